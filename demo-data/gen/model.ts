// Invented artworks and the partner records that show them → the typed scenario the writers turn into files.
import { renderDate, type DateStyle } from './dates.js';
import { IdMint, PARTNERS, type PartnerKey } from './partners.js';
import type { Rng } from './rng.js';
import { baseTitle, detailTitle, replicaTitle, SUBJECTS, QUALIFIERS, DETAIL_PARTS } from './titles.js';

/** One real-world object in the story (the truth the archives only partly know). */
export interface Art {
  id: number;
  kind: 'work' | 'detail' | 'replica';
  subject: number;
  qualifier: number;
  /** The year every honest rendering contains. */
  year: number;
  /** For a detail, the whole; for a replica, the original. */
  of?: Art;
  detailPart: number;
  labelled: boolean;
  /** Only exact date styles, so a deliberate conflict is not blurred. */
  narrow: boolean;
}

export interface Img {
  id: string;
  width: number;
  height: number;
}

/** One partner record: one work ID, its title and date, one or more photographs. */
export interface Rec {
  partner: PartnerKey;
  work: string;
  art: Art;
  title: string;
  date: string;
  /** Set only on the one work whose rows disagree on the date. */
  rowDates?: string[];
  images: Img[];
  photographer: number;
}

/** Kinds of matched work pairs the matcher run reports. */
export type PairKind =
  'same' | 'weak' | 'bridge' | 'false-bridge' | 'part' | 'small-part' | 'replica' | 'duplicate' | 'fading' | 'faded';

/** Score and overlap ranges per kind, and the share of rows with a blank overlap (blank = 1). */
export const RANGES: Record<
  PairKind,
  { score: [number, number]; overlap: [number, number]; blank: number; maxImages: number }
> = {
  same: { score: [0.76, 0.99], overlap: [0.8, 1], blank: 0.15, maxImages: 3 },
  duplicate: { score: [0.85, 0.99], overlap: [0.85, 1], blank: 0.15, maxImages: 2 },
  weak: { score: [0.3, 0.48], overlap: [0.75, 1], blank: 0, maxImages: 1 },
  bridge: { score: [0.91, 0.95], overlap: [0.8, 0.95], blank: 0, maxImages: 1 },
  'false-bridge': { score: [0.92, 0.95], overlap: [0.85, 0.95], blank: 0, maxImages: 1 },
  part: { score: [0.7, 0.9], overlap: [0.3, 0.6], blank: 0, maxImages: 2 },
  // a detail so small in the whole that the overlap falls below the policy's minOverlap (0.3)
  'small-part': { score: [0.7, 0.9], overlap: [0.1, 0.28], blank: 0, maxImages: 1 },
  replica: { score: [0.62, 0.75], overlap: [0.8, 1], blank: 0, maxImages: 2 },
  fading: { score: [0.76, 0.78], overlap: [0.8, 1], blank: 0, maxImages: 1 },
  // the same pair in a rerun that tells it apart better: below proposeAt, the link disappears
  faded: { score: [0.36, 0.44], overlap: [0.8, 1], blank: 0, maxImages: 1 },
};

/** A work pair the matcher saw; image pairs are chosen once and kept for the rerun. */
export interface PairSpec {
  a: Rec;
  b: Rec;
  kind: PairKind;
  imagePairs: [number, number][];
}

/** `partnerKey:workId`, the form used in decisions and gold files. */
export const ref = (r: Rec): string => `${r.partner}:${r.work}`;

/** A year nobody would place on a century boundary; mostly a multiple of five, as cataloguers write them. */
export function plainYear(rng: Rng): number {
  for (;;) {
    const y = rng.chance(0.8) ? 5 * rng.int(280, 312) : rng.int(1400, 1560);
    if (y % 100 >= 5 && y % 100 <= 95) return y;
  }
}

/** Collects artworks, records and matched pairs while a release's story is told. */
export class Builder {
  readonly arts: Art[] = [];
  readonly recs: Rec[] = [];
  readonly pairs: PairSpec[] = [];

  constructor(
    readonly rng: Rng,
    readonly ids: IdMint,
    firstArt = 1,
  ) {
    this.nextArt = firstArt;
  }

  private nextArt: number;

  /** A new artwork; details and replicas borrow their subject from `of`. */
  art(
    opts: { kind?: Art['kind']; of?: Art; year?: number; narrow?: boolean; subject?: number; qualifier?: number } = {},
  ): Art {
    const { rng } = this;
    const of = opts.of;
    const art: Art = {
      id: this.nextArt++,
      kind: opts.kind ?? 'work',
      subject: opts.subject ?? (of ? of.subject : rng.int(0, SUBJECTS.length - 1)),
      qualifier: opts.qualifier ?? (of ? of.qualifier : rng.chance(0.35) ? rng.int(1, QUALIFIERS.length - 1) : 0),
      year: opts.year ?? (of ? of.year : plainYear(rng)),
      of,
      detailPart: rng.int(0, DETAIL_PARTS.length - 1),
      labelled: rng.chance(0.5),
      narrow: opts.narrow ?? false,
    };
    this.arts.push(art);
    return art;
  }

  /** A partner record of an artwork, with 1–4 photographs. */
  rec(
    partner: PartnerKey,
    art: Art,
    opts: { date?: string; title?: string; work?: string; images?: number } = {},
  ): Rec {
    const { rng } = this;
    const work = opts.work ?? this.ids.work(partner);
    const count =
      opts.images ??
      rng.weighted([
        [1, 25],
        [2, 40],
        [3, 25],
        [4, 10],
      ] as const);
    const images = this.ids.images(partner, work, count).map((id) => ({
      id,
      width: rng.int(1600, 4200),
      height: rng.int(1600, 4200),
    }));
    const rec: Rec = {
      partner,
      work,
      art,
      images,
      photographer: rng.int(0, 5),
      title: opts.title ?? this.title(partner, art),
      date: opts.date ?? this.date(partner, art),
    };
    this.recs.push(rec);
    return rec;
  }

  /** A second record of the same artwork at the same partner. */
  duplicate(of: Rec): Rec {
    return this.rec(of.partner, of.art, {
      work: this.ids.duplicateOf(of.partner, of.work),
      title: of.title,
      date: of.date,
    });
  }

  /** The matcher reports this work pair; which photographs matched is drawn here. */
  link(a: Rec, b: Rec, kind: PairKind): PairSpec {
    const all: [number, number][] = [];
    for (let i = 0; i < a.images.length; i++) for (let j = 0; j < b.images.length; j++) all.push([i, j]);
    const n = Math.min(this.rng.int(1, RANGES[kind].maxImages), all.length);
    const spec: PairSpec = { a, b, kind, imagePairs: this.rng.shuffle(all).slice(0, n) };
    this.pairs.push(spec);
    return spec;
  }

  private title(partner: PartnerKey, art: Art): string {
    const lang = PARTNERS[partner].lang;
    if (art.kind === 'detail' && art.of)
      return detailTitle(baseTitle(art.subject, art.qualifier, lang), art.detailPart, lang);
    return replicaTitle(baseTitle(art.subject, art.qualifier, lang), art.kind === 'replica' && art.labelled, lang);
  }

  /** A date in one of the partner's styles that fits the artwork's year. */
  date(partner: PartnerKey, art: Art, year = art.year): string {
    const spec = PARTNERS[partner];
    const convention = spec.convention ?? 'unknown';
    const styles: readonly (readonly [DateStyle, number])[] = art.narrow
      ? spec.narrow.map((s) => [s, 1] as const)
      : spec.styles;
    for (;;) {
      const text = renderDate(year, this.rng.weighted(styles), convention, spec.lang);
      if (text !== null) return text;
    }
  }
}
