// changes.md wording: every transition between claim states reads right and names who made it; a distinct verdict
// is a status change only (never "related → same"); changes.ttl names the curator of each decided change.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import type { ClaimChange, ClaimStateOf, LinkState, MadeBy, ReleaseSnapshot } from '../src/history/types.js';
import { claimLine } from '../src/history/markdown.js';
import { compareSnapshots } from '../src/history/compare.js';

type State =
  | 'none'
  | 'same/proposed'
  | 'same/confirmed'
  | 'part/proposed'
  | 'part/confirmed'
  | 'related/proposed'
  | 'related/confirmed'
  | 'distinct';

const STATES: Record<State, [ClaimStateOf['kind'], ClaimStateOf['status']] | undefined> = {
  none: undefined,
  'same/proposed': ['same', 'proposed'],
  'same/confirmed': ['same', 'confirmed'],
  'part/proposed': ['part', 'proposed'],
  'part/confirmed': ['part', 'confirmed'],
  'related/proposed': ['related', 'proposed'],
  'related/confirmed': ['related', 'confirmed'],
  // a distinct verdict leaves the kind the evidence gave (here same): the wording must not depend on it
  distinct: ['same', 'rejected'],
};

const CURATOR = {
  kind: 'curator',
  review: 'https://c.example.org/review/1',
  curator: 'https://orcid.org/0000-0002-1825-0097',
  name: 'Jo Invented',
  date: '2027-01-05',
} as const;
/**
 * Who made the new state: a curator for confirmed and rejected states (with the verdict written), runs for proposed,
 * the release for a claim gone.
 */
function by(after: State): MadeBy {
  const s = STATES[after];
  if (!s) return { kind: 'release', version: '2' };
  if (s[1] === 'proposed')
    return {
      kind: 'runs',
      runs: [{ iri: 'https://c.example.org/run/run-2', id: 'run-2', software: 'm', version: '2.0' }],
    };
  return { ...CURATOR, verdict: s[1] === 'rejected' ? 'distinct' : s[0] };
}

/** The worked table: every ordered pair of distinct states (none = no claim), and the line changes.md prints for it. */
const TABLE: [State, State, string][] = [
  ['none', 'same/proposed', '`a:1` – `b:1`: no claim → probably the same work (proposed); by run run-2 (m 2.0)'],
  [
    'none',
    'same/confirmed',
    '`a:1` – `b:1`: no claim → same work (confirmed); decided by Jo Invented on 2027-01-05 (verdict same)',
  ],
  [
    'none',
    'part/proposed',
    '`a:1` – `b:1`: no claim → `a:1` is probably part of `b:1` (proposed); by run run-2 (m 2.0)',
  ],
  [
    'none',
    'part/confirmed',
    '`a:1` – `b:1`: no claim → `a:1` is part of `b:1` (confirmed); decided by Jo Invented on 2027-01-05 (verdict part)',
  ],
  ['none', 'related/proposed', '`a:1` – `b:1`: no claim → probably related works (proposed); by run run-2 (m 2.0)'],
  [
    'none',
    'related/confirmed',
    '`a:1` – `b:1`: no claim → related works (confirmed); decided by Jo Invented on 2027-01-05 (verdict related)',
  ],
  [
    'none',
    'distinct',
    '`a:1` – `b:1`: no claim → distinct works (rejected); decided by Jo Invented on 2027-01-05 (verdict distinct)',
  ],
  [
    'same/proposed',
    'none',
    '`a:1` – `b:1`: probably the same work (proposed) → no claim; dropped by release 2: no evidence or decision in it supports the link',
  ],
  [
    'same/proposed',
    'same/confirmed',
    '`a:1` – `b:1`: probably the same work (proposed) → same work (confirmed); decided by Jo Invented on 2027-01-05 (verdict same)',
  ],
  [
    'same/proposed',
    'part/proposed',
    '`a:1` – `b:1`: probably the same work (proposed) → `a:1` is probably part of `b:1` (proposed); by run run-2 (m 2.0)',
  ],
  [
    'same/proposed',
    'part/confirmed',
    '`a:1` – `b:1`: probably the same work (proposed) → `a:1` is part of `b:1` (confirmed); decided by Jo Invented on 2027-01-05 (verdict part)',
  ],
  [
    'same/proposed',
    'related/proposed',
    '`a:1` – `b:1`: probably the same work (proposed) → probably related works (proposed); by run run-2 (m 2.0)',
  ],
  [
    'same/proposed',
    'related/confirmed',
    '`a:1` – `b:1`: probably the same work (proposed) → related works (confirmed); decided by Jo Invented on 2027-01-05 (verdict related)',
  ],
  [
    'same/proposed',
    'distinct',
    '`a:1` – `b:1`: probably the same work (proposed) → distinct works (rejected); decided by Jo Invented on 2027-01-05 (verdict distinct)',
  ],
  [
    'same/confirmed',
    'none',
    '`a:1` – `b:1`: same work (confirmed) → no claim; dropped by release 2: no evidence or decision in it supports the link',
  ],
  [
    'same/confirmed',
    'same/proposed',
    '`a:1` – `b:1`: same work (confirmed) → probably the same work (proposed); by run run-2 (m 2.0)',
  ],
  [
    'same/confirmed',
    'part/proposed',
    '`a:1` – `b:1`: same work (confirmed) → `a:1` is probably part of `b:1` (proposed); by run run-2 (m 2.0)',
  ],
  [
    'same/confirmed',
    'part/confirmed',
    '`a:1` – `b:1`: same work (confirmed) → `a:1` is part of `b:1` (confirmed); decided by Jo Invented on 2027-01-05 (verdict part)',
  ],
  [
    'same/confirmed',
    'related/proposed',
    '`a:1` – `b:1`: same work (confirmed) → probably related works (proposed); by run run-2 (m 2.0)',
  ],
  [
    'same/confirmed',
    'related/confirmed',
    '`a:1` – `b:1`: same work (confirmed) → related works (confirmed); decided by Jo Invented on 2027-01-05 (verdict related)',
  ],
  [
    'same/confirmed',
    'distinct',
    '`a:1` – `b:1`: same work (confirmed) → distinct works (rejected); decided by Jo Invented on 2027-01-05 (verdict distinct)',
  ],
  [
    'part/proposed',
    'none',
    '`a:1` – `b:1`: `a:1` is probably part of `b:1` (proposed) → no claim; dropped by release 2: no evidence or decision in it supports the link',
  ],
  [
    'part/proposed',
    'same/proposed',
    '`a:1` – `b:1`: `a:1` is probably part of `b:1` (proposed) → probably the same work (proposed); by run run-2 (m 2.0)',
  ],
  [
    'part/proposed',
    'same/confirmed',
    '`a:1` – `b:1`: `a:1` is probably part of `b:1` (proposed) → same work (confirmed); decided by Jo Invented on 2027-01-05 (verdict same)',
  ],
  [
    'part/proposed',
    'part/confirmed',
    '`a:1` – `b:1`: `a:1` is probably part of `b:1` (proposed) → `a:1` is part of `b:1` (confirmed); decided by Jo Invented on 2027-01-05 (verdict part)',
  ],
  [
    'part/proposed',
    'related/proposed',
    '`a:1` – `b:1`: `a:1` is probably part of `b:1` (proposed) → probably related works (proposed); by run run-2 (m 2.0)',
  ],
  [
    'part/proposed',
    'related/confirmed',
    '`a:1` – `b:1`: `a:1` is probably part of `b:1` (proposed) → related works (confirmed); decided by Jo Invented on 2027-01-05 (verdict related)',
  ],
  [
    'part/proposed',
    'distinct',
    '`a:1` – `b:1`: `a:1` is probably part of `b:1` (proposed) → distinct works (rejected); decided by Jo Invented on 2027-01-05 (verdict distinct)',
  ],
  [
    'part/confirmed',
    'none',
    '`a:1` – `b:1`: `a:1` is part of `b:1` (confirmed) → no claim; dropped by release 2: no evidence or decision in it supports the link',
  ],
  [
    'part/confirmed',
    'same/proposed',
    '`a:1` – `b:1`: `a:1` is part of `b:1` (confirmed) → probably the same work (proposed); by run run-2 (m 2.0)',
  ],
  [
    'part/confirmed',
    'same/confirmed',
    '`a:1` – `b:1`: `a:1` is part of `b:1` (confirmed) → same work (confirmed); decided by Jo Invented on 2027-01-05 (verdict same)',
  ],
  [
    'part/confirmed',
    'part/proposed',
    '`a:1` – `b:1`: `a:1` is part of `b:1` (confirmed) → `a:1` is probably part of `b:1` (proposed); by run run-2 (m 2.0)',
  ],
  [
    'part/confirmed',
    'related/proposed',
    '`a:1` – `b:1`: `a:1` is part of `b:1` (confirmed) → probably related works (proposed); by run run-2 (m 2.0)',
  ],
  [
    'part/confirmed',
    'related/confirmed',
    '`a:1` – `b:1`: `a:1` is part of `b:1` (confirmed) → related works (confirmed); decided by Jo Invented on 2027-01-05 (verdict related)',
  ],
  [
    'part/confirmed',
    'distinct',
    '`a:1` – `b:1`: `a:1` is part of `b:1` (confirmed) → distinct works (rejected); decided by Jo Invented on 2027-01-05 (verdict distinct)',
  ],
  [
    'related/proposed',
    'none',
    '`a:1` – `b:1`: probably related works (proposed) → no claim; dropped by release 2: no evidence or decision in it supports the link',
  ],
  [
    'related/proposed',
    'same/proposed',
    '`a:1` – `b:1`: probably related works (proposed) → probably the same work (proposed); by run run-2 (m 2.0)',
  ],
  [
    'related/proposed',
    'same/confirmed',
    '`a:1` – `b:1`: probably related works (proposed) → same work (confirmed); decided by Jo Invented on 2027-01-05 (verdict same)',
  ],
  [
    'related/proposed',
    'part/proposed',
    '`a:1` – `b:1`: probably related works (proposed) → `a:1` is probably part of `b:1` (proposed); by run run-2 (m 2.0)',
  ],
  [
    'related/proposed',
    'part/confirmed',
    '`a:1` – `b:1`: probably related works (proposed) → `a:1` is part of `b:1` (confirmed); decided by Jo Invented on 2027-01-05 (verdict part)',
  ],
  [
    'related/proposed',
    'related/confirmed',
    '`a:1` – `b:1`: probably related works (proposed) → related works (confirmed); decided by Jo Invented on 2027-01-05 (verdict related)',
  ],
  [
    'related/proposed',
    'distinct',
    '`a:1` – `b:1`: probably related works (proposed) → distinct works (rejected); decided by Jo Invented on 2027-01-05 (verdict distinct)',
  ],
  [
    'related/confirmed',
    'none',
    '`a:1` – `b:1`: related works (confirmed) → no claim; dropped by release 2: no evidence or decision in it supports the link',
  ],
  [
    'related/confirmed',
    'same/proposed',
    '`a:1` – `b:1`: related works (confirmed) → probably the same work (proposed); by run run-2 (m 2.0)',
  ],
  [
    'related/confirmed',
    'same/confirmed',
    '`a:1` – `b:1`: related works (confirmed) → same work (confirmed); decided by Jo Invented on 2027-01-05 (verdict same)',
  ],
  [
    'related/confirmed',
    'part/proposed',
    '`a:1` – `b:1`: related works (confirmed) → `a:1` is probably part of `b:1` (proposed); by run run-2 (m 2.0)',
  ],
  [
    'related/confirmed',
    'part/confirmed',
    '`a:1` – `b:1`: related works (confirmed) → `a:1` is part of `b:1` (confirmed); decided by Jo Invented on 2027-01-05 (verdict part)',
  ],
  [
    'related/confirmed',
    'related/proposed',
    '`a:1` – `b:1`: related works (confirmed) → probably related works (proposed); by run run-2 (m 2.0)',
  ],
  [
    'related/confirmed',
    'distinct',
    '`a:1` – `b:1`: related works (confirmed) → distinct works (rejected); decided by Jo Invented on 2027-01-05 (verdict distinct)',
  ],
  [
    'distinct',
    'none',
    '`a:1` – `b:1`: distinct works (rejected) → no claim; dropped by release 2: no evidence or decision in it supports the link',
  ],
  [
    'distinct',
    'same/proposed',
    '`a:1` – `b:1`: distinct works (rejected) → probably the same work (proposed); by run run-2 (m 2.0)',
  ],
  [
    'distinct',
    'same/confirmed',
    '`a:1` – `b:1`: distinct works (rejected) → same work (confirmed); decided by Jo Invented on 2027-01-05 (verdict same)',
  ],
  [
    'distinct',
    'part/proposed',
    '`a:1` – `b:1`: distinct works (rejected) → `a:1` is probably part of `b:1` (proposed); by run run-2 (m 2.0)',
  ],
  [
    'distinct',
    'part/confirmed',
    '`a:1` – `b:1`: distinct works (rejected) → `a:1` is part of `b:1` (confirmed); decided by Jo Invented on 2027-01-05 (verdict part)',
  ],
  [
    'distinct',
    'related/proposed',
    '`a:1` – `b:1`: distinct works (rejected) → probably related works (proposed); by run run-2 (m 2.0)',
  ],
  [
    'distinct',
    'related/confirmed',
    '`a:1` – `b:1`: distinct works (rejected) → related works (confirmed); decided by Jo Invented on 2027-01-05 (verdict related)',
  ],
];

test('the worked table covers every transition between the eight claim states', () => {
  const names = Object.keys(STATES) as State[];
  assert.equal(TABLE.length, names.length * (names.length - 1));
  for (const b of names)
    for (const a of names)
      if (a !== b)
        assert.ok(
          TABLE.some(([x, y]) => x === b && y === a),
          `${b} → ${a}`,
        );
});

for (const [before, after, line] of TABLE) {
  test(`changes.md line: ${before} → ${after}`, () => {
    const st = (s: State) => STATES[s] && { kind: STATES[s]![0], status: STATES[s]![1], subject: 'a:1' };
    const c: ClaimChange = {
      link: 'L',
      subject: 'a:1',
      object: 'b:1',
      partners: ['a', 'b'],
      ...(st(before) ? { before: st(before) } : {}),
      ...(st(after) ? { after: st(after) } : {}),
      by: by(after),
    };
    assert.equal(claimLine(c), line);
  });
}

const WORKS = new Map([
  ['https://a.example.org/1', { partner: 'a', ref: 'a:1' }],
  ['https://b.example.org/1', { partner: 'b', ref: 'b:1' }],
]);
function snapshot(
  version: string,
  link: Partial<LinkState>,
  activities: ReleaseSnapshot['activities'] = new Map(),
): ReleaseSnapshot {
  const l: LinkState = {
    iri: 'https://c.example.org/link/1',
    subject: 'https://a.example.org/1',
    object: 'https://b.example.org/1',
    kind: 'same',
    status: 'proposed',
    support: 1,
    generatedBy: [],
    attributedTo: [],
    ...link,
  };
  return {
    version,
    dataset: `https://c.example.org/dataset/${version}`,
    links: new Map([[l.iri, l]]),
    works: WORKS,
    activities,
    clusters: { active: new Map(), retired: [] },
  };
}

test('a distinct verdict on a former related link is a status change only, made by the curator', () => {
  const before = snapshot('1', { kind: 'related', status: 'confirmed' });
  const review = 'https://c.example.org/review/2';
  const after = snapshot(
    '2',
    { kind: 'same', status: 'rejected', generatedBy: [review] },
    new Map([
      [
        review,
        {
          kind: 'review',
          curator: CURATOR.curator,
          curatorName: 'Jo Invented',
          date: '2027-01-05',
          verdict: 'distinct',
        },
      ],
    ]),
  );
  const c = compareSnapshots(before, after);
  assert.equal(c.claims.kind.length, 0, 'no kind change into a rejected state');
  assert.equal(c.claims.status.length, 1);
  assert.deepEqual(c.claims.status[0].by, { ...CURATOR, review, verdict: 'distinct' });
  assert.equal(
    claimLine(c.claims.status[0]),
    '`a:1` – `b:1`: related works (confirmed) → distinct works (rejected); decided by Jo Invented on 2027-01-05 (verdict distinct)',
  );
});

test('a change made by a run names the run, its software and version', () => {
  const run = 'https://c.example.org/run/run%202';
  const c = compareSnapshots(
    snapshot('1', { status: 'proposed' }),
    snapshot(
      '2',
      { kind: 'part', status: 'proposed', generatedBy: [run] },
      new Map([[run, { kind: 'run', id: 'run 2', software: 'm', version: '2.0' }]]),
    ),
  );
  assert.deepEqual(c.claims.kind[0].by, {
    kind: 'runs',
    runs: [{ iri: run, id: 'run 2', software: 'm', version: '2.0' }],
  });
});
