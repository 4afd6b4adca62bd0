// A folder → a new project: a starter concordance.json and empty catalogues/, evidence/, decisions/ folders.
import { existsSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import { UserError } from '../errors.js';
import { writeJsonFile } from '../io/json-file.js';
import { STARTER_PLACEHOLDERS } from '../load/placeholders.js';

export interface StarterOptions {
  title?: string;
  base?: string;
}

/**
 * The starter project file (design, "Project file"): no partners yet (`add-partner` adds them); the publisher and the
 * licence are placeholders that `check` flags until the consortium fills them in.
 */
export function starterProject(folder: string, opts: StarterOptions = {}): Record<string, unknown> {
  return {
    title: opts.title ?? `${path.basename(path.resolve(folder))} concordance`,
    base: opts.base ?? 'https://concordance.example.org/',
    license: STARTER_PLACEHOLDERS.license,
    publisher: { name: STARTER_PLACEHOLDERS.publisherName },
    partners: [],
    evidence: [],
    decisions: [],
    policy: { proposeAt: 0.5, autoConfirmAt: null, partOverlapBelow: 0.7, minOverlap: 0.3 },
    release: { version: '0.1' },
  };
}

export const PROJECT_FOLDERS = ['catalogues', 'evidence', 'decisions'] as const;

/** Creates `folder` (if needed), its empty input folders and concordance.json; refuses to overwrite a project file. */
export function initProject(folder: string, opts: StarterOptions = {}): string[] {
  const file = path.join(folder, 'concordance.json');
  if (existsSync(file)) throw new UserError({ file, line: 0, field: '', message: 'a project file already exists here', hint: 'choose a new folder, or edit it and use add-partner' });
  const made: string[] = [];
  for (const sub of PROJECT_FOLDERS) {
    const dir = path.join(folder, sub);
    if (!existsSync(dir)) made.push(`${sub}/`);
    mkdirSync(dir, { recursive: true });
  }
  writeJsonFile(file, starterProject(folder, opts));
  return ['concordance.json', ...made];
}
