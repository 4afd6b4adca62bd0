// Load stage: the fixture project loads into the expected model, and every kind of bad input is refused with file, line
// and field.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import path from 'node:path';
import { IMAGE_ROLES } from '../src/model.js';
import { load } from '../src/load/index.js';
import { UserError, type Problem } from '../src/errors.js';
import { fixtureCopy, json, type Edit } from './helpers/fixture.js';

test('the base fixture loads: works grouped from image rows, quoted newlines, TSV, warnings', async () => {
  const { model, stats } = await load(path.join(fixtureCopy('load/base'), 'concordance.json'));
  assert.equal(model.works.length, 6);
  assert.equal(model.images.count, 8);
  const a1 = model.works[model.workIndex[0].get('A 1')!];
  assert.equal(a1.imageCount, 2);
  assert.equal(a1.title, 'Madonna, enthroned');
  assert.equal(model.works[model.workIndex[0].get('A/2')!].title, 'The "Little" Saint\nJerome');
  assert.equal(
    model.works[model.workIndex[0].get('É-3')!].line,
    6,
    'record after a quoted newline starts on physical line 6',
  );
  assert.equal(stats.evidenceRows, 4);
  assert.equal(model.matches.count, 3, 'the match between two photos of one record is set aside');
  assert.equal(stats.sameRecordMatches, 1);
  assert.equal(model.matches.overlap[1], 1, 'blank overlap means 1');
  assert.equal(model.decisions.length, 2);
  assert.equal(model.gold.length, 2);
  const small = model.warnings.find((w) => /under 300 px/.test(w.message));
  assert.ok(small, 'a 250x400 image is warned about');
  assert.equal(small!.line, 6);
});

test("an image role column is read through the partner's roles map, case-insensitively; blank means not recorded", async () => {
  const dir = fixtureCopy('load/base', {
    'concordance.json': json((o) => {
      o.partners[0].catalogue.columns.role = 'Date';
      o.partners[0].catalogue.roles = { '1475': 'artwork', 'CA. 1480': 'verso', 'late 15th century': 'chart' };
    }),
  });
  const { model } = await load(path.join(dir, 'concordance.json'));
  const role = (id: string) => IMAGE_ROLES[model.images.role[model.images.id.indexOf(id)] - 1];
  assert.deepEqual(['a-1', 'a-2', 'a-3', 'a-4'].map(role), ['artwork', 'artwork', 'verso', 'chart']);
  assert.equal(model.images.role[model.images.id.indexOf('n3')], 0, 'beta records no roles');
});

test('image sizes are kept in the model (0 where a partner records none or a cell is blank)', async () => {
  const dir = fixtureCopy('load/base', { 'catalogues/alpha.csv': (t) => t.replace('800,600', ',600') });
  const { model } = await load(path.join(dir, 'concordance.json'));
  const size = (id: string) => {
    const i = model.images.id.indexOf(id);
    return [model.images.width[i], model.images.height[i]];
  };
  assert.deepEqual(['a-1', 'a-2', 'a-3', 'a-4'].map(size), [
    [1200, 900],
    [0, 600],
    [1000, 1000],
    [250, 400],
  ]);
  assert.deepEqual(size('n3'), [0, 0], 'beta maps no size columns');
});

test('BOM and CRLF line ends are read like plain UTF-8 with LF', async () => {
  const dir = fixtureCopy('load/base', {
    'catalogues/alpha.csv': (t) =>
      Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(t.replace(/\n/g, '\r\n'))]),
  });
  const { model } = await load(path.join(dir, 'concordance.json'));
  assert.equal(model.works.length, 6);
  assert.equal(model.works[model.workIndex[0].get('A/2')!].title, 'The "Little" Saint\r\nJerome');
  assert.equal(model.works[model.workIndex[0].get('É-3')!].line, 6);
});

test('rows of one work that disagree on the date give a warning, not an error', async () => {
  const dir = fixtureCopy('load/base', {
    'catalogues/beta.tsv': (t) => t.replace('B2\tn3\tHieronymus\t1470/1490', 'B2\tn3\tHieronymus\t1480'),
  });
  const { model } = await load(path.join(dir, 'concordance.json'));
  const w = model.warnings.find((x) => /B2/.test(x.message));
  assert.ok(w);
  assert.equal(w!.line, 4);
  assert.equal(w!.field, 'Datierung');
});

interface BadCase {
  name: string;
  edits: Record<string, Edit>;
  file: string;
  line: number;
  field: string;
  message: RegExp;
  hint?: RegExp;
}

const addRow = (row: string) => (t: string) => t + row + '\n';

const cases: BadCase[] = [
  {
    name: 'ragged row',
    edits: { 'catalogues/alpha.csv': addRow('A 9,a-9,X,1500,1000,1000,extra') },
    file: 'catalogues/alpha.csv',
    line: 7,
    field: '',
    message: /row has 7 fields, the header has 6/,
  },
  {
    name: 'short row in TSV',
    edits: { 'catalogues/beta.tsv': addRow('B9\tn9') },
    file: 'catalogues/beta.tsv',
    line: 6,
    field: '',
    message: /row has 2 fields, the header has 4/,
  },
  {
    name: 'stray quote',
    edits: { 'catalogues/alpha.csv': addRow('A 9,a-9,Bad"title,1500,1000,1000') },
    file: 'catalogues/alpha.csv',
    line: 7,
    field: '',
    message: /stray quote/,
  },
  {
    name: 'unterminated quote',
    edits: { 'catalogues/alpha.csv': addRow('A 9,a-9,"Open title,1500,1000,1000') },
    file: 'catalogues/alpha.csv',
    line: 7,
    field: '',
    message: /unterminated quoted field/,
  },
  {
    name: 'invalid UTF-8',
    edits: {
      'catalogues/beta.tsv': (t) => Buffer.concat([Buffer.from(t), Buffer.from('B9\tn9\tBad \xff\t1500\n', 'latin1')]),
    },
    file: 'catalogues/beta.tsv',
    line: 6,
    field: '',
    message: /invalid UTF-8/,
  },
  {
    name: 'width not a whole number',
    edits: { 'catalogues/alpha.csv': addRow('A 9,a-9,Title,1500,12.5,1000') },
    file: 'catalogues/alpha.csv',
    line: 7,
    field: 'W',
    message: /"12.5" is not a positive whole number of pixels/,
  },
  {
    name: 'height beyond any photograph',
    edits: { 'catalogues/alpha.csv': addRow('A 9,a-9,Title,1500,1000,3000000000') },
    file: 'catalogues/alpha.csv',
    line: 7,
    field: 'H',
    message: /"3000000000" is not a positive whole number of pixels/,
  },
  {
    name: 'missing file',
    edits: { 'concordance.json': json((o) => (o.partners[1].catalogue.file = 'catalogues/nope.tsv')) },
    file: 'catalogues/nope.tsv',
    line: 0,
    field: '',
    message: /file not found/,
  },
  {
    name: 'mapped column absent',
    edits: { 'concordance.json': json((o) => (o.partners[0].catalogue.columns.title = 'Titel')) },
    file: 'catalogues/alpha.csv',
    line: 1,
    field: 'Titel',
    message: /column "Titel".*not in the header/,
    hint: /did you mean "Title"/,
  },
  {
    name: 'header-only file',
    edits: { 'catalogues/beta.tsv': 'Inv\tNeg\tTitel\tDatierung\n' },
    file: 'catalogues/beta.tsv',
    line: 1,
    field: '',
    message: /header but no rows/,
  },
  {
    name: 'empty file',
    edits: { 'gold/gold.csv': '' },
    file: 'gold/gold.csv',
    line: 0,
    field: '',
    message: /file is empty/,
  },
  {
    name: 'score above 1',
    edits: { 'evidence/run1.csv': addRow('alpha:a-3,beta:n3,1.2,1') },
    file: 'evidence/run1.csv',
    line: 6,
    field: 'score',
    message: /score "1.2" is not a number in \[0,1\]/,
  },
  {
    name: 'score not a number',
    edits: { 'evidence/run1.csv': addRow('alpha:a-3,beta:n3,high,1') },
    file: 'evidence/run1.csv',
    line: 6,
    field: 'score',
    message: /score "high"/,
  },
  {
    name: 'overlap zero',
    edits: { 'evidence/run1.csv': addRow('alpha:a-3,beta:n3,0.8,0') },
    file: 'evidence/run1.csv',
    line: 6,
    field: 'overlap',
    message: /overlap "0" is not a number in \(0,1\]/,
  },
  {
    name: 'overlap above 1',
    edits: { 'evidence/run1.csv': addRow('alpha:a-3,beta:n3,0.8,1.5') },
    file: 'evidence/run1.csv',
    line: 6,
    field: 'overlap',
    message: /overlap "1.5"/,
  },
  {
    name: 'unknown partner',
    edits: { 'evidence/run1.csv': addRow('alfa:a-3,beta:n3,0.8,1') },
    file: 'evidence/run1.csv',
    line: 6,
    field: 'image_a',
    message: /unknown partner "alfa"/,
    hint: /did you mean "alpha"/,
  },
  {
    name: 'unknown image',
    edits: { 'evidence/run1.csv': addRow('alpha:a-99,beta:n3,0.8,1') },
    file: 'evidence/run1.csv',
    line: 6,
    field: 'image_a',
    message: /unknown image "a-99" of partner "alpha"/,
  },
  {
    name: 'not a reference',
    edits: { 'evidence/run1.csv': addRow('a-3,beta:n3,0.8,1') },
    file: 'evidence/run1.csv',
    line: 6,
    field: 'image_a',
    message: /not a image reference|not a image|is not a/,
  },
  {
    name: 'role column without a roles map',
    edits: { 'concordance.json': json((o) => (o.partners[0].catalogue.columns.role = 'Date')) },
    file: 'concordance.json',
    line: 27,
    field: 'partners[0].catalogue.roles',
    message: /a role column needs a "roles" map/,
    hint: /artwork, detail, verso/,
  },
  {
    name: 'role word not in the roles map',
    edits: {
      'concordance.json': json((o) => {
        o.partners[0].catalogue.columns.role = 'Date';
        o.partners[0].catalogue.roles = { '1475': 'artwork' };
      }),
    },
    file: 'catalogues/alpha.csv',
    line: 4,
    field: 'Date',
    message: /role "ca. 1480" is not in the partner's "roles" map/,
    hint: /mapped: 1475/,
  },
  {
    name: 'self-match',
    edits: { 'evidence/run1.csv': addRow('beta:n3,beta:n3,0.99,1') },
    file: 'evidence/run1.csv',
    line: 6,
    field: 'image_b',
    message: /image matched with itself/,
  },
  {
    name: 'unknown run',
    edits: {
      'evidence/run1.csv': (t) =>
        t
          .replace('score,overlap', 'score,overlap,run')
          .replace(/\n(?=.)/g, '\n')
          .split('\n')
          .map((l, i) => (i === 0 || !l ? l : l + ',run-2'))
          .join('\n'),
    },
    file: 'evidence/run1.csv',
    line: 2,
    field: 'run',
    message: /unknown run "run-2"/,
    hint: /did you mean "run-1"/,
  },
  {
    name: 'unknown work in decisions',
    edits: { 'decisions/d.csv': addRow('alpha:A 1,beta:B9,same,Jo Invented,2026-10-22,') },
    file: 'decisions/d.csv',
    line: 4,
    field: 'work_b',
    message: /unknown work "B9" of partner "beta"/,
  },
  {
    name: 'one image under two works',
    edits: { 'catalogues/alpha.csv': addRow('A 5,a-1,Other,1500,1000,1000') },
    file: 'catalogues/alpha.csv',
    line: 7,
    field: 'Photo',
    message: /image "a-1" is under work "A 5" here but under "A 1" on line 2/,
  },
  {
    name: 'unknown verdict',
    edits: { 'decisions/d.csv': addRow('alpha:A/2,beta:B2,sam,Jo Invented,2026-10-22,') },
    file: 'decisions/d.csv',
    line: 4,
    field: 'verdict',
    message: /unknown verdict "sam"/,
    hint: /did you mean "same"/,
  },
  {
    name: 'impossible decision date',
    edits: { 'decisions/d.csv': addRow('alpha:A/2,beta:B2,same,Jo Invented,2026-02-30,') },
    file: 'decisions/d.csv',
    line: 4,
    field: 'date',
    message: /"2026-02-30" is not a valid ISO 8601 date/,
  },
  {
    name: 'impossible catalogue date',
    edits: { 'catalogues/beta.tsv': addRow('B9\tn9\tX\t1475-13-02') },
    file: 'catalogues/beta.tsv',
    line: 6,
    field: 'Datierung',
    message: /impossible date "1475-13-02"/,
  },
  {
    name: 'range ending before it starts',
    edits: { 'catalogues/beta.tsv': addRow('B9\tn9\tX\t1490/1470') },
    file: 'catalogues/beta.tsv',
    line: 6,
    field: 'Datierung',
    message: /impossible date "1490\/1470"/,
  },
  {
    name: 'self-pair in gold',
    edits: { 'gold/gold.csv': addRow('beta:B1,beta:B1') },
    file: 'gold/gold.csv',
    line: 4,
    field: 'work_b',
    message: /paired with itself/,
  },
  {
    name: 'JSON syntax error',
    edits: {
      'concordance.json': (t) =>
        t.replace('"base": "https://concordance.example.org/",', '"base": "https://concordance.example.org/"'),
    },
    file: 'concordance.json',
    line: 4,
    field: '',
    message: /JSON syntax error/,
  },
  {
    name: 'unknown field with near miss',
    edits: {
      'concordance.json': (t) =>
        t.replace(
          '"catalogue": {\n        "file": "catalogues/alpha.csv"',
          '"catalog": {\n        "file": "catalogues/alpha.csv"',
        ),
    },
    file: 'concordance.json',
    line: 14,
    field: 'partners[0].catalog',
    message: /unknown field/,
    hint: /did you mean "catalogue"/,
  },
  {
    name: 'duplicate partner keys',
    edits: { 'concordance.json': json((o) => (o.partners[1].key = 'alpha')) },
    file: 'concordance.json',
    line: 0,
    field: 'partners[1].key',
    message: /duplicate partner key "alpha"/,
  },
  {
    name: 'template without placeholder',
    edits: { 'concordance.json': json((o) => (o.partners[0].workIri = 'https://alpha.example.org/id/work/')) },
    file: 'concordance.json',
    line: 0,
    field: 'partners[0].workIri',
    message: /has no \{work\} placeholder/,
  },
  {
    name: 'template with an operator',
    edits: { 'concordance.json': json((o) => (o.partners[1].imageIri = 'https://beta.example.org/photo/{+image}')) },
    file: 'concordance.json',
    line: 0,
    field: 'partners[1].imageIri',
    message: /operator/,
  },
  {
    name: 'base not an absolute IRI',
    edits: { 'concordance.json': json((o) => (o.base = 'concordance/')) },
    file: 'concordance.json',
    line: 0,
    field: 'base',
    message: /absolute IRI/,
  },
  {
    name: 'policy out of range',
    edits: { 'concordance.json': json((o) => (o.policy.proposeAt = 1.5)) },
    file: 'concordance.json',
    line: 0,
    field: 'policy.proposeAt',
    message: /1/,
  },
  {
    name: 'autoConfirmAt below proposeAt',
    edits: { 'concordance.json': json((o) => (o.policy.autoConfirmAt = 0.4)) },
    file: 'concordance.json',
    line: 0,
    field: 'policy.autoConfirmAt',
    message: /at least proposeAt/,
  },
  {
    name: 'a mapped column twice in the header',
    edits: {
      'catalogues/alpha.csv': (t) =>
        t
          .split('\n')
          .map((l, i) => (!l ? l : i === 0 ? l + ',Title' : l + ',x'))
          .join('\n'),
    },
    file: 'catalogues/alpha.csv',
    line: 1,
    field: 'Title',
    message: /column "Title" appears 2 times in the header \(columns 3, 7\)/,
  },
  {
    name: 'a TSV declared as comma-separated',
    edits: { 'concordance.json': json((o) => (o.partners[1].catalogue.delimiter = ',')) },
    file: 'catalogues/beta.tsv',
    line: 1,
    field: '',
    message: /looks tab-separated/,
    hint: /"delimiter": "\\t"/,
  },
  {
    name: 'a semicolon evidence file',
    edits: { 'evidence/run1.csv': (t) => t.replace(/,/g, ';') },
    file: 'evidence/run1.csv',
    line: 1,
    field: '',
    message: /looks ";"-separated/,
    hint: /comma-separated/,
  },
  {
    name: 'a decimal comma in a score',
    edits: { 'evidence/run1.csv': addRow('alpha:a-3,beta:n3,"0,92",1') },
    file: 'evidence/run1.csv',
    line: 6,
    field: 'score',
    message: /score "0,92"/,
    hint: /write a decimal point: 0\.92/,
  },
  {
    name: 'a work ID in the wrong case',
    edits: { 'decisions/d.csv': addRow('alpha:a 1,beta:B2,same,Jo Invented,2026-10-22,') },
    file: 'decisions/d.csv',
    line: 4,
    field: 'work_a',
    message: /unknown work "a 1" of partner "alpha"/,
    hint: /did you mean "alpha:A 1"\?/,
  },
  {
    name: 'unknown date language',
    edits: { 'concordance.json': json((o) => (o.partners[1].language = 'deu')) },
    file: 'concordance.json',
    line: 0,
    field: 'partners[1].language',
    message: /one of en, de, fr, it, es, nl/,
  },
  {
    name: 'unknown century convention',
    edits: { 'concordance.json': json((o) => (o.partners[0].centuryConvention = 'roman')) },
    file: 'concordance.json',
    line: 0,
    field: 'partners[0].centuryConvention',
    message: /ordinal|iso/,
  },
];

for (const c of cases) {
  test(`bad input: ${c.name}`, async () => {
    const dir = fixtureCopy('load/base', c.edits);
    const err = await load(path.join(dir, 'concordance.json')).then(
      () => assert.fail('expected a UserError'),
      (e: unknown) => e,
    );
    assert.ok(err instanceof UserError, String(err));
    assert.equal(err.exitCode, 2);
    const p: Problem | undefined = err.problems.find((x) => c.message.test(x.message));
    assert.ok(p, `no problem matching ${c.message} in:\n${err.message}`);
    assert.equal(path.relative(dir, p!.file), c.file);
    if (c.line > 0) assert.equal(p!.line, c.line, err.message);
    else assert.ok(p!.line >= 0);
    assert.equal(p!.field, c.field);
    if (c.hint) assert.match(p!.hint ?? '', c.hint);
  });
}

test('a date no form reads is one warning per distinct phrase, counting the records that use it', async () => {
  const rows = [
    'B9\tn9\tX\tRenaissance',
    'B9\tn10\tX\tRenaissance',
    'B10\tn11\tY\tRenaissance',
    'B11\tn12\tZ\tundatiert',
    'B12\tn13\tZ\tum 1480',
  ];
  const dir = fixtureCopy('load/base', { 'catalogues/beta.tsv': (t) => t + rows.join('\n') + '\n' });
  const { model } = await load(path.join(dir, 'concordance.json'));
  const unread = model.warnings.filter((x) => /is not a form concordat reads/.test(x.message));
  assert.deepEqual(
    unread.map((x) => [x.line, x.field, x.message.replace(/ is not a form.*/, '')]),
    [
      [6, 'Datierung', 'date "Renaissance" (2 records, first on this line)'], // B9's two photographs are one record
      [9, 'Datierung', 'date "undatiert" (1 record on this line)'],
    ],
  );
  assert.match(unread[0].hint ?? '', /"language"/, 'a partner without a language is told it can set one');
});

test("a partner's language decides which phrases are read", async () => {
  const dir = fixtureCopy('load/base', {
    'catalogues/beta.tsv': addRow('B9\tn9\tX\tvers 1480'),
    'concordance.json': json((o) => (o.partners[1].language = 'de')),
  });
  const { model } = await load(path.join(dir, 'concordance.json'));
  assert.equal(model.project.partners[1].language, 'de');
  assert.equal(
    model.warnings.filter((x) => /"vers 1480" \(1 record on this line\) is not a form/.test(x.message)).length,
    1,
  );
});

test('JSON syntax errors give line and column', async () => {
  const dir = fixtureCopy('load/base', {
    'concordance.json': '{\n  "title": "x",\n  "base" "https://x.example.org/"\n}\n',
  });
  const err = (await load(path.join(dir, 'concordance.json')).catch((e) => e)) as UserError;
  assert.equal(err.problems[0].line, 3);
  assert.equal(err.problems[0].column, 10);
});

test('problems are collected, not stopped at the first, and capped', async () => {
  const rows = Array.from({ length: 150 }, (_, i) => `alpha:a-${100 + i},beta:n1,0.8,1`).join('\n');
  const dir = fixtureCopy('load/base', { 'evidence/run1.csv': (t) => t + rows + '\n' });
  const err = (await load(path.join(dir, 'concordance.json')).catch((e) => e)) as UserError;
  assert.equal(err.problems.length, 101);
  assert.match(err.problems[100].message, /50 more problems not shown/);
});
