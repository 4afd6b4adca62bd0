// A ValidationOutcome → the text summary and the JSON object the validate command prints.
import { cut, visible } from '../shown.js';
import N3 from 'n3';
import { NS, iri } from '../namespaces.js';
import { pathText } from './paths.js';
import type { ResultRow, ValidationOutcome } from './report.js';

/** Shows an IRI as prefix:local when a known namespace (src/namespaces.ts) covers it, else as <iri>. */
export function showIri(value: string): string {
  for (const [prefix, ns] of Object.entries(NS))
    if (value.startsWith(ns) && /^[A-Za-z_][\w.-]*$/.test(value.slice(ns.length)))
      return `${prefix}:${value.slice(ns.length)}`;
  return `<${value}>`;
}

/** Shows an n3 term id the way Turtle would write it (RDF 1.1 Turtle §2.4–§2.5). */
export function showTerm(id: string): string {
  const term = N3.termFromId(id);
  if (term.termType === 'NamedNode') return showIri(term.value);
  if (term.termType === 'BlankNode') return `_:${term.value}`;
  if (term.termType === 'Literal') {
    const text = JSON.stringify(term.value);
    if (term.language) return `${text}@${term.language}`;
    return term.datatype.value === iri('xsd', 'string') ? text : `${text}^^${showIri(term.datatype.value)}`;
  }
  return id;
}

function messageOf(r: ResultRow): string {
  return r.messages.length > 0
    ? (N3.termFromId(r.messages[0]) as N3.Literal).value
    : `${r.component.slice(NS.sh.length)} not satisfied`;
}

function localName(severity: string): string {
  return severity.startsWith(NS.sh) ? severity.slice(NS.sh.length) : showIri(severity);
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/** The human-readable summary: a headline, counts, then one line per result (severity, focus node, path, message). */
export function summaryText(
  outcome: ValidationOutcome,
  context: { files: number; quads: number; shapesFiles: number },
): string {
  const lines = [
    `Validated ${plural(context.files, 'file')} (${plural(context.quads, 'triple')}) against ${plural(context.shapesFiles, 'shapes file')}.`,
    `${outcome.conforms ? 'Conforms' : 'Does not conform'}: ${plural(outcome.violations, 'violation')}, ${plural(outcome.warnings, 'warning')}, ${plural(outcome.infos, 'info')}.`,
  ];
  for (const r of outcome.results) {
    const path = r.path === null ? '' : ` ${pathText(r.path, showIri)}`;
    const value = r.value === null ? '' : ` (value ${showTerm(r.value)})`;
    const line = `${localName(r.severity)}: ${showTerm(r.focusNode)}${path}: ${messageOf(r)}${value}`;
    lines.push(`  ${visible(cut(line))}`); // terms and messages come from the user's data and shapes
  }
  return lines.join('\n') + '\n';
}

/** The machine-readable outcome: counts and one object per result with full IRIs. */
export function summaryJson(
  outcome: ValidationOutcome,
  context: { files: number; quads: number; shapesFiles: number },
): object {
  return {
    conforms: outcome.conforms,
    violations: outcome.violations,
    warnings: outcome.warnings,
    infos: outcome.infos,
    ...context,
    results: outcome.results.map((r) => ({
      severity: localName(r.severity),
      focusNode: r.focusNode,
      path: r.path === null ? null : pathText(r.path, (v) => `<${v}>`),
      value: r.value,
      message: messageOf(r),
      sourceShape: r.sourceShape,
      component: r.component,
    })),
  };
}
