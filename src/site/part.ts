// One part of a site's writing: the whole of concordance.nq read in file order, the documents of every `parts`-th
// cluster, stray link and loose entry written (the others only read, for the provenance every page shares), then
// every `parts`-th group of shard documents from the spools of all parts. Part 0 also writes the documents of their
// own, the claims kept from an earlier site, search, the static pages and what is carried over.
import path from 'node:path';
import { RELEASE_FILES } from '../rdf/formats.js';
import { streamNQuads, type Statement } from './nquads.js';
import { Grouper, type ClusterUnit, type Entry, type LinkEntry } from './group.js';
import { readSiteInfo, type SiteInfo } from './info.js';
import { SiteContext } from './context.js';
import { docOf, relPath, routeOf, ROUTES, type DocKind, type ShardWidths } from './routes.js';
import { JsonLd } from './jsonld.js';
import { page, html, Safe } from './html.js';
import { Spool } from './spool.js';
import { DocWriter } from './doc-writer.js';
import { clusterPage } from './pages/cluster.js';
import { linkSection, matchSection, genericSection, MATCH_TABLE_HEAD, MATCH_TABLE_TAIL } from './pages/entries.js';
import { genericPage } from './pages/generic.js';
import { datasetSummary } from './pages/dataset.js';
import { SearchIndex } from './search.js';
import { writeStaticPages } from './pages/static.js';
import { readEarlierSite, carryDocuments, earlierLinks, type EarlierSite } from './carry.js';

/** What a part is given (the same for every part but `part`). */
export interface PartSetup {
  release: string;
  /** The site's temp folder. */
  dir: string;
  part: number;
  parts: number;
  widths: ShardWidths;
  previous?: string;
}

const ntOf = (sts: readonly Statement[]) => sts.map((s) => s.nt).join('');

/**
 * A spooled shard entry: hash, N-Triples, JSON-LD node, HTML section, and `EARLIER` for a claim kept from an earlier
 * site.
 */
type SpoolRecord = [string, string, string, string] | [string, string, string, string, typeof EARLIER];
const EARLIER = 'earlier';

const cmp = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
/**
 * A shard's records in hash order, without the earlier site's record of a claim this release describes. Ties (the
 * same hash spooled twice) are ordered by their text, so the order depends neither on the order of spooling nor on
 * the number of parts.
 */
export function shardRecords(records: SpoolRecord[]): SpoolRecord[] {
  records.sort(
    (a, b) => cmp(a[0], b[0]) || cmp(a[4] ?? '', b[4] ?? '') || cmp(a[1], b[1]) || cmp(a[3], b[3]) || cmp(a[2], b[2]),
  );
  return records.filter((r, i) => !(r[4] === EARLIER && i > 0 && records[i - 1][0] === r[0]));
}

/** The spool folder of part `i` under the site's temp folder. */
export const spoolDir = (dir: string, i: number) => path.join(dir, '.spool', `part-${i}`);

/** Groups of spool buckets, each written as one batch of shard documents: the unit the parts share out. */
function shardGroups(widths: ShardWidths): { kind: DocKind; folder: string; k: number; buckets: string[] }[] {
  const hex = [...'0123456789abcdef'];
  const out: { kind: DocKind; folder: string; k: number; buckets: string[] }[] = [];
  for (const rule of ROUTES.filter((r) => r.shardFolder)) {
    const k = widths[rule.kind] ?? 1;
    // every spool bucket holds whole shards when the width is 2 or more; width 1 joins 16 buckets
    const groups = k === 1 ? hex.map((a) => hex.map((b) => a + b)) : hex.flatMap((a) => hex.map((b) => [a + b]));
    for (const buckets of groups) out.push({ kind: rule.kind, folder: rule.shardFolder!, k, buckets });
  }
  return out;
}

export class SitePart {
  private readonly ctx: SiteContext;
  private readonly spool: Spool;
  private readonly jl: JsonLd;
  private readonly docs: DocWriter;
  private readonly search: SearchIndex;
  private readonly own = new Map<string, { kind: DocKind; statements: Statement[] }>();
  private constructor(
    private readonly setup: PartSetup,
    private readonly info: SiteInfo,
    private readonly earlier: EarlierSite | undefined,
  ) {
    this.ctx = new SiteContext(info);
    this.ctx.widths = setup.widths;
    for (const d of earlier?.ownDocs ?? []) this.ctx.carried.add(d);
    this.spool = new Spool(spoolDir(setup.dir, setup.part));
    this.jl = new JsonLd(info.base);
    this.docs = new DocWriter(setup.dir, this.jl);
    this.search = new SearchIndex(this.spool, this.ctx);
  }

  static async open(setup: PartSetup): Promise<SitePart> {
    const info = await readSiteInfo(setup.release);
    const earlier = setup.previous ? readEarlierSite(setup.previous, info.base) : undefined;
    return new SitePart(setup, info, earlier);
  }

  get documents(): number {
    return this.docs.documents;
  }

  private shardDoc(kind: DocKind, hash: string): string {
    return docOf({ kind, key: hash, path: '' }, this.ctx.widths);
  }

  private spoolLink(l: LinkEntry, cluster: string | null): void {
    this.spool.add(`link-${l.hash.slice(0, 2)}`, [
      l.hash,
      ntOf(l.statements),
      this.jl.nodes(l.statements),
      linkSection(this.ctx, l, this.shardDoc('link', l.hash), cluster),
    ]);
    for (const m of l.matches) this.spoolEntry(m, l.iri);
  }

  private spoolEntry(e: Entry, link: string | null): void {
    const doc = this.shardDoc(e.kind, e.hash);
    const section = e.kind === 'match' ? matchSection(this.ctx, e, doc, link) : genericSection(this.ctx, e, doc);
    this.spool.add(`${e.kind}-${e.hash.slice(0, 2)}`, [
      e.hash,
      ntOf(e.statements),
      this.jl.nodes(e.statements),
      section,
    ]);
  }

  /**
   * Reads the release once: this part's clusters, stray links and loose entries rendered (cluster documents written,
   * the rest spooled); part 0 then writes the documents of their own and spools the claims kept from an earlier site.
   */
  async stream(): Promise<void> {
    const { ctx, docs, search, own, info } = this;
    const { part, parts } = this.setup;
    const nq = path.join(this.setup.release, RELEASE_FILES.nquads);
    const graphs = new Set<string>();
    // units (clusters, stray links, loose entries) in file order, shared out round-robin: the same in every part
    let unit = 0;
    const mine = () => unit++ % parts === part;
    const grouper = new Grouper(info.base, {
      cluster: (u: ClusterUnit) => {
        if (!mine()) return;
        docs.write(u.doc, ntOf(u.statements), [this.jl.nodes(u.statements)], clusterPage(ctx, u));
        for (const l of u.links) this.spoolLink(l, u.iri);
        search.addWorks(u.statements, u.doc, '');
      },
      strayLink: (l: LinkEntry) => {
        if (!mine()) return;
        this.spoolLink(l, null);
        search.addWorks(l.statements, this.shardDoc('link', l.hash), `link/${l.hash}`);
      },
      entry: (e: Entry) => {
        // every part keeps the reviews' provenance: pages of any part name them
        if (e.kind === 'review') for (const st of e.statements) ctx.addProv(st);
        if (mine()) this.spoolEntry(e, null);
      },
      own: (doc: string, kind: DocKind, st: Statement) => {
        let d = own.get(doc);
        if (!d) own.set(doc, (d = { kind, statements: [] }));
        d.statements.push(st);
        if (kind === 'run' || kind === 'agent' || kind === 'curator' || kind === 'release') ctx.addProv(st);
      },
    });
    await streamNQuads(nq, (st) => {
      if (st.g !== undefined && !graphs.has(st.g)) graphs.add(st.g);
      grouper.push(st);
      return docs.backlog();
    });
    const left = grouper.end();
    if (left.length) throw new Error(`site: ${left.length} statements about no minted IRI at the end of ${nq}`);
    if (part === 0) {
      this.ownDocuments(graphs);
      this.spoolEarlierClaims();
    }
    this.spool.close();
  }

  /** Documents of their own, and a document for every named graph. */
  private ownDocuments(graphs: Set<string>): void {
    const { ctx, info, own } = this;
    for (const g of graphs) {
      const rel = relPath(g, info.base);
      const route = rel === null ? null : routeOf(rel);
      if (route?.kind === 'graph' && !own.has(route.key)) own.set(route.key, { kind: 'graph', statements: [] });
    }
    for (const [doc, d] of [...own].sort((a, b) => (a[0] < b[0] ? -1 : 1))) {
      const extra =
        d.kind === 'dataset' && info.dataset === info.base + doc.split('/').map(encodeURIComponent).join('/')
          ? datasetSummary(ctx, doc)
          : undefined;
      this.docs.write(
        doc,
        ntOf(d.statements),
        [this.jl.nodes(d.statements)],
        genericPage(ctx, doc, d.kind, d.statements, extra),
      );
    }
  }

  /**
   * Claims of an earlier site, kept as that site described them where this release no longer describes them: the
   * shard pass drops the earlier record of a hash this release has (records flagged `EARLIER`).
   */
  private spoolEarlierClaims(): void {
    const { earlier, info } = this;
    if (!earlier) return;
    for (const e of earlierLinks(earlier, info.base)) {
      const entry: LinkEntry = {
        kind: 'link',
        hash: e.hash,
        iri: `${info.base}link/${e.hash}`,
        statements: e.statements,
        matches: [],
      };
      const note = `<p class="aside">This claim is not in release ${info.version}; it is shown as the site of release ${earlier.version} described it.</p>\n`;
      this.spool.add(`link-${e.hash.slice(0, 2)}`, [
        e.hash,
        ntOf(e.statements),
        this.jl.nodes(e.statements),
        linkSection(this.ctx, entry, this.shardDoc('link', e.hash), null).replace(/(<\/h2>\n)/, `$1${note}`),
        EARLIER,
      ]);
    }
  }

  /**
   * After every part has streamed: this part's share of the shard documents and of search, read from the spools of all
   * parts; part 0 then carries over the earlier site's documents and writes the static pages.
   */
  async shards(): Promise<void> {
    const { info, docs } = this;
    const { dir, part, parts } = this.setup;
    const spools = Array.from({ length: parts }, (_, i) => (i === part ? this.spool : new Spool(spoolDir(dir, i))));
    const read = (bucket: string) => spools.flatMap((s) => s.read(bucket));
    const groups = shardGroups(this.ctx.widths).filter((_, i) => i % parts === part);
    for (const { kind, folder, k, buckets } of groups) {
      await docs.backlog();
      const records = shardRecords(buckets.flatMap((b) => read(`${kind}-${b}`)) as SpoolRecord[]);
      const shards = new Map<string, SpoolRecord[]>();
      for (const r of records) {
        const key = r[0].slice(0, k);
        const s = shards.get(key);
        if (s) s.push(r);
        else shards.set(key, [r]);
      }
      for (const [key, rs] of shards) {
        const doc = `${folder}/${key}`;
        const label = kind === 'link' ? 'Claims' : kind === 'match' ? 'Image matches' : 'Curator reviews';
        const main = html`<p>${rs.length} ${label.toLowerCase()} whose identifier begins with <code>${key}</code>.</p>
${
  kind === 'match'
    ? new Safe(MATCH_TABLE_HEAD + rs.map((r) => r[3]).join('') + MATCH_TABLE_TAIL)
    : html`<nav aria-label="On this page"><ul class="toc">${rs.map((r) => html`<li><a href="#${folder}/${r[0]}">${r[0]}</a></li>`)}</ul></nav>
${rs.map((r) => new Safe(r[3]))}`
}`;
        const text = page({
          doc,
          title: `${label} ${key}…`,
          siteTitle: info.title,
          alternates: true,
          main: html`${main}`,
          licence: info.licence,
        });
        docs.write(
          doc,
          rs.map((r) => r[1]).join(''),
          rs.map((r) => r[2]),
          text,
        );
      }
    }
    await docs.close();
    this.search.finish(dir, read, part, parts);
    if (part === 0) {
      if (this.earlier) carryDocuments(this.earlier, dir);
      writeStaticPages(this.ctx, dir, this.own);
    }
  }

  /** Stops the writer thread (after shards, or when the site fails half-way). */
  async stop(): Promise<void> {
    await this.docs.stop();
  }
}
