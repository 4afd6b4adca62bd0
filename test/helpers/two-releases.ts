// The checks of a store that had the demo's release 1 (whole and a partner slice) and then release 2 loaded: it holds
// exactly release 2, and every named query gives the figures release 2's report gives. Used for every kind of store.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { build } from '../../src/pipeline.js';
import { queryText } from '../../src/store/open.js';
import type { QueryResult, Store } from '../../src/store/types.js';
import { repoRoot, tempDir } from './fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const demo = path.join(repoRoot, 'demo-data');
export const DEMO_BASE = 'https://concordance.lanternfield.example.org/';
const BASE = DEMO_BASE;
const CX = 'https://w3id.org/concordat/vocab#';

/** The demo's release 1 and release 2 (built on release 1), with release 2's report. */
let built: ReturnType<typeof buildBoth> | null = null;
export const demoReleases = (): ReturnType<typeof buildBoth> => (built ??= buildBoth());
async function buildBoth() {
  const tmp = tempDir('concordat-two-releases-');
  const r1 = path.join(tmp, 'r1'),
    r2 = path.join(tmp, 'r2');
  await build(path.join(demo, 'concordance.json'), r1);
  await build(path.join(demo, 'release-2', 'concordance.json'), r2, { previous: r1 });
  const report = JSON.parse(readFileSync(path.join(r2, 'report.json'), 'utf8'));
  return { tmp, r1, r2, report, markdown: readFileSync(path.join(r2, 'report.md'), 'utf8') };
}

/** Where the two releases are loaded: CLI arguments naming the store, how to open it, which graphs it holds. */
export interface StoreTarget {
  name: string;
  skip: false | string;
  where: (tmp: string) => string[];
  open: (tmp: string) => Promise<Store>;
  env?: Record<string, string>;
  /** The graphs of the store that a load may have made (this concordance's and staging graphs), sorted. */
  graphs: (s: Store, tmp: string) => Promise<string[]>;
}

async function named(
  store: Store,
  name: string,
  params: Record<string, string> = {},
): Promise<Record<string, string>[]> {
  const r: QueryResult = await store.query(await queryText(undefined, name, params));
  assert.equal(r.kind, 'bindings');
  return r.kind === 'bindings'
    ? r.rows.map((row) => Object.fromEntries(Object.entries(row).map(([k, t]) => [k, t.value])))
    : [];
}

/** Loads release 1, its partner slice vellmar and release 2 into the target, then checks it against the report. */
export function twoReleaseChecks(target: StoreTarget): void {
  const { skip } = target;
  const setup = skip
    ? Promise.resolve(null as never)
    : (async () => {
        const { tmp, r1, r2, report, markdown } = await demoReleases();
        const load = (...args: string[]) =>
          spawnSync(process.execPath, [cli, 'load', ...args, ...target.where(tmp)], {
            encoding: 'utf8',
            env: { ...process.env, ...target.env },
          });
        const steps = [load(r1), load(r1, '--partner', 'vellmar'), load(r2)];
        for (const s of steps) assert.equal(s.status, 0, s.stderr);
        const open = async (): Promise<Store> => target.open(tmp);
        return { tmp, r1, r2, steps, report, markdown, open };
      })();
  test(
    `loading release 2 removes release 1's partner graph and says so; the store holds release 2's graphs only: ${target.name}`,
    { skip },
    async () => {
      const { steps, open, tmp } = await setup;
      assert.match(
        steps[2].stderr,
        /removed <https:\/\/concordance\.lanternfield\.example\.org\/graph\/partner\/vellmar> from the store: it held release 2026\.1/,
      );
      const s = await open();
      assert.deepEqual(
        await target.graphs(s, tmp),
        ['claims', 'dataset', 'evidence', 'provenance'].map((g) => `${BASE}graph/${g}`),
      );
      const versions = await s.query(
        `SELECT DISTINCT ?v WHERE { ?d a <http://www.w3.org/ns/dcat#Dataset> ; <http://www.w3.org/ns/dcat#version> ?v }`,
      );
      assert.deepEqual(versions.kind === 'bindings' ? versions.rows.map((r) => r.v.value) : [], ['2027.1']);
      await s.close();
    },
  );

  test(
    `partner-pair-counts on the two-release store: links per status as report.md gives them (earlier link states not counted): ${target.name}`,
    { skip },
    async () => {
      const { report, markdown, open } = await setup;
      const s = await open();
      const byStatus = new Map<string, number>();
      for (const r of await named(s, 'partner-pair-counts'))
        byStatus.set(r.status, (byStatus.get(r.status) ?? 0) + Number(r.links));
      await s.close();
      const kinds = Object.values<Record<string, number>>(report.links.byKind);
      const total = (st: string) => kinds.reduce((a, k) => a + k[st], 0);
      assert.deepEqual(Object.fromEntries(byStatus), {
        [`${CX}Confirmed`]: total('confirmed'),
        [`${CX}Proposed`]: total('proposed'),
        [`${CX}Rejected`]: total('rejected'),
      });
      // the same figures as report.md's "Links by kind and status" table prints them
      const table = [...markdown.matchAll(/^\| (same|part|related) \| (\d+) \| (\d+) \| (\d+) \| (\d+) \|$/gm)];
      assert.equal(table.length, 3);
      for (const [, kind, confirmed, proposed, rejected] of table)
        assert.deepEqual(
          [confirmed, proposed, rejected].map(Number),
          ['confirmed', 'proposed', 'rejected'].map((st) => report.links.byKind[kind][st]),
          kind,
        );
    },
  );

  test(
    `claims-about-record over every work: each link found from both of its works, totals as report.md: ${target.name}`,
    { skip },
    async () => {
      const { report, open } = await setup;
      const s = await open();
      const works = await s.query(`SELECT DISTINCT ?w WHERE { ?w <${CX}partner> ?p }`);
      const seen = new Map<string, number>();
      for (const w of works.kind === 'bindings' ? works.rows.map((r) => r.w.value) : [])
        for (const link of new Set((await named(s, 'claims-about-record', { work: w })).map((r) => r.link)))
          seen.set(link, (seen.get(link) ?? 0) + 1);
      await s.close();
      const kinds = Object.values<Record<string, number>>(report.links.byKind);
      assert.equal(
        seen.size,
        kinds.reduce((a, k) => a + k.confirmed + k.proposed + k.rejected, 0),
      );
      assert.ok([...seen.values()].every((n) => n === 2));
      assert.ok(
        [...seen.keys()].every((l) => !l.includes('/v/')),
        'no earlier link state',
      );
    },
  );

  test(
    `cluster-members for every active and retired cluster: sizes, works and successors as report.md: ${target.name}`,
    { skip },
    async () => {
      const { report, r2, open } = await setup;
      const rows = readFileSync(path.join(r2, 'clusters.csv'), 'utf8')
        .trim()
        .split('\n')
        .slice(1)
        .map((l) => l.split(','));
      const active = [...new Set(rows.filter((r) => r[2] === 'active').map((r) => r[0]))];
      const s = await open();
      const sizes: Record<string, number> = {};
      let works = 0;
      for (const id of active) {
        const members = await named(s, 'cluster-members', { cluster: `${BASE}work/${id}` });
        assert.ok(members.every((m) => m.currentCluster === `${BASE}work/${id}`));
        const n = new Set(members.map((m) => m.member)).size;
        sizes[n] = (sizes[n] ?? 0) + 1;
        works += n;
      }
      for (const { id, replacedBy } of report.clusters.retired as { id: string; replacedBy: string[] }[]) {
        const current = new Set(
          (await named(s, 'cluster-members', { cluster: `${BASE}work/${id}` })).map((m) => m.currentCluster),
        );
        assert.deepEqual([...current].sort(), replacedBy.map((r) => `${BASE}work/${r}`).sort(), id);
      }
      await s.close();
      assert.equal(active.length, report.clusters.count);
      assert.equal(works, report.clusters.works);
      assert.deepEqual(sizes, report.clusters.sizes);
    },
  );

  test(
    `clusters-with-date-conflicts and pairs-through-third-archive: the rows report.md counts: ${target.name}`,
    { skip },
    async () => {
      const { report, open } = await setup;
      const s = await open();
      const conflicts = await named(s, 'clusters-with-date-conflicts');
      const implied = await named(s, 'pairs-through-third-archive');
      await s.close();
      // report.md lists conflicting records with their cluster; the query lists the clusters' conflicting pairs
      const clusters = (ids: Iterable<string>) => [...new Set(ids)].sort();
      assert.deepEqual(
        clusters(conflicts.map((c) => c.cluster)),
        clusters((report.conflicts.listed as { cluster: string }[]).map((l) => `${BASE}work/${l.cluster}`)),
      );
      assert.ok(conflicts.length > 0);
      assert.equal(implied.length, report.clusters.impliedThroughThirdArchive);
    },
  );
}
