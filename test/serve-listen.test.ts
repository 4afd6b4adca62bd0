// concordat serve when it cannot listen (port in use, privileged port): one line naming the option, exit 2, no trace.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { createServer } from 'node:net';
import { spawn } from 'node:child_process';
import path from 'node:path';
import { build } from '../src/pipeline.js';
import { writeSite } from '../src/site/index.js';
import { fixtureCopy, repoRoot, tempDir } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');

/** Runs the CLI to its end (serve exits at once when it cannot listen); a kill after 20 s fails the test. */
function run(args: string[]): Promise<{ status: number | null; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [cli, ...args], { stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d) => (stderr += d));
    const timer = setTimeout(() => child.kill('SIGKILL'), 20_000);
    child.on('close', (status) => {
      clearTimeout(timer);
      resolve({ status, stderr });
    });
  });
}

test('serve on a port already in use: exit 2, one line naming --port with the next port as a hint, no stack trace', async () => {
  const dir = fixtureCopy('load/base');
  const out = path.join(tempDir('concordat-serve-listen-'), 'release');
  await build(path.join(dir, 'concordance.json'), out);
  const site = path.join(tempDir('concordat-serve-listen-site-'), 'site');
  await writeSite(out, site);
  const holder = createServer();
  await new Promise<void>((r) => holder.listen(0, '127.0.0.1', () => r()));
  const port = (holder.address() as { port: number }).port;
  try {
    const r = await run(['serve', site, '--port', String(port)]);
    assert.equal(r.status, 2, r.stderr);
    assert.match(
      r.stderr,
      new RegExp(
        `--port: port ${port} on 127\\.0\\.0\\.1 is in use \\(stop what uses it or give --port ${port + 1}\\)`,
      ),
    );
    assert.doesNotMatch(r.stderr, /\n\s+at |EADDRINUSE/);
  } finally {
    holder.close();
  }
});
