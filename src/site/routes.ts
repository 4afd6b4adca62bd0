// Minted IRI paths (relative to the release's base) → the document that describes them: one route table for the
// site generator, the preview server and the generated web-server rules.

/** What kind of thing a route names; sharded kinds are described in documents holding every hash with one prefix. */
export type DocKind =
  | 'cluster'
  | 'link'
  | 'match'
  | 'review'
  | 'run'
  | 'agent'
  | 'curator'
  | 'release'
  | 'partner'
  | 'publisher'
  | 'dataset'
  | 'graph';

export interface RouteRule {
  kind: DocKind;
  /**
   * Over the percent-decoded path after the base; group 1 is the document's own path (or the hash of a sharded kind).
   */
  pattern: string;
  /** Sharded kinds: the folder of the shard documents (`link` → `link/3f.html`). */
  shardFolder?: string;
}

/**
 * A segment naming a document of its own: anything but a document's file name (`2027.1.html` is the page, not a thing).
 */
const NAME = '(?![^/]*\\.(?:html|ttl|jsonld|nt)$)[^/]+';

/**
 * The table. Order matters (first match). Own documents: the path in group 1. Sharded kinds (millions of links,
 * matches and reviews at the largest scales; one file each would be millions of files): the first `k` hex digits
 * of the hash name the shard document, `k` chosen per site from the counts (site.json).
 */
export const ROUTES: readonly RouteRule[] = [
  { kind: 'cluster', pattern: '^(work/[^/.]+)(?:/.*)?$' },
  { kind: 'link', pattern: '^link/([0-9a-f]+)(?:/.*)?$', shardFolder: 'link' },
  { kind: 'match', pattern: '^match/([0-9a-f]+)$', shardFolder: 'match' },
  { kind: 'review', pattern: '^review/([0-9a-f]+)$', shardFolder: 'review' },
  { kind: 'run', pattern: `^(run/${NAME})(?:/.*)?$` },
  { kind: 'agent', pattern: `^(agent/[^/]+/${NAME})$` },
  { kind: 'curator', pattern: `^(curator/${NAME})$` },
  { kind: 'release', pattern: `^(release/${NAME})$` },
  { kind: 'partner', pattern: `^(dataset/partner/${NAME})$` },
  { kind: 'publisher', pattern: '^(dataset/publisher)$' },
  // partner datasets and the publisher have documents of their own under dataset/ (rules above)
  { kind: 'dataset', pattern: `^(dataset/(?!partner/|publisher$)${NAME})(?:/.*)?$` },
  { kind: 'graph', pattern: `^(graph/${NAME})$` },
];
const COMPILED = ROUTES.map((r) => ({ ...r, re: new RegExp(r.pattern) }));

/** Where one minted resource is described: document path (no extension), its kind, the fragment (the path itself). */
export interface Route {
  kind: DocKind;
  /** Own documents: the document path; sharded kinds: the full hash (the shard is chosen later). */
  key: string;
  path: string;
}

/** Shard prefix lengths per sharded kind, recorded in site.json. */
export type ShardWidths = Partial<Record<DocKind, number>>;

/** The route of a percent-decoded path under the base, or null when no rule names it. */
export function routeOf(rel: string): Route | null {
  for (const r of COMPILED) {
    const m = r.re.exec(rel);
    if (m) return { kind: r.kind, key: m[1], path: rel };
  }
  return null;
}

/** Document path (no extension) of a route, given the site's shard widths. */
export function docOf(route: Route, widths: ShardWidths): string {
  const rule = ROUTES.find((r) => r.kind === route.kind)!;
  return rule.shardFolder ? `${rule.shardFolder}/${route.key.slice(0, widths[route.kind] ?? 1)}` : route.key;
}

/** The smallest prefix width (1–4 hex digits) with at most `per` hashes per shard on average. */
export function shardWidth(count: number, per = 24): number {
  let k = 1;
  while (k < 4 && count / 16 ** k > per) k++;
  return k;
}

/** A path segment is written to disk only if it cannot leave its folder or confuse a server. */
export const safeSegment = (s: string) => s.length > 0 && s !== '.' && s !== '..' && !/[\\\0-\x1f\x7f]/.test(s);

/** The percent-decoded path of `iri` under `base`, or null when the IRI is not under it or does not decode safely. */
export function relPath(iri: string, base: string): string | null {
  if (!iri.startsWith(base) || iri.length === base.length) return null;
  const raw = iri.slice(base.length);
  if (/[?#]/.test(raw)) return null;
  let rel: string;
  if (!raw.includes('%')) rel = raw;
  else
    try {
      rel = raw.split('/').map(decodeURIComponent).join('/');
    } catch {
      return null;
    }
  return rel.split('/').every(safeSegment) ? rel : null;
}
