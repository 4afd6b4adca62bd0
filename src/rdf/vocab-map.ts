// vocab-map/*.json → the table from claim kind + status to predicate IRI, and the project's IRI patterns.
import { iriProblem } from '../io/iri.js';
import { fill } from './terms.js';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';
import { UserError } from '../errors.js';
import { readJsonFile } from '../io/json-file.js';
import type { LinkKind, LinkStatus } from '../link/types.js';

/** The vocab-map folder shipped with the package (repo root / vocab-map). */
export const DEFAULT_VOCAB_MAP = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '..',
  '..',
  '..',
  'vocab-map',
  'claims.json',
);

const Row = z.strictObject({ kind: z.string(), status: z.string(), predicate: z.string().nullable() });
const FileSchema = z.strictObject({
  $comment: z.string().optional(),
  extends: z.string().optional(),
  prefixes: z.record(z.string(), z.string()).optional(),
  claims: z.array(Row),
  iris: z.record(z.string(), z.string()).optional(),
});

export interface VocabMap {
  /** Predicate IRI of the claim triple, or null for none. */
  predicate(kind: LinkKind, status: LinkStatus): string | null;
  /** IRI pattern by name, e.g. `link` → `{base}link/{hash}`. */
  iris: Record<string, string>;
  /** Every predicate the map can produce (for SHACL sh:in and VoID). */
  predicates: string[];
  /** What is published per claim kind and status: the resolved table, one row per kind × status. */
  table: { kind: LinkKind; status: LinkStatus; predicate: string | null }[];
  /** Predicates only confirmed claims are given (e.g. owl:sameAs, dcterms:isPartOf): never a proposal's. */
  confirmedOnly: string[];
}

function readMapFile(
  file: string,
  seen: Set<string>,
): { prefixes: Record<string, string>; claims: z.infer<typeof Row>[]; iris: Record<string, string> } {
  if (seen.has(file))
    throw new UserError({
      file,
      line: 0,
      field: 'extends',
      message: 'vocab map extends itself',
      hint: 'remove the cycle',
    });
  seen.add(file);
  const { value: raw } = readJsonFile(file, 'vocab map', 'check the "vocabMap" path in concordance.json');
  const parsed = FileSchema.safeParse(raw);
  if (!parsed.success) {
    const i = parsed.error.issues[0];
    throw new UserError({
      file,
      line: 0,
      field: i.path.join('.'),
      message: i.message,
      hint: 'see vocab-map/claims.json for the format',
    });
  }
  const own = parsed.data;
  const parent = own.extends
    ? readMapFile(path.resolve(path.dirname(file), own.extends), seen)
    : { prefixes: {}, claims: [], iris: {} };
  return {
    prefixes: { ...parent.prefixes, ...own.prefixes },
    claims: [...own.claims, ...parent.claims],
    iris: { ...parent.iris, ...own.iris },
  };
}

const slotsOf = (pattern: string): string[] => [...pattern.matchAll(/\{([^{}]*)\}/g)].map((m) => m[1]);

/**
 * Checks every IRI pattern when the map loads (RFC 6570 level-1 slots, as the RDF stage fills them): each name is one
 * the RDF stage mints, each `{slot}` one it fills for that name (those of the shipped map's pattern), no stray brace.
 */
function checkPatterns(file: string, iris: Record<string, string>): void {
  const shipped = path.resolve(file) === DEFAULT_VOCAB_MAP ? iris : readMapFile(DEFAULT_VOCAB_MAP, new Set()).iris;
  const bad = (name: string, message: string, hint: string) =>
    new UserError({ file, line: 0, field: `iris.${name}`, message, hint });
  for (const name of Object.keys(shipped))
    if (iris[name] === undefined)
      throw bad(
        name,
        'no IRI pattern for this name',
        `give one, e.g. "${shipped[name]}", or "extends" the shipped map`,
      );
  for (const [name, pattern] of Object.entries(iris)) {
    if (shipped[name] === undefined)
      throw bad(name, 'is no IRI pattern name concordat fills', `known: ${Object.keys(shipped).sort().join(', ')}`);
    const allowed = slotsOf(shipped[name]);
    for (const slot of slotsOf(pattern))
      if (!allowed.includes(slot))
        throw bad(
          name,
          `"{${slot}}" is not filled for this pattern`,
          `slots for "${name}": ${allowed.map((a) => `{${a}}`).join(', ')}`,
        );
    if (/[{}]/.test(pattern.replace(/\{[^{}]*\}/g, '')))
      throw bad(name, `"${pattern}" has an unmatched "{" or "}"`, 'slots are written {name}');
  }
}

/**
 * Checks that every IRI the map makes is an absolute IRI (RFC 3987 §2.2): each pattern filled with the project's
 * `base` and an `x` per other slot (the RDF stage percent-encodes slot values, so only the pattern's own text and the
 * base can break it), and each predicate.
 */
function checkIris(file: string, iris: Record<string, string>, predicates: string[], base: string | undefined): void {
  const bad = (field: string, iri: string, problem: string) =>
    new UserError({
      file,
      line: 0,
      field,
      message: `"${iri}" is not an absolute IRI: ${problem}`,
      hint:
        field === 'claims'
          ? 'check the predicate and its prefix'
          : 'slots are filled percent-encoded; fix the text around them',
    });
  if (base !== undefined)
    for (const [name, pattern] of Object.entries(iris)) {
      const filled = fill(
        pattern,
        Object.fromEntries(slotsOf(pattern).flatMap((s) => (s === 'base' ? [] : [[s, 'x']]))),
        base,
      );
      const problem = iriProblem(filled);
      if (problem) throw bad(`iris.${name}`, filled, problem);
    }
  for (const p of predicates) {
    const problem = iriProblem(p);
    if (problem) throw bad('claims', p, problem);
  }
}

/**
 * Loads a vocab map (rows of the file first, then those of the file it `extends`; first match wins). With the
 * project's `base`, every IRI pattern is also checked as it will be filled.
 */
export function loadVocabMap(file: string = DEFAULT_VOCAB_MAP, base?: string): VocabMap {
  const { prefixes, claims, iris } = readMapFile(path.resolve(file), new Set());
  checkPatterns(file, iris);
  const expand = (curie: string) => {
    const i = curie.indexOf(':');
    const ns = prefixes[curie.slice(0, i)];
    if (i < 0 || ns === undefined) {
      if (/^https?:\/\//.test(curie)) return curie;
      throw new UserError({
        file,
        line: 0,
        field: 'claims',
        message: `unknown prefix in "${curie}"`,
        hint: 'declare it under "prefixes"',
      });
    }
    return ns + curie.slice(i + 1);
  };
  const rows = claims.map((r) => ({ ...r, predicate: r.predicate === null ? null : expand(r.predicate) }));
  checkIris(
    file,
    iris,
    rows.flatMap((r) => (r.predicate === null ? [] : [r.predicate])),
    base,
  );
  const table = new Map<string, string | null>();
  for (const k of ['same', 'part', 'related'] as LinkKind[])
    for (const s of ['confirmed', 'proposed', 'rejected', 'candidate'] as LinkStatus[]) {
      const row = rows.find((r) => (r.kind === '*' || r.kind === k) && (r.status === '*' || r.status === s));
      table.set(`${k}/${s}`, s === 'candidate' ? null : row ? row.predicate : null);
    }
  const rowsOut = [...table].map(([k, predicate]) => {
    const [kind, status] = k.split('/') as [LinkKind, LinkStatus];
    return { kind, status, predicate };
  });
  const unconfirmed = new Set(rowsOut.filter((r) => r.status !== 'confirmed').map((r) => r.predicate));
  return {
    predicate: (kind, status) => table.get(`${kind}/${status}`) ?? null,
    table: rowsOut,
    confirmedOnly: [
      ...new Set(
        rowsOut
          .filter((r) => r.status === 'confirmed' && r.predicate !== null && !unconfirmed.has(r.predicate))
          .map((r) => r.predicate!),
      ),
    ].sort(),
    iris,
    predicates: [...new Set([...table.values()].filter((p): p is string => p !== null))].sort(),
  };
}
