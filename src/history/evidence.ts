// A previous release's concordance.nq + some link IRIs → the image matches behind those links, with their quads.
import path from 'node:path';
import type { Quad } from '@rdfjs/types';
import { streamRdfFile } from '../rdf/read.js';
import { iri } from '../namespaces.js';
import { RELEASE_FILES } from '../rdf/formats.js';

const DERIVED = iri('prov', 'wasDerivedFrom');

export interface LinkEvidence {
  /** Link IRI → its image match IRIs, in file order. */
  matches: Map<string, string[]>;
  /** Image match IRI → its quads. */
  quads: Map<string, Quad[]>;
}

/**
 * Reads the image matches (cx:ImageMatch) that `links` were derived from in the release in `folder`: one pass for the
 * prov:wasDerivedFrom triples, one for the matches' own quads, so memory holds only what the links need.
 */
export async function readLinkEvidence(folder: string, links: Set<string>): Promise<LinkEvidence> {
  const matches = new Map<string, string[]>();
  const quads = new Map<string, Quad[]>();
  if (links.size === 0) return { matches, quads };
  const file = path.join(folder, RELEASE_FILES.nquads);
  await streamRdfFile(file, (q) => {
    if (q.predicate.value !== DERIVED || !links.has(q.subject.value)) return;
    const list = matches.get(q.subject.value);
    if (list) list.push(q.object.value);
    else matches.set(q.subject.value, [q.object.value]);
  });
  const wanted = new Set([...matches.values()].flat());
  if (wanted.size === 0) return { matches, quads };
  await streamRdfFile(file, (q) => {
    if (!wanted.has(q.subject.value) || !q.graph.value.endsWith('graph/evidence')) return;
    const list = quads.get(q.subject.value);
    if (list) list.push(q);
    else quads.set(q.subject.value, [q]);
  });
  return { matches, quads };
}
