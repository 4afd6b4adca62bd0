// The release-1 story (three archives, one matcher run) → artworks, records and matched pairs, each difficulty named.
import { centuryLabel, centuryOf } from './dates.js';
import { Builder, type Rec } from './model.js';
import { IdMint, type PartnerKey } from './partners.js';
import { Rng } from './rng.js';

const V: PartnerKey = 'vellmar';
const K: PartnerKey = 'kessling';
const F: PartnerKey = 'fontclaire';
/** Partner pairs in turn, so every pair of archives gets its share. */
const PAIRINGS: readonly [PartnerKey, PartnerKey][] = [
  [V, K],
  [K, F],
  [V, F],
];

/** How many of each difficulty release 1 holds; the story below follows this table. */
export const PLAN1 = {
  triangles: 10,
  chains: 8,
  pairs: 30,
  hardConflicts: 4,
  missed: 5,
  weak: 3,
  details: 10,
  replicas: 8,
  fadingReplicas: 2,
  duplicates: 4,
  splitArtworks: 2,
  singletons: 50,
  noise: 80,
  smallImages: 5,
} as const;

/** Release 1 as told: the builder plus handles on every deliberate difficulty. */
export interface Release1 {
  b: Builder;
  triangles: [Rec, Rec, Rec][];
  chains: { ends: [Rec, Rec]; mid: Rec }[];
  pairs: [Rec, Rec][];
  missed: [Rec, Rec][];
  weak: [Rec, Rec][];
  details: { detail: Rec; wholes: Rec[]; linked: Rec[] }[];
  replicas: { original: Rec; replica: Rec; fading: boolean }[];
  duplicates: { first: Rec; second: Rec; elsewhere?: Rec }[];
  trueBridge: { sides: [Rec[], Rec[]]; link: [Rec, Rec] };
  falseBridge: { sides: [Rec[], Rec[]]; link: [Rec, Rec] };
  splitArtworks: { sides: [Rec[], Rec[]] }[];
  singletons: Rec[];
  conflicts: { a: Rec; b: Rec; implied: boolean }[];
  conventionOnly: [Rec, Rec][];
  rowDates: Rec;
  smallImages: string[];
}

/**
 * The date a partner writes, in its own language, for a year about a century after the true one: far enough that the
 * intervals lie more than the default date tolerance (25 years) apart.
 */
function conflictingDate(partner: PartnerKey, year: number): string {
  const table: Record<PartnerKey, () => string> = {
    vellmar: () => centuryLabel(centuryOf(year, 'ordinal'), 'en'),
    kessling: () => `${year - 10}/${year + 10}`, // EDTF interval: Kessling writes EDTF beside German phrases
    fontclaire: () => centuryLabel(centuryOf(year, 'unknown'), 'fr'),
    brindle: () => `${year}`,
  };
  return table[partner]();
}

/** Same year 1500, different century words: compatible once each partner's convention is applied. */
const CONVENTION_ONLY: readonly [[PartnerKey, string], [PartnerKey, string]][] = [
  [
    [V, '15th century'],
    [K, '1500'],
  ],
  [
    [V, '1500'],
    [K, '16. Jh.'],
  ],
  [
    [V, '15th century'],
    [K, '16. Jh.'],
  ],
  [
    [F, 'XVe s.'],
    [K, '1500'],
  ],
];

/** Tells the release-1 story with its own random streams. */
export function release1(): Release1 {
  const b = new Builder(Rng.of('release-1/world'), new IdMint(Rng.of('release-1/ids')));
  const rng = Rng.of('release-1/story');

  const triangles = Array.from({ length: PLAN1.triangles }, (_, i) => {
    // the first two carry the titles with a quoted delimiter and a line break at Fontclaire
    const art = b.art(i === 0 ? { subject: 0, qualifier: 0 } : i === 1 ? { subject: 4, qualifier: 5 } : {});
    const t: [Rec, Rec, Rec] = [b.rec(V, art), b.rec(K, art), b.rec(F, art)];
    if (i === 0) t[2].title = 'Vierge à l\'Enfant, dite "de Fontclaire"';
    if (i === 1) t[2].title = 'Retable de la Passion\n(panneau central)';
    b.link(t[0], t[1], 'same');
    b.link(t[1], t[2], 'same');
    b.link(t[0], t[2], 'same');
    return t;
  });

  const conflicts: Release1['conflicts'] = [];
  const chains = Array.from({ length: PLAN1.chains }, (_, i) => {
    const mid = ([K, F, V] as const)[i % 3];
    const [e1, e2] = ([V, K, F] as const).filter((p) => p !== mid);
    // chain 0: the ends disagree on the date and the middle archive gives none, so only the cluster shows it
    const art = b.art(i === 0 ? { year: 1465, narrow: true } : {});
    const a = b.rec(e1, art);
    const m = b.rec(mid, art, i === 0 ? { date: '' } : {});
    const c = b.rec(e2, art, i === 0 ? { date: conflictingDate(e2, art.year + 130) } : {});
    if (i === 0) conflicts.push({ a, b: c, implied: true });
    b.link(a, m, 'same');
    b.link(m, c, 'same');
    return { ends: [a, c] as [Rec, Rec], mid: m };
  });

  const conventionOnly: [Rec, Rec][] = [];
  const pairs = Array.from({ length: PLAN1.pairs }, (_, i): [Rec, Rec] => {
    const conv = CONVENTION_ONLY[i - PLAN1.hardConflicts];
    if (conv) {
      const art = b.art({ year: 1500 });
      const pair: [Rec, Rec] = [
        b.rec(conv[0][0], art, { date: conv[0][1] }),
        b.rec(conv[1][0], art, { date: conv[1][1] }),
      ];
      conventionOnly.push(pair);
      b.link(pair[0], pair[1], 'same');
      return pair;
    }
    const [p, q] = PAIRINGS[i % 3];
    const hard = i < PLAN1.hardConflicts;
    const art = b.art(hard ? { year: 5 * rng.int(288, 296), narrow: true } : {});
    const pair: [Rec, Rec] = [b.rec(p, art), b.rec(q, art, hard ? { date: conflictingDate(q, art.year + 130) } : {})];
    if (hard) conflicts.push({ a: pair[0], b: pair[1], implied: false });
    b.link(pair[0], pair[1], 'same');
    return pair;
  });

  const twoOf = (i: number): [Rec, Rec] => {
    const [p, q] = PAIRINGS[i % 3];
    const art = b.art();
    return [b.rec(p, art), b.rec(q, art)];
  };
  const missed = Array.from({ length: PLAN1.missed }, (_, i) => twoOf(i));
  const weak = Array.from({ length: PLAN1.weak }, (_, i) => {
    const pair = twoOf(i + 1);
    b.link(pair[0], pair[1], 'weak');
    return pair;
  });

  const details = Array.from({ length: PLAN1.details }, (_, i) => {
    const whole = b.art();
    const home = ([V, K, F] as const)[i % 3];
    const wholes = [b.rec(home, whole)];
    if (i >= 5) {
      wholes.push(b.rec(([K, F, V] as const)[i % 3], whole));
      b.link(wholes[0], wholes[1], 'same');
    }
    // the first two details sit in the same archive as their whole
    const at = i < 2 ? home : ([F, V, K] as const)[i % 3];
    const detail = b.rec(at, b.art({ kind: 'detail', of: whole }));
    const linked = i % 2 === 1 && wholes.length > 1 ? wholes : [wholes[0]];
    for (const w of linked) b.link(detail, w, i === 3 || i === 4 ? 'small-part' : 'part');
    return { detail, wholes, linked };
  });

  const replicas = Array.from({ length: PLAN1.replicas }, (_, i) => {
    const [p, q] = i < 2 ? [PAIRINGS[i][0], PAIRINGS[i][0]] : PAIRINGS[i % 3];
    const orig = b.art();
    const original = b.rec(p, orig);
    const replica = b.rec(q, b.art({ kind: 'replica', of: orig }));
    const fading = i >= PLAN1.replicas - PLAN1.fadingReplicas;
    b.link(original, replica, fading ? 'fading' : 'replica');
    return { original, replica, fading };
  });

  const duplicates = Array.from({ length: PLAN1.duplicates }, (_, i) => {
    const partner = ([K, K, V, F] as const)[i];
    const first = b.rec(partner, b.art());
    const second = b.duplicate(first);
    b.link(first, second, 'duplicate');
    if (i >= 2) return { first, second };
    const elsewhere = b.rec(i === 0 ? V : F, first.art);
    b.link(elsewhere, first, 'same');
    return { first, second, elsewhere };
  });

  // a correct cluster whose halves meet only through one weak-ish link
  const z = b.art();
  const zv = b.rec(V, z),
    zk = b.rec(K, z),
    zk2 = b.duplicate(zk),
    zf = b.rec(F, z);
  b.link(zv, zk, 'same');
  b.link(zk2, zf, 'same');
  b.link(zk, zf, 'bridge');
  const trueBridge = {
    sides: [
      [zv, zk],
      [zk2, zf],
    ] as [Rec[], Rec[]],
    link: [zk, zf] as [Rec, Rec],
  };

  // two distinct works (an original and its replica) joined by one look-alike link
  const x = b.art();
  const xr = b.art({ kind: 'replica', of: x });
  const xv = b.rec(V, x),
    xk = b.rec(K, x),
    rf = b.rec(F, xr),
    rk = b.rec(K, xr);
  b.link(xv, xk, 'same');
  b.link(rf, rk, 'same');
  b.link(xk, rf, 'false-bridge');
  const falseBridge = {
    sides: [
      [xv, xk],
      [rf, rk],
    ] as [Rec[], Rec[]],
    link: [xk, rf] as [Rec, Rec],
  };

  // one artwork, two clusters that nothing joins yet (a partner holds it twice under unrelated numbers)
  const m1 = b.art(),
    m2 = b.art();
  const m1v = b.rec(V, m1),
    m1k = b.rec(K, m1),
    m1f = b.rec(F, m1),
    m1k2 = b.rec(K, m1);
  const m2v = b.rec(V, m2),
    m2f = b.rec(F, m2),
    m2k = b.rec(K, m2),
    m2f2 = b.rec(F, m2);
  b.link(m1v, m1k, 'same');
  b.link(m1f, m1k2, 'same');
  b.link(m2v, m2f, 'same');
  b.link(m2k, m2f2, 'same');
  const splitArtworks = [
    {
      sides: [
        [m1v, m1k],
        [m1f, m1k2],
      ] as [Rec[], Rec[]],
    },
    {
      sides: [
        [m2v, m2f],
        [m2k, m2f2],
      ] as [Rec[], Rec[]],
    },
  ];

  const special: Record<number, { subject: number; qualifier: number; title?: string }> = {
    1: { subject: 4, qualifier: 0, title: 'Kreuzigung; Fragment eines Altarflügels' },
    4: { subject: 15, qualifier: 0, title: 'Anna Selbdritt, gen. "Die stille Anna"' },
    6: { subject: 6, qualifier: 0, title: 'Saint Jerome in his Study, with the lion' },
  };
  const singletons = Array.from({ length: PLAN1.singletons }, (_, i) => {
    const partner = ([V, K, F] as const)[i % 3];
    const s = special[i];
    const r = b.rec(partner, b.art(s ? { subject: s.subject, qualifier: s.qualifier } : {}), {
      images: i === 7 ? 3 : undefined,
    });
    if (s?.title) r.title = s.title;
    return r;
  });
  // one work whose photographs were dated differently row by row
  const rowDates = singletons[7];
  rowDates.date = `${rowDates.art.year}~`;
  rowDates.rowDates = [rowDates.date, rowDates.date, `${rowDates.art.year + 10}`];
  for (const i of [2, 5, 11]) singletons[i].date = '';

  const smallImages: string[] = [];
  for (const r of rng.shuffle(b.recs.filter((r) => r.partner === V)).slice(0, PLAN1.smallImages)) {
    const img = r.images[0];
    if (rng.chance(0.5)) img.width = rng.int(180, 290);
    else img.height = rng.int(180, 290);
    smallImages.push(`${r.partner}:${img.id}`);
  }
  smallImages.sort();

  return {
    b,
    triangles,
    chains,
    pairs,
    missed,
    weak,
    details,
    replicas,
    duplicates,
    trueBridge,
    falseBridge,
    splitArtworks,
    singletons,
    conflicts,
    conventionOnly,
    rowDates,
    smallImages,
  };
}
