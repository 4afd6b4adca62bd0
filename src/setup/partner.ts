// A project file + a catalogue export → a proposed partner block, and the project file with that block added.
import path from 'node:path';
import { UserError } from '../errors.js';
import { readJsonObject, writeJsonFile } from '../io/json-file.js';
import { sniffCatalogue } from './sniff.js';
import { proposeColumns, type Proposal } from './columns.js';

export interface PartnerRequest {
  key: string;
  catalogue: string;
  name?: string;
  workIri?: string;
  imageIri?: string;
}

export interface PartnerProposal {
  projectFile: string;
  /** The block as it will be written (paths relative to the project file). */
  block: Record<string, unknown>;
  reasons: Proposal['reasons'];
  header: string[];
}

const KEY = /^[a-z][a-z0-9_-]{0,31}$/;

/**
 * Proposes the partner block for `req` (design, "Project file"): the export's delimiter is sniffed from its header,
 * columns are proposed by header name and sampled values; IRI templates default to `{base}id/{key}/work/{work}` and
 * `{base}id/{key}/image/{image}` (RFC 6570 level 1) until the partner publishes its own.
 */
export async function proposePartner(projectFile: string, req: PartnerRequest): Promise<PartnerProposal> {
  const project = readJsonObject(projectFile);
  const field = (message: string, hint: string) => new UserError({ file: projectFile, line: 0, field: '--key', message, hint });
  if (!KEY.test(req.key)) throw field(`"${req.key}" is not a partner key`, 'lower-case letter, then letters, digits, - or _ (at most 32)');
  const partners = Array.isArray(project.partners) ? (project.partners as { key?: unknown }[]) : [];
  if (partners.some((p) => p?.key === req.key)) throw field(`partner "${req.key}" is already in the project`, 'choose another key, or edit its block by hand');
  const sniffed = await sniffCatalogue(req.catalogue);
  const { columns, reasons } = proposeColumns(sniffed.header, sniffed.rows);
  for (const role of ['work', 'image'] as const)
    if (!columns[role]) throw new UserError({ file: req.catalogue, line: 1, field: role, message: `no column looks like the ${role} ID`, hint: `header: ${sniffed.header.join(', ')}; add the block by hand` });
  const base = typeof project.base === 'string' ? project.base : 'https://concordance.example.org/';
  const rel = path.relative(path.dirname(path.resolve(projectFile)), path.resolve(req.catalogue)).split(path.sep).join('/');
  const block = {
    key: req.key,
    name: req.name ?? req.key,
    workIri: req.workIri ?? `${base}id/${req.key}/work/{work}`,
    imageIri: req.imageIri ?? `${base}id/${req.key}/image/{image}`,
    catalogue: { file: rel, delimiter: sniffed.delimiter, columns },
  };
  return { projectFile, block, reasons, header: sniffed.header };
}

/** Appends the proposed block to the project's partners, keeping every other field, written as JSON.stringify(…, null, 2). */
export function writePartner(p: PartnerProposal): void {
  const project = readJsonObject(p.projectFile);
  const partners = Array.isArray(project.partners) ? project.partners : [];
  project.partners = [...partners, p.block];
  writeJsonFile(p.projectFile, project);
}

/** The proposal as lines for a person to confirm. */
export function describeProposal(p: PartnerProposal): string {
  const cols = (p.block.catalogue as { delimiter: string; columns: Record<string, string> });
  const delim = cols.delimiter === '\t' ? 'tab' : `"${cols.delimiter}"`;
  const lines = [`Columns of ${String((p.block.catalogue as { file: string }).file)} (delimiter ${delim}): ${p.header.join(' | ')}`, 'Proposed mapping:'];
  for (const [role, col] of Object.entries(cols.columns)) lines.push(`  ${role.padEnd(6)} ← "${col}"  (${p.reasons[role as keyof typeof p.reasons]})`);
  lines.push('Partner block:', JSON.stringify(p.block, null, 2));
  return lines.join('\n') + '\n';
}
