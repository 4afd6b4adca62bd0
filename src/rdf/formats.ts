// The output format table: format → label, media type, extension, writer, graphs, and the compressions dumps can take.
import { NS, iri, type Prefix } from '../namespaces.js';

/** Names of the RDF formats concordat reads or writes. */
export type FormatName = 'turtle' | 'ntriples' | 'nquads' | 'trig' | 'jsonld';

/**
 * How a format's text is made: the line encoders of src/rdf/text.ts (`turtle`, `nquads`), the JSON-LD node framer of
 * src/publish (`jsonld`).
 */
export type WriterKind = 'turtle' | 'nquads' | 'jsonld';

/** One row of the format table. */
export interface FormatInfo {
  /** Name used in messages, e.g. `Turtle`. */
  label: string;
  /** IANA media type (RDF 1.1 Turtle §A, N-Triples §A, N-Quads §A, TriG §A; JSON-LD 1.1 §C). */
  mediaType: string;
  /** The media type as an IRI, the way DCAT 3 §6.8 dcat:mediaType wants it. */
  mediaTypeIri: string;
  /** File extension including the dot. */
  extension: string;
  /** Which parser reads it: n3 (given the media type as its format) or jsonld.js. */
  reader: 'n3' | 'jsonld';
  /** Which encoder writes it; null: read only. */
  writer: WriterKind | null;
  /** Whether the format carries named graphs; graph-less formats write every quad into the default graph. */
  graphs: boolean;
  /** Whether the format uses prefixed names. */
  prefixed: boolean;
}

function row(
  label: string,
  mediaType: string,
  extension: string,
  reader: FormatInfo['reader'],
  writer: WriterKind | null,
  graphs: boolean,
  prefixed: boolean,
): FormatInfo {
  return { label, mediaType, mediaTypeIri: iri('iana', mediaType), extension, reader, writer, graphs, prefixed };
}

/**
 * Format name → label, media type, extension, reader, writer (RDF 1.1 Turtle, N-Triples, N-Quads, TriG; JSON-LD 1.1).
 */
export const FORMATS: Readonly<Record<FormatName, FormatInfo>> = {
  turtle: row('Turtle', 'text/turtle', '.ttl', 'n3', 'turtle', false, true),
  ntriples: row('N-Triples', 'application/n-triples', '.nt', 'n3', 'nquads', false, false),
  nquads: row('N-Quads', 'application/n-quads', '.nq', 'n3', 'nquads', true, false),
  trig: row('TriG', 'application/trig', '.trig', 'n3', null, true, true),
  jsonld: row('JSON-LD', 'application/ld+json', '.jsonld', 'jsonld', 'jsonld', true, false),
};

/**
 * Compressions a release's dumps can also be written in: file extension and IANA media type (RFC 6713
 * application/gzip).
 */
export type Compression = 'gzip';
export interface CompressionInfo {
  extension: string;
  mediaType: string;
  /** The media type as an IRI, for DCAT 3 dcat:compressFormat (range dcterms:MediaType). */
  mediaTypeIri: string;
}
export const COMPRESSIONS: Readonly<Record<Compression, CompressionInfo>> = {
  gzip: { extension: '.gz', mediaType: 'application/gzip', mediaTypeIri: iri('iana', 'application/gzip') },
};

/** Formats written by the quad stream writer of src/rdf/serialize.ts. */
export type RdfFormat = 'turtle' | 'ntriples' | 'nquads';

/** The dumps of a release, in this order: `concordance.<ext>` and `partners/<key>.<ext>` (design, "Outputs"). */
export const DUMP_FORMATS: readonly FormatName[] = ['turtle', 'nquads', 'jsonld'];

/** Files of a release folder that later stages and commands read back (written by src/publish and src/report). */
export const RELEASE_FILES = { nquads: 'concordance.nq', dataset: 'dataset.ttl', clusters: 'clusters.csv' } as const;

/** The prefixes every Turtle file concordat writes declares, in this fixed order. */
export const PUBLISH_PREFIXES: readonly Prefix[] = [
  'rdf',
  'rdfs',
  'xsd',
  'owl',
  'skos',
  'dcterms',
  'prov',
  'void',
  'dcat',
  'foaf',
  'sh',
  'cx',
];

/** Prefix name → namespace IRI for the given prefix names (defaults to {@link PUBLISH_PREFIXES}). */
export function prefixMap(names: readonly Prefix[] = PUBLISH_PREFIXES): Record<string, string> {
  const out: Record<string, string> = {};
  for (const name of names) out[name] = NS[name];
  return out;
}
