// The four invented partner archives → their export habits: columns, delimiter, BOM, line ends, IDs, date styles.
import type { TextFormat } from './csv.js';
import type { Convention, DateStyle } from './dates.js';
import type { Lang } from './titles.js';
import type { Rng } from './rng.js';

export type PartnerKey = 'vellmar' | 'kessling' | 'fontclaire' | 'brindle';

/** What a catalogue column holds; only work, image, title, date, width and height are mapped in the project file. */
export type Field = 'work' | 'image' | 'title' | 'date' | 'width' | 'height' | 'photographer' | 'location' | 'remark';

/** One partner as the scenario knows it. */
export interface PartnerSpec {
  key: PartnerKey;
  name: string;
  host: string;
  /** Written to the project file; omitted means unknown. */
  convention?: Exclude<Convention, 'unknown'>;
  /** Catalogue path relative to the release-1 project file. */
  file: string;
  format: TextFormat;
  /** Header → field, in file order. */
  columns: readonly (readonly [string, Field])[];
  lang: Lang;
  /** The date language written to the project file; omitted means every language is tried. */
  language?: 'fr';
  /** Date styles the partner uses, with weights. */
  styles: readonly (readonly [DateStyle, number])[];
  /** Exact styles used where a wide date would blur a deliberate conflict. */
  narrow: readonly DateStyle[];
  /** Row order of the export. */
  order: 'work' | 'image' | 'shuffled';
  /**
   * Path segments of the IRI templates; `view`: a template path (with {image}, maybe {work}) where a photo can be
   * viewed.
   */
  paths: { work: string; image: string; page: string; view?: string };
}

export const PARTNERS: Record<PartnerKey, PartnerSpec> = {
  vellmar: {
    key: 'vellmar',
    name: 'Vellmar Foundation Photo Archive',
    host: 'vellmar.example.org',
    convention: 'ordinal',
    file: 'catalogues/vellmar.tsv',
    format: { delimiter: '\t', bom: false, eol: '\n' },
    columns: [
      ['Object number', 'work'],
      ['Photo number', 'image'],
      ['Title', 'title'],
      ['Date', 'date'],
      ['Photographer', 'photographer'],
      ['Width (px)', 'width'],
      ['Height (px)', 'height'],
    ],
    lang: 'en',
    styles: [
      ['year', 4],
      ['ca', 2],
      ['late-century', 3],
      ['century', 2],
    ],
    narrow: ['year', 'ca'],
    order: 'work',
    paths: { work: 'id/work/', image: 'id/photo/', page: 'collection/object/', view: 'viewer/{work}/{image}' },
  },
  kessling: {
    key: 'kessling',
    name: 'Kessling Institute for Art History, Photothek',
    host: 'kessling.example.org',
    convention: 'iso',
    file: 'catalogues/kessling.csv',
    format: { delimiter: ';', bom: false, eol: '\n' },
    columns: [
      ['Aufnahme', 'image'],
      ['Inventarnummer', 'work'],
      ['Titel', 'title'],
      ['Datierung', 'date'],
      ['Fotograf', 'photographer'],
      ['Standort', 'location'],
    ],
    lang: 'de',
    styles: [
      ['year', 2],
      ['edtf-decade', 2],
      ['ca', 2],
      ['range', 2],
    ],
    narrow: ['year', 'ca'],
    order: 'image',
    paths: {
      work: 'id/objekt/',
      image: 'id/aufnahme/',
      page: 'photothek/objekt/',
      view: 'bilder/{image}/full/max/0/default.jpg',
    },
  },
  fontclaire: {
    key: 'fontclaire',
    name: 'Photothèque de la Maison Fontclaire',
    host: 'fontclaire.example.org',
    file: 'catalogues/fontclaire.csv',
    format: { delimiter: ',', bom: true, eol: '\r\n' },
    columns: [
      ['cote', 'work'],
      ['cliché', 'image'],
      ['intitulé', 'title'],
      ['datation', 'date'],
      ['remarques', 'remark'],
    ],
    lang: 'fr',
    language: 'fr',
    styles: [
      ['century-abbr', 2],
      ['century', 2],
      ['range', 3],
      ['ca', 2],
    ],
    narrow: ['ca', 'range'],
    order: 'shuffled',
    paths: { work: 'id/oeuvre/', image: 'id/cliche/', page: 'fiche/' },
  },
  brindle: {
    key: 'brindle',
    name: 'Brindle Abbey Study Collection',
    host: 'brindle.example.org',
    convention: 'iso',
    file: 'catalogues/brindle.csv',
    format: { delimiter: ',', bom: false, eol: '\n' },
    columns: [
      ['work_id', 'work'],
      ['image_id', 'image'],
      ['label', 'title'],
      ['date_text', 'date'],
      ['notes', 'remark'],
    ],
    lang: 'en2',
    styles: [
      ['year', 3],
      ['range', 2],
      ['century', 2],
      ['edtf-decade', 1],
    ],
    narrow: ['year', 'range'],
    order: 'work',
    paths: { work: 'works/', image: 'images/', page: 'catalogue/' },
  },
};

/** Hands out each partner's work and image IDs in that partner's numbering habits. */
export class IdMint {
  private counters: Record<PartnerKey, number> = { vellmar: 1040, kessling: 0, fontclaire: 100, brindle: 200 };
  private imageCounters: Record<PartnerKey, number> = { vellmar: 0, kessling: 0, fontclaire: 12, brindle: 0 };
  private kesslingNegatives = new Set<number>();

  constructor(private readonly rng: Rng) {}

  /** A fresh work ID, e.g. "VF 1203", "Inv. 12/3", "Réf. 118", "BA 0231". */
  work(partner: PartnerKey): string {
    const n = (this.counters[partner] += this.rng.int(1, 3));
    const table: Record<PartnerKey, () => string> = {
      vellmar: () => `VF ${n}`,
      kessling: () => `Inv. ${10 + Math.floor(n / 9)}/${1 + (n % 9)}`,
      fontclaire: () => `Réf. ${n}`,
      brindle: () => `BA ${String(n).padStart(4, '0')}`,
    };
    return table[partner]();
  }

  /** A second record of the same object: Kessling re-catalogues with a letter suffix, others take a new number. */
  duplicateOf(partner: PartnerKey, work: string): string {
    return partner === 'kessling' ? `${work}a` : this.work(partner);
  }

  /** Image IDs for a work, e.g. "VF 1203/1", "Neg. 4471", "Fot-é 0045", "BA 0231-r2". */
  images(partner: PartnerKey, work: string, count: number): string[] {
    const out: string[] = [];
    for (let i = 1; i <= count; i++) {
      const table: Record<PartnerKey, () => string> = {
        vellmar: () => `${work}/${i}`,
        kessling: () => `Neg. ${this.negative()}`,
        fontclaire: () => `Fot-é ${String((this.imageCounters.fontclaire += this.rng.int(1, 4))).padStart(4, '0')}`,
        brindle: () => `${work}-r${i}`,
      };
      out.push(table[partner]());
    }
    return out;
  }

  /** Kessling's negatives were numbered when taken, not per object: random, unique. */
  private negative(): number {
    for (;;) {
      const n = this.rng.int(4000, 9899);
      if (!this.kesslingNegatives.has(n)) {
        this.kesslingNegatives.add(n);
        return n;
      }
    }
  }
}
