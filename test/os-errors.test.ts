// Operating-system trouble while writing (a path under a file, /proc, a full disk) gives a clear message and exit code,
// never a stack trace; release folders get the mode the umask asks for.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { repoRoot, tempDir } from './helpers/fixture.js';
import { requires } from './helpers/requires.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const demo = path.join(repoRoot, 'demo-data', 'concordance.json');
const build = (out: string) => spawnSync(process.execPath, [cli, 'build', demo, '--out', out], { encoding: 'utf8' });
const noStack = (stderr: string) => assert.doesNotMatch(stderr, /\n\s+at |node:internal/, 'no stack trace');

const cases: { name: string; out: (dir: string) => string; status: number; stderr: RegExp }[] = [
  {
    name: '--out under a file',
    out: (d) => {
      writeFileSync(path.join(d, 'afile'), '');
      return path.join(d, 'afile', 'r');
    },
    status: 2,
    stderr: /afile: --out: is a file, so no folder can be made under it/,
  },
  {
    name: '--out deeper under a file',
    out: (d) => {
      writeFileSync(path.join(d, 'afile'), '');
      return path.join(d, 'afile', 'x', 'r');
    },
    status: 2,
    stderr: /afile: --out: is a file/,
  },
  {
    name: '--out under /proc',
    out: () => '/proc/concordat-release',
    status: 2,
    stderr: /^\/proc: --out: no file can be made in this folder \(ENOENT\)/,
  },
];

for (const c of cases)
  test(`build with ${c.name}: exit ${c.status}, one clear line`, () => {
    const r = build(c.out(tempDir('concordat-os-')));
    assert.equal(r.status, c.status, r.stderr);
    assert.match(r.stderr, c.stderr);
    noStack(r.stderr);
  });

test('build on a full disk (a 1 MiB tmpfs): exit 1 naming --out and ENOSPC, the temp folder removed', (t) => {
  const dir = tempDir('concordat-full-');
  const mnt = path.join(dir, 'mnt');
  mkdirSync(mnt);
  const mounted = spawnSync('mount', ['-t', 'tmpfs', '-o', 'size=1m', 'tmpfs', mnt]).status === 0;
  if (!mounted)
    return t.skip(
      process.getuid?.() === 0 ? (requires(false, 'mount -t tmpfs failed') as string) : 'mounting a tmpfs needs root',
    );
  try {
    const r = build(path.join(mnt, 'release'));
    assert.equal(r.status, 1, r.stderr);
    assert.match(r.stderr, /release: --out: no space left on the device \(ENOSPC/);
    noStack(r.stderr);
    assert.deepEqual(readdirSync(mnt), []);
  } finally {
    spawnSync('umount', [mnt]);
  }
});

for (const [umask, mode] of [
  ['022', 0o755],
  ['027', 0o750],
  ['077', 0o700],
] as const)
  test(`a release folder made under umask ${umask} has mode ${mode.toString(8)}`, () => {
    const out = path.join(tempDir('concordat-umask-'), 'release');
    const r = spawnSync(
      'sh',
      ['-c', `umask ${umask} && exec "$0" "$@"`, process.execPath, cli, 'build', demo, '--out', out],
      { encoding: 'utf8' },
    );
    assert.equal(r.status, 0, r.stderr);
    assert.equal(statSync(out).mode & 0o777, mode);
  });
