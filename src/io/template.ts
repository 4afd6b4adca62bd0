// RFC 6570 level-1 URI templates (`{work}`, `{image}`): checking a template and expanding it.

const UNRESERVED = /[A-Za-z0-9\-._~]/;
const ALL_UNRESERVED = /^[A-Za-z0-9\-._~]*$/;

/**
 * Percent-encodes every character outside the unreserved set, as UTF-8 octets
 * (RFC 6570 §3.2.1 and §3.2.2 Simple String Expansion; unreserved per RFC 3986 §2.3).
 */
export function encodeUnreserved(value: string): string {
  // A value of only dots would expand to a "." or ".." path segment, which readers remove (RFC 3986 §5.2.4) and
  // RDF 1.1 Concepts §3.2 asks publishers to avoid: those dots are percent-encoded, a deliberate departure from §3.2.2.
  if (/^\.{1,2}$/.test(value)) return value.replace(/\./g, '%2E');
  if (ALL_UNRESERVED.test(value)) return value; // the common case: nothing to encode
  let out = '';
  for (const ch of value) {
    if (ch.length === 1 && UNRESERVED.test(ch)) out += ch;
    else for (const byte of Buffer.from(ch, 'utf8')) out += '%' + byte.toString(16).toUpperCase().padStart(2, '0');
  }
  return out;
}

/** Problems with a level-1 template, or [] when it is fine. `required` must appear; `allowed` may. */
export function checkTemplate(template: string, required: string, allowed: string[] = [required]): string[] {
  const problems: string[] = [];
  const exprs = [...template.matchAll(/\{([^{}]*)\}/g)].map((m) => m[1]);
  const stripped = template.replace(/\{[^{}]*\}/g, '');
  if (/[{}]/.test(stripped)) problems.push('unbalanced braces');
  for (const e of exprs) {
    if (/^[+#./;?&=,!@|]/.test(e))
      problems.push(`expression {${e}} uses an operator; only level-1 {name} expressions are supported`);
    else if (!allowed.includes(e))
      problems.push(`unknown variable {${e}}; use ${allowed.map((a) => `{${a}}`).join(' or ')}`);
  }
  if (!exprs.includes(required)) problems.push(`has no {${required}} placeholder`);
  return problems;
}

/** Expands `{name}` expressions (RFC 6570 §3.2.2, level 1). Undefined variables expand to '' (§3.2.1). */
export function expandTemplate(template: string, vars: Record<string, string | undefined>): string {
  return template.replace(/\{([^{}]*)\}/g, (_, name: string) => {
    const v = vars[name];
    return v === undefined ? '' : encodeUnreserved(v);
  });
}

/** A compiled template: splits once, expands many times without regex work (hot path for 1M works). */
export function compileTemplate(template: string, variable: string): (value: string) => string {
  const parts = template.split(`{${variable}}`);
  if (parts.length === 1) return () => template;
  return (value) => parts.join(encodeUnreserved(value));
}
