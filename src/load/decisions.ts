// Curators' decision files (as spreadsheets save them) and the hand-made gold concordance → work pairs.
import type { Problem, ProblemList } from '../errors.js';
import type { Decision, DecisionFile, GoldPair, Verdict } from '../model.js';
import { firstLine, sniffDelimiter } from '../io/delimiter.js';
import { readTable } from './table.js';
import { resolveRef, type RefResolver } from './refs.js';
import { didYouMean } from '../io/did-you-mean.js';
import { iriProblem, looksLikeIri } from '../io/iri.js';

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

async function* pairs(
  file: string,
  extra: string[],
  optional: string[],
  works: RefResolver,
  problems: ProblemList,
  context: string,
) {
  for await (const row of readTable(file, ',', ['work_a', 'work_b', ...extra], optional, problems, context)) {
    const ends: number[] = [];
    for (const col of ['work_a', 'work_b']) {
      const r = resolveRef(works, row.get(col), 'work');
      if (typeof r === 'number') ends.push(r);
      else problems.add({ ...r, file, line: row.line, field: col });
    }
    if (ends.length < 2) continue;
    if (ends[0] === ends[1]) {
      problems.add({
        file,
        line: row.line,
        field: 'work_b',
        message: 'a work paired with itself',
        hint: 'both columns name the same record',
      });
      continue;
    }
    yield { row, a: ends[0], b: ends[1] };
  }
}

/** Decision-date column of a review queue (named so it is not taken for an artwork's dating) and its older name. */
export const DECIDED_ON = 'decided_on';
const DECIDED_ON_OLD = 'date';

/** What reading one decisions file found beyond the decisions themselves. */
export interface DecisionsRead {
  /** Rows that name a pair but no verdict (a review queue's undecided rows): skipped. */
  undecided: number;
}

/** A date a spreadsheet wrote in its own local form (31.12.2026, 12/31/2026, 2026-12-31 00:00:00). */
const SPREADSHEET_DATE = /^(\d{1,2}[./-]\d{1,2}[./-]\d{2,4}|\d{4}-\d{2}-\d{2} \d{1,2}:\d{2}(:\d{2})?)$/;

/**
 * Reads a decisions file (design: "Decisions file") as a spreadsheet saves it: separator as set for the file or
 * detected from the header (",", ";", tab, "|"), BOM and CRLF accepted, blank rows and rows without a verdict skipped
 * (counted), extra columns ignored. The decision date is `decided_on` (or, in older files, `date`). A row with a
 * verdict must name its curator and date. Later rows for the same pair win (applied by the link stage).
 */
export async function loadDecisions(
  source: DecisionFile,
  works: RefResolver,
  out: Decision[],
  problems: ProblemList,
  warnings: Problem[] = [],
): Promise<DecisionsRead> {
  const { file } = source;
  const delimiter = source.delimiter ?? sniffDelimiter(firstLine(file) ?? '');
  const header = (firstLine(file) ?? '').split(delimiter).map((h) => h.trim().replace(/^"(.*)"$/, '$1'));
  const dateColumn = !header.includes(DECIDED_ON) && header.includes(DECIDED_ON_OLD) ? DECIDED_ON_OLD : DECIDED_ON;
  const read: DecisionsRead = { undecided: 0 };
  const columns = ['work_a', 'work_b', 'verdict', 'curator', dateColumn];
  for await (const row of readTable(file, delimiter, columns, ['note'], problems, 'decisions')) {
    const at = (field: string) => ({ file, line: row.line, field });
    const verdict = row.get('verdict').trim().toLowerCase();
    const curator = row.get('curator').trim();
    const date = row.get(dateColumn).trim();
    if (!verdict) {
      if ([...columns, 'note'].every((c) => row.get(c).trim() === '')) continue; // a blank row a spreadsheet kept
      read.undecided++;
      if (curator || date)
        warnings.push({
          ...at('verdict'),
          message: `no verdict, though ${curator ? 'a curator' : 'a date'} is given: the row is skipped`,
          hint: `write one of ${VERDICTS.join(', ')}, or clear the row`,
        });
      continue;
    }
    const ends: number[] = [];
    for (const col of ['work_a', 'work_b']) {
      const r = resolveRef(works, row.get(col), 'work');
      if (typeof r === 'number') ends.push(r);
      else problems.add({ ...r, ...at(col) });
    }
    let bad = ends.length < 2;
    if (!bad && ends[0] === ends[1]) {
      problems.add({
        ...at('work_b'),
        message: 'a work paired with itself',
        hint: 'both columns name the same record',
      });
      bad = true;
    }
    if (!VERDICTS.includes(verdict as Verdict)) {
      const near = didYouMean(verdict, VERDICTS);
      problems.add({
        ...at('verdict'),
        message: `unknown verdict "${row.get('verdict')}"`,
        hint: near ? `did you mean "${near}"?` : `use one of: ${VERDICTS.join(', ')}`,
      });
      bad = true;
    }
    if (!curator) {
      problems.add({
        ...at('curator'),
        message: `verdict "${verdict}" names no curator`,
        hint: 'give a name or, better, an ORCID IRI',
      });
      bad = true;
    }
    const iriWrong = looksLikeIri(curator) ? iriProblem(curator) : null;
    if (iriWrong) {
      problems.add({
        ...at('curator'),
        message: `"${curator}" starts like an IRI but is not one: ${iriWrong}`,
        hint: 'write an ORCID as https://orcid.org/0000-0002-1825-0097, or a name that does not start with http(s)://',
      });
      bad = true;
    }
    if (!isIsoDate(date)) {
      const hint = SPREADSHEET_DATE.test(date)
        ? 'the spreadsheet may have turned the date into its local form: format the column as text and write YYYY-MM-DD'
        : 'write YYYY-MM-DD, e.g. 2026-11-03';
      problems.add({
        ...at(dateColumn),
        message: date ? `"${date}" is not a valid ISO 8601 date` : `verdict "${verdict}" has no date`,
        hint,
      });
      bad = true;
    }
    if (bad) continue;
    out.push({
      a: ends[0],
      b: ends[1],
      verdict: verdict as Verdict,
      curator,
      date,
      note: row.get('note').trim(),
      file,
      line: row.line,
    });
  }
  return read;
}

/** Reads the gold concordance (design: "Gold concordance"): pairs a person established by hand. */
export async function loadGold(
  file: string,
  works: RefResolver,
  out: GoldPair[],
  problems: ProblemList,
): Promise<void> {
  for await (const { row, a, b } of pairs(file, [], [], works, problems, 'gold concordance'))
    out.push({ a, b, line: row.line });
}
