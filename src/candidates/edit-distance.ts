/**
 * Optimal string alignment distance (restricted Damerau-Levenshtein): insertions, deletions,
 * substitutions and transpositions of two adjacent characters each cost one, and no substring
 * is edited twice. A swapped pair of letters ("Radolnig" for "Radoling"), the commonest slip of
 * typesetters and of OCR line segmentation alike, costs one edit here where plain Levenshtein
 * charges two.
 */

/** The three rolling rows of osaDistance, reused across calls (grown on demand). */
let rows = new Uint32Array(3 * 32);

/** OSA distance of `a` and `b`, in UTF-16 code units; three rolling rows, O(|a| * |b|) time. */
export function osaDistance(a: string, b: string): number {
  if (a === b) return 0;
  if (a.length === 0) return b.length;
  if (b.length === 0) return a.length;
  const n = b.length;
  const width = n + 1;
  if (rows.length < 3 * width) rows = new Uint32Array(6 * width);
  const r = rows;
  // Offsets of the row two back, the previous row and the current one; rotated after each row.
  let prev2 = 0;
  let prev = width;
  let cur = 2 * width;
  for (let j = 0; j <= n; j++) r[prev + j] = j;
  for (let i = 1; i <= a.length; i++) {
    r[cur] = i;
    const ai = a.charCodeAt(i - 1);
    for (let j = 1; j <= n; j++) {
      const bj = b.charCodeAt(j - 1);
      let d = Math.min(r[prev + j]! + 1, r[cur + j - 1]! + 1, r[prev + j - 1]! + (ai === bj ? 0 : 1));
      if (i > 1 && j > 1 && ai === b.charCodeAt(j - 2) && a.charCodeAt(i - 2) === bj) {
        d = Math.min(d, r[prev2 + j - 2]! + 1);
      }
      r[cur + j] = d;
    }
    const oldest = prev2;
    prev2 = prev;
    prev = cur;
    cur = oldest;
  }
  return r[prev + n]!;
}
