// An earlier site → what the new site keeps of it: documents the new release no longer has (earlier datasets and
// release activities, runs, curators), their downloads, and claims (links) the new release no longer describes, so a
// link IRI cited from any earlier release still resolves.
import { existsSync, linkSync, copyFileSync, mkdirSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { parseLine, type Statement } from './nquads.js';
import { relPath, routeOf, ROUTES } from './routes.js';
import { readManifest } from './manifest.js';
import { UserError } from '../errors.js';

const OWN_FOLDERS = ['run', 'agent', 'curator', 'release', 'dataset', 'graph'];
const DOC_EXTS = ['.html', '.ttl', '.jsonld'];

export interface EarlierSite {
  dir: string;
  version: string;
  /** Document paths of its own documents (no extension). */
  ownDocs: string[];
}

/** Reads an earlier site's manifest and lists its own documents; refuses a site of another base. */
export function readEarlierSite(dir: string, base: string): EarlierSite {
  const m = readManifest(dir);
  if (m.base !== base)
    throw new UserError({
      file: path.join(dir, 'site.json'),
      line: 0,
      field: 'base',
      message: `the earlier site is of base ${m.base}, this release of ${base}`,
      hint: 'name the site of an earlier release of the same concordance',
    });
  const ownDocs: string[] = [];
  const walk = (rel: string) => {
    for (const e of readdirSync(path.join(dir, rel), { withFileTypes: true })) {
      const r = `${rel}/${e.name}`;
      if (e.isDirectory()) walk(r);
      else if (e.name.endsWith('.ttl')) ownDocs.push(r.slice(0, -4));
    }
  };
  for (const f of OWN_FOLDERS) if (existsSync(path.join(dir, f))) walk(f);
  return { dir, version: m.version, ownDocs: ownDocs.sort() };
}

const place = (from: string, to: string) => {
  mkdirSync(path.dirname(to), { recursive: true });
  try {
    linkSync(from, to);
  } catch {
    copyFileSync(from, to);
  }
};

/** Copies the earlier site's own documents missing from the new site, and its downloads; returns the paths copied. */
export function carryDocuments(e: EarlierSite, out: string): string[] {
  const carried: string[] = [];
  for (const doc of e.ownDocs) {
    const to = path.join(out, ...doc.split('/'));
    if (existsSync(`${to}.ttl`)) continue;
    for (const ext of DOC_EXTS)
      if (existsSync(path.join(e.dir, ...doc.split('/')) + ext))
        place(path.join(e.dir, ...doc.split('/')) + ext, to + ext);
    carried.push(doc);
  }
  const walk = (rel: string) => {
    for (const x of readdirSync(path.join(e.dir, rel), { withFileTypes: true })) {
      const r = path.join(rel, x.name);
      if (x.isDirectory()) walk(r);
      else if (!existsSync(path.join(out, r))) place(path.join(e.dir, r), path.join(out, r));
    }
  };
  if (existsSync(path.join(e.dir, 'releases'))) walk('releases');
  return carried;
}

/** Link entries of the earlier site (link and earlier-state statements by link hash), one shard file at a time. */
export function* earlierLinks(e: EarlierSite, base: string): Generator<{ hash: string; statements: Statement[] }> {
  const folder = ROUTES.find((r) => r.kind === 'link')!.shardFolder!;
  const dir = path.join(e.dir, folder);
  if (!existsSync(dir)) return;
  for (const name of readdirSync(dir)
    .filter((n) => n.endsWith('.ttl'))
    .sort()) {
    const file = path.join(dir, name);
    const byHash = new Map<string, Statement[]>();
    readFileSync(file, 'utf8')
      .split('\n')
      .forEach((line, i) => {
        const st = parseLine(line, file, i + 1);
        if (!st) return;
        const rel = relPath(st.s, base);
        const route = rel === null ? null : routeOf(rel);
        const hash = route?.kind === 'link' ? route.key : [...byHash.keys()].pop();
        if (!hash) return;
        const l = byHash.get(hash);
        if (l) l.push(st);
        else byHash.set(hash, [st]);
      });
    for (const [hash, statements] of byHash) yield { hash, statements };
  }
}
