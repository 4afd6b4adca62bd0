// Triple lines → upload chunks of at most N triples, keeping every statement about one blank node in the same chunk.
import { blankLabels } from './lines.js';

/**
 * Cuts N-Triples lines into chunks of ≤ `max` lines. Blank-node labels are scoped to one document (RDF 1.1 N-Triples
 * §2.4),
 * and each chunk is its own request, so statements connected through blank nodes travel together: a group larger than
 * `max` becomes one oversized chunk rather than being split. Order: blank-node-free lines first, then groups in order
 * of first appearance; deterministic for the same input.
 */
export function chunkLines(lines: string[], max: number): string[][] {
  const parent = new Map<string, string>();
  const find = (x: string): string => {
    let r = x;
    while (parent.get(r) !== r) r = parent.get(r)!;
    let c = x;
    while (c !== r) {
      const n = parent.get(c)!;
      parent.set(c, r);
      c = n;
    }
    return r;
  };
  const plain: string[] = [];
  const linked: Array<[string, string]> = [];
  for (const line of lines) {
    const labels = blankLabels(line);
    if (labels.length === 0) {
      plain.push(line);
      continue;
    }
    for (const l of labels) if (!parent.has(l)) parent.set(l, l);
    for (let i = 1; i < labels.length; i++) {
      const a = find(labels[0]),
        b = find(labels[i]);
      if (a !== b) parent.set(b, a);
    }
    linked.push([labels[0], line]);
  }
  const groups = new Map<string, string[]>();
  for (const [label, line] of linked) {
    const root = find(label);
    let g = groups.get(root);
    if (!g) groups.set(root, (g = []));
    g.push(line);
  }
  const chunks: string[][] = [];
  let current: string[] = [];
  const flush = (): void => {
    if (current.length) chunks.push(current);
    current = [];
  };
  for (const line of plain) {
    if (current.length >= max) flush();
    current.push(line);
  }
  for (const g of groups.values()) {
    if (current.length + g.length > max) flush();
    for (const line of g) current.push(line);
  }
  flush();
  return chunks;
}
