// Seed + scale → a synthetic concordat project (catalogues, evidence with look-alikes and indiscriminate scans,
// decisions, gold, answer key) streamed to files.
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
  /** Rates of the phenomena, to vary the consortium (defaults: PHENOMENA, JUNK, MISDATED). */
  rates?: Rates;
}

/**
 * Rates a scenario may change: share of artworks with a detail record, with a look-alike work, share of records with a
 * matcher error or a misdated catalogue entry, and a factor on every junk-scan rate of JUNK.
 */
export interface Rates {
  detail?: number;
  lookAlike?: number;
  matcherError?: number;
  junk?: number;
  misdated?: number;
}

/**
 * Share of records catalogued with a date one to three centuries off their artwork's (a slip of the century, a copy
 * dated as its model; common practice, no source). Drawn from a stream of its own, so the rest of a scenario does not
 * move with it.
 */
export const MISDATED = 0.005;

export interface GenerateSummary {
  projectFile: string;
  /**
   * `answer-key.csv`: `work,artwork,part_of,misdated` for every work (the truth the matcher only partly sees; misdated
   * 1 for a record whose catalogue date is centuries off its artwork's).
   */
  answerKey: string;
  works: number;
  images: number;
  evidenceRows: number;
  decisions: number;
  gold: number;
}

/** sfc32 pseudo-random generator (small fast counter, public-domain algorithm), seeded through splitmix32. */
export class Rng {
  private a: number;
  private b: number;
  private c: number;
  private d: number;
  constructor(seed: number) {
    let s = seed >>> 0;
    const mix = () => {
      s = (s + 0x9e3779b9) >>> 0;
      let z = s;
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
      return (z ^ (z >>> 16)) >>> 0;
    };
    this.a = mix();
    this.b = mix();
    this.c = mix();
    this.d = mix();
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
  int(n: number): number {
    return Math.floor(this.next() * n);
  }
  pick<T>(xs: readonly T[]): T {
    return xs[this.int(xs.length)];
  }
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
  constructor(file: string) {
    this.out = createWriteStream(file);
  }
  async line(s: string): Promise<void> {
    this.parts.push(s, '\n');
    this.size += s.length + 1;
    if (this.size >= 1 << 20) await this.flush();
  }
  private async flush(): Promise<void> {
    if (this.size === 0) return;
    const ok = this.out.write(this.parts.join(''));
    this.parts = [];
    this.size = 0;
    if (!ok) await once(this.out, 'drain');
  }
  async close(): Promise<void> {
    await this.flush();
    this.out.end();
    await once(this.out, 'finish');
  }
}

const SUBJECTS = [
  'Madonna and Child',
  'Saint Jerome',
  'Annunciation',
  'Crucifixion',
  'Saint Barbara',
  'Lamentation',
  'Adoration of the Magi',
  'Saint George',
  'Pieta',
  'Nativity',
  'Saint Catherine',
  'Deposition',
  'Portrait of a Donor',
  'Saint Anne',
  'Last Supper',
  'Resurrection',
];
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
const CURATORS = ['https://orcid.org/0000-0002-1825-0097', 'Ilse Marwitz', 'Tomas Okafor', 'Rhea Lindqvist'];

const partnerKey = (p: number) => `arch${String(p + 1).padStart(2, '0')}`;
const workId = (p: number, local: number) => `W${p + 1}-${String(local).padStart(7, '0')}`;
const imageId = (p: number, local: number, k: number) => `${workId(p, local)}/${k + 1}`;
const score = (x: number) => x.toFixed(3);
const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/**
 * What the scenario holds, per artwork or record (common practice of photo archives, no source; the rates are the
 * issue's consortium: about 4% of records with a mount-back scan):
 * - DETAIL: a detail or single panel of the artwork catalogued as a record of its own (a part);
 * - LOOK_ALIKE: a look-alike work that is not the same work (workshop replica, another print from the plate, pendant);
 * - scans that match regardless of the artwork, per record: mount back, colour chart, photographer's stamp, blank
 * frame.
 */
export const PHENOMENA = { detail: 0.05, lookAlike: 0.06, matcherError: 0.01 } as const;
/** Junk scans: share of records that have one, and how many other scans of the kind the matcher pairs each with. */
export const JUNK = [
  { kind: 'mount', word: 'Verso', rate: 0.04, k: [3, 20] },
  { kind: 'chart', word: 'Farbkarte', rate: 0.01, k: [5, 30] },
  { kind: 'stamp', word: 'Stempel', rate: 0.005, k: [2, 10] },
  { kind: 'blank', word: 'Leeraufnahme', rate: 0.003, k: [3, 15] },
] as const;
/** The partner that records image roles (a role column; the others do not). */
const ROLE_PARTNER = 0;
const ROLE_WORDS: Record<string, string> = {
  Recto: 'artwork',
  Detail: 'detail',
  Verso: 'verso',
  Farbkarte: 'chart',
  Stempel: 'stamp',
  Leeraufnahme: 'blank',
};

/**
 * Score of a true match between two records of one artwork: most high, a tail down to 0.5 (different photo campaigns):
 * a sixth below 0.75, where look-alikes score too.
 */
const trueBase = (rng: Rng) => 0.5 + 0.47 * rng.next() ** 0.35;

/**
 * Writes a synthetic project of `works` partner works into `dir` in the input contract (design, "Inputs"), with an
 * answer key. Artworks are held by 1–4 partners; 1–5 photos per record. The matcher finds 96% of true record pairs
 * (each photo pair with probability 0.55, at least one), scores 0.5–0.97 skewed high (a sixth below 0.75) with ±0.04
 * jitter, so true single-photo pairs at moderate scores exist; details (5% of artworks) match 1–2 photos of their whole
 * at 0.62–0.92
 * with overlap 0.3–0.65 (one row in 25 at 0.12–0.28, below minOverlap: never proposed); look-alike works (6%) share one
 * photo pair (a quarter two) with one
 * record of the original at 0.55–0.8, overlapping the true scores; 1% of works get a matcher error (an unrelated work
 * at 0.5–0.68); junk scans (JUNK) are each paired with k random others of their kind at 0.65–0.97, one partner records
 * their role; low-score noise ≈ 5.5 rows per work. Curators decide ≈ 1% of true pairs (`same`), a fifth of the
 * look-alikes (`distinct`) and a tenth of the details (`part`); gold: 5% of true pairs. Same options → same bytes.
 */
export async function generateProject(dir: string, opts: GenerateOptions): Promise<GenerateSummary> {
  const { works: N, seed } = opts;
  const P = opts.partners;
  if (!(P >= 3 && P <= 25)) throw new RangeError('partners must be 3–25');
  if (!(N >= 1)) throw new RangeError('works must be at least 1');
  for (const sub of ['catalogues', 'evidence', 'decisions', 'gold'])
    mkdirSync(path.join(dir, sub), { recursive: true });

  const rng = new Rng(seed);
  const dating = new Rng(seed ^ 0x6d15da7e); // misdated records: a stream of their own
  const rate = { ...PHENOMENA, junk: 1, misdated: MISDATED, ...opts.rates };
  const partnerOf = new Uint8Array(N),
    localOf = new Int32Array(N),
    imgCount = new Uint8Array(N),
    photos = new Uint8Array(N);
  const artOf = new Int32Array(N);
  const artStart: number[] = [];
  /** Per artwork: 0 an artwork, 1 a detail of `artOfArt`, 2 a look-alike of it. */
  const artKind: number[] = [],
    artRef: number[] = [];
  const nextLocal = new Int32Array(P);
  const delim = Array.from({ length: P }, (_, p) => DELIMS[p % DELIMS.length]);
  const cats = Array.from(
    { length: P },
    (_, p) => new ChunkWriter(path.join(dir, 'catalogues', `${partnerKey(p)}.csv`)),
  );
  for (let p = 0; p < P; p++)
    await cats[p].line(
      ['work_no', 'photo_no', 'title', 'date', ...(p === ROLE_PARTNER ? ['role'] : [])].join(delim[p]),
    );
  const key = new ChunkWriter(path.join(dir, 'answer-key.csv'));
  await key.line('work,artwork,part_of,misdated');
  const junk = JUNK.map(() => ({ work: [] as number[], k: [] as number[] }));

  // Pass 1: artworks (with their details and look-alikes) → partner records, photos and junk scans (catalogue rows).
  let images = 0;
  let w = 0;
  const addArtwork = async (kind: number, of: number, copies: number, title: string, year: number) => {
    const art = artStart.length;
    artStart.push(w);
    artKind.push(kind);
    artRef.push(of);
    const chosen = new Set<number>();
    while (chosen.size < Math.min(copies, N - w, P)) chosen.add(rng.int(P));
    for (const p of chosen) {
      partnerOf[w] = p;
      localOf[w] = nextLocal[p]++;
      artOf[w] = art;
      photos[w] = kind === 1 ? 1 + rng.int(2) : 1 + rng.weighted([15, 35, 70, 90, 100]);
      const extra: number[] = [];
      JUNK.forEach((j, t) => {
        if (rng.next() < j.rate * rate.junk) {
          extra.push(t);
          junk[t].work.push(w);
          junk[t].k.push(photos[w] + extra.length - 1);
        }
      });
      imgCount[w] = photos[w] + extra.length;
      const t = kind === 1 ? `${title} (detail)` : title + rng.pick(PARTS);
      let date = rng.pick(DATE_STYLES)(year + rng.int(11) - 5);
      const off = dating.next() < rate.misdated && date !== '';
      if (off)
        date = DATE_STYLES[dating.int(DATE_STYLES.length - 1)](
          year + (dating.next() < 0.5 ? -1 : 1) * (100 + dating.int(200)),
        );
      for (let k = 0; k < imgCount[w]; k++) {
        const role = k < photos[w] ? (kind === 1 ? 'Detail' : 'Recto') : JUNK[extra[k - photos[w]]].word;
        await cats[p].line(
          [workId(p, localOf[w]), imageId(p, localOf[w], k), t, date, ...(p === ROLE_PARTNER ? [role] : [])].join(
            delim[p],
          ),
        );
      }
      await key.line(`${partnerKey(p)}:${workId(p, localOf[w])},A${art},${kind === 1 ? `A${of}` : ''},${off ? 1 : ''}`);
      images += imgCount[w];
      w++;
    }
    return art;
  };
  while (w < N) {
    const title = rng.pick(SUBJECTS);
    const year = 1380 + rng.int(220);
    const art = await addArtwork(0, -1, rng.weighted(COPIES_CUM) + 1, title, year);
    if (w < N && rng.next() < rate.detail) await addArtwork(1, art, 1, title, year);
    if (w < N && rng.next() < rate.lookAlike) await addArtwork(2, art, 1 + rng.int(2), title, year + rng.int(30));
  }
  artStart.push(N);
  for (const c of cats) await c.close();
  await key.close();

  // Pass 2: evidence (true matches, details, look-alikes, errors, junk, noise), decisions and gold.
  const ev = new ChunkWriter(path.join(dir, 'evidence', 'run.csv'));
  const dec = new ChunkWriter(path.join(dir, 'decisions', 'curators.csv'));
  const gold = new ChunkWriter(path.join(dir, 'gold', 'gold.csv'));
  await ev.line('image_a,image_b,score,overlap');
  await dec.line('work_a,work_b,verdict,curator,date,note');
  await gold.line('work_a,work_b');
  const img = (x: number, k: number) => `${partnerKey(partnerOf[x])}:${imageId(partnerOf[x], localOf[x], k)}`;
  const work = (x: number) => `${partnerKey(partnerOf[x])}:${workId(partnerOf[x], localOf[x])}`;
  let rows = 0,
    decisions = 0,
    golds = 0;
  const row = async (a: string, b: string, s: number, ov: number | null) => {
    await ev.line(`${a},${b},${score(clamp(s, 0, 1))},${ov === null ? '' : score(ov)}`);
    rows++;
  };
  const decide = async (x: number, y: number, verdict: string) => {
    const day = String(1 + rng.int(28)).padStart(2, '0');
    await dec.line(`${work(x)},${work(y)},${verdict},${rng.pick(CURATORS)},2026-10-${day},`);
    decisions++;
  };
  for (let a = 0; a + 1 < artStart.length; a++) {
    const [s0, s1] = [artStart[a], artStart[a + 1]];
    for (let x = s0; x < s1; x++) {
      for (let y = x + 1; y < s1; y++) {
        if (rng.next() < 0.04) continue; // the matcher misses the pair
        const base = trueBase(rng);
        const pairs: [number, number][] = [];
        for (let i = 0; i < photos[x]; i++)
          for (let j = 0; j < photos[y]; j++) if (rng.next() < 0.55) pairs.push([i, j]);
        if (pairs.length === 0) pairs.push([rng.int(photos[x]), rng.int(photos[y])]);
        for (const [i, j] of pairs)
          await row(
            img(x, i),
            img(y, j),
            clamp(base + (rng.next() - 0.5) * 0.08, 0.45, 0.995),
            rng.next() < 0.1 ? null : 0.75 + rng.next() * 0.25,
          );
        if (rng.next() < 0.01) await decide(x, y, 'same');
        if (rng.next() < 0.05) {
          await gold.line(`${work(x)},${work(y)}`);
          golds++;
        }
      }
      // background: a low-score match with a random other work, ~5.5 per work; now and then a curator rejects one
      const noise = rng.int(12);
      for (let n = 0; n < noise; n++) {
        const y = rng.int(N);
        if (y >= s0 && y < s1) continue;
        await row(
          img(x, rng.int(photos[x])),
          img(y, rng.int(photos[y])),
          0.05 + rng.next() * 0.4,
          0.3 + rng.next() * 0.7,
        );
        if (rng.next() < 0.003) await decide(x, y, 'distinct');
      }
      if (rng.next() < rate.matcherError) {
        const y = rng.int(N);
        if (artOf[y] !== a && artRef[artOf[y]] !== a && artRef[a] !== artOf[y])
          await row(
            img(x, rng.int(photos[x])),
            img(y, rng.int(photos[y])),
            0.5 + rng.next() * 0.18,
            0.8 + rng.next() * 0.2,
          );
      }
    }
    if (artKind[a] === 0) continue;
    const of = artRef[a];
    const [o0, o1] = [artStart[of], artStart[of + 1]];
    if (artKind[a] === 1) {
      // a detail: its photo (image_a) matches 1–2 photos of 1–2 records of the whole, on a small region
      const d = s0;
      for (let n = 1 + rng.int(2), t = 0; t < n && t < o1 - o0; t++) {
        const whole = o0 + ((t + rng.int(o1 - o0)) % (o1 - o0));
        // a detail so small in the whole that the overlap is not to be trusted (below minOverlap)
        const small = rng.next() < 0.04;
        await row(
          img(d, 0),
          img(whole, rng.int(photos[whole])),
          0.62 + rng.next() * 0.3,
          small ? 0.12 + rng.next() * 0.16 : 0.3 + rng.next() * 0.35,
        );
        if (rng.next() < 0.1) await decide(d, whole, 'part');
      }
    } else {
      // a look-alike: one record of it shares one photo pair (a quarter: two) with one record of the original
      const x = s0 + rng.int(s1 - s0),
        y = o0 + rng.int(o1 - o0);
      const base = 0.55 + rng.next() * 0.25;
      const n = rng.next() < 0.25 ? 2 : 1;
      for (let t = 0; t < n; t++)
        await row(
          img(x, t % photos[x]),
          img(y, (t + rng.int(photos[y])) % photos[y]),
          base - t * rng.next() * 0.05,
          0.8 + rng.next() * 0.2,
        );
      if (rng.next() < 0.2) await decide(x, y, 'distinct');
    }
  }
  // junk scans: each paired with k random others of its kind, high scores whatever the artwork
  for (const [t, j] of JUNK.entries()) {
    const list = junk[t];
    const n = list.work.length;
    if (n < 2) continue;
    const seen = new Set<number>();
    for (let i = 0; i < n; i++) {
      const k = Math.min(n - 1, j.k[0] + rng.int(j.k[1] - j.k[0] + 1));
      for (let m = 0; m < k; m++) {
        const o = (i + 1 + rng.int(n - 1)) % n;
        const pk = Math.min(i, o) * n + Math.max(i, o);
        if (seen.has(pk) || list.work[i] === list.work[o]) continue;
        seen.add(pk);
        await row(
          img(list.work[i], list.k[i]),
          img(list.work[o], list.k[o]),
          0.65 + rng.next() * 0.32,
          rng.next() < 0.3 ? null : 0.85 + rng.next() * 0.15,
        );
      }
    }
  }
  await ev.close();
  await dec.close();
  await gold.close();

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
      catalogue: {
        file: `catalogues/${partnerKey(p)}.csv`,
        delimiter: delim[p],
        columns: {
          work: 'work_no',
          image: 'photo_no',
          title: 'title',
          date: 'date',
          ...(p === ROLE_PARTNER ? { role: 'role' } : {}),
        },
        ...(p === ROLE_PARTNER ? { roles: ROLE_WORDS } : {}),
      },
    })),
    evidence: [
      {
        file: 'evidence/run.csv',
        run: {
          id: 'bench-run-1',
          software: 'synthetic-matcher',
          version: '1.0.0',
          started: '2026-10-04T09:00:00Z',
          parameters: { seed },
        },
      },
    ],
    decisions: ['decisions/curators.csv'],
    gold: 'gold/gold.csv',
    policy: { proposeAt: 0.5, autoConfirmAt: null, partOverlapBelow: 0.7, minOverlap: 0.3 },
    ...(opts.partnerDumps === false ? { release: { version: '0', partnerDumps: false } } : {}),
  };
  const projectFile = path.join(dir, 'concordance.json');
  writeFileSync(projectFile, JSON.stringify(project, null, 2) + '\n');
  return {
    projectFile,
    answerKey: path.join(dir, 'answer-key.csv'),
    works: N,
    images,
    evidenceRows: rows,
    decisions,
    gold: golds,
  };
}
