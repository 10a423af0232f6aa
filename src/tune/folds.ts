/** Deterministic fold assignment for cross-validation: a seeded shuffle of mention indices. */

/**
 * mulberry32: a small, fast 32-bit generator; statistically fine for shuffling and, above all,
 * identical on every platform for a given seed.
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Fisher-Yates shuffle of 0..n-1 driven by mulberry32(seed). */
export function shuffledIndices(n: number, seed: number): number[] {
  const random = mulberry32(seed);
  const order = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  return order;
}

/**
 * Fold of each of n items: the shuffled order is dealt round-robin, so fold sizes differ by at
 * most one. Returns fold numbers 0..folds-1 indexed by item.
 */
export function assignFolds(n: number, folds: number, seed: number): number[] {
  const fold = new Array<number>(n).fill(0);
  shuffledIndices(n, seed).forEach((item, position) => {
    fold[item] = position % folds;
  });
  return fold;
}
