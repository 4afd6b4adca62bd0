// Whether two evidence rows can name the same image match: exactly when two images share an IRI or two runs an ID,
// found through hashes of the image IRIs and confirmed on the text.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import type { Model } from '../src/model.js';
import { matchIrisCanRepeat } from '../src/rdf/index.js';

const model = (images: number, runs = ['r1', 'r2']) =>
  ({ runs: runs.map((id) => ({ id })), images: { count: images } }) as unknown as Model;
const namer = (iri: (img: number) => string) => ({ imageIri: iri });

test('distinct image IRIs and run IDs: no match IRI can repeat', () => {
  assert.equal(
    matchIrisCanRepeat(
      model(20_000),
      namer((i) => `https://photos.example.org/img/${i}`),
    ),
    false,
  );
});

test('two images with one IRI, anywhere among many: match IRIs can repeat', () => {
  for (const [x, y] of [
    [0, 1],
    [3, 19_999],
    [12_345, 54],
  ])
    assert.equal(
      matchIrisCanRepeat(
        model(20_000),
        namer((i) => `https://photos.example.org/img/${i === y ? x : i}`),
      ),
      true,
      `${x} and ${y}`,
    );
});

test('an image IRI template without the image ID (one IRI per work) repeats IRIs', () => {
  assert.equal(
    matchIrisCanRepeat(
      model(100),
      namer((i) => `https://photos.example.org/work/${Math.floor(i / 3)}`),
    ),
    true,
  );
});

test('two runs with one ID: match IRIs can repeat', () => {
  assert.equal(
    matchIrisCanRepeat(
      model(10, ['r1', 'r1']),
      namer((i) => `https://photos.example.org/img/${i}`),
    ),
    true,
  );
});
