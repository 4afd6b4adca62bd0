// Nearest known name for a misspelt key, for "did you mean" hints.

/**
 * Edit distance counting a swap of two neighbouring letters as one edit (optimal string alignment), small strings only.
 */
export function editDistance(a: string, b: string): number {
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) =>
    Array.from({ length: b.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)),
  );
  for (let i = 1; i <= a.length; i++)
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      d[i][j] = Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1])
        d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
    }
  return d[a.length][b.length];
}

/** The closest candidate within a distance that grows with length (or shares a long prefix), else undefined. */
export function didYouMean(name: string, candidates: readonly string[]): string | undefined {
  const lower = name.toLowerCase();
  let best: string | undefined;
  let bestD = Infinity;
  for (const c of candidates) {
    const d = editDistance(lower, c.toLowerCase());
    if (d < bestD) [best, bestD] = [c, d];
  }
  if (best === undefined) return undefined;
  const len = Math.max(name.length, best.length);
  const limit = len <= 3 ? 1 : Math.max(2, Math.floor(len / 3));
  if (bestD <= limit) return best;
  if (
    best.length >= 4 &&
    (lower.startsWith(best.toLowerCase().slice(0, 5)) || best.toLowerCase().startsWith(lower.slice(0, 5)))
  )
    return best;
  return undefined;
}
