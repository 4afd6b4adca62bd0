// A folder → a new project: a starter concordance.json and empty catalogues/, evidence/, decisions/ folders.
import { existsSync, mkdirSync, readdirSync, statSync } from 'node:fs';
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
    base: opts.base ?? STARTER_PLACEHOLDERS.base,
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
  if (existsSync(file))
    throw new UserError({
      file,
      line: 0,
      field: '',
      message: 'a project file already exists here',
      hint: 'choose a new folder, or edit it and use add-partner',
    });
  if (existsSync(folder)) {
    if (!statSync(folder).isDirectory())
      throw new UserError({
        file: folder,
        line: 0,
        field: '<folder>',
        message: 'is a file',
        hint: 'choose a new folder',
      });
    const isRelease =
      existsSync(path.join(folder, 'SHA256SUMS')) || existsSync(path.join(folder, '.concordat-incomplete'));
    const other = readdirSync(folder)
      .filter((n) => !(PROJECT_FOLDERS as readonly string[]).includes(n))
      .sort();
    if (isRelease || other.length)
      throw new UserError({
        file: folder,
        line: 0,
        field: '<folder>',
        message: isRelease
          ? 'is a release folder'
          : `is not empty (${other.slice(0, 3).join(', ')}${other.length > 3 ? ', …' : ''})`,
        hint: 'init writes a starter project into a new or empty folder',
      });
  }
  const made: string[] = [];
  for (const sub of PROJECT_FOLDERS) {
    const dir = path.join(folder, sub);
    if (!existsSync(dir)) made.push(`${sub}/`);
    mkdirSync(dir, { recursive: true });
  }
  writeJsonFile(file, starterProject(folder, opts));
  return ['concordance.json', ...made];
}
