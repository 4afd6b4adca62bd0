// The report data → report.md: the same content as report.json, as tables a person reads.
import type { ReportData } from './data.js';
import { LIST_LIMIT } from './data.js';
import { percent } from './context.js';
import { markdownText } from '../shown.js';

/**
 * A table cell: the value as text, never markup (Markdown and HTML escaped, controls visible, line breaks as spaces:
 * `markdownText`; pipes escaped for GitHub Flavored Markdown tables, §4.10).
 */
const cell = (v: unknown) => markdownText(String(v ?? ''));

function table(header: string[], rows: unknown[][]): string[] {
  if (rows.length === 0) return ['(none)', ''];
  return [
    `| ${header.map(cell).join(' | ')} |`,
    `|${header.map(() => '---').join('|')}|`,
    ...rows.map((r) => `| ${r.map(cell).join(' | ')} |`),
    '',
  ];
}

const more = (shown: number, total: number, where: string) =>
  total > shown ? [`${total - shown} more in ${where}.`, ''] : [];

/** The "withheld" section: images set aside, links held back, clusters split, counts before and after. */
function withheldMarkdown(d: ReportData): string[] {
  const w = d.withheld;
  const out = ['## Withheld', ''];
  out.push(
    `Claims before weighing the evidence and splitting clusters: ${w.before.sameClaims} same-work claims, ${w.before.clusters} clusters, the largest of ${w.before.largest} works, ${w.before.impliedPairs} implied pairs. Published: ${w.after.sameClaims} same-work claims, ${w.after.clusters} clusters, the largest of ${w.after.largest} works, ${w.after.impliedPairs} implied pairs (listed one by one only for clusters of at most ${w.pairwiseLimit} works, so no cluster's pairs grow quadratically).`,
    '',
  );
  out.push(
    '### Indiscriminate images',
    '',
    `${w.indiscriminateImages} images match regardless of the artwork (${Object.entries(w.byVerdict)
      .map(([k, v]) => `${k} ${v}`)
      .join(
        ', ',
      )}); their ${w.rowsSetAside} evidence rows stay evidence but carry no link on their own. Hub: more than ${w.method.hubAbove} works matched; suspect: ${w.method.suspectFrom} or more (median ${w.method.medianWorksMatched}, median absolute deviation ${w.method.madWorksMatched}) with matched works that do not match each other (src/evidence/README.md).`,
    '',
  );
  out.push(
    ...table(
      ['partner', 'image', 'work', 'why', 'works matched', 'partners matched', 'rows'],
      w.images.map((i) => [i.partner, i.image, i.work, i.why, i.worksMatched, i.partnersMatched, i.rows]),
    ),
    ...more(w.images.length, w.indiscriminateImages, 'report.json (first ' + LIST_LIMIT + ' listed)'),
  );
  out.push(
    '### Links held back',
    '',
    'Machine links whose evidence reached proposeAt but that are not published; each is in the review queue.',
    '',
    ...table(['why', 'links'], Object.entries(w.heldLinks)),
  );
  out.push(
    '### Clusters split',
    '',
    `${w.splitsTotal} groups of works the claims would have joined were split to keep every cluster one artwork (src/cluster/README.md); the cut links are in the review queue.`,
    '',
  );
  out.push(
    ...table(
      ['works', 'clusters made', 'works left alone', 'links cut'],
      w.splits.map((s) => [s.works, s.clusters.join(' '), s.alone, s.cutLinks]),
    ),
    ...more(w.splits.length, w.splitsTotal, 'report.json (first ' + LIST_LIMIT + ' listed)'),
  );
  return out;
}

/** report.md (deterministic: no dates, no absolute paths). */
export function reportMarkdown(d: ReportData): string {
  const out: string[] = [`# ${markdownText(d.title)}: release ${markdownText(d.version)}`, ''];
  out.push(
    '## Partners',
    '',
    ...table(
      ['key', 'name', 'works'],
      d.partners.map((p) => [p.key, p.name, p.works]),
    ),
  );
  out.push('## Links by kind and status', '', `${d.links.total} work pairs with evidence or a decision.`, '');
  const statuses = Object.keys(d.links.byKind.same);
  out.push(
    ...table(
      ['kind', ...statuses],
      Object.entries(d.links.byKind).map(([k, s]) => [k, ...statuses.map((x) => (s as Record<string, number>)[x])]),
    ),
  );

  const c = d.clusters;
  out.push(
    '## Clusters',
    '',
    `${c.count} clusters hold ${c.works} works. Implied pairs (same cluster, no direct claim): ${c.impliedPairs}` +
      ` (${c.impliedThroughThirdArchive} joined only through a third archive). Bridges: ${c.bridgesTotal} (${c.bridgesJoiningClusters} joining two groups of two or more works). Oversized (more than ${c.oversizeAt} members): ${c.oversizedTotal}. Retired IDs: ${c.retiredTotal}.`,
    '',
  );
  out.push('### Sizes', '', ...table(['members', 'clusters'], Object.entries(c.sizes)));
  out.push(
    '### Oversized clusters',
    '',
    ...table(
      ['cluster', 'members', 'partners'],
      c.oversized.map((o) => [o.id, o.members, o.partners.join(', ')]),
    ),
    ...more(c.oversized.length, c.oversizedTotal, 'report.json (first ' + LIST_LIMIT + ' listed)'),
  );
  out.push(
    '### Bridges',
    '',
    'Links whose removal splits their cluster (clusters of three or more works), those joining two groups of two or more works first.',
    '',
    ...table(
      ['cluster', 'work_a', 'work_b', 'status', 'score', 'smaller side'],
      c.bridges.map((b) => [b.cluster, b.work_a, b.work_b, b.status, b.score, b.smallerSide]),
    ),
    ...more(c.bridges.length, c.bridgesTotal, 'report.json (first ' + LIST_LIMIT + ' listed)'),
  );
  out.push(
    '### Retired cluster IDs',
    '',
    ...table(
      ['cluster', 'replaced by'],
      c.retired.map((r) => [r.id, r.replacedBy.join(' ') || '(no successor)']),
    ),
    ...more(c.retired.length, c.retiredTotal, 'clusters.csv'),
  );

  out.push(...withheldMarkdown(d));

  out.push(
    '## Overlap between archives',
    '',
    "Works of the row archive that match a work of the column archive (a confirmed or proposed same or part claim, or one cluster), and their share of the row archive's works.",
    '',
  );
  const keys = d.partners.map((p) => p.key);
  out.push(
    ...table(
      ['from \\ to', ...keys],
      keys.map((from) => [
        from,
        ...keys.map((to) => {
          const x = d.overlap.pairs.find((p) => p.from === from && p.to === to);
          return x ? `${x.matched} / ${x.works} (${percent(x.share)})` : '—';
        }),
      ]),
    ),
  );
  out.push(
    '### Per century',
    '',
    "Century of the midpoint of the work's date interval.",
    '',
    ...table(
      ['from', 'to', 'century', 'matched', 'works', 'share'],
      d.overlap.centuries.map((x) => [x.from, x.to, x.century, x.matched, x.works, percent(x.share)]),
    ),
  );

  const dc = d.conflicts;
  out.push(
    '## Date conflicts',
    '',
    `${dc.records} records whose date lies more than ${dc.tolerance} years from what most records of their artwork give (or, for a detail, from the work it is part of); ${dc.centuriesApart} of them a century or more. Most years apart first.`,
    '',
  );
  out.push(
    ...table(
      ['record', 'date as catalogued', 'consensus date', 'records', 'years apart', 'compared with'],
      dc.listed.map((x) => [
        x.record,
        x.date_as_catalogued,
        x.consensus_date,
        x.consensus_records,
        x.years_apart,
        x.compared_with,
      ]),
    ),
    ...more(dc.listed.length, dc.records, 'conflicts.csv'),
  );

  out.push('## Agreement with the gold concordance', '');
  const a = d.agreement;
  if (!a) out.push('The project names no gold concordance.', '');
  else {
    out.push(
      ...table(
        ['measure', 'value', 'from'],
        [
          ['recall', percent(a.recall), `${a.found} of ${a.goldPairs} gold pairs share a cluster`],
          [
            'precision',
            percent(a.precision),
            `${a.correctPairs} of ${a.claimedPairs} claimed pairs among the ${a.goldWorks} gold works are gold`,
          ],
          ['F1', percent(a.f1), 'harmonic mean'],
        ],
      ),
    );
    out.push(
      '### Missed gold pairs',
      '',
      ...table(
        ['work_a', 'work_b', 'gold line', 'best evidence'],
        a.missed.map((m) => [
          m.work_a,
          m.work_b,
          m.line,
          typeof m.evidence === 'string'
            ? m.evidence
            : `${m.evidence.kind} ${m.evidence.status}, score ${m.evidence.score}, ${m.evidence.support} image pair${m.evidence.support === 1 ? '' : 's'}`,
        ]),
      ),
      ...more(a.missed.length, a.missedTotal, 'report.json (first ' + LIST_LIMIT + ' listed)'),
    );
  }
  const q = d.reviewQueue;
  out.push(
    '## Review queue',
    '',
    `${q.listed} pairs in review-queue.csv, most useful first${q.total > q.listed ? ` (the first ${q.limit} of ${q.total}, policy "reviewLimit"; ${q.total - q.listed} more wait for a later release)` : ''}. Fill in verdict, curator and date and add the file to "decisions".`,
    '',
  );
  out.push(
    ...table(
      ['reason', 'pairs', 'listed'],
      Object.entries(q.byReason).map(([r, n]) => [r, n, q.listedByReason[r]]),
    ),
  );
  return out.join('\n');
}
