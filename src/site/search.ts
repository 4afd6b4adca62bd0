// Search over record IDs and titles that stays small: postings spooled by the token's first letter, written as one
// JSON file per two-letter prefix (`search/ab.json`), at most MAX_POSTINGS records per token.
import { mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Statement } from './nquads.js';
import type { Spool } from './spool.js';
import { V, nodesOf, type SiteContext } from './context.js';
import { workView } from './pages/parts.js';

/** Records listed per token; a query narrows by more words (common practice, no source). */
export const MAX_POSTINGS = 200;

/**
 * Lower-case words without diacritics, split on anything but letters and digits (the same code runs in the browser).
 */
export function tokens(s: string): string[] {
  return s
    .normalize('NFKD')
    .replace(/\p{M}/gu, '')
    .toLowerCase()
    .split(/[^\p{L}\p{N}]+/u)
    .filter((t) => t.length >= 2);
}

/** Prefix file name of a token: its first two characters, anything outside a–z and 0–9 as `_`. */
export const shardOf = (t: string) => t.slice(0, 2).replace(/[^a-z0-9]/g, '_');

export class SearchIndex {
  constructor(
    private readonly spool: Spool,
    private readonly ctx: SiteContext,
  ) {}

  /** Postings for every partner work described in `statements`: ID and title words → (ID, title, archive, page). */
  addWorks(statements: readonly Statement[], doc: string, fragment: string): void {
    for (const n of nodesOf(statements).values()) {
      if (!n.by.has(V.partner)) continue;
      const w = workView(this.ctx, n.iri, n);
      const href = `${doc}.html${fragment ? `#${fragment}` : ''}`;
      const seen = new Set<string>();
      for (const t of [...tokens(w.id), ...tokens(w.title ?? '')]) {
        if (seen.has(t)) continue;
        seen.add(t);
        this.spool.add(`search-${shardOf(t)[0]}`, [t, w.id, w.title ?? '', w.partnerName, href]);
      }
    }
  }

  /**
   * Writes `search/<prefix>.json`: `{ token: [[id, title, archive, href], …] }`, tokens and records sorted; `read`
   * gives a spool bucket's records (by default this index's own spool; the site joins the spools of all its parts).
   * Part `part` of `parts` writes every `parts`-th first letter; `writeSearchPrefixes` then lists what all wrote.
   */
  finish(dir: string, read: (bucket: string) => string[][] = (b) => this.spool.read(b), part = 0, parts = 1): void {
    mkdirSync(path.join(dir, 'search'), { recursive: true });
    for (const [i, first] of [...'_0123456789abcdefghijklmnopqrstuvwxyz'].entries()) {
      if (i % parts !== part) continue;
      const rows = read(`search-${first}`);
      const shards = new Map<string, Map<string, string[][]>>();
      for (const [t, ...rest] of rows) {
        const key = shardOf(t);
        let m = shards.get(key);
        if (!m) shards.set(key, (m = new Map()));
        const list = m.get(t);
        if (list) list.push(rest);
        else m.set(t, [rest]);
      }
      for (const [key, m] of shards) {
        const obj: Record<string, { n: number; r: string[][] }> = {};
        for (const t of [...m.keys()].sort()) {
          const list = m.get(t)!.sort((a, b) => (a.join('\t') < b.join('\t') ? -1 : 1));
          obj[t] = { n: list.length, r: list.slice(0, MAX_POSTINGS) };
        }
        writeFileSync(path.join(dir, 'search', `${key}.json`), JSON.stringify(obj));
      }
    }
  }
}

/** Writes `search/prefixes.json`: the prefix files that exist, sorted, so the browser asks for no other. */
export function writeSearchPrefixes(dir: string): void {
  const folder = path.join(dir, 'search');
  const keys = readdirSync(folder)
    .filter((f) => f.endsWith('.json') && f !== 'prefixes.json')
    .map((f) => f.slice(0, -'.json'.length))
    .sort();
  writeFileSync(path.join(folder, 'prefixes.json'), JSON.stringify(keys));
}
