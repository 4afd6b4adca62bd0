// A catalogue export → its delimiter (tab, ';' or ','), header and a sample of rows.
import { openSync, readSync, closeSync } from 'node:fs';
import { readCsv } from '../io/csv-read.js';
import { UserError } from '../errors.js';

/** Candidates in order of preference on a tie. */
export const DELIMITERS = ['\t', ';', ','] as const;

/** Counts each candidate outside double quotes in one line (RFC 4180 §2 quoting). */
function counts(line: string): Map<string, number> {
  const n = new Map<string, number>(DELIMITERS.map((d) => [d, 0]));
  let quoted = false;
  for (const ch of line) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && n.has(ch)) n.set(ch, n.get(ch)! + 1);
  }
  return n;
}

/** The delimiter of a header line: the candidate that occurs most often outside quotes (ties → tab, then ';', then ','). */
export function sniffDelimiter(headerLine: string): string {
  const n = counts(headerLine);
  let best: string = DELIMITERS[DELIMITERS.length - 1];
  let most = 0;
  for (const d of DELIMITERS) if (n.get(d)! > most) [best, most] = [d, n.get(d)!];
  return best;
}

function firstLine(file: string): string {
  let fd: number;
  try {
    fd = openSync(file, 'r');
  } catch (e) {
    throw new UserError({ file, line: 0, field: '--catalogue', message: `cannot read the catalogue export (${(e as NodeJS.ErrnoException).code ?? e})`, hint: 'check the path' });
  }
  const buf = Buffer.alloc(65536);
  const n = readSync(fd, buf, 0, buf.length, 0);
  closeSync(fd);
  return buf.subarray(0, n).toString('utf8').replace(/^\uFEFF/, '').split(/\r?\n|\r/)[0];
}

export interface Sniffed {
  delimiter: string;
  header: string[];
  /** Up to `limit` data rows, cells trimmed. */
  rows: string[][];
}

/** Reads the header and the first `limit` rows of a CSV/TSV export with its sniffed delimiter. */
export async function sniffCatalogue(file: string, limit = 200): Promise<Sniffed> {
  const delimiter = sniffDelimiter(firstLine(file));
  let header: string[] | undefined;
  const rows: string[][] = [];
  for await (const r of readCsv(file, delimiter)) {
    if (!header) { header = r.fields.map((h) => h.trim()); continue; }
    rows.push(r.fields.map((c) => c.trim()));
    if (rows.length >= limit) break;
  }
  if (!header) throw new UserError({ file, line: 0, field: '--catalogue', message: 'the export is empty', hint: 'export the catalogue with a header row' });
  return { delimiter, header, rows };
}
