// The whole flow, top to bottom: load → weigh evidence → link → cluster → analyse → view → units → validate → write
// dumps → reports → history → checksums.
import path from 'node:path';
import { existsSync } from 'node:fs';
import v8 from 'node:v8';
import type { Quad } from '@rdfjs/types';
import { load, type LoadStats } from './load/index.js';
import { weighEvidence } from './evidence/index.js';
import { link } from './link/index.js';
import type { LinkSet } from './link/types.js';
import { cluster, readClusterRegistry, type Clustering } from './cluster/index.js';
import { analyse, type Analysis } from './analyse/index.js';
import { writeReports } from './report/index.js';
import { loadVocabMap, type VocabMap } from './rdf/vocab-map.js';
import { releaseView } from './rdf/view.js';
import { releaseStream } from './rdf/stream.js';
import { shaclGate } from './validate/gate.js';
import { writeValidationReport } from './validate/report.js';
import { writeDumps, writeChecksums, type PublishResult } from './publish/index.js';
import { writeFolderAtomically } from './io/atomic.js';
import { loadShapesFolder, defaultShapesDir } from './validate/files.js';
import { UserError, EXIT } from './errors.js';
import type { Model } from './model.js';
import { readRelease, releaseHistory, writeChanges, type Changes } from './history/index.js';
import type { ShaclEngine } from './validate/shacl.js';

export interface BuildOptions {
  shapesDir?: string;
  workers?: number;
  /** Own triples per SHACL batch, at most (smaller = flatter memory; default 100 000). */
  validationBatch?: number;
  /** SHACL engine (default: the built-in core engine). */
  shaclEngine?: ShaclEngine;
  /** Run SHACL over the release (default true); false skips it and writes no validation.ttl (for timing the rest). */
  validate?: boolean;
  /** Progress lines (stage names) for a terminal; silent when undefined. */
  progress?: (stage: string) => void;
  /** Folder of the previous release; overrides the project's "previous". */
  previous?: string;
  /** CSV files plain (LF, no BOM) instead of for spreadsheets; overrides the project's `release.csv`. */
  csvPlain?: boolean;
  /** Also write gzip-compressed dumps (overrides the project's release.compress). */
  gzip?: boolean;
}

export interface BuildResult {
  outDir: string;
  model: Model;
  stats: LoadStats;
  links: LinkSet;
  clustering: Clustering;
  analysis: Analysis;
  /** The vocab map the release was written with (claim kind + status → predicate). */
  vocab: VocabMap;
  publish: PublishResult;
  /** Changes against the previous release, when there is one. */
  changes?: Changes;
}

/** Link, cluster and per-cluster views: the part of the pipeline that needs no output folder. */
export async function derive(model: Model): Promise<{ links: LinkSet; clustering: Clustering }> {
  const evidence = weighEvidence(model);
  const links = link(model, model.project.policy, evidence);
  const previous = model.project.previous ? await readClusterRegistry(registryFile(model.project.previous)) : undefined;
  const clustering = cluster(model, links, previous);
  return { links, clustering };
}

function registryFile(previous: string): string {
  const f = path.join(previous, 'clusters.csv');
  if (!existsSync(f))
    throw new UserError({
      file: f,
      line: 0,
      field: 'previous',
      message: 'the previous release has no clusters.csv',
      hint: '"previous" must name the folder of an earlier release built by concordat',
    });
  return f;
}

/**
 * Turns off V8's allocation-site pretenuring before the release is written. The RDF stage makes a few hundred
 * short-lived
 * objects per unit at the same allocation sites; a young-generation GC that lands mid-unit finds them all alive, so V8
 * starts allocating them straight into the old generation, which then grows by ~1 GiB per 100k works of garbage
 * between full GCs (peak RSS 1.5 GiB instead of 0.7 GiB at 100k works). A GC policy only: output is unaffected.
 */
function releaseGcPolicy(): void {
  v8.setFlagsFromString('--no-allocation-site-pretenuring');
}

/**
 * Builds a release into `outDir` (design, "Outputs"): written into a temporary folder and renamed at the end;
 * any sh:Violation fails the build with exit 1 and nothing is published.
 */
export async function build(projectFile: string, outDir: string, opts: BuildOptions = {}): Promise<BuildResult> {
  const say = opts.progress ?? (() => undefined);
  say('load');
  const { model, stats } = await load(projectFile);
  if (opts.previous) model.project.previous = path.resolve(opts.previous);
  if (opts.csvPlain) model.project.release.csv = 'plain';
  if (opts.gzip) model.project.release.compress = 'gzip';
  say('link and cluster');
  const { links, clustering } = await derive(model);
  say('analyse');
  const analysis = analyse(model, links, clustering);
  const shapes: Quad[] = (await loadShapesFolder(opts.shapesDir ?? defaultShapesDir())).quads;
  const view = releaseView(
    model,
    links,
    clustering,
    analysis,
    loadVocabMap(model.project.vocabMap, model.project.base),
  );
  const previous = model.project.previous ? await readRelease(model.project.previous) : undefined;
  const history = await releaseHistory(view, clustering, previous);
  const validating = opts.validate !== false;
  return writeFolderAtomically(outDir, async (dir) => {
    say('rdf, validate, publish');
    releaseGcPolicy();
    // units are made, validated and written one at a time: each step below reads the one before it as a stream
    const units = releaseStream(view, history.units, previous?.snapshot.dataset, history.attached);
    const gate = shaclGate(shapes, {
      validate: validating,
      workers: opts.workers,
      batchTriples: opts.validationBatch,
      units: units.size,
      shapesLabel: 'shapes',
      engine: opts.shaclEngine,
    });
    const dumps = await writeDumps(
      dir,
      model,
      gate.pass(units.units),
      units.size,
      validating ? 'writing + SHACL' : 'writing release',
    );
    const validation = await gate.outcome();
    if (validating) await writeValidationReport(path.join(dir, 'validation.ttl'), validation);
    if (!validation.conforms) {
      const first = validation.results.filter((r) => r.severity.endsWith('Violation')).slice(0, 10);
      throw new UserError(
        first.map((r) => ({
          file: 'release',
          line: 0,
          field: r.focusNode,
          message: r.messages[0] ?? r.component,
          hint: `shape ${r.sourceShape}`,
        })),
        EXIT.failure,
      );
    }
    await writeReports(dir, model, links, clustering, analysis, view.namer);
    await writeChanges(dir, history);
    await writeChecksums(dir, dumps.hashes);
    const publish: PublishResult = {
      triples: dumps.triples,
      claims: units.claims(),
      validation,
      hashes: dumps.hashes,
      encodeMs: dumps.encodeMs,
    };
    return {
      outDir: path.resolve(outDir),
      model,
      stats,
      links,
      clustering,
      analysis,
      vocab: view.vocab,
      publish,
      changes: history.changes,
    };
  });
}
