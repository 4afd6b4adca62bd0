// Rows of strings → RFC 4180 CSV files (for spreadsheets: UTF-8 with BOM, CRLF; or plain: LF, no BOM), streamed and
// renamed into place.
import { createWriteStream } from 'node:fs';
import { once } from 'node:events';
import { TempFile } from './temp-file.js';

const NEEDS_QUOTES = /[",\r\n]/;
/** First characters a spreadsheet reads as the start of a formula. */
const FORMULA_START = /^[=+\-@]/;

/** One field: quoted when it holds a comma, quote, CR or LF; inner quotes doubled (RFC 4180 §2.6, §2.7). */
export function csvCell(value: string): string {
  return NEEDS_QUOTES.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/**
 * Prefixes `'` to a cell that starts with `=`, `+`, `-` or `@`, so a spreadsheet shows it as text instead of
 * evaluating it (formula injection; common practice, no source).
 */
export function neutralise(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value;
}

/**
 * How a CSV file is written: `spreadsheet` = UTF-8 with a byte-order mark and CRLF record ends (RFC 4180 §2.1), which
 * usual office spreadsheets open with accents intact (without the BOM they guess a legacy code page: common practice,
 * no source); `plain` = LF and no BOM, for pipelines.
 */
export type CsvForm = 'spreadsheet' | 'plain';
export const CSV_FORMS: readonly CsvForm[] = ['spreadsheet', 'plain'];

/** One record with its line end (LF unless given). `neutral[i]` true → cell i is neutralised before quoting. */
export function csvLine(cells: readonly string[], neutral?: readonly boolean[], eol = '\n'): string {
  let out = '';
  for (let i = 0; i < cells.length; i++) {
    if (i > 0) out += ',';
    out += csvCell(neutral?.[i] ? neutralise(cells[i]) : cells[i]);
  }
  return out + eol;
}

const CHUNK = 1 << 16;

/**
 * Writes a CSV file atomically: records go to a temp file beside it in 64 KiB chunks (never one big string) and the
 * file is
 * renamed into place by `close()`. `neutral` marks the columns that are neutralised (see `neutralise`); `form` picks
 * BOM and line ends (see `CsvForm`). Line breaks inside a quoted cell are written as they are.
 */
export class CsvFile {
  private readonly stream;
  private buffer = '';
  private readonly temp: TempFile;
  private readonly eol: string;
  constructor(
    private readonly file: string,
    header: readonly string[],
    private readonly neutral?: readonly boolean[],
    form: CsvForm = 'spreadsheet',
  ) {
    this.temp = new TempFile(file);
    this.stream = createWriteStream(this.temp.temp, { encoding: 'utf8' });
    this.eol = form === 'spreadsheet' ? '\r\n' : '\n';
    this.buffer = (form === 'spreadsheet' ? '\uFEFF' : '') + csvLine(header, undefined, this.eol);
  }

  async row(cells: readonly string[]): Promise<void> {
    this.buffer += csvLine(cells, this.neutral, this.eol);
    if (this.buffer.length >= CHUNK) await this.flush();
  }

  private async flush(): Promise<void> {
    const chunk = this.buffer;
    this.buffer = '';
    if (chunk && !this.stream.write(chunk)) await once(this.stream, 'drain');
  }

  /** Flushes, closes and renames the file into place; returns its path. */
  async close(): Promise<string> {
    try {
      await this.flush();
      this.stream.end();
      await once(this.stream, 'finish');
    } catch (e) {
      this.temp.discard();
      throw e;
    }
    this.temp.commit();
    return this.file;
  }
}
