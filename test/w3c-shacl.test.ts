// W3C SHACL core test suite (w3c/data-shapes, data-shapes-test-suite/tests/core) → one test per manifest entry,
// run through both engines of src/validate/shacl.ts by the manifest runner in test/helpers/shacl-manifest.ts
// (comparison rules: the
// suite's own document, data-shapes-test-suite/index.html, "Validation Reports" / compliance levels).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { existsSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { manifestCases, testFiles } from './helpers/shacl-manifest.js';
import { reference } from './helpers/requires.js';
import { SHACL_ENGINES } from '../src/validate/shacl.js';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const suite = resolve(root, '../shared/reference/shacl/data-shapes-test-suite/tests');
const coreManifest = resolve(suite, 'core/manifest.ttl');

/** Entries we do not run, with the reason (none at present: all 98 core entries are compared in full). */
const SKIP: Readonly<Record<string, string>> = {};

const absent = reference(existsSync(coreManifest), 'W3C SHACL test suite not present at ../shared/reference/shacl');
const files = absent ? [] : await testFiles(pathToFileURL(coreManifest).href);

test('the core manifest reaches 98 test files', { skip: absent }, () => {
  // 98 core tests: shared/reference/README.md §1 counts (w3c/data-shapes @ ff9edb9c).
  assert.equal(files.length, 98);
});

// Both engines: the built-in core engine (the default) and rdf-validate-shacl.
for (const engine of SHACL_ENGINES) {
  for (const fileUrl of files) {
    const name = fileUrl.slice(pathToFileURL(suite).href.length + 1).replace(/\.ttl$/, '');
    for (const c of await manifestCases(fileUrl, engine))
      test(`SHACL ${name} (${engine})`, { skip: SKIP[name] ?? false }, () => c.run());
  }
}
