// `partnerKey:id` references (evidence, decisions, gold) → image or work numbers, with hints for near misses.
import type { Problem } from '../errors.js';
import { didYouMean } from '../io/did-you-mean.js';

export interface RefResolver {
  keys: string[];
  byKey: Map<string, number>;
  index: Map<string, number>[];
}

/**
 * Resolves `key:id` (split at the first colon; IDs may hold colons). Returns the number or a problem (without
 * file/line).
 */
export function resolveRef(
  r: RefResolver,
  raw: string,
  what: 'image' | 'work',
): number | Omit<Problem, 'file' | 'line'> {
  const ref = raw.trim();
  const colon = ref.indexOf(':');
  if (colon <= 0)
    return {
      field: '',
      message: `"${ref}" is not ${what === 'image' ? 'an' : 'a'} ${what} reference`,
      hint: `write partnerKey:${what}Id, e.g. ${r.keys[0] ?? 'harbour'}:123`,
    };
  const key = ref.slice(0, colon);
  const id = ref.slice(colon + 1).trim();
  const p = r.byKey.get(key);
  if (p === undefined) {
    const near = didYouMean(key, r.keys);
    return {
      field: '',
      message: `unknown partner "${key}"`,
      hint: near ? `did you mean "${near}"?` : `partners are: ${r.keys.join(', ')}`,
    };
  }
  const n = r.index[p].get(id);
  if (n === undefined) {
    const lower = id.toLowerCase();
    let near: string | undefined;
    if (r.index[p].size <= 2_000_000)
      for (const k of r.index[p].keys())
        if (k.toLowerCase() === lower) {
          near = k;
          break;
        }
    return {
      field: '',
      message: `unknown ${what} "${id}" of partner "${key}"`,
      hint: near
        ? `did you mean "${key}:${near}"? IDs are compared exactly, case included`
        : `it is not in ${key}'s catalogue export`,
    };
  }
  return n;
}
