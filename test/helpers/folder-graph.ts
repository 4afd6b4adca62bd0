// src/**/*.ts → the graph of imports between its folders, and the cycles in it (strongly connected components).
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';

/** One import from a file in one folder to a file in another. */
export interface FolderEdge {
  from: string;
  to: string;
  file: string;
  spec: string;
}

/**
 * A file's folder: the first path segment under `src/`; a file directly in `src/` (model.ts, pipeline.ts, …) is a
 * node of its own named after the file. Every import counts, `import type` and `import()` included: a type-only
 * import ties the folders together as much as a value import does.
 */
export function folderOf(srcDir: string, file: string): string {
  const rel = path.relative(srcDir, file).split(path.sep);
  return rel.length === 1 ? rel[0].replace(/\.ts$/, '') : rel[0];
}

function* sources(dir: string): Generator<string> {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) yield* sources(p);
    else if (e.name.endsWith('.ts')) yield p;
  }
}

/** Every relative import between two folders of `srcDir`, read with TypeScript's own pre-processor (no regexes). */
export function folderEdges(srcDir: string): FolderEdge[] {
  const edges: FolderEdge[] = [];
  for (const file of sources(srcDir)) {
    const info = ts.preProcessFile(readFileSync(file, 'utf8'), true, true);
    for (const { fileName: spec } of info.importedFiles) {
      if (!spec.startsWith('.')) continue;
      const target = path.resolve(path.dirname(file), spec.replace(/\.js$/, '.ts'));
      const from = folderOf(srcDir, file),
        to = folderOf(srcDir, target);
      if (from !== to) edges.push({ from, to, file: path.relative(srcDir, file), spec });
    }
  }
  return edges;
}

/** The cycles: strongly connected components of more than one folder (Tarjan 1972), each sorted, in sorted order. */
export function folderCycles(edges: readonly Pick<FolderEdge, 'from' | 'to'>[]): string[][] {
  const next = new Map<string, Set<string>>();
  for (const { from, to } of edges) {
    if (!next.has(from)) next.set(from, new Set());
    if (!next.has(to)) next.set(to, new Set());
    next.get(from)!.add(to);
  }
  const index = new Map<string, number>(),
    low = new Map<string, number>(),
    stack: string[] = [],
    onStack = new Set<string>();
  const components: string[][] = [];
  const visit = (v: string): void => {
    index.set(v, index.size);
    low.set(v, index.get(v)!);
    stack.push(v);
    onStack.add(v);
    for (const w of next.get(v)!) {
      if (!index.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (onStack.has(w)) low.set(v, Math.min(low.get(v)!, index.get(w)!));
    }
    if (low.get(v) === index.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        onStack.delete(w);
        component.push(w);
      } while (w !== v);
      if (component.length > 1) components.push(component.sort());
    }
  };
  for (const v of [...next.keys()].sort()) if (!index.has(v)) visit(v);
  return components.sort((a, b) => (a[0] < b[0] ? -1 : 1));
}
