// Which process owns a temp folder or a lock: the owner record (PID, host, boot, start) and whether that owner is gone.
import { readFileSync } from 'node:fs';
import { hostname } from 'node:os';

/** Written into every temp folder and lock file concordat makes, so a later run can tell leftovers from live work. */
export interface Owner {
  tool: 'concordat';
  pid: number;
  host: string;
  /** Linux boot id (`/proc/sys/kernel/random/boot_id`); after a reboot every earlier owner is gone. Empty elsewhere. */
  boot: string;
  /** When the owner started this piece of work (clock time: the record is never part of a release). */
  started: string;
  /** The command that made it, e.g. "build". */
  command: string;
}

function bootId(): string {
  try {
    return readFileSync('/proc/sys/kernel/random/boot_id', 'utf8').trim();
  } catch {
    return '';
  }
}

/** The record for this process. */
export function ownerRecord(command: string): Owner {
  return {
    tool: 'concordat',
    pid: process.pid,
    host: hostname(),
    boot: bootId(),
    started: new Date().toISOString(),
    command,
  };
}

/** Reads an owner record; null when the file is missing or is not one (a partly written record included). */
export function readOwner(file: string): Owner | null {
  try {
    const o = JSON.parse(readFileSync(file, 'utf8')) as Partial<Owner>;
    return o && o.tool === 'concordat' && Number.isInteger(o.pid) && typeof o.host === 'string' ? (o as Owner) : null;
  } catch {
    return null;
  }
}

/**
 * What is known of an owner: `gone` when it ran on this host and its process no longer exists (or the machine has
 * rebooted since), `alive` when its process exists, `elsewhere` when it ran on another host (cannot be checked from
 * here).
 * A reused PID makes a gone owner look alive: the leftover then stays until that process ends (the safe side).
 */
export function ownerState(o: Owner): 'gone' | 'alive' | 'elsewhere' {
  if (o.host !== hostname()) return 'elsewhere';
  const boot = bootId();
  if (o.boot && boot && o.boot !== boot) return 'gone';
  if (o.pid === process.pid) return 'alive';
  try {
    process.kill(o.pid, 0);
    return 'alive';
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM' ? 'alive' : 'gone';
  }
}

/** "pid 123 on host h, since 2026-…" for messages. */
export const describeOwner = (o: Owner): string =>
  `concordat ${o.command} (pid ${o.pid} on ${o.host}, started ${o.started})`;
