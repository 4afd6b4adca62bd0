// Worker thread: one part of a site (part.ts), driven by the main thread phase by phase (stream, then shards, once
// every part has streamed); replies when a phase is done, or with the phase's error.
import { parentPort, workerData } from 'node:worker_threads';
import { SitePart, type PartSetup } from './part.js';
import { UserError, type Problem } from '../errors.js';

/** To the worker: the next phase. */
export type PartMessage = { phase: 'stream' | 'shards' };
/** From the worker: a phase done (with the documents written so far), or the phase's error. */
export type PartReply =
  | { done: 'stream' | 'shards'; documents: number }
  | { userError: { problems: Problem[]; exitCode: number } }
  | { error: string; code?: string; path?: string; stack?: string };

const part = SitePart.open(workerData as PartSetup);
// a failure to open is reported when the first phase asks for the part
part.catch(() => undefined);
parentPort!.on('message', async (m: PartMessage) => {
  try {
    const p = await part;
    if (m.phase === 'stream') await p.stream();
    else {
      await p.shards();
      await p.stop();
    }
    parentPort!.postMessage({ done: m.phase, documents: p.documents } satisfies PartReply);
  } catch (e) {
    const reply: PartReply =
      e instanceof UserError
        ? { userError: { problems: e.problems, exitCode: e.exitCode } }
        : {
            error: (e as Error).message,
            code: (e as NodeJS.ErrnoException).code,
            path: (e as NodeJS.ErrnoException).path,
            stack: (e as Error).stack,
          };
    parentPort!.postMessage(reply);
    await (await part.catch(() => undefined))?.stop();
  }
});
