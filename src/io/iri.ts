// A string → whether it is an absolute IRI (RFC 3987 §2.2), and if not, the first thing wrong with it, in words.

// RFC 3987 §2.2 character classes (ucschar, iprivate) and RFC 3986 §2.2–2.3 (unreserved, sub-delims).
const UCS =
  '\\u{A0}-\\u{D7FF}\\u{F900}-\\u{FDCF}\\u{FDF0}-\\u{FFEF}\\u{10000}-\\u{1FFFD}\\u{20000}-\\u{2FFFD}' +
  '\\u{30000}-\\u{3FFFD}\\u{40000}-\\u{4FFFD}\\u{50000}-\\u{5FFFD}\\u{60000}-\\u{6FFFD}\\u{70000}-\\u{7FFFD}' +
  '\\u{80000}-\\u{8FFFD}\\u{90000}-\\u{9FFFD}\\u{A0000}-\\u{AFFFD}\\u{B0000}-\\u{BFFFD}\\u{C0000}-\\u{CFFFD}' +
  '\\u{D0000}-\\u{DFFFD}\\u{E1000}-\\u{EFFFD}';
const PRIVATE = '\\u{E000}-\\u{F8FF}\\u{F0000}-\\u{FFFFD}\\u{100000}-\\u{10FFFD}';
const UNRESERVED = `A-Za-z0-9\\-._~${UCS}`; // iunreserved
const SUB_DELIMS = "!$&'()*+,;=";
const PCT = '%[0-9A-Fa-f]{2}';
const PCHAR = `(?:[${UNRESERVED}${SUB_DELIMS}:@]|${PCT})`; // ipchar
const AUTHORITY =
  `(?:(?:[${UNRESERVED}${SUB_DELIMS}:]|${PCT})*@)?` + // iuserinfo "@"
  `(?:\\[[0-9A-Fa-f:.]+\\]|\\[v[0-9A-Fa-f]+\\.[A-Za-z0-9\\-._~${SUB_DELIMS}:]+\\]|(?:[${UNRESERVED}${SUB_DELIMS}]|${PCT})*)` + // IP-literal (IPv6 read loosely) / ireg-name
  '(?::[0-9]*)?'; // ":" port
/**
 * IRI = scheme ":" ihier-part [ "?" iquery ] [ "#" ifragment ] (RFC 3987 §2.2). ihier-part is `//` iauthority
 * ipath-abempty, or a path of ipchar and `/` (ipath-absolute, ipath-rootless and ipath-empty together; the branch
 * order keeps a path from starting with `//`).
 */
const IRI = new RegExp(
  `^[A-Za-z][A-Za-z0-9+\\-.]*:(?://${AUTHORITY}(?:/${PCHAR}*)*|(?!//)(?:${PCHAR}|/)*)` +
    `(?:\\?(?:${PCHAR}|[${PRIVATE}/?])*)?(?:#(?:${PCHAR}|[/?])*)?$`,
  'u',
);
/** Characters that may appear somewhere in an IRI: the classes above plus gen-delims (RFC 3986 §2.2) and `%`. */
const ALLOWED = new RegExp(`[${UNRESERVED}${SUB_DELIMS}:/?#\\[\\]@%${PRIVATE}]`, 'u');

/** Bidirectional formatting characters, which an IRI must not hold (RFC 3987 §4.1) though ucschar includes them. */
const BIDI = /[\u200e\u200f\u202a-\u202e]/u;

/** How a character is named in a message: `a space`, `control character U+0001`, `"<" (U+003C)`. */
function named(ch: string): string {
  const cp = ch.codePointAt(0)!;
  const u = `U+${cp.toString(16).toUpperCase().padStart(4, '0')}`;
  if (ch === ' ') return 'a space (U+0020)';
  if (cp < 0x20 || (cp >= 0x7f && cp <= 0x9f)) return `control character ${u}`;
  if (/\s/u.test(ch)) return `white space ${u}`;
  if (BIDI.test(ch)) return `bidirectional formatting character ${u}`;
  if (!/[\p{L}\p{N}\p{P}\p{S}]/u.test(ch)) return `character ${u}`;
  return `"${ch}" (${u})`;
}

/**
 * Why `s` is not an absolute IRI as RDF needs one (RDF 1.1 Concepts §3.2: absolute, a fragment allowed), or null when
 * it is one: the first character no IRI may hold (with its 1-based position in characters), a `%` without two hex
 * digits, a missing scheme, an http(s) IRI without a host (RFC 9110 §4.2.1), or a structure RFC 3987 §2.2 rejects.
 */
export function iriProblem(s: string): string | null {
  let at = 0;
  for (const ch of s) {
    at++;
    if (!ALLOWED.test(ch) || BIDI.test(ch)) return `${named(ch)} at character ${at} is not allowed in an IRI`;
  }
  const pct = /%(?![0-9A-Fa-f]{2})/.exec(s);
  if (pct) return `"%" at character ${[...s.slice(0, pct.index)].length + 1} is not followed by two hex digits`;
  const scheme = /^([A-Za-z][A-Za-z0-9+\-.]*):/.exec(s);
  if (!scheme) return 'has no scheme such as "https:" (it must be an absolute IRI)';
  if (/^https?$/i.test(scheme[1]) && hostOf(s) === '')
    return `an ${scheme[1].toLowerCase()} IRI needs a host after "//"`;
  if (!IRI.test(s)) return 'is not an IRI by RFC 3987 §2.2 (check the brackets, "@" and the port)';
  return null;
}

/** The host of `scheme://userinfo@host:port/…` ('' when there is no `//` or no host). */
function hostOf(s: string): string {
  const m = /^[^:]+:\/\/([^/?#]*)/.exec(s);
  if (!m) return '';
  const hostPort = m[1].slice(m[1].lastIndexOf('@') + 1);
  return hostPort.startsWith('[') ? hostPort : hostPort.replace(/:[0-9]*$/, '');
}

/** Whether a curator's value is meant as an IRI rather than a name (it starts with http:// or https://). */
export const looksLikeIri = (s: string): boolean => /^https?:\/\//i.test(s);
