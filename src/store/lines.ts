// N-Quads / N-Triples text → per-graph lists of triple lines, kept term for term (labels, escapes) with their file
// lines.
import { UserError } from '../errors.js';

/**
 * One graph's statements as N-Triples text (`s p o .` lines, each ending in "\n"), with the 1-based source line of
 * each. Kept as one flat string, not an array of line strings: a large JS heap makes the WASM store load many times
 * slower (measured: 17× with 3M small strings alive), so big releases must not hold millions of small strings.
 */
export interface TripleLines {
  text: string;
  count: number;
  lineNos: number[];
}

const SPACE = 32,
  TAB = 9,
  CR = 13,
  HASH = 35,
  DOT = 46,
  LT = 60,
  QUOTE = 34,
  BSLASH = 92,
  AT = 64,
  CARET = 94;
const LANG_CHAR = /[A-Za-z0-9-]/;

const isSpace = (c: number): boolean => c === SPACE || c === TAB || c === CR;

/**
 * Splits one N-Quads line (RDF 1.1 N-Quads §2, grammar [2] statement) into its 3 or 4 term texts.
 * Returns null for blank and comment lines. This only finds term boundaries; the store's own parser checks the rest.
 */
export function scanTerms(line: string, file: string, lineNo: number): string[] | null {
  const fail = (message: string, col: number): never => {
    throw new UserError({
      file,
      line: lineNo,
      column: col + 1,
      field: '',
      message,
      hint: 'the file must be N-Quads or N-Triples, one statement per line',
    });
  };
  const terms: string[] = [];
  const n = line.length;
  let i = 0;
  let ended = false;
  while (i < n) {
    const c = line.charCodeAt(i);
    if (isSpace(c)) {
      i++;
      continue;
    }
    if (c === HASH) break;
    if (ended) fail('text after the closing "."', i);
    const start = i;
    if (c === DOT) {
      ended = true;
      i++;
      continue;
    }
    if (c === LT) {
      const e = line.indexOf('>', i + 1);
      if (e < 0) fail('IRI without closing ">"', i);
      i = e + 1;
    } else if (c === 95 /* _ */ && line.charCodeAt(i + 1) === 58 /* : */) {
      i += 2;
      while (i < n && !isSpace(line.charCodeAt(i)) && line.charCodeAt(i) !== LT && line.charCodeAt(i) !== QUOTE) i++;
      while (line.charCodeAt(i - 1) === DOT) i--; // a label never ends with "."
    } else if (c === QUOTE) {
      i++;
      while (i < n && line.charCodeAt(i) !== QUOTE) i += line.charCodeAt(i) === BSLASH ? 2 : 1;
      if (i >= n) fail('string without closing quote', start);
      i++;
      if (line.charCodeAt(i) === AT) {
        i++;
        while (i < n && LANG_CHAR.test(line[i])) i++;
      } else if (line.charCodeAt(i) === CARET && line.charCodeAt(i + 1) === CARET) {
        if (line.charCodeAt(i + 2) !== LT) fail('datatype must be an IRI in <>', i + 2);
        const e = line.indexOf('>', i + 3);
        if (e < 0) fail('IRI without closing ">"', i + 2);
        i = e + 1;
      }
    } else {
      fail(`unexpected character "${line[i]}"`, i);
    }
    terms.push(line.slice(start, i));
  }
  if (terms.length === 0 && !ended) return null;
  if (!ended) fail('statement does not end with "."', n);
  if (terms.length !== 3 && terms.length !== 4) fail(`expected 3 or 4 terms, found ${terms.length}`, 0);
  return terms;
}

function* eachLine(text: string): Generator<[string, number]> {
  let start = 0;
  let no = 1;
  while (start < text.length) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    yield [text.slice(start, end), no];
    start = end + 1;
    no++;
  }
}

/** Groups statements by graph name (`''` = default graph); each becomes an N-Triples line `s p o .`. */
export function splitByGraph(text: string, file: string): Map<string, TripleLines> {
  const buckets = new Map<string, { lines: string[]; lineNos: number[] }>();
  for (const [line, no] of eachLine(text)) {
    const t = scanTerms(line, file, no);
    if (!t) continue;
    const g = t.length === 4 ? t[3] : '';
    if (g !== '' && g.charCodeAt(0) !== LT)
      throw new UserError({
        file,
        line: no,
        field: '',
        message: `graph name ${g} is a blank node`,
        hint: 'name graphs with IRIs',
      });
    const key = g === '' ? '' : g.slice(1, -1);
    let bucket = buckets.get(key);
    if (!bucket) buckets.set(key, (bucket = { lines: [], lineNos: [] }));
    bucket.lines.push(`${t[0]} ${t[1]} ${t[2]} .`);
    bucket.lineNos.push(no);
  }
  const out = new Map<string, TripleLines>();
  for (const [key, b] of buckets)
    out.set(key, { text: b.lines.join('\n') + '\n', count: b.lines.length, lineNos: b.lineNos });
  return out;
}

/** All statements as triple lines, graph names dropped (for loading a whole file into one graph). */
export function dropGraphNames(text: string, file: string): TripleLines {
  const parts = [...splitByGraph(text, file).values()];
  const lineNos: number[] = [];
  for (const p of parts) for (const n of p.lineNos) lineNos.push(n);
  return { text: parts.map((p) => p.text).join(''), count: lineNos.length, lineNos };
}

/** The lines of a TripleLines text, as an array (for chunking; avoid for large graphs held a long time). */
export function linesOf(t: TripleLines): string[] {
  if (t.count === 0) return [];
  const lines = t.text.split('\n');
  lines.pop();
  return lines;
}

/** Number of distinct triples, counting byte-identical lines once (RDF 1.1 Concepts §3: a graph is a set). */
export function distinctCount(lines: string[]): number {
  return new Set(lines).size;
}

/** Blank-node labels used by a triple line (`_:x` terms), for keeping their statements together. */
export function blankLabels(line: string): string[] {
  if (!line.includes('_:')) return [];
  const t = scanTerms(line, '', 0) ?? [];
  return t.filter((term) => term.startsWith('_:'));
}
