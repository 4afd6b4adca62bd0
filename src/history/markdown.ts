// Changes between two releases → Markdown (changes.md, and the text output of `concordat diff`).
import type { ClaimChange, ClaimStateOf, Changes, MadeBy } from './types.js';
import { markdownText } from '../shown.js';

/** A CommonMark code span (§6.1) that survives backticks inside the text. */
export function code(s: string): string {
  const longest = Math.max(0, ...[...s.matchAll(/`+/g)].map((m) => m[0].length));
  const fence = '`'.repeat(longest + 1);
  return longest ? `${fence} ${s} ${fence}` : `${fence}${s}${fence}`;
}

/** A claim's state in words, by kind/status (a table); `s` and `o` name the state's own subject and object. */
const STATE_WORDS: Record<string, (s: string, o: string) => string> = {
  'same/confirmed': () => 'same work (confirmed)',
  'same/proposed': () => 'probably the same work (proposed)',
  'part/confirmed': (s, o) => `${s} is part of ${o} (confirmed)`,
  'part/proposed': (s, o) => `${s} is probably part of ${o} (proposed)`,
  'related/confirmed': () => 'related works (confirmed)',
  'related/proposed': () => 'probably related works (proposed)',
  rejected: () => 'distinct works (rejected)',
};

/** A state in words: a rejected link claims nothing, whatever kind the evidence gave it. */
export function stateWords(x: ClaimStateOf | undefined, c: Pick<ClaimChange, 'subject' | 'object'>): string {
  if (!x) return 'no claim';
  const other = x.subject === c.subject ? c.object : c.subject;
  const words = STATE_WORDS[x.status === 'rejected' ? 'rejected' : `${x.kind}/${x.status}`](
    code(x.subject),
    code(other),
  );
  return x.score !== undefined && x.status !== 'rejected' ? `${words.slice(0, -1)}, score ${x.score})` : words;
}

/**
 * Who made a change, in words: the curator (name or IRI), date and verdict; the runs; or the release that dropped it.
 */
export function madeByWords(b: MadeBy): string {
  switch (b.kind) {
    case 'curator':
      return `decided by ${b.name !== undefined ? markdownText(b.name) : `<${b.curator}>`}${b.date ? ` on ${b.date}` : ''}${b.verdict ? ` (verdict ${b.verdict})` : ''}`;
    case 'runs':
      return b.runs.length
        ? `by ${b.runs.length === 1 ? 'run' : 'runs'} ${b.runs.map((r) => `${r.id}${r.software ? ` (${markdownText(r.software)}${r.version ? ` ${markdownText(r.version)}` : ''})` : ''}`).join(', ')}`
        : 'by no recorded run';
    case 'release':
      return `dropped by release ${b.version}: no evidence or decision in it supports the link`;
  }
}

/** One changed claim: the pair, the state before → after in words, and who made the change. */
export function claimLine(c: ClaimChange): string {
  return `${code(c.subject)} – ${code(c.object)}: ${stateWords(c.before, c)} → ${stateWords(c.after, c)}; ${madeByWords(c.by)}`;
}

/**
 * Sections of the summary table (counts) and of the listing: a claim whose status and kind both changed is listed once.
 */
const CLAIM_SECTIONS: [keyof Changes['claims'], string][] = [
  ['added', 'Claims added'],
  ['removed', 'Claims removed'],
  ['status', 'Claims with a new status'],
  ['kind', 'Claims with a new kind'],
];

/** Claims added, removed, then changed (status or kind), each once, in link order. */
function listings(c: Changes): [string, ClaimChange[]][] {
  const changed = new Map([...c.claims.status, ...c.claims.kind].map((x) => [x.link, x]));
  return [
    ['Claims added', c.claims.added],
    ['Claims removed', c.claims.removed],
    ['Claims changed', [...changed.values()].sort((x, y) => (x.link < y.link ? -1 : x.link > y.link ? 1 : 0))],
  ];
}

const release = (r: Changes['from']) => `${r.version}${r.issued ? `, issued ${r.issued}` : ''} (<${r.dataset}>)`;

/** Renders `changes` as a Markdown document: summary table, per-partner table, then every change listed. */
export function changesMarkdown(c: Changes): string {
  const out: string[] = [`# Changes from release ${c.from.version} to ${c.to.version}`, ''];
  out.push(`- previous release: ${release(c.from)}`, `- this release: ${release(c.to)}`, '');
  out.push('| change | count |', '|---|---:|');
  for (const [key, title] of CLAIM_SECTIONS) out.push(`| ${title.toLowerCase()} | ${c.claims[key].length} |`);
  out.push(`| clusters merged | ${c.clusters.merged.length} |`, `| clusters split | ${c.clusters.split.length} |`);
  out.push(`| new clusters | ${c.clusters.new.length} |`, `| cluster IDs retired | ${c.clusters.retired.length} |`, '');
  const partners = Object.keys(c.partners);
  if (partners.length) {
    out.push(
      '## Per partner',
      '',
      '| partner | added | removed | new status | new kind |',
      '|---|---:|---:|---:|---:|',
    );
    for (const p of partners) {
      const n = c.partners[p];
      out.push(`| ${p} | ${n.added} | ${n.removed} | ${n.status} | ${n.kind} |`);
    }
    out.push('');
  }
  for (const [title, list] of listings(c)) {
    if (!list.length) continue;
    out.push(`## ${title}`, '');
    for (const x of list) out.push(`- ${claimLine(x)} <${x.link}>`);
    out.push('');
  }
  const cl = c.clusters;
  const sections: [string, string[]][] = [
    ['Clusters merged', cl.merged.map((m) => `- ${m.into} ← ${m.from.join(', ')}`)],
    ['Clusters split', cl.split.map((s) => `- ${s.from} → ${s.into.join(', ')}`)],
    ['New clusters', cl.new.length ? [`- ${cl.new.join(', ')}`] : []],
    [
      'Retired cluster IDs',
      cl.retired.map(
        (r) => `- ${r.id} → ${r.replacedBy.length ? `replaced by ${r.replacedBy.join(', ')}` : 'no successor'}`,
      ),
    ],
  ];
  for (const [title, lines] of sections) if (lines.length) out.push(`## ${title}`, '', ...lines, '');
  return out.join('\n');
}
