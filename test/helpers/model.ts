// Test helper: a tiny Model built in code (partners, works, image matches, decisions, gold) without any files.
import {
  IMAGE_ROLES,
  type CenturyConvention,
  type ImageRole,
  type Model,
  type Policy,
  type Verdict,
} from '../../src/model.js';

export interface TinyWork {
  ref: string;
  title?: string;
  date?: string;
  images?: number;
}

export interface TinySpec {
  partners: (string | { key: string; convention?: CenturyConvention; recordPage?: string })[];
  works: (string | TinyWork)[];
  /** Image matches `[a, b, score, overlap = 1]`: a work ref means its first image, `ref#k` its image k. */
  matches?: [string, string, number, number?][];
  /** `[work_a, work_b, verdict, curator = 'A. Curator', date = '2026-01-01']`, in file order. */
  decisions?: [string, string, Verdict, string?, string?][];
  gold?: [string, string][];
  policy?: Partial<Policy>;
  /** Image roles by image ref (`ref` or `ref#k`), as a catalogue's role column would give them. */
  roles?: Record<string, ImageRole>;
}

export const DEFAULT_POLICY: Policy = {
  proposeAt: 0.5,
  autoConfirmAt: null,
  partOverlapBelow: 0.7,
  minOverlap: 0.3,
  indiscriminateAbove: null,
  reviewLimit: 500,
};

const split = (ref: string): [string, string] => {
  const i = ref.indexOf(':');
  return [ref.slice(0, i), ref.slice(i + 1)];
};

/** Builds a Model: work IDs and image IDs (`<workId>#<k>`) are interned in the order given. */
export function tinyModel(spec: TinySpec): Model {
  const partners = spec.partners.map((p) => (typeof p === 'string' ? { key: p } : p));
  const keyIndex = new Map(partners.map((p, i) => [p.key, i]));
  const workIndex = partners.map(() => new Map<string, number>());
  const imageIndex = partners.map(() => new Map<string, number>());
  const works: Model['works'] = [];
  const imgWork: number[] = [],
    imgId: string[] = [];
  for (const raw of spec.works) {
    const w = typeof raw === 'string' ? { ref: raw } : raw;
    const [key, id] = split(w.ref);
    const p = keyIndex.get(key);
    if (p === undefined) throw new Error(`unknown partner in ${w.ref}`);
    const n = works.length;
    const count = w.images ?? 1;
    works.push({
      partner: p,
      id,
      title: w.title ?? `Title of ${w.ref}`,
      date: w.date ?? '',
      line: n + 2,
      imageCount: count,
    });
    workIndex[p].set(id, n);
    for (let k = 0; k < count; k++) {
      imageIndex[p].set(`${id}#${k}`, imgId.length);
      imgWork.push(n);
      imgId.push(`${id}#${k}`);
    }
  }
  const workNo = (ref: string) => {
    const [key, id] = split(ref);
    const n = workIndex[keyIndex.get(key) ?? -1]?.get(id);
    if (n === undefined) throw new Error(`unknown work ${ref}`);
    return n;
  };
  const imageNo = (ref: string) => {
    const [wref, k] = ref.includes('#') ? ref.split('#') : [ref, '0'];
    const [key, id] = split(wref);
    const n = imageIndex[keyIndex.get(key)!].get(`${id}#${k}`);
    if (n === undefined) throw new Error(`unknown image ${ref}`);
    return n;
  };
  const m = spec.matches ?? [];
  const role = new Uint8Array(imgId.length);
  for (const [ref, r] of Object.entries(spec.roles ?? {})) role[imageNo(ref)] = 1 + IMAGE_ROLES.indexOf(r);
  return {
    projectFile: 'concordance.json',
    project: {
      title: 'Tiny test concordance',
      base: 'https://concordance.example.org/',
      license: 'https://creativecommons.org/publicdomain/zero/1.0/',
      publisher: { name: 'Test Consortium' },
      partners: partners.map((p) => ({
        key: p.key,
        name: `Archive ${p.key}`,
        workIri: `https://${p.key}.example.org/id/work/{work}`,
        imageIri: `https://${p.key}.example.org/id/image/{image}`,
        recordPage: p.recordPage ?? `https://${p.key}.example.org/records/{work}`,
        centuryConvention: p.convention ?? 'ordinal',
        catalogue: {
          file: `${p.key}.csv`,
          delimiter: ',',
          columns: { work: 'work', image: 'image', title: 'title', date: 'date' },
        },
      })),
      evidence: [{ file: 'evidence.csv' }],
      decisions: [],
      policy: { ...DEFAULT_POLICY, ...spec.policy },
      release: { version: 'test' },
    },
    works,
    workIndex,
    images: {
      count: imgId.length,
      work: Int32Array.from(imgWork),
      id: imgId,
      line: Int32Array.from(imgId, (_, i) => i + 2),
      role,
      width: new Int32Array(imgId.length),
      height: new Int32Array(imgId.length),
    },
    matches: {
      count: m.length,
      a: Int32Array.from(m, (r) => imageNo(r[0])),
      b: Int32Array.from(m, (r) => imageNo(r[1])),
      score: Float64Array.from(m, (r) => r[2]),
      overlap: Float64Array.from(m, (r) => r[3] ?? 1),
      run: new Int32Array(m.length),
      file: new Int32Array(m.length),
      line: Int32Array.from(m, (_, i) => i + 2),
    },
    runs: [{ id: 'run-1', software: 'test-matcher', version: '1.0', started: '2026-01-01T00:00:00Z', parameters: {} }],
    evidenceFiles: ['evidence.csv'],
    decisions: (spec.decisions ?? []).map(([a, b, verdict, curator, date], i) => ({
      a: workNo(a),
      b: workNo(b),
      verdict,
      curator: curator ?? 'A. Curator',
      date: date ?? '2026-01-01',
      note: '',
      file: 'decisions.csv',
      line: i + 2,
    })),
    gold: (spec.gold ?? []).map(([a, b], i) => ({ a: workNo(a), b: workNo(b), line: i + 2 })),
    warnings: [],
  };
}

/** Work number of a `partnerKey:workId` reference in a tiny model. */
export function workNo(model: Model, ref: string): number {
  const [key, id] = split(ref);
  const p = model.project.partners.findIndex((x) => x.key === key);
  const n = model.workIndex[p]?.get(id);
  if (n === undefined) throw new Error(`unknown work ${ref}`);
  return n;
}
