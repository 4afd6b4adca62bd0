// Skips for tests that need something outside the project (reference suites, Debian tools, a server).
// On a user's fresh clone they skip with a one-line reason; under CI (.ci/run sets CONCORDAT_REQUIRE_EXTERNAL=1) an
// absent requirement fails instead, so a broken install can never pass as a green run of skipped checks.

/** `false` when present; else the reason to skip, or a thrown error when CI requires everything. */
export function requires(present: unknown, reason: string): false | string {
  if (present) return false;
  if (process.env.CONCORDAT_REQUIRE_EXTERNAL === '1') throw new Error(`required under CI but missing: ${reason}`);
  return reason;
}
