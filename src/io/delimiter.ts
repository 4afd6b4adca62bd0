// The first line of a delimited file → its column separator (tab, ';', ',' or '|'), counted outside quotes.
import { closeSync, openSync, readSync } from 'node:fs';

/** Candidates in order of preference on a tie. */
export const DELIMITERS = ['\t', ';', ',', '|'] as const;

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

/**
 * The delimiter of a header line: the candidate that occurs most often outside quotes (ties → tab, ';', ',', '|'; none
 * → ',').
 */
export function sniffDelimiter(headerLine: string): string {
  const n = counts(headerLine);
  let best = ',';
  let most = 0;
  for (const d of DELIMITERS) if (n.get(d)! > most) [best, most] = [d, n.get(d)!];
  return best;
}

/**
 * The first line of `file` (BOM dropped; CR, LF or CRLF ends it), read from its first 64 KiB; undefined when
 * unreadable.
 */
export function firstLine(file: string): string | undefined {
  let fd: number;
  try {
    fd = openSync(file, 'r');
  } catch {
    return undefined;
  }
  try {
    const buf = Buffer.alloc(65536);
    let n: number;
    try {
      n = readSync(fd, buf, 0, buf.length, 0);
    } catch {
      return undefined; // a folder opens but cannot be read (EISDIR): the reader names it
    }
    return buf
      .subarray(0, n)
      .toString('utf8')
      .replace(/^\uFEFF/, '')
      .split(/\r?\n|\r/)[0];
  } finally {
    closeSync(fd);
  }
}

/** How a delimiter is named in messages: tab, or the character in quotes. */
export const delimiterName = (d: string) => (d === '\t' ? 'tab' : `"${d}"`);
