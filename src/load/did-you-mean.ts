// Nearest known name for a misspelt key, for "did you mean" hints.

/** Levenshtein distance, small strings only. */
export function editDistance(a: string, b: string): number {
  const prev = Array.from({ length: b.length + 1 }, (_, i) => i);
  for (let i = 1; i <= a.length; i++) {
    let diag = prev[0];
    prev[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const tmp = prev[j];
      prev[j] = Math.min(prev[j] + 1, prev[j - 1] + 1, diag + (a[i - 1] === b[j - 1] ? 0 : 1));
      diag = tmp;
    }
  }
  return prev[b.length];
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
  const limit = Math.max(1, Math.floor(Math.max(name.length, best.length) / 3));
  if (bestD <= limit) return best;
  if (best.length >= 4 && (lower.startsWith(best.toLowerCase().slice(0, 5)) || best.toLowerCase().startsWith(lower.slice(0, 5))))
    return best;
  return undefined;
}
