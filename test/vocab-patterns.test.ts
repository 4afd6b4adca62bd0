// A project's vocab map with a broken IRI pattern is refused when it loads (file, field, message), never a stack trace.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { fixtureCopy, json, repoRoot } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');

const cases: { name: string; iris: Record<string, string>; extendsShipped?: boolean; error: RegExp }[] = [
  {
    name: 'a misspelt slot',
    iris: { link: '{base}link/{hsh}' },
    extendsShipped: true,
    error: /vocab\.json: iris\.link: "\{hsh\}" is not filled for this pattern \(slots for "link": \{base\}, \{hash\}\)/,
  },
  {
    name: 'a slot of another pattern',
    iris: { cluster: '{base}work/{hash}' },
    extendsShipped: true,
    error: /iris\.cluster: "\{hash\}" is not filled/,
  },
  {
    name: 'an unknown pattern name',
    iris: { lnk: '{base}link/{hash}' },
    extendsShipped: true,
    error: /iris\.lnk: is no IRI pattern name concordat fills/,
  },
  {
    name: 'an unmatched brace',
    iris: { link: '{base}link/{hash' },
    extendsShipped: true,
    error: /iris\.link: "\{base\}link\/\{hash" has an unmatched/,
  },
  {
    name: 'a missing pattern (no extends)',
    iris: { link: '{base}link/{hash}' },
    error: /iris\.match: no IRI pattern for this name/,
  },
];

for (const c of cases)
  test(`vocab map with ${c.name}: check and build exit 2 with file and field`, () => {
    const dir = fixtureCopy('load/base', {
      'concordance.json': json((o) => {
        o.vocabMap = 'vocab.json';
      }),
    });
    const map = {
      ...(c.extendsShipped ? { extends: path.join(repoRoot, 'vocab-map', 'claims.json') } : {}),
      claims: [],
      iris: c.iris,
    };
    writeFileSync(path.join(dir, 'vocab.json'), JSON.stringify(map, null, 2));
    for (const cmd of [['check'], ['build', '--out', path.join(dir, 'out')]]) {
      const r = spawnSync(process.execPath, [cli, cmd[0], path.join(dir, 'concordance.json'), ...cmd.slice(1)], {
        encoding: 'utf8',
      });
      assert.equal(r.status, 2, `${cmd[0]}: ${r.stderr}`);
      assert.match(r.stderr, c.error);
      assert.doesNotMatch(r.stderr, /\n\s+at /, 'no stack trace');
    }
  });
