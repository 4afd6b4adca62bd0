// site.json of a site folder: the base, the release version and dataset, the shard widths.
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { UserError } from '../errors.js';
import { parseJson } from '../io/json-file.js';
import type { ShardWidths } from './routes.js';

export interface SiteManifest {
  base: string;
  version: string;
  dataset: string;
  widths: ShardWidths;
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
  return parseJson(
    readFileSync(f, 'utf8'),
    f,
    'site.json is damaged: write the site again with concordat site',
  ) as SiteManifest;
}
