// Units of quads → JSON-LD 1.1 graph objects of framed nodes (a JSON-LD dataset), and the streamed .jsonld file around
// them.
import type { Quad } from '@rdfjs/types';
import type { Unit } from '../rdf/index.js';
import { JSONLD_CONTEXT } from '../rdf/jsonld.js';
import { iri } from '../namespaces.js';
import { ContextTables } from './jsonld-context.js';
import { frameQuads } from './jsonld-frame.js';

const context = JSONLD_CONTEXT;

/** Frame per unit kind (JSON-LD 1.1 Framing §2.3): top-level node types; the rest is embedded once where referenced. */
const FRAME_TYPES: Record<Unit['kind'], string[]> = {
  cluster: [iri('cx', 'Cluster'), iri('cx', 'Link')],
  link: [iri('cx', 'Link')],
  provenance: [iri('prov', 'Activity'), iri('prov', 'Agent'), iri('prov', 'SoftwareAgent'), iri('prov', 'Person')],
  dataset: [iri('void', 'Dataset'), iri('dcat', 'Distribution'), iri('foaf', 'Organization')],
};
const frameSets = Object.fromEntries(Object.entries(FRAME_TYPES).map(([k, v]) => [k, new Set(v)])) as Record<
  Unit['kind'],
  Set<string>
>;
const tables = new ContextTables(context);

/**
 * One unit → its top-level JSON-LD nodes, compacted against the shared context (JSON-LD 1.1 Framing §2.3.1
 * `@embed: @once`; graph names dropped: the unit's merged graph). Decimals come out as strings ("0.93") under
 * xsd:decimal coercion, never JSON numbers, which would turn into ill-typed "9.3E-1" on the way back; xsd:integer
 * values in canonical form that a double holds exactly come out as JSON numbers (see jsonld-frame.ts).
 */
export function unitNodesSync(unit: Unit): object[] {
  return frameQuads(unit.quads, frameSets[unit.kind], tables);
}

/**
 * One unit → its text in the JSON-LD dump, a JSON-LD 1.1 dataset (JSON-LD 1.1 §4.9 named graphs): per named graph the
 * unit writes into (in order of first appearance), a graph object `{"id": <graph IRI>, "@graph": [nodes]}` with that
 * graph's quads framed as in {@link unitNodesSync}; quads of the default graph as top-level nodes. The same graph IRI
 * recurs in every unit's graph objects: JSON-LD 1.1 API §7.2 node map generation merges them into one named graph.
 * Null when the unit has no quads.
 */
export function unitText(unit: Unit): string | null {
  const graphs = new Map<string, Quad[]>();
  for (const q of unit.quads) {
    const g = q.graph.termType === 'DefaultGraph' ? '' : q.graph.value;
    const list = graphs.get(g);
    if (list) list.push(q);
    else graphs.set(g, [q]);
  }
  const parts: string[] = [];
  for (const [g, quads] of graphs) {
    const body = frameQuads(quads, frameSets[unit.kind], tables)
      .map((n) => JSON.stringify(n))
      .join(',\n');
    parts.push(
      g === ''
        ? body
        : `{${JSON.stringify(tables.idKey)}:${JSON.stringify(tables.absolute(g))},"@graph":[\n${body}\n]}`,
    );
  }
  return parts.length ? parts.join(',\n') : null;
}

/** {@link unitNodesSync} behind the writer's asynchronous interface. */
export function unitNodes(unit: Unit): Promise<object[]> {
  return Promise.resolve(unitNodesSync(unit));
}

/** Writes `{"@context": …, "@graph": [` … `]}` around runs of nodes or graph objects, so files stream. */
export class JsonLdFile {
  private first = true;
  constructor(private readonly write: (s: string) => void) {
    write(JsonLdFile.head);
  }
  /** The text before the first node: the shared context and the opening of `@graph`. */
  static readonly head = `{\n"@context": ${JSON.stringify(context)},\n"@graph": [\n`;
  /** The text after the last node. */
  static readonly tail = '\n]}\n';
  /** Nodes as one run of text (`,\n` between nodes), to be placed with `separator()` before it. */
  static text(nodes: object[]): string {
    return nodes.map((n) => JSON.stringify(n)).join(',\n');
  }
  /** What must precede the next run of nodes in this file ('' for the first), and records that a run follows. */
  separator(): string {
    const s = this.first ? '' : ',\n';
    this.first = false;
    return s;
  }
  add(nodes: object[]): void {
    if (nodes.length === 0) return;
    this.write(this.separator() + JsonLdFile.text(nodes));
  }
  close(): void {
    this.write(JsonLdFile.tail);
  }
}
