// The cluster ID registry (clusters.csv) ↔ ClusterRegistry: written with every release, read back from the previous
// one.
//
// Format of clusters.csv (RFC 4180, UTF-8; with BOM and CRLF for spreadsheets unless the project's release.csv is
// `plain`,
// then LF without BOM; both read back; never neutralised: every cell is an ID the tool reads back):
//   cluster,work,status,replaced_by
//   c000001,harbour:12,active,          one row per member of an active cluster (work = partnerKey:workId)
//   c000004,,retired,c000001            one row per successor of a retired ID (a merge has one, a split+merge several)
//   c000007,,retired,                   a retired ID whose members are all gone or unclustered: no successor
// Active rows come first, by cluster ID then member reference; retired rows follow, by ID, successors in the order
// recorded (largest former-member overlap first). Retired rows are carried into every later release (tombstones).
import type { Model } from '../model.js';
import { workRef } from '../model.js';
import { UserError, type Problem } from '../errors.js';
import { readCsv } from '../io/csv-read.js';
import { CsvFile } from '../io/csv-write.js';
import { clusterIdNumber } from './ids.js';
import type { ClusterRegistry, Clustering, RetiredId } from './types.js';

export const CLUSTERS_CSV_HEADER = ['cluster', 'work', 'status', 'replaced_by'] as const;

/** The registry a clustering leaves behind: what `writeClusterRegistry` writes, as data. */
export function registryOf(model: Model, clustering: Clustering): ClusterRegistry {
  const active = new Map<string, string[]>();
  for (const c of clustering.clusters)
    active.set(
      c.id,
      Array.from(c.members, (w) => workRef(model, w)),
    );
  return { active, retired: clustering.retired.map((r) => ({ id: r.id, replacedBy: [...r.replacedBy] })) };
}

/** Writes clusters.csv (format in this file's header comment) atomically; returns its path. */
export async function writeClusterRegistry(file: string, model: Model, clustering: Clustering): Promise<string> {
  const out = new CsvFile(file, CLUSTERS_CSV_HEADER, undefined, model.project.release.csv ?? 'spreadsheet');
  for (const [id, refs] of registryOf(model, clustering).active)
    for (const r of refs) await out.row([id, r, 'active', '']);
  for (const r of clustering.retired) {
    if (r.replacedBy.length === 0) await out.row([r.id, '', 'retired', '']);
    for (const s of r.replacedBy) await out.row([r.id, '', 'retired', s]);
  }
  return out.close();
}

const HINT_ID = 'cluster IDs are "c" followed by digits, e.g. c000042';

/**
 * Reads a clusters.csv written by `writeClusterRegistry` (header by name; extra columns ignored). Every problem is
 * reported with file, line and field in one UserError: bad IDs or statuses, a work in two clusters, an ID both
 * active and retired, a member row without a work.
 */
export async function readClusterRegistry(file: string): Promise<ClusterRegistry> {
  const problems: Problem[] = [];
  const active = new Map<string, string[]>();
  const retired = new Map<string, RetiredId>();
  const memberOf = new Map<string, string>();
  let index: Map<string, number> | undefined;
  for await (const { fields, line } of readCsv(file, ',')) {
    const at = (field: string, message: string, hint?: string) => problems.push({ file, line, field, message, hint });
    if (!index) {
      index = new Map(fields.map((h, i) => [h.trim(), i]));
      const missing = CLUSTERS_CSV_HEADER.filter((c) => c !== 'replaced_by' && !index!.has(c));
      if (missing.length)
        throw new UserError({
          file,
          line,
          field: missing[0],
          message: `column "${missing[0]}" (cluster registry) is not in the header`,
          hint: `the header is ${CLUSTERS_CSV_HEADER.join(',')}`,
        });
      continue;
    }
    const get = (c: string) => (fields[index!.get(c) ?? -1] ?? '').trim();
    const id = get('cluster'),
      work = get('work'),
      status = get('status'),
      succ = get('replaced_by');
    if (clusterIdNumber(id) === undefined) {
      at('cluster', `"${id}" is not a cluster ID`, HINT_ID);
      continue;
    }
    if (status === 'active') {
      if (work.indexOf(':') <= 0) {
        at('work', `"${work}" is not a work reference`, 'write partnerKey:workId');
        continue;
      }
      if (succ) at('replaced_by', 'an active cluster has no successor', 'leave replaced_by empty on active rows');
      if (retired.has(id)) {
        at('cluster', `${id} is both retired and active`, 'a retired ID is never reused');
        continue;
      }
      const prior = memberOf.get(work);
      if (prior !== undefined) {
        at('work', `${work} is already a member of ${prior}`, 'a work belongs to one cluster at most');
        continue;
      }
      memberOf.set(work, id);
      let list = active.get(id);
      if (!list) active.set(id, (list = []));
      list.push(work);
    } else if (status === 'retired') {
      if (work) at('work', 'a retired ID has no members', 'leave work empty on retired rows');
      if (succ && clusterIdNumber(succ) === undefined) {
        at('replaced_by', `"${succ}" is not a cluster ID`, HINT_ID);
        continue;
      }
      if (succ === id) {
        at('replaced_by', `${id} is replaced by itself`, 'name the cluster that took over its members');
        continue;
      }
      if (active.has(id)) {
        at('cluster', `${id} is both active and retired`, 'a retired ID is never reused');
        continue;
      }
      let r = retired.get(id);
      if (!r) retired.set(id, (r = { id, replacedBy: [] }));
      if (succ && !r.replacedBy.includes(succ)) r.replacedBy.push(succ);
    } else at('status', `unknown status "${status}"`, 'use active or retired');
  }
  if (!index)
    problems.push({
      file,
      line: 0,
      field: '',
      message: 'file is empty',
      hint: `expected the header ${CLUSTERS_CSV_HEADER.join(',')}`,
    });
  if (problems.length) throw new UserError(problems.slice(0, 100));
  return { active, retired: [...retired.values()] };
}
