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
import os from 'node:os';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { writeFolderAtomically } from '../io/atomic.js';
import { RELEASE_FILES } from '../rdf/formats.js';
import { UserError } from '../errors.js';
import { readSiteInfo } from './info.js';
import { SiteContext, V } from './context.js';
import { shardWidth, type ShardWidths } from './routes.js';
import { serverRules } from './rules.js';
import { readEarlierSite } from './carry.js';
import { writeSearchPrefixes } from './search.js';
import type { PartSetup } from './part.js';
import type { PartMessage, PartReply } from './part-worker.js';

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

/**
 * Parts the site is written in by default: one per core, at most 4 (each part reads the whole release and keeps a
 * writer thread busy; past 4 the reading it repeats outweighs what it shares out).
 */
export function defaultParts(): number {
  return Math.max(1, Math.min(4, os.availableParallelism()));
}

/** One part (part.ts) in a worker thread, run phase by phase; its errors come back as they were thrown. */
class PartWorker {
  private readonly worker: Worker;
  private pending: { resolve: (documents: number) => void; reject: (e: Error) => void } | null = null;
  private failure: Error | null = null;
  private exited = false;
  constructor(setup: PartSetup) {
    this.worker = new Worker(new URL('./part-worker.js', import.meta.url), { workerData: setup });
    this.worker.on('message', (r: PartReply) => {
      if ('done' in r) this.settle(null, r.documents);
      else if ('userError' in r) this.settle(new UserError(r.userError.problems, r.userError.exitCode));
      else this.settle(Object.assign(new Error(r.error), { code: r.code, path: r.path, stack: r.stack }));
    });
    this.worker.on('error', (e) => this.settle(e));
    this.worker.on('exit', (code) => {
      this.exited = true;
      this.settle(new Error(`site part stopped (exit code ${code})`));
    });
  }
  private settle(e: Error | null, documents = 0): void {
    const p = this.pending;
    this.pending = null;
    if (e) this.failure ??= e;
    if (!p) return;
    if (e) p.reject(this.failure ?? e);
    else p.resolve(documents);
  }
  /** Runs a phase; resolves with the documents the part has written so far. */
  run(phase: PartMessage['phase']): Promise<number> {
    if (this.failure) return Promise.reject(this.failure);
    return new Promise((resolve, reject) => {
      this.pending = { resolve, reject };
      this.worker.postMessage({ phase } satisfies PartMessage);
    });
  }
  async stop(): Promise<void> {
    if (!this.exited) await this.worker.terminate();
  }
}

/**
 * `concordat site <release> --out <folder>`: written in `parts` worker threads (part.ts), each reading
 * concordance.nq once in file order (a cluster at a time; links, matches and reviews spooled to disk by hash prefix
 * and written as shard documents afterwards) and writing every `parts`-th cluster, so memory holds per part one
 * cluster, the shared provenance and one spool file at a time. The same files whatever the number of parts. Written
 * to a temp folder renamed at the end.
 */
export async function writeSite(
  release: string,
  out: string,
  opts: { previous?: string; parts?: number } = {},
): Promise<SiteSummary> {
  // the file it reads is checked whole; the others (hard-linked as downloads) are checked to be the ones listed
  const info = await readSiteInfo(release);
  await verifyRelease(release, [RELEASE_FILES.nquads, RELEASE_FILES.dataset], { hashNeededOnly: true });
  // an earlier site of another base is refused before anything is written (each part reads it again)
  if (opts.previous) readEarlierSite(opts.previous, info.base);
  const nq = path.join(release, RELEASE_FILES.nquads);
  const parts = opts.parts ?? defaultParts();
  return writeFolderAtomically(out, async (dir) => {
    const ctx = new SiteContext(info);
    ctx.widths = widthsFor(statSync(nq).size);
    const workers = Array.from(
      { length: parts },
      (_, part) =>
        new PartWorker({
          release,
          dir,
          part,
          parts,
          widths: ctx.widths,
          previous: opts.previous && path.resolve(opts.previous),
        }),
    );
    try {
      // every part reads the whole release before any writes shard documents from the spools of all
      await Promise.all(workers.map((w) => w.run('stream')));
      const documents = (await Promise.all(workers.map((w) => w.run('shards')))).reduce((a, b) => a + b, 0);
      writeSearchPrefixes(dir);
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
      rmSync(path.join(dir, '.spool'), { recursive: true, force: true });
      // a web server's own user reads the site: the folder gets the usual permissions, not the temp folder's 0700
      const mask = process.umask();
      chmodSync(dir, 0o755 & ~mask);
      const all = measure(dir),
        dl = measure(path.join(dir, 'releases'));
      return {
        out: path.resolve(out),
        base: info.base,
        version: info.version,
        documents,
        files: all.files,
        bytes: all.bytes - dl.bytes,
        downloadBytes: dl.bytes,
        widths: ctx.widths,
      };
    } finally {
      await Promise.all(workers.map((w) => w.stop()));
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
