// Shape parameters → checkers: one table row per SHACL core constraint component (SHACL §4), each turning the value
// nodes of a focus node into failures (the value, and a path when it is not the shape's own).
import N3 from 'n3';
import { iri } from '../../namespaces.js';
import type { PathTree } from '../paths.js';
import type { DataGraph } from './data.js';
import type { Shape } from './shapes.js';
import {
  compareTerms,
  isBlank,
  isIri,
  isLiteral,
  langMatches,
  literalParts,
  stringValue,
  wellFormed,
  type TermId,
} from './terms.js';

const ID = N3.termToId as (t: N3.Term) => TermId;

/** A shape referred to by a parameter, compiled on first use (shapes may refer to each other). */
export interface ShapeRef {
  id: TermId;
  get(): Shape;
}

/** What a checker may ask while it runs. */
export interface CheckContext {
  data: DataGraph;
  /** Whether `node` conforms to the shape (SHACL §2.1: validating it produces no results). */
  conforms(ref: ShapeRef, node: TermId): boolean;
  /** Validates `focus` against the shape, its results joining the current ones (sh:property, SHACL §4.7.2). */
  nested(ref: ShapeRef, focus: TermId): void;
}

/** Reports a failure: the offending value (or null) and, when it differs from the shape's, the result path. */
export type Fail = (value: TermId | null, path?: PathTree) => void;
export type Checker = (ctx: CheckContext, focus: TermId, values: readonly TermId[], fail: Fail) => void;

/** What a component's compiler sees: the shape node, one value of its parameter, and helpers over the shapes graph. */
export interface CompileInput {
  node: N3.Term;
  value: N3.Term;
  shape: Shape;
  one(local: string): N3.Term | null;
  list(head: N3.Term): N3.Term[];
  ref(node: N3.Term): ShapeRef;
  siblings(): ShapeRef[];
  /** Predicates that are the paths of the shape's own sh:property shapes (SHACL §4.8.1). */
  propertyPredicates(): string[];
}

export interface Component {
  /** Component local name without "ConstraintComponent". */
  name: string;
  /** The parameter whose values each yield one checker. */
  parameter: string;
  compile(input: CompileInput): Checker | null;
}

/** A checker failing every value node for which `ok` is false, with that value (the common case of SHACL §4). */
const each =
  (ok: (v: TermId, ctx: CheckContext, focus: TermId) => boolean): Checker =>
  (ctx, focus, values, fail) => {
    for (const v of values) if (!ok(v, ctx, focus)) fail(v);
  };

/** SHACL §4.1.3 node kinds → test. */
const NODE_KINDS: Readonly<Record<string, (v: TermId) => boolean>> = {
  IRI: isIri,
  BlankNode: isBlank,
  Literal: isLiteral,
  BlankNodeOrIRI: (v) => !isLiteral(v),
  BlankNodeOrLiteral: (v) => !isIri(v),
  IRIOrLiteral: (v) => !isBlank(v),
};

const range = (name: string, ok: (order: number) => boolean): Component => ({
  name,
  parameter: name[0].toLowerCase() + name.slice(1),
  compile: ({ value }) => {
    const bound = ID(value);
    return each((v) => {
      const order = compareTerms(v, bound);
      return order !== null && ok(order);
    });
  },
});

const length = (name: string, ok: (length: number, limit: number) => boolean): Component => ({
  name,
  parameter: name[0].toLowerCase() + name.slice(1),
  compile: ({ value }) => {
    const limit = Number(value.value);
    return each((v) => {
      const text = stringValue(v);
      return text !== null && ok([...text].length, limit);
    });
  },
});

/** XPath regex flags (XPath and XQuery Functions 3.1 §5.6.1) → JavaScript; `x` strips whitespace, `q` quotes. */
function regexOf(pattern: string, flags: string): RegExp {
  let source = flags.includes('x') ? pattern.replace(/\s+/g, '') : pattern;
  if (flags.includes('q')) source = source.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  return new RegExp(source, [...flags].filter((f) => 'ims'.includes(f)).join(''));
}

const pairwise = (name: string, ok: (order: number) => boolean): Component => ({
  name,
  parameter: name[0].toLowerCase() + name.slice(1),
  compile:
    ({ value }) =>
    (ctx, focus, values, fail) => {
      const others = ctx.data.objects(focus, value.value);
      for (const v of values) {
        for (const o of others) {
          const order = compareTerms(v, o);
          if (order === null || !ok(order)) fail(v);
        }
      }
    },
});

const qualified = (name: string, tooMany: boolean): Component => ({
  name,
  parameter: name[0].toLowerCase() + name.slice(1),
  compile: ({ value, one, ref, siblings }) => {
    const shapeNode = one('qualifiedValueShape');
    if (!shapeNode) return null;
    const target = ref(shapeNode);
    const limit = Number(value.value);
    const disjoint = one('qualifiedValueShapesDisjoint')?.value === 'true';
    const others = disjoint ? siblings() : [];
    return (ctx, _focus, values, fail) => {
      let count = 0;
      for (const v of values) if (ctx.conforms(target, v) && !others.some((s) => ctx.conforms(s, v))) count++;
      if (tooMany ? count > limit : count < limit) fail(null);
    };
  },
});

/** The SHACL core constraint components (SHACL §4.1–§4.8), in the order of the specification. */
export const COMPONENTS: readonly Component[] = [
  { name: 'Class', parameter: 'class', compile: ({ value }) => each((v, ctx) => ctx.data.isInstance(v, ID(value))) },
  {
    name: 'Datatype',
    parameter: 'datatype',
    compile: ({ value }) =>
      each((v) => {
        if (!isLiteral(v)) return false;
        const parts = literalParts(v);
        return parts.datatype === value.value && wellFormed(parts);
      }),
  },
  {
    name: 'NodeKind',
    parameter: 'nodeKind',
    compile: ({ value }) => {
      const ok = NODE_KINDS[value.value.slice(iri('sh', '').length)];
      return ok ? each(ok) : each(() => false);
    },
  },
  {
    name: 'MinCount',
    parameter: 'minCount',
    compile:
      ({ value }) =>
      (_c, _f, values, fail) => {
        if (values.length < Number(value.value)) fail(null);
      },
  },
  {
    name: 'MaxCount',
    parameter: 'maxCount',
    compile:
      ({ value }) =>
      (_c, _f, values, fail) => {
        if (values.length > Number(value.value)) fail(null);
      },
  },
  range('MinExclusive', (o) => o > 0),
  range('MinInclusive', (o) => o >= 0),
  range('MaxExclusive', (o) => o < 0),
  range('MaxInclusive', (o) => o <= 0),
  length('MinLength', (n, limit) => n >= limit),
  length('MaxLength', (n, limit) => n <= limit),
  {
    name: 'Pattern',
    parameter: 'pattern',
    compile: ({ value, one }) => {
      const regex = regexOf(value.value, one('flags')?.value ?? '');
      return each((v) => {
        const text = stringValue(v);
        return text !== null && regex.test(text);
      });
    },
  },
  {
    name: 'LanguageIn',
    parameter: 'languageIn',
    compile: ({ value, list }) => {
      const ranges = list(value).map((t) => t.value);
      return each((v) => isLiteral(v) && ranges.some((r) => langMatches(literalParts(v).language, r)));
    },
  },
  {
    name: 'UniqueLang',
    parameter: 'uniqueLang',
    compile: ({ value }) =>
      value.value !== 'true'
        ? null
        : (_c, _f, values, fail) => {
            const seen = new Map<string, number>();
            for (const v of values) {
              const language = isLiteral(v) ? literalParts(v).language.toLowerCase() : '';
              if (language) seen.set(language, (seen.get(language) ?? 0) + 1);
            }
            for (const count of seen.values()) if (count > 1) fail(null);
          },
  },
  {
    name: 'Equals',
    parameter: 'equals',
    compile:
      ({ value }) =>
      (ctx, focus, values, fail) => {
        const others = ctx.data.objects(focus, value.value);
        for (const v of values) if (!others.includes(v)) fail(v);
        for (const o of others) if (!values.includes(o)) fail(o);
      },
  },
  {
    name: 'Disjoint',
    parameter: 'disjoint',
    compile:
      ({ value }) =>
      (ctx, focus, values, fail) => {
        const others = ctx.data.objects(focus, value.value);
        for (const v of values) if (others.includes(v)) fail(v);
      },
  },
  pairwise('LessThan', (o) => o < 0),
  pairwise('LessThanOrEquals', (o) => o <= 0),
  {
    name: 'Not',
    parameter: 'not',
    compile: ({ value, ref }) => {
      const s = ref(value);
      return each((v, ctx) => !ctx.conforms(s, v));
    },
  },
  {
    name: 'And',
    parameter: 'and',
    compile: ({ value, ref, list }) => {
      const ss = list(value).map(ref);
      return each((v, ctx) => ss.every((s) => ctx.conforms(s, v)));
    },
  },
  {
    name: 'Or',
    parameter: 'or',
    compile: ({ value, ref, list }) => {
      const ss = list(value).map(ref);
      return each((v, ctx) => ss.some((s) => ctx.conforms(s, v)));
    },
  },
  {
    name: 'Xone',
    parameter: 'xone',
    compile: ({ value, ref, list }) => {
      const ss = list(value).map(ref);
      return each((v, ctx) => ss.filter((s) => ctx.conforms(s, v)).length === 1);
    },
  },
  {
    name: 'Node',
    parameter: 'node',
    compile: ({ value, ref }) => {
      const s = ref(value);
      return each((v, ctx) => ctx.conforms(s, v));
    },
  },
  {
    // sh:property reports the nested shape's own results, not a result of this component (SHACL §4.7.2)
    name: 'Property',
    parameter: 'property',
    compile: ({ value, ref }) => {
      const s = ref(value);
      return (ctx, _focus, values) => {
        for (const v of values) ctx.nested(s, v);
      };
    },
  },
  qualified('QualifiedMinCount', false),
  qualified('QualifiedMaxCount', true),
  {
    name: 'Closed',
    parameter: 'closed',
    compile: ({ value, one, list, propertyPredicates }) => {
      if (value.value !== 'true') return null;
      const ignored = one('ignoredProperties');
      const allowed = new Set<string>([...propertyPredicates(), ...(ignored ? list(ignored).map((t) => t.value) : [])]);
      return (ctx, _focus, values, fail) => {
        for (const v of values) {
          const pairs = ctx.data.pairs(v);
          for (let i = 0; i < pairs.length; i += 2) if (!allowed.has(pairs[i])) fail(pairs[i + 1], pairs[i]);
        }
      };
    },
  },
  {
    name: 'HasValue',
    parameter: 'hasValue',
    compile: ({ value }) => {
      const id = ID(value);
      return (_c, _f, values, fail) => {
        if (!values.includes(id)) fail(null);
      };
    },
  },
  {
    name: 'In',
    parameter: 'in',
    compile: ({ value, list }) => {
      const ids = new Set(list(value).map(ID));
      return each((v) => ids.has(v));
    },
  },
];
