// Answer keys → the truth quality is measured against: the bench's answer-key.csv and the demo's answer-key.json.
import { readFileSync } from 'node:fs';
import type { Truth } from '../src/analyse/quality.js';

/** `answer-key.csv` of the bench generator: `work,artwork,part_of` (part_of: the whole's artwork, for details). */
export function readTruthCsv(file: string): Truth {
  const truth: Truth = { artwork: new Map(), partOf: new Map() };
  const lines = readFileSync(file, 'utf8').split('\n').slice(1);
  for (const line of lines) {
    if (!line) continue;
    const [work, artwork, partOf] = line.split(',');
    truth.artwork.set(work, artwork);
    if (partOf) truth.partOf.set(artwork, partOf);
  }
  return truth;
}

interface DemoKey {
  truePairs: [string, string, string][];
  details?: { part: string; whole: string[] | string }[];
  brindle?: { details: { part: string; whole: string }[] };
}

/**
 * The demo's answer keys (demo-data/answer-key.json, release-2/answer-key.json): artworks are the components of the
 * true pairs; details list their wholes (a release-2 key adds Brindle's, so both keys are read for release 2).
 */
export function readDemoTruth(...files: string[]): Truth {
  const parent = new Map<string, string>();
  const find = (x: string): string => {
    let r = x;
    while (parent.has(r) && parent.get(r) !== r) r = parent.get(r)!;
    return r;
  };
  const keys = files.map((f) => JSON.parse(readFileSync(f, 'utf8')) as DemoKey);
  const last = keys[keys.length - 1];
  for (const [a, b] of last.truePairs) {
    const ra = find(a),
      rb = find(b);
    if (!parent.has(a)) parent.set(a, a);
    if (!parent.has(b)) parent.set(b, b);
    if (ra !== rb) parent.set(ra < rb ? rb : ra, ra < rb ? ra : rb);
  }
  const artworkOf = (w: string) => `art ${find(w)}`;
  const truth: Truth = { artwork: new Map(), partOf: new Map() };
  const details = keys.flatMap((k) => [...(k.details ?? []), ...(k.brindle?.details ?? [])]);
  for (const w of parent.keys()) truth.artwork.set(w, artworkOf(w));
  for (const d of details) {
    const whole = Array.isArray(d.whole) ? d.whole[0] : d.whole;
    truth.artwork.set(d.part, artworkOf(d.part));
    truth.artwork.set(whole, artworkOf(whole));
    truth.partOf.set(artworkOf(d.part), artworkOf(whole));
  }
  return truth;
}
