/**
 * "Did you mean" suggestions for misspelt keys and ids.
 *
 * Distance: optimal string alignment (restricted Damerau-Levenshtein: insertions, deletions,
 * substitutions and transpositions of adjacent characters each cost 1; Damerau, CACM 7 (1964)),
 * computed on a normalised spelling (lower case, `_` and `-` dropped), so `EC`, `f_max` and
 * `fmax` all find `ec` / `fMax` at distance 0.
 */

/** Optimal-string-alignment distance between `a` and `b` (O(|a| |b|) time). */
export function editDistance(a: string, b: string): number {
  const n = a.length;
  const m = b.length;
  if (n === 0) return m;
  if (m === 0) return n;
  // Three rolling rows: two back (for transpositions), previous, current.
  let prev2 = new Array<number>(m + 1).fill(0);
  let prev = Array.from({ length: m + 1 }, (_, j) => j);
  let cur = new Array<number>(m + 1).fill(0);
  for (let i = 1; i <= n; i++) {
    cur[0] = i;
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        d = Math.min(d, prev2[j - 2] + 1);
      }
      cur[j] = d;
    }
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[m];
}

function normalise(s: string): string {
  return s.toLowerCase().replace(/[_-]/g, '');
}

/**
 * The candidate closest to `word`, or undefined when none is close enough: a candidate is close
 * when its normalised distance is at most max(1, floor(length / 3)) of the longer normalised word.
 * Ties go to the earlier candidate, so callers control the preference by order.
 */
export function didYouMean(word: string, candidates: Iterable<string>): string | undefined {
  const w = normalise(word);
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const c = normalise(candidate);
    const limit = Math.max(1, Math.floor(Math.max(w.length, c.length) / 3));
    const d = editDistance(w, c);
    if (d <= limit && d < bestDistance) {
      best = candidate;
      bestDistance = d;
    }
  }
  return best;
}
