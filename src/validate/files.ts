// Paths of RDF data files and a shapes folder → quads ready for validation, with clear errors for missing input.
import { readdir, stat } from 'node:fs/promises';
import { extname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import N3 from 'n3';
import { UserError } from '../errors.js';
import { streamRdfFile } from '../rdf/read.js';

/** The package's own `shapes/` folder (two levels above dist/src/validate/). */
export function defaultShapesDir(): string {
  return fileURLToPath(new URL('../../../shapes/', import.meta.url));
}

/** Loaded shapes: every .ttl in the folder, in file-name order, as one graph (SHACL §1.5 shapes graph). */
export interface ShapesGraph {
  files: string[];
  quads: N3.Quad[];
}

/** Reads every `.ttl` file of a folder into one shapes graph; an empty or missing folder is a user error. */
export async function loadShapesFolder(dir: string): Promise<ShapesGraph> {
  let names: string[];
  try {
    names = await readdir(dir);
  } catch (err) {
    throw new UserError({
      file: dir,
      line: 0,
      field: '--shapes',
      message: `cannot read the shapes folder (${(err as NodeJS.ErrnoException).code ?? err})`,
      hint: 'pass --shapes <folder> holding SHACL shapes as .ttl files',
    });
  }
  const files = names
    .filter((n) => n.endsWith('.ttl'))
    .sort()
    .map((n) => join(dir, n));
  if (files.length === 0)
    throw new UserError({
      file: dir,
      line: 0,
      field: '--shapes',
      message: 'the shapes folder has no .ttl file',
      hint: 'put SHACL shapes in Turtle there or pass --shapes <folder>',
    });
  const quads: N3.Quad[] = [];
  for (const f of files) await streamRdfFile(f, (q) => quads.push(q));
  return { files, quads };
}

/** Reads data files (any extension the reader knows) into one N3.Store, all graphs merged for validation. */
export async function loadDataFiles(files: string[]): Promise<N3.Store> {
  const store = new N3.Store();
  const { quad, defaultGraph } = N3.DataFactory;
  const g = defaultGraph();
  // SHACL validates a data graph (§1.5); named graphs of N-Quads/TriG/JSON-LD input are merged into it.
  for (const f of files)
    await streamRdfFile(f, (q) =>
      store.addQuad(q.graph.termType === 'DefaultGraph' ? q : quad(q.subject, q.predicate, q.object, g)),
    );
  return store;
}

/** Largest JSON-LD document read for validation: it is read and converted whole (JSON-LD 1.1 API §4), holding the
 *  text, its expansion and the quads at once. 64 MiB is a rule of thumb (common practice, no source), not measured
 *  against the 2 GiB bound; larger releases are validated through their N-Quads, which stream. */
export const JSONLD_LIMIT_BYTES = 64 * 1024 * 1024;

/**
 * Streams the triples of data files to `onQuad` (named graphs merged, SHACL §1.5). Turtle-family files are parsed as
 * they are read; a JSON-LD document above {@link JSONLD_LIMIT_BYTES} is refused before it is read, since it cannot be
 * streamed.
 */
export async function streamDataFiles(
  files: string[],
  onQuad: (q: N3.Quad) => void,
  jsonldLimit = JSONLD_LIMIT_BYTES,
): Promise<void> {
  for (const f of files) {
    if (extname(f).toLowerCase() === '.jsonld') {
      const size = await stat(f).then(
        (s) => s.size,
        () => 0,
      );
      if (size > jsonldLimit)
        throw new UserError({
          file: f,
          line: 0,
          field: '',
          message: `a JSON-LD document is read whole, and this one is ${(size / 2 ** 20).toFixed(1)} MiB, above the ${(jsonldLimit / 2 ** 20).toFixed(1)} MiB that validate reads in bounded memory`,
          hint: "validate the release's N-Quads or Turtle instead (concordance.nq), or convert the document to N-Quads first",
        });
    }
    await streamRdfFile(f, onQuad);
  }
}
