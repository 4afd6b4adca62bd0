// Command-line store options → an open Store (embedded folder or remote endpoints), and query text from its sources.
import { existsSync, statSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { UserError, EXIT } from '../errors.js';
import { bindParams } from './bind.js';
import { EmbeddedStore } from './embedded.js';
import { readNamedQuery } from './named.js';
import { RemoteStore, type RemoteOptions } from './remote.js';
import type { Store } from './types.js';
import { join } from 'node:path';
import { MANIFEST } from './folder.js';

/** Where the data lives: a store folder, or remote endpoints (Graph Store, Update, Query). */
export interface StoreChoice {
  store?: string;
  /** Reading only (query): a store folder must already hold a loaded release; nothing is created. */
  existing?: boolean;
  endpoint?: string;
  update?: string;
  query?: string;
}

const usage = (field: string, message: string, hint: string): UserError =>
  new UserError({ file: 'command line', line: 0, field, message, hint }, EXIT.badInput);

/** Opens the chosen store; exactly one of a folder or a query URL must be given. */
export async function openStore(c: StoreChoice, remote: RemoteOptions = {}): Promise<Store> {
  checkStoreChoice(c);
  if (c.store) return EmbeddedStore.open(c.store, { lock: !c.existing });
  return new RemoteStore({ gsp: c.endpoint, update: c.update, query: c.query! }, remote);
}

/** Refuses a store choice that cannot work (both or neither kind, URLs that are not http(s) or carry a password). */
export function checkStoreChoice(c: StoreChoice): void {
  const isRemote = Boolean(c.endpoint || c.update || c.query);
  if (c.store && isRemote)
    throw usage(
      '--store',
      'cannot be combined with remote endpoint options',
      'choose the store folder or the endpoints',
    );
  if (c.store && c.existing && !existsSync(join(c.store, MANIFEST)))
    throw usage(
      '--store',
      `${c.store} holds no loaded release`,
      'load one first: concordat load <release> --store <folder>',
    );
  if (c.store) return;
  if (!c.query) throw usage('--store', 'no store given', 'give --store <folder>, or the remote endpoint URLs');
  for (const [field, url] of Object.entries({
    '--endpoint': c.endpoint,
    '--update': c.update,
    '--query-endpoint': c.query,
  })) {
    if (url && !/^https?:\/\//.test(url))
      throw usage(field, `"${url}" is not an http(s) URL`, 'e.g. http://127.0.0.1:8890/sparql');
    if (url && new URL(url).password)
      throw usage(
        field,
        'the URL carries a password',
        'remove it; credentials come from CONCORDAT_STORE_USER / CONCORDAT_STORE_PASSWORD or netrc',
      );
  }
}

/** Parses `key=value` parameters; the value may itself contain "=". */
export function parseParams(pairs: string[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const p of pairs) {
    const i = p.indexOf('=');
    if (i <= 0)
      throw usage('--param', `"${p}" is not key=value`, 'e.g. --param work=https://harbour.example.org/id/work/H-1');
    out[p.slice(0, i)] = p.slice(i + 1);
  }
  return out;
}

/** The query to run: a named query, a .rq file, or SPARQL text, with parameters bound (see bind.ts). */
export async function queryText(
  arg: string | undefined,
  named: string | undefined,
  params: Record<string, string>,
): Promise<string> {
  if (arg && named) throw usage('--named', 'cannot be combined with a query argument', 'give one of them');
  let text: string;
  if (named) text = await readNamedQuery(named);
  else if (!arg) throw usage('<query>', 'no query given', 'give SPARQL text, a .rq file or --named <name>');
  else if (existsSync(arg) && statSync(arg).isFile()) text = await readFile(arg, 'utf8');
  else if (arg.endsWith('.rq')) throw usage('<query>', `no such file ${arg}`, 'check the path');
  else text = arg;
  return bindParams(text, params);
}
