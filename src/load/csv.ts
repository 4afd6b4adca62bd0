// Delimited text file → rows of fields with the 1-based physical line each record starts on (fast-csv underneath).
import { createReadStream } from 'node:fs';
import { once } from 'node:events';
import { parse } from 'fast-csv';
import { UserError, type Problem } from '../errors.js';

export interface CsvRow {
  fields: string[];
  /** 1-based physical line where the record starts (a quoted newline makes a record span lines). */
  line: number;
}

/** Index of the first byte that starts an invalid UTF-8 sequence, -1 if none; `tail` = bytes of an unfinished sequence at the end. */
function firstInvalidUtf8(buf: Uint8Array): { bad: number; tail: number } {
  let i = 0;
  const n = buf.length;
  while (i < n) {
    const b = buf[i];
    if (b < 0x80) { i++; continue; }
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

/**
 * Tracks record boundaries the way RFC 4180 §2 quoting defines them, to give each record its physical start line
 * and to catch stray quotes (a `"` inside an unquoted field, which fast-csv would keep as text).
 */
class LineTracker {
  line = 1;
  starts: number[] = [];
  stray: { line: number }[] = [];
  private inQuotes = false;
  private quotePending = false; // saw a `"` inside quotes: closing or first half of `""`
  private fieldStart = true;
  private recordOpen = false;
  private lastCR = false;
  constructor(private readonly delim: number) {}

  feed(text: string): void {
    const d = this.delim;
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      if (this.lastCR) {
        this.lastCR = false;
        if (c === 10) continue; // CRLF counted once
      }
      if (!this.recordOpen) {
        this.recordOpen = true;
        this.starts.push(this.line);
      }
      if (this.quotePending) {
        this.quotePending = false;
        if (c === 34) continue; // escaped quote
        this.inQuotes = false; // closing quote; fall through to handle c
        if (c !== d && c !== 10 && c !== 13) this.stray.push({ line: this.line });
      } else if (this.inQuotes) {
        if (c === 34) this.quotePending = true;
        else if (c === 10 || c === 13) { this.line++; this.lastCR = c === 13; }
        continue;
      }
      if (c === 34) {
        if (this.fieldStart) { this.inQuotes = true; this.fieldStart = false; }
        else this.stray.push({ line: this.line });
        continue;
      }
      if (c === d) { this.fieldStart = true; continue; }
      if (c === 10 || c === 13) {
        this.line++;
        this.lastCR = c === 13;
        this.recordOpen = false;
        this.fieldStart = true;
        continue;
      }
      this.fieldStart = false;
    }
  }
  get unterminated(): boolean {
    return this.inQuotes && !this.quotePending;
  }
}

const problem = (file: string, line: number, message: string, hint?: string): Problem => ({ file, line, field: '', message, hint });

/**
 * Streams the records of a CSV/TSV file (RFC 4180 quoting; UTF-8 with or without BOM; CRLF or LF).
 * Blank lines are skipped. Structural faults (invalid UTF-8, stray or unterminated quotes) throw a UserError
 * naming the line; ragged rows are left to the caller, which knows the header.
 */
export async function* readCsv(file: string, delimiter: string, onBytes?: (bytesRead: number) => void): AsyncGenerator<CsvRow> {
  const tracker = new LineTracker(delimiter.charCodeAt(0));
  const decoder = new TextDecoder('utf-8', { fatal: true });
  const parser = parse({ delimiter, ignoreEmpty: false, quote: '"', escape: '"' });
  const rows: string[][] = [];
  let parseError: Error | undefined;
  parser.on('data', (r: string[]) => rows.push(r));
  parser.on('error', (e: Error) => (parseError = e));
  const ended = new Promise<void>((res) => parser.on('end', res));
  let emitted = 0;
  let carry = new Uint8Array(0);

  const drain = function* (): Generator<CsvRow> {
    if (tracker.stray.length) {
      throw new UserError(problem(file, tracker.stray[0].line, 'stray quote inside an unquoted field', 'quote the whole field and double any quote inside it: "a ""b"" c"'));
    }
    if (parseError) throw new UserError(problem(file, tracker.line, `malformed CSV: ${parseError.message}`, 'check quoting on this line'));
    for (const fields of rows) {
      const line = tracker.starts[emitted++];
      if (fields.length === 0 || (fields.length === 1 && fields[0] === '')) continue;
      yield { fields, line };
    }
    rows.length = 0;
    tracker.starts.splice(0, emitted); // keep only the start lines of records not yet parsed
    emitted = 0;
  };

  let stream;
  try {
    stream = createReadStream(file);
    let bytesRead = 0;
    for await (const chunk of stream as AsyncIterable<Buffer>) {
      bytesRead += chunk.length;
      onBytes?.(bytesRead);
      const buf = carry.length ? Buffer.concat([carry, chunk]) : chunk;
      const { bad, tail } = firstInvalidUtf8(buf);
      if (bad >= 0) {
        const prefix = decoder.decode(buf.subarray(0, bad), { stream: true });
        tracker.feed(prefix);
        throw new UserError(problem(file, tracker.line, `invalid UTF-8 (byte 0x${buf[bad].toString(16)})`, 'save the export as UTF-8'));
      }
      carry = tail ? buf.slice(buf.length - tail) : new Uint8Array(0);
      const text = decoder.decode(tail ? buf.subarray(0, buf.length - tail) : buf, { stream: true });
      tracker.feed(text);
      // wait until fast-csv has parsed what it was given: reading ahead of the parser would queue the whole file
      if (!parser.write(text)) await Promise.race([once(parser, 'drain'), ended]);
      else await new Promise<void>((r) => setImmediate(r));
      yield* drain();
    }
  } catch (e) {
    if (e instanceof UserError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    throw new UserError(problem(file, 0, code === 'ENOENT' ? 'file not found' : `cannot read file (${code ?? e})`, 'check the path in concordance.json (paths are relative to it)'));
  }
  if (carry.length) throw new UserError(problem(file, tracker.line, 'invalid UTF-8 (truncated sequence at end of file)', 'save the export as UTF-8'));
  if (tracker.unterminated) throw new UserError(problem(file, tracker.starts[tracker.starts.length - 1] ?? 1, 'unterminated quoted field', 'a field opened with " must close with "'));
  parser.end();
  await ended;
  yield* drain();
}
