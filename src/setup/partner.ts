// A project file + a catalogue export → a proposed partner block, and the project file with that block added.
import { checkProject } from '../load/project.js';
import path from 'node:path';
import { UserError } from '../errors.js';
import { readJsonObject, writeJsonFile } from '../io/json-file.js';
import { sniffCatalogue } from './sniff.js';
import { proposeColumns, type Proposal } from './columns.js';
import { delimiterName } from '../io/delimiter.js';
import { didYouMean } from '../io/did-you-mean.js';
import { IMAGE_ROLES, type ColumnMap, type ImageRole } from '../model.js';
import { STARTER_PLACEHOLDERS } from '../load/placeholders.js';

export interface PartnerRequest {
  key: string;
  catalogue: string;
  name?: string;
  /** Column separator of the export; sniffed from its header line when absent. */
  delimiter?: string;
  /** Columns a person chose (`--column role=header`); the rest are proposed. */
  columns?: Partial<ColumnMap>;
  workIri?: string;
  imageIri?: string;
  recordPage?: string;
  imageView?: string;
}

export interface PartnerProposal {
  projectFile: string;
  /** The block as it will be written (paths relative to the project file). */
  block: Record<string, unknown>;
  reasons: Proposal['reasons'];
  header: string[];
  /** What a person should check before writing: every guess made from values alone, IRIs minted for the partner. */
  warnings: string[];
  /** What else is worth knowing: columns left unmapped that look like a role. */
  notes: string[];
}

const KEY = /^[a-z][a-z0-9_-]{0,31}$/;

/** Option spellings of a delimiter → the character. */
const DELIMITER_NAMES: Record<string, string> = {
  ',': ',',
  ';': ';',
  '\t': '\t',
  '\\t': '\t',
  tab: '\t',
  '|': '|',
  comma: ',',
  semicolon: ';',
  pipe: '|',
};

/**
 * The partner's words for an image's role → the project's roles, for words that say it plainly (common practice, no
 * source).
 */
const ROLE_WORDS: Record<string, ImageRole> = {
  artwork: 'artwork',
  recto: 'artwork',
  front: 'artwork',
  overall: 'artwork',
  gesamtansicht: 'artwork',
  vue: 'artwork',
  detail: 'detail',
  ausschnitt: 'detail',
  dettaglio: 'detail',
  verso: 'verso',
  back: 'verso',
  ruckseite: 'verso',
  rueckseite: 'verso',
  revers: 'verso',
  mount: 'mount',
  montage: 'mount',
  chart: 'chart',
  'colour chart': 'chart',
  'color chart': 'chart',
  farbkarte: 'chart',
  stamp: 'stamp',
  stempel: 'stamp',
  blank: 'blank',
  leer: 'blank',
  other: 'other',
};
const norm = (s: string) => s.normalize('NFKD').replace(/\p{M}/gu, '').toLowerCase().trim();

/**
 * A roles map for the distinct values of the role column in the sample; words not recognised map to `artwork`, with a
 * warning.
 */
function rolesOf(values: string[], column: string, warnings: string[]): Record<string, ImageRole> {
  const roles: Record<string, ImageRole> = {};
  const unknown: string[] = [];
  for (const v of [...new Set(values.filter(Boolean))].sort()) {
    const r = ROLE_WORDS[norm(v)];
    roles[v] = r ?? 'artwork';
    if (!r) unknown.push(v);
  }
  if (unknown.length)
    warnings.push(
      `roles: ${unknown.map((v) => `"${v}"`).join(', ')} in column "${column}" read as artwork: check the "roles" map (one of ${IMAGE_ROLES.join(', ')})`,
    );
  return roles;
}

/**
 * Proposes the partner block for `req` (design, "Project file"): the export's delimiter as given or sniffed from its
 * header, columns as given by `req.columns` and otherwise proposed by header name and sampled values; IRI templates
 * as given, or minted under the project's base (`{base}id/{key}/work/{work}`, RFC 6570 level 1) with a warning that
 * the partner's own IRIs are better. Every column guessed from values alone is a warning; unmapped columns that look
 * like a role are notes.
 */
export async function proposePartner(projectFile: string, req: PartnerRequest): Promise<PartnerProposal> {
  const project = readJsonObject(projectFile);
  const field = (message: string, hint: string) =>
    new UserError({ file: projectFile, line: 0, field: '--key', message, hint });
  if (!KEY.test(req.key))
    throw field(`"${req.key}" is not a partner key`, 'lower-case letter, then letters, digits, - or _ (at most 32)');
  const partners = Array.isArray(project.partners) ? (project.partners as { key?: unknown }[]) : [];
  if (partners.some((p) => p?.key === req.key))
    throw field(`partner "${req.key}" is already in the project`, 'choose another key, or edit its block by hand');
  let delimiter: string | undefined;
  if (req.delimiter !== undefined) {
    delimiter = DELIMITER_NAMES[req.delimiter];
    if (!delimiter)
      throw new UserError({
        file: 'command line',
        line: 0,
        field: '--delimiter',
        message: `"${req.delimiter}" is not a delimiter`,
        hint: 'give , ; tab or |',
      });
  }
  const sniffed = await sniffCatalogue(req.catalogue, 200, delimiter);
  for (const [role, col] of Object.entries(req.columns ?? {})) {
    if (sniffed.header.includes(col!)) continue;
    const near = didYouMean(col!, sniffed.header);
    throw new UserError({
      file: req.catalogue,
      line: 1,
      field: `--column ${role}`,
      message: `no column "${col}" in the header`,
      hint: `${near ? `did you mean "${near}"? ` : ''}the header (delimiter ${delimiterName(sniffed.delimiter)}) has: ${sniffed.header.join(', ')}`,
    });
  }
  const proposal = proposeColumns(sniffed.header, sniffed.rows, req.columns);
  const { columns, reasons } = proposal;
  for (const role of ['work', 'image'] as const)
    if (!columns[role])
      throw new UserError({
        file: req.catalogue,
        line: 1,
        field: role,
        message: `no column looks like the ${role} ID`,
        hint: `name it: --column ${role}=<header>; the header (delimiter ${delimiterName(sniffed.delimiter)}) has: ${sniffed.header.join(', ')}${sniffed.header.length === 1 ? ' (one column: give --delimiter)' : ''}`,
      });
  const warnings = proposal.fromValues.map(
    (r) =>
      `${r} ← "${columns[r]}" was guessed from its values alone (no header name says so): check it, or set --column ${r}=<header>`,
  );
  const notes = proposal.unmapped.map(
    (u) =>
      `column "${u.column}" looks like the ${u.role} (${u.why}) but is not mapped: --column ${u.role}=${JSON.stringify(u.column)} maps it`,
  );
  for (const role of ['title', 'date'] as const)
    if (!columns[role] && !proposal.unmapped.some((u) => u.role === role))
      notes.push(
        `no column looks like the ${role}: without it ${role === 'date' ? 'date conflicts cannot be found' : 'reports show IDs only'} (--column ${role}=<header> if there is one)`,
      );
  const base = typeof project.base === 'string' ? project.base : STARTER_PLACEHOLDERS.base;
  if (base === STARTER_PLACEHOLDERS.base && (req.workIri === undefined || req.imageIri === undefined))
    warnings.push(
      `the project's base is still the starter's placeholder ${base}: set "base" in ${path.basename(projectFile)} before adding partners without --work-iri/--image-iri, or their IRIs name nothing anyone can look up`,
    );
  for (const [opt, given] of [
    ['--work-iri', req.workIri],
    ['--image-iri', req.imageIri],
  ] as const)
    if (given === undefined)
      warnings.push(
        `${opt.slice(2, -4)} IRIs are minted under the consortium's base ${base}: the partner's own IRIs, if it publishes them, are better (give ${opt} <template>)`,
      );
  const rel = path
    .relative(path.dirname(path.resolve(projectFile)), path.resolve(req.catalogue))
    .split(path.sep)
    .join('/');
  const roleColumn = columns.role;
  const roles = roleColumn
    ? rolesOf(
        sniffed.rows.map((r) => r[sniffed.header.indexOf(roleColumn)] ?? ''),
        roleColumn,
        warnings,
      )
    : undefined;
  const block = {
    key: req.key,
    name: req.name ?? req.key,
    workIri: req.workIri ?? `${base}id/${req.key}/work/{work}`,
    imageIri: req.imageIri ?? `${base}id/${req.key}/image/{image}`,
    ...(req.recordPage ? { recordPage: req.recordPage } : {}),
    ...(req.imageView ? { imageView: req.imageView } : {}),
    catalogue: { file: rel, delimiter: sniffed.delimiter, columns, ...(roles ? { roles } : {}) },
  };
  return { projectFile, block, reasons, header: sniffed.header, warnings, notes };
}

/**
 * Appends the proposed block to the project's partners, keeping every other field, written as JSON.stringify(…, null,
 * 2).
 */
export function writePartner(p: PartnerProposal): void {
  const project = readJsonObject(p.projectFile);
  const partners = Array.isArray(project.partners) ? project.partners : [];
  project.partners = [...partners, p.block];
  // never write a project file that check would refuse (a broken field elsewhere included)
  checkProject(p.projectFile, JSON.stringify(project, null, 2), project);
  writeJsonFile(p.projectFile, project);
}

/** The proposal as lines for a person to confirm. */
export function describeProposal(p: PartnerProposal): string {
  const cols = p.block.catalogue as { delimiter: string; columns: Record<string, string> };
  const delim = delimiterName(cols.delimiter);
  const lines = [
    `Columns of ${String((p.block.catalogue as { file: string }).file)} (delimiter ${delim}): ${p.header.join(' | ')}`,
    'Proposed mapping:',
  ];
  for (const [role, col] of Object.entries(cols.columns))
    lines.push(`  ${role.padEnd(6)} ← "${col}"  (${p.reasons[role as keyof typeof p.reasons]})`);
  for (const n of p.notes) lines.push(`note: ${n}`);
  lines.push('Partner block:', JSON.stringify(p.block, null, 2));
  return lines.join('\n') + '\n';
}
