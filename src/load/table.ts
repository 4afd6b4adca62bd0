// CSV rows → header-checked records: finds the named columns, reports ragged rows and header-only files.
import type { ProblemList } from '../errors.js';
import { readCsvBatches } from '../io/csv-read.js';
import { didYouMean } from '../io/did-you-mean.js';

export interface TableRow {
  line: number;
  /** value of a named column ('' when the column is optional and absent) */
  get(column: string): string;
}

/**
 * Streams records of a delimited file with a header row. `required` columns must be in the header (problem
 * naming the missing column with a did-you-mean hint); rows whose field count differs from the header's are
 * reported and skipped. A file with a header and no records is a problem too.
 */
export async function* readTable(
  file: string,
  delimiter: string,
  required: string[],
  optional: string[],
  problems: ProblemList,
  context: string,
  onBytes?: (bytesRead: number) => void,
): AsyncGenerator<TableRow> {
  let header: string[] | undefined;
  let index = new Map<string, number>();
  let records = 0;
  for await (const batch of readCsvBatches(file, delimiter, onBytes))
    for (const { fields, line, last } of batch) {
      if (!header) {
        header = fields.map((h) => h.trim());
        const other = [';', '\t', ','].find(
          (d) => d !== delimiter && header!.length === 1 && header![0].split(d).length >= Math.max(2, required.length),
        );
        if (other) {
          const name = other === '\t' ? 'tab' : `"${other}"`;
          problems.add({
            file,
            line,
            field: '',
            message: `the header is one column; it looks ${name}-separated`,
            hint:
              context === 'evidence' || context === 'gold concordance'
                ? `${context} files are comma-separated: save the file with ","`
                : `set "delimiter": ${JSON.stringify(other)} for this file in concordance.json${context === 'decisions' ? ' ({ "file": …, "delimiter": … } in "decisions")' : ''}`,
          });
          return;
        }
        index = new Map(header.map((h, i) => [h, i]));
        for (const c of [...required, ...optional]) {
          const at = header.flatMap((h, i) => (h === c ? [i + 1] : []));
          if (at.length > 1)
            problems.add({
              file,
              line,
              field: c,
              message: `column "${c}" appears ${at.length} times in the header (columns ${at.join(', ')})`,
              hint: 'rename the copies: it is not clear which one holds the values',
            });
        }
        const missing = required.filter((c) => !index.has(c));
        for (const c of missing) {
          const near = didYouMean(c, header);
          problems.add({
            file,
            line,
            field: c,
            message: `column "${c}" (${context}) is not in the header`,
            hint: near
              ? `did you mean "${near}"? the header has: ${header.join(', ')}`
              : `the header has: ${header.join(', ')}`,
          });
        }
        if (missing.length || [...required, ...optional].some((c) => header!.filter((h) => h === c).length > 1)) return;
        for (const c of optional) if (!index.has(c)) index.set(c, -1);
        continue;
      }
      records++;
      if (fields.length !== header.length) {
        problems.add({
          file,
          line,
          field: '',
          message:
            `row has ${fields.length} fields, the header has ${header.length}` +
            (last > line ? `; it runs to line ${last} inside a quoted field` : ''),
          hint:
            last > line
              ? `check that the quote opened on line ${line} is closed where the field ends`
              : fields.length < header.length
                ? 'a field is missing or a delimiter is lost'
                : `a value holds the delimiter ${JSON.stringify(delimiter)} unquoted: quote it`,
        });
        continue;
      }
      yield {
        line,
        get(column: string) {
          const i = index.get(column);
          return i === undefined || i < 0 ? '' : fields[i];
        },
      };
    }
  if (!header)
    problems.add({
      file,
      line: 0,
      field: '',
      message: 'file is empty',
      hint: `expected a header row with: ${required.join(', ')}`,
    });
  else if (records === 0)
    problems.add({
      file,
      line: 1,
      field: '',
      message: 'file has a header but no rows',
      hint: 'export the records too, or remove the file from concordance.json',
    });
}
