/**
 * Seeded pseudo-random numbers for the benchmark generator. Everything the generator draws
 * comes from here, so the same seed always yields byte-identical files.
 */

/** Multipliers of the 32-bit integer hash finalizer below (the murmur3 fmix32 constants). */
const MIX_MULTIPLIER_A = 0x85ebca6b;
const MIX_MULTIPLIER_B = 0xc2b2ae35;
/** Distinct starting values of the four seed lanes (fractional digits of the golden ratio, pi, e, sqrt 2). */
const LANE_INITS: readonly number[] = [0x9e3779b9, 0x243f6a88, 0xb7e15162, 0x6a09e667];
/** Outputs discarded after seeding so the first draws do not echo the seed (common practice for sfc32). */
const WARMUP_ROUNDS = 12;
/** 2^32, to map a 32-bit unsigned integer into [0, 1). */
const TWO_POW_32 = 4294967296;

function fmix32(x: number): number {
  let h = x >>> 0;
  h = Math.imul(h ^ (h >>> 16), MIX_MULTIPLIER_A);
  h = Math.imul(h ^ (h >>> 13), MIX_MULTIPLIER_B);
  return (h ^ (h >>> 16)) >>> 0;
}

/** Hashes integer parts (seed, stream tag, index...) into one lane of a seed. */
function lane(init: number, parts: readonly number[]): number {
  let h = init;
  for (const part of parts) h = fmix32(h ^ fmix32((part >>> 0) + init));
  return h;
}

/**
 * A 128-bit seed derived from integer parts: four independently hashed 32-bit lanes. A million
 * per-entity streams then never share a seed, which a single 32-bit seed would (birthday bound).
 */
export type Seed = readonly [number, number, number, number];

export function mixSeed(...parts: number[]): Seed {
  return [
    lane(LANE_INITS[0]!, parts),
    lane(LANE_INITS[1]!, parts),
    lane(LANE_INITS[2]!, parts),
    lane(LANE_INITS[3]!, parts),
  ];
}

/**
 * A small seeded generator (sfc32: 128-bit state, so per-entity streams do not overlap the way
 * shifted copies of a 32-bit counter generator can) with the sampling helpers the generator needs.
 */
export class Rng {
  private a: number;
  private b: number;
  private c: number;
  private d: number;

  constructor(seed: Seed) {
    [this.a, this.b, this.c, this.d] = seed;
    for (let i = 0; i < WARMUP_ROUNDS; i++) this.next();
  }

  /** Uniform float in [0, 1). */
  next(): number {
    const t = (((this.a + this.b) | 0) + this.d) | 0;
    this.d = (this.d + 1) | 0;
    this.a = this.b ^ (this.b >>> 9);
    this.b = (this.c + (this.c << 3)) | 0;
    this.c = (this.c << 21) | (this.c >>> 11);
    this.c = (this.c + t) | 0;
    return (t >>> 0) / TWO_POW_32;
  }

  /** Uniform integer in [0, n). */
  int(n: number): number {
    return Math.floor(this.next() * n);
  }

  /** Uniform integer in [lo, hi], both ends included. */
  between(lo: number, hi: number): number {
    return lo + this.int(hi - lo + 1);
  }

  /** True with probability p. */
  chance(p: number): boolean {
    return this.next() < p;
  }

  /** One element of a non-empty array, uniformly. */
  pick<T>(items: readonly T[]): T {
    const item = items[this.int(items.length)];
    if (item === undefined) throw new Error("Rng.pick: empty array");
    return item;
  }

  /** An index drawn from a cumulative weight table (see `cumulative`). */
  weighted(cum: Float64Array): number {
    const total = cum[cum.length - 1] ?? 0;
    return searchCumulative(cum, this.next() * total);
  }

  /** Fisher-Yates shuffle of a copy. */
  shuffled<T>(items: readonly T[]): T[] {
    const out = items.slice();
    for (let i = out.length - 1; i > 0; i--) {
      const j = this.int(i + 1);
      const tmp = out[i] as T;
      out[i] = out[j] as T;
      out[j] = tmp;
    }
    return out;
  }
}

/** Running sums of weights, for `Rng.weighted`. */
export function cumulative(weights: ArrayLike<number>): Float64Array {
  const cum = new Float64Array(weights.length);
  let sum = 0;
  for (let i = 0; i < weights.length; i++) {
    sum += weights[i] ?? 0;
    cum[i] = sum;
  }
  return cum;
}

/** First index whose running sum exceeds `target` (binary search). */
export function searchCumulative(cum: Float64Array, target: number): number {
  let lo = 0;
  let hi = cum.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((cum[mid] ?? 0) > target) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** Cumulative Zipf weights 1 / rank^exponent for ranks 1..n: a few items common, a long tail rare. */
export function zipfTable(n: number, exponent: number): Float64Array {
  const weights = new Float64Array(n);
  for (let i = 0; i < n; i++) weights[i] = 1 / (i + 1) ** exponent;
  return cumulative(weights);
}
