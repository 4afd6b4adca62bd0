// Publish stage: units of the release → RDF dump files (whole and per partner) and dataset.ttl; SHA256SUMS at the end.
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { readdir, stat, writeFile } from 'node:fs/promises';
import N3 from 'n3';
import path from 'node:path';
import type { Quad } from '@rdfjs/types';
import type { Model } from '../model.js';
import type { Unit } from '../rdf/index.js';
import { progress } from '../util/progress.js';
import { writeQuads } from '../rdf/serialize.js';
import type { ValidationOutcome } from '../validate/shacl.js';
import { ReleaseWriter } from './rdf-files.js';
import { nn, typed } from '../rdf/terms.js';
import { iri } from '../namespaces.js';
import { TEMP_MARKER } from '../io/atomic.js';
import { DUMP_FORMATS, type FormatName } from '../rdf/formats.js';

export interface PublishResult {
  triples: number;
  /** Claim triples per predicate IRI. */
  claims: Record<string, number>;
  validation: ValidationOutcome;
  /** SHA-256 (hex) of the RDF files written, by path relative to the release folder (for {@link writeChecksums}). */
  hashes: Map<string, string>;
  /** Milliseconds spent making each dump format's text (see {@link DumpsWritten}). */
  encodeMs?: Partial<Record<FormatName, number>>;
}

/** What writing the dumps gives back: triples written, and SHA-256 (hex) of the RDF files by relative path. */
export interface DumpsWritten {
  triples: number;
  hashes: Map<string, string>;
  /** Milliseconds spent making each dump format's text on the main thread (the bench reports them). */
  encodeMs: Partial<Record<FormatName, number>>;
}

/**
 * Writes concordance.{ttl,nq,jsonld}, partners/<key>.{ttl,nq,jsonld} (unless the project turns slices off) and
 * dataset.ttl (the last unit, the dataset description, with each file's dcat:byteSize) into `dir` (design, "Outputs"),
 * one unit at a time; with `release.compress` "gzip", a `.gz` copy of every dump beside it, written in the same pass.
 * `size` is the number of units, for the progress bar named `label`.
 */
export async function writeDumps(
  dir: string,
  model: Model,
  units: AsyncIterable<Unit>,
  size: number,
  label: string,
): Promise<DumpsWritten> {
  const writer = new ReleaseWriter(
    dir,
    model.project.release.partnerDumps === false ? null : model.project.partners.map((p) => p.key),
    model.project.release.compress === 'gzip' ? 'gzip' : null,
  );
  const bar = progress(label, size, 'units');
  let done = 0;
  let datasetQuads: Quad[] = [];
  let hashes: Map<string, string>;
  try {
    for await (const unit of units) {
      bar.update(++done);
      if (unit.kind === 'dataset') datasetQuads = unit.quads;
      await writer.add(unit);
    }
    hashes = await writer.close();
  } catch (e) {
    await writer.abort();
    throw e;
  } finally {
    bar.stop();
  }
  await writeQuads(path.join(dir, 'dataset.ttl'), 'turtle', [
    ...datasetQuads,
    ...(await byteSizes(dir, datasetQuads, [...hashes.keys()])),
  ]);
  const encodeMs = Object.fromEntries(DUMP_FORMATS.map((f, i) => [f, writer.encodeMs[i]]));
  return { triples: writer.triples, hashes, encodeMs };
}

/**
 * dcat:byteSize (DCAT 3 §6.8; xsd:nonNegativeInteger, the range DCAT 3 recommends, from memory) of every distribution
 * whose download URL ends in one of `files`, for dataset.ttl only: the copy of the description inside the dumps cannot
 * state their own sizes.
 */
async function byteSizes(dir: string, description: Quad[], files: string[]): Promise<Quad[]> {
  const out: Quad[] = [];
  for (const q of description) {
    if (q.predicate.value !== iri('dcat', 'downloadURL')) continue;
    const f = files.find((x) => q.object.value.endsWith(`/${x}`));
    if (f === undefined) continue;
    const size = (await stat(path.join(dir, f))).size;
    out.push(
      N3.DataFactory.quad(
        q.subject,
        nn(iri('dcat', 'byteSize')),
        typed(String(size), 'nonNegativeInteger'),
        q.graph,
      ) as Quad,
    );
  }
  return out;
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
    .map((d) =>
      path
        .relative(dir, path.join(d.parentPath ?? (d as unknown as { path: string }).path, d.name))
        .split(path.sep)
        .join('/'),
    )
    .filter((f) => f !== 'SHA256SUMS' && f !== TEMP_MARKER)
    .sort();
  const lines: string[] = [];
  for (const f of files) lines.push(`${known.get(f) ?? (await sha256(path.join(dir, f)))}  ${f}`);
  await writeFile(path.join(dir, 'SHA256SUMS'), lines.join('\n') + '\n');
}
