/**
 * A compact in-memory multimap from strings to 32-bit values, for lookups that every mention
 * makes many times (blocking keys, deletion variants). Strings are not stored: each is reduced
 * to two 32-bit FNV-1a hashes, the first picks a bucket and the second is kept as a check. The
 * entries of a bucket sit side by side (a counting sort by bucket at build time), so a lookup
 * is one hash, one bucket range and a scan of a few check words, with no allocation.
 *
 * A lookup can answer a value of another string only when that string falls in the same bucket
 * and its second hash is equal too (about one lookup in a billion at the default bucket load):
 * candidate generation then proposes one more entity, which scoring judges on its real names
 * like any other. A lookup never misses a value that was added.
 *
 * Memory: 8 bytes per entry and 4 per bucket, with one bucket per BUCKET_LOAD entries (about
 * 39 MB for the 4.4 million blocking-key rows of the 1,000,000-entity benchmark table).
 */

import { groupByBucket, U32List } from "./u32-list.js";

const FNV_OFFSET = 0x811c9dc5;
const FNV_PRIME = 0x01000193;
/** A second offset basis, so the two hashes of one string are independent enough to check each other. */
const FNV_OFFSET_2 = 0x01000193 ^ 0x5bd1e995;

/** The two hashes of the last `hashPair` call (module state, so hashing allocates nothing). */
let hashA = 0;
let hashB = 0;

/** Both 32-bit FNV-1a hashes of `s` (over UTF-16 units) in one pass, into hashA and hashB. */
function hashPair(s: string): void {
  let a = FNV_OFFSET;
  let b = FNV_OFFSET_2;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    a = Math.imul(a ^ c, FNV_PRIME);
    b = Math.imul(b ^ c, FNV_PRIME);
  }
  hashA = a >>> 0;
  hashB = b >>> 0;
}

/**
 * Entries per bucket, on average, when the index is sized. Eight keeps the bucket array at an
 * eighth of the entry arrays (4 MB less than four for the million-entity benchmark's keys); a
 * lookup scans eight check words on average, which still costs less than hashing the string.
 * Values of one string share a bucket, whatever the load.
 */
const BUCKET_LOAD = 8;

/** The three arrays of a built index, as stored in the KB's hot table. */
export interface StringIndexArrays {
  /** bucket b's entries are check/value[start[b] .. start[b + 1]); length = buckets + 1. */
  start: Uint32Array;
  /** The second hash of each entry's string. */
  check: Uint32Array;
  value: Uint32Array;
}

/** Collects (string, value) entries in any order; `build` lays them out by bucket. */
export class StringIndexBuilder {
  private readonly bucketHash = new U32List();
  private readonly check = new U32List();
  private readonly value = new U32List();

  get size(): number {
    return this.value.length;
  }

  add(s: string, value: number): void {
    hashPair(s);
    this.bucketHash.push(hashA);
    this.check.push(hashB);
    this.value.push(value);
  }

  /** The index, entries of one bucket in the order they were added (a stable counting sort). */
  build(): StringIndexArrays {
    const n = this.value.length;
    let buckets = 1;
    while (buckets * BUCKET_LOAD < n) buckets *= 2;
    const mask = buckets - 1;
    const hashes = this.bucketHash.data;
    const {
      start,
      grouped: [check, value],
    } = groupByBucket(n, buckets, (i) => hashes[i]! & mask, [this.check.data, this.value.data]);
    return { start, check: check!, value: value! };
  }
}

/** A built index, loaded for lookups. */
export class StringIndex {
  private readonly start: Uint32Array;
  private readonly check: Uint32Array;
  private readonly value: Uint32Array;
  private readonly mask: number;

  constructor(arrays: StringIndexArrays) {
    const buckets = arrays.start.length - 1;
    if (buckets < 1 || (buckets & (buckets - 1)) !== 0)
      throw new Error(`string index: ${buckets} buckets is not a power of two`);
    if (arrays.check.length !== arrays.value.length || arrays.start[buckets] !== arrays.value.length)
      throw new Error("string index: arrays of different lengths");
    this.start = arrays.start;
    this.check = arrays.check;
    this.value = arrays.value;
    this.mask = buckets - 1;
  }

  get size(): number {
    return this.value.length;
  }

  /** Calls `each` with every value added under `s`, in the order they were added. */
  forEach(s: string, each: (value: number) => void): void {
    hashPair(s);
    const b = hashA & this.mask;
    const want = hashB;
    const end = this.start[b + 1]!;
    for (let i = this.start[b]!; i < end; i++) if (this.check[i] === want) each(this.value[i]!);
  }

  /** Whether any value was added under `s` (true can, very rarely, be a collision: see above). */
  has(s: string): boolean {
    hashPair(s);
    const b = hashA & this.mask;
    const end = this.start[b + 1]!;
    for (let i = this.start[b]!; i < end; i++) if (this.check[i] === hashB) return true;
    return false;
  }
}
