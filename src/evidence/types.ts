// What the evidence stage finds: per-image statistics and which images cannot carry a link on their own.

/** Why an image's matches cannot carry a link on their own (0 in WeighedEvidence.verdict: they can). */
export const IMAGE_VERDICTS = ['discriminating', 'hub', 'uncorroborated', 'role'] as const;
export type ImageVerdict = (typeof IMAGE_VERDICTS)[number];

/** Per-image statistics as columns (index = image number), over the rows that could propose (score ≥ proposeAt). */
export interface ImageStats {
  /** Evidence rows naming the image (matched images, repeats included). */
  matchedImages: Int32Array;
  /** Distinct other works matched: the image's k-occurrence in the match graph. */
  works: Int32Array;
  /** Distinct partners of those works. */
  partners: Int32Array;
  /**
   * Matched works whose pair with the image's own work is also supported by a row through other photographs (the
   * agreement of the other images); computed for suspects only, -1 elsewhere.
   */
  corroborated: Int32Array;
  /** Share of pairs of its matched works that match each other (triangle support); suspects only, -1 elsewhere. */
  triangles: Float64Array;
}

/** The evidence stage's output, read by the link stage and the report. */
export interface WeighedEvidence {
  stats: ImageStats;
  /** Per image: index into IMAGE_VERDICTS. */
  verdict: Uint8Array;
  /** Per evidence row (Model.matches): 1 when an image of the row is not discriminating. */
  setAside: Uint8Array;
  /** An image matching more distinct works than this is a hub. */
  hubAbove: number;
  /** An image matching at least this many works is a suspect, kept only when most of them are corroborated. */
  suspectFrom: number;
  /** Median and median absolute deviation of `works` over images with at least one match. */
  median: number;
  mad: number;
  /** Images that are not discriminating, most works matched first (then image number). */
  indiscriminate: Int32Array;
  /** Rows set aside. */
  rowsSetAside: number;
}
