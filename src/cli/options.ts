// Option values shared by commands: numbers checked as they are parsed (the message names the option), deprecated
// aliases.
import { statSync } from 'node:fs';
import path from 'node:path';
import { InvalidArgumentError } from 'commander';
import { NUMBER_GRAMMAR, readNumber } from '../io/number.js';

/**
 * A commander argument parser for a number in [min, max] ((min, max] when `above`; whole when `integer`). Commander
 * reports a refusal as
 * `option '--from <score>' argument 'abc' is invalid. "abc" is not a number …`, so the message names the option.
 */
export function numberIn(
  min: number,
  max: number,
  { integer = false, example, above = false }: { integer?: boolean; example: string; above?: boolean },
): (value: string) => number {
  const what = `a ${integer ? 'whole ' : ''}number ${above ? `above ${min} and at most` : `from ${min} to`} ${max}`;
  return (value) => {
    // the one number grammar of user input (io/number.ts); a decimal comma is read as a decimal point, except in a
    // whole number, where "1,000" is a thousands separator
    const raw = value.trim();
    const read = readNumber(integer ? raw : raw.replace(/^([+-]?\d*),(\d+)$/, '$1.$2'), integer);
    const n = read.ok ? read.value : NaN;
    if (!read.ok && !(integer && NUMBER_GRAMMAR.test(raw)))
      throw new InvalidArgumentError(`"${value}" is not a number: give ${what}, e.g. ${example}.`);
    if (integer && !Number.isInteger(n))
      throw new InvalidArgumentError(`${value} is not a whole number: give ${what}, e.g. ${example}.`);
    if (n < min || n > max || (above && n === min))
      throw new InvalidArgumentError(`${value} is out of range: give ${what}, e.g. ${example}.`);
    return n;
  };
}

/** A score in [0, 1] (proposal thresholds, sweep ends). */
export const score = (example: string) => numberIn(0, 1, { example });

/** Warns on stderr that `old` is a deprecated spelling of `now` (kept so existing scripts keep working). */
export function deprecated(old: string, now: string): void {
  process.stderr.write(`concordat: ${old} is deprecated; use ${now} (the same option in every command)\n`);
}

/** The project file's name in a project folder (what `concordat init` writes). */
export const PROJECT_FILE = 'concordance.json';

/**
 * The `<project>` argument: a project file, or a folder holding `concordance.json` (what `init` made), taken as that
 * file. Anything else is passed on as given, so the reader's own error names it.
 */
export function projectArg(value: string): string {
  try {
    if (statSync(value).isDirectory()) return path.join(value, PROJECT_FILE);
  } catch {
    // not there: the project reader says so, naming the file
  }
  return value;
}
