/**
 * Suggestions for misspelt keys: the valid key nearest to the one given by the optimal string
 * alignment distance, the restricted form of the Damerau-Levenshtein distance (F. J. Damerau, "A
 * technique for computer detection and correction of spelling errors", Comm. ACM 7(3), 1964; V. I.
 * Levenshtein, Soviet Physics Doklady 10(8), 1966): insertions, deletions, substitutions and
 * transpositions of adjacent characters each cost 1.
 */

/** Keys longer than this are not compared (a pasted paragraph is no misspelling). */
const MAX_COMPARED_LENGTH = 64;

/** The optimal string alignment distance between a and b, case-sensitive. */
export function damerauLevenshtein(a: string, b: string): number {
  const n = a.length;
  const m = b.length;
  if (n === 0) return m;
  if (m === 0) return n;
  // Three rows: i - 2, i - 1, i.
  let prev2 = new Array<number>(m + 1).fill(0);
  let prev = Array.from({ length: m + 1 }, (_, j) => j);
  let cur = new Array<number>(m + 1).fill(0);
  for (let i = 1; i <= n; i++) {
    cur[0] = i;
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, prev2[j - 2] + 1); // transposition
      cur[j] = d;
    }
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[m];
}

/**
 * The valid key nearest to `key` (case-insensitive distance), if it is near enough to be a likely
 * misspelling: at most a third of the longer key's length, and at least 1 edit allowed (common practice,
 * no source). Ties go to the key listed first.
 */
export function suggestKey(key: string, validKeys: readonly string[]): string | undefined {
  if (key.length > MAX_COMPARED_LENGTH) return undefined;
  const lower = key.toLowerCase();
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const k of validKeys) {
    const d = damerauLevenshtein(lower, k.toLowerCase());
    if (d < bestDistance) {
      best = k;
      bestDistance = d;
    }
  }
  if (best === undefined) return undefined;
  const allowed = Math.max(1, Math.floor(Math.max(key.length, best.length) / 3));
  return bestDistance <= allowed ? best : undefined;
}
