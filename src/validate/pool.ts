// A fixed set of validation worker threads (worker.ts) → tasks run one per worker at a time, answers as promises.
import { Worker } from 'node:worker_threads';
import { UserError } from '../errors.js';
import type { ResultRow } from './report.js';
import type { WorkerInit, WorkerReply, WorkerTask } from './wire.js';

interface Slot {
  worker: Worker;
  settle?: (reply: WorkerReply | Error) => void;
}

/** A fixed set of workers, each validating one batch at a time. */
export class Pool {
  private readonly slots: Slot[] = [];
  private readonly free: Slot[] = [];
  private readonly waiting: Array<(slot: Slot) => void> = [];
  private nextId = 0;

  constructor(size: number, init: WorkerInit) {
    for (let i = 0; i < size; i++) {
      const slot: Slot = {
        worker: new Worker(new URL('./worker.js', import.meta.url), {
          workerData: init,
          resourceLimits: { maxYoungGenerationSizeMb: 16, maxOldGenerationSizeMb: 1024 },
        }),
      };
      slot.worker.on('message', (reply: WorkerReply) => slot.settle?.(reply));
      slot.worker.on('error', (err) => slot.settle?.(err));
      slot.worker.on('exit', (code) => slot.settle?.(new Error(`validation worker exited with code ${code}`)));
      this.slots.push(slot);
      this.free.push(slot);
    }
  }

  /** Resolves with a free worker (waits while all are busy, which throttles the reader). */
  acquire(): Promise<Slot> {
    const slot = this.free.pop();
    return slot ? Promise.resolve(slot) : new Promise((resolve) => this.waiting.push(resolve));
  }

  /** Sends one task on an acquired worker, frees it afterwards and resolves with its rows. */
  reply(slot: Slot, task: (id: number) => WorkerTask): Promise<{ rows: ResultRow[]; ownTriples?: number }> {
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      slot.settle = (reply) => {
        slot.settle = undefined;
        const next = this.waiting.shift();
        if (next) next(slot);
        else this.free.push(slot);
        if (reply instanceof Error) reject(reply);
        else if ('rows' in reply && reply.id === id) resolve(reply);
        else if ('problems' in reply) reject(new UserError(reply.problems));
        else reject(new Error('error' in reply ? reply.error : 'validation worker answered out of turn'));
      };
      slot.worker.postMessage(task(id));
    });
  }

  async close(): Promise<void> {
    for (const slot of this.slots) slot.settle = undefined;
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }
}
