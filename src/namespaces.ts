// Every IRI prefix the code uses, declared once.

export const NS = {
  rdf: 'http://www.w3.org/1999/02/22-rdf-syntax-ns#',
  rdfs: 'http://www.w3.org/2000/01/rdf-schema#',
  xsd: 'http://www.w3.org/2001/XMLSchema#',
  owl: 'http://www.w3.org/2002/07/owl#',
  skos: 'http://www.w3.org/2004/02/skos/core#',
  dcterms: 'http://purl.org/dc/terms/',
  prov: 'http://www.w3.org/ns/prov#',
  void: 'http://rdfs.org/ns/void#',
  dcat: 'http://www.w3.org/ns/dcat#',
  foaf: 'http://xmlns.com/foaf/0.1/',
  sh: 'http://www.w3.org/ns/shacl#',
  cx: 'https://w3id.org/concordat/vocab#',
  mf: 'http://www.w3.org/2001/sw/DataAccess/tests/test-manifest#',
  sht: 'http://www.w3.org/ns/shacl-test#',
  rdft: 'http://www.w3.org/ns/rdftest#',
  iana: 'https://www.iana.org/assignments/media-types/',
} as const;

export type Prefix = keyof typeof NS;

/** `iri('owl', 'sameAs')` → `http://www.w3.org/2002/07/owl#sameAs`. */
export function iri(prefix: Prefix, local: string): string {
  return NS[prefix] + local;
}
