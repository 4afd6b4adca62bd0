// Curators' decision files and the hand-made gold concordance → work pairs.
import type { ProblemList } from '../errors.js';
import type { Decision, GoldPair, Verdict } from '../model.js';
import { readTable } from './table.js';
import { resolveRef, type RefResolver } from './refs.js';
import { didYouMean } from '../io/did-you-mean.js';

export const VERDICTS: readonly Verdict[] = ['same', 'part', 'related', 'distinct'];

/** ISO 8601 calendar date or date-time (extended format), checked for a real calendar day. */
export function isIsoDate(s: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})(T(\d{2}):(\d{2})(:(\d{2})(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?)?$/.exec(s);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const day = new Date(Date.UTC(y, mo - 1, d));
  if (day.getUTCFullYear() !== y || day.getUTCMonth() !== mo - 1 || day.getUTCDate() !== d) return false;
  if (m[4] && (Number(m[5]) > 23 || Number(m[6]) > 59 || Number(m[8] ?? 0) > 59)) return false;
  return true;
}

async function* pairs(file: string, extra: string[], optional: string[], works: RefResolver, problems: ProblemList, context: string) {
  for await (const row of readTable(file, ',', ['work_a', 'work_b', ...extra], optional, problems, context)) {
    const ends: number[] = [];
    for (const col of ['work_a', 'work_b']) {
      const r = resolveRef(works, row.get(col), 'work');
      if (typeof r === 'number') ends.push(r);
      else problems.add({ ...r, file, line: row.line, field: col });
    }
    if (ends.length < 2) continue;
    if (ends[0] === ends[1]) {
      problems.add({ file, line: row.line, field: 'work_b', message: 'a work paired with itself', hint: 'both columns name the same record' });
      continue;
    }
    yield { row, a: ends[0], b: ends[1] };
  }
}

/** Reads a decisions file (design: "Decisions file"). Later rows for the same pair win (applied by the link stage). */
export async function loadDecisions(file: string, works: RefResolver, out: Decision[], problems: ProblemList): Promise<void> {
  for await (const { row, a, b } of pairs(file, ['verdict', 'curator', 'date'], ['note'], works, problems, 'decisions')) {
    const at = (field: string) => ({ file, line: row.line, field });
    const verdict = row.get('verdict').trim().toLowerCase();
    const curator = row.get('curator').trim();
    const date = row.get('date').trim();
    let bad = false;
    if (!VERDICTS.includes(verdict as Verdict)) {
      const near = didYouMean(verdict, VERDICTS);
      problems.add({ ...at('verdict'), message: `unknown verdict "${row.get('verdict')}"`, hint: near ? `did you mean "${near}"?` : `use one of: ${VERDICTS.join(', ')}` });
      bad = true;
    }
    if (!curator) { problems.add({ ...at('curator'), message: 'no curator named', hint: 'give a name or, better, an ORCID IRI' }); bad = true; }
    if (!isIsoDate(date)) { problems.add({ ...at('date'), message: `"${date}" is not a valid ISO 8601 date`, hint: 'write YYYY-MM-DD, e.g. 2026-11-03' }); bad = true; }
    if (bad) continue;
    out.push({ a, b, verdict: verdict as Verdict, curator, date, note: row.get('note').trim(), file, line: row.line });
  }
}

/** Reads the gold concordance (design: "Gold concordance"): pairs a person established by hand. */
export async function loadGold(file: string, works: RefResolver, out: GoldPair[], problems: ProblemList): Promise<void> {
  for await (const { row, a, b } of pairs(file, [], [], works, problems, 'gold concordance')) out.push({ a, b, line: row.line });
}
