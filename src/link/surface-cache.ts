/**
 * Work shared by mentions with the same text and label. An archive names the same entities over
 * and over in the same few spellings; what follows from the spelling and the label alone (the
 * normalized forms, the candidate pool before the context-dependent cut) is computed once per
 * spelling and reused. The context is weighed afresh for every mention, so a held surface gives
 * the same rows as a fresh one. (Name features against each candidate were held too, at first:
 * they keep the candidates' alias rows alive, and the memory cost outweighed the time saved.)
 *
 * A surface is held from its second sighting on: most spellings in a stream of mostly distinct
 * names are seen once, and holding each for a while only to drop it later makes the garbage
 * collector let the heap grow, though a surface is small (its pool is in typed arrays). At
 * 1,000,000 entities, on the benchmark's stream (85% distinct spellings, each mention linked and
 * then asked for its candidates), with room for 4,096 surfaces, peak RSS was 443 MB holding
 * surfaces from their first sighting and 376 MB from their second (365 MB without reuse).
 * Held surfaces are bounded two ways, least recently used first out: a number of surfaces, and a
 * weight (entities held in pools).
 */
import type { CandidatePool, MentionForm } from "../candidates/generate.js";

/** What one (text, label) pair has computed so far. */
export interface Surface {
  /** Normalized forms, one per class the label may be (see Linker.prepare). */
  readonly forms: MentionForm[];
  /** Context terms of the mention's own text (left out of its context vector), once computed. */
  own: ReadonlySet<string> | undefined;
  /** Candidate pool (see gatherPool), once computed. */
  pool: CandidatePool | undefined;
  /** Units of the cache's weight budget this surface holds. */
  weight: number;
  /** Whether the cache holds it (an evicted surface stays usable by whoever holds it). */
  held: boolean;
}

/**
 * Keys remembered as seen once, per surface the cache may hold; past this the memory of
 * sightings starts afresh (a doorkeeper reset: a spelling seen twice since is still held).
 */
const SEEN_PER_SURFACE = 4;

export class SurfaceCache {
  private readonly map = new Map<string, Surface>();
  /** Keys seen once since the last reset (see SEEN_PER_SURFACE). */
  private readonly seen = new Set<string>();
  private total = 0;

  /**
   * `maxSurfaces`: most (text, label) pairs held (0 holds none: every surface is computed fresh).
   * `maxWeight`: most pool members held, over all surfaces.
   */
  constructor(
    private readonly maxSurfaces: number,
    private readonly maxWeight: number,
  ) {}

  /** Number of surfaces held. */
  get size(): number {
    return this.map.size;
  }

  /**
   * The surface of `key`, computing its forms with `make` when it is not held; held from now on
   * when the key was seen before.
   */
  get(key: string, make: () => MentionForm[]): Surface {
    const held = this.map.get(key);
    if (held !== undefined) {
      // Most recently used last: Map keeps insertion order.
      this.map.delete(key);
      this.map.set(key, held);
      return held;
    }
    const s: Surface = {
      forms: make(),
      own: undefined,
      pool: undefined,
      weight: 1,
      held: false,
    };
    if (this.maxSurfaces === 0) return s;
    if (!this.seen.has(key)) {
      if (this.seen.size >= this.maxSurfaces * SEEN_PER_SURFACE) this.seen.clear();
      this.seen.add(key);
    } else {
      this.seen.delete(key);
      s.held = true;
      this.map.set(key, s);
      this.total += s.weight;
      this.evict();
    }
    return s;
  }

  /** Counts `units` more weight on a surface (its pool was gathered). */
  grow(s: Surface, units: number): void {
    s.weight += units;
    if (!s.held) return;
    this.total += units;
    this.evict();
  }

  private evict(): void {
    while (this.map.size > this.maxSurfaces || (this.total > this.maxWeight && this.map.size > 0)) {
      const [key, oldest] = this.map.entries().next().value as [string, Surface];
      this.map.delete(key);
      oldest.held = false;
      this.total -= oldest.weight;
    }
  }
}
