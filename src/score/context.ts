/**
 * The context feature without building a vector per candidate: the entity's TF-IDF norm is
 * computed once at index time (the IDF is fixed then), so at link time the cosine needs only a
 * merge of the mention's few terms with the entity's sorted term list.
 *
 * Weights are those of tfidf.ts: tf = 1 + ln(count), weight = tf * idf(term).
 */
import type { TermVector } from "./tfidf.js";

/** The TF-IDF norm of a sorted term list (repeats = counts), as stored in the KB. */
export function termListNorm(sortedTerms: readonly string[], idfOf: (t: string) => number): number {
  let sum = 0;
  let i = 0;
  while (i < sortedTerms.length) {
    const t = sortedTerms[i]!;
    let j = i + 1;
    while (j < sortedTerms.length && sortedTerms[j] === t) j++;
    const w = (1 + Math.log(j - i)) * idfOf(t);
    sum += w * w;
    i = j;
  }
  return Math.sqrt(sum);
}

/**
 * Cosine between a mention vector and an entity's sorted term list with its stored norm, and
 * (when `shared` is given) the shared terms, heaviest product first.
 */
export function contextCosine(
  mention: TermVector & { idfs: Float64Array },
  entityTerms: readonly string[],
  entityNorm: number,
  shared?: string[],
): number {
  if (mention.norm === 0 || entityNorm === 0) return 0;
  const mt = mention.terms;
  let dot = 0;
  let i = 0;
  let j = 0;
  const products: Array<[string, number]> = [];
  while (i < mt.length && j < entityTerms.length) {
    const a = mt[i]!;
    const b = entityTerms[j]!;
    if (a === b) {
      let k = j + 1;
      while (k < entityTerms.length && entityTerms[k] === b) k++;
      const p = mention.weights[i]! * (1 + Math.log(k - j)) * mention.idfs[i]!;
      dot += p;
      if (shared) products.push([a, p]);
      i++;
      j = k;
    } else if (a < b) i++;
    else j++;
  }
  if (shared) for (const [t] of products.sort((x, y) => y[1] - x[1])) shared.push(t);
  return Math.min(1, Math.max(0, dot / (mention.norm * entityNorm)));
}
