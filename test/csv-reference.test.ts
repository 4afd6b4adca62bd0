// The CSV reader (own RFC 4180 parser) against fast-csv on random files (fast-check, seeded): same records, and each
// record's physical start line equal to 1 + the line breaks before it; plus chunk boundaries anywhere in a record.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { parseString } from 'fast-csv';
import { readCsv, type CsvRow } from '../src/io/csv-read.js';
import { tempDir } from './helpers/fixture.js';

const dir = tempDir('concordat-csv-');
let n = 0;

async function ours(text: string, delimiter: string): Promise<CsvRow[]> {
  const file = path.join(dir, `t${n++}.csv`);
  writeFileSync(file, text);
  const out: CsvRow[] = [];
  for await (const r of readCsv(file, delimiter)) out.push(r);
  return out;
}

function theirs(text: string, delimiter: string): Promise<string[][]> {
  return new Promise((resolve, reject) => {
    const rows: string[][] = [];
    parseString(text, { delimiter, ignoreEmpty: false, quote: '"', escape: '"' })
      .on('data', (r: string[]) => rows.push(r))
      .on('error', reject)
      .on('end', () => resolve(rows.filter((r) => r.length > 0)));
  });
}

const piece = fc.constantFrom(
  'a',
  'b',
  'Z',
  ' ',
  'é',
  '漢',
  '😀',
  ',',
  ';',
  '\t',
  '"',
  '\n',
  '\r\n',
  '\r',
  '0.5',
  'x y',
);
const field = fc.array(piece, { maxLength: 6 }).map((p) => p.join(''));
const quoteIfNeeded = (f: string, d: string) =>
  /[",;\t\r\n]/.test(f) || f.includes(d) ? `"${f.replace(/"/g, '""')}"` : f;
const file = fc.record({
  delimiter: fc.constantFrom(',', ';', '\t'),
  rows: fc.array(fc.array(field, { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 12 }),
  eol: fc.constantFrom('\n', '\r\n', '\r'),
  lastEol: fc.boolean(),
  blankLines: fc.array(fc.nat({ max: 11 }), { maxLength: 3 }),
});

test('same records as fast-csv and the physical start line of each (fast-check, 300 files)', async () => {
  await fc.assert(
    fc.asyncProperty(file, async ({ delimiter, rows, eol, lastEol, blankLines }) => {
      const lines = rows.map((r) => r.map((f) => quoteIfNeeded(f, delimiter)).join(delimiter));
      for (const b of blankLines) if (b < lines.length) lines.splice(b, 0, '');
      const text = lines.join(eol) + (lastEol ? eol : '');
      const got = await ours(text, delimiter);
      const want = await theirs(text, delimiter);
      // fast-csv empties a first field of only spaces (" ,x" → ["", "x"]); RFC 4180 §2 keeps spaces as part of a
      // field, and so do we: compare with that one field emptied
      const firstTrimmed = (f: string[]) => (f[0].trim() === '' ? ['', ...f.slice(1)] : f);
      assert.deepEqual(
        got.map((r) => firstTrimmed(r.fields)),
        want.map(firstTrimmed),
      );
      // the start line: 1 + line breaks (CRLF, CR or LF) in the text before the record's first character
      let at = 0;
      const starts: number[] = [];
      for (const l of lines) {
        if (l.includes(delimiter) || l.includes('"') || l.trim() !== '')
          starts.push(1 + (text.slice(0, at).match(/\r\n|\r|\n/g)?.length ?? 0));
        at += l.length + eol.length;
      }
      assert.deepEqual(
        got.map((r) => r.line),
        starts,
      );
    }),
    { numRuns: 300, seed: 42 },
  );
});

test('a file read in 1 MiB chunks splits records, quoted fields and CRLF pairs anywhere', async () => {
  const row = (i: number) => `img-${i},"a ""quoted"" value, with a comma\r\nand a line break",${(i % 100) / 100}\r\n`;
  const count = 40_000;
  const text = 'image,note,score\r\n' + Array.from({ length: count }, (_, i) => row(i)).join('');
  assert.ok(text.length > 2 * 2 ** 20, 'the file spans several chunks');
  const got = await ours(text, ',');
  assert.equal(got.length, count + 1);
  got.slice(1).forEach((r, i) => {
    assert.deepEqual(r.fields, [
      `img-${i}`,
      'a "quoted" value, with a comma\r\nand a line break',
      String((i % 100) / 100),
    ]);
    assert.equal(r.line, 2 + 2 * i);
  });
});
