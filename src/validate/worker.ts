// Worker-thread entry: encoded data batches → SHACL result rows, against shapes compiled once per worker.
import { parentPort, workerData } from 'node:worker_threads';
import { UserError } from '../errors.js';
import { readBatch } from './batch.js';
import { compileShapes } from './shacl.js';
import { decodeQuads, type WorkerInit, type WorkerReply, type WorkerTask } from './wire.js';

const init = workerData as WorkerInit;
const port = parentPort!;

let compiled: ReturnType<typeof compileShapes> | null = null;

port.on('message', async (task: WorkerTask) => {
  let reply: WorkerReply;
  try {
    compiled ??= compileShapes(decodeQuads(init.shapes), init.options);
    if ('batch' in task) {
      const { ids, ownTriples, owns } = readBatch(task.batch);
      reply = { id: task.id, rows: await compiled.rowsOfIds(ids, owns), ownTriples };
    } else reply = { id: task.id, rows: await compiled.rowsOfIds(JSON.parse(task.quads) as string[]) };
  } catch (err) {
    reply =
      err instanceof UserError
        ? { id: task.id, problems: err.problems }
        : { id: task.id, error: (err as Error).stack ?? String(err) };
  }
  port.postMessage(reply);
});
