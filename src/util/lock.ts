// A folder path → an exclusive lock file beside it (owner record inside), so two runs never write one folder at once.
import { closeSync, openSync, rmSync, writeSync } from 'node:fs';
import path from 'node:path';
import { UserError, EXIT, displayPath } from '../errors.js';
import { describeOwner, ownerRecord, ownerState, readOwner } from './owner.js';
import { removeOnSignal } from './interrupt.js';

/** A held lock; `release` removes the lock file (idempotent). */
export interface Lock {
  file: string;
  release(): void;
}

/**
 * Takes `lockFile` with O_CREAT|O_EXCL (POSIX open(2): exactly one creator wins). A lock whose owner is gone (killed,
 * machine rebooted) is taken over; a live owner's lock is refused with exit 2 naming the owner and `what` it guards.
 */
export function takeLock(lockFile: string, command: string, what: string, field: string): Lock {
  for (let attempt = 0; attempt < 2; attempt++) {
    let fd: number;
    try {
      fd = openSync(lockFile, 'wx', 0o644);
    } catch (err) {
      const code = (err as NodeJS.ErrnoException).code;
      if (code !== 'EEXIST')
        throw new UserError(
          {
            file: path.dirname(lockFile),
            line: 0,
            field,
            message: `no file can be made in this folder (${code})`,
            hint: 'choose a folder on an ordinary, writable file system',
          },
          EXIT.badInput,
        );
      const owner = readOwner(lockFile);
      if (owner && ownerState(owner) === 'gone') {
        rmSync(lockFile, { force: true });
        continue;
      }
      const who = owner ? describeOwner(owner) : 'another run';
      throw new UserError(
        {
          file: lockFile,
          line: 0,
          field,
          message: `${who} is writing ${displayPath(what)}`,
          hint:
            owner && ownerState(owner) === 'alive'
              ? 'wait for it to finish'
              : `if no such run is going on, remove ${displayPath(lockFile)}`,
        },
        EXIT.badInput,
      );
    }
    const forget = removeOnSignal(lockFile);
    try {
      writeSync(fd, JSON.stringify(ownerRecord(command)) + '\n');
    } finally {
      closeSync(fd);
    }
    let held = true;
    return {
      file: lockFile,
      release() {
        if (!held) return;
        held = false;
        rmSync(lockFile, { force: true });
        forget();
      },
    };
  }
  throw new UserError(
    { file: lockFile, line: 0, field, message: 'the lock changed hands while it was being taken', hint: 'try again' },
    EXIT.badInput,
  );
}
