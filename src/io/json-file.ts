// JSON text and files ↔ values: the one reader (syntax errors at their line and column), and atomic JSON writes.
import { readFileSync } from 'node:fs';
import { writeFileAtomically } from './temp-file.js';
import { UserError } from '../errors.js';
import { scanJson, type JsonSpots } from './json-scan.js';
import { osWords } from '../util/os-error.js';

/** Writes `value` as JSON.stringify(value, null, 2) plus a final LF: temp file beside it, then rename. */
export function writeJsonFile(file: string, value: unknown): void {
  writeFileAtomically(file, JSON.stringify(value, null, 2) + '\n');
}

/** Line and column (1-based) of a character offset. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  const before = text.slice(0, offset);
  const line = before.split('\n').length;
  return { line, column: offset - before.lastIndexOf('\n') };
}

/**
 * Parses JSON text (RFC 8259; a leading byte-order mark is ignored). A syntax error is a UserError at the line and
 * column of the error as our own scanner finds it (json-scan.ts: V8's messages give no position for some errors and
 * quote the text), with `hint`.
 */
export function parseJson(text: string, file: string, hint = 'check commas, quotes and brackets near here'): unknown {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  try {
    return JSON.parse(body);
  } catch (e) {
    const scan = scanJson(body, false);
    if (scan.ok) throw e; // the two grammars disagree: a bug, not the user's
    const { line, column } = lineColumn(body, scan.offset);
    throw new UserError({ file, line, column, field: '', message: `JSON syntax error: ${scan.message}`, hint });
  }
}

/** Where each value of valid JSON text starts, and each number's text (see {@link scanJson}). */
export function jsonSpots(text: string): JsonSpots {
  const scan = scanJson(text);
  if (!scan.ok) throw new Error(`JSON.parse accepted what the scanner refuses at ${scan.offset}: ${scan.message}`);
  return scan.spots;
}

/**
 * Reads a UTF-8 JSON file and parses it (see {@link parseJson}); a file that cannot be read is a UserError naming it as
 * `what` with `hint`. Returns the text as well, for callers that place later errors on their lines.
 */
export function readJsonFile(file: string, what: string, hint: string): { text: string; value: unknown } {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    throw new UserError({
      file,
      line: 0,
      field: '',
      message: `cannot read ${what}: ${osWords(e)}`,
      hint,
    });
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  return { text, value: parseJson(text, file) };
}

/** Reads a JSON object (BOM tolerated); a syntax error or a non-object is a UserError naming the file. */
export function readJsonObject(file: string): Record<string, unknown> {
  const { value } = readJsonFile(file, 'project file', 'give the path to concordance.json, e.g. from concordat init');
  if (typeof value !== 'object' || value === null || Array.isArray(value))
    throw new UserError({
      file,
      line: 1,
      field: '',
      message: 'the project file is not a JSON object',
      hint: 'start from concordat init',
    });
  return value as Record<string, unknown>;
}
