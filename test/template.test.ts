// RFC 6570 level-1 templates: expansion and checking.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { checkTemplate, compileTemplate, expandTemplate } from '../src/io/template.js';

// RFC 6570 §1.2 (Level 1 examples) and §3.2.2 (Simple String Expansion examples), with the variable values of §3.2
// (var := "value", hello := "Hello World!", half := "50%", empty := "", undef undefined). Transcribed from memory
// of the RFC text.
const vars = { var: 'value', hello: 'Hello World!', half: '50%', empty: '' };
const rfcExamples: [string, string][] = [
  ['{var}', 'value'],
  ['{hello}', 'Hello%20World%21'],
  ['{half}', '50%25'],
  ['O{empty}X', 'OX'],
  ['O{undef}X', 'OX'],
];
for (const [template, expected] of rfcExamples) {
  test(`RFC 6570 §3.2.2 level-1 example ${template} → ${expected}`, () => {
    assert.equal(expandTemplate(template, vars), expected);
  });
}

test('catalogue IDs with spaces, slashes, accents and colons give valid IRIs (RFC 6570 §3.2.1: UTF-8 then pct-encode)', () => {
  const f = compileTemplate('https://a.example.org/id/{work}', 'work');
  assert.equal(f('Inv. 12/3'), 'https://a.example.org/id/Inv.%2012%2F3');
  assert.equal(f('Fot-é 0045'), 'https://a.example.org/id/Fot-%C3%A9%200045');
  assert.equal(f('x:y~z_1'), 'https://a.example.org/id/x%3Ay~z_1');
  assert.equal(f('😀'), 'https://a.example.org/id/%F0%9F%98%80');
  assert.equal(f('a'), expandTemplate('https://a.example.org/id/{work}', { work: 'a' }));
});

test('template checks', () => {
  assert.deepEqual(checkTemplate('https://x.example.org/{work}', 'work'), []);
  assert.match(checkTemplate('https://x.example.org/', 'work').join(), /no \{work\}/);
  assert.match(checkTemplate('https://x.example.org/{+work}', 'work').join(), /operator/);
  assert.match(checkTemplate('https://x.example.org/{wrk}', 'work').join(), /unknown variable \{wrk\}/);
  assert.match(checkTemplate('https://x.example.org/{work', 'work').join(), /unbalanced/);
});

test('a value of only dots is percent-encoded, so no dot segment is minted (RFC 3986 §5.2.4; RDF 1.1 Concepts §3.2)', () => {
  const f = compileTemplate('https://a.example.org/id/{work}', 'work');
  assert.equal(f('..'), 'https://a.example.org/id/%2E%2E');
  assert.equal(f('.'), 'https://a.example.org/id/%2E');
  assert.equal(f('...'), 'https://a.example.org/id/...');
  assert.equal(f('a.b'), 'https://a.example.org/id/a.b');
});
