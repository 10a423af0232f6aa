/**
 * A Bloom filter over strings: "certainly absent" or "maybe present". The KB stores one over its
 * blocking keys, one over deletion variants and one over alias tokens, so that the many probes a
 * noisy mention makes for keys that do not exist are answered in memory instead of by SQLite.
 *
 * Sizing is the textbook one (common practice): m = -n ln p / (ln 2)^2 bits and
 * k = (m / n) ln 2 hash functions for n items at false-positive rate p. Hashes are two 32-bit
 * FNV-1a variants combined by double hashing (Kirsch and Mitzenmacher).
 */

/** False-positive rate the filters are sized for: 1 probe in 100 for an absent key still asks SQLite. */
export const BLOOM_FALSE_POSITIVE_RATE = 0.01;

const FNV_OFFSET = 0x811c9dc5;
const FNV_PRIME = 0x01000193;
/** A second offset basis, so the two hashes of one string are independent enough for double hashing. */
const FNV_OFFSET_2 = 0x01000193 ^ 0x5bd1e995;

/** The two hashes of the last `hash` call (module state, so hashing a string allocates nothing). */
let hash1 = 0;
let hash2 = 0;

/**
 * Both FNV-1a hashes of `s` in one pass: hash1 from FNV_OFFSET, hash2 from FNV_OFFSET_2 with its
 * lowest bit set (an odd step, so the k probes of double hashing never repeat early).
 */
function hash(s: string): void {
  let a = FNV_OFFSET;
  let b = FNV_OFFSET_2;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    a = Math.imul(a ^ c, FNV_PRIME);
    b = Math.imul(b ^ c, FNV_PRIME);
  }
  hash1 = a >>> 0;
  hash2 = (b >>> 0) | 1;
}

export class BloomFilter {
  readonly bits: Uint8Array;
  readonly m: number;
  readonly k: number;

  constructor(m: number, k: number, bits?: Uint8Array) {
    this.m = Math.max(8, m);
    this.k = Math.max(1, k);
    this.bits = bits ?? new Uint8Array(Math.ceil(this.m / 8));
  }

  /** A filter sized for `n` items at the given false-positive rate. */
  static forItems(n: number, rate = BLOOM_FALSE_POSITIVE_RATE): BloomFilter {
    const items = Math.max(1, n);
    const m = Math.ceil((-items * Math.log(rate)) / (Math.LN2 * Math.LN2));
    const k = Math.max(1, Math.round((m / items) * Math.LN2));
    return new BloomFilter(m, k);
  }

  add(s: string): void {
    hash(s);
    for (let i = 0; i < this.k; i++) {
      const bit = (hash1 + Math.imul(i, hash2)) >>> 0;
      const at = bit % this.m;
      this.bits[at >>> 3]! |= 1 << (at & 7);
    }
  }

  /** False: certainly never added. True: probably added. */
  has(s: string): boolean {
    hash(s);
    for (let i = 0; i < this.k; i++) {
      const bit = (hash1 + Math.imul(i, hash2)) >>> 0;
      const at = bit % this.m;
      if ((this.bits[at >>> 3]! & (1 << (at & 7))) === 0) return false;
    }
    return true;
  }
}
