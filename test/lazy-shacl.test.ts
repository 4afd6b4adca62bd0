// rdf-validate-shacl is loaded only when it is the chosen engine: with it refused, the built-in engine still validates.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { repoRoot, tempDir } from './helpers/fixture.js';

const tmp = tempDir('concordat-lazy-shacl-');
after(() => rmSync(tmp, { recursive: true, force: true }));
const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const hooks = pathToFileURL(path.join(repoRoot, 'dist', 'test', 'helpers', 'refuse-module.js')).href;
const register = `data:text/javascript,import{register}from'node:module';register(${JSON.stringify(hooks)});`;

function validate(engine: string) {
  const data = path.join(tmp, 'data.ttl');
  writeFileSync(data, '<http://example.org/a> <http://example.org/p> "x" .\n');
  return spawnSync(process.execPath, ['--import', register, cli, 'validate', data, '--shacl-engine', engine], {
    encoding: 'utf8',
  });
}

test('the built-in engine runs with rdf-validate-shacl unloadable; choosing rdf-validate-shacl then fails', () => {
  const builtin = validate('builtin');
  assert.equal(builtin.status, 0, builtin.stderr);
  const reference = validate('rdf-validate-shacl');
  assert.notEqual(reference.status, 0, 'the refusal hook is in effect');
  assert.match(reference.stderr, /refused to load rdf-validate-shacl/);
});
