// SHACL validation results as plain rows → counts, a sorted merged report, its RDF quads and its Turtle file.
import N3 from 'n3';
import { iri } from '../namespaces.js';
import { writeQuads } from '../rdf/serialize.js';
import { pathQuads, type PathTree } from './paths.js';

/**
 * One validation result (SHACL §3.6.2) as plain, structured-clone-safe data. Terms are n3 term ids:
 * an IRI as is, a blank node as `_:label`, a literal as `"lexical"@lang` or `"lexical"^^datatypeIri`.
 */
export interface ResultRow {
  focusNode: string;
  path: PathTree | null;
  value: string | null;
  /** sh:resultSeverity IRI (SHACL §2.1.4). */
  severity: string;
  /** sh:sourceConstraintComponent IRI. */
  component: string;
  sourceShape: string;
  sourceConstraint: string | null;
  /** sh:resultMessage literals (SHACL §2.1.5). */
  messages: string[];
}

/** What one validation found; `conforms` means no result of severity sh:Violation. */
export interface ValidationOutcome {
  conforms: boolean;
  violations: number;
  warnings: number;
  infos: number;
  results: ResultRow[];
  /** The report graph (SHACL §3.6), built from the sorted results with deterministic blank-node labels. */
  reportQuads: N3.Quad[];
}

/** Severity IRI → counter name (SHACL §2.1.4.1). */
const SEVERITY_COUNTER: ReadonlyArray<[string, 'violations' | 'warnings' | 'infos']> = [
  [iri('sh', 'Violation'), 'violations'],
  [iri('sh', 'Warning'), 'warnings'],
  [iri('sh', 'Info'), 'infos'],
];

/** A stable sort and identity key for a row. */
export function rowKey(r: ResultRow): string {
  return JSON.stringify([
    r.focusNode,
    r.path,
    r.component,
    r.sourceShape,
    r.value,
    r.severity,
    r.sourceConstraint,
    r.messages,
  ]);
}

function compare(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * Merges the result rows of several validations of overlapping chunks. A row repeated within one chunk is kept
 * as often as it occurs there (a shape reached along two routes reports twice); a row found in several chunks
 * (the same node copied into each) is kept as often as the most any one chunk has it.
 */
export class RowMerger {
  private readonly rows = new Map<string, { row: ResultRow; count: number }>();
  add(batch: Iterable<ResultRow>): void {
    const local = new Map<string, { row: ResultRow; count: number }>();
    for (const row of batch) {
      const key = rowKey(row);
      const seen = local.get(key);
      if (seen) seen.count++;
      else local.set(key, { row, count: 1 });
    }
    for (const [key, entry] of local) {
      const prior = this.rows.get(key);
      if (!prior || prior.count < entry.count) this.rows.set(key, entry);
    }
  }
  /** The merged rows sorted by code point of their key. */
  sorted(): ResultRow[] {
    const entries = [...this.rows.entries()].sort((a, b) => compare(a[0], b[0]));
    return entries.flatMap(([, e]) => Array.from({ length: e.count }, () => e.row));
  }
}

/** Builds the report graph (SHACL §3.6.1): `_:report`, results `_:r1…`, path nodes `_:r1-p1…`. */
export function reportQuads(rows: ResultRow[]): N3.Quad[] {
  const { namedNode, blankNode, literal, quad } = N3.DataFactory;
  const sh = (local: string) => namedNode(iri('sh', local));
  const term = (id: string) => N3.termFromId(id) as N3.Quad_Object;
  const out: N3.Quad[] = [];
  const report = blankNode('report');
  out.push(quad(report, namedNode(iri('rdf', 'type')), sh('ValidationReport')));
  // SHACL §3.6.1.1: sh:conforms is true only when there are no results at all.
  out.push(
    quad(report, sh('conforms'), literal(rows.length === 0 ? 'true' : 'false', namedNode(iri('xsd', 'boolean')))),
  );
  rows.forEach((_, i) => out.push(quad(report, sh('result'), blankNode(`r${i + 1}`))));
  rows.forEach((r, i) => {
    const node = blankNode(`r${i + 1}`);
    out.push(quad(node, namedNode(iri('rdf', 'type')), sh('ValidationResult')));
    out.push(quad(node, sh('focusNode'), term(r.focusNode)));
    const structure: N3.Quad[] = [];
    if (r.path !== null)
      out.push(quad(node, sh('resultPath'), pathQuads(r.path, `r${i + 1}`, structure) as N3.Quad_Object));
    if (r.value !== null) out.push(quad(node, sh('value'), term(r.value)));
    out.push(quad(node, sh('resultSeverity'), namedNode(r.severity)));
    out.push(quad(node, sh('sourceConstraintComponent'), namedNode(r.component)));
    out.push(quad(node, sh('sourceShape'), term(r.sourceShape)));
    if (r.sourceConstraint !== null) out.push(quad(node, sh('sourceConstraint'), term(r.sourceConstraint)));
    for (const m of r.messages) out.push(quad(node, sh('resultMessage'), term(m)));
    for (const q of structure) out.push(q);
  });
  return out;
}

/** Counts by severity and derives `conforms` from severity, not from sh:conforms (see SHACL §3.6.1.1). */
export function outcomeOf(rows: Iterable<ResultRow> | RowMerger): ValidationOutcome {
  const merger = rows instanceof RowMerger ? rows : new RowMerger();
  if (!(rows instanceof RowMerger)) merger.add(rows);
  const results = merger.sorted();
  const counts = { violations: 0, warnings: 0, infos: 0 };
  for (const r of results) {
    const counter = SEVERITY_COUNTER.find(([s]) => s === r.severity);
    if (counter) counts[counter[1]]++;
  }
  return { conforms: counts.violations === 0, ...counts, results, reportQuads: reportQuads(results) };
}

/** Writes the report graph as Turtle, atomically; same results give the same bytes. */
export async function writeValidationReport(path: string, outcome: ValidationOutcome): Promise<void> {
  await writeQuads(path, 'turtle', outcome.reportQuads);
}
