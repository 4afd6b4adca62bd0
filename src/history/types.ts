// What the history stage compares: a release reduced to its links, clusters and identity, and the changes between two.
import type { ClusterRegistry } from '../cluster/types.js';
import type { Quad } from '@rdfjs/types';

export type ClaimStatus = 'confirmed' | 'proposed' | 'rejected';
export type ClaimKind = 'same' | 'part' | 'related';

/** One published link (cx:Link) as a release states it. */
export interface LinkState {
  iri: string;
  subject: string;
  object: string;
  kind: ClaimKind;
  status: ClaimStatus;
  /** Claim predicate IRI; absent for rejected links. */
  relation?: string;
  score?: number;
  /** cx:confidence as the release published it (absent in releases written before it was published). */
  confidence?: number;
  support: number;
  /** prov:wasGeneratedBy / prov:wasAttributedTo IRIs, sorted. */
  generatedBy: string[];
  attributedTo: string[];
}

/** A work as the release names it: partner key and `partnerKey:workId` (or the IRI when it cannot be decoded). */
export interface WorkName {
  partner: string;
  ref: string;
}

/**
 * An activity a link names as prov:wasGeneratedBy: a curator's review or a matcher run, as the release describes it.
 */
export type ActivityInfo =
  | { kind: 'review'; curator: string; curatorName?: string; date?: string; verdict?: string }
  | { kind: 'run'; id: string; software?: string; version?: string };

/**
 * Who made a claim's new state: the curator whose review generated it, the matcher runs behind it, or (for a claim
 * that is gone) the release that no longer holds it.
 */
export type MadeBy =
  | { kind: 'curator'; review: string; curator: string; name?: string; date?: string; verdict?: string }
  | { kind: 'runs'; runs: { iri: string; id: string; software?: string; version?: string }[] }
  | { kind: 'release'; version: string };

/** A release reduced to what the history stage compares (from its files, or from a build in progress). */
export interface ReleaseSnapshot {
  version: string;
  issued?: string;
  /** The dcat:Dataset IRI of the release. */
  dataset: string;
  /** Link IRI → state; current links only (earlier states `…/v/{version}` are left out). */
  links: Map<string, LinkState>;
  /** Work IRI → name, for every work a link names. */
  works: Map<string, WorkName>;
  /** Activity IRI → what the release says about it, for every activity a link names. */
  activities: Map<string, ActivityInfo>;
  clusters: ClusterRegistry;
}

/** What a previous release folder gives a new build beyond its snapshot. */
export interface PreviousRelease {
  folder: string;
  snapshot: ReleaseSnapshot;
  /**
   * Provenance-graph quads about runs, agents, plans, reviews and people, by subject IRI (to describe earlier states).
   */
  provenance: Map<string, Quad[]>;
  /** Retired cluster IRI → its recorded invalidation (activity IRI, time), carried with the tombstone. */
  clusterInvalidations: Map<string, { activity: string; time?: string }>;
}

/** One claim that differs between two releases. */
export interface ClaimChange {
  link: string;
  subject: string;
  object: string;
  /** Partner keys of the two works (one entry when both are of one partner). */
  partners: string[];
  before?: ClaimStateOf;
  after?: ClaimStateOf;
  /**
   * Who made the change: for a claim added or changed, whoever generated its new state; for one removed, the release.
   */
  by: MadeBy;
}

/** A claim's state in one release; `subject` is the `partnerKey:workId` of its subject work (the detail of a part). */
export interface ClaimStateOf {
  status: ClaimStatus;
  kind: ClaimKind;
  relation?: string;
  score?: number;
  subject: string;
}

export interface PartnerCounts {
  added: number;
  removed: number;
  status: number;
  kind: number;
}

/** Everything that changed from one release to the next (design: "changes against previous"). */
export interface Changes {
  from: { version: string; dataset: string; issued?: string };
  to: { version: string; dataset: string; issued?: string };
  claims: { added: ClaimChange[]; removed: ClaimChange[]; status: ClaimChange[]; kind: ClaimChange[] };
  clusters: {
    merged: { into: string; from: string[] }[];
    split: { from: string; into: string[] }[];
    new: string[];
    retired: { id: string; replacedBy: string[] }[];
  };
  /** Partner key → counts of claim changes touching its works; keys sorted. */
  partners: Record<string, PartnerCounts>;
}
