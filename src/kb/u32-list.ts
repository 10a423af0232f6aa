/** A growable Uint32Array, for arrays built row by row whose final length is not known ahead. */
export class U32List {
  data: Uint32Array;
  length = 0;
  constructor(capacity = 1024) {
    this.data = new Uint32Array(capacity);
  }
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Uint32Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  /** A copy of the filled part. */
  toArray(): Uint32Array {
    return this.data.slice(0, this.length);
  }
}

/** Most distinct ids an id array stores in 16 bits. */
const IDS_16_MAX = 2 ** 16;

/** `ids` in 16 bits when there are at most 65,536 distinct ids (half the memory), else as they are. */
export function narrowIds(ids: Uint32Array, distinct: number): Uint16Array | Uint32Array {
  return distinct <= IDS_16_MAX ? Uint16Array.from(ids) : ids;
}

/**
 * A stable counting sort of parallel columns by bucket: entry i (of `n`) goes to bucket
 * `bucketOf(i)` (0 .. buckets - 1). Returns each column laid out bucket after bucket, entries of
 * one bucket in their original order, and `start`: bucket b's entries are [start[b], start[b + 1]).
 */
export function groupByBucket(
  n: number,
  buckets: number,
  bucketOf: (i: number) => number,
  columns: readonly Uint32Array[],
): { start: Uint32Array; grouped: Uint32Array[] } {
  const start = new Uint32Array(buckets + 1);
  for (let i = 0; i < n; i++) start[bucketOf(i) + 1]!++;
  for (let b = 0; b < buckets; b++) start[b + 1]! += start[b]!;
  const fill = start.slice(0, buckets);
  const grouped = columns.map(() => new Uint32Array(n));
  for (let i = 0; i < n; i++) {
    const at = fill[bucketOf(i)]!++;
    for (let c = 0; c < columns.length; c++) grouped[c]![at] = columns[c]![i]!;
  }
  return { start, grouped };
}
