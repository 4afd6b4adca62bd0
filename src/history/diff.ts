// Two release folders → the changes between them (`concordat diff`).
import { readRelease } from './read.js';
import { compareSnapshots } from './compare.js';
import type { Changes } from './types.js';

/** Reads both releases (concordance.nq, dataset.ttl, clusters.csv) and compares them; see compareSnapshots. */
export async function diffReleases(oldFolder: string, newFolder: string): Promise<Changes> {
  const [before, after] = await Promise.all([readRelease(oldFolder), readRelease(newFolder)]);
  return compareSnapshots(before.snapshot, after.snapshot);
}
