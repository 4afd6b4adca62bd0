// RDF terms and quads → N-Triples / N-Quads / Turtle text, without per-quad writer objects (the publishing hot path).
import type { Quad, Term } from '@rdfjs/types';
import { Iri, Lit } from './terms.js';

const XSD_STRING = 'http://www.w3.org/2001/XMLSchema#string';
const RDF_LANG_STRING = 'http://www.w3.org/1999/02/22-rdf-syntax-ns#langString';
const RDF_TYPE = 'http://www.w3.org/1999/02/22-rdf-syntax-ns#type';

/** ECHAR and UCHAR escapes for a quoted string (RDF 1.1 N-Triples §2.4, Turtle §2.5.1). */
function escapeString(s: string): string {
  if (!/["\\\u0000-\u001f\u007f\ud800-\udfff]/.test(s)) return s;
  let out = '';
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    const ch = s[i];
    if (ch === '"') out += '\\"';
    else if (ch === '\\') out += '\\\\';
    else if (ch === '\n') out += '\\n';
    else if (ch === '\r') out += '\\r';
    else if (ch === '\t') out += '\\t';
    else if (c < 0x20 || c === 0x7f) out += '\\u' + c.toString(16).toUpperCase().padStart(4, '0');
    else if (
      c >= 0xd800 &&
      c <= 0xdbff &&
      i + 1 < s.length &&
      s.charCodeAt(i + 1) >= 0xdc00 &&
      s.charCodeAt(i + 1) <= 0xdfff
    ) {
      out += ch + s[i + 1];
      i++;
    } else if (c >= 0xd800 && c <= 0xdfff)
      out += '\\u' + c.toString(16).toUpperCase(); // lone surrogate: keep it representable
    else out += ch;
  }
  return out;
}

/** IRIREF with the characters it may not hold written as UCHAR (RDF 1.1 N-Triples §2.3, [8] IRIREF). */
function iriRef(iri: string): string {
  if (!/[\u0000-\u0020<>"{}|^`\\]/.test(iri)) return `<${iri}>`;
  return (
    '<' +
    iri.replace(
      /[\u0000-\u0020<>"{}|^`\\]/g,
      (c) => '\\u' + c.charCodeAt(0).toString(16).toUpperCase().padStart(4, '0'),
    ) +
    '>'
  );
}

/** A literal's N-Triples text from its parts. */
function ntLiteral(value: string, language: string, datatype: Term): string {
  const body = `"${escapeString(value)}"`;
  if (language) return `${body}@${language}`;
  return datatype.value === XSD_STRING ? body : `${body}^^${ntTerm(datatype)}`;
}

/** One term in N-Triples syntax (IRIs made by src/rdf/terms.ts keep their text after the first time). */
export function ntTerm(t: Term): string {
  if (t instanceof Iri) return (t.nt ??= iriRef(t.value));
  if (t instanceof Lit) return ntLiteral(t.value, t.language, t.datatype);
  switch (t.termType) {
    case 'NamedNode':
      return iriRef(t.value);
    case 'BlankNode':
      return '_:' + t.value;
    case 'Literal':
      return ntLiteral(t.value, t.language, t.datatype);
    default:
      throw new Error(`cannot write a ${t.termType} term in N-Triples`);
  }
}

/** Quads as N-Quads lines (RDF 1.1 N-Quads §2); `graphs: false` gives N-Triples. */
export function nquadsText(quads: readonly Quad[], graphs = true): string {
  let out = '';
  let graph: Term | undefined;
  let ending = '';
  for (const q of quads) {
    out += `${ntTerm(q.subject)} ${ntTerm(q.predicate)} ${ntTerm(q.object)}`;
    if (!graphs || q.graph.termType === 'DefaultGraph') out += ' .\n';
    else {
      // the line ending for a graph, made once per run of quads in that graph
      if (q.graph !== graph) {
        graph = q.graph;
        ending = ` ${ntTerm(graph)} .\n`;
      }
      out += ending;
    }
  }
  return out;
}

/**
 * PN_LOCAL we are sure of: letters, digits, `_` and `-`, not starting with `-` (a safe subset of Turtle §6.5 [168s]).
 */
const SAFE_LOCAL = /^[A-Za-z0-9_][A-Za-z0-9_-]*$/;

/** Prefix declarations (Turtle §2.4) in a fixed order. */
export function turtlePrefixes(prefixes: Record<string, string>): string {
  return (
    Object.entries(prefixes)
      .map(([p, ns]) => `@prefix ${p}: ${iriRef(ns)} .\n`)
      .join('') + '\n'
  );
}

/**
 * Turtle text for a run of quads (graph names dropped), grouping consecutive triples of one subject with `;` and of
 * one predicate with `,` (Turtle §2.3), prefixed names where the local part is plainly safe, `a` for rdf:type.
 * Each call returns complete statements, so fragments from several calls can be concatenated after one prefix block.
 */
export class TurtleEncoder {
  private readonly spaces: [string, string][];
  constructor(prefixes: Record<string, string>) {
    // longest namespace first, so nested namespaces pick the most specific prefix
    this.spaces = Object.entries(prefixes).sort((a, b) => b[1].length - a[1].length);
  }
  /** A prefixed name when one fits, else the IRIREF (taken from the term's N-Triples text when it has one). */
  private name(iri: string, t?: Iri): string {
    for (const [p, ns] of this.spaces)
      if (iri.startsWith(ns) && SAFE_LOCAL.test(iri.slice(ns.length))) return `${p}:${iri.slice(ns.length)}`;
    return t ? (t.nt ??= iriRef(iri)) : iriRef(iri);
  }
  /** An IRI's Turtle text, kept on IRIs made by src/rdf/terms.ts (for this encoder's prefix table). */
  private iri(t: Term): string {
    if (!(t instanceof Iri)) return this.name(t.value);
    if (t.ttlFor !== this.spaces) {
      t.ttl = this.name(t.value, t);
      t.ttlFor = this.spaces;
    }
    return t.ttl!;
  }
  private term(t: Term): string {
    if (t.termType === 'NamedNode') return this.iri(t);
    if (
      t.termType === 'Literal' &&
      !t.language &&
      t.datatype.value !== XSD_STRING &&
      t.datatype.value !== RDF_LANG_STRING
    )
      return `"${escapeString(t.value)}"^^${this.iri(t.datatype)}`;
    return ntTerm(t);
  }
  /**
   * One block per subject (Turtle §2.3 predicate lists), subjects in order of first appearance, each subject's
   * predicates in order of first appearance with their objects as one object list, and a blank line after each block.
   * Quads keep their relative order within a predicate, so equal input gives equal text.
   */
  encode(quads: readonly Quad[]): string {
    let out = '';
    for (const block of bySubject(quads)) {
      let p = '';
      for (let i = 0; i < block.length; i++) {
        const q = block[i];
        const predicate = q.predicate.value;
        if (i === 0)
          out +=
            this.term(q.subject) +
            ' ' +
            (predicate === RDF_TYPE ? 'a' : this.term(q.predicate)) +
            ' ' +
            this.term(q.object);
        else if (predicate === p) out += ', ' + this.term(q.object);
        else out += ';\n    ' + (predicate === RDF_TYPE ? 'a' : this.term(q.predicate)) + ' ' + this.term(q.object);
        p = predicate;
      }
      out += ' .\n\n';
    }
    return out;
  }
}

/** A quad's subject as a key: blank nodes as `_:label`, IRIs as themselves. */
export const subjectKey = (q: Quad) => (q.subject.termType === 'BlankNode' ? '_:' + q.subject.value : q.subject.value);

/**
 * Quads grouped by subject (first appearance order), and within a subject by predicate (first appearance order).
 * Runs that are already grouped, the common case, are passed through without maps.
 */
export function bySubject(quads: readonly Quad[]): (readonly Quad[])[] {
  const subjects = new Map<string, Quad[]>();
  for (const q of quads) {
    const k = subjectKey(q);
    const list = subjects.get(k);
    if (list) list.push(q);
    else subjects.set(k, [q]);
  }
  const out: (readonly Quad[])[] = [];
  for (const list of subjects.values()) out.push(byPredicate(list));
  return out;
}

/** One subject's quads with each predicate's quads together (first appearance order, stable within a predicate). */
function byPredicate(list: Quad[]): Quad[] {
  // grouped already when every predicate change goes to a predicate not seen before
  let seen: Set<string> | null = null;
  let prev = '';
  let grouped = true;
  for (const q of list) {
    const p = q.predicate.value;
    if (p === prev) continue;
    seen ??= new Set();
    if (seen.has(p)) {
      grouped = false;
      break;
    }
    seen.add(p);
    prev = p;
  }
  if (grouped) return list;
  const byP = new Map<string, Quad[]>();
  for (const q of list) {
    const l = byP.get(q.predicate.value);
    if (l) l.push(q);
    else byP.set(q.predicate.value, [q]);
  }
  return [...byP.values()].flat();
}
