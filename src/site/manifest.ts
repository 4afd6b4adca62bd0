// site.json of a site folder: the base, the release version and dataset, the shard widths.
import { existsSync } from 'node:fs';
import { readJsonFile } from '../io/json-file.js';
import path from 'node:path';
import { UserError } from '../errors.js';
import type { ShardWidths } from './routes.js';

export interface SiteManifest {
  base: string;
  version: string;
  dataset: string;
  widths: ShardWidths;
  /** Servers pages show partners' photographs from (absent: none). */
  imageOrigins?: string[];
}

/** Reads site.json of a folder written by `concordat site`. */
export function readManifest(site: string): SiteManifest {
  const f = path.join(site, 'site.json');
  if (!existsSync(f))
    throw new UserError({
      file: site,
      line: 0,
      field: 'site',
      message: 'not a site folder (no site.json)',
      hint: 'name a folder written by concordat site',
    });
  const { value } = readJsonFile(f, 'site manifest', 'write the site again with concordat site');
  const m = value as Partial<SiteManifest> | null;
  const widths = m?.widths as unknown as Record<string, unknown> | undefined;
  if (
    !m ||
    typeof m !== 'object' ||
    typeof m.base !== 'string' ||
    typeof m.version !== 'string' ||
    typeof m.dataset !== 'string' ||
    !widths ||
    typeof widths !== 'object' ||
    !Object.values(widths).every((w) => Number.isInteger(w))
  )
    throw new UserError({
      file: f,
      line: 0,
      field: '',
      message: 'is not the manifest concordat site writes (base, version, dataset, widths)',
      hint: 'write the site again with concordat site',
    });
  return m as SiteManifest;
}
