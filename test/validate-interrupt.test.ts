// validate stopped by a signal while its input is spilled to a temp folder: exit 130/143, the folder removed and named
// in the one line printed.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawn } from 'node:child_process';
import { createWriteStream, existsSync, mkdirSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { repoRoot, tempDir } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');

/** 300,000 triples: more than one validation batch (100,000), so validate spills them to a temp folder. */
async function bigFile(dir: string): Promise<string> {
  const file = path.join(dir, 'big.nt');
  const out = createWriteStream(file);
  for (let i = 0; i < 300_000; i++)
    if (!out.write(`<urn:x:s${i % 100_000}> <urn:x:p${i % 3}> "value ${i}" .\n`))
      await new Promise<void>((r) => out.once('drain', () => r()));
  await new Promise<void>((r) => out.end(() => r()));
  return file;
}

for (const [signal, code] of [
  ['SIGINT', 130],
  ['SIGTERM', 143],
] as const)
  test(`validate stopped by ${signal} while it spills: exit ${code}, the spill folder removed and named`, async () => {
    const dir = tempDir('concordat-validate-stop-');
    const file = await bigFile(dir);
    const tmp = path.join(dir, 'tmp');
    mkdirSync(tmp);
    const child = spawn(process.execPath, [cli, 'validate', file], {
      env: { ...process.env, TMPDIR: tmp },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let stderr = '';
    child.stderr.on('data', (d) => (stderr += d));
    let done = false;
    const ended = new Promise<number | null>((resolve) =>
      child.on('close', (c) => {
        done = true;
        resolve(c);
      }),
    );
    const spill = () => readdirSync(tmp).filter((n) => n.startsWith('concordat-validate-'));
    while (!done && spill().length === 0) await sleep(5);
    const made = spill();
    if (!done) child.kill(signal);
    const status = await ended;
    assert.equal(made.length, 1, `a spill folder was made before the end (exit ${status}): ${stderr}`);
    assert.equal(status, code, stderr);
    assert.match(stderr, new RegExp(`^concordat: stopped by ${signal}; removed .*${made[0]}\\n$`));
    assert.ok(!existsSync(path.join(tmp, made[0])), 'spill folder gone');
  });
