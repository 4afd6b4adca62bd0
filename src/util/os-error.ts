// An operating-system error (disk full, no permission, a path under a file) → a user-facing problem without a stack
// trace.
import { EXIT, UserError } from '../errors.js';

/** What each errno means for the user, and the hint (POSIX errno names; Node's `err.code`). */
const OS_ERRORS: Record<string, { message: string; hint: string; exit: number }> = {
  ENOSPC: {
    message: 'no space left on the device',
    hint: 'free some space or write elsewhere; nothing was published',
    exit: EXIT.failure,
  },
  EDQUOT: {
    message: 'disk quota exceeded',
    hint: 'free some space or write elsewhere; nothing was published',
    exit: EXIT.failure,
  },
  EACCES: { message: 'permission denied', hint: 'choose a path you may write to', exit: EXIT.badInput },
  EPERM: { message: 'operation not permitted', hint: 'choose a path you may write to', exit: EXIT.badInput },
  EROFS: {
    message: 'the file system is read-only',
    hint: 'choose a path on a writable file system',
    exit: EXIT.badInput,
  },
  ENOTDIR: { message: 'a part of this path is a file, not a folder', hint: 'check the path', exit: EXIT.badInput },
  EISDIR: { message: 'is a folder, a file was expected', hint: 'check the path', exit: EXIT.badInput },
  ENOENT: { message: 'no such file or folder', hint: 'check the path', exit: EXIT.badInput },
  EEXIST: { message: 'already exists', hint: 'choose a new path', exit: EXIT.badInput },
  ENAMETOOLONG: { message: 'the path is too long', hint: 'choose a shorter path', exit: EXIT.badInput },
  EMFILE: { message: 'too many open files', hint: 'raise the limit (ulimit -n) and run again', exit: EXIT.failure },
  EIO: { message: 'input/output error', hint: 'check the disk', exit: EXIT.failure },
  EINVAL: {
    message: 'invalid argument for this file system',
    hint: 'choose a path on an ordinary file system',
    exit: EXIT.badInput,
  },
  ENOTEMPTY: { message: 'the folder is not empty', hint: 'choose a new folder', exit: EXIT.badInput },
  EBUSY: { message: 'the path is busy', hint: 'try again when it is free', exit: EXIT.failure },
};

/** An errno error in plain words (`no such file or folder`), its code where it has no words here. */
export function osWords(err: unknown): string {
  const code = (err as NodeJS.ErrnoException | null)?.code;
  return (code && OS_ERRORS[code]?.message) ?? code ?? String(err);
}

/** A UserError for an errno error from the file system, or null when `err` is something else (a bug: rethrown). */
export function osUserError(err: unknown): UserError | null {
  const e = err as NodeJS.ErrnoException | null;
  if (!e || typeof e !== 'object' || typeof e.code !== 'string' || !(e.syscall || e.path)) return null;
  const known = OS_ERRORS[e.code];
  if (!known) return null;
  return new UserError(
    {
      file: e.path ?? 'file system',
      line: 0,
      field: '',
      message: `${known.message} (${e.code}${e.syscall ? ` in ${e.syscall}` : ''})`,
      hint: known.hint,
    },
    known.exit,
  );
}
