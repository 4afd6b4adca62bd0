// A citation as data: the claims a release holds about a work, pair or cluster, with their evidence chain and the
// release.
import type { Quad } from '@rdfjs/types';
import type { ClaimKind, ClaimStatus } from '../history/types.js';

export interface CitedWork {
  iri: string;
  /** `partnerKey:workId`, or the IRI when it cannot be decoded. */
  ref: string;
  partner: string;
  partnerName?: string;
  title?: string;
  date?: string;
  page?: string;
}

export interface CitedMatch {
  iri: string;
  source: string;
  target: string;
  score: number;
  overlap: number;
  run?: string;
}

export interface CitedRun {
  iri: string;
  id: string;
  software?: string;
  version?: string;
  started?: string;
  parameters: { name: string; value: string }[];
}

export interface CitedReview {
  iri: string;
  curator: string;
  curatorName?: string;
  date?: string;
  verdict?: string;
  note?: string;
}

export interface CitedRelease {
  dataset: string;
  title?: string;
  version: string;
  issued?: string;
  license?: string;
  publisher?: string;
}

/** One link (cx:Link) with everything behind it. */
export interface CitedClaim {
  link: string;
  subject: CitedWork;
  object: CitedWork;
  relation?: string;
  kind: ClaimKind;
  status: ClaimStatus;
  score?: number;
  /** cx:confidence: the link confidence from all the evidence (src/evidence/README.md), never above `score`. */
  confidence?: number;
  support: number;
  matches: CitedMatch[];
  runs: CitedRun[];
  review?: CitedReview;
}

/** Two records of a cited cluster whose catalogued dates disagree (cx:DateConflict). */
export interface CitedConflict {
  iri: string;
  severity?: string;
  a: CitedWork;
  b: CitedWork;
}

export interface Citation {
  /** What was asked for, as given. */
  query: string;
  target: { kind: 'work' | 'link' | 'cluster'; iri: string };
  release: CitedRelease;
  claims: CitedClaim[];
  /** For a cluster: its date conflicts (absent or empty for a work or a link). */
  conflicts?: CitedConflict[];
  /**
   * Text and Markdown without a line per image match (each claim's line gives their number and the claim's IRI, whose
   * document lists them) and with the runs and the release once for all claims (`cite --brief`; the site's pages).
   */
  brief?: boolean;
  /** The statements the citation rests on (links, matches, runs, reviews, works, dataset), for JSON-LD. */
  quads: Quad[];
}
