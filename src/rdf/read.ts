// An RDF file (Turtle, N-Triples, N-Quads, TriG, JSON-LD; picked by extension) → n3 quads, errors naming file and line.
import { createReadStream } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { extname } from 'node:path';
import { pathToFileURL } from 'node:url';
import N3 from 'n3';
import { UserError } from '../errors.js';
import { jsonldToNQuads } from './jsonld.js';
import { FORMATS } from './formats.js';

/** Extension → parser input format, from the format table (RDF 1.1 Turtle, N-Triples, N-Quads, TriG; JSON-LD 1.1). */
export const READ_FORMATS: Readonly<Record<string, { name: string; n3Format: string | null }>> = Object.fromEntries(
  Object.values(FORMATS).map((f) => [f.extension, { name: f.label, n3Format: f.reader === 'n3' ? f.mediaType : null }]),
);

/** Options for reading one RDF file. */
export interface ReadOptions {
  /** Base IRI for relative IRIs; defaults to the file's own file: URL. */
  base?: string;
  /** Local JSON-LD contexts by URL; any other remote context is refused. */
  contexts?: Record<string, unknown>;
}

function formatOf(path: string): { name: string; n3Format: string | null } {
  const ext = extname(path).toLowerCase();
  const info = READ_FORMATS[ext];
  if (!info)
    throw new UserError({
      file: path,
      line: 0,
      field: '',
      message: `unknown RDF file extension "${ext}"`,
      hint: `use one of ${Object.keys(READ_FORMATS).join(' ')}`,
    });
  return info;
}

/** Turns an n3 parse error into a UserError naming the file and 1-based line. */
export function syntaxError(err: unknown, file: string, formatName: string): UserError {
  const e = err as Error & { context?: { line?: number } };
  const line = e.context?.line ?? Number(/on line (\d+)/.exec(e.message)?.[1] ?? 0);
  const message = e.message.replace(/ on line \d+\.?$/, '');
  return new UserError({
    file,
    line,
    field: '',
    message: `${formatName} syntax error: ${message}`,
    hint: `the file is read as ${formatName} because of its extension`,
  });
}

function readError(err: unknown, file: string): UserError {
  const e = err as NodeJS.ErrnoException;
  return new UserError({
    file,
    line: 0,
    field: '',
    message: `cannot read file (${e.code ?? e.message})`,
    hint: 'check the path',
  });
}

/**
 * Streams the quads of one RDF file to `onQuad`, picking the syntax by extension. Turtle-family files are parsed
 * as they are read; JSON-LD is converted to N-Quads by jsonld.js (JSON-LD 1.1 API §4.6) and parsed by n3.
 */
export async function streamRdfFile(path: string, onQuad: (q: N3.Quad) => void, opts: ReadOptions = {}): Promise<void> {
  const format = formatOf(path);
  const base = opts.base ?? pathToFileURL(path).href;
  if (format.n3Format === null) {
    let text: string;
    try {
      text = await readFile(path, 'utf8');
    } catch (err) {
      throw readError(err, path);
    }
    const nquads = await jsonldToNQuads(text.replace(/^\uFEFF/, ''), path, base, opts.contexts);
    try {
      new N3.Parser({ format: 'application/n-quads' }).parse(nquads, (err, quad) => {
        if (err) throw err;
        if (quad) onQuad(quad);
      });
    } catch (err) {
      throw new UserError({
        file: path,
        line: 0,
        field: '',
        message: `JSON-LD produced unusable RDF: ${(err as Error).message}`,
        hint: 'check IRIs in the document',
      });
    }
    return;
  }
  const parser = new N3.StreamParser({ format: format.n3Format, baseIRI: base });
  const input = createReadStream(path, { encoding: 'utf8' });
  await new Promise<void>((resolve, reject) => {
    let first = true;
    input.on('error', (err) => reject(readError(err, path)));
    input.on('data', (chunk) => {
      let text = chunk as string;
      if (first) {
        text = text.replace(/^\uFEFF/, '');
        first = false;
      }
      parser.write(text);
    });
    input.on('end', () => parser.end());
    parser.on('data', onQuad);
    parser.on('error', (err) => {
      input.destroy();
      reject(syntaxError(err, path, format.name));
    });
    parser.on('end', () => resolve());
  });
}

/** Reads every quad of one RDF file into an array; see {@link streamRdfFile}. */
export async function readRdfFile(path: string, opts: ReadOptions = {}): Promise<N3.Quad[]> {
  const quads: N3.Quad[] = [];
  await streamRdfFile(path, (q) => quads.push(q), opts);
  return quads;
}

/** Parses RDF text held in memory (n3 formats only), errors naming `file`. */
export function parseRdfText(text: string, n3Format: string, file: string, base?: string): N3.Quad[] {
  const name = Object.values(READ_FORMATS).find((f) => f.n3Format === n3Format)?.name ?? n3Format;
  try {
    return new N3.Parser({ format: n3Format, baseIRI: base }).parse(text);
  } catch (err) {
    throw syntaxError(err, file, name);
  }
}
