// Decisions files as spreadsheets save them: BOM, CRLF, ";" or tab, blank and undecided rows, decimal commas, per-file
// options.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import path from 'node:path';
import { load } from '../src/load/index.js';
import { summarise, summaryText } from '../src/load/summary.js';
import { UserError } from '../src/errors.js';
import { fixtureCopy, json, type Edit } from './helpers/fixture.js';

const BOM = Buffer.from([0xef, 0xbb, 0xbf]);
/** A file the way a spreadsheet on a usual office set-up saves it: UTF-8 with BOM, CRLF after every row. */
const spreadsheet = (rows: string[][], sep: string) =>
  Buffer.concat([BOM, Buffer.from(rows.map((r) => r.join(sep) + '\r\n').join(''))]);

const HEADER = ['work_a', 'work_b', 'verdict', 'curator', 'decided_on', 'note', 'reason', 'score', 'title_a'];
/**
 * A review queue with two rows decided out of five, a blank row kept as separators only, decimal commas in the score
 * column.
 */
const QUEUE = [
  HEADER,
  ['alpha:A 1', 'beta:B1', 'same', 'Jo Invented', '2026-12-01', 'checked the mount', 'high-score', '0,97', 'Madonna'],
  ['alpha:A/2', 'beta:B2', '', '', '', '', 'proposed', '0,61', 'Hieronymus'],
  ['', '', '', '', '', '', '', '', ''],
  [
    'alpha:É-3',
    'beta:B3',
    'Part',
    'https://orcid.org/0000-0002-1825-0097',
    '2026-12-02',
    '',
    'proposed',
    '0,55',
    'Annunciation',
  ],
  ['alpha:A 1', 'beta:B3', '', '', '', '', 'implied', '', 'Madonna'],
  ['alpha:A/2', 'beta:B1', '', '', '', '', 'proposed', '0,5', 'Saint'],
];

const withQueue = (content: Edit, entry: unknown = 'decisions/queue.csv') => ({
  'decisions/queue.csv': content,
  'concordance.json': json((o) => (o.decisions = [entry])),
});

async function loaded(edits: Record<string, Edit>) {
  const dir = fixtureCopy('load/base', edits);
  return { dir, ...(await load(path.join(dir, 'concordance.json'))) };
}

for (const [name, sep] of [
  ['semicolons', ';'],
  ['tabs', '\t'],
  ['commas', ','],
  ['bars', '|'],
] as const) {
  test(`a review queue saved with ${name}, BOM, CRLF and blank rows loads with the separator detected`, async () => {
    const rows = sep === ',' ? QUEUE.map((r) => r.map((c) => (c.includes(',') ? `"${c}"` : c))) : QUEUE;
    const { model, stats } = await loaded(withQueue(spreadsheet(rows, sep)));
    assert.equal(model.decisions.length, 2);
    const [d1, d2] = model.decisions;
    assert.equal(d1.verdict, 'same');
    assert.equal(d1.curator, 'Jo Invented');
    assert.equal(d1.date, '2026-12-01');
    assert.equal(d1.note, 'checked the mount');
    assert.equal(d1.line, 2);
    assert.equal(d2.verdict, 'part', 'verdicts are read case-insensitively');
    assert.equal(d2.line, 5, 'lines count the blank row');
    assert.equal(stats.undecidedRows, 3, 'rows naming a pair but no verdict are counted; the blank row is not');
  });
}

test('check says how many rows had no verdict', async () => {
  const { model, stats } = await loaded(withQueue(spreadsheet(QUEUE, ';')));
  const s = summarise(model, stats);
  assert.equal(s.decisionRowsWithoutVerdict, 3);
  assert.match(summaryText(s), /decisions: 2 \(3 rows without a verdict skipped\)/);
});

test('the per-file form { file, delimiter } sets the separator; a wrong one is refused naming the file', async () => {
  const { model } = await loaded(withQueue(spreadsheet(QUEUE, ';'), { file: 'decisions/queue.csv', delimiter: ';' }));
  assert.equal(model.decisions.length, 2);
  const dir = fixtureCopy(
    'load/base',
    withQueue(spreadsheet(QUEUE, ';'), { file: 'decisions/queue.csv', delimiter: '\t' }),
  );
  const err = (await load(path.join(dir, 'concordance.json')).catch((e) => e)) as UserError;
  assert.ok(err instanceof UserError);
  assert.equal(path.relative(dir, err.problems[0].file), 'decisions/queue.csv');
  assert.match(err.problems[0].message, /the header is one column; it looks ";"-separated/);
  assert.match(err.problems[0].hint ?? '', /"delimiter": ";"/);
});

test('the old decision-date header "date" is still read', async () => {
  const old = QUEUE.map((r, i) => (i === 0 ? r.map((c) => (c === 'decided_on' ? 'date' : c)) : r));
  const { model } = await loaded(withQueue(spreadsheet(old, ';')));
  assert.deepEqual(
    model.decisions.map((d) => d.date),
    ['2026-12-01', '2026-12-02'],
  );
});

test('a row with a curator but no verdict is skipped with a warning naming file, line and field', async () => {
  const rows = QUEUE.map((r, i) => (i === 2 ? [r[0], r[1], '', 'Jo Invented', '', '', ...r.slice(6)] : r));
  const { dir, model } = await loaded(withQueue(spreadsheet(rows, ';')));
  const w = model.warnings.find((x) => /no verdict/.test(x.message));
  assert.ok(w);
  assert.equal(path.relative(dir, w!.file), 'decisions/queue.csv');
  assert.equal(w!.line, 3);
  assert.equal(w!.field, 'verdict');
});

interface BadCase {
  name: string;
  row: number;
  cells: Record<number, string>;
  entry?: unknown;
  file: string;
  line: number;
  field: string;
  message: RegExp;
  hint?: RegExp;
}

const bad: BadCase[] = [
  {
    name: 'a verdict without a curator',
    row: 2,
    cells: { 2: 'distinct' },
    file: 'decisions/queue.csv',
    line: 3,
    field: 'curator',
    message: /verdict "distinct" names no curator/,
  },
  {
    name: 'a verdict without a date',
    row: 2,
    cells: { 2: 'same', 3: 'Jo Invented' },
    file: 'decisions/queue.csv',
    line: 3,
    field: 'decided_on',
    message: /verdict "same" has no date/,
  },
  {
    name: 'a date a spreadsheet localised',
    row: 1,
    cells: { 4: '01.12.2026' },
    file: 'decisions/queue.csv',
    line: 2,
    field: 'decided_on',
    message: /"01.12.2026" is not a valid ISO 8601 date/,
    hint: /format the column as text/,
  },
  {
    name: 'a misspelt verdict',
    row: 1,
    cells: { 2: 'sme' },
    file: 'decisions/queue.csv',
    line: 2,
    field: 'verdict',
    message: /unknown verdict "sme"/,
    hint: /did you mean "same"/,
  },
  {
    name: 'a verdict on a blank pair',
    row: 3,
    cells: { 2: 'same', 3: 'Jo', 4: '2026-12-01' },
    file: 'decisions/queue.csv',
    line: 4,
    field: 'work_a',
    message: /"" is not a work reference/,
  },
  {
    name: 'an unknown delimiter in the per-file form',
    row: 1,
    cells: {},
    entry: { file: 'decisions/queue.csv', delimiter: ':' },
    file: 'concordance.json',
    line: 0,
    field: 'decisions[0].delimiter',
    message: /delimiter must be one of/,
  },
  {
    name: 'an unknown field in the per-file form',
    row: 1,
    cells: {},
    entry: { file: 'decisions/queue.csv', delimter: ';' },
    file: 'concordance.json',
    line: 0,
    field: 'decisions[0].delimter',
    message: /unknown field/,
    hint: /did you mean "delimiter"/,
  },
];

for (const c of bad) {
  test(`bad decisions: ${c.name}`, async () => {
    const rows = QUEUE.map((r, i) => (i === c.row ? r.map((x, k) => c.cells[k] ?? x) : r));
    const dir = fixtureCopy('load/base', withQueue(spreadsheet(rows, ';'), c.entry));
    const err = (await load(path.join(dir, 'concordance.json')).then(
      () => assert.fail('expected a UserError'),
      (e: unknown) => e,
    )) as UserError;
    assert.ok(err instanceof UserError, String(err));
    assert.equal(err.exitCode, 2);
    const p = err.problems.find((x) => c.message.test(x.message));
    assert.ok(p, `no problem matching ${c.message} in:\n${err.message}`);
    assert.equal(path.relative(dir, p!.file), c.file);
    if (c.line > 0) assert.equal(p!.line, c.line);
    assert.equal(p!.field, c.field);
    if (c.hint) assert.match(p!.hint ?? '', c.hint);
  });
}
