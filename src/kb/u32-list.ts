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
