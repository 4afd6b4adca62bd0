// Waiting on a worker thread's replies: a condition re-checked after each reply, or the worker's first failure.

/**
 * The waiting side of a writer that hands work to a worker thread: `wake` after each reply, `fail` on the worker's
 * first error (kept; later ones are dropped), `until` resolves once a condition holds and rejects with that error.
 */
export class Replies {
  failure: Error | null = null;
  private waiting: (() => void) | null = null;

  fail(e: Error): void {
    this.failure ??= e;
    this.wake();
  }

  wake(): void {
    const w = this.waiting;
    this.waiting = null;
    w?.();
  }

  async until(holds: () => boolean): Promise<void> {
    while (!this.failure && !holds()) await new Promise<void>((r) => (this.waiting = r));
    if (this.failure) throw this.failure;
  }
}
