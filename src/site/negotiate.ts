// Content negotiation: the representations of a document, and an Accept header → the one to send (RFC 9110 §12.5.1).

/** One representation of a site document: the extension asked for, its media type, and the file it is read from. */
export interface Representation {
  ext: string;
  type: string;
  file: string;
}

/**
 * In order of preference when an Accept header ranks several equally (HTML first: `*∕*` and browsers get the page).
 * N-Triples is sent from the `.ttl` file, whose lines are N-Triples (RDF 1.1 N-Triples §1: a subset of Turtle).
 */
export const REPRESENTATIONS: readonly Representation[] = [
  { ext: '.html', type: 'text/html', file: '.html' },
  { ext: '.ttl', type: 'text/turtle', file: '.ttl' },
  { ext: '.jsonld', type: 'application/ld+json', file: '.jsonld' },
  { ext: '.nt', type: 'application/n-triples', file: '.ttl' },
];
/** Media types that also name a representation (XHTML readers get HTML, plain JSON readers JSON-LD). */
const ALIASES: Record<string, string> = {
  'application/xhtml+xml': 'text/html',
  'application/json': 'application/ld+json',
};

interface Range {
  type: string;
  sub: string;
  q: number;
  params: number;
}

function parseAccept(header: string): Range[] {
  const out: Range[] = [];
  for (const part of header.split(',')) {
    const [mt, ...params] = part
      .trim()
      .split(';')
      .map((x) => x.trim());
    const m = /^([!#$%&'*+.^_`|~0-9A-Za-z-]+)\/([!#$%&'*+.^_`|~0-9A-Za-z-]+)$/.exec(mt ?? '');
    if (!m) continue;
    let q = 1,
      n = 0;
    for (const p of params) {
      const qm = /^q=([0-9.]+)$/i.exec(p);
      if (qm) q = Math.min(1, Math.max(0, Number(qm[1]) || 0));
      else if (p) n++;
    }
    out.push({ type: m[1].toLowerCase(), sub: m[2].toLowerCase(), q, params: n });
  }
  return out;
}

/** The quality an Accept header gives a media type: from its most specific matching range (RFC 9110 §12.5.1). */
function quality(ranges: Range[], mediaType: string): number {
  const [type, sub] = mediaType.split('/');
  let best = -1,
    q = 0;
  for (const r of ranges) {
    const spec =
      r.type === type && r.sub === sub
        ? 3
        : r.type === type && r.sub === '*'
          ? 2
          : r.type === '*' && r.sub === '*'
            ? 1
            : 0;
    if (spec > best && spec > 0) {
      best = spec;
      q = r.q;
    }
  }
  return best < 0 ? 0 : q;
}

/** The representation to send for an Accept header (absent: HTML), or null when the header accepts none (406). */
export function negotiate(accept: string | undefined): Representation | null {
  if (!accept || !accept.trim()) return REPRESENTATIONS[0];
  const ranges = parseAccept(accept);
  if (!ranges.length) return REPRESENTATIONS[0];
  let best: Representation | null = null,
    bestQ = 0;
  for (const r of REPRESENTATIONS) {
    let q = quality(ranges, r.type);
    for (const [alias, to] of Object.entries(ALIASES))
      if (to === r.type)
        q = Math.max(
          q,
          quality(
            ranges.filter((x) => x.type !== '*'),
            alias,
          ),
        );
    if (q > bestQ) {
      best = r;
      bestQ = q;
    }
  }
  return best;
}

/** Media types of the other files a site holds, by extension. */
export const FILE_TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.ttl': 'text/turtle; charset=utf-8',
  '.jsonld': 'application/ld+json',
  '.json': 'application/json',
  '.css': 'text/css; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.nq': 'application/n-quads',
  '.csv': 'text/csv; charset=utf-8',
  '.md': 'text/markdown; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8',
  '.conf': 'text/plain; charset=utf-8',
  '.gz': 'application/gzip',
  '.png': 'image/png',
};
