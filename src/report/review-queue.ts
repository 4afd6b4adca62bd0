// The review queue → review-queue.csv: decisions-file columns to fill in, then one table of context columns.
import type { Model } from '../model.js';
import type { Link, LinkSet } from '../link/types.js';
import { matchesOf } from '../link/index.js';
import { isPublished, type Namer } from '../rdf/index.js';
import { REVIEW_REASONS, type Analysis } from '../analyse/index.js';
import { compileTemplate } from '../io/template.js';
import { CsvFile, type CsvForm } from '../io/csv-write.js';
import { num, type WorkContext } from './context.js';

/**
 * Decisions-file columns (design: "Decisions file") first, so a filled-in queue loads as one. The decision's date is
 * `decided_on`, so that nobody takes it for an artwork's dating (`dating_a`, `dating_b`).
 */
export const DECISION_COLUMNS = ['work_a', 'work_b', 'verdict', 'curator', 'decided_on', 'note'] as const;

/** The context column names, in file order (for readers and tests). */
export const REVIEW_CONTEXT = [
  'reason',
  'link',
  'kind',
  'status',
  'score',
  'confidence',
  'support',
  'images_a',
  'images_b',
  'views_a',
  'views_b',
  'pair_scores',
  'pair_overlaps',
  'title_a',
  'title_b',
  'dating_a',
  'dating_b',
  'page_a',
  'page_b',
] as const;
export const REVIEW_HEADER = [...DECISION_COLUMNS, ...REVIEW_CONTEXT] as const;
type ReviewContextColumn = (typeof REVIEW_CONTEXT)[number];

/**
 * Image pairs listed per row (best score first); `support` gives how many there are in all (common practice, no
 * source).
 */
export const PAIRS_LISTED = 10;

/** One queue row as the context columns see it. */
interface QueueRow {
  a: number;
  b: number;
  reason: string;
  link?: Link;
  /** The listed image pairs, oriented so that `imageA` belongs to work_a. */
  pairs: { imageA: number; imageB: number; score: number; overlap: number }[];
}

/** Cells of one column over several image pairs: one line per pair, in the same order in every such column. */
const lines = (xs: string[]) => xs.join('\n');

/** Context column → its cell (a table: adding a column is one name in REVIEW_CONTEXT and one entry here). */
function contextCells(
  model: Model,
  ctx: WorkContext,
  namer: Namer,
): Record<ReviewContextColumn, (r: QueueRow) => string> {
  const partners = model.project.partners;
  const views = partners.map((p) => (p.imageView ? compileImageTemplate(p.imageView) : undefined));
  const view = (img: number) => {
    const w = model.images.work[img];
    return views[model.works[w].partner]?.(model.images.id[img], model.works[w].id) ?? '';
  };
  return {
    reason: (r) => r.reason,
    link: (r) => (r.link && isPublished(r.link) ? namer.linkIri(r.link) : ''),
    kind: (r) => r.link?.kind ?? '',
    status: (r) => r.link?.status ?? '',
    score: (r) => (r.link ? num(r.link.best) : ''),
    confidence: (r) => (r.link && r.link.reliableSupport > 0 ? num(r.link.confidence) : ''),
    support: (r) => String(r.link?.support ?? 0),
    images_a: (r) => lines(r.pairs.map((p) => namer.imageIri(p.imageA))),
    images_b: (r) => lines(r.pairs.map((p) => namer.imageIri(p.imageB))),
    views_a: (r) => (r.pairs.some((p) => view(p.imageA)) ? lines(r.pairs.map((p) => view(p.imageA))) : ''),
    views_b: (r) => (r.pairs.some((p) => view(p.imageB)) ? lines(r.pairs.map((p) => view(p.imageB))) : ''),
    pair_scores: (r) => lines(r.pairs.map((p) => num(p.score))),
    pair_overlaps: (r) => lines(r.pairs.map((p) => num(p.overlap))),
    title_a: (r) => ctx.title(r.a),
    title_b: (r) => ctx.title(r.b),
    dating_a: (r) => ctx.date(r.a),
    dating_b: (r) => ctx.date(r.b),
    page_a: (r) => ctx.page(r.a),
    page_b: (r) => ctx.page(r.b),
  };
}

/** An `imageView` template (RFC 6570 level 1, `{image}` and `{work}`) → a function of image and work ID. */
function compileImageTemplate(template: string): (image: string, work: string) => string {
  const pieces = template.split('{image}').map((piece) => compileTemplate(piece, 'work'));
  const image = compileTemplate('{image}', 'image');
  return (id, work) => pieces.map((p) => p(work)).join(image(id));
}

/** A link's image pairs, oriented to (a, b), distinct image pairs only, best score first (then input order), capped. */
function pairsOf(model: Model, linkSet: LinkSet, l: Link | undefined, a: number) {
  if (!l) return [];
  const m = model.matches;
  const seen = new Set<string>();
  const rows = Array.from(matchesOf(linkSet, l)).sort((x, y) => m.score[y] - m.score[x] || x - y);
  const out: QueueRow['pairs'] = [];
  for (const r of rows) {
    const [imageA, imageB] = model.images.work[m.a[r]] === a ? [m.a[r], m.b[r]] : [m.b[r], m.a[r]];
    const key = `${imageA},${imageB}`;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push({ imageA, imageB, score: m.score[r], overlap: m.overlap[r] });
    if (out.length === PAIRS_LISTED) break;
  }
  return out;
}

/**
 * review-queue.csv, in rank order, verdict/curator/decided_on/note empty. Only the context columns are neutralised:
 * the work references are read back by the decisions loader and never start with = + - @ (partner keys start with a
 * letter). Several image pairs in one cell are one per line, aligned across images_*, views_*, pair_* columns.
 */
export async function writeReviewQueue(
  file: string,
  model: Model,
  linkSet: LinkSet,
  analysis: Analysis,
  ctx: WorkContext,
  namer: Namer,
  form: CsvForm,
): Promise<string> {
  const cells = contextCells(model, ctx, namer);
  const out = new CsvFile(
    file,
    REVIEW_HEADER,
    REVIEW_HEADER.map((_, i) => i >= DECISION_COLUMNS.length),
    form,
  );
  const q = analysis.review;
  for (let i = 0; i < q.count; i++) {
    const a = q.a[i],
      b = q.b[i];
    const link = q.link[i] >= 0 ? linkSet.links[q.link[i]] : undefined;
    const row: QueueRow = { a, b, reason: REVIEW_REASONS[q.reason[i]], link, pairs: pairsOf(model, linkSet, link, a) };
    await out.row([ctx.ref(a), ctx.ref(b), '', '', '', '', ...REVIEW_CONTEXT.map((c) => cells[c](row))]);
  }
  return out.close();
}
