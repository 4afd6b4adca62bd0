// A partner's catalogue export (one row per image) → works and images, grouped by the partner's work ID.
import { readNumber } from '../io/number.js';
import type { ProblemList, Problem } from '../errors.js';
import { IMAGE_ROLES, type PartnerConfig, type Work } from '../model.js';
import type { Column } from '../util/columns.js';
import { statSync } from 'node:fs';
import path from 'node:path';
import { progress } from '../util/progress.js';
import { detached } from '../io/csv-read.js';
import { readTable } from './table.js';
import { checkCatalogueDate } from './dates.js';
import { DATE_LANGUAGES } from '../dates/index.js';

/**
 * Below this many pixels on the shorter side, visual matching gets unreliable (rule of thumb of the trade, no published
 * source).
 */
export const MIN_IMAGE_SIDE = 300;
/** Largest size a pixel column may give: what an Int32Array holds (no photograph comes near it). */
const MAX_PIXELS = 0x7fffffff;

export interface ImageColumns {
  work: Column<Int32Array>;
  line: Column<Int32Array>;
  id: string[];
  /** 1 + index into IMAGE_ROLES per image; 0 = not recorded. */
  role: number[];
  /** Pixels; 0 = not recorded. */
  width: Column<Int32Array>;
  height: Column<Int32Array>;
}

/** Reads one partner's export into the shared work and image tables (design: "Catalogue export"). */
export async function loadCatalogue(
  partnerNo: number,
  partner: PartnerConfig,
  works: Work[],
  workIndex: Map<string, number>,
  images: ImageColumns,
  imageIndex: Map<string, number>,
  problems: ProblemList,
  warnings: Problem[],
): Promise<void> {
  const { file, delimiter, columns: c } = partner.catalogue;
  const optional = [c.title, c.date, c.width, c.height, c.role].filter((x): x is string => !!x);
  const roles = new Map(
    Object.entries(partner.catalogue.roles ?? {}).map(([word, role]) => [
      word.trim().toLowerCase(),
      1 + IMAGE_ROLES.indexOf(role),
    ]),
  );
  const required = [c.work, c.image, ...optional];
  const disagreeing = new Set<number>();
  /** Distinct date phrases we cannot read: one warning each, with the number of records (works) that use it. */
  const unread = new Map<string, { line: number; records: number; hint: string }>();
  let size = 0;
  try {
    size = statSync(file).size;
  } catch {
    /* a missing file is reported by the reader */
  }
  const bar = progress(`catalogue ${path.basename(file)}`, Math.round(size / 1048576), 'MiB');
  const rows = readTable(file, delimiter, required, [], problems, `partner "${partner.key}"`, (b) =>
    bar.update(Math.round(b / 1048576)),
  );
  try {
    for await (const row of rows) {
      const workId = detached(row.get(c.work).trim());
      const imageId = detached(row.get(c.image).trim());
      if (!workId) {
        problems.add({
          file,
          line: row.line,
          field: c.work,
          message: 'empty work ID',
          hint: 'every row needs the ID of the work it shows',
        });
        continue;
      }
      if (!imageId) {
        problems.add({
          file,
          line: row.line,
          field: c.image,
          message: 'empty image ID',
          hint: 'every row is one photo and needs its ID',
        });
        continue;
      }
      const title = c.title ? detached(row.get(c.title).trim()) : '';
      const date = c.date ? detached(row.get(c.date).trim()) : '';
      if (date) {
        const bad = checkCatalogueDate(date, partner.centuryConvention, partner.language);
        if (bad?.kind === 'impossible')
          problems.add({
            file,
            line: row.line,
            field: c.date!,
            message: `impossible date "${date}": ${bad.reason}`,
            hint: bad.hint,
          });
        else if (bad && !workIndex.has(workId)) {
          const seen = unread.get(date);
          if (seen === undefined) unread.set(date, { line: row.line, records: 1, hint: bad.hint });
          else seen.records++;
        }
      }
      let w = workIndex.get(workId);
      if (w === undefined) {
        w = works.length;
        works.push({ partner: partnerNo, id: workId, title, date, line: row.line, imageCount: 0 });
        workIndex.set(workId, w);
      } else {
        const work = works[w];
        if ((work.title !== title || work.date !== date) && !disagreeing.has(w)) {
          disagreeing.add(w);
          const field = work.title !== title ? c.title! : c.date!;
          warnings.push({
            file,
            line: row.line,
            field,
            message: `work "${workId}" has "${field === c.title ? title : date}" here but "${field === c.title ? work.title : work.date}" on line ${work.line}`,
            hint: 'the first row is kept; make the rows of one work agree',
          });
        }
      }
      const seen = imageIndex.get(imageId);
      if (seen !== undefined) {
        const other = works[images.work.data[seen]];
        if (other.id !== workId)
          problems.add({
            file,
            line: row.line,
            field: c.image,
            message: `image "${imageId}" is under work "${workId}" here but under "${other.id}" on line ${images.line.data[seen]}`,
            hint: 'one photo can show only one catalogue record: fix the work ID',
          });
        else
          warnings.push({
            file,
            line: row.line,
            field: c.image,
            message: `image "${imageId}" is listed twice`,
            hint: `first on line ${images.line.data[seen]}; the repeat is ignored`,
          });
        continue;
      }
      let width = 0,
        height = 0;
      if (c.width && c.height) {
        const rawW = row.get(c.width).trim();
        const rawH = row.get(c.height).trim();
        const [wpx, hpx] = [rawW, rawH].map((raw) => {
          const r = readNumber(raw, true);
          return r.ok && r.value > 0 && r.value <= MAX_PIXELS ? r.value : NaN;
        });
        for (const [col, raw, v] of [
          [c.width, rawW, wpx],
          [c.height, rawH, hpx],
        ] as const)
          if (raw !== '' && Number.isNaN(v)) {
            const r = readNumber(raw, true);
            problems.add({
              file,
              line: row.line,
              field: col,
              message: `"${raw}" is not a positive whole number of pixels`,
              hint: `${r.ok ? `from 1 to ${MAX_PIXELS}` : r.hint}; leave it blank when unknown`,
            });
          }
        if (rawW !== '' && rawH !== '' && Math.min(wpx, hpx) < MIN_IMAGE_SIDE && Math.min(wpx, hpx) > 0)
          warnings.push({
            file,
            line: row.line,
            field: `${c.width}/${c.height}`,
            message: `image "${imageId}" is ${wpx}×${hpx} px, under ${MIN_IMAGE_SIDE} px on its shorter side`,
            hint: 'matches on it are unreliable; a larger scan would help',
          });
        if (rawW !== '' && Number.isInteger(wpx) && wpx > 0) width = wpx;
        if (rawH !== '' && Number.isInteger(hpx) && hpx > 0) height = hpx;
      }
      let role = 0;
      if (c.role) {
        const word = row.get(c.role).trim();
        const r = roles.get(word.toLowerCase());
        if (r !== undefined) role = r;
        else if (word !== '')
          problems.add({
            file,
            line: row.line,
            field: c.role,
            message: `role "${word}" is not in the partner's "roles" map`,
            hint: `add it to partners[${partnerNo}].catalogue.roles in concordance.json (mapped: ${[...roles.keys()].join(', ') || 'none'})`,
          });
      }
      const img = images.id.length;
      images.role.push(role);
      images.id.push(imageId);
      images.work.push(w);
      images.line.push(row.line);
      images.width.push(width);
      images.height.push(height);
      imageIndex.set(imageId, img);
      works[w].imageCount++;
    }
  } finally {
    bar.stop();
  }
  for (const [date, u] of unread) {
    const records = u.records === 1 ? '1 record' : `${u.records} records, first`;
    warnings.push({
      file,
      line: u.line,
      field: c.date!,
      message: `date "${date}" (${records} on this line) is not a form concordat reads; it is published as catalogued and left out of date comparisons`,
      hint:
        partner.language === undefined
          ? `${u.hint}; or set the partner's "language" (${DATE_LANGUAGES.join(', ')})`
          : u.hint,
    });
  }
}
