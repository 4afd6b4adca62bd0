// The one JSON reader: syntax errors at their line and column in every file concordat reads as JSON.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { parseJson, readJsonFile, lineColumn } from '../src/io/json-file.js';
import { loadVocabMap } from '../src/rdf/vocab-map.js';
import { jsonldToNQuads } from '../src/rdf/jsonld.js';
import { readJsonObject } from '../src/io/json-file.js';
import type { UserError } from '../src/errors.js';
import { tempDir } from './helpers/fixture.js';

const tmp = tempDir('concordat-json-file-');
after(() => rmSync(tmp, { recursive: true, force: true }));

const problem = (f: () => unknown) => {
  try {
    f();
  } catch (e) {
    return (e as UserError).problems[0];
  }
  assert.fail('no error');
};

test('lineColumn counts lines and columns from 1', () => {
  assert.deepEqual(lineColumn('ab\ncd', 0), { line: 1, column: 1 });
  assert.deepEqual(lineColumn('ab\ncd', 4), { line: 2, column: 2 });
});

test('parseJson: a missing colon is placed at its line and column; a BOM is ignored', () => {
  const text = '\uFEFF{\n  "a": 1,\n  "b" 2\n}\n';
  const p = problem(() => parseJson(text, 'x.json'));
  assert.deepEqual([p.file, p.line, p.column], ['x.json', 3, 7]);
  assert.match(p.message, /^JSON syntax error: /);
  assert.doesNotMatch(p.message, /position/);
  assert.deepEqual(parseJson('\uFEFF{"a":1}', 'x.json'), { a: 1 });
});

test('parseJson: text that ends too early is placed at its end', () => {
  const p = problem(() => parseJson('{\n  "a": [1,\n', 'x.json'));
  assert.deepEqual([p.line, p.column], [3, 1]);
});

test('readJsonFile names a file it cannot read', () => {
  const p = problem(() => readJsonFile(path.join(tmp, 'missing.json'), 'vocab map', 'check the path'));
  assert.match(p.message, /cannot read vocab map: no such file or folder/);
  assert.equal(p.hint, 'check the path');
});

test('vocab maps, JSON project files and JSON-LD documents report syntax errors at their line', async () => {
  const f = path.join(tmp, 'broken.json');
  writeFileSync(f, '{\n  "claims": [\n    { "kind": "same" "status": "confirmed" }\n  ]\n}\n');
  for (const read of [() => loadVocabMap(f), () => readJsonObject(f)]) {
    const p = problem(read);
    assert.deepEqual([p.file, p.line, p.column], [f, 3, 22]);
  }
  const err = (await jsonldToNQuads('{\n  "@id": "x",\n  "@type" "y"\n}', 'doc.jsonld', 'file:///doc.jsonld').catch(
    (e) => e,
  )) as UserError;
  assert.deepEqual([err.problems[0].file, err.problems[0].line, err.problems[0].column], ['doc.jsonld', 3, 11]);
});
