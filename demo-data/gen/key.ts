// The told stories → answer keys (answer-key.json): every deliberate difficulty by name, with counts.
import type { Decision } from './curation.js';
import type { Match } from './evidence.js';
import { ref, type PairSpec, type Rec } from './model.js';
import type { Release1 } from './release1.js';
import type { Release2 } from './release2.js';

const refs = (rs: readonly Rec[]): string[] => rs.map(ref);
const pairKey = (a: Rec, b: Rec): string => [ref(a), ref(b)].sort().join('|');

/**
 * Every pair of records that show the same artwork, with the kind of evidence the run has for it ('none' if absent).
 */
function truePairs(recs: readonly Rec[], pairs: readonly PairSpec[]): [string, string, string][] {
  const kinds = new Map(pairs.map((p) => [pairKey(p.a, p.b), p.kind as string]));
  const out: [string, string, string][] = [];
  for (let i = 0; i < recs.length; i++) {
    for (let j = i + 1; j < recs.length; j++) {
      if (recs[i].art === recs[j].art)
        out.push([ref(recs[i]), ref(recs[j]), kinds.get(pairKey(recs[i], recs[j])) ?? 'none']);
    }
  }
  return out;
}

const countKind = (pairs: readonly PairSpec[], ...kinds: string[]) =>
  pairs.filter((p) => kinds.includes(p.kind)).length;

/** Files and rows, common to both keys. */
function sizes(recs: readonly Rec[], matches: readonly Match[], noise: number, decisions: number, gold: number) {
  return {
    works: recs.length,
    images: recs.reduce((s, r) => s + r.images.length, 0),
    artworks: new Set(recs.map((r) => r.art)).size,
    evidenceRows: matches.length + noise,
    noiseRows: noise,
    decisionRows: decisions,
    goldPairs: gold,
  };
}

/** Release-1 key: counts first, then each difficulty listed by `partnerKey:workId`. */
export function key1(r: Release1, matches: Match[], noise: number, decisions: Decision[], gold: [Rec, Rec][]) {
  const { recs, pairs } = r.b;
  const tp = truePairs(recs, pairs);
  const linked = new Set(pairs.map((p) => pairKey(p.a, p.b)));
  return {
    note: 'Answer key of the invented release-1 scenario; generated with the data by demo-data/generate.ts.',
    counts: {
      partners: 3,
      ...sizes(recs, matches, noise, decisions.length, gold.length),
      truePairs: tp.length,
      truePairsWithStrongEvidence: tp.filter((t) => t[2] === 'same' || t[2] === 'duplicate').length,
      truePairsWithoutEvidence: tp.filter((t) => t[2] === 'none').length,
      sameLinks: countKind(pairs, 'same'),
      triangles: r.triangles.length,
      chains: r.chains.length,
      weakTruePairs: r.weak.length,
      missedTruePairs: r.missed.length,
      details: r.details.length,
      partLinks: countKind(pairs, 'part', 'small-part'),
      partLinksBelowMinOverlap: countKind(pairs, 'small-part'),
      replicas: r.replicas.length,
      replicasThatFadeInRelease2: r.replicas.filter((x) => x.fading).length,
      duplicatesLinked: countKind(pairs, 'duplicate'),
      duplicatesUnlinked: tp.filter((t) => t[2] === 'none' && t[0].split(':')[0] === t[1].split(':')[0]).length,
      bridges: 2,
      splitArtworks: r.splitArtworks.length,
      hardDateConflicts: r.conflicts.length,
      conventionOnlyDates: r.conventionOnly.length,
      rowDateDisagreements: 1,
      blankDates: recs.filter((x) => x.date === '').length,
      smallImages: r.smallImages.length,
      decidedTwice: 1,
      goldWithoutDirectEvidence: gold.filter(([a, b]) => !linked.has(pairKey(a, b))).length,
      goldMistakes: 1,
    },
    truePairs: tp,
    chains: r.chains.map((c) => ({ a: ref(c.ends[0]), via: ref(c.mid), c: ref(c.ends[1]) })),
    weak: r.weak.map(refs),
    missed: r.missed.map(refs),
    details: r.details.map((x) => ({ part: ref(x.detail), whole: refs(x.wholes), matchedWith: refs(x.linked) })),
    replicas: r.replicas.map((x) => ({
      original: ref(x.original),
      replica: ref(x.replica),
      fadesInRelease2: x.fading,
    })),
    duplicates: r.duplicates.map((x) => [ref(x.first), ref(x.second)]),
    bridges: [
      { link: refs(r.trueBridge.link), correct: true, sides: r.trueBridge.sides.map(refs) },
      { link: refs(r.falseBridge.link), correct: false, sides: r.falseBridge.sides.map(refs) },
    ],
    splitArtworks: r.splitArtworks.map((m) => m.sides.map(refs)),
    dateConflicts: r.conflicts.map((c) => ({
      a: ref(c.a),
      b: ref(c.b),
      dates: [c.a.date, c.b.date],
      onlyInCluster: c.implied,
    })),
    conventionOnly: r.conventionOnly.map(([a, b]) => ({ a: ref(a), b: ref(b), dates: [a.date, b.date] })),
    rowDateDisagreement: { work: ref(r.rowDates), dates: r.rowDates.rowDates },
    smallImages: r.smallImages,
    goldMistake: [ref(r.replicas[5].original), ref(r.replicas[5].replica)],
  };
}

/** Release-2 key: Brindle's difficulties and the changes against release 1. */
export function key2(r: Release2, matches: Match[], noise: number, decisions: Decision[], gold: [Rec, Rec][]) {
  const recs = [...r.r1.b.recs, ...r.b.recs];
  const pairs = [...r.r1.b.pairs, ...r.b.pairs];
  const tp = truePairs(recs, pairs);
  const { r1 } = r;
  return {
    note: 'Answer key of the invented release-2 scenario; generated with the data by demo-data/generate.ts.',
    counts: {
      partners: 4,
      ...sizes(recs, matches, noise, decisions.length, gold.length),
      newWorks: r.b.recs.length,
      truePairs: tp.length,
      truePairsWithoutEvidence: tp.filter((t) => t[2] === 'none').length,
      newSameLinks: countKind(r.b.pairs, 'same'),
      brindlePartLinks: countKind(r.b.pairs, 'part'),
      brindleDetails: r.details.length,
      brindleReplicas: r.replicas.length,
      brindleDuplicates: r.duplicates.length,
      brindleMissed: r.missed.length,
      hardDateConflicts: 1 + r1.conflicts.length,
      undatedRecords: 1,
      merges: 2,
      splits: 1,
      confirmedFromProposed: 3,
      disappearedLinks: 2,
      overriddenDecisions: 1,
    },
    truePairs: tp,
    merges: [
      {
        how: 'new partner links both clusters',
        via: ref(r.mergeViaBrindle.brindle),
        joins: r1.splitArtworks[0].sides.map(refs),
      },
      {
        how: 'rerun finds a link between the clusters',
        link: [ref(r.mergeByRerun.a), ref(r.mergeByRerun.b)],
        joins: r1.splitArtworks[1].sides.map(refs),
      },
    ],
    splits: [{ link: refs(r1.falseBridge.link), by: 'curator distinct', sides: r1.falseBridge.sides.map(refs) }],
    confirmedFromProposed: [r1.trueBridge.link, r1.pairs[12], r1.pairs[13]].map(refs),
    disappeared: r1.replicas.filter((x) => x.fading).map((x) => [ref(x.original), ref(x.replica)]),
    overriddenDecision: {
      pair: [ref(r1.replicas[3].original), ref(r1.replicas[3].replica)],
      from: 'related',
      to: 'distinct',
    },
    brindle: {
      extends: r.extended.map((e) => ({ brindle: ref(e.brindle), matchedWith: refs(e.linked) })),
      newPairs: r.newPairs.map(refs),
      details: r.details.map((x) => ({ part: ref(x.detail), whole: ref(x.whole) })),
      replicas: r.replicas.map((x) => ({ original: ref(x.original), replica: ref(x.replica) })),
      duplicates: r.duplicates.map(refs),
      missed: r.missed.map(refs),
      dateConflict: { a: ref(r.conflict.a), b: ref(r.conflict.b), dates: [r.conflict.a.date, r.conflict.b.date] },
      undated: ref(r.singletons[3]),
    },
  };
}
