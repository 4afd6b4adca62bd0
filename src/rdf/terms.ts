// Small constructors for RDF terms: IRIs from the namespace table, typed literals, decimals, stable hashes.
import * as crypto from 'node:crypto';
import type { Quad, Quad_Graph, Quad_Object, Quad_Subject, NamedNode, Literal, Term } from '@rdfjs/types';
import { NS, type Prefix } from '../namespaces.js';

/**
 * An IRI (RDF/JS NamedNode, RDF 1.1 Concepts §3.2) that keeps its N-Triples and Turtle text once written
 * (src/rdf/text.ts fills them), so a node used in many quads is turned into text once.
 */
export class Iri implements NamedNode {
  /** N-Triples text (`<…>`), once written. */
  nt: string | undefined = undefined;
  /** Turtle text for the encoder whose prefix table is `ttlFor`. */
  ttl: string | undefined = undefined;
  ttlFor: unknown = undefined;
  constructor(readonly value: string) {}
  get termType(): 'NamedNode' {
    return 'NamedNode';
  }
  equals(other: Term | null | undefined): boolean {
    return !!other && other.termType === 'NamedNode' && other.value === this.value;
  }
}

/** A literal (RDF/JS Literal, RDF 1.1 Concepts §3.3) with plain fields: no parsing on every read. */
export class Lit implements Literal {
  constructor(
    readonly value: string,
    readonly language: string,
    readonly datatype: Iri,
  ) {}
  get termType(): 'Literal' {
    return 'Literal';
  }
  equals(other: Term | null | undefined): boolean {
    return (
      !!other &&
      other.termType === 'Literal' &&
      other.value === this.value &&
      other.language === this.language &&
      !other.direction &&
      other.datatype.value === this.datatype.value
    );
  }
}

/** A quad (RDF/JS Quad, RDF 1.1 Concepts §4: a triple in a named graph). */
export class RdfQuad implements Quad {
  constructor(
    readonly subject: Quad_Subject,
    readonly predicate: NamedNode,
    readonly object: Quad_Object,
    readonly graph: Quad_Graph,
  ) {}
  get termType(): 'Quad' {
    return 'Quad';
  }
  get value(): '' {
    return '';
  }
  equals(other: Term | null | undefined): boolean {
    return (
      !!other &&
      other.termType === 'Quad' &&
      this.subject.equals(other.subject) &&
      this.predicate.equals(other.predicate) &&
      this.object.equals(other.object) &&
      this.graph.equals(other.graph)
    );
  }
}

export const nn = (iri: string): Iri => new Iri(iri);
const vocabulary = new Map<Prefix, Map<string, Iri>>();
/** A vocabulary term, made once and shared (the RDF stage asks for the same few dozen terms millions of times). */
export const term = (prefix: Prefix, local: string): Iri => {
  let space = vocabulary.get(prefix);
  if (!space) vocabulary.set(prefix, (space = new Map()));
  let node = space.get(local);
  if (!node) space.set(local, (node = new Iri(NS[prefix] + local)));
  return node;
};
const XSD_STRING = term('xsd', 'string');
export const str = (s: string): Lit => new Lit(s, '', XSD_STRING);
export const typed = (s: string, dt: string): Lit => new Lit(s, '', term('xsd', dt));
export const int = (n: number) => typed(String(n), 'integer');
export const bool = (b: boolean) => typed(String(b), 'boolean');

/**
 * An xsd:decimal literal in canonical-looking form ("0.93", "1.0"): at most 6 fraction digits, never an exponent
 * (XSD 1.1 Part 2 §3.3.3 decimal lexical space has no exponent; RDF 1.1 Turtle §2.5.2: write 1.0, not 1).
 */
export function dec(n: number): Lit {
  let s = n.toFixed(6).replace(/0+$/, '');
  if (s.endsWith('.')) s += '0';
  return typed(s, 'decimal');
}

/**
 * A JSON number's text (RFC 8259 §6: `-? int frac? exp?`) → a literal with that very text, typed by the XSD 1.1 Part 2
 * lexical space that holds it: no fraction and no exponent is xsd:integer (§3.4.13, `[\-+]?[0-9]+`), a fraction
 * without exponent xsd:decimal (§3.3.3.1 decimalLexicalRep), an exponent xsd:double (§3.3.5.1 doubleRep). The text is
 * never passed through a JavaScript number, which would turn a 30-digit integer into 1.2345678901234568e+29.
 */
export function numberLiteral(text: string): Lit {
  return typed(text, /[eE]/.test(text) ? 'double' : text.includes('.') ? 'decimal' : 'integer');
}

/** xsd:dateTime for a full date-time, xsd:date for a calendar date. */
export const when = (s: string) => (s.includes('T') ? typed(s, 'dateTime') : typed(s, 'date'));

/** Node's one-shot digest (Node ≥ 20.12; about 3× faster than a Hash object for short inputs), when present. */
const oneShot = (crypto as unknown as { hash?: (algorithm: string, data: string, encoding: 'hex') => string }).hash;

/** First 16 hex digits of SHA-256 over the parts joined by tabs: short, stable identifiers for pairs. */
export function hash(...parts: string[]): string {
  const text = parts.join('\t');
  return (oneShot ? oneShot('sha256', text, 'hex') : crypto.createHash('sha256').update(text).digest('hex')).slice(
    0,
    16,
  );
}

/** A pattern split at its `{name}` slots: literal text at even indices, slot names at odd ones. */
const compiledPatterns = new Map<string, string[]>();
const encodeSlot = (v: string) =>
  encodeURIComponent(v).replace(/[!'()*]/g, (c) => '%' + c.charCodeAt(0).toString(16).toUpperCase());

/**
 * Fills `{name}` slots of a project IRI pattern; values are percent-encoded except `base` (taken from the
 * third argument when `vars` has none). Each pattern is split once and kept.
 */
export function fill(pattern: string, vars: Record<string, string>, base?: string): string {
  let parts = compiledPatterns.get(pattern);
  if (!parts) compiledPatterns.set(pattern, (parts = pattern.split(/\{(\w+)\}/)));
  let out = parts[0];
  for (let i = 1; i < parts.length; i += 2) {
    const k = parts[i];
    const v = k === 'base' && !('base' in vars) ? base : vars[k];
    if (v === undefined) throw new Error(`IRI pattern ${pattern} needs {${k}}`);
    out += (k === 'base' ? v : encodeSlot(v)) + parts[i + 1];
  }
  return out;
}

/** Quad builder bound to one graph. */
export function inGraph(g: Quad_Graph, out: Quad[]) {
  return (s: Quad_Subject, p: NamedNode, o: Quad_Object) => {
    out.push(new RdfQuad(s, p, o, g));
  };
}
