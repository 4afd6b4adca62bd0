// src/ folders → no import cycles between them: stages import only downward (model and shared I/O at the bottom, the
// CLI at the top).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { folderCycles, folderEdges } from './helpers/folder-graph.js';

const srcDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'src');

test('the cycle finder finds a cycle of three folders and ignores a diamond', () => {
  const cyclic = [
    { from: 'load', to: 'dates' },
    { from: 'dates', to: 'analyse' },
    { from: 'analyse', to: 'load' },
    { from: 'cli', to: 'load' },
  ];
  assert.deepEqual(folderCycles(cyclic), [['analyse', 'dates', 'load']]);
  const diamond = [
    { from: 'cli', to: 'load' },
    { from: 'cli', to: 'rdf' },
    { from: 'load', to: 'io' },
    { from: 'rdf', to: 'io' },
  ];
  assert.deepEqual(folderCycles(diamond), []);
});

test('no import cycle between the folders of src/ (type-only and dynamic imports count)', () => {
  const edges = folderEdges(srcDir);
  assert.ok(
    edges.some((e) => e.from === 'pipeline' && e.to === 'load'),
    'the import reader sees the pipeline importing load',
  );
  const cycles = folderCycles(edges);
  const explain = cycles.map((c) => {
    const inside = edges.filter((e) => c.includes(e.from) && c.includes(e.to));
    return (
      `${c.join(' ↔ ')}:\n` + inside.map((e) => `  ${e.from} → ${e.to}: src/${e.file} imports '${e.spec}'`).join('\n')
    );
  });
  assert.deepEqual(explain, [], `import cycles between folders:\n${explain.join('\n')}`);
});
