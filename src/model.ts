// The typed model the load stage produces and every later stage reads: partners, works, images, matches, decisions.
import type { Problem } from './errors.js';

export type CenturyConvention = 'ordinal' | 'iso' | 'unknown';
/** Languages whose date phrases concordat reads (ISO 639-1 codes). */
export type DateLanguage = 'en' | 'de' | 'fr' | 'it' | 'es' | 'nl';
export type Verdict = 'same' | 'part' | 'related' | 'distinct';

export interface ColumnMap {
  work: string;
  image: string;
  title?: string;
  date?: string;
  width?: string;
  height?: string;
  /** The image's role (recto, verso, chart… in the partner's words, read through `catalogue.roles`). */
  role?: string;
}

/**
 * What a photograph shows, in the project's own words. `artwork` and `detail` show the work; the others are images
 * archives scan beside it (mount backs, colour charts, stamps, blank frames) and never count as evidence of a same
 * work or part link. 0 in Images.role = not recorded.
 */
export const IMAGE_ROLES = ['artwork', 'detail', 'verso', 'mount', 'chart', 'stamp', 'blank', 'other'] as const;
export type ImageRole = (typeof IMAGE_ROLES)[number];
/** Roles whose images show something other than the artwork: their matches stay evidence but link nothing. */
export const NON_ARTWORK_ROLES: ReadonlySet<ImageRole> = new Set([
  'verso',
  'mount',
  'chart',
  'stamp',
  'blank',
  'other',
]);

export interface PartnerConfig {
  key: string;
  name: string;
  homepage?: string;
  workIri: string;
  imageIri: string;
  recordPage?: string;
  /**
   * Template (`{image}`, `{work}`) of a URL where a person can view the photograph (a viewer page or image service).
   */
  imageView?: string;
  centuryConvention: CenturyConvention;
  /** Language of the partner's date phrases; absent: every language is tried (see dates/languages.ts). */
  language?: DateLanguage;
  catalogue: { file: string; delimiter: string; columns: ColumnMap; roles?: Record<string, ImageRole> };
}

/** A number as written in the project file, so it is published with neither its precision nor its type lost. */
export interface ParameterNumber {
  number: string;
}

export interface RunConfig {
  id: string;
  software: string;
  version: string;
  started: string;
  /** Parameters as given; a number keeps its text from the project file (RFC 8259 §6), e.g. `{ number: "1e-7" }`. */
  parameters: Record<string, string | ParameterNumber | boolean | null>;
}

export interface Policy {
  proposeAt: number;
  autoConfirmAt: number | null;
  partOverlapBelow: number;
  minOverlap: number;
  /**
   * An image matching more distinct works than this is indiscriminate (null: 2 × partners, the most records one
   * artwork plausibly has; see src/evidence/README.md).
   */
  indiscriminateAbove: number | null;
  /** Most rows review-queue.csv lists, most useful first; the rest are counted in the report. */
  reviewLimit: number;
  /**
   * Years two dates of one artwork may lie apart before they are listed as a date conflict (default DATE_TOLERANCE).
   */
  dateTolerance?: number;
}

/** A decisions file as the project names it: `delimiter` absent = detected from the header line. */
export interface DecisionFile {
  file: string;
  delimiter?: string;
}

/** The project file after validation, with every path resolved against the project file's folder. */
export interface ProjectConfig {
  title: string;
  base: string;
  license: string;
  publisher: { name: string; homepage?: string };
  partners: PartnerConfig[];
  evidence: { file: string; run?: RunConfig }[];
  decisions: DecisionFile[];
  gold?: string;
  policy: Policy;
  previous?: string;
  vocabMap?: string;
  /** `partnerDumps`: write partners/<key>.* slices (absent = true). */
  /** `csv`: how review-queue.csv, conflicts.csv and clusters.csv are written (absent = spreadsheet: BOM, CRLF). */
  release: {
    version: string;
    issued?: string;
    partnerDumps?: boolean;
    csv?: 'spreadsheet' | 'plain';
    compress?: 'none' | 'gzip';
  };
  description?: string;
}

/** One catalogue record (a work) of one partner. `title`/`date` as catalogued (first row wins). */
export interface Work {
  partner: number;
  id: string;
  title: string;
  date: string;
  /** 1-based line of the first catalogue row naming this work. */
  line: number;
  imageCount: number;
}

/** Columnar image table: index = image number. */
export interface Images {
  count: number;
  work: Int32Array;
  id: string[];
  line: Int32Array;
  /** 1 + index into IMAGE_ROLES; 0 when the catalogue records no role. */
  role: Uint8Array;
  /** Size in pixels as catalogued (mapped `width` and `height` columns); 0 when not recorded. */
  width: Int32Array;
  height: Int32Array;
}

/** Columnar match table: one entry per evidence row (image pair), in input order. */
export interface Matches {
  count: number;
  a: Int32Array;
  b: Int32Array;
  score: Float64Array;
  overlap: Float64Array;
  run: Int32Array;
  /** index into Model.evidenceFiles */
  file: Int32Array;
  line: Int32Array;
}

export interface Decision {
  a: number;
  b: number;
  verdict: Verdict;
  curator: string;
  date: string;
  note: string;
  file: string;
  line: number;
}

export interface GoldPair {
  a: number;
  b: number;
  line: number;
}

export interface Model {
  projectFile: string;
  project: ProjectConfig;
  works: Work[];
  /** per partner: catalogue work ID → work number */
  workIndex: Map<string, number>[];
  /** (The per-partner image ID → image number maps are the load stage's own: nothing later looks images up by ID.) */
  images: Images;
  matches: Matches;
  runs: RunConfig[];
  evidenceFiles: string[];
  decisions: Decision[];
  gold: GoldPair[];
  warnings: Problem[];
}

/** `partnerKey:workId` of a work: the reference form used in decisions, gold and review files. */
export function workRef(model: Pick<Model, 'project' | 'works'>, w: number): string {
  const work = model.works[w];
  return `${model.project.partners[work.partner].key}:${work.id}`;
}

/**
 * Ranks `works` by reference (`partnerKey:workId`, code-point order: the order links and clusters are sorted by) into
 * `rank[w]` (0-based among `works`); other entries stay -1. Each reference string is built once; sorts then compare
 * integers.
 */
export function refRank(model: Pick<Model, 'project' | 'works'>, works: ArrayLike<number>): Int32Array {
  const rank = new Int32Array(model.works.length).fill(-1);
  const refs = Array.from(works, (w) => workRef(model, w));
  const order = Array.from(refs.keys()).sort((x, y) => (refs[x] < refs[y] ? -1 : refs[x] > refs[y] ? 1 : 0));
  order.forEach((i, r) => (rank[works[i]] = r));
  return rank;
}

/** `workRef` memoised per work, for stages that format the same work many times (sorting, reports). */
export function cachedWorkRef(model: Pick<Model, 'project' | 'works'>): (w: number) => string {
  const refs = new Map<number, string>();
  return (w) => {
    let r = refs.get(w);
    if (r === undefined) refs.set(w, (r = workRef(model, w)));
    return r;
  };
}
