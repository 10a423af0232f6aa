/**
 * A bounded cache in two generations: hits are looked up in the young map, then in the old one
 * (and promoted); when the young map is full it becomes the old one and a new young map starts.
 * Recently used entries survive, memory stays under twice the size, and no access pays for
 * reordering (a plain LRU's delete-and-reinsert on every hit cost more than the lookups it saved).
 */
export class GenerationCache<K, V> {
  private young = new Map<K, V>();
  private old = new Map<K, V>();
  constructor(private readonly size: number) {}
  get(k: K): V | undefined {
    const v = this.young.get(k);
    if (v !== undefined) return v;
    const o = this.old.get(k);
    if (o !== undefined) this.set(k, o);
    return o;
  }
  set(k: K, v: V): void {
    if (this.young.size >= this.size) {
      this.old = this.young;
      this.young = new Map();
    }
    this.young.set(k, v);
  }
}
