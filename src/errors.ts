// User-facing problems (bad input, bad usage) as data: file, 1-based line, field, message, hint.
import path from 'node:path';
import { cut, visible } from './shown.js';

/** One problem found in the user's input, printed as `file:line: field: message (hint)`. */
export interface Problem {
  file: string;
  /** 1-based physical line where the record starts; 0 when the problem concerns the whole file. */
  line: number;
  /** Column, JSON path or option name; empty when none applies. */
  field: string;
  message: string;
  hint?: string;
  /** Also 1-based; set for JSON syntax errors. */
  column?: number;
}

/** A path as the user would type it: relative to the working folder when inside it. */
export function displayPath(file: string): string {
  if (!path.isAbsolute(file)) return file;
  const rel = path.relative(process.cwd(), file);
  return rel && !rel.startsWith('..') && !path.isAbsolute(rel) ? rel : file;
}

/** A problem with its message, hint and field cut to a readable length (values from users' files can be huge). */
export function bounded(p: Problem): Problem {
  const out = { ...p, field: cut(p.field), message: cut(p.message) };
  if (p.hint !== undefined) out.hint = cut(p.hint);
  return out;
}

/**
 * Formats a problem the way every command prints it: long texts cut and control characters shown as `\xHH`, so a
 * catalogue value can neither flood the terminal nor drive it with escape sequences.
 */
export function formatProblem(p: Problem): string {
  const file = visible(displayPath(p.file));
  const where = p.line > 0 ? `${file}:${p.line}${p.column ? `:${p.column}` : ''}` : file;
  const field = p.field ? ` ${visible(cut(p.field))}:` : '';
  const hint = p.hint ? ` (${visible(cut(p.hint))})` : '';
  return `${where}:${field} ${visible(cut(p.message))}${hint}`;
}

/** Exit codes shared by every command (design: 0 ok, 1 the work found a failure, 2 bad usage or input). */
export const EXIT = { ok: 0, failure: 1, badInput: 2 } as const;

/**
 * The one user-error class. Carries every problem collected (up to a cap) so the CLI prints them all
 * without a stack trace and exits with `exitCode`. Anything else thrown is a bug and is rethrown.
 */
export class UserError extends Error {
  readonly problems: Problem[];
  readonly exitCode: number;
  constructor(problems: Problem[] | Problem, exitCode: number = EXIT.badInput) {
    const list = (Array.isArray(problems) ? problems : [problems]).map(bounded);
    super(list.map(formatProblem).join('\n'));
    this.name = 'UserError';
    this.problems = list;
    this.exitCode = exitCode;
  }
}

/** Collects problems up to a cap; `throwIfAny` raises one UserError holding all of them. */
export class ProblemList {
  readonly items: Problem[] = [];
  truncated = 0;
  constructor(readonly cap = 100) {}
  add(p: Problem): void {
    if (this.items.length < this.cap) this.items.push(bounded(p));
    else this.truncated++;
  }
  get size(): number {
    return this.items.length + this.truncated;
  }
  throwIfAny(): void {
    if (this.size === 0) return;
    const items = [...this.items];
    if (this.truncated > 0)
      items.push({
        file: items[0].file,
        line: 0,
        field: '',
        message: `${this.truncated} more problems not shown`,
        hint: 'fix the ones above first',
      });
    throw new UserError(items);
  }
}
