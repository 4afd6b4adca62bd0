// A citation target as typed (`partner:work`, a work, link or cluster IRI) → the links to cite, or nearest matches.
import N3 from 'n3';
import { iri } from '../namespaces.js';
import { editDistance } from '../io/did-you-mean.js';
import { refOfWorkIri } from '../history/names.js';

const { namedNode } = N3.DataFactory;
const T = (p: Parameters<typeof iri>[0], l: string) => namedNode(iri(p, l));

export type Found =
  | { ok: true; kind: 'work' | 'link' | 'cluster'; iri: string; links: string[] }
  | { ok: false; message: string; nearest: string[] };

const values = (store: N3.Store, s: string | null, p: N3.NamedNode, o: N3.Term | null = null) =>
  (s === null ? store.getSubjects(p, o, null) : store.getObjects(namedNode(s), p, null)).map((t) => t.value);

/** Current links (cx:Link that are not earlier states, i.e. without dcterms:isVersionOf). */
function isCurrentLink(store: N3.Store, s: string): boolean {
  return (
    store.countQuads(namedNode(s), T('rdf', 'type'), T('cx', 'Link'), null) > 0 &&
    store.countQuads(namedNode(s), T('dcterms', 'isVersionOf'), null, null) === 0
  );
}

function linksOfWork(store: N3.Store, w: string): string[] {
  const ls = [
    ...values(store, null, T('cx', 'subjectWork'), namedNode(w)),
    ...values(store, null, T('cx', 'objectWork'), namedNode(w)),
  ];
  return [...new Set(ls)].filter((l) => isCurrentLink(store, l)).sort();
}

/** Every partner work of the release by `partnerKey:workId` (decoded after its partner dataset's void:uriSpace). */
export function workRefs(store: N3.Store): Map<string, string> {
  const refs = new Map<string, string>();
  for (const q of store.getQuads(null, T('cx', 'partner'), null, null)) {
    const w = q.subject.value;
    const ds = values(store, w, T('void', 'inDataset'))[0];
    const space = ds ? values(store, ds, T('void', 'uriSpace'))[0] : undefined;
    refs.set(refOfWorkIri(w, q.object.value, space), w);
  }
  return refs;
}

/** Up to `n` candidates closest to `wanted` (edit distance at most a third of the longer string, at least 2). */
export function nearest(wanted: string, candidates: Iterable<string>, n = 5): string[] {
  const scored: [string, number][] = [];
  for (const c of candidates) {
    const d = editDistance(wanted.toLowerCase(), c.toLowerCase());
    if (d <= Math.max(2, Math.floor(Math.max(wanted.length, c.length) / 3))) scored.push([c, d]);
  }
  return scored
    .sort((x, y) => x[1] - y[1] || (x[0] < y[0] ? -1 : 1))
    .slice(0, n)
    .map((x) => x[0]);
}

/**
 * Resolves what to cite: a link IRI, a cluster IRI (its links between members), a work IRI or `partnerKey:workId` (its
 * links).
 */
export function findTarget(store: N3.Store, query: string): Found {
  const q = query.trim();
  if (/^[a-z][a-z0-9+.-]*:\/\//i.test(q)) {
    if (isCurrentLink(store, q)) return { ok: true, kind: 'link', iri: q, links: [q] };
    if (store.countQuads(namedNode(q), T('rdf', 'type'), T('cx', 'Cluster'), null) > 0) {
      if (values(store, q, T('owl', 'deprecated'))[0] === 'true') {
        const next = values(store, q, T('dcterms', 'isReplacedBy')).sort();
        return {
          ok: false,
          message: `cluster <${q}> is retired in this release${next.length ? ', replaced by ' + next.map((n) => `<${n}>`).join(', ') : ' with no successor'}`,
          nearest: next,
        };
      }
      const members = new Set(values(store, q, T('cx', 'member')));
      const links = [...members]
        .flatMap((m) => linksOfWork(store, m))
        .filter(
          (l) =>
            members.has(values(store, l, T('cx', 'subjectWork'))[0]) &&
            members.has(values(store, l, T('cx', 'objectWork'))[0]),
        );
      return { ok: true, kind: 'cluster', iri: q, links: [...new Set(links)].sort() };
    }
    const links = linksOfWork(store, q);
    if (links.length) return { ok: true, kind: 'work', iri: q, links };
    const invalidated = values(store, q, T('prov', 'wasInvalidatedBy'));
    const why = invalidated.length ? ` (it was withdrawn by <${invalidated[0]}>)` : '';
    return {
      ok: false,
      message: `the release holds no claim about <${q}>${why}`,
      nearest: nearest(q, [...workRefs(store).values(), ...values(store, null, T('rdf', 'type'), T('cx', 'Link'))]),
    };
  }
  const refs = workRefs(store);
  const w = refs.get(q);
  if (w) {
    const links = linksOfWork(store, w);
    if (links.length) return { ok: true, kind: 'work', iri: w, links };
  }
  return { ok: false, message: `the release holds no claim about ${q}`, nearest: nearest(q, refs.keys()) };
}
