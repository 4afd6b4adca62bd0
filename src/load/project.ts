// concordance.json → ProjectConfig: JSON syntax, zod schema, did-you-mean hints, paths resolved.
import path from 'node:path';
import { z } from 'zod';
import { ProblemList, type Problem } from '../errors.js';
import { IMAGE_ROLES, type ProjectConfig, type RunConfig } from '../model.js';
import { checkTemplate } from '../io/template.js';
import { iriProblem } from '../io/iri.js';
import { didYouMean } from '../io/did-you-mean.js';
import { jsonSpots, lineColumn, readJsonFile } from '../io/json-file.js';
import { pathKey, type JsonSpots } from '../io/json-scan.js';

/** An IRI the release publishes: checked by RFC 3987 §2.2 before anything is written (io/iri.ts). */
const iri = (example: string) =>
  z.string().superRefine((v, ctx) => {
    const problem = iriProblem(v);
    if (problem)
      ctx.addIssue({
        code: 'custom',
        message: `"${v}" is not an absolute IRI: ${problem}`,
        params: { hint: `e.g. "${example}"` },
      });
  });
const unit = z.number().min(0).max(1);
const nonEmpty = z.string().trim().min(1, { message: 'must not be empty' });
const partnerKey = z.string().regex(/^[a-z][a-z0-9_-]{0,31}$/, {
  message: 'partner key: lower-case letter, then letters, digits, - or _ (at most 32)',
});

const ColumnsSchema = z.strictObject({
  work: nonEmpty,
  image: nonEmpty,
  title: nonEmpty.optional(),
  date: nonEmpty.optional(),
  width: nonEmpty.optional(),
  height: nonEmpty.optional(),
  role: nonEmpty.optional(),
});

const PartnerSchema = z.strictObject({
  key: partnerKey,
  name: nonEmpty,
  homepage: iri('https://archive.example.org/').optional(),
  workIri: z.string(),
  imageIri: z.string(),
  recordPage: z.string().optional(),
  imageView: z.string().optional(),
  showImages: z.boolean().optional(),
  centuryConvention: z.enum(['ordinal', 'iso', 'unknown']).default('unknown'),
  language: z
    .enum(['en', 'de', 'fr', 'it', 'es', 'nl'], {
      message: 'language: one of en, de, fr, it, es, nl (the language of the date phrases)',
    })
    .optional(),
  catalogue: z.strictObject({
    file: nonEmpty,
    delimiter: z.string().length(1, { message: 'delimiter must be one character, e.g. "," ";" or "\\t"' }).default(','),
    columns: ColumnsSchema,
    /** The partner's words for an image's role → the project's roles (needed with columns.role). */
    roles: z.record(z.string(), z.enum(IMAGE_ROLES)).optional(),
  }),
});

/** Column separators a decisions file may use (a spreadsheet saves with "," ";" or tab, by locale). */
export const DECISION_DELIMITERS = [',', ';', '\t', '|'] as const;

/** A decisions file: a path, or `{ "file", "delimiter" }` to set the separator instead of detecting it. */
const DecisionFileSchema = z.preprocess(
  (v) => (typeof v === 'string' ? { file: v } : v),
  z.strictObject({
    file: nonEmpty,
    delimiter: z
      .enum(DECISION_DELIMITERS, {
        message: 'delimiter must be one of "," ";" "\\t" "|" (leave it out to detect it from the header)',
      })
      .optional(),
  }),
);

const RunSchema = z.strictObject({
  id: z.string().regex(/^[A-Za-z0-9][A-Za-z0-9._-]*$/, { message: 'run id: letters, digits, . _ - only' }),
  software: nonEmpty,
  version: nonEmpty,
  started: z.iso.datetime({
    offset: true,
    message: 'started must be an ISO 8601 date-time with zone, e.g. 2026-10-04T09:00:00Z',
  }),
  parameters: z.record(z.string(), z.union([z.string(), z.number(), z.boolean(), z.null()])).default({}),
});

type RunConfigParsed = z.infer<typeof RunSchema>;

const PolicySchema = z
  .strictObject({
    proposeAt: unit.default(0.5),
    autoConfirmAt: unit.nullable().default(null),
    partOverlapBelow: z.number().gt(0).max(1).default(0.7),
    minOverlap: unit.default(0.3),
    indiscriminateAbove: z.number().int().min(1).nullable().default(null),
    reviewLimit: z.number().int().min(1).default(500),
    dateTolerance: z.number().int({ message: 'dateTolerance: whole years, e.g. 25' }).min(0).optional(),
  })
  .refine((p) => p.autoConfirmAt === null || p.autoConfirmAt >= p.proposeAt, {
    message: 'autoConfirmAt must be at least proposeAt (or null)',
    path: ['autoConfirmAt'],
  });

export const ProjectSchema = z.strictObject({
  title: nonEmpty,
  description: z.string().optional(),
  base: iri('https://concordance.example.org/'),
  license: iri('https://creativecommons.org/licenses/by/4.0/'),
  publisher: z.strictObject({ name: nonEmpty, homepage: iri('https://consortium.example.org/').optional() }),
  partners: z.array(PartnerSchema).min(1, { message: 'at least one partner is needed' }),
  evidence: z.array(z.strictObject({ file: nonEmpty, run: RunSchema.optional() })).default([]),
  decisions: z.array(DecisionFileSchema).default([]),
  gold: nonEmpty.optional(),
  policy: PolicySchema.default({
    proposeAt: 0.5,
    autoConfirmAt: null,
    partOverlapBelow: 0.7,
    minOverlap: 0.3,
    indiscriminateAbove: null,
    reviewLimit: 500,
  }),
  previous: nonEmpty.optional(),
  vocabMap: nonEmpty.optional(),
  release: z
    .strictObject({
      version: nonEmpty,
      issued: z.iso.date({ message: 'issued must be an ISO 8601 date, e.g. 2026-11-30' }).optional(),
      /**
       * Write partners/<key>.{ttl,nq,jsonld} (default true). Each slice repeats the clusters its partner takes part in.
       */
      partnerDumps: z.boolean().default(true),
      /** CSV files for spreadsheets (UTF-8 with BOM, CRLF; the default) or plain (LF, no BOM) for pipelines. */
      csv: z.enum(['spreadsheet', 'plain']).default('spreadsheet'),
      /** Also write every dump gzip-compressed (`concordance.nq.gz`, …), described with dcat:compressFormat. */
      compress: z.enum(['none', 'gzip']).default('none'),
    })
    .default({ version: '0', partnerDumps: true, csv: 'spreadsheet', compress: 'none' }),
});

/** Known keys of the object the JSON path points into, found by walking the schema (for did-you-mean). */
function keysAt(pathParts: PropertyKey[]): string[] {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- zod's schema internals are untyped
  let s: any = ProjectSchema;
  const wrappers = new Set(['optional', 'default', 'nullable', 'prefault', 'readonly', 'catch']);
  const unwrap = () => {
    for (;;) {
      if (s && wrappers.has(s.def?.type)) s = s.def.innerType;
      else if (s?.def?.type === 'pipe')
        s = s.def.in?.def?.type === 'transform' ? s.def.out : s.def.in; // z.preprocess: the schema after the transform
      else return;
    }
  };
  for (const p of pathParts) {
    unwrap();
    if (s?.def?.type === 'array') s = s.element;
    else if (s?.shape) s = s.shape[p as string];
    else return [];
  }
  unwrap();
  return s?.shape ? Object.keys(s.shape) : [];
}

const jsonPath = (p: PropertyKey[]) =>
  p.reduce<string>((acc, k) => (typeof k === 'number' ? `${acc}[${k}]` : acc ? `${acc}.${String(k)}` : String(k)), '');

let scanned: { text: string; spots: JsonSpots } | undefined;
/** Where values start in the project text (scanned once per text). */
function spotsOf(text: string): JsonSpots {
  if (scanned?.text !== text) scanned = { text, spots: jsonSpots(text) };
  return scanned.spots;
}

/** The line where a JSON path's value (or member name) starts; for a missing field, that of its nearest parent. */
function lineOfPath(text: string, p: PropertyKey[]): number {
  const { offset } = spotsOf(text);
  const keys = p.filter((k): k is string | number => typeof k !== 'symbol');
  for (let n = keys.length; n >= 0; n--) {
    const at = offset.get(pathKey(keys.slice(0, n)));
    if (at !== undefined) return lineColumn(text, at).line;
  }
  return 1;
}

/**
 * A run's parameters with each number as written in the project file (JSON.parse would turn 1e-7 into 1e-7 but a
 * 30-digit integer into 1.2345678901234568e+29): the text is kept and typed when published.
 */
function parametersAsWritten(text: string, i: number, run: RunConfigParsed): RunConfig {
  const { number } = spotsOf(text);
  const parameters: RunConfig['parameters'] = {};
  for (const [k, v] of Object.entries(run.parameters)) {
    const written = number.get(pathKey(['evidence', i, 'run', 'parameters', k]));
    if (typeof v === 'number' && written === undefined) throw new Error(`no text for the number at parameters.${k}`);
    parameters[k] = typeof v === 'number' ? { number: written! } : v;
  }
  return { ...run, parameters };
}

/** The hint for a value of the wrong type or a missing one: where the project file format is described. */
function schemaHint(at: PropertyKey[]): string {
  const top = at.length ? String(at[0]) : '';
  return top
    ? `see "${top}" in an example project (concordat init writes one; demo-data/concordance.json)`
    : 'a project file is one JSON object: concordat init writes an example';
}

/** Reads and validates a project file (design: "Project file"); throws UserError with every problem. */
export function loadProjectFile(file: string): ProjectConfig {
  const { text, value: raw } = readJsonFile(file, 'project file', 'give the path to concordance.json');
  return checkProject(file, text, raw);
}

/**
 * Validates a parsed project file (`text` places problems on their lines); throws UserError with every problem, else
 * returns the config with paths resolved against the file's folder.
 */
export function checkProject(file: string, text: string, raw: unknown): ProjectConfig {
  const problems = new ProblemList();
  const parsed = ProjectSchema.safeParse(raw);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      if (issue.code === 'unrecognized_keys') {
        for (const key of issue.keys) {
          const near = didYouMean(key, keysAt(issue.path));
          problems.add({
            file,
            line: lineOfPath(text, [...issue.path, key]),
            field: jsonPath([...issue.path, key]),
            message: 'unknown field',
            hint: near ? `did you mean "${near}"?` : `known fields: ${keysAt(issue.path).join(', ')}`,
          });
        }
      } else {
        const hint = issue.code === 'custom' ? (issue.params?.hint as string | undefined) : undefined;
        problems.add({
          file,
          line: lineOfPath(text, issue.path),
          field: jsonPath(issue.path),
          message: issue.message,
          hint: hint ?? schemaHint(issue.path),
        });
      }
    }
    problems.throwIfAny();
  }
  const p = parsed.data!;
  const seen = new Set<string>();
  p.partners.forEach((partner, i) => {
    const at = (f: string): Problem => ({
      file,
      line: lineOfPath(text, ['partners', i, f]),
      field: `partners[${i}].${f}`,
      message: '',
    });
    const { columns, roles } = partner.catalogue;
    if (columns.role !== undefined && roles === undefined)
      problems.add({
        file,
        line: lineOfPath(text, ['partners', i, 'catalogue', 'columns', 'role']),
        field: `partners[${i}].catalogue.roles`,
        message: 'a role column needs a "roles" map',
        hint: `map each word of the column to one of ${IMAGE_ROLES.join(', ')}, e.g. "roles": { "Recto": "artwork", "Verso": "verso" }`,
      });
    if (roles !== undefined && columns.role === undefined)
      problems.add({
        file,
        line: lineOfPath(text, ['partners', i, 'catalogue', 'roles']),
        field: `partners[${i}].catalogue.columns.role`,
        message: '"roles" is given but no role column',
        hint: 'name the column that holds each image\'s role in "columns": { "role": … }',
      });
    if (seen.has(partner.key))
      problems.add({
        ...at('key'),
        message: `duplicate partner key "${partner.key}"`,
        hint: 'each partner needs its own key',
      });
    seen.add(partner.key);
    const templates: [string, string | undefined, string, string[]][] = [
      ['workIri', partner.workIri, 'work', ['work']],
      ['imageIri', partner.imageIri, 'image', ['image', 'work']],
      ['recordPage', partner.recordPage, 'work', ['work']],
      ['imageView', partner.imageView, 'image', ['image', 'work']],
    ];
    for (const [field, tpl, req, allowed] of templates) {
      if (tpl === undefined) continue;
      for (const msg of checkTemplate(tpl, req, allowed))
        problems.add({
          ...at(field),
          message: `template ${msg}`,
          hint: `e.g. "https://archive.example.org/id/${req}/{${req}}"`,
        });
      // each {name} filled with as many x as it is long, so positions in the message are the template's own
      const problem = iriProblem(tpl.replace(/\{[^{}]*\}/g, (m) => 'x'.repeat(m.length)));
      if (problem)
        problems.add({
          ...at(field),
          message: `template "${tpl}" does not give an absolute IRI: ${problem}`,
          hint: `e.g. "https://archive.example.org/id/${req}/{${req}}"`,
        });
    }
    if (partner.showImages && partner.imageView === undefined)
      problems.add({
        ...at('showImages'),
        message: 'showImages needs an imageView template: the pages show the photograph at that URL',
        hint: 'add "imageView" (a URL that gives the image itself, e.g. an IIIF Image API URL) or drop showImages',
      });
  });
  const runIds = new Set<string>();
  p.evidence.forEach((ev, i) => {
    if (
      ev.run &&
      runIds.has(ev.run.id) &&
      JSON.stringify(ev.run) !== JSON.stringify(p.evidence.find((e) => e.run?.id === ev.run!.id)!.run)
    )
      problems.add({
        file,
        line: lineOfPath(text, ['evidence', i, 'run']),
        field: `evidence[${i}].run.id`,
        message: `run "${ev.run.id}" is declared twice with different details`,
        hint: 'give each run its own id',
      });
    if (ev.run) runIds.add(ev.run.id);
  });
  if (!/[/#]$/.test(p.base))
    problems.add({
      file,
      line: lineOfPath(text, ['base']),
      field: 'base',
      message: 'base must end with "/" or "#"',
      hint: `e.g. "${p.base}/"`,
    });
  problems.throwIfAny();

  const dir = path.dirname(path.resolve(file));
  const abs = (f: string) => path.resolve(dir, f);
  return {
    ...p,
    partners: p.partners.map((x) => ({ ...x, catalogue: { ...x.catalogue, file: abs(x.catalogue.file) } })),
    evidence: p.evidence.map((e, i) => ({
      file: abs(e.file),
      ...(e.run ? { run: parametersAsWritten(text, i, e.run) } : {}),
    })),
    decisions: p.decisions.map((d) => ({ ...d, file: abs(d.file) })),
    gold: p.gold === undefined ? undefined : abs(p.gold),
    previous: p.previous === undefined ? undefined : abs(p.previous),
    vocabMap: p.vocabMap === undefined ? undefined : abs(p.vocabMap),
  };
}
