// Units of quads → JSON-LD 1.1 nodes, framed one document per cluster (jsonld.js behind this one adapter).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import jsonld from 'jsonld';
import type { Quad } from '@rdfjs/types';
import type { Unit } from '../rdf/index.js';

export const CONTEXT_FILE = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', '..', 'vocab-map', 'context.jsonld');
const context = JSON.parse(readFileSync(CONTEXT_FILE, 'utf8'))['@context'];

/** Never fetches: every context is inline (JSON-LD 1.1 API §9.4 documentLoader). */
const documentLoader = async (url: string) => {
  throw new Error(`concordat does not fetch remote JSON-LD documents (${url})`);
};

const CX = 'https://w3id.org/concordat/vocab#';
const PROV = 'http://www.w3.org/ns/prov#';
/** Frame per unit kind (JSON-LD 1.1 Framing §2.3): top-level node types; the rest is embedded once where referenced. */
const FRAME_TYPES: Record<Unit['kind'], string[]> = {
  cluster: [CX + 'Cluster', CX + 'Link'],
  link: [CX + 'Link'],
  provenance: [PROV + 'Activity', PROV + 'Agent', PROV + 'SoftwareAgent', PROV + 'Person'],
  dataset: ['http://rdfs.org/ns/void#Dataset', 'http://www.w3.org/ns/dcat#Distribution', 'http://xmlns.com/foaf/0.1/Organization'],
};

/** Quads as jsonld.js's internal dataset objects (graph names dropped: the JSON-LD dump, like Turtle, is the merged graph). */
function toDataset(quads: Quad[]) {
  return quads.map((q) => ({
    subject: { termType: q.subject.termType, value: q.subject.value },
    predicate: { termType: 'NamedNode', value: q.predicate.value },
    object: q.object.termType === 'Literal'
      ? { termType: 'Literal', value: q.object.value, datatype: { termType: 'NamedNode', value: q.object.datatype.value }, ...(q.object.language ? { language: q.object.language } : {}) }
      : { termType: q.object.termType, value: q.object.value },
    graph: { termType: 'DefaultGraph', value: '' },
  }));
}

/**
 * One unit → its top-level JSON-LD nodes, compacted against the shared context. Decimals come out as strings
 * ("0.93") under xsd:decimal coercion, never JSON numbers, which would turn into ill-typed "9.3E-1" on the way back.
 */
export async function unitNodes(unit: Unit): Promise<object[]> {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const expanded = await jsonld.fromRDF(toDataset(unit.quads) as any, { useNativeTypes: false });
  const types = FRAME_TYPES[unit.kind];
  const present = new Set<string>();
  for (const q of unit.quads) if (q.predicate.value.endsWith('#type')) present.add(q.object.value);
  const framed = await jsonld.frame(expanded, { '@context': context, '@type': types.filter((t) => present.has(t)) }, {
    documentLoader,
    embed: '@once',
    omitGraph: false,
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
  } as any);
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  return ((framed as any)['@graph'] ?? []) as object[];
}

/** Writes `{"@context": …, "@graph": [` … `]}` around node lists, one node per line, so files stream. */
export class JsonLdFile {
  private first = true;
  constructor(private readonly write: (s: string) => void) {
    write(`{\n"@context": ${JSON.stringify(context)},\n"@graph": [\n`);
  }
  add(nodes: object[]): void {
    for (const n of nodes) {
      this.write((this.first ? '' : ',\n') + JSON.stringify(n));
      this.first = false;
    }
  }
  close(): void {
    this.write('\n]}\n');
  }
}

export { context as JSONLD_CONTEXT };
