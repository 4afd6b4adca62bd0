// Quads → Turtle / N-Triples / N-Quads files, streamed through n3's Writer in 1 MiB chunks and written atomically.
import { createWriteStream, type WriteStream } from 'node:fs';
import { rename, unlink } from 'node:fs/promises';
import { once } from 'node:events';
import N3 from 'n3';
import type { Quad } from '@rdfjs/types';
import { FORMATS, prefixMap, type RdfFormat } from './formats.js';

export { FORMATS, type RdfFormat } from './formats.js';

/** Bytes (UTF-16 code units, close enough) gathered before one write to the file stream. */
const CHUNK = 1 << 20;

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

/** Collects the writer's output and hands it to the file stream in chunks of about {@link CHUNK}. */
class ChunkSink {
  private parts: string[] = [];
  private size = 0;
  ok = true;
  constructor(private readonly out: WriteStream) {}
  write(text: string, _enc?: unknown, done?: () => void): void {
    this.parts.push(text);
    this.size += text.length;
    if (this.size >= CHUNK) this.flush();
    if (typeof done === 'function') done();
  }
  flush(): void {
    if (this.size === 0) return;
    this.ok = this.out.write(this.parts.join('')) && this.ok;
    this.parts = [];
    this.size = 0;
  }
  end(done?: () => void): void {
    if (typeof done === 'function') done();
  }
}

const { DataFactory } = N3;

/**
 * Opens a streaming writer for `path` in `format` (RDF 1.1 Turtle §2, N-Triples §2, N-Quads §2).
 * Turtle gets the given prefixes (default: the fixed publishing set) in a fixed order; graph-less formats
 * put every quad into the default graph. Output order is the input order, so equal input gives equal bytes.
 * The file appears under `path` only after `end()` (written to a temporary file, then renamed).
 */
export function openQuadWriter(path: string, format: RdfFormat, prefixes: Record<string, string> = prefixMap()): QuadWriter {
  const info = FORMATS[format];
  const tmp = `${path}.${process.pid}.${Math.random().toString(36).slice(2)}.tmp`;
  const out = createWriteStream(tmp);
  let failure: Error | null = null;
  out.on('error', (err) => { failure = err; });
  const sink = new ChunkSink(out);
  const writer = new N3.Writer(sink, { format: info.n3Format, prefixes: info.prefixed ? prefixes : {}, end: false });
  const defaultGraph = DataFactory.defaultGraph();
  const finish = async (): Promise<void> => {
    const ended = new Promise<void>((resolve) => writer.end(() => resolve()));
    await ended;
    sink.flush();
    out.end();
    if (!out.closed) await once(out, 'close').catch(() => undefined);
  };
  return {
    write(quad) {
      if (failure) throw failure;
      if (info.graphs || quad.graph.termType === 'DefaultGraph') writer.addQuad(quad);
      else writer.addQuad(quad.subject, quad.predicate, quad.object, defaultGraph);
      const ok = sink.ok;
      sink.ok = true;
      return ok;
    },
    async drain() {
      if (out.writableNeedDrain) await once(out, 'drain');
    },
    async end() {
      await finish();
      if (failure) {
        await unlink(tmp).catch(() => undefined);
        throw failure;
      }
      await rename(tmp, path);
    },
    async abort() {
      await finish().catch(() => undefined);
      await unlink(tmp).catch(() => undefined);
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
