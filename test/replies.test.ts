// util/replies: waiting on a worker thread's replies until a condition holds, or its first failure.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { Replies } from '../src/util/replies.js';

test('until resolves once the condition holds after a reply, and rejects with the first failure only', async () => {
  const r = new Replies();
  let acked = 0;
  const waiting = r.until(() => acked >= 2);
  for (let i = 0; i < 2; i++)
    setImmediate(() => {
      acked++;
      r.wake();
    });
  await waiting;
  assert.equal(acked, 2);
  const failing = r.until(() => false);
  r.fail(new Error('first'));
  r.fail(new Error('second'));
  await assert.rejects(failing, /first/);
  await assert.rejects(
    r.until(() => true),
    /first/,
    'a condition that holds does not hide a failure',
  );
});
