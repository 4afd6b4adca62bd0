// A partner's records → its catalogue export: one row per photograph, in the partner's columns and file habits.
import { delimited } from './csv.js';
import type { Rec } from './model.js';
import { PARTNERS, type Field, type PartnerKey } from './partners.js';
import type { Rng } from './rng.js';

const PHOTOGRAPHERS: Record<PartnerKey, readonly string[]> = {
  vellmar: ['H. Orrin', 'M. Castellane', 'J. Pell', 'R. Dunmore', 'A. Quist', ''],
  kessling: ['E. Rathgeb', 'L. Vosskamp', 'W. Ehrlich', 'B. Sänger', 'unbekannt', ''],
  fontclaire: [''],
  brindle: [''],
};
const LOCATIONS = ['Schrank 3, Fach 12', 'Schrank 4, Fach 2', 'Mappe 17', 'Glasplattenarchiv', 'Mappe 9'];
const REMARKS: Record<PartnerKey, readonly string[]> = {
  fontclaire: ['', '', '', 'négatif verre', 'tirage ancien, contrecollé', 'voir dossier'],
  brindle: ['', '', '', 'colour slide, scanned', 'from the 1962 survey'],
  vellmar: [''],
  kessling: [''],
};

/** The cell value of one field for one photograph of a record. */
function value(field: Field, rec: Rec, i: number, rng: Rng): string {
  const table: Record<Field, () => string> = {
    work: () => rec.work,
    image: () => rec.images[i].id,
    title: () => rec.title,
    date: () => rec.rowDates?.[i] ?? rec.date,
    width: () => String(rec.images[i].width),
    height: () => String(rec.images[i].height),
    photographer: () => PHOTOGRAPHERS[rec.partner][rec.photographer % PHOTOGRAPHERS[rec.partner].length],
    location: () => rng.pick(LOCATIONS),
    remark: () => rng.pick(REMARKS[rec.partner]),
  };
  return table[field]();
}

/** Rows in the order the partner's system exports them. */
function ordered(partner: PartnerKey, recs: readonly Rec[], rng: Rng): [Rec, number][] {
  const rows = recs.flatMap((r) => r.images.map((_, i) => [r, i] as [Rec, number]));
  const num = (s: string) => Number(s.replace(/\D+/g, ' ').trim().split(' ').join('.'));
  const table: Record<'work' | 'image' | 'shuffled', () => [Rec, number][]> = {
    work: () =>
      rows.sort(
        ([a, i], [b, j]) => num(a.work) - num(b.work) || (a.work < b.work ? -1 : a.work > b.work ? 1 : 0) || i - j,
      ),
    image: () => rows.sort(([a, i], [b, j]) => num(a.images[i].id) - num(b.images[j].id)),
    shuffled: () => rng.shuffle(recs).flatMap((r) => r.images.map((_, i) => [r, i] as [Rec, number])),
  };
  return table[PARTNERS[partner].order]();
}

/** The whole export file of one partner. */
export function catalogueText(partner: PartnerKey, recs: readonly Rec[], rng: Rng): string {
  const spec = PARTNERS[partner];
  const mine = recs.filter((r) => r.partner === partner);
  const rows = ordered(partner, mine, rng).map(([r, i]) => spec.columns.map(([, field]) => value(field, r, i, rng)));
  if (spec.format.delimiter === '\t' && rows.some((row) => row.some((v) => /[\t\n\r"]/.test(v)))) {
    throw new Error(`${partner}: a TSV cell would need quoting`);
  }
  return delimited(
    spec.columns.map(([h]) => h),
    rows,
    spec.format,
  );
}
