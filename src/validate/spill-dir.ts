// A parent folder → a fresh spill folder carrying an owner record, after removing spill folders whose owner is gone.
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';

const PREFIX = 'concordat-validate-';
const OWNER = 'owner';

/** Whether a process of this host with that id still runs (signal 0 only checks, POSIX kill(2)). */
function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Makes `<parent>/concordat-validate-XXXXXX` with an owner record (process id and host). Spill folders left by a run
 * that was killed (SIGKILL, power loss) are removed first: those of this host whose owner process is gone (a folder
 * without a record may be one being made right now, and is left alone).
 */
export function makeSpillDir(parent: string): string {
  let names: string[] = [];
  try {
    names = readdirSync(parent).filter((n) => n.startsWith(PREFIX));
  } catch {
    /* the parent is made below or fails there */
  }
  for (const name of names) {
    const dir = join(parent, name);
    let owner: string;
    try {
      owner = readFileSync(join(dir, OWNER), 'utf8');
    } catch {
      continue;
    }
    const [pid, host] = owner.trim().split(' ');
    if (host === hostname() && Number(pid) !== process.pid && !alive(Number(pid)))
      rmSync(dir, { recursive: true, force: true });
  }
  const dir = mkdtempSync(join(parent, PREFIX));
  writeFileSync(join(dir, OWNER), `${process.pid} ${hostname()}\n`);
  return dir;
}
