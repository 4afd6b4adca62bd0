// Progress bars on stderr for long stages (cli-progress), silent when stderr is not a terminal.
import cliProgress from 'cli-progress';

export interface Progress {
  /** Moves the bar to `value` (of the total given at start). */
  update(value: number): void;
  /** Completes and removes the bar. */
  stop(): void;
}

const silent: Progress = { update: () => undefined, stop: () => undefined };

/**
 * A bar for one stage (`label`, out of `total` units), drawn on stderr only when it is a terminal, so
 * machine-readable stdout and logs stay clean. Redraws at most ten times a second.
 */
export function progress(label: string, total: number, unit = ''): Progress {
  if (!process.stderr.isTTY || total <= 0 || process.env.CONCORDAT_NO_PROGRESS === '1') return silent;
  const bar = new cliProgress.SingleBar(
    {
      format: `${label.padEnd(22)} [{bar}] {percentage}% {value}/{total}${unit ? ' ' + unit : ''} {eta_formatted} left`,
      stream: process.stderr,
      fps: 10,
      clearOnComplete: true,
      hideCursor: true,
    },
    cliProgress.Presets.shades_classic,
  );
  bar.start(total, 0);
  return { update: (v) => bar.update(Math.min(v, total)), stop: () => bar.stop() };
}
