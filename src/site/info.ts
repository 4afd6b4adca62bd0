// A release's dataset.ttl and SHA256SUMS → what every page needs to know: title, version, licence, partners, files.
import { existsSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import type { Quad } from '@rdfjs/types';
import { streamRdfFile } from '../rdf/read.js';
import { datasetIdentity } from '../history/read.js';
import { RELEASE_FILES } from '../rdf/formats.js';
import { UserError } from '../errors.js';
import { iri } from '../namespaces.js';

export interface PartnerInfo {
  key: string;
  iri: string;
  name: string;
  homepage?: string;
  uriSpace?: string;
  /** Present only when the partner lets pages show its photographs (cx:imageTemplate, cx:imageViewTemplate). */
  images?: { iri: string; view: string };
}
export interface LinksetInfo {
  iri: string;
  title?: string;
  subjects?: string;
  objects?: string;
  predicate?: string;
  triples?: number;
}
export interface FileInfo {
  iri: string;
  url?: string;
  title?: string;
  mediaType?: string;
  byteSize?: number;
  sha256?: string;
  file?: string;
}
export interface SiteInfo {
  base: string;
  dataset: string;
  version: string;
  issued?: string;
  title: string;
  description?: string;
  licence?: string;
  previous?: string;
  publisher?: { iri: string; name?: string; homepage?: string };
  partners: Map<string, PartnerInfo>;
  linksets: LinksetInfo[];
  files: FileInfo[];
  /** Every quad of dataset.ttl (for citations). */
  quads: Quad[];
}

const P = (p: Parameters<typeof iri>[0], l: string) => iri(p, l);

/** Reads dataset.ttl (DCAT 3 §6.6, §6.8; VoID §4–§5) and SHA256SUMS of a release folder. */
export async function readSiteInfo(release: string): Promise<SiteInfo> {
  const file = path.join(release, RELEASE_FILES.dataset);
  if (!existsSync(file) || !existsSync(path.join(release, RELEASE_FILES.nquads)))
    throw new UserError({
      file: release,
      line: 0,
      field: 'release',
      message: `not a release folder (no ${RELEASE_FILES.dataset} or ${RELEASE_FILES.nquads})`,
      hint: 'name the folder written by concordat build',
    });
  const quads: Quad[] = [];
  await streamRdfFile(file, (q) => quads.push(q));
  const id = datasetIdentity(quads, file);
  const bySubject = new Map<string, Map<string, string[]>>();
  for (const q of quads) {
    let m = bySubject.get(q.subject.value);
    if (!m) bySubject.set(q.subject.value, (m = new Map()));
    let v = m.get(q.predicate.value);
    if (!v) m.set(q.predicate.value, (v = []));
    v.push(q.object.value);
  }
  const one = (s: string, p: string) => bySubject.get(s)?.get(p)?.[0];
  const typed = (t: string) =>
    [...bySubject]
      .filter(([, m]) => m.get(P('rdf', 'type'))?.includes(t))
      .map(([s]) => s)
      .sort();
  const uriSpace = one(id.dataset, P('void', 'uriSpace'));
  const base = uriSpace ?? id.dataset.replace(/dataset\/[^/]*$/, '');
  if (!base.endsWith('/'))
    throw new UserError({
      file,
      line: 0,
      field: 'base',
      message: `the release's base ${base} does not end in "/"`,
      hint: 'a site gives every IRI a document of its own; a base ending in "#" names everything inside one document',
    });
  const partners = new Map<string, PartnerInfo>();
  for (const s of typed(P('void', 'Dataset'))) {
    if (!s.startsWith(`${base}dataset/partner/`)) continue;
    const key = decodeURIComponent(s.slice(`${base}dataset/partner/`.length));
    partners.set(key, {
      key,
      iri: s,
      name: one(s, P('dcterms', 'title')) ?? key,
      homepage: one(s, P('foaf', 'homepage')),
      uriSpace: one(s, P('void', 'uriSpace')),
      images: imagesOf(one(s, P('cx', 'imageTemplate')), one(s, P('cx', 'imageViewTemplate'))),
    });
  }
  const subsets = bySubject.get(id.dataset)?.get(P('void', 'subset')) ?? [];
  const linksets = subsets.sort().map((s) => ({
    iri: s,
    title: one(s, P('dcterms', 'title')),
    subjects: one(s, P('void', 'subjectsTarget')),
    objects: one(s, P('void', 'objectsTarget')),
    predicate: one(s, P('void', 'linkPredicate')),
    triples: Number(one(s, P('void', 'triples')) ?? NaN),
  }));
  const sums = new Map<string, string>();
  const sumsFile = path.join(release, 'SHA256SUMS');
  if (existsSync(sumsFile))
    for (const line of readFileSync(sumsFile, 'utf8').split('\n')) {
      const m = /^([0-9a-f]{64}) [ *](.+)$/.exec(line);
      if (m) sums.set(m[2], m[1]);
    }
  const files = typed(P('dcat', 'Distribution')).map((s) => {
    const url = one(s, P('dcat', 'downloadURL'));
    const prefix = `${base}releases/${encodeURIComponent(id.version)}/`;
    const file = url?.startsWith(prefix) ? decodeURIComponent(url.slice(prefix.length)) : undefined;
    const onDisk = file && existsSync(path.join(release, file)) ? statSync(path.join(release, file)).size : undefined;
    const size = one(s, P('dcat', 'byteSize')) ?? onDisk;
    return {
      iri: s,
      url,
      title: one(s, P('dcterms', 'title')),
      mediaType: one(s, P('dcat', 'mediaType')),
      byteSize: size === undefined ? undefined : Number(size),
      file,
      sha256: file ? sums.get(file) : undefined,
    };
  });
  const pub = one(id.dataset, P('dcterms', 'publisher'));
  return {
    base,
    dataset: id.dataset,
    version: id.version,
    issued: id.issued,
    title: one(id.dataset, P('dcterms', 'title')) ?? 'Concordance',
    description: one(id.dataset, P('dcterms', 'description')),
    licence: one(id.dataset, P('dcterms', 'license')),
    previous: one(id.dataset, P('dcat', 'previousVersion')),
    publisher: pub
      ? { iri: pub, name: one(pub, P('foaf', 'name')), homepage: one(pub, P('foaf', 'homepage')) }
      : undefined,
    partners,
    linksets,
    files,
    quads,
  };
}

/** Both templates, or nothing: pages show a partner's photographs only when the release publishes both. */
const imagesOf = (iri: string | undefined, view: string | undefined) => (iri && view ? { iri, view } : undefined);
