// A store folder on disk: one N-Quads file per graph plus manifest.json, written atomically (temp file, rename,
// manifest last).
import { createHash } from 'node:crypto';
import { mkdir, readdir, readFile, rm } from 'node:fs/promises';
import { join } from 'node:path';
import { z } from 'zod';
import { UserError, EXIT } from '../errors.js';
import { parseJson } from '../io/json-file.js';
import { writeFileAtomicallyAsync } from '../io/temp-file.js';

/** What the manifest records for one graph. */
export interface ManifestEntry {
  /** Path of the graph's N-Quads file, relative to the folder. */
  file: string;
  triples: number;
  sha256: string;
  /** The release's own date (its dcterms:issued), never the clock; null when the release has none. */
  loadedAt: string | null;
  /** The file the graph was loaded from, as given on the command line. */
  source: string;
}

const ManifestSchema = z.object({
  version: z.literal(1),
  graphs: z.record(
    z.string(),
    z.object({
      file: z.string().regex(/^graphs\/[0-9a-f-]+\.nq$/),
      triples: z.number().int().nonnegative(),
      sha256: z.string().regex(/^[0-9a-f]{64}$/),
      loadedAt: z.string().nullable(),
      source: z.string(),
    }),
  ),
});

/** The manifest: graph IRI → entry. */
export type Manifest = z.infer<typeof ManifestSchema>;

export const MANIFEST = 'manifest.json';

/** sha256 hex of a text's UTF-8 bytes. */
export const sha256 = (data: string | Buffer): string => createHash('sha256').update(data).digest('hex');

/**
 * Temp files are `<name>.tmp-<12 hex>` (src/io/temp-file.ts); anything so named in a locked store folder is a leftover
 * of a stopped load.
 */
const TEMP_FILE = /\.tmp-[0-9a-f]{12}$/;
/** The lock file a writing command holds inside the store folder. */
export const STORE_LOCK = '.concordat.lock';

/**
 * Removes what a killed load left in a store folder: temp files and graph files the manifest does not name (written
 * before a manifest that never came). Only call while holding the folder's lock. Returns the removed paths.
 */
export async function removeStoreLeftovers(folder: string, m: Manifest): Promise<string[]> {
  const named = new Set(Object.values(m.graphs).map((e) => e.file));
  const removed: string[] = [];
  for (const [sub, names] of [
    ['', await readdir(folder)],
    ['graphs', await readdir(join(folder, 'graphs'))],
  ] as const)
    for (const name of names) {
      const rel = sub ? `${sub}/${name}` : name;
      if (TEMP_FILE.test(name) || (sub === 'graphs' && name.endsWith('.nq') && !named.has(rel))) {
        await rm(join(folder, rel), { force: true });
        removed.push(join(folder, rel));
      }
    }
  return removed.sort();
}

/** Reads and checks manifest.json; a folder without one is an empty store. */
export async function readManifest(folder: string): Promise<Manifest> {
  let text: string;
  try {
    text = await readFile(join(folder, MANIFEST), 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') return { version: 1, graphs: {} };
    throw new UserError(
      {
        file: join(folder, MANIFEST),
        line: 0,
        field: '',
        message: `cannot be read (${code ?? (err as Error).message})`,
        hint: 'a store folder holds the manifest.json concordat load wrote: load the release into a new folder',
      },
      EXIT.badInput,
    );
  }
  const hint = 'the store folder is damaged; load the release into a new folder';
  const parsed = ManifestSchema.safeParse(parseJson(text, join(folder, MANIFEST), hint));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new UserError(
      {
        file: join(folder, MANIFEST),
        line: 0,
        field: issue.path.join('.'),
        message: issue.message,
        hint,
      },
      EXIT.badInput,
    );
  }
  return parsed.data;
}

/** Writes the manifest with graphs in sorted order, so the same loads give byte-identical files. */
export async function writeManifest(folder: string, m: Manifest): Promise<void> {
  const graphs = Object.fromEntries(
    Object.keys(m.graphs)
      .sort()
      .map((g) => [g, m.graphs[g]]),
  );
  await writeFileAtomicallyAsync(join(folder, MANIFEST), JSON.stringify({ version: 1, graphs }, null, 2) + '\n');
}

/**
 * File name for a graph's content: graph hash + content hash, so a new version never overwrites the file the manifest
 * names.
 */
export function graphFileName(graph: string, contentSha: string): string {
  return `graphs/${sha256(graph).slice(0, 16)}-${contentSha.slice(0, 16)}.nq`;
}

/** Makes sure the folder and its graphs/ subfolder exist. */
export async function ensureFolder(folder: string): Promise<void> {
  await mkdir(join(folder, 'graphs'), { recursive: true });
}
