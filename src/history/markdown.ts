// Changes between two releases → Markdown (changes.md, and the text output of `concordat diff`).
import type { ClaimChange, Changes } from './types.js';

/** A CommonMark code span (§6.1) that survives backticks inside the text. */
export function code(s: string): string {
  const longest = Math.max(0, ...[...s.matchAll(/`+/g)].map((m) => m[0].length));
  const fence = '`'.repeat(longest + 1);
  return longest ? `${fence} ${s} ${fence}` : `${fence}${s}${fence}`;
}

const state = (x: NonNullable<ClaimChange['before']>) => `${x.kind}, ${x.status}${x.score !== undefined ? ` (score ${x.score})` : ''}`;
const pair = (c: ClaimChange) => `${code(c.subject)} – ${code(c.object)}`;

const CLAIM_SECTIONS: [keyof Changes['claims'], string, (c: ClaimChange) => string][] = [
  ['added', 'Claims added', (c) => `${pair(c)}: ${state(c.after!)}`],
  ['removed', 'Claims removed', (c) => `${pair(c)}: was ${state(c.before!)}`],
  ['status', 'Claims with a new status', (c) => `${pair(c)}: ${c.before!.status} → ${c.after!.status}`],
  ['kind', 'Claims with a new kind', (c) => `${pair(c)}: ${c.before!.kind} → ${c.after!.kind}`],
];

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
    out.push('## Per partner', '', '| partner | added | removed | new status | new kind |', '|---|---:|---:|---:|---:|');
    for (const p of partners) {
      const n = c.partners[p];
      out.push(`| ${p} | ${n.added} | ${n.removed} | ${n.status} | ${n.kind} |`);
    }
    out.push('');
  }
  for (const [key, title, line] of CLAIM_SECTIONS) {
    if (!c.claims[key].length) continue;
    out.push(`## ${title}`, '');
    for (const x of c.claims[key]) out.push(`- ${line(x)} <${x.link}>`);
    out.push('');
  }
  const cl = c.clusters;
  const sections: [string, string[]][] = [
    ['Clusters merged', cl.merged.map((m) => `- ${m.into} ← ${m.from.join(', ')}`)],
    ['Clusters split', cl.split.map((s) => `- ${s.from} → ${s.into.join(', ')}`)],
    ['New clusters', cl.new.length ? [`- ${cl.new.join(', ')}`] : []],
    ['Retired cluster IDs', cl.retired.map((r) => `- ${r.id} → ${r.replacedBy.length ? `replaced by ${r.replacedBy.join(', ')}` : 'no successor'}`)],
  ];
  for (const [title, lines] of sections) if (lines.length) out.push(`## ${title}`, '', ...lines, '');
  return out.join('\n');
}
