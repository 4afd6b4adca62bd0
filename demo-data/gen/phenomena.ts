// Release 1 + its own random stream → scans that match whatever the artwork (mount backs, colour charts) and look-alike
// works (prints from one plate, pendants), with the evidence rows a matcher reports for them.
import type { Match } from './evidence.js';
import type { Builder, Rec } from './model.js';
import type { PartnerKey } from './partners.js';
import { Rng } from './rng.js';

/** How many of each the demo holds (release 1; the release-2 rerun reports the same rows). */
export const PLAN_PHENOMENA = { mountBacks: 12, charts: 7, prints: 3, pendants: 2 } as const;

export interface Phenomena {
  /** Image refs (`partner:imageId`) of the mount-back scans and colour charts added to records. */
  mountBacks: string[];
  charts: string[];
  /** Look-alike works: three prints from one plate (distinct objects), two pairs of pendants. */
  prints: Rec[];
  pendants: [Rec, Rec][];
  matches: Match[];
}

const PARTNERS: readonly PartnerKey[] = ['vellmar', 'kessling', 'fontclaire'];
const ref = (r: Rec, i: number) => `${r.partner}:${r.images[i].id}`;
const r3 = (x: number) => Math.round(x * 1000) / 1000;
const r2 = (x: number) => Math.round(x * 100) / 100;

/** A scan of the kind added to `rec` as one more photograph (its ID in the partner's numbering). */
function addScan(b: Builder, rec: Rec, rng: Rng): string {
  const id = b.ids.images(rec.partner, rec.work, rec.images.length + 1).pop()!;
  rec.images.push({ id, width: rng.int(1600, 3000), height: rng.int(1600, 3000) });
  return ref(rec, rec.images.length - 1);
}

/**
 * Adds the phenomena to release 1 after its story is told (own random stream, so the story's records keep their IDs):
 * mount backs on twelve records, each matched with 5–9 of the others at 0.72–0.95 (more works than one artwork has
 * records: hubs); colour charts on seven records, all matching each other at 0.8–0.97 (a clique no larger than an
 * artwork's records, told apart only because the paintings beside them never match); three prints from one plate
 * (one record each, every pair matching on one photo at 0.6–0.72) and two pairs of pendants (0.58–0.7).
 */
export function phenomena1(b: Builder): Phenomena {
  const rng = Rng.of('release-1/phenomena');
  const story = b.recs.filter((r) => r.images.length >= 1);
  const chosen = rng.shuffle(story).slice(0, PLAN_PHENOMENA.mountBacks + PLAN_PHENOMENA.charts);
  const matches: Match[] = [];
  const scans = (recs: Rec[]) => recs.map((r) => addScan(b, r, rng));
  const mountBacks = scans(chosen.slice(0, PLAN_PHENOMENA.mountBacks));
  const charts = scans(chosen.slice(PLAN_PHENOMENA.mountBacks));
  const seen = new Set<string>();
  mountBacks.forEach((x, i) => {
    const others = rng.shuffle(mountBacks.filter((_, j) => j !== i)).slice(0, rng.int(5, 9));
    for (const y of others) {
      const k = [x, y].sort().join('|');
      if (seen.has(k)) continue;
      seen.add(k);
      matches.push({ a: x, b: y, score: r3(rng.real(0.72, 0.95)), overlap: r2(rng.real(0.85, 1)) });
    }
  });
  for (let i = 0; i < charts.length; i++)
    for (let j = i + 1; j < charts.length; j++)
      matches.push({ a: charts[i], b: charts[j], score: r3(rng.real(0.8, 0.97)), overlap: null });

  // look-alike works: distinct objects whose photographs match moderately and share nothing else
  const plate = b.art();
  const prints = PARTNERS.map((p) =>
    b.rec(p, b.art({ subject: plate.subject, qualifier: plate.qualifier, year: plate.year }), {
      images: rng.int(1, 2),
    }),
  );
  for (let i = 0; i < prints.length; i++)
    for (let j = i + 1; j < prints.length; j++)
      matches.push({
        a: ref(prints[i], 0),
        b: ref(prints[j], 0),
        score: r3(rng.real(0.6, 0.72)),
        overlap: r2(rng.real(0.85, 1)),
      });
  const pendants = Array.from({ length: PLAN_PHENOMENA.pendants }, (_, i): [Rec, Rec] => {
    const left = b.art();
    const right = b.art({ subject: left.subject, year: left.year });
    const pair: [Rec, Rec] = [b.rec(PARTNERS[i], left), b.rec(PARTNERS[(i + 1) % 3], right)];
    matches.push({
      a: ref(pair[0], 0),
      b: ref(pair[1], 0),
      score: r3(rng.real(0.58, 0.7)),
      overlap: r2(rng.real(0.8, 1)),
    });
    return pair;
  });
  return { mountBacks, charts, prints, pendants, matches };
}
