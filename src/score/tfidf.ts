/**
 * TF-IDF term vectors for the context feature: building, cosine similarity, and a compact binary
 * encoding for storing an entity's vector in the KB (SQLite BLOB).
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

// ---------------------------------------------------------------------------------------------
// Binary encoding
// ---------------------------------------------------------------------------------------------

/**
 * Encoded vector layout, all integers and floats little-endian:
 *
 * | offset          | size    | content                                          |
 * |-----------------|---------|--------------------------------------------------|
 * | 0               | 2       | magic "TV" (0x54 0x56)                           |
 * | 2               | 1       | format version, 1                                |
 * | 3               | 1       | reserved, 0                                      |
 * | 4               | 4       | uint32 n, the number of terms                    |
 * | 8               | 8       | float64 norm                                     |
 * | 16              | 8 * n   | float64 weights, in term order                   |
 * | 16 + 8n         | 2 * n   | uint16 UTF-8 byte length of each term            |
 * | 16 + 10n        | rest    | the terms' UTF-8 bytes, concatenated in order    |
 *
 * Weights come first so they sit 8-byte aligned within the encoding; the header fixes the format
 * so a KB written by a later version fails loudly instead of decoding garbage.
 */
const MAGIC_0 = 0x54; // "T"
const MAGIC_1 = 0x56; // "V"
const FORMAT_VERSION = 1;
const HEADER_BYTES = 16;
const WEIGHT_BYTES = 8;
const LENGTH_BYTES = 2;
/** Longest term the uint16 length field can describe, in UTF-8 bytes. */
const MAX_TERM_BYTES = 0xffff;

/**
 * Encodes a vector as a Buffer (layout above). Terms are stored as UTF-8, so they must be
 * well-formed strings (a lone surrogate would come back as U+FFFD; `contextTerms` never yields
 * one). Throws a RangeError for a term too long to store or a weight count that does not match.
 */
export function encodeVector(v: TermVector): Buffer {
  const n = v.terms.length;
  if (v.weights.length !== n) {
    throw new RangeError(`encodeVector: ${n} terms but ${v.weights.length} weights`);
  }
  const termBytes = new Array<number>(n);
  let textBytes = 0;
  for (let i = 0; i < n; i++) {
    const len = Buffer.byteLength(v.terms[i]!, "utf8");
    if (len > MAX_TERM_BYTES) {
      throw new RangeError(`encodeVector: term ${i} is ${len} bytes long, more than ${MAX_TERM_BYTES}`);
    }
    termBytes[i] = len;
    textBytes += len;
  }
  const buf = Buffer.alloc(HEADER_BYTES + n * (WEIGHT_BYTES + LENGTH_BYTES) + textBytes);
  buf[0] = MAGIC_0;
  buf[1] = MAGIC_1;
  buf[2] = FORMAT_VERSION;
  buf.writeUInt32LE(n, 4);
  buf.writeDoubleLE(v.norm, 8);
  let at = HEADER_BYTES;
  for (let i = 0; i < n; i++, at += WEIGHT_BYTES) buf.writeDoubleLE(v.weights[i]!, at);
  for (let i = 0; i < n; i++, at += LENGTH_BYTES) buf.writeUInt16LE(termBytes[i]!, at);
  for (let i = 0; i < n; i++) at += buf.write(v.terms[i]!, at, "utf8");
  return buf;
}

/**
 * Decodes a vector written by `encodeVector`. Accepts any Uint8Array (better-sqlite3 returns
 * BLOBs as Buffers). Throws an Error naming the problem for a truncated or foreign encoding, or
 * terms out of order.
 */
export function decodeVector(data: Uint8Array): TermVector {
  const buf = Buffer.isBuffer(data) ? data : Buffer.from(data.buffer, data.byteOffset, data.byteLength);
  if (buf.length < HEADER_BYTES || buf[0] !== MAGIC_0 || buf[1] !== MAGIC_1) {
    throw new Error("decodeVector: not an encoded term vector (bad header)");
  }
  if (buf[2] !== FORMAT_VERSION) {
    throw new Error(
      `decodeVector: unsupported format version ${buf[2]} (this build reads ${FORMAT_VERSION})`,
    );
  }
  const n = buf.readUInt32LE(4);
  const norm = buf.readDoubleLE(8);
  const fixedEnd = HEADER_BYTES + n * (WEIGHT_BYTES + LENGTH_BYTES);
  if (buf.length < fixedEnd) {
    throw new Error(`decodeVector: truncated: ${n} terms need at least ${fixedEnd} bytes, got ${buf.length}`);
  }
  const weights = new Float64Array(n);
  let at = HEADER_BYTES;
  for (let i = 0; i < n; i++, at += WEIGHT_BYTES) weights[i] = buf.readDoubleLE(at);
  let textAt = fixedEnd;
  const terms = new Array<string>(n);
  for (let i = 0; i < n; i++, at += LENGTH_BYTES) {
    const len = buf.readUInt16LE(at);
    if (textAt + len > buf.length) {
      throw new Error(`decodeVector: truncated: term ${i} runs past the end of the data`);
    }
    const term = buf.toString("utf8", textAt, textAt + len);
    if (i > 0 && !(terms[i - 1]! < term)) {
      throw new Error(`decodeVector: terms out of order at term ${i}`);
    }
    terms[i] = term;
    textAt += len;
  }
  if (textAt !== buf.length) {
    throw new Error(`decodeVector: ${buf.length - textAt} unexpected trailing bytes`);
  }
  return { terms, weights, norm };
}
