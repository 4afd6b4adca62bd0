// Quads of one unit → framed, compacted JSON-LD node objects (top-level by type, the rest embedded once where
// referenced).
import type { Literal, Quad, Quad_Object, Quad_Subject } from '@rdfjs/types';
import { NS } from '../namespaces.js';
import type { ContextTables } from './jsonld-context.js';

const RDF_TYPE = NS.rdf + 'type';
const XSD_STRING = NS.xsd + 'string';
const XSD_INTEGER = NS.xsd + 'integer';

/**
 * Whether an xsd:integer lexical form can be written as a JSON number and read back as the same literal: JSON-LD 1.1
 * API §8.6 (object to RDF) turns a number without fractional part below 10^21 into the canonical xsd:integer form,
 * so the form must be canonical (no sign but `-`, no leading zeros, no `-0`) and the value a double holds exactly.
 * Decimals never qualify: a number with a fractional part turns into an xsd:double.
 */
function nativeInteger(lexical: string): boolean {
  return /^(0|-?[1-9][0-9]*)$/.test(lexical) && Number.isSafeInteger(Number(lexical));
}

type Json = string | number | JsonObject | Json[];
interface JsonObject {
  [key: string]: Json;
}

/** One subject's description: rdf:type IRIs and the other properties in first-appearance order. */
interface Subject {
  term: Quad_Subject;
  types: string[];
  props: Map<string, Quad_Object[]>;
  /** Object keys per predicate, made only for long value lists (short ones are scanned). */
  keys?: Map<string, Set<string>>;
}

/** Value lists longer than this get a key set for the duplicate check. */
const SCAN_LIMIT = 16;

/** Key of a node in the unit: blank nodes as `_:label`, IRIs as themselves (an absolute IRI never starts with `_:`). */
const nodeKey = (t: Quad_Subject | Quad_Object) => (t.termType === 'BlankNode' ? '_:' + t.value : t.value);
const objectKey = (o: Quad_Object) =>
  o.termType === 'Literal' ? `"${o.value}"${o.language ? '@' + o.language : '^^' + o.datatype.value}` : nodeKey(o);

/** Same object key (see objectKey) without building it: same term, for literals same value, language and datatype. */
function sameObject(x: Quad_Object, o: Quad_Object): boolean {
  if (x.value !== o.value || x.termType !== o.termType) return false;
  if (x.termType !== 'Literal' || o.termType !== 'Literal') return true;
  return x.language === o.language && (x.language !== '' || x.datatype.value === o.datatype.value);
}

/** Is `o` already among the subject's values `list` for predicate `p`? */
function holds(s: Subject, p: string, list: Quad_Object[], o: Quad_Object): boolean {
  if (list.length <= SCAN_LIMIT) {
    for (const x of list) if (sameObject(x, o)) return true;
    return false;
  }
  s.keys ??= new Map();
  let keys = s.keys.get(p);
  if (!keys) s.keys.set(p, (keys = new Set(list.map(objectKey))));
  return keys.has(objectKey(o));
}

/** Groups quads by subject (graph names dropped), dropping duplicate triples (an RDF graph is a set). */
function group(quads: Quad[]): { subjects: Map<string, Subject>; referenced: Set<string> } {
  const subjects = new Map<string, Subject>();
  const referenced = new Set<string>();
  for (const q of quads) {
    const key = nodeKey(q.subject);
    let s = subjects.get(key);
    if (!s) subjects.set(key, (s = { term: q.subject, types: [], props: new Map() }));
    const o = q.object,
      p = q.predicate.value;
    const isType = p === RDF_TYPE && o.termType === 'NamedNode';
    const list = isType ? undefined : s.props.get(p);
    if (isType ? s.types.includes(o.value) : list !== undefined && holds(s, p, list, o)) continue;
    if (o.termType !== 'Literal') {
      const ok = nodeKey(o);
      if (ok !== key) referenced.add(ok);
    }
    if (isType) s.types.push(o.value);
    else if (list) {
      list.push(o);
      s.keys?.get(p)?.add(objectKey(o));
    } else s.props.set(p, [o]);
  }
  return { subjects, referenced };
}

/**
 * Builds the node objects of one unit (JSON-LD 1.1 Framing §2.3.1 `@embed: @once`, compaction per JSON-LD 1.1 §4):
 * subjects typed with one of `frameTypes` are top-level in first-appearance order; any other subject is embedded
 * the first time a placed node refers to it (depth first, quad order) and referenced by `@id` afterwards; subjects
 * nobody refers to, then any left in reference cycles, become top-level too, so every triple is written once.
 */
export function frameQuads(quads: Quad[], frameTypes: ReadonlySet<string>, ctx: ContextTables): object[] {
  const { subjects, referenced } = group(quads);
  const placed = new Set<string>();
  const tops: Subject[] = [];
  for (const [k, s] of subjects)
    if (s.types.some((t) => frameTypes.has(t))) {
      placed.add(k);
      tops.push(s);
    }
  const idKey = ctx.idKey;

  const nodeValue = (o: Quad_Object, type: string | undefined): Json => {
    const k = nodeKey(o);
    const sub = subjects.get(k);
    if (sub && !placed.has(k)) {
      placed.add(k);
      return node(sub);
    }
    if (type === '@id') return ctx.absolute(k);
    if (type === '@vocab' && o.termType === 'NamedNode') return ctx.vocabIri(o.value);
    return { [idKey]: ctx.absolute(k) };
  };

  const literalValue = (o: Literal, type: string | undefined): Json => {
    if (o.language) {
      if (type === undefined && o.language.toLowerCase() === ctx.language) return o.value;
      return { '@value': o.value, '@language': o.language };
    }
    const dt = o.datatype.value;
    // a JSON number takes the term's coercion on the way back (API §8.6): only under no coercion or xsd:integer's
    if (dt === XSD_INTEGER && (type === undefined || type === XSD_INTEGER) && nativeInteger(o.value))
      return Number(o.value);
    if (dt === type) return o.value;
    if (dt === XSD_STRING) return type === undefined && ctx.language === undefined ? o.value : { '@value': o.value };
    return { '@value': o.value, '@type': ctx.vocabIri(dt) };
  };

  function node(s: Subject): JsonObject {
    const out: JsonObject = { [idKey]: ctx.absolute(nodeKey(s.term)) };
    if (s.types.length)
      out[ctx.typeKey] = s.types.length === 1 ? ctx.vocabIri(s.types[0]) : s.types.map((t) => ctx.vocabIri(t));
    for (const [p, objects] of s.props) {
      const { key, type, set } = ctx.property(p);
      const values = objects.map((o) => (o.termType === 'Literal' ? literalValue(o, type) : nodeValue(o, type)));
      out[key] = set || values.length > 1 ? values : values[0];
    }
    return out;
  }

  const result: object[] = tops.map(node);
  for (const pass of [(k: string) => !referenced.has(k), () => true])
    for (const [k, s] of subjects)
      if (!placed.has(k) && pass(k)) {
        placed.add(k);
        result.push(node(s));
      }
  return result;
}
