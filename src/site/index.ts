// Site stage: a release folder → a static site in which every IRI the release mints under its base has an HTML,
// Turtle and JSON-LD document, plus pages to search, the dataset, the vocabulary and rules for web servers.
import { verifyRelease } from '../store/complete.js';
import {
  mkdirSync,
  writeFileSync,
  statSync,
  rmSync,
  linkSync,
  copyFileSync,
  readdirSync,
  chmodSync,
  existsSync,
} from 'node:fs';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import type { WriteMessage, WriteReply } from './write-worker.js';
import { writeFolderAtomically } from '../io/atomic.js';
import { RELEASE_FILES } from '../rdf/formats.js';
import { streamNQuads, type Statement } from './nquads.js';
import { Grouper, type ClusterUnit, type Entry, type LinkEntry } from './group.js';
import { readSiteInfo } from './info.js';
import { SiteContext, V } from './context.js';
import { docOf, routeOf, relPath, shardWidth, ROUTES, type DocKind, type ShardWidths } from './routes.js';
import { JsonLd } from './jsonld.js';
import { page, html, Safe } from './html.js';
import { Spool } from './spool.js';
import { clusterPage } from './pages/cluster.js';
import { linkSection, matchSection, genericSection, MATCH_TABLE_HEAD, MATCH_TABLE_TAIL } from './pages/entries.js';
import { genericPage } from './pages/generic.js';
import { datasetSummary } from './pages/dataset.js';
import { SearchIndex } from './search.js';
import { writeStaticPages } from './pages/static.js';
import { serverRules } from './rules.js';
import { readEarlierSite, carryDocuments, earlierLinks } from './carry.js';

export interface SiteSummary {
  out: string;
  base: string;
  version: string;
  documents: number;
  files: number;
  /** Bytes of the site without the downloads (the release's own files, hard-linked under releases/). */
  bytes: number;
  downloadBytes: number;
  widths: ShardWidths;
}

/** Shard widths from the size of concordance.nq (bytes per link, match and review measured on generated releases). */
export function widthsFor(nqBytes: number): ShardWidths {
  return {
    link: shardWidth(nqBytes / 16_000),
    match: shardWidth(nqBytes / 2_500),
    review: shardWidth(nqBytes / 200_000),
  };
}

/** Characters of document text per batch handed to the writer thread, and batches in flight before reading waits. */
const BATCH = 4 << 20;
const IN_FLIGHT = 8;

/**
 * Writes one document in its three forms: `.ttl` (N-Triples lines, which are Turtle too), `.jsonld`, `.html`. The
 * files are written by a worker thread (write-worker.ts) in batches; at most IN_FLIGHT batches wait for it.
 */
class DocWriter {
  documents = 0;
  private batch: [string, string][] = [];
  private size = 0;
  private inFlight = 0;
  private failure: Error | null = null;
  private waiting: (() => void) | null = null;
  private finished = false;
  private readonly worker: Worker;
  constructor(
    private readonly dir: string,
    private readonly jsonld: JsonLd,
  ) {
    this.worker = new Worker(new URL('./write-worker.js', import.meta.url));
    this.worker.on('message', (r: WriteReply) => {
      if ('ack' in r) this.inFlight--;
      else if ('done' in r) this.finished = true;
      else this.fail(Object.assign(new Error(`writing the site: ${r.error}`), { code: r.code, path: r.path }));
      this.wake();
    });
    this.worker.on('error', (e) => this.fail(e));
    this.worker.on('exit', (code) => {
      if (!this.finished) this.fail(new Error(`site file writer stopped (exit code ${code})`));
    });
  }
  private fail(e: Error) {
    this.failure ??= e;
    this.wake();
  }
  private wake() {
    const w = this.waiting;
    this.waiting = null;
    w?.();
  }
  private async settle(until: () => boolean): Promise<void> {
    while (!this.failure && !until()) await new Promise<void>((r) => (this.waiting = r));
    if (this.failure) throw this.failure;
  }
  write(doc: string, nt: string, jsonNodes: string[], htmlText: string): void {
    const f = path.join(this.dir, ...doc.split('/'));
    const json = this.jsonld.document(jsonNodes);
    this.batch.push([`${f}.ttl`, nt], [`${f}.jsonld`, json], [`${f}.html`, htmlText]);
    this.size += nt.length + json.length + htmlText.length;
    this.documents++;
    if (this.size >= BATCH) this.post();
  }
  private post() {
    if (!this.batch.length) return;
    this.worker.postMessage({ files: this.batch } satisfies WriteMessage);
    this.inFlight++;
    this.batch = [];
    this.size = 0;
  }
  /** A promise while too many batches wait for the writer (the reader pauses), else undefined. */
  backlog(): Promise<void> | undefined {
    if (this.failure) return Promise.reject(this.failure);
    return this.inFlight >= IN_FLIGHT ? this.settle(() => this.inFlight < IN_FLIGHT) : undefined;
  }
  /** Stops the writer thread (after close, or when the site fails half-way). */
  async stop(): Promise<void> {
    this.finished = true;
    await this.worker.terminate();
  }

  /** Writes what is left and waits until every file is written; fails with the writer's first error. */
  async close(): Promise<void> {
    this.post();
    this.worker.postMessage({ end: true } satisfies WriteMessage);
    await this.settle(() => this.finished);
  }
}

const ntOf = (sts: readonly Statement[]) => sts.map((s) => s.nt).join('');

/**
 * `concordat site <release> --out <folder>`: reads concordance.nq once in file order (a cluster at a time; links,
 * matches and reviews spooled to disk by hash prefix and written as shard documents afterwards), so memory holds one
 * cluster, the shared provenance and one spool file at a time. Written to a temp folder renamed at the end.
 */
export async function writeSite(release: string, out: string, opts: { previous?: string } = {}): Promise<SiteSummary> {
  // the file it reads is checked whole; the others (hard-linked as downloads) are checked to be the ones listed
  const info = await readSiteInfo(release);
  await verifyRelease(release, [RELEASE_FILES.nquads, RELEASE_FILES.dataset], { hashNeededOnly: true });
  const earlier = opts.previous ? readEarlierSite(opts.previous, info.base) : undefined;
  const nq = path.join(release, RELEASE_FILES.nquads);
  return writeFolderAtomically(out, async (dir) => {
    const ctx = new SiteContext(info);
    ctx.widths = widthsFor(statSync(nq).size);
    for (const d of earlier?.ownDocs ?? []) ctx.carried.add(d);
    const linkHashes = new Set<string>();
    const spoolDir = path.join(dir, '.spool');
    const spool = new Spool(spoolDir);
    const jl = new JsonLd(info.base);
    const jsonldNodes = (sts: readonly Statement[]) => jl.nodes(sts);
    const docs = new DocWriter(dir, jl);
    try {
      const search = new SearchIndex(spool, ctx);
      const own = new Map<string, { kind: DocKind; statements: Statement[] }>();
      const graphs = new Set<string>();
      const shardDoc = (kind: DocKind, hash: string) => docOf({ kind, key: hash, path: '' }, ctx.widths);

      const spoolLink = (l: LinkEntry, cluster: string | null) => {
        const doc = shardDoc('link', l.hash);
        linkHashes.add(l.hash);
        spool.add(`link-${l.hash.slice(0, 2)}`, [
          l.hash,
          ntOf(l.statements),
          jsonldNodes(l.statements),
          linkSection(ctx, l, doc, cluster),
        ]);
        for (const m of l.matches) spoolEntry(m, l.iri);
      };
      const spoolEntry = (e: Entry, link: string | null) => {
        const doc = shardDoc(e.kind, e.hash);
        const section = e.kind === 'match' ? matchSection(ctx, e, doc, link) : genericSection(ctx, e, doc);
        spool.add(`${e.kind}-${e.hash.slice(0, 2)}`, [e.hash, ntOf(e.statements), jsonldNodes(e.statements), section]);
      };
      const grouper = new Grouper(info.base, {
        cluster(u: ClusterUnit) {
          docs.write(u.doc, ntOf(u.statements), [jsonldNodes(u.statements)], clusterPage(ctx, u));
          for (const l of u.links) spoolLink(l, u.iri);
          search.addWorks(u.statements, u.doc, '');
        },
        strayLink(l: LinkEntry) {
          spoolLink(l, null);
          search.addWorks(l.statements, shardDoc('link', l.hash), `link/${l.hash}`);
        },
        entry(e: Entry) {
          if (e.kind === 'review') for (const st of e.statements) ctx.addProv(st);
          spoolEntry(e, null);
        },
        own(doc: string, kind: DocKind, st: Statement) {
          let d = own.get(doc);
          if (!d) own.set(doc, (d = { kind, statements: [] }));
          d.statements.push(st);
          if (kind === 'run' || kind === 'agent' || kind === 'curator' || kind === 'release') ctx.addProv(st);
        },
      });
      await streamNQuads(nq, (st) => {
        if (st.g !== undefined) graphs.add(st.g);
        grouper.push(st);
        return docs.backlog();
      });
      const left = grouper.end();
      if (left.length) throw new Error(`site: ${left.length} statements about no minted IRI at the end of ${nq}`);
      spool.close();

      // Documents of their own, and a document for every named graph.
      for (const g of graphs) {
        const rel = relPath(g, info.base);
        const route = rel === null ? null : routeOf(rel);
        if (route?.kind === 'graph' && !own.has(route.key)) own.set(route.key, { kind: 'graph', statements: [] });
      }
      for (const [doc, d] of [...own].sort((a, b) => (a[0] < b[0] ? -1 : 1))) {
        const extra =
          d.kind === 'dataset' && info.dataset === info.base + doc.split('/').map(encodeURIComponent).join('/')
            ? datasetSummary(ctx, doc)
            : undefined;
        docs.write(
          doc,
          ntOf(d.statements),
          [jsonldNodes(d.statements)],
          genericPage(ctx, doc, d.kind, d.statements, extra),
        );
      }

      // Claims of an earlier site that this release no longer describes: kept as that site described them.
      if (earlier) {
        for (const e of earlierLinks(earlier, info.base)) {
          if (linkHashes.has(e.hash)) continue;
          const entry: LinkEntry = {
            kind: 'link',
            hash: e.hash,
            iri: `${info.base}link/${e.hash}`,
            statements: e.statements,
            matches: [],
          };
          const note = `<p class="aside">This claim is not in release ${info.version}; it is shown as the site of release ${earlier.version} described it.</p>\n`;
          spool.add(`link-${e.hash.slice(0, 2)}`, [
            e.hash,
            ntOf(e.statements),
            jsonldNodes(e.statements),
            linkSection(ctx, entry, shardDoc('link', e.hash), null).replace(/(<\/h2>\n)/, `$1${note}`),
          ]);
        }
        spool.close();
      }

      // Shard documents: every spool bucket holds whole shards when the width is 2 or more; width 1 joins 16 buckets.
      for (const rule of ROUTES.filter((r) => r.shardFolder)) {
        const kind = rule.kind;
        const k = ctx.widths[kind] ?? 1;
        const hex = [...'0123456789abcdef'];
        const groups = k === 1 ? hex.map((a) => hex.map((b) => a + b)) : hex.flatMap((a) => hex.map((b) => [a + b]));
        for (const buckets of groups) {
          await docs.backlog();
          const records = buckets.flatMap((b) => spool.read(`${kind}-${b}`)) as [string, string, string, string][];
          records.sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0));
          const shards = new Map<string, typeof records>();
          for (const r of records) {
            const key = r[0].slice(0, k);
            const s = shards.get(key);
            if (s) s.push(r);
            else shards.set(key, [r]);
          }
          for (const [key, rs] of shards) {
            const doc = `${rule.shardFolder}/${key}`;
            const label = kind === 'link' ? 'Claims' : kind === 'match' ? 'Image matches' : 'Curator reviews';
            const main = html`<p>${rs.length} ${label.toLowerCase()} whose identifier begins with <code>${key}</code>.</p>
${
  kind === 'match'
    ? new Safe(MATCH_TABLE_HEAD + rs.map((r) => r[3]).join('') + MATCH_TABLE_TAIL)
    : html`<nav aria-label="On this page"><ul class="toc">${rs.map((r) => html`<li><a href="#${rule.shardFolder}/${r[0]}">${r[0]}</a></li>`)}</ul></nav>
${rs.map((r) => new Safe(r[3]))}`
}`;
            const text = page({
              doc,
              title: `${label} ${key}…`,
              siteTitle: info.title,
              alternates: true,
              main: html`${main}`,
              licence: info.licence,
            });
            docs.write(
              doc,
              rs.map((r) => r[1]).join(''),
              rs.map((r) => r[2]),
              text,
            );
          }
        }
      }
      await docs.close();
      search.finish(dir);
      if (earlier) carryDocuments(earlier, dir);
      writeStaticPages(ctx, dir, own);
      const downloads = path.join(dir, 'releases', info.version);
      for (const f of info.files) {
        if (!f.file) continue;
        const target = path.join(downloads, ...f.file.split('/'));
        mkdirSync(path.dirname(target), { recursive: true });
        try {
          linkSync(path.join(release, f.file), target);
        } catch {
          copyFileSync(path.join(release, f.file), target);
        }
      }
      writeFileSync(
        path.join(dir, 'site.json'),
        JSON.stringify(
          {
            base: info.base,
            version: info.version,
            dataset: info.dataset,
            widths: ctx.widths,
            ...(ctx.images.origins.length ? { imageOrigins: ctx.images.origins } : {}),
          },
          null,
          2,
        ) + '\n',
      );
      for (const [name, body] of Object.entries(serverRules(info.base, ctx.widths, ctx.images.origins)))
        writeFileSync(path.join(dir, name), body);
      rmSync(spoolDir, { recursive: true, force: true });
      // a web server's own user reads the site: the folder gets the usual permissions, not the temp folder's 0700
      const mask = process.umask();
      chmodSync(dir, 0o755 & ~mask);
      const all = measure(dir),
        dl = measure(path.join(dir, 'releases'));
      return {
        out: path.resolve(out),
        base: info.base,
        version: info.version,
        documents: docs.documents,
        files: all.files,
        bytes: all.bytes - dl.bytes,
        downloadBytes: dl.bytes,
        widths: ctx.widths,
      };
    } finally {
      await docs.stop();
    }
  });
}

/** Files and bytes under a folder (hard-linked downloads counted once each, as the file system stores them). */
function measure(dir: string): { files: number; bytes: number } {
  let files = 0,
    bytes = 0;
  const walk = (d: string) => {
    if (!existsSync(d)) return;
    for (const e of readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else {
        files++;
        bytes += statSync(p).size;
      }
    }
  };
  walk(dir);
  return { files, bytes };
}
export { V };
