// The release-2 story (Brindle joins, the matcher is rerun, curators review) → new records, pairs and the changes they
// cause.
import { Builder, type PairSpec, type Rec } from './model.js';
import { IdMint } from './partners.js';
import type { Release1 } from './release1.js';
import { Rng } from './rng.js';

/** How many of each difficulty the new partner brings. */
export const PLAN2 = {
  extendTriangles: 6,
  extendPairs: 6,
  newPairs: 2,
  details: 2,
  replicas: 2,
  duplicates: 1,
  missed: 1,
  singletons: 17,
  noise: 90,
} as const;

/** Release 2 as told, with handles on what should change against release 1. */
export interface Release2 {
  r1: Release1;
  b: Builder;
  extended: { brindle: Rec; linked: Rec[] }[];
  newPairs: [Rec, Rec][];
  details: { detail: Rec; whole: Rec }[];
  replicas: { original: Rec; replica: Rec }[];
  duplicates: [Rec, Rec][];
  missed: [Rec, Rec][];
  singletons: Rec[];
  conflict: { a: Rec; b: Rec };
  /** Merges: a Brindle record that links both halves, and a link the rerun finds between old clusters. */
  mergeViaBrindle: { brindle: Rec; joins: [Rec, Rec] };
  mergeByRerun: PairSpec;
}

const B = 'brindle' as const;

/** Tells the release-2 story on top of release 1, with its own random streams. */
export function release2(r1: Release1): Release2 {
  const b = new Builder(Rng.of('release-2/world'), new IdMint(Rng.of('release-2/ids')), r1.b.arts.length + 1);

  const extended = [
    ...r1.triangles
      .slice(0, PLAN2.extendTriangles)
      .map((t, i) => ({ art: t[0].art, linked: [t[i % 3], t[(i + 1) % 3]] })),
    ...r1.pairs.slice(14, 14 + PLAN2.extendPairs).map((p) => ({ art: p[0].art, linked: [p[0]] })),
  ].map(({ art, linked }) => {
    const brindle = b.rec(B, art);
    for (const r of linked) b.link(brindle, r, 'same');
    return { brindle, linked };
  });
  // the first extended pair: Brindle dates it a century later than both older records
  const conflicted = extended[PLAN2.extendTriangles];
  const y = conflicted.brindle.art.year;
  conflicted.brindle.date = `${Math.floor(y / 100) * 100 + 130}`;
  const conflict = { a: conflicted.linked[0], b: conflicted.brindle };

  const newPairs = [r1.singletons[0], r1.singletons[10]].map((old): [Rec, Rec] => {
    const rec = b.rec(B, old.art);
    b.link(rec, old, 'same');
    return [rec, old];
  });

  const [m1, m2] = r1.splitArtworks;
  const m1b = b.rec(B, m1.sides[0][0].art);
  b.link(m1b, m1.sides[0][1], 'same');
  b.link(m1b, m1.sides[1][0], 'same');
  const mergeViaBrindle = { brindle: m1b, joins: [m1.sides[0][1], m1.sides[1][0]] as [Rec, Rec] };
  const mergeByRerun = b.link(m2.sides[0][0], m2.sides[1][0], 'same');

  const details = [r1.details[5].wholes[0], r1.triangles[6][0]].map((whole) => {
    const detail = b.rec(B, b.art({ kind: 'detail', of: whole.art }));
    b.link(detail, whole, 'part');
    return { detail, whole };
  });
  const replicas = [r1.singletons[13], r1.pairs[20][0]].map((original) => {
    const replica = b.rec(B, b.art({ kind: 'replica', of: original.art }));
    b.link(original, replica, 'replica');
    return { original, replica };
  });
  const duplicates = Array.from({ length: PLAN2.duplicates }, (): [Rec, Rec] => {
    const first = b.rec(B, b.art());
    const second = b.duplicate(first);
    b.link(first, second, 'duplicate');
    return [first, second];
  });
  const missed = [r1.pairs[25][1]].map((old): [Rec, Rec] => [b.rec(B, old.art), old]);

  const singletons = Array.from({ length: PLAN2.singletons }, () => b.rec(B, b.art()));
  singletons[3].date = 'undated';

  return {
    r1,
    b,
    extended,
    newPairs,
    details,
    replicas,
    duplicates,
    missed,
    singletons,
    conflict,
    mergeViaBrindle,
    mergeByRerun,
  };
}
