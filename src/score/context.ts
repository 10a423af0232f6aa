/**
 * The context feature without building a vector per candidate. The KB gives every context term
 * an id and keeps each entity's term ids (ascending, repeated per occurrence) with the entity's
 * TF-IDF norm, computed once at index time (the IDF is fixed then) in its hot store. At link time
 * the cosine needs only a merge of the mention's few term ids with the entity's id list.
 *
 * Weights are those of tfidf.ts: tf = 1 + ln(count), weight = tf * idf(term).
 */
import type { TermVector } from "./tfidf.js";

/**
 * Entity term id lists as the KB stores them: 16-bit ids when the table has at most 65,536
 * distinct context terms (half the memory), else 32-bit.
 */
export type TermIdArray = Uint16Array | Uint32Array;

/**
 * A mention's context vector by KB term id: ids ascending (terms unknown to the KB are left
 * out, since no entity carries them; they still count in `norm`), each with its term and its
 * weight times its IDF, the factor an entity's term frequency multiplies.
 */
export interface IdVector {
  ids: Uint32Array;
  terms: string[];
  weightIdf: Float64Array;
  norm: number;
}

/** The id vector of a mention vector; `idOf` gives a term's KB id, or -1 for an unknown term. */
export function idVector(
  mention: TermVector,
  idfOf: (term: string) => number,
  idOf: (term: string) => number,
): IdVector {
  const known: Array<[number, string, number]> = [];
  mention.terms.forEach((t, i) => {
    const id = idOf(t);
    if (id >= 0) known.push([id, t, mention.weights[i]! * idfOf(t)]);
  });
  known.sort((a, b) => a[0] - b[0]);
  return {
    ids: Uint32Array.from(known, (k) => k[0]),
    terms: known.map((k) => k[1]),
    weightIdf: Float64Array.from(known, (k) => k[2]),
    norm: mention.norm,
  };
}

/**
 * The TF-IDF norm of an entity's ascending term ids `ids[start..end)` (repeats = counts), as the
 * KB stores it; `idfOfId` gives the IDF of a term id.
 */
export function termIdListNorm(
  ids: TermIdArray,
  start: number,
  end: number,
  idfOfId: (id: number) => number,
): number {
  let sum = 0;
  let i = start;
  while (i < end) {
    let j = i + 1;
    while (j < end && ids[j] === ids[i]) j++;
    const w = (1 + Math.log(j - i)) * idfOfId(ids[i]!);
    sum += w * w;
    i = j;
  }
  return Math.sqrt(sum);
}

/**
 * Cosine between a mention's id vector and an entity's ascending term ids `ids[start..end)` with
 * its stored norm, clamped to [0, 1], and (when `shared` is given) the shared terms, heaviest
 * product first.
 */
export function contextCosine(
  mention: IdVector,
  ids: TermIdArray,
  start: number,
  end: number,
  entityNorm: number,
  shared?: string[],
): number {
  if (mention.norm === 0 || entityNorm === 0) return 0;
  const mt = mention.ids;
  let dot = 0;
  let i = 0;
  let j = start;
  // Shared terms are gathered only when asked for (the reasons); scoring passes no list.
  const products: Array<[string, number]> | null = shared ? [] : null;
  while (i < mt.length && j < end) {
    const a = mt[i]!;
    const b = ids[j]!;
    if (a === b) {
      let k = j + 1;
      while (k < end && ids[k] === b) k++;
      const p = mention.weightIdf[i]! * (1 + Math.log(k - j));
      dot += p;
      if (products !== null) products.push([mention.terms[i]!, p]);
      i++;
      j = k;
    } else if (a < b) i++;
    else j++;
  }
  if (shared && products !== null) for (const [t] of products.sort((x, y) => y[1] - x[1])) shared.push(t);
  return Math.min(1, Math.max(0, dot / (mention.norm * entityNorm)));
}
