/**
 * Optimal string alignment distance (restricted Damerau-Levenshtein): insertions, deletions,
 * substitutions and transpositions of two adjacent characters each cost one, and no substring
 * is edited twice. A swapped pair of letters ("Radolnig" for "Radoling"), the commonest slip of
 * typesetters and of OCR line segmentation alike, costs one edit here where plain Levenshtein
 * charges two.
 */

/** OSA distance of `a` and `b`, in UTF-16 code units; three rolling rows, O(|a| * |b|) time. */
export function osaDistance(a: string, b: string): number {
  if (a === b) return 0;
  if (a.length === 0) return b.length;
  if (b.length === 0) return a.length;
  const n = b.length;
  let prev2 = new Uint32Array(n + 1);
  let prev = new Uint32Array(n + 1);
  let cur = new Uint32Array(n + 1);
  for (let j = 0; j <= n; j++) prev[j] = j;
  for (let i = 1; i <= a.length; i++) {
    cur[0] = i;
    const ai = a.charCodeAt(i - 1);
    for (let j = 1; j <= n; j++) {
      const bj = b.charCodeAt(j - 1);
      let d = Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + (ai === bj ? 0 : 1));
      if (i > 1 && j > 1 && ai === b.charCodeAt(j - 2) && a.charCodeAt(i - 2) === bj) {
        d = Math.min(d, prev2[j - 2]! + 1);
      }
      cur[j] = d;
    }
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[n]!;
}
