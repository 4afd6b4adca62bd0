// Skips for tests that need something outside the project (reference suites, Debian tools, a server).
// On a user's fresh clone they skip with a one-line reason. Under CI (.ci/run sets CONCORDAT_REQUIRE_EXTERNAL=1) a
// missing tool or server that .ci/run installs and starts fails instead, so a broken install cannot pass as a green run
// of skipped checks. The reference suites in ../shared/reference/ are not ours to install: they always just skip.

/**
 * A Debian tool or server that .ci/run provides: `false` when present, else the reason to skip (or an error under CI).
 */
export function requires(present: unknown, reason: string): false | string {
  if (present) return false;
  if (process.env.CONCORDAT_REQUIRE_EXTERNAL === '1') throw new Error(`required under CI but missing: ${reason}`);
  return reason;
}

/** A third-party reference suite read in place: `false` when present, else the reason to skip. */
export function reference(present: unknown, reason: string): false | string {
  return present ? false : reason;
}
