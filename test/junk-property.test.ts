// Generated consortia with and without scans that match whatever the artwork (bench/generate.ts `rates.junk`): the
// junk adds catalogue rows and evidence rows but never puts two artworks in one cluster that were apart without it.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import path from 'node:path';
import { readFileSync } from 'node:fs';
import { generateProject } from '../bench/generate.js';
import { load } from '../src/load/index.js';
import { link } from '../src/link/index.js';
import { cluster } from '../src/cluster/index.js';
import { workRef } from '../src/model.js';
import { tempDir } from './helpers/fixture.js';

/** Each work's artwork by the answer key (`work,artwork,part_of,misdated`). */
const artworks = (file: string) =>
  new Map(
    readFileSync(file, 'utf8')
      .split('\n')
      .slice(1)
      .filter(Boolean)
      .map((line) => line.split(',').slice(0, 2) as [string, string]),
  );

/** Each work's cluster, as a map from `partner:work` to a cluster key (the work itself when unclustered). */
async function clustersOf(dir: string, seed: number, junk: number, key?: Map<string, string>[]) {
  const gen = await generateProject(dir, { works: 1500, partners: 4, seed, partnerDumps: false, rates: { junk } });
  key?.push(artworks(gen.answerKey));
  const { model } = await load(gen.projectFile);
  const c = cluster(model, link(model));
  const out = new Map<string, string>();
  for (let w = 0; w < model.works.length; w++) {
    const k = c.clusterOf[w];
    out.set(workRef(model, w), k >= 0 ? `c${k}` : workRef(model, w));
  }
  return out;
}

test('adding junk scans (3× and 8× the default rates) to generated scenarios never merges two artworks (4 seeds)', async () => {
  const tmp = tempDir('concordat-junk-property-');
  for (const seed of [101, 202, 303, 404]) {
    const keys: Map<string, string>[] = [];
    const clean = await clustersOf(path.join(tmp, `${seed}-0`), seed, 0, keys);
    const art = keys[0];
    for (const junk of [3, 8]) {
      const noisy = await clustersOf(path.join(tmp, `${seed}-${junk}`), seed, junk);
      assert.equal(noisy.size, clean.size, 'the same records (junk scans are photographs of existing records)');
      // two records the junk puts together that were apart without it show one artwork. (Records of one artwork may
      // join: the suspect rule's bound follows the spread of matched works, which junk widens, so an ordinary
      // photograph set aside in the clean scenario may count with junk; that is recall, never a false merge.)
      const members = new Map<string, string[]>();
      for (const [ref, k] of noisy) members.set(k, [...(members.get(k) ?? []), ref]);
      let merged = 0;
      for (const refs of members.values())
        for (let i = 0; i < refs.length; i++)
          for (let j = i + 1; j < refs.length; j++)
            if (clean.get(refs[i]) !== clean.get(refs[j]) && art.get(refs[i]) !== art.get(refs[j])) merged++;
      assert.equal(merged, 0, `seed ${seed}, junk ×${junk}: ${merged} pairs of two artworks merged by junk`);
    }
  }
});
