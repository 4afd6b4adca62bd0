// The site's document writer: one document in its three forms (N-Triples as `.ttl`, `.jsonld`, `.html`) handed in
// batches to a worker thread that creates the files (write-worker.ts).
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import type { WriteMessage, WriteReply } from './write-worker.js';
import type { JsonLd } from './jsonld.js';
import { Replies } from '../util/replies.js';

/** Bytes of document text per batch handed to the writer thread, and batches in flight before reading waits. */
const BATCH = 4 << 20;
const IN_FLIGHT = 8;

/**
 * Writes one document in its three forms: `.ttl` (N-Triples lines, which are Turtle too), `.jsonld`, `.html`. The
 * files are written by a worker thread (write-worker.ts) in batches; at most IN_FLIGHT batches wait for it.
 */
export class DocWriter {
  documents = 0;
  private paths: string[] = [];
  /** Each file's end in `bytes` (it starts where the one before ends). */
  private ends: number[] = [];
  private bytes = Buffer.allocUnsafeSlow(BATCH);
  private size = 0;
  private inFlight = 0;
  private readonly replies = new Replies();
  private finished = false;
  private readonly worker: Worker;
  constructor(
    private readonly dir: string,
    private readonly jsonld: JsonLd,
  ) {
    this.worker = new Worker(new URL('./write-worker.js', import.meta.url));
    this.worker.on('message', (r: WriteReply) => {
      if ('ack' in r) this.inFlight--;
      else if ('done' in r) this.finished = true;
      else this.replies.fail(Object.assign(new Error(`writing the site: ${r.error}`), { code: r.code, path: r.path }));
      this.replies.wake();
    });
    this.worker.on('error', (e) => this.replies.fail(e));
    this.worker.on('exit', (code) => {
      if (!this.finished) this.replies.fail(new Error(`site file writer stopped (exit code ${code})`));
    });
  }
  write(doc: string, nt: string, jsonNodes: string[], htmlText: string): void {
    const f = path.join(this.dir, ...doc.split('/'));
    const json = this.jsonld.document(jsonNodes);
    this.add(`${f}.ttl`, nt);
    this.add(`${f}.jsonld`, json);
    this.add(`${f}.html`, htmlText);
    this.documents++;
  }
  /**
   * A file's text encoded as UTF-8 into the batch's own buffer, which is then moved to the writer thread (transferred,
   * not copied): no copy of the text in the message, no encoding on the writer's side.
   */
  private add(file: string, text: string) {
    const worst = text.length * 3; // UTF-8 bytes per UTF-16 code unit, at most
    if (this.size + worst > this.bytes.length) {
      this.post();
      if (worst > this.bytes.length) this.bytes = Buffer.allocUnsafeSlow(worst);
    }
    this.size += this.bytes.write(text, this.size);
    this.paths.push(file);
    this.ends.push(this.size);
  }
  private post() {
    if (!this.paths.length) return;
    const { buffer } = this.bytes;
    this.worker.postMessage({ paths: this.paths, ends: this.ends, bytes: buffer } satisfies WriteMessage, [buffer]);
    this.inFlight++;
    this.paths = [];
    this.ends = [];
    this.bytes = Buffer.allocUnsafeSlow(BATCH);
    this.size = 0;
  }
  /** A promise while too many batches wait for the writer (the reader pauses), else undefined. */
  backlog(): Promise<void> | undefined {
    if (this.replies.failure) return Promise.reject(this.replies.failure);
    return this.inFlight >= IN_FLIGHT ? this.replies.until(() => this.inFlight < IN_FLIGHT) : undefined;
  }
  /** Stops the writer thread (after close, or when the site fails half-way). */
  async stop(): Promise<void> {
    this.finished = true;
    await this.worker.terminate();
  }

  /** Writes what is left and waits until every file is written; fails with the writer's first error. */
  async close(): Promise<void> {
    this.post();
    this.worker.postMessage({ end: true } satisfies WriteMessage);
    await this.replies.until(() => this.finished);
  }
}
