// A built release → the short summary `build` and the demo print: counts by kind and status, one example claim.
import { cut, visible } from '../shown.js';
import type { BuildResult } from '../pipeline.js';
import { workRef } from '../model.js';
import { claimEnds } from '../rdf/index.js';
import { prefixMap } from '../rdf/formats.js';

export interface ReleaseSummary {
  version: string;
  works: number;
  links: Record<string, number>;
  claimTriples: Record<string, number>;
  clusters: number;
  impliedPairs: number;
  bridges: number;
  triples: number;
  violations: number;
  warnings: number;
  example?: { subject: string; predicate: string; object: string; score: number; support: number; status: string };
}

const PREFIXES = Object.entries(prefixMap());
/** A predicate IRI as a prefixed name of the publishing prefixes when one fits, else the IRI. */
const short = (iri: string) => {
  for (const [p, ns] of PREFIXES)
    if (iri.startsWith(ns) && iri.length > ns.length) return `${p}:${iri.slice(ns.length)}`;
  return iri;
};

/** Counts what a release holds. */
export function releaseSummary(r: BuildResult): ReleaseSummary {
  const links: Record<string, number> = {};
  for (const l of r.links.links) {
    const k = `${l.kind}/${l.status}`;
    links[k] = (links[k] ?? 0) + 1;
  }
  const claimTriples: Record<string, number> = {};
  for (const [p, n] of Object.entries(r.publish.claims).sort()) claimTriples[short(p)] = n;
  const ex = r.links.links
    .filter((l) => l.kind === 'same' && l.status === 'confirmed' && l.support > 0)
    .sort((a, b) => b.best - a.best)[0];
  return {
    version: r.model.project.release.version,
    works: r.model.works.length,
    links: Object.fromEntries(Object.entries(links).sort()),
    claimTriples,
    clusters: r.clustering.clusters.length,
    impliedPairs: r.clustering.impliedTotal,
    bridges: r.clustering.bridges.length,
    triples: r.publish.triples,
    violations: r.publish.validation.violations,
    warnings: r.publish.validation.warnings,
    example:
      ex &&
      (() => {
        const [s, o] = claimEnds(ex);
        // the predicate the release holds for this claim, from the vocab map (owl:sameAs, or e.g. skos:exactMatch)
        const predicate = r.vocab.predicate(ex.kind, ex.status);
        return {
          subject: workRef(r.model, s),
          predicate: predicate ? short(predicate) : '(no claim triple)',
          object: workRef(r.model, o),
          score: ex.best,
          support: ex.support,
          status: ex.status,
        };
      })(),
  };
}

export function releaseSummaryText(s: ReleaseSummary, where: string): string {
  const lines = [
    `release ${s.version} written to ${where}`,
    `  ${s.triples} triples; SHACL: ${s.violations} violations, ${s.warnings} warnings`,
    `  clusters: ${s.clusters}, implied pairs: ${s.impliedPairs}, bridges: ${s.bridges}`,
    '  claim triples:',
  ];
  for (const [p, n] of Object.entries(s.claimTriples)) lines.push(`    ${p.padEnd(18)} ${n}`);
  lines.push('  links by kind/status:');
  for (const [k, n] of Object.entries(s.links)) lines.push(`    ${k.padEnd(18)} ${n}`);
  if (s.example)
    lines.push(
      `  example claim: ${visible(cut(s.example.subject))} ${s.example.predicate} ${visible(cut(s.example.object))} (score ${s.example.score}, ${s.example.support} image pair${s.example.support === 1 ? '' : 's'}, ${s.example.status})`,
    );
  return lines.join('\n') + '\n';
}
