// A catalogue header + sampled values → proposed column mapping (work, image, title, date, width, height), with
// reasons.
import type { ColumnMap } from '../model.js';

/** Columns proposed from a header (an image-role column needs a map of the partner's words, so it is not guessed). */
export type Role = Exclude<keyof ColumnMap, 'role'>;
export const ROLES: Role[] = ['work', 'image', 'title', 'date', 'width', 'height'];

/**
 * Header names by role in English, German, French, Italian and Dutch, normalised (lower case, accents and
 * punctuation dropped). Common cataloguing vocabulary of photo archives (common practice, no source).
 */
export const HEADER_NAMES: Record<Role, string[]> = {
  work: [
    'work',
    'work id',
    'work no',
    'work number',
    'object',
    'object id',
    'object no',
    'object number',
    'objectno',
    'inventory',
    'inventory no',
    'inventory number',
    'accession number',
    'record id',
    'catalogue number',
    'werk',
    'objekt',
    'objektnummer',
    'inventarnummer',
    'inventar nr',
    'inv nr',
    'cote',
    'oeuvre',
    'numero d inventaire',
    'n inventaire',
    'no inventaire',
    'opera',
    'inventario',
    'numero inventario',
    'numero di inventario',
    'segnatura',
    'objectnummer',
    'inventarisnummer',
    'inv nr',
  ],
  image: [
    'image',
    'image id',
    'image no',
    'image number',
    'photo',
    'photo id',
    'photo no',
    'photo number',
    'photograph',
    'negative',
    'negative no',
    'negative number',
    'file',
    'filename',
    'file name',
    'bild',
    'bildnummer',
    'foto',
    'fotonummer',
    'aufnahme',
    'aufnahmenummer',
    'negativ',
    'negativnummer',
    'cliche',
    'numero de cliche',
    'photographie',
    'negatif',
    'fotografia',
    'immagine',
    'negativo',
    'lastra',
    'afbeelding',
    'opname',
    'negatief',
    'fotonummer',
  ],
  title: [
    'title',
    'label',
    'name',
    'subject',
    'titel',
    'bezeichnung',
    'benennung',
    'titre',
    'intitule',
    'sujet',
    'titolo',
    'soggetto',
    'denominazione',
    'benaming',
    'onderwerp',
  ],
  date: [
    'date',
    'dated',
    'dating',
    'period',
    'datierung',
    'datum',
    'entstehungszeit',
    'zeit',
    'datation',
    'epoque',
    'data',
    'datazione',
    'epoca',
    'datering',
    'jaar',
    'periode',
  ],
  width: ['width', 'width px', 'breite', 'largeur', 'larghezza', 'breedte', 'w'],
  height: ['height', 'height px', 'hohe', 'hoehe', 'hauteur', 'altezza', 'hoogte', 'h'],
};

const norm = (s: string) =>
  s
    .normalize('NFKD')
    .replace(/\p{M}/gu, '')
    .toLowerCase()
    .replace(/[^\p{L}\p{N}]+/gu, ' ')
    .trim();
const tokens = (s: string) => new Set(norm(s).split(' ').filter(Boolean));

/**
 * 10 for a header equal to a known name, 6 when every word of a known name (of two letters or more) is a word of it.
 */
export function headerScore(header: string, role: Role): number {
  const h = norm(header);
  const words = tokens(header);
  let best = 0;
  for (const name of HEADER_NAMES[role]) {
    if (h === name || h.replace(/ /g, '') === name.replace(/ /g, '')) return 10;
    const parts = name.split(' ');
    if (parts.every((p) => p.length >= 2 && words.has(p))) best = 6;
  }
  return best;
}

const share = (values: string[], test: (v: string) => boolean) =>
  values.length ? values.filter(test).length / values.length : 0;
const DATE =
  /\b1\d{3}\b|\b1\d(X|XX|\d?X)\b|\b\d{1,2}(st|nd|rd|th|\.|e|er|°)?\s*(century|c\.|jh|jahrhundert|siecle|siècle|secolo|sec\.|eeuw)/i;

/**
 * Evidence from sampled values: dates, pixel sizes, ID-like codes, repeated (work) or unique (image) values, prose
 * (titles).
 */
export function valueScore(values: string[], role: Role): number {
  const v = values.filter((x) => x !== '');
  if (v.length === 0) return 0;
  const unique = new Set(v).size === v.length;
  const idLike = share(v, (x) => x.length <= 40 && /\d/.test(x) && x.split(' ').length <= 3) >= 0.9;
  const dateLike = share(v, (x) => DATE.test(x)) >= 0.6;
  switch (role) {
    case 'date':
      return dateLike ? 4 : 0;
    case 'width':
    case 'height':
      return share(v, (x) => /^\d+$/.test(x) && Number(x) >= 16 && Number(x) <= 100000) >= 0.9 ? 2 : 0;
    case 'work':
      return idLike && !dateLike ? (unique ? 1 : 3) : 0;
    case 'image':
      return idLike && !dateLike ? (unique ? 3 : 0) : 0;
    case 'title':
      return !dateLike && share(v, (x) => /\p{L}{3,}/u.test(x) && x.includes(' ')) >= 0.6 ? 3 : 0;
  }
}

export interface Proposal {
  columns: Partial<ColumnMap>;
  /** Role → why that column was chosen. */
  reasons: Partial<Record<keyof ColumnMap, string>>;
  /** Roles whose column was guessed from sampled values alone, with no header name to go by: each deserves a check. */
  fromValues: Role[];
  /** Columns left unmapped that look like a role (by header name or values), with why. */
  unmapped: { column: string; role: Role; why: string }[];
}

/**
 * Lowest score for a proposal: work and image need some evidence; the optional roles need a header hint or clear
 * values.
 */
const MIN: Record<Role, number> = { work: 2, image: 2, title: 4, date: 4, width: 6, height: 6 };

/**
 * Proposes one column per role, greedily by score (header name first, then values), each column used once. `fixed`
 * holds the columns a person chose (`--column role=header`): they are kept as given and taken out of the guessing.
 */
export function proposeColumns(header: string[], rows: string[][], fixed: Partial<ColumnMap> = {}): Proposal {
  const cands: { role: Role; col: number; score: number; why: string; byValues: boolean }[] = [];
  const taken = new Set(Object.values(fixed));
  header.forEach((h, col) => {
    if (taken.has(h)) return;
    const values = rows.map((r) => r[col] ?? '');
    for (const role of ROLES) {
      const hs = headerScore(h, role),
        vs = valueScore(values, role);
      const score = hs + vs;
      if (score >= MIN[role])
        cands.push({
          role,
          col,
          score,
          why: hs ? `header name${vs ? ' and values' : ''}` : 'values',
          byValues: hs === 0,
        });
    }
  });
  cands.sort((x, y) => y.score - x.score || ROLES.indexOf(x.role) - ROLES.indexOf(y.role) || x.col - y.col);
  const out: Proposal = { columns: {}, reasons: {}, fromValues: [], unmapped: [] };
  const byValues = new Set<Role>();
  const used = new Set<number>();
  for (const c of cands) {
    if (fixed[c.role] !== undefined || out.columns[c.role] !== undefined || used.has(c.col)) continue;
    out.columns[c.role] = header[c.col];
    out.reasons[c.role] = `${c.why} (score ${c.score})`;
    if (c.byValues) byValues.add(c.role);
    used.add(c.col);
  }
  if (!(out.columns.width && out.columns.height) && !(fixed.width || fixed.height))
    for (const r of ['width', 'height'] as const)
      if (out.columns[r] !== undefined) {
        used.delete(header.indexOf(out.columns[r]!));
        delete out.columns[r];
        delete out.reasons[r];
        byValues.delete(r);
      }
  const ordered: Proposal = { columns: {}, reasons: {}, fromValues: [], unmapped: [] };
  for (const r of [...ROLES, 'role'] as const) {
    if (fixed[r] !== undefined) [ordered.columns[r], ordered.reasons[r]] = [fixed[r], 'set with --column'];
    else if (r !== 'role' && out.columns[r] !== undefined)
      [ordered.columns[r], ordered.reasons[r]] = [out.columns[r], out.reasons[r]];
  }
  ordered.fromValues = ROLES.filter(
    (r) => byValues.has(r) && ordered.columns[r] !== undefined && fixed[r] === undefined,
  );
  const noted = new Set<number>();
  for (const c of cands) {
    if (used.has(c.col) || noted.has(c.col)) continue;
    noted.add(c.col);
    ordered.unmapped.push({ column: header[c.col], role: c.role, why: `${c.why} (score ${c.score})` });
  }
  ordered.unmapped.sort((x, y) => header.indexOf(x.column) - header.indexOf(y.column));
  return ordered;
}
