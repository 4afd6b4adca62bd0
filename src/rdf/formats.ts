// The output format table: format name → media type, media type IRI, file extension and n3 writer settings.
import { NS, iri, type Prefix } from '../namespaces.js';

/** Names of the RDF formats concordat writes. */
export type RdfFormat = 'turtle' | 'ntriples' | 'nquads';

/** One row of the format table. */
export interface FormatInfo {
  /** IANA media type (RDF 1.1 Turtle §A, N-Triples §A, N-Quads §A). */
  mediaType: string;
  /** The media type as an IRI, the way DCAT 3 §6.8 dcat:mediaType wants it. */
  mediaTypeIri: string;
  /** File extension including the dot. */
  extension: string;
  /** The `format` option n3's Writer understands. */
  n3Format: string;
  /** Whether the format carries named graphs; graph-less formats write every quad into the default graph. */
  graphs: boolean;
  /** Whether the format uses prefixed names. */
  prefixed: boolean;
}

function row(mediaType: string, extension: string, n3Format: string, graphs: boolean, prefixed: boolean): FormatInfo {
  return { mediaType, mediaTypeIri: iri('iana', mediaType), extension, n3Format, graphs, prefixed };
}

/** Format name → media type, extension and writer settings (RDF 1.1 Turtle, N-Triples and N-Quads Recommendations). */
export const FORMATS: Readonly<Record<RdfFormat, FormatInfo>> = {
  turtle: row('text/turtle', '.ttl', 'Turtle', false, true),
  ntriples: row('application/n-triples', '.nt', 'N-Triples', false, false),
  nquads: row('application/n-quads', '.nq', 'N-Quads', true, false),
};

/** Files of a release folder that later stages and commands read back (written by src/publish and src/report). */
export const RELEASE_FILES = { nquads: 'concordance.nq', dataset: 'dataset.ttl', clusters: 'clusters.csv' } as const;

/** The prefixes every Turtle file concordat writes declares, in this fixed order. */
export const PUBLISH_PREFIXES: readonly Prefix[] = [
  'rdf', 'rdfs', 'xsd', 'owl', 'skos', 'dcterms', 'prov', 'void', 'dcat', 'foaf', 'sh', 'cx',
];

/** Prefix name → namespace IRI for the given prefix names (defaults to {@link PUBLISH_PREFIXES}). */
export function prefixMap(names: readonly Prefix[] = PUBLISH_PREFIXES): Record<string, string> {
  const out: Record<string, string> = {};
  for (const name of names) out[name] = NS[name];
  return out;
}
