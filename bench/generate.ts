// Seed + scale → a synthetic concordat project (concordance.json, catalogues, evidence, decisions, gold) streamed to files.
import { createWriteStream, mkdirSync, writeFileSync, type WriteStream } from 'node:fs';
import { once } from 'node:events';
import path from 'node:path';

export interface GenerateOptions {
  /** Partner works to generate (exactly this many catalogue records). */
  works: number;
  /** Partner archives, 3–25. */
  partners: number;
  seed: number;
  /** Write per-partner slices when built (the project's release.partnerDumps; default true). */
  partnerDumps?: boolean;
}

export interface GenerateSummary {
  projectFile: string;
  works: number;
  images: number;
  evidenceRows: number;
  decisions: number;
  gold: number;
}

/** sfc32 pseudo-random generator (small fast counter, public-domain algorithm), seeded through splitmix32. */
export class Rng {
  private a: number; private b: number; private c: number; private d: number;
  constructor(seed: number) {
    let s = seed >>> 0;
    const mix = () => {
      s = (s + 0x9e3779b9) >>> 0;
      let z = s;
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
      return (z ^ (z >>> 16)) >>> 0;
    };
    this.a = mix(); this.b = mix(); this.c = mix(); this.d = mix();
    for (let i = 0; i < 12; i++) this.next();
  }
  /** Uniform in [0, 1). */
  next(): number {
    const t = (((this.a + this.b) >>> 0) + this.d) >>> 0;
    this.d = (this.d + 1) >>> 0;
    this.a = this.b ^ (this.b >>> 9);
    this.b = (this.c + (this.c << 3)) >>> 0;
    this.c = ((this.c << 21) | (this.c >>> 11)) >>> 0;
    this.c = (this.c + t) >>> 0;
    return t / 4294967296;
  }
  int(n: number): number { return Math.floor(this.next() * n); }
  pick<T>(xs: readonly T[]): T { return xs[this.int(xs.length)]; }
  /** Index into cumulative weights. */
  weighted(cum: readonly number[]): number {
    const r = this.next() * cum[cum.length - 1];
    let i = 0;
    while (cum[i] <= r) i++;
    return i;
  }
}

/** Line-oriented file writer that hands the stream 1 MiB chunks and waits for drain (never one big string). */
class ChunkWriter {
  private readonly out: WriteStream;
  private parts: string[] = [];
  private size = 0;
  constructor(file: string) { this.out = createWriteStream(file); }
  async line(s: string): Promise<void> {
    this.parts.push(s, '\n');
    this.size += s.length + 1;
    if (this.size >= 1 << 20) await this.flush();
  }
  private async flush(): Promise<void> {
    if (this.size === 0) return;
    const ok = this.out.write(this.parts.join(''));
    this.parts = []; this.size = 0;
    if (!ok) await once(this.out, 'drain');
  }
  async close(): Promise<void> {
    await this.flush();
    this.out.end();
    await once(this.out, 'finish');
  }
}

const SUBJECTS = ['Madonna and Child', 'Saint Jerome', 'Annunciation', 'Crucifixion', 'Saint Barbara', 'Lamentation', 'Adoration of the Magi', 'Saint George', 'Pieta', 'Nativity', 'Saint Catherine', 'Deposition', 'Portrait of a Donor', 'Saint Anne', 'Last Supper', 'Resurrection'];
const PARTS = ['', ' (left wing)', ' (right wing)', ' (centre panel)', ' (predella)', ' (fragment)'];
/** Catalogue date styles the loader reads (plain year, approximate, range, century phrase, EDTF unspecified digit). */
const DATE_STYLES: ReadonlyArray<(y: number) => string> = [
  (y) => String(y),
  (y) => `ca. ${y}`,
  (y) => `${y - 10}-${y + 10}`,
  (y) => `${y % 100 < 50 ? 'early' : 'late'} ${Math.floor(y / 100) + 1}th century`,
  (y) => `${Math.floor(y / 10)}X`,
  () => '',
];
const DELIMS = [',', ';', '\t'];
/** Copies per artwork: 1–4, weights 30/40/20/10 (mean ≈ 2.1 partner works per artwork). */
const COPIES_CUM = [30, 70, 90, 100];
/** Curator verdict mix (cumulative weights): same, part, related, distinct. */
const VERDICT_CUM = [70, 80, 85, 100];
const VERDICTS = ['same', 'part', 'related', 'distinct'];
const CURATORS = ['https://orcid.org/0000-0002-1825-0097', 'Ilse Marwitz', 'Tomas Okafor', 'Rhea Lindqvist'];

const partnerKey = (p: number) => `arch${String(p + 1).padStart(2, '0')}`;
const workId = (p: number, local: number) => `W${p + 1}-${String(local).padStart(7, '0')}`;
const imageId = (p: number, local: number, k: number) => `${workId(p, local)}/${k + 1}`;
const score = (x: number) => x.toFixed(3);

/**
 * Writes a synthetic project of `works` partner works into `dir` in the input contract (design, "Inputs"): artworks held
 * by 1–4 of the partners, ~3 photos per work, ~10 evidence rows per work (true matches plus low-score noise and a few
 * partial details), curator decisions for about 1% of the links, and a gold sample. Same options → byte-identical files.
 */
export async function generateProject(dir: string, opts: GenerateOptions): Promise<GenerateSummary> {
  const { works: N, seed } = opts;
  const P = opts.partners;
  if (!(P >= 3 && P <= 25)) throw new RangeError('partners must be 3–25');
  if (!(N >= 1)) throw new RangeError('works must be at least 1');
  for (const sub of ['catalogues', 'evidence', 'decisions', 'gold']) mkdirSync(path.join(dir, sub), { recursive: true });

  const rng = new Rng(seed);
  const partnerOf = new Uint8Array(N), localOf = new Int32Array(N), imgCount = new Uint8Array(N);
  const artStart: number[] = [];
  const nextLocal = new Int32Array(P);
  const delim = Array.from({ length: P }, (_, p) => DELIMS[p % DELIMS.length]);
  const cats = Array.from({ length: P }, (_, p) => new ChunkWriter(path.join(dir, 'catalogues', `${partnerKey(p)}.csv`)));
  for (let p = 0; p < P; p++) await cats[p].line(['work_no', 'photo_no', 'title', 'date'].join(delim[p]));

  // Pass 1: artworks → partner works and their photos (catalogue rows).
  let images = 0;
  for (let w = 0; w < N;) {
    artStart.push(w);
    const copies = Math.min(rng.weighted(COPIES_CUM) + 1, N - w, P);
    const title = rng.pick(SUBJECTS);
    const year = 1380 + rng.int(220);
    const chosen = new Set<number>();
    while (chosen.size < copies) chosen.add(rng.int(P));
    for (const p of chosen) {
      partnerOf[w] = p; localOf[w] = nextLocal[p]++;
      imgCount[w] = 1 + rng.weighted([15, 35, 70, 90, 100]); // 1–5 photos, mean ≈ 2.9
      const t = title + rng.pick(PARTS), date = rng.pick(DATE_STYLES)(year + rng.int(11) - 5);
      for (let k = 0; k < imgCount[w]; k++) await cats[p].line([workId(p, localOf[w]), imageId(p, localOf[w], k), t, date].join(delim[p]));
      images += imgCount[w];
      w++;
    }
  }
  artStart.push(N);
  for (const c of cats) await c.close();

  // Pass 2: evidence (true matches between copies, noise between random works), decisions and gold.
  const ev = new ChunkWriter(path.join(dir, 'evidence', 'run.csv'));
  const dec = new ChunkWriter(path.join(dir, 'decisions', 'curators.csv'));
  const gold = new ChunkWriter(path.join(dir, 'gold', 'gold.csv'));
  await ev.line('image_a,image_b,score,overlap');
  await dec.line('work_a,work_b,verdict,curator,date,note');
  await gold.line('work_a,work_b');
  const img = (w: number, k: number) => `${partnerKey(partnerOf[w])}:${imageId(partnerOf[w], localOf[w], k)}`;
  const work = (w: number) => `${partnerKey(partnerOf[w])}:${workId(partnerOf[w], localOf[w])}`;
  let rows = 0, decisions = 0, golds = 0;
  for (let a = 0; a + 1 < artStart.length; a++) {
    for (let x = artStart[a]; x < artStart[a + 1]; x++) {
      for (let y = x + 1; y < artStart[a + 1]; y++) {
        const detail = rng.next() < 0.06; // one work photographs a detail of the other
        const base = 0.45 + rng.next() * 0.5;
        for (let i = 0; i < imgCount[x]; i++) for (let j = 0; j < imgCount[y]; j++) {
          if (rng.next() < 0.2) continue;
          const s = Math.min(1, base + rng.next() * 0.05);
          const ov = detail ? 0.3 + rng.next() * 0.35 : 0.7 + rng.next() * 0.3;
          await ev.line(`${img(x, i)},${img(y, j)},${score(s)},${rng.next() < 0.1 ? '' : score(ov)}`);
          rows++;
        }
        if (rng.next() < 0.06) {
          const v = VERDICTS[rng.weighted(VERDICT_CUM)];
          const day = String(1 + rng.int(28)).padStart(2, '0');
          await dec.line(`${work(x)},${work(y)},${v},${rng.pick(CURATORS)},2026-10-${day},`);
          decisions++;
        }
        if (rng.next() < 0.05) { await gold.line(`${work(x)},${work(y)}`); golds++; }
      }
      // Noise: a low-score match with a random other work, ~5.5 per work; now and then a curator rejects one.
      const noise = rng.int(12);
      for (let n = 0; n < noise; n++) {
        const y = rng.int(N);
        if (y >= artStart[a] && y < artStart[a + 1]) continue;
        await ev.line(`${img(x, rng.int(imgCount[x]))},${img(y, rng.int(imgCount[y]))},${score(0.05 + rng.next() * 0.4)},${score(0.3 + rng.next() * 0.7)}`);
        rows++;
        if (rng.next() < 0.003) { await dec.line(`${work(x)},${work(y)},distinct,${rng.pick(CURATORS)},2026-10-15,noise`); decisions++; }
      }
    }
  }
  await ev.close(); await dec.close(); await gold.close();

  const project = {
    title: `Synthetic concordance of ${N} works`,
    base: 'https://concordance.bench.example.org/',
    license: 'https://creativecommons.org/publicdomain/zero/1.0/',
    publisher: { name: 'Benchmark Consortium', homepage: 'https://bench.example.org/' },
    partners: Array.from({ length: P }, (_, p) => ({
      key: partnerKey(p),
      name: `Synthetic Photo Archive ${p + 1}`,
      homepage: `https://${partnerKey(p)}.example.org/`,
      workIri: `https://${partnerKey(p)}.example.org/id/work/{work}`,
      imageIri: `https://${partnerKey(p)}.example.org/id/image/{image}`,
      recordPage: `https://${partnerKey(p)}.example.org/records/{work}`,
      centuryConvention: p % 2 === 0 ? 'ordinal' : 'iso',
      catalogue: { file: `catalogues/${partnerKey(p)}.csv`, delimiter: delim[p], columns: { work: 'work_no', image: 'photo_no', title: 'title', date: 'date' } },
    })),
    evidence: [{ file: 'evidence/run.csv', run: { id: 'bench-run-1', software: 'synthetic-matcher', version: '1.0.0', started: '2026-10-04T09:00:00Z', parameters: { seed } } }],
    decisions: ['decisions/curators.csv'],
    gold: 'gold/gold.csv',
    policy: { proposeAt: 0.5, autoConfirmAt: null, partOverlapBelow: 0.7, minOverlap: 0.3 },
    ...(opts.partnerDumps === false ? { release: { version: '0', partnerDumps: false } } : {}),
  };
  const projectFile = path.join(dir, 'concordance.json');
  writeFileSync(projectFile, JSON.stringify(project, null, 2) + '\n');
  return { projectFile, works: N, images, evidenceRows: rows, decisions, gold: golds };
}
