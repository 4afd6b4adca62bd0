// Small constructors for RDF terms: IRIs from the namespace table, typed literals, decimals, stable hashes.
import { createHash } from 'node:crypto';
import N3 from 'n3';
import type { Quad, Quad_Graph, Quad_Object, Quad_Subject, NamedNode } from '@rdfjs/types';
import { NS, type Prefix } from '../namespaces.js';

const { namedNode, literal, quad } = N3.DataFactory;

export const nn = (iri: string): NamedNode => namedNode(iri);
const vocabulary = new Map<Prefix, Map<string, NamedNode>>();
/** A vocabulary term, made once and shared (the RDF stage asks for the same few dozen terms millions of times). */
export const term = (prefix: Prefix, local: string): NamedNode => {
  let space = vocabulary.get(prefix);
  if (!space) vocabulary.set(prefix, (space = new Map()));
  let node = space.get(local);
  if (!node) space.set(local, (node = namedNode(NS[prefix] + local)));
  return node;
};
export const str = (s: string) => literal(s);
export const typed = (s: string, dt: string) => literal(s, term('xsd', dt));
export const int = (n: number) => typed(String(n), 'integer');
export const bool = (b: boolean) => typed(String(b), 'boolean');

/**
 * An xsd:decimal literal in canonical-looking form ("0.93", "1.0"): at most 6 fraction digits, never an exponent
 * (XSD 1.1 Part 2 §3.3.3 decimal lexical space has no exponent; RDF 1.1 Turtle §2.5.2: write 1.0, not 1).
 */
export function dec(n: number): N3.Literal {
  let s = n.toFixed(6).replace(/0+$/, '');
  if (s.endsWith('.')) s += '0';
  return typed(s, 'decimal');
}

/** xsd:dateTime for a full date-time, xsd:date for a calendar date. */
export const when = (s: string) => (s.includes('T') ? typed(s, 'dateTime') : typed(s, 'date'));

/** First 16 hex digits of SHA-256 over the parts joined by tabs: short, stable identifiers for pairs. */
export function hash(...parts: string[]): string {
  return createHash('sha256').update(parts.join('\t')).digest('hex').slice(0, 16);
}

/** Fills `{name}` slots of a project IRI pattern; values are percent-encoded except `base`. */
export function fill(pattern: string, vars: Record<string, string>): string {
  return pattern.replace(/\{(\w+)\}/g, (_, k: string) => {
    const v = vars[k];
    if (v === undefined) throw new Error(`IRI pattern ${pattern} needs {${k}}`);
    return k === 'base' ? v : encodeURIComponent(v).replace(/[!'()*]/g, (c) => '%' + c.charCodeAt(0).toString(16).toUpperCase());
  });
}

/** Quad builder bound to one graph. */
export function inGraph(g: Quad_Graph, out: Quad[]) {
  return (s: Quad_Subject, p: NamedNode, o: Quad_Object) => {
    out.push(quad(s, p, o, g));
  };
}
