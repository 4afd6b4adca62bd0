// Warnings → one line per kind (same file, field and message apart from its numbers) with a count and the first
// positions, so thousands of repeats stay readable; verbose lists every one.
import { formatProblem, type Problem } from '../errors.js';

/** Kinds with at most this many warnings are printed in full. */
export const FULL_UP_TO = 3;
/** Positions listed for a summarised kind besides its first warning (common practice, no source). */
export const POSITIONS_SHOWN = 5;

/** Warnings of one kind, in the order they were found. */
export interface WarningKind {
  first: Problem;
  all: Problem[];
}

const kindKey = (w: Problem): string =>
  [w.file, w.field, w.message.replace(/[0-9][0-9,]*/g, '#'), w.hint ?? ''].join('\u0000');

/** Groups warnings by kind, kinds in order of their first warning. */
export function warningKinds(warnings: Problem[]): WarningKind[] {
  const kinds = new Map<string, WarningKind>();
  for (const w of warnings) {
    const key = kindKey(w);
    const k = kinds.get(key);
    if (k) k.all.push(w);
    else kinds.set(key, { first: w, all: [w] });
  }
  return [...kinds.values()];
}

/**
 * The warning lines to print: every warning when `verbose`, else each kind of more than {@link FULL_UP_TO} warnings
 * as its first warning, how many more there are and where the next few are.
 */
export function warningLines(warnings: Problem[], verbose: boolean): string[] {
  if (verbose) return warnings.map(formatProblem);
  const out: string[] = [];
  for (const { first, all } of warningKinds(warnings)) {
    if (all.length <= FULL_UP_TO) {
      out.push(...all.map(formatProblem));
      continue;
    }
    const rest = all.slice(1);
    const lines = rest.slice(0, POSITIONS_SHOWN).map((w) => w.line);
    const more = rest.length > POSITIONS_SHOWN ? ', …' : '';
    const where = lines.every((l) => l > 0) ? `, on lines ${lines.join(', ')}${more}` : '';
    out.push(
      `${formatProblem(first)}; and ${rest.length.toLocaleString('en-US')} more of this kind${where} (--verbose lists all)`,
    );
  }
  return out;
}
