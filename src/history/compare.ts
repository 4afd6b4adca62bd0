// Two release snapshots → the changes between them: claims added, removed, re-statused or re-kinded; clusters merged,
// split, new, retired.
import type { ClusterRegistry } from '../cluster/types.js';
import { byNumber } from '../cluster/ids.js';
import type { ClaimChange, ClaimStateOf, Changes, LinkState, MadeBy, PartnerCounts, ReleaseSnapshot } from './types.js';

const cmp = (x: string, y: string) => (x < y ? -1 : x > y ? 1 : 0);

function stateOf(snap: ReleaseSnapshot, l: LinkState): ClaimStateOf {
  return {
    status: l.status,
    kind: l.kind,
    ...(l.relation ? { relation: l.relation } : {}),
    ...(l.score !== undefined ? { score: l.score } : {}),
    subject: snap.works.get(l.subject)?.ref ?? l.subject,
  };
}

/**
 * Who generated a link state: the curator review among its activities, else the runs (from the release's descriptions).
 */
export function madeBy(snap: ReleaseSnapshot, l: LinkState): MadeBy {
  const infos = l.generatedBy.map((iri) => ({ iri, info: snap.activities.get(iri) }));
  const review = infos.find((x) => x.info?.kind === 'review');
  if (review && review.info?.kind === 'review') {
    const { curator, curatorName, date, verdict } = review.info;
    return {
      kind: 'curator',
      review: review.iri,
      curator,
      ...(curatorName ? { name: curatorName } : {}),
      ...(date ? { date } : {}),
      ...(verdict ? { verdict } : {}),
    };
  }
  const runs = infos.map(({ iri, info }) => ({
    iri,
    id: info?.kind === 'run' ? info.id : decodeURIComponent(iri.replace(/^.*\//, '')),
    ...(info?.kind === 'run' && info.software ? { software: info.software } : {}),
    ...(info?.kind === 'run' && info.version ? { version: info.version } : {}),
  }));
  return { kind: 'runs', runs };
}

function change(before: ReleaseSnapshot, after: ReleaseSnapshot, old?: LinkState, now?: LinkState): ClaimChange {
  const l = (now ?? old)!;
  const name = (w: string) => after.works.get(w) ?? before.works.get(w) ?? { partner: '', ref: w };
  const [s, o] = [name(l.subject), name(l.object)];
  return {
    link: l.iri,
    subject: s.ref,
    object: o.ref,
    partners: [...new Set([s.partner, o.partner])].sort(cmp),
    ...(old ? { before: stateOf(before, old) } : {}),
    ...(now ? { after: stateOf(after, now) } : {}),
    by: now ? madeBy(after, now) : { kind: 'release', version: after.version },
  };
}

/** A rejected link claims nothing, whatever kind the evidence gave it: only status changes count into or out of it. */
const kindChanged = (x: LinkState, y: LinkState) =>
  x.status !== 'rejected' && y.status !== 'rejected' && x.kind !== y.kind;

/**
 * Clusters: merged (a new cluster holding members of several old ones), split (an old one spread over several new
 * ones), new IDs, IDs retired now.
 */
export function compareClusters(before: ClusterRegistry, after: ClusterRegistry): Changes['clusters'] {
  const newOf = new Map<string, string>();
  for (const [id, refs] of after.active) for (const r of refs) newOf.set(r, id);
  const oldOf = new Map<string, string>();
  for (const [id, refs] of before.active) for (const r of refs) oldOf.set(r, id);
  const merged: Changes['clusters']['merged'] = [];
  for (const [id, refs] of after.active) {
    const from = [...new Set(refs.map((r) => oldOf.get(r)).filter((x): x is string => x !== undefined))].sort(byNumber);
    if (from.length > 1) merged.push({ into: id, from });
  }
  const split: Changes['clusters']['split'] = [];
  for (const [id, refs] of before.active) {
    const into = [...new Set(refs.map((r) => newOf.get(r)).filter((x): x is string => x !== undefined))].sort(byNumber);
    if (into.length > 1) split.push({ from: id, into });
  }
  const known = new Set([...before.active.keys(), ...before.retired.map((r) => r.id)]);
  const wasRetired = new Set(before.retired.map((r) => r.id));
  return {
    merged: merged.sort((x, y) => byNumber(x.into, y.into)),
    split: split.sort((x, y) => byNumber(x.from, y.from)),
    new: [...after.active.keys()].filter((id) => !known.has(id)).sort(byNumber),
    retired: after.retired
      .filter((r) => !wasRetired.has(r.id))
      .map((r) => ({ id: r.id, replacedBy: [...r.replacedBy] }))
      .sort((x, y) => byNumber(x.id, y.id)),
  };
}

/**
 * What changed from `before` to `after` (design, "changes against previous"). Links are matched by IRI, which
 * is a hash of the ordered work pair and so stable across releases. Comparing a release with itself gives no change.
 */
export function compareSnapshots(before: ReleaseSnapshot, after: ReleaseSnapshot): Changes {
  const claims: Changes['claims'] = { added: [], removed: [], status: [], kind: [] };
  for (const [iri, l] of after.links) {
    const old = before.links.get(iri);
    if (!old) {
      claims.added.push(change(before, after, undefined, l));
      continue;
    }
    if (old.status !== l.status) claims.status.push(change(before, after, old, l));
    if (kindChanged(old, l)) claims.kind.push(change(before, after, old, l));
  }
  for (const [iri, l] of before.links)
    if (!after.links.has(iri)) claims.removed.push(change(before, after, l, undefined));
  for (const list of Object.values(claims)) list.sort((x, y) => cmp(x.link, y.link));

  const partners: Record<string, PartnerCounts> = {};
  const bump = (c: ClaimChange, what: keyof PartnerCounts) => {
    for (const p of c.partners) (partners[p] ??= { added: 0, removed: 0, status: 0, kind: 0 })[what]++;
  };
  for (const what of ['added', 'removed', 'status', 'kind'] as const) for (const c of claims[what]) bump(c, what);
  const sortedPartners = Object.fromEntries(
    Object.keys(partners)
      .sort(cmp)
      .map((k) => [k, partners[k]]),
  );
  const id = (s: ReleaseSnapshot) => ({
    version: s.version,
    dataset: s.dataset,
    ...(s.issued ? { issued: s.issued } : {}),
  });
  return {
    from: id(before),
    to: id(after),
    claims,
    clusters: compareClusters(before.clusters, after.clusters),
    partners: sortedPartners,
  };
}

/** True when nothing changed (dataset identity aside). */
export function isEmpty(c: Changes): boolean {
  const { claims: k, clusters: x } = c;
  return (
    !k.added.length &&
    !k.removed.length &&
    !k.status.length &&
    !k.kind.length &&
    !x.merged.length &&
    !x.split.length &&
    !x.new.length &&
    !x.retired.length
  );
}
