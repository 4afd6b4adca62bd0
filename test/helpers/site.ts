// Test helper: the demo's two releases built once per test process, their sites, and HTTP checks of minted IRIs
// shared by the preview-server and nginx tests.
import assert from 'node:assert/strict';
import path from 'node:path';
import N3 from 'n3';
import { build } from '../../src/pipeline.js';
import { writeSite } from '../../src/site/index.js';
import { streamRdfFile } from '../../src/rdf/read.js';
import { jsonldToNQuads } from '../../src/rdf/jsonld.js';
import { relPath, routeOf } from '../../src/site/routes.js';
import { repoRoot, tempDir } from './fixture.js';

const demo = path.join(repoRoot, 'demo-data');

export interface DemoSites {
  tmp: string;
  release1: string;
  release2: string;
  site1: string;
  site2: string;
}

let demoSites: Promise<DemoSites> | undefined;
/** Demo releases 2026.1 and 2027.1 (with the first as previous) and a site of each, built once per process. */
export function demoSitesOnce(): Promise<DemoSites> {
  demoSites ??= (async () => {
    const tmp = tempDir('concordat-site-');
    const release1 = path.join(tmp, 'releases', '2026.1'),
      release2 = path.join(tmp, 'releases', '2027.1');
    await build(path.join(demo, 'concordance.json'), release1);
    await build(path.join(demo, 'release-2', 'concordance.json'), release2, { previous: release1 });
    const site1 = path.join(tmp, 'site', '2026.1'),
      site2 = path.join(tmp, 'site', '2027.1');
    await writeSite(release1, site1);
    await writeSite(release2, site2, { previous: site1 });
    return { tmp, release1, release2, site1, site2 };
  })();
  return demoSites;
}

/** The release's triples by subject (N-Triples text of each, graph dropped), read with n3's own parser. */
export async function triplesBySubject(
  release: string,
): Promise<{ bySubject: Map<string, Set<string>>; graphs: Set<string> }> {
  const bySubject = new Map<string, Set<string>>();
  const graphs = new Set<string>();
  const w = new N3.Writer({ format: 'N-Triples' });
  await streamRdfFile(path.join(release, 'concordance.nq'), (q) => {
    const line = w.quadToString(q.subject, q.predicate, q.object);
    let s = bySubject.get(q.subject.value);
    if (!s) bySubject.set(q.subject.value, (s = new Set()));
    s.add(line);
    if (q.graph.termType === 'NamedNode') graphs.add(q.graph.value);
  });
  return { bySubject, graphs };
}

/** A sample of every kind of minted IRI: per path shape (hashes and IDs replaced by `*`), the first and the last. */
export function sampleIris(base: string, iris: Iterable<string>): Map<string, string[]> {
  const byShape = new Map<string, string[]>();
  for (const x of iris) {
    const rel = relPath(x, base);
    if (rel === null || !routeOf(rel)) continue;
    const shape = `${routeOf(rel)!.kind}:${rel
      .split('/')
      .map((s, i) =>
        i === 0 || /^(v|plan|association|implied|conflict|linkset|file|partner|publisher)$/.test(s) ? s : '*',
      )
      .join('/')}`;
    const l = byShape.get(shape);
    if (l) l.push(x);
    else byShape.set(shape, [x]);
  }
  for (const [k, l] of byShape) {
    l.sort();
    byShape.set(k, [...new Set([l[0], l[l.length - 1]])]);
  }
  return byShape;
}

const NT = new N3.Writer({ format: 'N-Triples' });
const lines = (quads: N3.Quad[]) => new Set(quads.map((q) => NT.quadToString(q.subject, q.predicate, q.object)));

/** Accept header → media type of the 200 that follows the 303, and how its body is read into triples. */
export const ACCEPTS: {
  accept: string;
  type: string;
  ext: string;
  parse: (body: string, url: string) => Promise<Set<string>>;
}[] = [
  { accept: 'text/html', type: 'text/html', ext: '.html', parse: async () => new Set() },
  {
    accept: 'text/turtle',
    type: 'text/turtle',
    ext: '.ttl',
    parse: async (b, url) => lines(new N3.Parser({ format: 'text/turtle', baseIRI: url }).parse(b)),
  },
  {
    accept: 'application/ld+json',
    type: 'application/ld+json',
    ext: '.jsonld',
    parse: async (b, url) =>
      lines(new N3.Parser({ format: 'application/n-quads' }).parse(await jsonldToNQuads(b, url, url))),
  },
  {
    accept: 'application/n-triples',
    type: 'application/n-triples',
    ext: '.nt',
    parse: async (b) => lines(new N3.Parser({ format: 'application/n-triples' }).parse(b)),
  },
  { accept: '*/*', type: 'text/html', ext: '.html', parse: async () => new Set() },
];

/**
 * Every sampled IRI, with every Accept: 303 to the document of that representation, then 200 with the media type,
 * a body that parses and holds every triple the release has about the IRI; HTML pages hold an element for a fragment.
 */
export async function checkMintedIris(origin: string, release: string, base: string): Promise<number> {
  const { bySubject, graphs } = await triplesBySubject(release);
  const objects = new Set<string>();
  for (const set of bySubject.values())
    for (const l of set) {
      const m = /^<[^>]*> <[^>]*> <([^>]*)> \.$/.exec(l);
      if (m) objects.add(m[1]);
    }
  const sample = sampleIris(base, [...bySubject.keys(), ...objects, ...graphs]);
  let checked = 0;
  for (const [shape, iris] of sample) {
    for (const x of iris) {
      const url = origin + new URL(x).pathname;
      for (const a of ACCEPTS) {
        const r = await fetch(url, { headers: { accept: a.accept }, redirect: 'manual' });
        assert.equal(r.status, 303, `${shape} ${x} Accept ${a.accept}: status`);
        assert.match(r.headers.get('vary') ?? '', /accept/i, `${x}: Vary`);
        const loc = new URL(r.headers.get('location')!, url);
        assert.ok(loc.pathname.endsWith(a.ext), `${x} Accept ${a.accept} → ${loc}`);
        const doc = await fetch(loc, { headers: { accept: a.accept } });
        assert.equal(doc.status, 200, `${loc}`);
        assert.equal(doc.headers.get('content-type')?.split(';')[0].trim(), a.type, `${loc}: media type`);
        const body = await doc.text();
        const got = await a.parse(body, loc.href.replace(/#.*$/, ''));
        if (a.type === 'text/html') {
          const frag = decodeURIComponent(loc.hash.slice(1));
          if (frag) assert.ok(body.includes(`id="${frag}"`), `${loc}: no element with id ${frag}`);
          else assert.ok(body.includes(x.replace(/&/g, '&amp;')), `${loc}: the page does not name ${x}`);
        } else {
          for (const t of bySubject.get(x) ?? []) assert.ok(got.has(t), `${loc} lacks ${t}`);
        }
        checked++;
      }
    }
  }
  return checked;
}
