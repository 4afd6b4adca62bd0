// One measured job per process (build, whole-graph SHACL, load alone) → one JSON line on stdout with time and peak RSS.
import { performance } from 'node:perf_hooks';
import { createReadStream, createWriteStream } from 'node:fs';
import { pipeline } from 'node:stream/promises';
import { createGzip } from 'node:zlib';
import { build } from '../src/pipeline.js';
import { load } from '../src/load/index.js';
import { UserError, EXIT } from '../src/errors.js';
import { validate, type ShaclEngine } from '../src/validate/shacl.js';
import { loadDataFiles, loadShapesFolder, defaultShapesDir, streamDataFiles } from '../src/validate/files.js';
import { BoundedValidation } from '../src/validate/bounded.js';

type Job = (args: string[]) => Promise<Record<string, number>>;

/** The jobs a benchmark child can run, by name. */
const JOBS: Record<string, Job> = {
  /** build <project> <outDir> <1|0 validate> [1|0 gzip] */
  async build([project, out, v, gz]): Promise<Record<string, number>> {
    const t = performance.now();
    // milliseconds spent in each stage the build announces (load, link and cluster, analyse, rdf + publish, …)
    const stages: Record<string, number> = {};
    let current = '';
    let since = t;
    const progress = (stage: string) => {
      const now = performance.now();
      if (current) stages[`stage:${current}`] = now - since;
      [current, since] = [stage, now];
    };
    // the largest resident set seen in each stage, sampled every 100 ms (MiB)
    const sampler = setInterval(() => {
      const key = `rss:${current}`;
      stages[key] = Math.max(stages[key] ?? 0, process.memoryUsage.rss() / 2 ** 20);
    }, 100);
    sampler.unref();
    let r;
    try {
      r = await build(project, out, { validate: v !== '0', progress, gzip: gz === '1' });
      progress('');
      clearInterval(sampler);
    } catch (e) {
      // A non-conforming release still ran every stage: report the time and how many problems were listed.
      if (e instanceof UserError && e.exitCode === EXIT.failure)
        return { ms: performance.now() - t, nonConforming: 1, problemsListed: e.problems.length };
      throw e;
    }
    return {
      ...stages,
      ms: performance.now() - t,
      triples: r.publish.triples,
      evidenceRows: r.stats.evidenceRows,
      links: r.links.links.length,
      clusters: r.clustering.clusters.length,
      violations: r.publish.validation.violations,
      ...Object.fromEntries(Object.entries(r.publish.encodeMs ?? {}).map(([f, ms]) => [`encode:${f}`, ms])),
    };
  },
  /** gzip <file>: the file through zlib's gzip (default level, as the build's copies) into /dev/null, timed. */
  async gzip([file]) {
    const t = performance.now();
    let bytes = 0;
    const gz = createGzip({ chunkSize: 1 << 16 }).on('data', (c: Buffer) => (bytes += c.length));
    await pipeline(createReadStream(file, { highWaterMark: 1 << 20 }), gz, createWriteStream('/dev/null'));
    return { ms: performance.now() - t, bytes };
  },
  /** whole <file.nq> [engine]: the release in one N3.Store, validated at once with the shipped shapes (default engine:
   *  rdf-validate-shacl, the reference the targets are measured against). */
  async whole([file, engine = 'rdf-validate-shacl']) {
    const shapes = (await loadShapesFolder(defaultShapesDir())).quads;
    const t0 = performance.now();
    const store = await loadDataFiles([file]);
    const t1 = performance.now();
    const outcome = await validate(store, shapes, { engine: engine as ShaclEngine });
    return { loadMs: t1 - t0, validateMs: performance.now() - t1, triples: store.size, violations: outcome.violations };
  },
  /** validate <file>: what `concordat validate <file>` does, bounded validation of a file with the shipped shapes. */
  async validate([file]) {
    const shapes = (await loadShapesFolder(defaultShapesDir())).quads;
    const t = performance.now();
    const run = new BoundedValidation(shapes, { dataLabel: file });
    await streamDataFiles([file], (q) => run.add(q));
    const outcome = await run.finish();
    return { ms: performance.now() - t, triples: outcome.triples, violations: outcome.violations };
  },
  /** load <project>: the load stage alone. */
  /** site <release> <out>: the release as a static site (src/site) */
  async site([release, out]) {
    const { writeSite } = await import('../src/site/index.js');
    const t = performance.now();
    const r = await writeSite(release, out);
    return { ms: performance.now() - t, bytes: r.bytes, files: r.files, documents: r.documents };
  },
  async load([project]) {
    const t = performance.now();
    const { model, stats } = await load(project);
    return {
      ms: performance.now() - t,
      evidenceRows: stats.evidenceRows,
      works: model.works.length,
      images: model.images.count,
    };
  },
};

const [name, ...args] = process.argv.slice(2);
const job = JOBS[name];
if (!job) {
  process.stderr.write(`unknown job "${name}"; known: ${Object.keys(JOBS).join(', ')}\n`);
  process.exit(2);
}
const result = await job(args);
process.stdout.write(JSON.stringify({ ...result, maxRssKiB: process.resourceUsage().maxRSS }) + '\n');
