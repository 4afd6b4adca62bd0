// Load stage: project file + every input file → the typed Model; all problems collected, nothing written.
import path from 'node:path';
import { ProblemList, type Problem } from '../errors.js';
import type { Model, Work, Decision, GoldPair, RunConfig } from '../model.js';
import { int32 } from '../util/columns.js';
import { loadProjectFile } from './project.js';
import { placeholderWarnings } from './placeholders.js';
import { loadCatalogue, type ImageColumns } from './catalogue.js';
import { loadEvidence, newMatchColumns } from './evidence.js';
import { loadDecisions, loadGold } from './decisions.js';
import type { RefResolver } from './refs.js';

export interface LoadStats {
  evidenceRows: number;
  sameRecordMatches: number;
  /** Decisions-file rows naming a pair but no verdict (skipped). */
  undecidedRows: number;
}

export interface Loaded {
  model: Model;
  stats: LoadStats;
}

/**
 * Reads the project file and every catalogue, evidence, decisions and gold file it names (design, pipeline step 1).
 * Throws one UserError listing every problem (capped at 100) as file:line: field: message (hint).
 */
export async function load(projectFile: string): Promise<Loaded> {
  const project = loadProjectFile(projectFile);
  const problems = new ProblemList();
  const warnings: Problem[] = placeholderWarnings(project, projectFile);
  const works: Work[] = [];
  const workIndex = project.partners.map(() => new Map<string, number>());
  const imageIndex = project.partners.map(() => new Map<string, number>());
  const images: ImageColumns = { work: int32(), line: int32(), id: [], role: [], width: int32(), height: int32() };

  for (const [i, partner] of project.partners.entries()) {
    await loadCatalogue(i, partner, works, workIndex[i], images, imageIndex[i], problems, warnings);
  }

  const keys = project.partners.map((p) => p.key);
  const byKey = new Map(keys.map((k, i) => [k, i]));
  const imageRefs: RefResolver = { keys, byKey, index: imageIndex };
  const workRefs: RefResolver = { keys, byKey, index: workIndex };

  const runs: RunConfig[] = [];
  for (const e of project.evidence) if (e.run && !runs.some((r) => r.id === e.run!.id)) runs.push(e.run);
  const m = newMatchColumns();
  const stats: LoadStats = { evidenceRows: 0, sameRecordMatches: 0, undecidedRows: 0 };
  const evidenceFiles = project.evidence.map((e) => e.file);
  const catalogueOk = problems.size === 0;
  for (const [i, e] of project.evidence.entries()) {
    if (!catalogueOk) break; // references cannot be checked against a broken catalogue
    const fileRun = e.run ? runs.findIndex((r) => r.id === e.run!.id) : -1;
    const c = await loadEvidence(e.file, i, fileRun, runs, imageRefs, (img) => images.work.data[img], m, problems);
    stats.evidenceRows += c.rows;
    stats.sameRecordMatches += c.sameRecord;
  }
  if (stats.sameRecordMatches > 0)
    warnings.push({
      file: evidenceFiles[0],
      line: 0,
      field: '',
      message: `${stats.sameRecordMatches} matches between two photos of the same record were set aside`,
      hint: 'they say nothing about other records',
    });

  const decisions: Decision[] = [];
  const gold: GoldPair[] = [];
  if (catalogueOk) {
    for (const f of project.decisions)
      stats.undecidedRows += (await loadDecisions(f, workRefs, decisions, problems, warnings)).undecided;
    if (project.gold) await loadGold(project.gold, workRefs, gold, problems);
  }
  problems.throwIfAny();

  const model: Model = {
    projectFile: path.resolve(projectFile),
    project,
    works,
    workIndex,
    images: {
      count: images.id.length,
      work: images.work.trim(),
      id: images.id,
      line: images.line.trim(),
      role: Uint8Array.from(images.role),
      width: images.width.trim(),
      height: images.height.trim(),
    },
    matches: {
      count: m.a.length,
      a: m.a.trim(),
      b: m.b.trim(),
      score: m.score.trim(),
      overlap: m.overlap.trim(),
      run: m.run.trim(),
      file: m.file.trim(),
      line: m.line.trim(),
    },
    runs,
    evidenceFiles,
    decisions,
    gold,
    warnings,
  };
  return { model, stats };
}
