// The stories' review outcomes → curators' decision files and the hand-made gold concordance.
import { delimited, PLAIN_CSV } from './csv.js';
import { ref, type Rec } from './model.js';
import type { Release1 } from './release1.js';
import type { Release2 } from './release2.js';
import type { Rng } from './rng.js';

/** ORCID's own documented example identifier, used for one invented curator. */
const ORCID_CURATOR = 'https://orcid.org/0000-0002-1825-0097';
const MARWITZ = 'Ilse Marwitz';
const FONTAN = 'Aurélie Fontan';
const WREN = 'Tobias Wren';

type Verdict = 'same' | 'part' | 'related' | 'distinct';
/** One decision row: the pair, verdict, who, when (ISO 8601), and a note. */
export interface Decision {
  a: Rec;
  b: Rec;
  verdict: Verdict;
  curator: string;
  date: string;
  note: string;
}

const d = (a: Rec, b: Rec, verdict: Verdict, curator: string, date: string, note = ''): Decision => ({
  a,
  b,
  verdict,
  curator,
  date,
  note,
});

/** Release-1 decisions, in the order curators appended them. */
export function decisions1(r: Release1): Decision[] {
  const rep = r.replicas;
  return [
    d(r.triangles[0][0], r.triangles[0][1], 'same', ORCID_CURATOR, '2026-10-06', 'checked against both photographs'),
    d(r.triangles[1][1], r.triangles[1][2], 'same', MARWITZ, '2026-10-07'),
    d(r.chains[1].ends[0], r.chains[1].mid, 'same', MARWITZ, '2026-10-07'),
    d(r.pairs[8][0], r.pairs[8][1], 'same', FONTAN, '2026-10-09'),
    d(r.pairs[9][0], r.pairs[9][1], 'same', FONTAN, '2026-10-09'),
    d(r.pairs[10][0], r.pairs[10][1], 'same', ORCID_CURATOR, '2026-10-12'),
    d(
      r.duplicates[0].first,
      r.duplicates[0].second,
      'same',
      MARWITZ,
      '2026-10-13',
      'catalogued twice; records to be merged',
    ),
    d(rep[4].original, rep[4].replica, 'same', FONTAN, '2026-10-14', 'looks identical in the photographs'),
    d(r.weak[0][0], r.weak[0][1], 'same', ORCID_CURATOR, '2026-10-15', 'low score: heavily retouched print'),
    d(r.weak[1][0], r.weak[1][1], 'same', MARWITZ, '2026-10-16', 'raking-light photograph, same panel'),
    d(r.missed[0][0], r.missed[0][1], 'same', FONTAN, '2026-10-20', 'matched by hand; no photograph pair was compared'),
    ...r.details
      .slice(0, 3)
      .map((x, i) => d(x.detail, x.wholes[0], 'part', MARWITZ, `2026-10-2${2 + i}`, 'detail photograph of the panel')),
    ...rep
      .slice(0, 3)
      .map((x, i) =>
        d(
          x.original,
          x.replica,
          'distinct',
          ORCID_CURATOR,
          `2026-10-2${6 + i}`,
          'workshop replica, a different panel; see conservation file',
        ),
      ),
    d(rep[3].original, rep[3].replica, 'related', FONTAN, '2026-10-30', 'replica after the same model'),
    d(
      rep[4].original,
      rep[4].replica,
      'distinct',
      ORCID_CURATOR,
      '2026-11-02',
      'replaces the decision of 14 October: replica, different size',
    ),
    d(
      r.pairs[11][0],
      r.pairs[11][1],
      'same',
      ORCID_CURATOR,
      '2026-11-20T15:42:00Z',
      'confirmed in the November review',
    ),
  ];
}

/** Release-2 decisions (a second file; the release-1 file is read first, so these rows come later). */
export function decisions2(r: Release2): Decision[] {
  const { r1 } = r;
  return [
    d(
      r1.falseBridge.link[0],
      r1.falseBridge.link[1],
      'distinct',
      WREN,
      '2027-04-20',
      'the Fontclaire panel is the workshop version',
    ),
    d(r1.trueBridge.link[0], r1.trueBridge.link[1], 'same', WREN, '2027-04-20', 'same panel before and after cleaning'),
    ...[12, 13].map((i) => d(r1.pairs[i][0], r1.pairs[i][1], 'same', MARWITZ, '2027-04-22')),
    d(
      r1.replicas[3].original,
      r1.replicas[3].replica,
      'distinct',
      FONTAN,
      '2027-04-23',
      're-examined: not after the same model',
    ),
    d(r.details[0].detail, r.details[0].whole, 'part', WREN, '2027-04-27', 'detail, Brindle survey photograph'),
    d(r.replicas[0].original, r.replicas[0].replica, 'distinct', WREN, '2027-04-27', 'later copy'),
    d(r.replicas[1].original, r.replicas[1].replica, 'related', WREN, '2027-04-28', 'copy after the same cartoon'),
    d(r.extended[0].brindle, r.extended[0].linked[0], 'same', ORCID_CURATOR, '2027-05-03'),
    d(
      r.extended[6].brindle,
      r.extended[6].linked[0],
      'same',
      ORCID_CURATOR,
      '2027-05-03',
      'dates disagree; Brindle dating to be checked',
    ),
    d(r.missed[0][0], r.missed[0][1], 'same', WREN, '2027-05-10', 'matched by hand'),
    // the two details matched below minOverlap, never proposed: listed as `small-overlap` in the release-1 queue
    ...r1.details
      .slice(3, 5)
      .map((x, i) =>
        d(x.detail, x.wholes[0], 'part', MARWITZ, `2027-05-1${2 + i}`, 'from the review queue: detail of the panel'),
      ),
  ];
}

/** A decisions file: `work_a,work_b,verdict,curator,date,note`. */
export function decisionsText(rows: readonly Decision[]): string {
  return delimited(
    ['work_a', 'work_b', 'verdict', 'curator', 'date', 'note'],
    rows.map((x) => [ref(x.a), ref(x.b), x.verdict, x.curator, x.date, x.note]),
    PLAIN_CSV,
  );
}

/** Release-1 gold pairs: mostly true pairs, several the matcher never reported, and one honest mistake (a replica). */
export function gold1(r: Release1): [Rec, Rec][] {
  return [
    ...r.missed,
    ...r.weak,
    ...r.chains.slice(0, 5).map((c) => c.ends),
    ...r.chains.slice(5).map((c): [Rec, Rec] => [c.ends[0], c.mid]),
    [r.chains[5].mid, r.chains[5].ends[1]],
    ...r.triangles.slice(0, 5).flatMap((t): [Rec, Rec][] => [
      [t[0], t[1]],
      [t[1], t[2]],
    ]),
    ...r.pairs.slice(0, 14),
    [r.duplicates[0].first, r.duplicates[0].second],
    ...r.splitArtworks.map((m): [Rec, Rec] => [m.sides[0][0], m.sides[1][0]]),
    r.trueBridge.link,
    [r.replicas[5].original, r.replicas[5].replica],
  ];
}

/** Release-2 gold: the release-1 pairs plus the person's Brindle pairs. */
export function gold2(r: Release2): [Rec, Rec][] {
  return [
    ...gold1(r.r1),
    ...r.extended.slice(0, 4).map((e): [Rec, Rec] => [e.brindle, e.linked[0]]),
    ...r.extended.slice(6, 8).map((e): [Rec, Rec] => [e.brindle, e.linked[0]]),
    [r.mergeViaBrindle.brindle, r.mergeViaBrindle.joins[0]],
    ...r.missed,
  ];
}

/** A gold file `work_a,work_b`, in the person's own (shuffled) order and orientation. */
export function goldText(pairs: readonly [Rec, Rec][], rng: Rng): string {
  const rows = rng.shuffle(pairs).map(([a, b]) => (rng.chance(0.5) ? [ref(a), ref(b)] : [ref(b), ref(a)]));
  return delimited(['work_a', 'work_b'], rows, PLAIN_CSV);
}
