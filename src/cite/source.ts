// A release folder or an embedded store folder → one in-memory N3 store of its quads (one code path for both).
import { verifyRelease } from '../store/complete.js';
import { existsSync } from 'node:fs';
import path from 'node:path';
import N3 from 'n3';
import { readRdfFile } from '../rdf/read.js';
import { readManifest } from '../store/folder.js';
import { UserError } from '../errors.js';
import { RELEASE_FILES } from '../rdf/formats.js';

export interface CiteSource {
  release?: string;
  store?: string;
}

/**
 * Reads the quads of `--release <folder>` (its concordance.nq, N-Quads) or `--store <folder>` (every graph file the
 * store's manifest.json lists, N-Quads), so everything after works on quads alone.
 */
export async function readSource(src: CiteSource): Promise<N3.Store> {
  if (!!src.release === !!src.store)
    throw new UserError({
      file: 'command line',
      line: 0,
      field: '--release',
      message: 'give exactly one of --release <folder> or --store <folder>',
      hint: 'e.g. --release releases/2026.1',
    });
  const store = new N3.Store();
  if (src.release) {
    const file = path.join(src.release, RELEASE_FILES.nquads);
    if (!existsSync(file))
      throw new UserError({
        file,
        line: 0,
        field: '--release',
        message: `not a release folder (no ${RELEASE_FILES.nquads})`,
        hint: 'name a folder written by concordat build',
      });
    await verifyRelease(src.release, [RELEASE_FILES.nquads], { hashNeededOnly: true });
    store.addQuads(await readRdfFile(file));
    return store;
  }
  const folder = src.store!;
  const manifest = await readManifest(folder);
  const files = Object.keys(manifest.graphs)
    .sort()
    .map((g) => path.join(folder, manifest.graphs[g].file));
  if (files.length === 0)
    throw new UserError({
      file: folder,
      line: 0,
      field: '--store',
      message: 'the store folder holds no graphs',
      hint: 'load a release first: concordat load <release> --store <folder>',
    });
  for (const f of files) store.addQuads(await readRdfFile(f));
  return store;
}
