/**
 * Edit distance between two strings: the fewest single-character insertions, deletions,
 * substitutions and swaps of neighbours that turn one into the other (the "optimal string
 * alignment" variant of Damerau–Levenshtein; Damerau 1964, Levenshtein 1966). Swaps count
 * once because transposed letters ("coruant") are the commonest typing slip.
 *
 * @example
 * editDistance('courrant', 'courant'); // 1
 */
export function editDistance(a: string, b: string): number {
  const n = a.length;
  const m = b.length;
  // Three rolling rows: the swap rule looks two rows back.
  let prev2 = new Array<number>(m + 1).fill(0);
  let prev = Array.from({ length: m + 1 }, (_, j) => j);
  let cur = new Array<number>(m + 1).fill(0);
  for (let i = 1; i <= n; i++) {
    cur[0] = i;
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, prev2[j - 2] + 1);
      cur[j] = d;
    }
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[m];
}

/** Longest key we try to match; longer unknown keys are not typos of ours. */
const MAX_KEY_LENGTH = 64;

/**
 * The candidate a mistyped name most likely meant, or undefined when none is close.
 * Case is ignored. A candidate is close when its edit distance is at most a third of its
 * length (at least 1), or when the input is a prefix of it at least three characters long
 * ("freq" → "frequencies"). Ties go to the first candidate. // common practice, no source
 *
 * @example
 * closestName('kapaMax', ['cells', 'kappaMax']); // 'kappaMax'
 */
export function closestName(input: string, candidates: readonly string[]): string | undefined {
  if (input.length === 0 || input.length > MAX_KEY_LENGTH) return undefined;
  const lower = input.toLowerCase();
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const c of candidates) {
    const cl = c.toLowerCase();
    const d = editDistance(lower, cl);
    const allowed = Math.max(1, Math.floor(c.length / 3));
    if (d <= allowed && d < bestDistance) { best = c; bestDistance = d; }
  }
  if (best !== undefined) return best;
  if (lower.length >= 3) return candidates.find((c) => c.toLowerCase().startsWith(lower));
  return undefined;
}
