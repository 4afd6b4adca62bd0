// Worked examples: date phrases in the partners' languages (en, de, fr, it, es, nl) → year intervals, and the language
// setting.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { type CenturyConvention, type DateForm, type DateLanguage, parseDate } from '../src/dates/index.js';
import { canonicalPhrase, numeral } from '../src/dates/languages.js';

type Row = [text: string, start: number, end: number, form: DateForm, approximate?: boolean];

function reads(language: DateLanguage | undefined, convention: CenturyConvention) {
  return ([text, start, end, form, approximate = false]: Row): void => {
    const r = parseDate(text, convention, language);
    assert.equal(r.kind, 'interval', `${text} (${language ?? 'any language'}): ${JSON.stringify(r)}`);
    if (r.kind !== 'interval') return;
    assert.deepEqual(
      [r.start, r.end, r.form, r.approximate],
      [start, end, form, approximate],
      `${text} (${language ?? 'any'}, ${convention})`,
    );
  };
}

// Every interval below is common practice, no source: what the words mean is the languages' ordinary use in
// catalogues; the widths are those of src/dates/calendar.ts (ca. a year ±10, before/after 50 years,
// early/mid/late and thirds = 33/34/33 years, halves, quarters; ca. with a part of a century ±tolerance of its
// length). Centuries with the convention unknown read as the union of ordinal (15th = 1401–1500) and ISO 8601-2
// (1400–1499) counting, 1400–1500; the parts follow the same union (late 15th = 1467–1500).
const GERMAN: Row[] = [
  ['15. Jh.', 1400, 1500, 'century'],
  ['15. Jahrhundert', 1400, 1500, 'century'],
  ['15.Jh.', 1400, 1500, 'century'],
  ['um 1480', 1470, 1490, 'circa', true],
  ['gegen 1480', 1470, 1490, 'circa', true],
  ['um 1500?', 1490, 1510, 'circa', true],
  ['vor 1500', 1450, 1500, 'before', true],
  ['nach 1500', 1500, 1550, 'after', true],
  ['nicht vor 1480', 1480, 1530, 'after', true],
  ['1470 bis 1490', 1470, 1490, 'range'],
  ['von 1470 bis 1490', 1470, 1490, 'range'],
  ['zwischen 1470 und 1490', 1470, 1490, 'range'],
  ['1470er Jahre', 1470, 1479, 'decade'],
  ['70er Jahre des 15. Jh.', 1470, 1479, 'decade'],
  ['Anfang 16. Jh.', 1500, 1533, 'part-of-century'],
  ['frühes 16. Jh.', 1500, 1533, 'part-of-century'],
  ['Mitte des 15. Jahrhunderts', 1433, 1467, 'part-of-century'],
  ['Ende 15. Jh.', 1467, 1500, 'part-of-century'],
  ['spätes 15. Jh.', 1467, 1500, 'part-of-century'],
  ['E. 15. Jh.', 1467, 1500, 'part-of-century'],
  ['1. Hälfte 16. Jh.', 1500, 1550, 'part-of-century'],
  ['2. Hälfte des 15. Jahrhunderts', 1450, 1500, 'part-of-century'],
  ['erste Hälfte 16. Jh.', 1500, 1550, 'part-of-century'],
  ['2. H. 15. Jh.', 1450, 1500, 'part-of-century'],
  ['1. Viertel 16. Jh.', 1500, 1525, 'part-of-century'],
  ['2. Viertel 16. Jh.', 1525, 1550, 'part-of-century'],
  ['letztes Viertel 15. Jh.', 1475, 1500, 'part-of-century'],
  ['1. Drittel 16. Jh.', 1500, 1533, 'part-of-century'],
  ['15./16. Jh.', 1400, 1600, 'century-range'],
  ['15.-16. Jh.', 1400, 1600, 'century-range'],
  ['um die Mitte des 15. Jh.', 1423, 1477, 'part-of-century', true],
  ['2. Jh. v. Chr.', -199, -100, 'century'],
  ['100 v. Chr.', -99, -99, 'year'],
];

const FRENCH: Row[] = [
  ['XVe siècle', 1400, 1500, 'century'],
  ['XVe s.', 1400, 1500, 'century'],
  ['15e siècle', 1400, 1500, 'century'],
  ['XVème siècle', 1400, 1500, 'century'],
  ['vers 1480', 1470, 1490, 'circa', true],
  ['v. 1480', 1470, 1490, 'circa', true],
  ['1480 env.', 1470, 1490, 'circa', true],
  ['avant 1500', 1450, 1500, 'before', true],
  ['après 1500', 1500, 1550, 'after', true],
  ['entre 1470 et 1490', 1470, 1490, 'range'],
  ['de 1470 à 1490', 1470, 1490, 'range'],
  ['années 1470', 1470, 1479, 'decade'],
  ['les années 1470', 1470, 1479, 'decade'],
  ['début du XVIe siècle', 1500, 1533, 'part-of-century'],
  ['milieu du XVe siècle', 1433, 1467, 'part-of-century'],
  ['mi-XVe siècle', 1433, 1467, 'part-of-century'],
  ['fin du XVe siècle', 1467, 1500, 'part-of-century'],
  ['fin XVe', 1467, 1500, 'part-of-century'],
  ['première moitié du XVIe siècle', 1500, 1550, 'part-of-century'],
  ['2e moitié du XVe siècle', 1450, 1500, 'part-of-century'],
  ['premier quart du XVIe siècle', 1500, 1525, 'part-of-century'],
  ['dernier quart du XVe siècle', 1475, 1500, 'part-of-century'],
  ['3e quart du XVe s.', 1450, 1475, 'part-of-century'],
  ['premier tiers du XVIe siècle', 1500, 1533, 'part-of-century'],
  ['XVe-XVIe siècles', 1400, 1600, 'century-range'],
  ['fin XVe - début XVIe s.', 1467, 1533, 'part-of-century'],
  ['vers le milieu du XVe siècle', 1423, 1477, 'part-of-century', true],
  ['IIe siècle av. J.-C.', -199, -100, 'century'],
];

const ITALIAN: Row[] = [
  ['sec. XV', 1400, 1500, 'century'],
  ['secolo XV', 1400, 1500, 'century'],
  ['XV secolo', 1400, 1500, 'century'],
  ['XV sec.', 1400, 1500, 'century'],
  ['secc. XV-XVI', 1400, 1600, 'century-range'],
  ['fine del XV secolo', 1467, 1500, 'part-of-century'],
  ['fine sec. XV', 1467, 1500, 'part-of-century'],
  ['inizio del XVI secolo', 1500, 1533, 'part-of-century'],
  ['metà del XV secolo', 1433, 1467, 'part-of-century'],
  ['prima metà del XVI secolo', 1500, 1550, 'part-of-century'],
  ['seconda metà del XV secolo', 1450, 1500, 'part-of-century'],
  ['primo quarto del XVI secolo', 1500, 1525, 'part-of-century'],
  ['ultimo quarto del XV secolo', 1475, 1500, 'part-of-century'],
  // Quattrocento = the 1400s: the name fixes the years (1400–1499), whatever the convention.
  ['Quattrocento', 1400, 1499, 'century'],
  ['il Cinquecento', 1500, 1599, 'century'],
  ['fine Quattrocento', 1467, 1499, 'part-of-century'],
  ["fine '400", 1467, 1499, 'part-of-century'],
  ['primo Cinquecento', 1500, 1532, 'part-of-century'],
  ['anni settanta del Quattrocento', 1470, 1479, 'decade'],
  ["anni '70 del XV secolo", 1470, 1479, 'decade'],
  ['circa 1480', 1470, 1490, 'circa', true],
  ['1480 circa', 1470, 1490, 'circa', true],
  ['verso il 1480', 1470, 1490, 'circa', true],
  ['intorno al 1480', 1470, 1490, 'circa', true],
  ['prima del 1500', 1450, 1500, 'before', true],
  ['ante 1500', 1450, 1500, 'before', true],
  ['dopo il 1500', 1500, 1550, 'after', true],
  ['post 1500', 1500, 1550, 'after', true],
  ['tra il 1470 e il 1490', 1470, 1490, 'range'],
  ['dal 1470 al 1490', 1470, 1490, 'range'],
];

const SPANISH: Row[] = [
  ['siglo XV', 1400, 1500, 'century'],
  ['s. XV', 1400, 1500, 'century'],
  ['siglos XV-XVI', 1400, 1600, 'century-range'],
  ['siglos XV y XVI', 1400, 1600, 'century-range'],
  ['hacia 1480', 1470, 1490, 'circa', true],
  ['h. 1480', 1470, 1490, 'circa', true],
  ['alrededor de 1480', 1470, 1490, 'circa', true],
  ['antes de 1500', 1450, 1500, 'before', true],
  ['después de 1500', 1500, 1550, 'after', true],
  ['entre 1470 y 1490', 1470, 1490, 'range'],
  ['de 1470 a 1490', 1470, 1490, 'range'],
  ['década de 1470', 1470, 1479, 'decade'],
  ['principios del siglo XVI', 1500, 1533, 'part-of-century'],
  ['mediados del siglo XV', 1433, 1467, 'part-of-century'],
  ['finales del siglo XV', 1467, 1500, 'part-of-century'],
  ['a finales del siglo XV', 1467, 1500, 'part-of-century'],
  ['fines del s. XV', 1467, 1500, 'part-of-century'],
  ['primera mitad del siglo XVI', 1500, 1550, 'part-of-century'],
  ['segunda mitad del siglo XV', 1450, 1500, 'part-of-century'],
  ['primer cuarto del siglo XVI', 1500, 1525, 'part-of-century'],
  ['último cuarto del siglo XV', 1475, 1500, 'part-of-century'],
  ['primer tercio del siglo XVI', 1500, 1533, 'part-of-century'],
  ['último tercio del siglo XV', 1467, 1500, 'part-of-century'],
];

const DUTCH: Row[] = [
  ['15de eeuw', 1400, 1500, 'century'],
  ['15e eeuw', 1400, 1500, 'century'],
  ['15de-16de eeuw', 1400, 1600, 'century-range'],
  ['eind 15de eeuw', 1467, 1500, 'part-of-century'],
  ['einde van de 15de eeuw', 1467, 1500, 'part-of-century'],
  ['begin 16de eeuw', 1500, 1533, 'part-of-century'],
  ['midden 15de eeuw', 1433, 1467, 'part-of-century'],
  ['eerste helft 16de eeuw', 1500, 1550, 'part-of-century'],
  ['tweede helft 15de eeuw', 1450, 1500, 'part-of-century'],
  ['eerste kwart 16de eeuw', 1500, 1525, 'part-of-century'],
  ['derde kwart 15de eeuw', 1450, 1475, 'part-of-century'],
  ['laatste kwart van de 15de eeuw', 1475, 1500, 'part-of-century'],
  ['laat-15de-eeuws', 1467, 1500, 'part-of-century'],
  ['vroeg-16de-eeuws', 1500, 1533, 'part-of-century'],
  ['15de-eeuws', 1400, 1500, 'century'],
  ['omstreeks 1480', 1470, 1490, 'circa', true],
  ['omstr. 1480', 1470, 1490, 'circa', true],
  ['rond 1480', 1470, 1490, 'circa', true],
  ['voor 1500', 1450, 1500, 'before', true],
  ['na 1500', 1500, 1550, 'after', true],
  ['tussen 1470 en 1490', 1470, 1490, 'range'],
  ['van 1470 tot 1490', 1470, 1490, 'range'],
  ['1470 tot 1490', 1470, 1490, 'range'],
];

const ENGLISH: Row[] = [
  ['beginning of the 16th century', 1500, 1533, 'part-of-century'],
  ['middle of the 15th century', 1433, 1467, 'part-of-century'],
  ['end of the 15th century', 1467, 1500, 'part-of-century'],
  ['first third of the 16th century', 1500, 1533, 'part-of-century'],
  ['last third of the 15th century', 1467, 1500, 'part-of-century'],
  ['final quarter of the 15th century', 1475, 1500, 'part-of-century'],
  ['fifteenth century', 1400, 1500, 'century'],
  ['15th-century', 1400, 1500, 'century'],
  ['late 1400s', 1467, 1499, 'part-of-century'],
  ['late 15th century-early 16th century', 1467, 1533, 'part-of-century'],
];

const LANGS: [DateLanguage, Row[]][] = [
  ['de', GERMAN],
  ['fr', FRENCH],
  ['it', ITALIAN],
  ['es', SPANISH],
  ['nl', DUTCH],
  ['en', ENGLISH],
];
for (const [lang, rows] of LANGS) {
  test(`${lang}: every phrase reads with the partner's language set`, () => rows.forEach(reads(lang, 'unknown')));
  // `v. 1480` is French *vers* (circa) but German/Dutch *vor*/*voor* (before): with no language it reads as the hull.
  test(`${lang}: every phrase reads with no language set`, () =>
    rows.filter(([t]) => t !== 'v. 1480').forEach(reads(undefined, 'unknown')));
}

test('century conventions apply to centuries in every language', () => {
  // ordinal: 15th century = 1401–1500; ISO 8601-2 (the `iso` convention): 1400–1499
  const rows: [string, DateLanguage, CenturyConvention, number, number][] = [
    ['15. Jh.', 'de', 'ordinal', 1401, 1500],
    ['15. Jh.', 'de', 'iso', 1400, 1499],
    ['XVe siècle', 'fr', 'ordinal', 1401, 1500],
    ['fin du XVe siècle', 'fr', 'iso', 1467, 1499],
    ['sec. XV', 'it', 'iso', 1400, 1499],
    ['primo quarto del XVI secolo', 'it', 'ordinal', 1501, 1525],
    ['mediados del siglo XV', 'es', 'ordinal', 1434, 1467],
    ['tweede helft 15de eeuw', 'nl', 'iso', 1450, 1499],
    // a name of the hundreds is not a counted century: Quattrocento stays 1400–1499
    ['Quattrocento', 'it', 'ordinal', 1400, 1499],
  ];
  for (const [text, lang, conv, start, end] of rows) {
    const r = parseDate(text, conv, lang);
    assert.ok(r.kind === 'interval' && r.start === start && r.end === end, `${text} (${conv}): ${JSON.stringify(r)}`);
  }
});

test('the language setting decides a phrase that differs between languages, and restricts the words read', () => {
  const span = (t: string, l?: DateLanguage) => {
    const r = parseDate(t, 'unknown', l);
    return r.kind === 'interval' ? `${r.start}/${r.end}` : r.kind;
  };
  assert.equal(span('v. 1480', 'fr'), '1470/1490'); // vers 1480
  assert.equal(span('v. 1480', 'de'), '1430/1480'); // vor 1480
  assert.equal(span('v. 1480', 'nl'), '1430/1480'); // voor 1480
  assert.equal(span('v. 1480'), '1430/1490'); // no language: the hull of both readings
  assert.equal(span('vers 1480', 'de'), 'unread'); // a German partner's French word is not read…
  assert.equal(span('late 15th century', 'de'), '1467/1500'); // …but English phrases are read for every partner
  assert.equal(span('1480', 'it'), '1480/1480');
});

test('text that is no date stays unread in every language', () => {
  for (const t of ['Renaissance', 'undatiert', 'sans date', 'fine', 'mitte', 'v.', 'XV', 'late', 'siglo']) {
    const r = parseDate(t, 'unknown');
    assert.equal(r.kind, 'unread', `${t}: ${JSON.stringify(r)}`);
    if (r.kind === 'unread') assert.equal(r.reason, 'not a date form we can read', t);
  }
  const r = parseDate('0. Jh.', 'unknown', 'de');
  assert.ok(r.kind === 'impossible' && /0th century/.test(r.reason), 'impossible stays impossible in another language');
});

test('Roman numerals and the canonical phrase', () => {
  assert.deepEqual(['i', 'iv', 'ix', 'xiv', 'xv', 'xix', 'xxi', '15'].map(numeral), [1, 4, 9, 14, 15, 19, 21, 15]);
  assert.equal(canonicalPhrase('1. hälfte 16. jh.', 'de'), 'first half 16th century');
  assert.equal(canonicalPhrase('fin xve-début xvie siècle', 'fr'), 'late 15th century-early 16th century');
  assert.equal(canonicalPhrase('mediados del siglo xv', 'es'), 'mid 15th century');
});
