// A JSON-LD context object → compaction tables: property IRI → term or compact IRI, coercions, containers, vocab IRIs.

/** How one property is written: its key and the term's coercion and container, when a term was chosen. */
export interface PropertyKey {
  key: string;
  /** Expanded `@type` coercion: '@id', '@vocab' or a datatype IRI. */
  type?: string;
  /** `@container: @set`: always an array. */
  set: boolean;
}

interface TermDef {
  iri: string;
  type?: string;
  set: boolean;
  /** Terms with features this writer does not produce (language, reverse, other containers) are never chosen. */
  usable: boolean;
}

const GEN_DELIMS = /[:/?#[\]@]$/;
/** A local part that expands back unchanged and cannot be mistaken for anything else (common practice, no source). */
const SIMPLE_LOCAL = /^[A-Za-z_][A-Za-z0-9_.-]*$/;
const SET_CONTAINER = (c: unknown) => c === '@set' || (Array.isArray(c) && c.length === 1 && c[0] === '@set');
const KNOWN_KEYWORDS = new Set(['@version', '@vocab', '@protected', '@language']);

/**
 * Compaction tables over one context (JSON-LD 1.1 §4.1–§4.3, API §6.2 IRI compaction restricted to what this writer
 * needs): term selection by IRI, compact IRIs from prefix definitions (§4.1.5), vocab-relative IRIs (§4.1.2).
 * Contexts using features outside that subset fail at load instead of producing wrong output.
 */
export class ContextTables {
  readonly vocab?: string;
  readonly language?: string;
  /** Aliases of `@id` and `@type` (§4.1.3), or the keywords themselves. */
  readonly idKey: string;
  readonly typeKey: string;
  private terms = new Map<string, TermDef>();
  private prefixes: [string, string][] = [];
  private byIri = new Map<string, string>();
  private keyCache = new Map<string, PropertyKey>();
  private vocabCache = new Map<string, string>();

  constructor(ctx: Record<string, unknown>) {
    let idKey = '@id',
      typeKey = '@type';
    for (const [k, v] of Object.entries(ctx)) {
      if (k.startsWith('@')) {
        if (!KNOWN_KEYWORDS.has(k)) throw new Error(`JSON-LD writer: context keyword ${k} is not supported`);
        continue;
      }
      if (v === '@id') idKey = k;
      else if (v === '@type') typeKey = k;
    }
    this.idKey = idKey;
    this.typeKey = typeKey;
    this.vocab = typeof ctx['@vocab'] === 'string' ? ctx['@vocab'] : undefined;
    this.language = typeof ctx['@language'] === 'string' ? ctx['@language'].toLowerCase() : undefined;
    // Prefixes first: term @id values may use them.
    for (const [k, v] of Object.entries(ctx))
      if (!k.startsWith('@') && typeof v === 'string' && !v.startsWith('@') && GEN_DELIMS.test(v) && !k.includes(':'))
        this.prefixes.push([k, v]);
    for (const [k, v] of Object.entries(ctx)) {
      if (k.startsWith('@') || v === '@id' || v === '@type' || v === null) continue;
      const def = typeof v === 'string' ? { '@id': v } : (v as Record<string, unknown>);
      const raw = typeof def['@id'] === 'string' ? def['@id'] : k;
      const iri = this.expand(raw);
      const type =
        typeof def['@type'] === 'string'
          ? def['@type'].startsWith('@')
            ? def['@type']
            : this.expand(def['@type'])
          : undefined;
      const extra = Object.keys(def).filter(
        (x) => !['@id', '@type', '@container', '@protected', '@prefix'].includes(x),
      );
      const usable =
        extra.length === 0 &&
        (def['@container'] === undefined || SET_CONTAINER(def['@container'])) &&
        !iri.startsWith('@');
      this.terms.set(k, { iri, type, set: SET_CONTAINER(def['@container']), usable });
      if (usable && !this.byIri.has(iri)) this.byIri.set(iri, k);
    }
  }

  /** Compact IRI, term or vocab-relative string from the context → absolute IRI (§4.1.2, §4.1.5). */
  private expand(value: string): string {
    const colon = value.indexOf(':');
    if (colon > 0) {
      const prefix = this.prefixes.find(([p]) => p === value.slice(0, colon));
      return prefix ? prefix[1] + value.slice(colon + 1) : value;
    }
    const term = this.terms.get(value);
    if (term) return term.iri;
    if (this.vocab) return this.vocab + value;
    throw new Error(`JSON-LD writer: cannot expand ${value} without @vocab`);
  }

  /** True when no prefix or term would capture the absolute IRI's scheme on expansion (§4.1.5). */
  private absoluteOk(iri: string): boolean {
    const colon = iri.indexOf(':');
    return colon > 0 && (iri.startsWith('//', colon + 1) || !this.terms.has(iri.slice(0, colon)));
  }

  /** Absolute IRI in `@id` position (document-relative expansion, API §5.2.2): written in full, checked safe. */
  absolute(iri: string): string {
    if (iri.startsWith('_:') || this.absoluteOk(iri)) return iri;
    throw new Error(`JSON-LD writer: IRI ${iri} has a scheme that the context defines as a term`);
  }

  private reserved(name: string): boolean {
    return this.terms.has(name) || name === this.idKey || name === this.typeKey || name === '__proto__';
  }

  /**
   * An IRI in vocab position (property keys, `@type` values, `@type: @vocab` values; API §6.2 with vocab = true):
   * the term mapped to it, else vocab-relative, else a compact IRI, else the full IRI.
   */
  vocabIri(iri: string): string {
    let out = this.vocabCache.get(iri);
    if (out !== undefined) return out;
    out = this.byIri.get(iri);
    if (out === undefined && this.vocab && iri.startsWith(this.vocab)) {
      const local = iri.slice(this.vocab.length);
      if (SIMPLE_LOCAL.test(local) && !this.reserved(local)) out = local;
    }
    if (out === undefined) {
      let best: [string, string] | undefined;
      for (const [p, ns] of this.prefixes)
        if (
          iri.startsWith(ns) &&
          iri.length > ns.length &&
          (!best || ns.length > best[1].length) &&
          SIMPLE_LOCAL.test(iri.slice(ns.length))
        )
          best = [p, ns];
      if (best) out = `${best[0]}:${iri.slice(best[1].length)}`;
    }
    out ??= this.absolute(iri);
    this.vocabCache.set(iri, out);
    return out;
  }

  /** The key for a property IRI with the chosen term's coercion and container (JSON-LD 1.1 §4.2.3, §4.3.2). */
  property(iri: string): PropertyKey {
    let out = this.keyCache.get(iri);
    if (out) return out;
    const name = this.vocabIri(iri);
    const term = this.terms.get(name);
    out = term?.usable && term.iri === iri ? { key: name, type: term.type, set: term.set } : { key: name, set: false };
    this.keyCache.set(iri, out);
    return out;
  }
}
