// The dataset description: VoID linksets per partner pair × predicate, DCAT 3 distributions per file, partner datasets.
import type { Quad } from '@rdfjs/types';
import { term, nn, str, typed, int, inGraph } from './terms.js';
import { COMPRESSIONS, DUMP_FORMATS, FORMATS } from './formats.js';
import type { Namer, LinksetCounts, Unit } from './index.js';
import type { Model } from '../model.js';
import { NS } from '../namespaces.js';

export interface DistributionFile {
  /** Path inside the release folder, e.g. `partners/harbour.ttl`. */
  file: string;
  mediaTypeIri: string;
  title: string;
  /** IANA media type IRI of the compression (DCAT 3 §6.8 dcat:compressFormat) when the file is compressed. */
  compressFormatIri?: string;
}

/**
 * The files of a release that the description lists as DCAT distributions, in a fixed order: each dump format, then
 * its compressed copy when the project asks for one (`release.compress`), whole and per partner.
 */
export function distributionFiles(model: Model): DistributionFile[] {
  const files: DistributionFile[] = [];
  const compress = model.project.release.compress === 'gzip' ? COMPRESSIONS.gzip : null;
  const dumps = DUMP_FORMATS.map((f) => [FORMATS[f].extension.slice(1), FORMATS[f].mediaTypeIri] as const);
  const add = (stem: string, title: (ext: string) => string) => {
    for (const [ext, media] of dumps) {
      files.push({ file: `${stem}.${ext}`, mediaTypeIri: media, title: title(ext) });
      if (compress)
        files.push({
          file: `${stem}.${ext}${compress.extension}`,
          mediaTypeIri: media,
          title: title(`${ext}${compress.extension}`),
          compressFormatIri: compress.mediaTypeIri,
        });
    }
  };
  add('concordance', (ext) => `Whole concordance (${ext})`);
  if (model.project.release.partnerDumps !== false)
    for (const p of model.project.partners) add(`partners/${p.key}`, (ext) => `Slice for ${p.name} (${ext})`);
  return files;
}

/**
 * VoID (W3C Note 2011: §4.6 void:triples, §5.1 linksets with two targets, §5.3 void:linkPredicate, §3.3 void:dataDump)
 * and DCAT 3 (§6.6 Dataset, §6.8 Distribution with dcat:mediaType as an IANA IRI, dcterms:license, dcat:version,
 * dcat:previousVersion; dcat:mediaType is the format inside a compressed file, dcat:compressFormat the compression).
 */
export function datasetUnit(model: Model, namer: Namer, counts: LinksetCounts, previousVersion?: string): Unit {
  const quads: Quad[] = [];
  const g = inGraph(namer.graph('dataset'), quads);
  const a = term('rdf', 'type');
  const p = model.project;
  const version = p.release.version;
  const D = nn(namer.iri('dataset', { version }));
  const license = nn(p.license);
  g(D, a, term('void', 'Dataset'));
  g(D, a, term('dcat', 'Dataset'));
  g(D, term('dcterms', 'title'), str(p.title));
  if (p.description) g(D, term('dcterms', 'description'), str(p.description));
  const pub = nn(namer.iri('publisher'));
  g(D, term('dcterms', 'publisher'), pub);
  g(pub, a, term('foaf', 'Organization'));
  g(pub, term('foaf', 'name'), str(p.publisher.name));
  if (p.publisher.homepage) g(pub, term('foaf', 'homepage'), nn(p.publisher.homepage));
  g(D, term('dcterms', 'license'), license);
  g(D, term('dcat', 'version'), str(version));
  if (p.release.issued) g(D, term('dcterms', 'issued'), typed(p.release.issued, 'date'));
  if (previousVersion) g(D, term('dcat', 'previousVersion'), nn(previousVersion));
  g(D, term('void', 'uriSpace'), str(p.base));
  for (const v of ['owl', 'skos', 'prov', 'dcterms', 'cx'] as const) g(D, term('void', 'vocabulary'), nn(NS[v]));

  p.partners.forEach((partner, i) => {
    const P = nn(namer.partnerDataset(i));
    g(P, a, term('void', 'Dataset'));
    g(P, term('dcterms', 'title'), str(partner.name));
    if (partner.homepage) g(P, term('foaf', 'homepage'), nn(partner.homepage));
    g(P, term('void', 'uriSpace'), str(partner.workIri.slice(0, partner.workIri.indexOf('{'))));
    // photographs pages may show: how an image IRI reads back into IDs, and the URL of the image (project: showImages)
    if (partner.showImages && partner.imageView) {
      g(P, term('cx', 'imageTemplate'), str(partner.imageIri));
      g(P, term('cx', 'imageViewTemplate'), str(partner.imageView));
    }
  });

  let total = 0;
  for (const key of [...counts.keys()].sort()) {
    const [sp, op, predicate] = key.split('|');
    const n = counts.get(key)!;
    total += n;
    const [ks, ko] = [p.partners[Number(sp)].key, p.partners[Number(op)].key];
    const local = predicate.replace(/^.*[#/]/, '');
    const L = nn(namer.iri('linkset', { version, partner: ks, other: ko, predicate: local }));
    g(D, term('void', 'subset'), L);
    g(L, a, ks === ko ? term('void', 'Dataset') : term('void', 'Linkset'));
    g(
      L,
      term('dcterms', 'title'),
      str(ks === ko ? `${local} links within ${ks}` : `${local} links from ${ks} to ${ko}`),
    );
    if (ks !== ko) {
      g(L, term('void', 'subjectsTarget'), nn(namer.partnerDataset(Number(sp))));
      g(L, term('void', 'objectsTarget'), nn(namer.partnerDataset(Number(op))));
      g(L, term('void', 'linkPredicate'), nn(predicate));
    }
    g(L, term('void', 'triples'), int(n));
  }
  g(D, term('cx', 'claimTriples'), int(total));

  for (const f of distributionFiles(model)) {
    const url = namer.iri('download', { version, file: f.file }).replace(/%2F/g, '/');
    const F = nn(namer.iri('distribution', { version, file: f.file.replace('/', '-') }));
    g(D, term('dcat', 'distribution'), F);
    if (f.file.startsWith('concordance.')) g(D, term('void', 'dataDump'), nn(url));
    g(F, a, term('dcat', 'Distribution'));
    g(F, term('dcterms', 'title'), str(f.title));
    g(F, term('dcat', 'downloadURL'), nn(url));
    g(F, term('dcat', 'mediaType'), nn(f.mediaTypeIri));
    if (f.compressFormatIri) g(F, term('dcat', 'compressFormat'), nn(f.compressFormatIri));
    g(F, term('dcterms', 'license'), license);
  }
  return { kind: 'dataset', id: 'dataset', quads, partners: 'all' };
}
