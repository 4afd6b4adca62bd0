// A catalogue export → its delimiter (tab, ';', ',' or '|'), header and a sample of rows.
export { DELIMITERS, sniffDelimiter } from '../io/delimiter.js';
import { firstLine, sniffDelimiter } from '../io/delimiter.js';
import { readCsv } from '../io/csv-read.js';
import { UserError } from '../errors.js';

function headerLine(file: string): string {
  const line = firstLine(file);
  if (line === undefined)
    throw new UserError({
      file,
      line: 0,
      field: '--catalogue',
      message: 'cannot read the catalogue export',
      hint: 'check the path',
    });
  return line;
}

export interface Sniffed {
  delimiter: string;
  header: string[];
  /** Up to `limit` data rows, cells trimmed. */
  rows: string[][];
}

/**
 * Reads the header and the first `limit` rows of a CSV/TSV export with its delimiter (`given`, or sniffed from the
 * header).
 */
export async function sniffCatalogue(file: string, limit = 200, given?: string): Promise<Sniffed> {
  const delimiter = given ?? sniffDelimiter(headerLine(file));
  let header: string[] | undefined;
  const rows: string[][] = [];
  for await (const r of readCsv(file, delimiter)) {
    if (!header) {
      header = r.fields.map((h) => h.trim());
      continue;
    }
    rows.push(r.fields.map((c) => c.trim()));
    if (rows.length >= limit) break;
  }
  if (!header)
    throw new UserError({
      file,
      line: 0,
      field: '--catalogue',
      message: 'the export is empty',
      hint: 'export the catalogue with a header row',
    });
  if (rows.length === 0)
    throw new UserError({
      file,
      line: 1,
      field: '--catalogue',
      message: 'the export has a header and no records',
      hint: 'export the whole catalogue: its columns are recognised from their values too',
    });
  return { delimiter, header, rows };
}
