// Errors point where the problem is: a quote never closed is reported on the line it opened (and where it was
// noticed); thousands of identical warnings read as one line per kind with a count, --verbose lists them all.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { UserError } from '../src/errors.js';
import { readCsv } from '../src/io/csv-read.js';
import { load } from '../src/load/index.js';
import { FULL_UP_TO, POSITIONS_SHOWN, warningLines } from '../src/load/warning-groups.js';
import { fixtureCopy, repoRoot, tempDir } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');

/** Twelve rows of a catalogue; row `open` (1-based line) gets a title whose quote is never closed. */
function catalogue(open: number, lastQuoted: boolean): string {
  const lines = ['Object,Photo,Title,Date,W,H'];
  for (let i = 2; i <= 16; i++) {
    const title = i === open ? '"Madonna, enthroned' : i === 16 && lastQuoted ? '"Saint Jerome"' : `Study ${i}`;
    lines.push(`W${i},p-${i},${title},1500,1000,800`);
  }
  return lines.join('\n') + '\n';
}

async function refusal(text: string): Promise<UserError> {
  const file = path.join(tempDir('concordat-quote-'), 'c.csv');
  writeFileSync(file, text);
  try {
    for await (const row of readCsv(file, ',')) void row;
  } catch (e) {
    if (e instanceof UserError) return e;
    throw e;
  }
  assert.fail('the file was accepted');
}

test('a quote opened on line 4 and closed by a quoted field on line 16: reported at line 4, naming line 16', async () => {
  const e = await refusal(catalogue(4, true));
  assert.equal(e.problems[0].line, 4, e.message);
  assert.match(e.message, /the quoted field opened here runs to line 16, where text follows its closing quote/);
  assert.match(e.problems[0].hint ?? '', /close the quote on line 4/);
});

test('a quote opened on line 4 and never closed: reported at line 4, noticed at the end of the file', async () => {
  const e = await refusal(catalogue(4, false));
  assert.equal(e.problems[0].line, 4, e.message);
  assert.match(
    e.message,
    /unterminated quoted field: the quote opened here is still open at the end of the file \(line 17\)/,
  );
});

test('the quote opened on a later line of a record that spans lines is the one named', async () => {
  // the record starts on line 2 (a quoted newline in the title), the unclosed quote opens on line 3
  const text = 'a,b,c\n"x\ny",1,"open\n4,5,6\n';
  const e = await refusal(text);
  assert.equal(e.problems[0].line, 3, e.message);
});

test('a row whose quoted field swallowed lines: the field count names the lines it ran over', async () => {
  const rows = catalogue(4, false).replace('W8,p-8', 'W8",p-8');
  const dir = fixtureCopy('load/base', { 'catalogues/alpha.csv': rows });
  const e = await load(path.join(dir, 'concordance.json')).then(
    () => assert.fail('accepted'),
    (err: unknown) => err as UserError,
  );
  const p = e.problems.find((x) => /runs to line/.test(x.message));
  assert.ok(p, e.message);
  assert.equal(p!.line, 4);
  assert.match(p!.message, /row has \d+ fields, the header has 6; it runs to line 8 inside a quoted field/);
  assert.match(p!.hint ?? '', /the quote opened on line 4/);
});

/** The fixture project with its evidence file's first row repeated `n` times. */
function repeated(n: number): string {
  const dir = fixtureCopy('load/base');
  const file = path.join(dir, 'evidence', 'run1.csv');
  const lines = readFileSync(file, 'utf8').split('\n');
  writeFileSync(file, [...lines.slice(0, 2), ...Array(n).fill(lines[1]), ...lines.slice(2)].join('\n'));
  return path.join(dir, 'concordance.json');
}

test('6,022 repeated evidence rows: check prints one line for them with the count and the next positions', () => {
  const project = repeated(6022);
  const r = spawnSync(process.execPath, [cli, 'check', project], { encoding: 'utf8' });
  assert.equal(r.status, 0, r.stderr);
  const repeats = r.stdout.split('\n').filter((l) => /already listed/.test(l));
  assert.equal(repeats.length, 1, r.stdout.slice(0, 2000));
  assert.match(repeats[0], /run1\.csv:3: image_b: this image pair and run were already listed on line 2/);
  assert.match(repeats[0], /and 6,021 more of this kind, on lines 4, 5, 6, 7, 8, … \(--verbose lists all\)/);
  assert.match(r.stdout, /warnings: \d+/);
  const verbose = spawnSync(process.execPath, [cli, 'check', project, '--verbose'], { encoding: 'utf8' });
  assert.equal(verbose.status, 0);
  assert.equal(verbose.stdout.split('\n').filter((l) => /already listed/.test(l)).length, 6022);
});

test('kinds of at most three warnings are printed in full; others keep their own kinds apart', () => {
  const w = (line: number, message: string, file = 'e.csv') => ({ file, line, field: 'image_b', message });
  const few = [w(2, 'repeated row of line 1'), w(3, 'repeated row of line 1'), w(9, 'unknown date "x"')];
  assert.equal(warningLines(few, false).length, 3);
  const many = Array.from({ length: FULL_UP_TO + 4 }, (_, i) => w(10 + i, `repeated row of line ${i}`));
  const other = w(99, 'another kind', 'f.csv');
  const lines = warningLines([...many, other], false);
  assert.equal(lines.length, 2);
  assert.match(lines[0], new RegExp(`and ${many.length - 1} more of this kind, on lines 11, 12, 13, 14, 15, … `));
  assert.equal(POSITIONS_SHOWN, 5);
  assert.match(lines[1], /f\.csv:99: image_b: another kind$/);
  assert.equal(warningLines([...many, other], true).length, many.length + 1);
});
