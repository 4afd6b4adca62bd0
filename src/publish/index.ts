// Publish stage: release view → RDF files (whole and per partner), SHACL-validated chunk by chunk, plus checksums.
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { readdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Quad } from '@rdfjs/types';
import { releaseUnits, Namer, isPublished, type LinksetCounts, type Unit } from '../rdf/index.js';
import { progress } from '../util/progress.js';
import { datasetUnit } from '../rdf/dataset.js';
import type { ReleaseView } from '../rdf/view.js';
import { writeQuads } from '../rdf/serialize.js';
import { validateChunks, writeValidationReport, type ValidationChunk } from '../validate/chunked.js';
import type { ShaclEngine, ValidationOutcome } from '../validate/shacl.js';
import { outcomeOf } from '../validate/report.js';
import { ReleaseWriter, chunkOf, typeIndexOf } from './rdf-files.js';
import { TEMP_MARKER } from '../io/atomic.js';

export interface PublishOptions {
  shapes: Quad[];
  /** IRI of the previous release's dataset (dcat:previousVersion). */
  previousVersion?: string;
  /** Extra units appended before the dataset description (e.g. changes against the previous release). */
  extraUnits?: Unit[];
  workers?: number;
  /** Quads per SHACL batch (default: validateChunks' own). */
  validationBatch?: number;
  /** SHACL engine (default: the built-in core engine). */
  shaclEngine?: ShaclEngine;
  /** Run SHACL (default true); false writes everything except validation.ttl and reports an empty outcome. */
  validate?: boolean;
}

export interface PublishResult {
  triples: number;
  /** Claim triples per predicate IRI. */
  claims: Record<string, number>;
  validation: ValidationOutcome;
  /** SHA-256 (hex) of the RDF files written, by path relative to the release folder (for {@link writeChecksums}). */
  hashes: Map<string, string>;
}

/**
 * Writes concordance.{ttl,nq,jsonld}, partners/<key>.{ttl,nq,jsonld}, dataset.ttl and validation.ttl into `dir`
 * (design, "Outputs"), validating each unit with the shared provenance it points to (SHACL per chunk keeps memory flat).
 */
export async function publishRdf(dir: string, view: ReleaseView, opts: PublishOptions): Promise<PublishResult> {
  const namer = new Namer(view.model, view.vocab.iris);
  const counts: LinksetCounts = new Map();
  const writer = new ReleaseWriter(dir, view.model.project.release.partnerDumps === false ? null : view.model.project.partners.map((p) => p.key));
  let typeIndex = new Map<string, Quad[]>();
  let datasetQuads: Quad[] = [];
  // links outside every cluster become units of their own: counted for the progress bar (a byte per link)
  const inClusters = new Uint8Array(view.links.links.length);
  for (const c of view.clusters) for (const li of c.links) inClusters[li] = 1;
  let stray = 0;
  view.links.links.forEach((l, i) => { if (!inClusters[i] && isPublished(l)) stray++; });
  const bar = progress(opts.validate === false ? 'writing release' : 'writing + SHACL', view.clusters.length + stray + (opts.extraUnits?.length ?? 0) + 2, 'units');
  let done = 0;
  /** Validation chunks are only built when SHACL runs. */
  const validating = opts.validate !== false;
  async function* chunks(): AsyncGenerator<Quad[] | ValidationChunk> {
    for (const unit of releaseUnits(view, namer, counts)) {
      bar.update(++done);
      if (unit.kind === 'provenance' && validating) typeIndex = typeIndexOf(unit);
      await writer.add(unit);
      yield validating ? chunkOf(unit, typeIndex) : unit.quads;
    }
    for (const unit of opts.extraUnits ?? []) {
      bar.update(++done);
      await writer.add(unit);
      yield validating ? chunkOf(unit, typeIndex) : unit.quads;
    }
    const ds = datasetUnit(view.model, namer, counts, opts.previousVersion);
    datasetQuads = ds.quads;
    await writer.add(ds);
    yield ds.quads;
  }
  let validation: ValidationOutcome;
  let hashes: Map<string, string>;
  try {
    if (opts.validate === false) {
      for await (const _ of chunks()); // eslint-disable-line @typescript-eslint/no-unused-vars
      validation = outcomeOf([]);
    } else validation = await validateChunks(chunks(), opts.shapes, { workers: opts.workers, batchQuads: opts.validationBatch, shapesLabel: 'shapes', engine: opts.shaclEngine });
    hashes = await writer.close();
  } catch (e) {
    await writer.abort();
    throw e;
  } finally {
    bar.stop();
  }
  await writeQuads(path.join(dir, 'dataset.ttl'), 'turtle', datasetQuads);
  if (opts.validate !== false) await writeValidationReport(path.join(dir, 'validation.ttl'), validation);
  const claims: Record<string, number> = {};
  for (const [key, n] of counts) {
    const p = key.split('|')[2];
    claims[p] = (claims[p] ?? 0) + n;
  }
  return { triples: writer.triples, claims, validation, hashes };
}

async function sha256(file: string): Promise<string> {
  const h = createHash('sha256');
  for await (const chunk of createReadStream(file)) h.update(chunk as Buffer);
  return h.digest('hex');
}

/**
 * Writes SHA256SUMS (the `sha256sum` text format: hash, two spaces, path) over every file of the folder, sorted.
 * `known` gives hashes already taken while writing (path relative to the folder → hex); other files are read.
 */
export async function writeChecksums(dir: string, known: ReadonlyMap<string, string> = new Map()): Promise<void> {
  const files = (await readdir(dir, { recursive: true, withFileTypes: true }))
    .filter((d) => d.isFile())
    .map((d) => path.relative(dir, path.join(d.parentPath ?? (d as unknown as { path: string }).path, d.name)).split(path.sep).join('/'))
    .filter((f) => f !== 'SHA256SUMS' && f !== TEMP_MARKER)
    .sort();
  const lines: string[] = [];
  for (const f of files) lines.push(`${known.get(f) ?? (await sha256(path.join(dir, f)))}  ${f}`);
  await writeFile(path.join(dir, 'SHA256SUMS'), lines.join('\n') + '\n');
}
