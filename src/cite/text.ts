// A citation → a footnote-ready sentence per claim plus its evidence list, as plain text or Markdown.
import type { Citation, CitedClaim, CitedConflict, CitedRelease, CitedRun, CitedWork } from './types.js';

const ID_OF = (w: CitedWork) => (w.ref.startsWith(`${w.partner}:`) ? w.ref.slice(w.partner.length + 1) : w.ref);
export const name = (w: CitedWork) => `${w.partnerName ?? w.partner} ${ID_OF(w)}${w.title ? ` ("${w.title}")` : ''}`;
const plural = (n: number, one: string) => `${n} ${one}${n === 1 ? '' : 'es'}`;

/** Verb phrase by kind and status (a table: kind/status → how the sentence joins the two works). */
const VERB: Record<string, (s: string, o: string) => string> = {
  'same/confirmed': (s, o) => `${s} and ${o} show the same work`,
  'same/proposed': (s, o) => `${s} and ${o} probably show the same work`,
  'part/confirmed': (s, o) => `${s} shows a part of ${o}`,
  'part/proposed': (s, o) => `${s} probably shows a part of ${o}`,
  'related/confirmed': (s, o) => `${s} and ${o} show related but distinct works`,
  'related/proposed': (s, o) => `${s} and ${o} probably show related works`,
};
const verb = (c: CitedClaim) =>
  c.status === 'rejected'
    ? (s: string, o: string) => `${s} and ${o} do not show the same work`
    : VERB[`${c.kind}/${c.status}`];

/** "A and B show the same work" (the claim without its basis and release). */
export const claimPhrase = (c: CitedClaim) => verb(c)(name(c.subject), name(c.object));

/** Who asserted the claim: the curator of its review, else its runs ("a matcher" when none is recorded). */
export function assertedBy(c: CitedClaim): { kind: 'curator' | 'run'; name: string } {
  if (c.review) return { kind: 'curator', name: c.review.curatorName ?? c.review.curator };
  const run = c.runs[0];
  return {
    kind: 'run',
    name: run ? `${run.software ?? 'a matcher'}${run.version ? ` ${run.version}` : ''} (run ${run.id})` : 'a matcher',
  };
}

function basis(c: CitedClaim): string {
  const r = c.review;
  if (r)
    return `${c.status === 'rejected' ? 'as judged by' : c.status === 'confirmed' ? 'confirmed by' : 'reviewed by'} ${r.curatorName ?? r.curator}${r.date ? ` on ${r.date.slice(0, 10)}` : ''}`;
  const run = c.runs[0];
  const who = run
    ? `${run.software ?? 'a matcher'}${run.version ? ` ${run.version}` : ''} (run ${run.id})`
    : 'a matcher';
  return c.status === 'confirmed' ? `confirmed automatically on the score of ${who}` : `proposed by ${who}`;
}

const evidence = (c: CitedClaim) =>
  c.matches.length
    ? `on the evidence of ${plural(c.matches.length, 'image match')}${c.score !== undefined ? ` (best score ${c.score}${c.confidence !== undefined ? `, confidence ${c.confidence}` : ''})` : ''}`
    : 'without image-match evidence';

export function releaseLine(r: CitedRelease): string {
  return [
    r.title,
    `release ${r.version}${r.issued ? ` (${r.issued})` : ''}`,
    r.publisher,
    r.license ? `licence ${r.license}` : undefined,
  ]
    .filter(Boolean)
    .join(', ');
}

/**
 * "A and B show the same work, confirmed by C on D, on the evidence of N image matches (best score S). Title, release V
 * (date), publisher, licence L, <link>."
 */
export function sentence(c: CitedClaim, r: CitedRelease): string {
  return `${verb(c)(name(c.subject), name(c.object))}, ${basis(c)}, ${evidence(c)}. ${releaseLine(r)}, ${c.link}.`;
}

function runFact(run: CitedRun): string {
  const params = run.parameters.map((p) => `${p.name}=${p.value}`).join(', ');
  return `run ${run.id}: ${run.software ?? '?'} ${run.version ?? ''}${run.started ? `, started ${run.started}` : ''}${params ? `; parameters ${params}` : ''} <${run.iri}>`;
}

const releaseFact = (r: CitedRelease) =>
  `release: ${r.version}${r.issued ? `, issued ${r.issued}` : ''}${r.license ? `, licence <${r.license}>` : ''}, dataset <${r.dataset}>`;

/**
 * The facts behind one claim: the claim, its image matches, runs, curator review and the release. Brief: the claim
 * (whose IRI's document lists the matches) and the review only; runs and release follow once for all claims.
 */
function details(c: CitedClaim, r: CitedRelease, item: (s: string) => string, brief = false): string[] {
  const out = [
    item(
      `claim: ${c.relation ?? 'no claim triple'} (${c.kind}, ${c.status})${c.score !== undefined ? `, score ${c.score}` : ''}${c.confidence !== undefined ? `, confidence ${c.confidence}` : ''}, ${c.support} image pair${c.support === 1 ? '' : 's'} <${c.link}>`,
    ),
  ];
  if (!brief) {
    for (const m of c.matches)
      out.push(
        item(
          `image match: ${m.source} ~ ${m.target}, score ${m.score}, overlap ${m.overlap}${m.run ? `, run ${m.run.replace(/^.*\//, '')}` : ''} <${m.iri}>`,
        ),
      );
    for (const run of c.runs) out.push(item(runFact(run)));
  }
  const v = c.review;
  if (v)
    out.push(
      item(
        `curator: ${v.curatorName ? `${v.curatorName} ` : ''}<${v.curator}>${v.date ? `, ${v.date}` : ''}${v.verdict ? `, verdict ${v.verdict}` : ''}${v.note ? `, note "${v.note}"` : ''} <${v.iri}>`,
      ),
    );
  if (!brief) out.push(item(releaseFact(r)));
  return out;
}

/** A brief citation's shared facts: every run any claim rests on, once, then the release. */
function sharedFacts(c: Citation): string[] {
  const runs = new Map<string, CitedRun>();
  for (const x of c.claims) for (const run of x.runs) runs.set(run.iri, run);
  return [...[...runs.keys()].sort().map((k) => runFact(runs.get(k)!)), releaseFact(c.release)];
}

/**
 * A date conflict in words: the record whose date disagrees (work A), then a record giving the cluster's date (work B).
 */
export function conflictLine(x: CitedConflict): string {
  return `${x.severity ?? 'conflict'}: ${name(x.a)} dated "${x.a.date ?? ''}", where ${name(x.b)} gives the date most of the cluster gives, "${x.b.date ?? ''}" <${x.iri}>`;
}

const heading = (c: Citation) =>
  `${c.claims.length} claim${c.claims.length === 1 ? '' : 's'} about ${c.query} in release ${c.release.version}`;

/** Plain text: per claim, the sentence, then "Evidence:" and one indented line per fact. */
export function citationText(c: Citation): string {
  const blocks = c.claims.map((x) =>
    [sentence(x, c.release), '', 'Evidence:', ...details(x, c.release, (s) => `  - ${s}`, c.brief)].join('\n'),
  );
  const conflicts = c.conflicts?.length
    ? [
        '',
        `Date conflicts in this cluster (${c.conflicts.length}):`,
        ...c.conflicts.map((x) => `  - ${conflictLine(x)}`),
      ]
    : [];
  const shared = c.brief ? ['', 'Runs and release:', ...sharedFacts(c).map((l) => `  - ${l}`)] : [];
  return [heading(c), '', blocks.join('\n\n'), ...shared, ...conflicts, ''].join('\n');
}

/**
 * Escapes Markdown punctuation (CommonMark §2.4) and `<` that would open an HTML tag; keeps `<https://…>` autolinks.
 */
const md = (s: string) => s.replace(/([\\`*_[\]|])/g, '\\$1').replace(/<(?=[A-Za-z/!?])(?!https?:)/g, '\\<');

/** Markdown: a heading, then per claim the sentence as a paragraph, an evidence table and a list of the rest. */
export function citationMarkdown(c: Citation): string {
  const out = [`# ${md(heading(c))}`, ''];
  for (const x of c.claims) {
    out.push(`## ${md(x.subject.ref)} – ${md(x.object.ref)}`, '', md(sentence(x, c.release)), '');
    if (x.matches.length && !c.brief) {
      out.push('| source image | target image | score | overlap | run |', '|---|---|---:|---:|---|');
      for (const m of x.matches)
        out.push(
          `| <${m.source}> | <${m.target}> | ${m.score} | ${m.overlap} | ${md(m.run?.replace(/^.*\//, '') ?? '')} |`,
        );
      out.push('');
    }
    out.push(
      ...details(x, c.release, (s) => `- ${md(s)}`, c.brief).filter((l) => !l.startsWith('- image match: ')),
      '',
    );
  }
  if (c.brief) out.push('## Runs and release', '', ...sharedFacts(c).map((l) => `- ${md(l)}`), '');
  if (c.conflicts?.length)
    out.push('## Date conflicts in this cluster', '', ...c.conflicts.map((x) => `- ${md(conflictLine(x))}`), '');
  return out.join('\n');
}
