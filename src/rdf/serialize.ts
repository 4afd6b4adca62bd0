// Quads → Turtle / N-Triples / N-Quads files, turned into text in batches (src/rdf/text.ts) and written atomically.
import { createWriteStream } from 'node:fs';
import { once } from 'node:events';
import type { Quad } from '@rdfjs/types';
import { TempFile } from '../io/temp-file.js';
import { FORMATS, prefixMap, type RdfFormat } from './formats.js';
import { TurtleEncoder, bySubject, nquadsText, subjectKey, turtlePrefixes } from './text.js';

export { FORMATS, type RdfFormat } from './formats.js';

/** A quad sink over one output file. */
export interface QuadWriter {
  /** Adds one quad; returns false when the caller should `await drain()` before writing more. */
  write(quad: Quad): boolean;
  /** Resolves when the file stream has room again. */
  drain(): Promise<void>;
  /** Flushes, closes and moves the temporary file onto the target path. */
  end(): Promise<void>;
  /** Closes and removes the temporary file; the target path is left untouched. */
  abort(): Promise<void>;
}

/** Quads gathered before they are turned into text in one go. */
const BATCH = 4096;

/**
 * Opens a streaming writer for `path` in `format` (RDF 1.1 Turtle §2, N-Triples §2, N-Quads §2).
 * Turtle gets the given prefixes (default: the fixed publishing set) in a fixed order, one block per run of quads
 * with one subject (batches end between subjects); graph-less formats
 * put every quad into the default graph. Output order is the input order, so equal input gives equal bytes.
 * The file appears under `path` only after `end()` (written to a temporary file, then renamed).
 */
export function openQuadWriter(
  path: string,
  format: RdfFormat,
  prefixes: Record<string, string> = prefixMap(),
): QuadWriter {
  const info = FORMATS[format];
  const file = new TempFile(path);
  const out = createWriteStream(file.temp);
  let failure: Error | null = null;
  out.on('error', (err) => {
    failure = err;
  });
  const turtle = info.prefixed ? new TurtleEncoder(prefixes) : null;
  let batch: Quad[] = [];
  let ok = true;
  if (turtle) ok = out.write(turtlePrefixes(prefixes));
  const flush = () => {
    if (batch.length === 0) return;
    ok = out.write(turtle ? turtle.encode(batch) : nquadsText(batch, info.graphs)) && ok;
    batch = [];
  };
  const finish = async (): Promise<void> => {
    flush();
    out.end();
    if (!out.closed) await once(out, 'close').catch(() => undefined);
  };
  return {
    write(quad) {
      if (failure) throw failure;
      // Turtle batches end between subjects, so a run of one subject's quads stays one block
      if (batch.length >= BATCH && (!turtle || subjectKey(quad) !== subjectKey(batch[batch.length - 1]))) flush();
      batch.push(quad);
      const was = ok;
      ok = true;
      return was;
    },
    async drain() {
      if (out.writableNeedDrain) await once(out, 'drain');
    },
    async end() {
      await finish();
      if (failure) {
        file.discard();
        throw failure;
      }
      file.commit();
    },
    async abort() {
      await finish().catch(() => undefined);
      file.discard();
    },
  };
}

/** Writes every quad of a (possibly async) iterable to `path` in `format`; see {@link openQuadWriter}. */
export async function writeQuads(
  path: string,
  format: RdfFormat,
  quads: Iterable<Quad> | AsyncIterable<Quad>,
  prefixes?: Record<string, string>,
): Promise<void> {
  const writer = openQuadWriter(path, format, prefixes);
  // an array is in memory already: Turtle gets each subject's quads together (one block per subject)
  if (Array.isArray(quads) && FORMATS[format].prefixed) quads = bySubject(quads as readonly Quad[]).flat();
  try {
    if (Symbol.iterator in quads) {
      for (const quad of quads) if (!writer.write(quad)) await writer.drain();
    } else {
      for await (const quad of quads) if (!writer.write(quad)) await writer.drain();
    }
  } catch (err) {
    await writer.abort();
    throw err;
  }
  await writer.end();
}
