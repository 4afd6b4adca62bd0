// Offline EDTF reference files (../shared/reference/edtf) → checks of src/dates/index.ts, one test per entry.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { type DateReading, type IntervalReading, parseDate } from '../src/dates/index.js';
import { reference } from './helpers/requires.js';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const dir = resolve(root, '../shared/reference/edtf');
const absent = reference(existsSync(dir), 'EDTF reference files not present at ../shared/reference/edtf');

function load<T>(file: string): T {
  return JSON.parse(readFileSync(join(dir, file), 'utf8')) as T;
}

function interval(text: string, r: DateReading): IntervalReading {
  assert.equal(r.kind, 'interval', `${JSON.stringify(text)}: ${JSON.stringify(r)}`);
  return r as IntervalReading;
}

/** Year of a `YYYY-MM-DD` bound as the files write it (negative and long years allowed; `inf`/`-inf` open). */
function year(bound: string): number {
  if (bound === 'inf') return Infinity;
  if (bound === '-inf') return -Infinity;
  return Number(bound.slice(0, bound.length - 6));
}

if (absent) {
  test('EDTF reference files', { skip: absent }, () => {});
} else {
  // Source: Library of Congress, Extended Date/Time Format (EDTF) Specification, February 4, 2019,
  // https://www.loc.gov/standards/datetime/ (transcribed in loc-spec/loc-spec-examples.json).
  // "An implementation of level N must accept all examples of levels <= N": levels 0 and 1 all; level 2 as supported.
  const LOC_L2_UNSUPPORTED: Record<string, string> = {}; // every level 2 example is read
  const loc = load<{ examples: { level: number; edtf: string }[] }>('loc-spec/loc-spec-examples.json');
  test('LoC EDTF 2019: 64 examples transcribed', () => assert.equal(loc.examples.length, 64));
  loc.examples.forEach((e, i) => {
    test(`LoC EDTF 2019 L${e.level} #${i} ${e.edtf} is accepted`, { skip: LOC_L2_UNSUPPORTED[e.edtf] ?? false }, () => {
      interval(e.edtf, parseDate(e.edtf, 'unknown'));
    });
  });

  // Source: ixc/python-edtf edtf/parser/tests.py EXAMPLES @ 603859e9 (python-edtf/parser-examples.json): strict
  // lower/upper bounds, compared by year only.
  const PY_SKIP: Record<string, string> = {};
  const abbreviated =
    'YYYY-NN with NN above YY is read as the abbreviated range a cataloguer means (2008-12 → 2008–2012), a hull that also covers the EDTF month/season';
  for (const s of ['2008-12', '2001-21', '2003-22', '2000-23', '2010-24', '2001-29', '2001-34'])
    PY_SKIP[s] = abbreviated;
  const unknownEnd = 'an unknown (empty) interval end is unbounded here; python-edtf guesses 10 years';
  for (const s of ['/2006', '2004-06-01/', '1984-06-02?/']) PY_SKIP[s] = unknownEnd;
  const spaces = 'spaces inside a set: rejected, LoC EDTF 2019 Level 2 sets allow no spaces';
  for (const s of [
    '[1667, 1668, 1670..1672]',
    '[1760-01, 1760-02, 1760-12..]',
    '[1667, 1760-12]',
    '{1667,1668, 1670..1672}',
    '{1960, 1961-12}',
  ])
    PY_SKIP[s] = spaces;
  // Approximate (~ %) and significant-digit (S) entries: our bounds include the tolerance or the S range, python-edtf's
  // strict bounds do not; checked by containment instead of equality.
  const WIDENED = /[~%]|\dS\d/;
  const py = load<{ examples: { edtf: string; date?: string; lowerStrict?: string; upperStrict?: string }[] }>(
    'python-edtf/parser-examples.json',
  );
  py.examples.forEach((e, i) => {
    const name = `python-edtf strict bounds #${i} ${e.edtf}`;
    test(name, { skip: PY_SKIP[e.edtf] ?? false }, () => {
      const r = interval(e.edtf, parseDate(e.edtf, 'iso'));
      const lo = year(e.lowerStrict ?? e.date!),
        hi = year(e.upperStrict ?? e.date!);
      if (WIDENED.test(e.edtf)) {
        assert.ok(
          r.approximate && r.start <= lo && r.end >= hi,
          `${e.edtf}: [${r.start}, ${r.end}] should contain [${lo}, ${hi}]`,
        );
      } else {
        assert.deepEqual([r.start, r.end], [lo, hi], e.edtf);
      }
    });
  });

  // Source: unt-libraries/edtf-validate tests/test_valid_edtf.py @ 01c13c55 (edtf-validate/edtf-validate-cases.json).
  const EV_ACCEPTED_ON_PURPOSE: Record<string, string> = {
    ' 1863-03-29': 'catalogue cells are trimmed before reading',
    '1863-03-29 ': 'catalogue cells are trimmed before reading',
    '0000-01-03/0000-01':
      'valid here: the end month still has days after the start (rule: start’s earliest day ≤ end’s latest day)',
    '0000-02/0000': 'valid here: the end year still has days after the start (same rule)',
    '2004-06-11%/2004-%06': 'valid here: June 2004 still has days after 11 June (same rule)',
    '2004-06-11%/2004-06~': 'valid here: June 2004 still has days after 11 June (same rule)',
    'Y-61000/-2000': 'valid here: letter-prefixed years are allowed as interval ends',
  };
  const ev = load<{ valid: { edtf: string; level: number }[]; invalid: { edtf: string; list: string }[] }>(
    'edtf-validate/edtf-validate-cases.json',
  );
  ev.invalid.forEach((e, i) => {
    test(
      `edtf-validate ${e.list} #${i} ${JSON.stringify(e.edtf)} is rejected`,
      { skip: EV_ACCEPTED_ON_PURPOSE[e.edtf] ?? false },
      () => {
        const r = parseDate(e.edtf, 'unknown');
        // A blank cell is the `empty` reading by design: not a date either.
        assert.ok(
          e.edtf === '' ? r.kind === 'empty' : r.kind === 'impossible' || r.kind === 'unread',
          `${JSON.stringify(e.edtf)}: ${JSON.stringify(r)}`,
        );
      },
    );
  });
  const EV_VALID_REJECTED: Record<string, string> = {
    '-1859S5': 'rejected on purpose: 5 significant digits of a 4-digit year',
  };
  ev.valid.forEach((e, i) => {
    test(
      `edtf-validate valid L${e.level} #${i} ${e.edtf} is accepted`,
      { skip: EV_VALID_REJECTED[e.edtf] ?? false },
      () => {
        interval(e.edtf, parseDate(e.edtf, 'unknown'));
      },
    );
  });

  // Source: ixc/python-edtf edtf/natlang/tests.py test_natlang (python-edtf/natlang-examples.json). Its centuries are
  // ISO-counted ('19th century' → 18XX), so phrases are read with the 'iso' convention and compared with our
  // reading of the EDTF they map to; null (not a date) must not give an interval.
  const NL_SKIP: Record<string, string> = {};
  const notOurs = 'not one of our free-text forms (month or season names, numeric day/month, phrases, decade parts)';
  for (const s of [
    'active late 17th-19th centuries',
    'active 17-19th Centuries',
    'the year 1800',
    'the year 1897',
    'January 2008',
    'January 12, 1940',
    '1862 (uncertain)',
    'maybe 1862',
    '1862 maybe',
    '1862 guess',
    'uncertain: 1862',
    'uncertain: Jan 18 1862',
    '~ Feb 1812',
    'circa Feb 1812',
    'Feb 1812 approx',
    'about Spring 1849',
    'notcirca 1860',
    'attica 1802',
    'attic. 1802',
    'uncertain: approx 1862',
    'January 12',
    'January',
    '10/7/2008',
    '7/2008',
    'Spring 1872',
    'Summer 1872',
    'Autumn 1872',
    'Fall 1872',
    'Winter 1872',
    'before January 1928',
    'before 18 January 1928',
    'before approx January 18 1928',
    'before approx January 1928',
    'after approx January 1928',
    'after approx Summer 1928',
    'after about the 1920s',
    'before about the 1900s',
    'before the 1900s',
    'decade in 1800s',
    'decade somewhere during the 1800s',
    'year in the 1860s',
    'year in the 1800s',
    'year in about the 1800s',
    'month in 1872',
    'day in Spring 1849',
    'day in January 1872',
    'day in 1872',
    'birthday in 1872',
    'before 19th century',
    'a day in about Spring 1849?',
    '1857-mid 1860s',
    'active 1910-30',
    '1861-67 (later print)',
    '1915 late - autumn 1916',
    '1920s -early 1930s',
  ])
    NL_SKIP[s] = notOurs;
  const twoDates = 'two dates in one cell (", printed …", "; …", "or"): not one of our forms; the file keeps the first';
  for (const s of [
    '1851-1852; printed 1853-1854',
    '1863 or 1864',
    '1863, printed 1870',
    '1863, printed ca. 1866',
    '1864 or 1866',
    '1864, printed ca. 1864',
    '1864-1872, printed 1870s',
    '1870s, printed ca. 1880s',
    '1900-1903, cast before 1929',
    '1900; 1973',
    '1900; printed 1912',
    '1915, from Camerawork, October 1916',
    '1930s, printed early 1960s',
    '1932, printed 1976 by Gunther Sander',
    '1938, printed 1940s-1950s',
  ])
    NL_SKIP[s] = twoDates;
  Object.assign(NL_SKIP, {
    '90': 'two-digit years are not read: too ambiguous in a catalogue (the file guesses 1990)',
    'c64 BCE': 'the file maps 64 BCE to -0064, which is 65 BC in EDTF/ISO year numbering (1 BC = 0000)',
    c1900s: "the file maps 'c1900s' to the decade 190X~ but '1800s' to the century 18XX; we read both as hundreds",
    'c1800s?': "the file maps 'c1800s?' to the decade 180X% but '1800s' to the century 18XX; we read both as hundreds",
    '1858/1860': "the file itself lists this result ('[1858, 1860]', with a space) among its wrong ones",
  });
  // before/after: the file leaves the far end unknown; we give a 50-year width, so only the written bound is compared.
  const OPEN = new Set(['earlier than 1928', 'before 1928', 'after 1928', 'later than 1928']);
  const nl = load<{ examples: { text: string; edtf: string | null }[] }>('python-edtf/natlang-examples.json');
  nl.examples.forEach((e, i) => {
    test(`python-edtf natlang #${i} ${JSON.stringify(e.text)} → ${e.edtf}`, { skip: NL_SKIP[e.text] ?? false }, () => {
      const ours = parseDate(e.text, 'iso');
      if (e.edtf === null) {
        assert.notEqual(ours.kind, 'interval', e.text);
        return;
      }
      const r = interval(e.text, ours),
        x = interval(e.edtf, parseDate(e.edtf, 'iso'));
      if (OPEN.has(e.text))
        assert.equal(x.start === -Infinity ? r.end : r.start, x.start === -Infinity ? x.end : x.start);
      else assert.deepEqual([r.start, r.end], [x.start, x.end], `${e.text} vs ${e.edtf}`);
    });
  });
}
