// A named query (queries/<name>.rq shipped with the package) → its SPARQL text; also lists the names with their
// headers.
import { existsSync } from 'node:fs';
import { readdir, readFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { UserError, EXIT } from '../errors.js';

/** The queries/ folder at the package root (this file is dist/src/store/named.js once built). */
export const QUERIES_DIR = fileURLToPath(new URL('../../../queries/', import.meta.url));

const NAME = /^[a-z0-9][a-z0-9-]*$/;

/** Names of the shipped queries, sorted. */
export async function namedQueries(dir = QUERIES_DIR): Promise<string[]> {
  if (!existsSync(dir)) return [];
  return (await readdir(dir))
    .filter((f) => f.endsWith('.rq'))
    .map((f) => f.slice(0, -3))
    .sort();
}

/** Reads queries/<name>.rq; an unknown name is a user error listing the known ones. */
export async function readNamedQuery(name: string, dir = QUERIES_DIR): Promise<string> {
  const known = await namedQueries(dir);
  if (!NAME.test(name) || !known.includes(name))
    throw new UserError(
      {
        file: 'command line',
        line: 0,
        field: '--named',
        message: `no query named "${name}"`,
        hint: `known: ${known.join(', ') || 'none'}`,
      },
      EXIT.badInput,
    );
  return readFile(join(dir, `${name}.rq`), 'utf8');
}
