// Terms the history stage reads and writes, and work IRIs → `partnerKey:workId` names.
import { iri } from '../namespaces.js';
import type { ClaimKind, ClaimStatus } from './types.js';

export const P = {
  type: iri('rdf', 'type'),
  Link: iri('cx', 'Link'),
  Cluster: iri('cx', 'Cluster'),
  ImpliedPair: iri('cx', 'ImpliedPair'),
  DateConflict: iri('cx', 'DateConflict'),
  Dataset: iri('dcat', 'Dataset'),
  subjectWork: iri('cx', 'subjectWork'),
  objectWork: iri('cx', 'objectWork'),
  relation: iri('cx', 'relation'),
  kind: iri('cx', 'kind'),
  status: iri('cx', 'status'),
  score: iri('cx', 'score'),
  confidence: iri('cx', 'confidence'),
  support: iri('cx', 'support'),
  partner: iri('cx', 'partner'),
  inDataset: iri('void', 'inDataset'),
  uriSpace: iri('void', 'uriSpace'),
  version: iri('dcat', 'version'),
  issued: iri('dcterms', 'issued'),
  isVersionOf: iri('dcterms', 'isVersionOf'),
  generatedBy: iri('prov', 'wasGeneratedBy'),
  attributedTo: iri('prov', 'wasAttributedTo'),
  invalidatedBy: iri('prov', 'wasInvalidatedBy'),
  invalidatedAt: iri('prov', 'invalidatedAtTime'),
  CuratorReview: iri('cx', 'CuratorReview'),
  MatchRun: iri('cx', 'MatchRun'),
  associatedWith: iri('prov', 'wasAssociatedWith'),
  endedAt: iri('prov', 'endedAtTime'),
  date: iri('dcterms', 'date'),
  verdict: iri('cx', 'verdict'),
  label: iri('rdfs', 'label'),
  versionInfo: iri('owl', 'versionInfo'),
} as const;

/** cx:Same / cx:Part / cx:Related → kind; cx:Confirmed / cx:Proposed / cx:Rejected → status. */
export const KIND_OF: Record<string, ClaimKind> = {
  [iri('cx', 'Same')]: 'same',
  [iri('cx', 'Part')]: 'part',
  [iri('cx', 'Related')]: 'related',
};
export const STATUS_OF: Record<string, ClaimStatus> = {
  [iri('cx', 'Confirmed')]: 'confirmed',
  [iri('cx', 'Proposed')]: 'proposed',
  [iri('cx', 'Rejected')]: 'rejected',
};

/**
 * `partnerKey:workId` for a work IRI made from a level-1 template `…{work}` (RFC 6570 §3.2.2: the ID is
 * percent-encoded after the partner's void:uriSpace); the IRI itself when it does not decode that way.
 */
export function refOfWorkIri(workIri: string, partner: string, uriSpace: string | undefined): string {
  if (!uriSpace || !workIri.startsWith(uriSpace)) return workIri;
  try {
    return `${partner}:${decodeURIComponent(workIri.slice(uriSpace.length))}`;
  } catch {
    return workIri;
  }
}

/** The earlier state of a link kept by a later release: `{link IRI}/v/{version}`. */
export const earlierStateIri = (link: string, version: string) => `${link}/v/${encodeURIComponent(version)}`;
