// Delimited text file → rows of fields with the 1-based physical line each record starts on (an RFC 4180 parser).
import { createReadStream } from 'node:fs';
import { UserError, type Problem } from '../errors.js';

export interface CsvRow {
  fields: string[];
  /** 1-based physical line where the record starts (a quoted newline makes a record span lines). */
  line: number;
  /** The physical line it ends on (greater than `line` when a quoted field spans lines). */
  last: number;
}

/**
 * Index of the first byte that starts an invalid UTF-8 sequence, -1 if none; `tail` = bytes of an unfinished sequence
 * at the end.
 */
function firstInvalidUtf8(buf: Uint8Array): { bad: number; tail: number } {
  let i = 0;
  const n = buf.length;
  while (i < n) {
    const b = buf[i];
    if (b < 0x80) {
      i++;
      continue;
    }
    let len: number, min: number;
    if (b >= 0xc2 && b <= 0xdf) [len, min] = [2, 0x80];
    else if (b >= 0xe0 && b <= 0xef) [len, min] = [3, 0x800];
    else if (b >= 0xf0 && b <= 0xf4) [len, min] = [4, 0x10000];
    else return { bad: i, tail: 0 };
    if (i + len > n) {
      for (let k = i + 1; k < n; k++) if ((buf[k] & 0xc0) !== 0x80) return { bad: i, tail: 0 };
      return { bad: -1, tail: n - i };
    }
    let cp = b & (0xff >> (len + 1));
    for (let k = 1; k < len; k++) {
      const c = buf[i + k];
      if ((c & 0xc0) !== 0x80) return { bad: i, tail: 0 };
      cp = (cp << 6) | (c & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return { bad: i, tail: 0 };
    i += len;
  }
  return { bad: -1, tail: 0 };
}

const START = 0; // at the start of a field
const UNQUOTED = 1; // inside an unquoted field
const QUOTED = 2; // inside a quoted field
const PENDING = 3; // saw `"` inside a quoted field: the closing quote, or the first half of `""`
const CLOSED = 4; // after a quoted field's closing quote

/**
 * An RFC 4180 §2 parser fed text in pieces: records of fields, each with the physical line it starts on (a quoted
 * newline makes a record span lines; CR, LF and CRLF each end one line). A `"` inside an unquoted field, or text
 * after a closing quote, is recorded as a stray quote (the caller reports it).
 */
class CsvParser {
  line = 1;
  readonly rows: CsvRow[] = [];
  /** Line of the first stray quote, 0 if none. */
  stray = 0;
  /** When the first stray quote follows a quoted field that spanned lines: the line that field's quote opened on. */
  strayOpened = 0;
  /** Line the open (or last) quoted field's opening quote is on. */
  private quoteLine = 0;
  private state = START;
  private field = '';
  private fields: string[] = [];
  /** Line the open record started on, 0 when no record is open. */
  private recordLine = 0;
  private lastCR = false;
  /** Whether the open record has a quoted field. */
  private quoted = false;
  constructor(private readonly delim: number) {}

  feed(text: string): void {
    const d = this.delim;
    let state = this.state;
    let mark = 0; // start of the current field's text not yet copied into `field`
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      const afterCR = this.lastCR;
      this.lastCR = c === 13;
      if (state === QUOTED) {
        if (c === 34) {
          this.field += text.slice(mark, i);
          mark = i + 1;
          state = PENDING;
        } else if (c === 13 || (c === 10 && !afterCR)) this.line++;
        continue;
      }
      if (state === PENDING) {
        if (c === 34) {
          // `""`: one quote of content
          this.field += '"';
          mark = i + 1;
          state = QUOTED;
          continue;
        }
        state = CLOSED;
      }
      if (c === 10 && afterCR) {
        mark = i + 1;
        continue;
      } // the LF of a CRLF that already ended the record
      if (this.recordLine === 0) this.recordLine = this.line;
      if (c === d) {
        this.fields.push(this.field + text.slice(mark, i));
        this.field = '';
        mark = i + 1;
        state = START;
      } else if (c === 10 || c === 13) {
        this.fields.push(this.field + text.slice(mark, i));
        this.endRecord();
        this.line++;
        mark = i + 1;
        state = START;
      } else if (c === 34 && state === START) {
        state = QUOTED;
        this.quoted = true;
        this.quoteLine = this.line;
        mark = i + 1;
      } else if (c === 34 || state === CLOSED) {
        if (this.stray === 0) {
          this.stray = this.line;
          // text right after a quoted field that ran over lines: most likely its opening quote was never closed, and
          // a later quote was taken as its end
          if (state === CLOSED && this.quoteLine < this.line) this.strayOpened = this.quoteLine;
        }
      } else state = UNQUOTED;
    }
    if (state === QUOTED || state === UNQUOTED) this.field += text.slice(mark);
    this.state = state;
  }

  /** A blank line, or one of unquoted spaces only, is no record. */
  private endRecord(): void {
    if (this.quoted || this.fields.length > 1 || this.fields[0].trim() !== '')
      this.rows.push({ fields: this.fields, line: this.recordLine, last: this.line });
    this.quoted = false;
    this.fields = [];
    this.field = '';
    this.recordLine = 0;
  }

  /** Closes the last record at the end of input; returns the line of an unterminated field's opening quote, else 0. */
  finish(): number {
    if (this.state === QUOTED) return this.quoteLine;
    if (this.recordLine !== 0) {
      this.fields.push(this.field);
      this.endRecord();
    }
    return 0;
  }
}

/**
 * A copy of `s` that no longer keeps alive the chunk of file text it was cut from: V8 represents a long substring
 * as a slice of its parent string, so a kept title would hold its whole 1 MiB chunk. For values stored past loading.
 */
export function detached(s: string): string {
  return s.length < 13 ? s : (' ' + s).slice(1);
}

const problem = (file: string, line: number, message: string, hint?: string): Problem => ({
  file,
  line,
  field: '',
  message,
  hint,
});

/**
 * Streams the records of a CSV/TSV file (RFC 4180 quoting; UTF-8 with or without BOM; CRLF or LF), in batches (one
 * per chunk read). Blank (or only-space) lines are skipped; spaces inside a field are kept (RFC 4180 §2). Structural
 * faults (invalid UTF-8, stray or unterminated quotes) throw a
 * UserError naming the line; ragged rows are left to the caller, which knows the header.
 */
export async function* readCsvBatches(
  file: string,
  delimiter: string,
  onBytes?: (bytesRead: number) => void,
): AsyncGenerator<CsvRow[]> {
  const parser = new CsvParser(delimiter.charCodeAt(0));
  const decoder = new TextDecoder('utf-8', { fatal: true });
  let carry = new Uint8Array(0);

  const drain = (): CsvRow[] => {
    if (parser.stray && parser.strayOpened)
      throw new UserError(
        problem(
          file,
          parser.strayOpened,
          `the quoted field opened here runs to line ${parser.stray}, where text follows its closing quote`,
          `close the quote on line ${parser.strayOpened}, or double every quote inside the field ("")`,
        ),
      );
    if (parser.stray)
      throw new UserError(
        problem(
          file,
          parser.stray,
          'stray quote inside an unquoted field',
          'quote the whole field and double any quote inside it: "a ""b"" c"',
        ),
      );
    return parser.rows.splice(0);
  };

  let stream;
  try {
    stream = createReadStream(file, { highWaterMark: 1 << 20 });
    let bytesRead = 0;
    for await (const chunk of stream as AsyncIterable<Buffer>) {
      bytesRead += chunk.length;
      onBytes?.(bytesRead);
      const buf = carry.length ? Buffer.concat([carry, chunk]) : chunk;
      const { bad, tail } = firstInvalidUtf8(buf);
      if (bad >= 0) {
        parser.feed(decoder.decode(buf.subarray(0, bad), { stream: true }));
        throw new UserError(
          problem(file, parser.line, `invalid UTF-8 (byte 0x${buf[bad].toString(16)})`, 'save the export as UTF-8'),
        );
      }
      carry = tail ? buf.slice(buf.length - tail) : new Uint8Array(0);
      parser.feed(decoder.decode(tail ? buf.subarray(0, buf.length - tail) : buf, { stream: true }));
      const batch = drain();
      if (batch.length) yield batch;
    }
  } catch (e) {
    if (e instanceof UserError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    throw new UserError(
      problem(
        file,
        0,
        code === 'ENOENT' ? 'file not found' : `cannot read file (${code ?? e})`,
        'check the path in concordance.json (paths are relative to it)',
      ),
    );
  }
  if (carry.length)
    throw new UserError(
      problem(file, parser.line, 'invalid UTF-8 (truncated sequence at end of file)', 'save the export as UTF-8'),
    );
  const unterminated = parser.finish();
  if (unterminated)
    throw new UserError(
      problem(
        file,
        unterminated,
        `unterminated quoted field: the quote opened here is still open at the end of the file (line ${parser.line})`,
        'a field opened with " must close with "',
      ),
    );
  const batch = drain();
  if (batch.length) yield batch;
}

/** The records of {@link readCsvBatches} one by one. */
export async function* readCsv(
  file: string,
  delimiter: string,
  onBytes?: (bytesRead: number) => void,
): AsyncGenerator<CsvRow> {
  for await (const batch of readCsvBatches(file, delimiter, onBytes)) yield* batch;
}
