/**
 * TF-IDF term vectors for the context feature: building and cosine similarity (the reference the
 * link-time cosine over KB term ids, src/score/context.ts, is tested against).
 */

/**
 * Smoothed inverse document frequency: ln((1 + N) / (1 + df)) + 1.
 *
 * Common practice (the smoothed form used by mainstream text-retrieval toolkits): the +1 inside
 * acts as if one extra document contained every term, so a term never seen at index time
 * (df = 0) gets a finite weight, and the +1 outside keeps terms that occur in every document at
 * weight 1 instead of 0. Always >= 1 for 0 <= df <= N. Throws a RangeError for negative or
 * non-finite counts.
 */
export function idf(df: number, nDocs: number): number {
  if (!(df >= 0 && nDocs >= 0 && Number.isFinite(df) && Number.isFinite(nDocs))) {
    throw new RangeError(`idf: document counts must be finite and >= 0 (df=${df}, nDocs=${nDocs})`);
  }
  return Math.log((1 + nDocs) / (1 + df)) + 1;
}

/**
 * A weighted term vector. `terms` are distinct and sorted ascending by UTF-16 code units (the
 * order of JavaScript's `<` on strings), `weights[i]` belongs to `terms[i]`, `norm` is the
 * Euclidean length of `weights`.
 */
export type TermVector = { terms: string[]; weights: Float64Array; norm: number };

/**
 * Builds a vector from a term list (duplicates count): tf = 1 + ln(count) (log scaling, so a word
 * repeated ten times does not outweigh ten different shared words), weight = tf * idfOf(term).
 */
export function buildVector(terms: string[], idfOf: (t: string) => number): TermVector {
  if (terms.length === 0) return { terms: [], weights: new Float64Array(0), norm: 0 };
  const counts = new Map<string, number>();
  for (const t of terms) counts.set(t, (counts.get(t) ?? 0) + 1);
  const sorted = [...counts.keys()].sort();
  const weights = new Float64Array(sorted.length);
  let sumSquares = 0;
  for (let i = 0; i < sorted.length; i++) {
    const t = sorted[i]!;
    const w = (1 + Math.log(counts.get(t)!)) * idfOf(t);
    weights[i] = w;
    sumSquares += w * w;
  }
  return { terms: sorted, weights, norm: Math.sqrt(sumSquares) };
}

/**
 * Cosine similarity of two vectors by a merge join over their sorted terms, clamped to [0, 1]
 * (rounding can push it a hair past 1; negative weights, which `idf` never produces, to below 0).
 * 0 when either vector is empty or has zero norm.
 */
export function cosine(a: TermVector, b: TermVector): number {
  if (a.norm === 0 || b.norm === 0) return 0;
  const ta = a.terms;
  const tb = b.terms;
  const wa = a.weights;
  const wb = b.weights;
  let i = 0;
  let k = 0;
  let dot = 0;
  while (i < ta.length && k < tb.length) {
    const x = ta[i]!;
    const y = tb[k]!;
    if (x === y) {
      dot += wa[i]! * wb[k]!;
      i++;
      k++;
    } else if (x < y) {
      i++;
    } else {
      k++;
    }
  }
  const c = dot / (a.norm * b.norm);
  return c <= 0 ? 0 : Math.min(c, 1);
}
