/**
 * Context statistics gathered while the table streams in: the document frequency of every
 * context term, and each entity's term list as term ids in compact typed arrays (four bytes per
 * term occurrence instead of a string), so the TF-IDF norms can be computed once the final IDF
 * is known without reading the entities back from SQLite.
 */
import { idf } from "../score/tfidf.js";

/** log2 of the entries per chunk of a ChunkedUint32 (1 Mi entries, 4 MiB per chunk). */
const CHUNK_BITS = 20;
const CHUNK_SIZE = 1 << CHUNK_BITS;
const CHUNK_MASK = CHUNK_SIZE - 1;

/**
 * A growable array of uint32 in fixed-size chunks: growing never copies, and at most one chunk
 * is partly unused (a doubling array would hold up to twice its contents, and three times while
 * it grows).
 */
class ChunkedUint32 {
  private readonly chunks: Uint32Array[] = [];
  length = 0;

  push(v: number): void {
    const c = this.length >>> CHUNK_BITS;
    if (c === this.chunks.length) this.chunks.push(new Uint32Array(CHUNK_SIZE));
    this.chunks[c]![this.length & CHUNK_MASK] = v;
    this.length++;
  }

  get(i: number): number {
    return this.chunks[i >>> CHUNK_BITS]![i & CHUNK_MASK]!;
  }
}

export class ContextStats {
  private readonly ids = new Map<string, number>();
  /** Terms by id, in order of first appearance. */
  private readonly termList: string[] = [];
  /** Document frequency by term id. */
  private readonly df: number[] = [];
  /** The term id of every occurrence, documents one after another, each in sorted term order. */
  private readonly occurrences = new ChunkedUint32();
  /** Entry d: where document d + 1 starts in `occurrences` (document 0 starts at 0). */
  private readonly ends = new ChunkedUint32();

  /** Number of documents added. */
  get documents(): number {
    return this.ends.length;
  }

  /** Number of distinct terms seen. */
  get size(): number {
    return this.termList.length;
  }

  /** Adds the next document's terms, sorted (repeats are counts). */
  add(sortedTerms: readonly string[]): void {
    let id = -1;
    for (let i = 0; i < sortedTerms.length; i++) {
      const t = sortedTerms[i]!;
      if (i === 0 || t !== sortedTerms[i - 1]) {
        let known = this.ids.get(t);
        if (known === undefined) {
          known = this.termList.length;
          this.ids.set(t, known);
          this.termList.push(t);
          this.df.push(0);
        }
        id = known;
        this.df[id]!++;
      }
      this.occurrences.push(id);
    }
    this.ends.push(this.occurrences.length);
  }

  /** Every term with its document frequency, in order of first appearance. */
  *frequencies(): Generator<[string, number]> {
    for (let id = 0; id < this.termList.length; id++) yield [this.termList[id]!, this.df[id]!];
  }

  /**
   * The TF-IDF norm of every document (index = order added), by the formula and summation order
   * of `termListNorm` (score/context.ts): terms in sorted order, weight (1 + ln count) * idf.
   */
  norms(): Float64Array {
    const docs = this.documents;
    const idfs = new Float64Array(this.termList.length);
    for (let id = 0; id < idfs.length; id++) idfs[id] = idf(this.df[id]!, docs);
    const out = new Float64Array(docs);
    let e = 0;
    for (let d = 0; d < docs; d++) {
      const end = this.ends.get(d);
      let sum = 0;
      while (e < end) {
        const id = this.occurrences.get(e);
        let run = e + 1;
        while (run < end && this.occurrences.get(run) === id) run++;
        const w = (1 + Math.log(run - e)) * idfs[id]!;
        sum += w * w;
        e = run;
      }
      out[d] = Math.sqrt(sum);
    }
    return out;
  }
}
