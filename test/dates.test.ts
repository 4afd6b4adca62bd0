// Worked examples: catalogued date text → year intervals per century convention, and pairwise date agreement.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { type CenturyConvention, type DateForm, LATEST_YEAR, compareDates, parseDate } from '../src/dates/index.js';

type Row = [
  text: string,
  convention: CenturyConvention,
  start: number,
  end: number,
  form: DateForm,
  approximate?: boolean,
];

function shouldRead([text, convention, start, end, form, approximate = false]: Row): void {
  const r = parseDate(text, convention);
  assert.equal(r.kind, 'interval', `${text}: ${JSON.stringify(r)}`);
  if (r.kind !== 'interval') return;
  assert.deepEqual([r.start, r.end, r.form, r.approximate], [start, end, form, approximate], `${text} (${convention})`);
}

function shouldReject(text: string, reason: RegExp): void {
  const r = parseDate(text, 'unknown');
  assert.equal(r.kind, 'impossible', `${text}: ${JSON.stringify(r)}`);
  if (r.kind === 'impossible') {
    assert.match(r.reason, reason, text);
    assert.ok(r.hint.length > 0, `${text}: hint`);
  }
}

const U = 'unknown',
  O = 'ordinal',
  I = 'iso';

// Widths used below (chosen in src/dates/calendar.ts, common practice, no source): ca. a year ±10,
// a decade ±10, a century ±25; before/after 50 years; early/mid/late = thirds (0–32, 33–66, 67–99), halves, quarters.
const FREE_TEXT: Row[] = [
  ['1475', U, 1475, 1475, 'year'],
  ['  1475 ', U, 1475, 1475, 'year'],
  ['800', U, 800, 800, 'year'],
  ['64 BC', U, -63, -63, 'year'],
  ['1 BC', U, 0, 0, 'year'],
  ['AD 800', U, 800, 800, 'year'],
  ['ca. 1480', U, 1470, 1490, 'circa', true],
  ['c. 1480', U, 1470, 1490, 'circa', true],
  ['circa 1480', U, 1470, 1490, 'circa', true],
  ['about 1480', U, 1470, 1490, 'circa', true],
  ['Ca.1480', U, 1470, 1490, 'circa', true],
  ['1480 approx.', U, 1470, 1490, 'circa', true],
  ['1470-1490', U, 1470, 1490, 'range'],
  ['1470–1490', U, 1470, 1490, 'range'],
  ['1470 - 90', U, 1470, 1490, 'range'],
  ['1470-5', U, 1470, 1475, 'range'],
  ['1520-22', U, 1520, 1522, 'range'],
  ['1470 to 1490', U, 1470, 1490, 'range'],
  ['between 1470 and 1490', U, 1470, 1490, 'range'],
  ['1470/90', U, 1470, 1490, 'range'],
  ['ca. 1470-1490', U, 1460, 1500, 'range', true],
  ['1470-ca. 1490', U, 1470, 1500, 'range', true],
  ['1470s-1480s', U, 1470, 1489, 'range'],
  ['1470s', U, 1470, 1479, 'decade'],
  ["1470's", U, 1470, 1479, 'decade'],
  ['ca. 1470s', U, 1460, 1489, 'decade', true],
  ['the 1400s', U, 1400, 1499, 'century'],
  ['before 1500', U, 1450, 1500, 'before', true],
  ['after 1480', U, 1480, 1530, 'after', true],
  ['not before 1480', U, 1480, 1530, 'after', true],
];

// Century labels under the three conventions: ordinal 15th = 1401–1500, ISO 8601-2 = 1400–1499, unknown = union.
const CENTURIES: Row[] = [
  ['15th century', O, 1401, 1500, 'century'],
  ['15th century', I, 1400, 1499, 'century'],
  ['15th century', U, 1400, 1500, 'century'],
  ['15th c.', O, 1401, 1500, 'century'],
  ['15th c.', I, 1400, 1499, 'century'],
  ['15th c.', U, 1400, 1500, 'century'],
  ['15c.', U, 1400, 1500, 'century'],
  ['1st century', O, 1, 100, 'century'],
  ['1st century', I, 0, 99, 'century'],
  ['2nd century BC', U, -199, -100, 'century'],
  ['2nd century BC', O, -199, -100, 'century'],
  ['late 15th century', O, 1468, 1500, 'part-of-century'],
  ['late 15th century', I, 1467, 1499, 'part-of-century'],
  ['late 15th century', U, 1467, 1500, 'part-of-century'],
  ['early 16th c.', O, 1501, 1533, 'part-of-century'],
  ['early 16th c.', I, 1500, 1532, 'part-of-century'],
  ['early 16th c.', U, 1500, 1533, 'part-of-century'],
  ['mid-15th century', O, 1434, 1467, 'part-of-century'],
  ['mid-15th century', I, 1433, 1466, 'part-of-century'],
  ['mid 15th century', U, 1433, 1467, 'part-of-century'],
  ['first half of the 15th century', O, 1401, 1450, 'part-of-century'],
  ['first half of the 15th century', I, 1400, 1449, 'part-of-century'],
  ['second half of the 15th century', U, 1450, 1500, 'part-of-century'],
  ['last quarter of the 15th century', O, 1476, 1500, 'part-of-century'],
  ['15th-16th century', O, 1401, 1600, 'century-range'],
  ['15th-16th century', I, 1400, 1599, 'century-range'],
  ['15th-16th century', U, 1400, 1600, 'century-range'],
  ['late 15th-early 16th century', O, 1468, 1533, 'part-of-century'],
  ['ca. 15th century', O, 1376, 1525, 'century', true],
  ['15th century?', I, 1400, 1499, 'century'],
];

// EDTF (LoC EDTF Specification 2019-02-04) and ISO 8601-2 centuries; conventions do not change EDTF readings.
const EDTF: Row[] = [
  ['1475-03-02', U, 1475, 1475, 'edtf'],
  ['1476-02-29', U, 1476, 1476, 'edtf'],
  ['1475-03', O, 1475, 1475, 'edtf'],
  ['1470/1490', U, 1470, 1490, 'edtf'],
  ['1470/..', U, 1470, Infinity, 'edtf'],
  ['../1490', U, -Infinity, 1490, 'edtf'],
  ['1470/', U, 1470, Infinity, 'edtf'],
  ['147X', U, 1470, 1479, 'edtf'],
  ['14XX', O, 1400, 1499, 'edtf'],
  ['1475?', U, 1475, 1475, 'edtf'],
  ['1475~', U, 1465, 1485, 'edtf', true],
  ['1475%', U, 1465, 1485, 'edtf', true],
  ['1475-06~', U, 1474, 1476, 'edtf', true],
  ['147X~', U, 1460, 1489, 'edtf', true],
  ['14XX~', U, 1375, 1524, 'edtf', true],
  ['1475-21', U, 1475, 1475, 'edtf'],
  ['1475-24', U, 1475, 1475, 'edtf'],
  ['-0044', U, -44, -44, 'edtf'],
  ['14', O, 1400, 1499, 'century'],
  ['14', U, 1400, 1499, 'century'],
  ['14~', U, 1375, 1524, 'century', true],
  ['1950S2', U, 1900, 1999, 'edtf', true],
  ['[1667,1668,1670..1672]', U, 1667, 1672, 'edtf'],
  ['{1960,1961-12}', U, 1960, 1961, 'edtf'],
  ['[..1984]', U, -Infinity, 1984, 'edtf'],
  ['?1475-06-~11', U, 1474, 1476, 'edtf', true],
  ['1XXX-12', U, 1000, 1999, 'edtf'],
  ['Y-17E7', U, -170000000, -170000000, 'edtf'],
];

test('free-text forms read as year intervals', () => FREE_TEXT.forEach(shouldRead));
test('century labels follow the century convention', () => CENTURIES.forEach(shouldRead));
test('EDTF forms read as year intervals', () => EDTF.forEach(shouldRead));

test('century labels carry the ordinal and both strict readings', () => {
  const r = parseDate('late 15th-early 16th century', 'unknown');
  assert.equal(r.kind, 'interval');
  if (r.kind !== 'interval') return;
  assert.deepEqual(r.century, { ordinal: 15, last: 16 });
  assert.deepEqual(r.byConvention, { ordinal: { start: 1468, end: 1533 }, iso: { start: 1467, end: 1532 } });
  const e = parseDate('14XX', 'unknown');
  assert.ok(
    e.kind === 'interval' && e.century?.ordinal === 15 && e.byConvention === undefined,
    'EDTF centuries are not ambiguous',
  );
  const u = parseDate('1475?', 'unknown');
  assert.ok(u.kind === 'interval' && u.uncertain && !u.approximate, '? marks uncertain without widening');
});

test('blank text is empty', () => {
  for (const t of ['', '   ', '\t']) assert.deepEqual(parseDate(t, 'unknown'), { kind: 'empty' });
});

test('impossible dates are invalid with a reason and a hint', () => {
  shouldReject('1475-13', /impossible month 13/);
  shouldReject('1475-06-31', /impossible day 31/);
  shouldReject('1475-02-29', /impossible day 29 February/);
  shouldReject('1900-02-29', /impossible day 29 February/); // not a leap year: divisible by 100, not by 400
  shouldReject('1490-1470', /ends before it starts/);
  shouldReject('1490/1470', /ends before it starts/);
  shouldReject('16th-15th century', /ends before it starts/);
  shouldReject(String(LATEST_YEAR + 1), /future/);
  shouldReject('2475', /future/);
  shouldReject('ca. 2475', /future/);
  shouldReject('1470-2475', /future/);
  shouldReject('0th century', /0th century/);
  shouldReject('0 BC', /no year 0/);
  shouldReject('-0000', /impossible year/);
  shouldReject('90', /century 90: in the future/); // ISO 8601-2 century 90 = 9000–9099
});

test('text we cannot read is unread, not impossible', () => {
  for (const t of ['undated', 'Renaissance', '9', '1475 or 1476', '147x', 'mid-1470s', '/']) {
    const r = parseDate(t, 'unknown');
    assert.equal(r.kind, 'unread', t);
    if (r.kind === 'unread') assert.doesNotMatch(r.reason, /impossible/, t);
  }
});

type Pair = [
  a: string,
  convA: CenturyConvention,
  b: string,
  convB: CenturyConvention,
  expected: ReturnType<typeof compareDates>,
];

// Definition in src/dates/compare.ts: disjoint → conflict; overlapping only in the years where ordinal and
// ISO century counting disagree (disjoint when every century label is read by one strict convention) → soft.
const PAIRS: Pair[] = [
  ['1475', U, 'late 15th century', U, 'agree'],
  ['1475', U, '1520', U, 'conflict'],
  ['ca. 1480', U, '1470-1490', U, 'agree'],
  ['ca. 1480', U, '1495', U, 'conflict'],
  ['15th century', U, '1500', U, 'soft'], // ISO reading 1400–1499 misses 1500
  ['15th century', O, '1500', U, 'soft'], // as read they share 1500; ISO counting would not
  ['15th century', I, '1500', U, 'conflict'], // declared ISO: 1400–1499 vs 1500, disjoint
  ['15th century', U, '1400', U, 'soft'], // ordinal reading 1401–1500 misses 1400
  ['15th century', O, '1400', U, 'conflict'],
  ['15th century', U, '16th century', U, 'soft'], // both readings share only 1500
  ['15th century', O, '16th century', I, 'soft'], // 1401–1500 vs 1500–1599 share 1500 only
  ['15th century', O, '16th century', O, 'conflict'],
  ['15th century', O, '15th century', I, 'agree'],
  ['late 15th century', U, 'early 16th century', U, 'soft'],
  ['15th century', U, '14XX', U, 'agree'],
  ['15th century', U, '15XX', U, 'soft'], // EDTF 15XX is 1500–1599; ordinal 15th century reaches 1500
  ['1475', U, 'undated', U, 'unknown'],
  ['', U, '1475', U, 'unknown'],
  ['1470/..', U, '1900', U, 'agree'],
  ['before 1500', U, 'after 1480', U, 'agree'],
];

test('compareDates worked examples', () => {
  for (const [a, ca, b, cb, expected] of PAIRS) {
    const ra = parseDate(a, ca),
      rb = parseDate(b, cb);
    assert.equal(compareDates(ra, rb), expected, `${a} (${ca}) vs ${b} (${cb})`);
    assert.equal(compareDates(rb, ra), expected, `${b} (${cb}) vs ${a} (${ca})`);
  }
});

const textArb = fc.oneof(
  fc.integer({ min: 1000, max: 2100 }).map(String),
  fc.integer({ min: 1000, max: 2100 }).map((y) => `ca. ${y}`),
  fc.tuple(fc.integer({ min: 1000, max: 2000 }), fc.integer({ min: 0, max: 80 })).map(([y, d]) => `${y}-${y + d}`),
  fc
    .tuple(fc.constantFrom('', 'early ', 'mid-', 'late ', 'first half of the '), fc.integer({ min: 1, max: 21 }))
    .map(([p, n]) => `${p}${n}th century`),
  fc.integer({ min: 100, max: 209 }).map((d) => `${d}X`),
);
const convArb = fc.constantFrom<CenturyConvention>('ordinal', 'iso', 'unknown');

test('compareDates is symmetric and agrees with interval overlap', () => {
  fc.assert(
    fc.property(textArb, convArb, textArb, convArb, (a, ca, b, cb) => {
      const ra = parseDate(a, ca),
        rb = parseDate(b, cb);
      const v = compareDates(ra, rb);
      assert.equal(v, compareDates(rb, ra));
      if (ra.kind === 'interval' && rb.kind === 'interval') {
        assert.equal(v === 'conflict', ra.end < rb.start || rb.end < ra.start);
        assert.ok(ra.start <= ra.end && Number.isInteger(ra.start) && Number.isInteger(ra.end));
      }
    }),
  );
});

test('the unknown convention reads a century label as the union of the other two', () => {
  fc.assert(
    fc.property(
      fc.constantFrom('', 'early ', 'mid-', 'late ', 'second half of the '),
      fc.integer({ min: 1, max: 20 }),
      (p, n) => {
        const text = `${p}${n}th century`;
        const [o, i, u] = (['ordinal', 'iso', 'unknown'] as const).map((c) => parseDate(text, c));
        assert.ok(o.kind === 'interval' && i.kind === 'interval' && u.kind === 'interval');
        assert.deepEqual([u.start, u.end], [Math.min(o.start, i.start), Math.max(o.end, i.end)]);
        assert.deepEqual([o.start - i.start, o.end - i.end], [1, 1]);
      },
    ),
  );
});
