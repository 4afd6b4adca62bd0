// Lines of a release's N-Quads file → parsed statements (subject, predicate, object term, the triple's own N-Triples
// text).
import { createReadStream } from 'node:fs';
import { UserError } from '../errors.js';

/** An object term: IRI, blank node or literal (RDF 1.1 Concepts §3.2–§3.4), lexical form unescaped. */
export type Term =
  | { kind: 'iri'; value: string }
  | { kind: 'bnode'; value: string }
  | { kind: 'literal'; value: string; datatype?: string; language?: string };

/** One statement: IRIs unescaped, and the triple as one N-Triples line (graph dropped, ending in " .\n"). */
export interface Statement {
  s: string;
  p: string;
  o: Term;
  nt: string;
  /** The graph name, when the quad has one. */
  g?: string;
}

const ESC: Record<string, string> = { t: '\t', b: '\b', n: '\n', r: '\r', f: '\f', '"': '"', "'": "'", '\\': '\\' };

/** Undoes N-Triples string and IRI escapes (RDF 1.1 N-Triples §2.4: ECHAR and UCHAR). */
export function unescapeNt(s: string): string {
  if (!s.includes('\\')) return s;
  return s.replace(/\\(?:u([0-9A-Fa-f]{4})|U([0-9A-Fa-f]{8})|(.))/g, (_, u4: string, u8: string, c: string) =>
    u4 ? String.fromCharCode(parseInt(u4, 16)) : u8 ? String.fromCodePoint(parseInt(u8, 16)) : (ESC[c] ?? c),
  );
}

/** End (exclusive) of the term starting at `i`, or -1 when the text there is no term. */
function termEnd(line: string, i: number): number {
  const c = line.charCodeAt(i);
  if (c === 60 /* < */) {
    const j = line.indexOf('>', i + 1);
    return j < 0 ? -1 : j + 1;
  }
  if (c === 95 /* _ */) {
    const j = line.indexOf(' ', i);
    return j < 0 ? -1 : j;
  }
  if (c !== 34 /* " */) return -1;
  let j = i + 1;
  for (;;) {
    j = line.indexOf('"', j);
    if (j < 0) return -1;
    let k = j - 1,
      bs = 0;
    while (line.charCodeAt(k) === 92) {
      bs++;
      k--;
    }
    if (bs % 2 === 0) break;
    j++;
  }
  j++;
  if (line.charCodeAt(j) === 64 /* @ */) {
    const e = line.indexOf(' ', j);
    return e < 0 ? -1 : e;
  }
  if (line.startsWith('^^<', j)) {
    const e = line.indexOf('>', j + 3);
    return e < 0 ? -1 : e + 1;
  }
  return j;
}

function objectTerm(text: string): Term {
  const c = text.charCodeAt(0);
  if (c === 60) return { kind: 'iri', value: unescapeNt(text.slice(1, -1)) };
  if (c === 95) return { kind: 'bnode', value: text.slice(2) };
  const close = text.lastIndexOf('"');
  const value = unescapeNt(text.slice(1, close));
  const rest = text.slice(close + 1);
  if (rest.startsWith('@')) return { kind: 'literal', value, language: rest.slice(1) };
  if (rest.startsWith('^^<')) return { kind: 'literal', value, datatype: unescapeNt(rest.slice(3, -1)) };
  return { kind: 'literal', value };
}

/**
 * Parses one N-Quads line (RDF 1.1 N-Quads §2) as concordat writes them: one statement per line, single spaces
 * between terms. Returns null for a blank line; throws a UserError naming file and line for anything else it cannot
 * read.
 */
export function parseLine(line: string, file: string, lineNo: number): Statement | null {
  if (line.length === 0 || line.charCodeAt(0) === 35 /* # */) return null;
  const bad = (what: string) =>
    new UserError({
      file,
      line: lineNo,
      field: what,
      message: `not an N-Quads statement as concordat writes them`,
      hint: 'site reads concordance.nq of a release built by concordat',
    });
  const e1 = termEnd(line, 0);
  if (e1 < 0 || line.charCodeAt(0) !== 60) throw bad('subject');
  const e2 = termEnd(line, e1 + 1);
  if (e2 < 0 || line.charCodeAt(e1 + 1) !== 60) throw bad('predicate');
  const e3 = termEnd(line, e2 + 1);
  if (e3 < 0) throw bad('object');
  const tail = line.slice(e3).trimEnd();
  if (!/^(?: (?:<[^>]*>|_:\S+))? \.$/.test(tail)) throw bad('graph');
  return {
    s: unescapeNt(line.slice(1, e1 - 1)),
    p: unescapeNt(line.slice(e1 + 2, e2 - 1)),
    o: objectTerm(line.slice(e2 + 1, e3)),
    nt: line.slice(0, e3) + ' .\n',
    g: tail.length > 2 && tail.charCodeAt(1) === 60 ? unescapeNt(tail.slice(2, tail.lastIndexOf('>'))) : undefined,
  };
}

/**
 * Streams the statements of an N-Quads file in file order, 1 MiB at a time; `onStatement` may return a promise
 * (back-pressure).
 */
export async function streamNQuads(
  file: string,
  onStatement: (st: Statement) => void | Promise<void>,
): Promise<number> {
  let rest = '';
  let lineNo = 0;
  for await (const chunk of createReadStream(file, { encoding: 'utf8', highWaterMark: 1 << 20 })) {
    const text = rest + (chunk as string);
    let start = 0;
    for (;;) {
      const nl = text.indexOf('\n', start);
      if (nl < 0) break;
      lineNo++;
      const st = parseLine(text.slice(start, nl), file, lineNo);
      start = nl + 1;
      if (st) {
        const r = onStatement(st);
        if (r) await r;
      }
    }
    rest = text.slice(start);
  }
  if (rest.length) {
    lineNo++;
    const st = parseLine(rest, file, lineNo);
    if (st) {
      const r = onStatement(st);
      if (r) await r;
    }
  }
  return lineNo;
}
