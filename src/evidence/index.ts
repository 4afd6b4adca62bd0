// Evidence stage: image matches → per-image statistics and the images whose matches cannot carry a link (step 1b).
import { IMAGE_ROLES, NON_ARTWORK_ROLES, type Model, type Policy } from '../model.js';
import {
  corroboratedWorks,
  corroboration,
  distinctCounts,
  imageRows,
  proposing,
  triangleSupport,
  workPairs,
} from './stats.js';
import { IMAGE_VERDICTS, type ImageVerdict, type WeighedEvidence } from './types.js';

export { IMAGE_VERDICTS, type ImageStats, type ImageVerdict, type WeighedEvidence } from './types.js';

/**
 * One artwork has about one record per archive, so no genuine photograph matches more than about twice as many works
 * as there are partners (common practice, no source; the same bound flags oversized clusters).
 */
export const HUB_PER_PARTNER = 2;
/** Suspects are images at least this many (scaled) median absolute deviations above the median k-occurrence. */
export const SUSPECT_MADS = 2;
/**
 * No image matching fewer works than this is a suspect: the triangle test over three works (three pairs) says too
 * little.
 */
export const SUSPECT_MIN = 4;

const V = (v: ImageVerdict) => IMAGE_VERDICTS.indexOf(v);

/**
 * Weighs the evidence (design, pipeline step 1b; src/evidence/README.md) over the rows that could propose a link
 * (score ≥ proposeAt, overlap ≥ minOverlap). An image is not discriminating when
 * 1. its catalogue role is not the artwork (verso, mount, chart, stamp, blank, other), or
 * 2. it is a **hub**: its k-occurrence (distinct works it matched) exceeds `policy.indiscriminateAbove` (default
 *    HUB_PER_PARTNER × partners). Hubness: Radovanović, Nanopoulos & Ivanović, "Hubs in space: popular nearest
 *    neighbors in high-dimensional data", JMLR 11 (2010), where points that appear among the neighbours of very many
 *    others are shown to be uninformative for similarity; or
 * 3. it is a **suspect** (k-occurrence ≥ max(SUSPECT_MIN, median + SUSPECT_MADS × 1.4826 × MAD): an outlier by
 *    the median absolute deviation, which the outliers themselves cannot inflate as they inflate a mean and standard
 *    deviation (Hampel's identifier; Rousseeuw & Croux, "Alternatives to the median absolute deviation", JASA 88,
 *    1993); the hub rule of the hubness literature is the same idea with μ + 2σ) whose matches nothing else confirms:
 *    a. fewer than half of the pairs of works it matched match each other (triangle consistency: the records of one
 *       artwork match each other, the works a mount back matched do not) and fewer than half of its matched works
 *       share a row with its own work through two other photographs (neither a role-excluded image nor a hub); or
 *    b. the other photographs disagree: of the matched works where both records have other usable photographs (at
 *       least SUSPECT_MIN such), fewer than a quarter share a row through them. A small set of look-alike scans that
 *       all match each other passes the triangle test, but the paintings beside them never match.
 * Matches of such images stay evidence (the link stage keeps and publishes them) but count for nothing in a link's
 * confidence. Linear in the evidence rows plus a sort of each image's rows: no pair list of any image's works.
 */
export function weighEvidence(model: Model, policy: Policy = model.project.policy): WeighedEvidence {
  const { images, matches } = model;
  const n = images.count;
  const use = proposing(model, policy.proposeAt, policy.minOverlap);
  const ir = imageRows(model, use);
  const { works, partners } = distinctCounts(model, ir);
  const hubAbove = policy.indiscriminateAbove ?? HUB_PER_PARTNER * model.project.partners.length;
  const { median, mad } = robustSpread(works);
  const suspectFrom = Math.max(SUSPECT_MIN, Math.ceil(median + SUSPECT_MADS * 1.4826 * mad - 1e-9));

  const verdict = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const role = images.role[i];
    if (role > 0 && NON_ARTWORK_ROLES.has(IMAGE_ROLES[role - 1])) verdict[i] = V('role');
    else if (works[i] > hubAbove) verdict[i] = V('hub');
  }
  const corroborated = new Int32Array(n).fill(-1);
  const triangles = new Float64Array(n).fill(-1);
  let suspects = 0;
  for (let i = 0; i < n; i++) if (verdict[i] === 0 && works[i] >= suspectFrom) suspects++;
  if (suspects > 0) {
    const corr = corroboration(model, verdict, use);
    const pairs = workPairs(model, verdict, use);
    const usable = new Int32Array(model.works.length);
    for (let i = 0; i < n; i++) if (verdict[i] === 0) usable[images.work[i]]++;
    for (let i = 0; i < n; i++) {
      if (verdict[i] !== 0 || works[i] < suspectFrom) continue;
      const c = corroboratedWorks(model, ir, corr, usable, i);
      corroborated[i] = c.corroborated;
      triangles[i] = triangleSupport(ir, pairs, i);
      const noTriangles = 2 * triangles[i] < 1 && 2 * c.corroborated < works[i];
      const noOtherPhotos = c.opportunities >= SUSPECT_MIN && 4 * c.corroborated < c.opportunities;
      if (noTriangles || noOtherPhotos) verdict[i] = V('uncorroborated');
    }
  }

  const setAside = new Uint8Array(matches.count);
  let rowsSetAside = 0;
  for (let r = 0; r < matches.count; r++)
    if (verdict[matches.a[r]] || verdict[matches.b[r]]) {
      setAside[r] = 1;
      rowsSetAside++;
    }
  const flagged: number[] = [];
  for (let i = 0; i < n; i++) if (verdict[i] && ir.offset[i + 1] > ir.offset[i]) flagged.push(i);
  flagged.sort((x, y) => works[y] - works[x] || x - y);
  return {
    stats: {
      matchedImages: Int32Array.from({ length: n }, (_, i) => ir.offset[i + 1] - ir.offset[i]),
      works,
      partners,
      corroborated,
      triangles,
    },
    verdict,
    setAside,
    hubAbove,
    suspectFrom,
    median,
    mad,
    indiscriminate: Int32Array.from(flagged),
    rowsSetAside,
  };
}

/** Median and median absolute deviation of the k-occurrences of images with at least one match (counting sort). */
function robustSpread(works: Int32Array): { median: number; mad: number } {
  const values = works.filter((x) => x > 0).sort();
  if (values.length === 0) return { median: 0, mad: 0 };
  const mid = (v: ArrayLike<number>) =>
    v.length % 2 ? v[(v.length - 1) / 2] : (v[v.length / 2 - 1] + v[v.length / 2]) / 2;
  const median = mid(values);
  const dev = Float64Array.from(values, (x) => Math.abs(x - median)).sort();
  return { median, mad: mid(dev) };
}
