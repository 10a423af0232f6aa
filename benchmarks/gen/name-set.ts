/**
 * A compact membership set of every name and alias in the generated table, used to make sure
 * a NIL mention's name is not in the table. Names are kept as 32-bit hashes in a sorted typed
 * array (4 bytes a name): a hash collision can only reject a good NIL name, never let a table
 * name through.
 */

/** FNV-1a offset basis and prime (the published 32-bit parameters). */
const FNV_OFFSET = 0x811c9dc5;
const FNV_PRIME = 0x01000193;
/** Initial capacity; the array doubles as names are added. */
const INITIAL_CAPACITY = 1 << 16;

/** The comparison key of a name: lower case, letters and digits only. */
export function nameKey(name: string): string {
  return name.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, "");
}

/** 32-bit FNV-1a hash of a name's key. */
export function nameHash(name: string): number {
  const key = nameKey(name);
  let h = FNV_OFFSET;
  for (let i = 0; i < key.length; i++) {
    h ^= key.charCodeAt(i);
    h = Math.imul(h, FNV_PRIME);
  }
  return h >>> 0;
}

/** Add every name, then `freeze()`, then query with `has`. */
export class NameSet {
  private hashes = new Uint32Array(INITIAL_CAPACITY);
  private count = 0;
  private frozen = false;

  add(name: string): void {
    if (this.frozen) throw new Error("NameSet.add after freeze");
    if (this.count === this.hashes.length) {
      const grown = new Uint32Array(this.hashes.length * 2);
      grown.set(this.hashes);
      this.hashes = grown;
    }
    this.hashes[this.count++] = nameHash(name);
  }

  freeze(): void {
    this.hashes = this.hashes.slice(0, this.count).sort();
    this.frozen = true;
  }

  has(name: string): boolean {
    if (!this.frozen) throw new Error("NameSet.has before freeze");
    const h = nameHash(name);
    let lo = 0;
    let hi = this.hashes.length - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >>> 1;
      const v = this.hashes[mid] as number;
      if (v === h) return true;
      if (v < h) lo = mid + 1;
      else hi = mid - 1;
    }
    return false;
  }
}
