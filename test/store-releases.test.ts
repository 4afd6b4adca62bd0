// A store folder that had the demo's release 1 (whole and a partner slice) and then release 2 loaded holds exactly
// release 2, and every named query gives the figures release 2's report gives (the checks: helpers/two-releases.ts).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { EmbeddedStore } from '../src/store/embedded.js';
import { twoReleaseChecks } from './helpers/two-releases.js';

twoReleaseChecks({
  name: 'store folder',
  skip: false,
  where: (tmp) => ['--store', path.join(tmp, 'store')],
  open: (tmp) => EmbeddedStore.open(path.join(tmp, 'store')),
  graphs: async (_s, tmp) =>
    Object.keys(JSON.parse(readFileSync(path.join(tmp, 'store', 'manifest.json'), 'utf8')).graphs).sort(),
});

test('every shipped named query is checked against the report above', async () => {
  const { namedQueries } = await import('../src/store/named.js');
  assert.deepEqual(await namedQueries(), [
    'claims-about-record',
    'cluster-members',
    'clusters-with-date-conflicts',
    'pairs-through-third-archive',
    'partner-pair-counts',
  ]);
});
