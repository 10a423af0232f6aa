import { describe, expect, it } from "vitest";
import { DEFAULT_WEIGHTS } from "../src/score/combine.js";
import { mulberry32 } from "../src/tune/folds.js";
import { choleskySolve, fitLogistic, fitWeights, logisticObjective } from "../src/tune/logistic.js";
import { FEATURE_NAMES } from "../src/types.js";
import { ZERO_FEATURES } from "./eval-helpers.js";

/** Plain gradient descent on the same objective, as an independent check of the Newton solver. */
function gradientDescent(x: number[][], y: number[], l2: number, iterations: number): number[] {
  const d = x[0]!.length;
  const theta = new Array<number>(d + 1).fill(0);
  // Step 1/L with L an upper bound of the gradient's Lipschitz constant: 0.25 * ||[1 X]||_F^2 + l2.
  let frob = 0;
  for (const row of x) frob += 1 + row.reduce((s, v) => s + v * v, 0);
  const step = 1 / (0.25 * frob + l2);
  for (let it = 0; it < iterations; it++) {
    const grad = new Array<number>(d + 1).fill(0);
    for (let i = 0; i < x.length; i++) {
      const row = x[i]!;
      let z = theta[0]!;
      for (let j = 0; j < d; j++) z += theta[j + 1]! * row[j]!;
      const r = 1 / (1 + Math.exp(-z)) - y[i]!;
      grad[0]! += r;
      for (let j = 0; j < d; j++) grad[j + 1]! += r * row[j]!;
    }
    for (let j = 1; j <= d; j++) grad[j]! += l2 * theta[j]!;
    for (let j = 0; j <= d; j++) theta[j]! -= step * grad[j]!;
  }
  return theta;
}

describe("choleskySolve", () => {
  it("solves a symmetric positive-definite system", () => {
    // A = [[4,2,0],[2,5,1],[0,1,3]], v = [1,2,3] -> r = A v = [8, 15, 11]
    const v = choleskySolve(
      [
        [4, 2, 0],
        [2, 5, 1],
        [0, 1, 3],
      ],
      [8, 15, 11],
    );
    for (const [i, value] of v.entries()) expect(value).toBeCloseTo([1, 2, 3][i]!, 12);
    expect(() =>
      choleskySolve(
        [
          [1, 2],
          [2, 1],
        ],
        [1, 1],
      ),
    ).toThrow(/not positive definite/);
  });
});

describe("fitLogistic", () => {
  // One binary feature. x = 0: 1 positive of 4; x = 1: 3 positives of 4.
  const x = [[0], [0], [0], [0], [1], [1], [1], [1]];
  const y = [1, 0, 0, 0, 1, 1, 1, 0];

  it("without penalty reproduces the saturated model's log-odds (hand-checkable)", () => {
    // Unpenalized, a binary feature fits each group's rate exactly:
    // b = logit(1/4) = ln(1/3), b + w = logit(3/4) = ln 3, so w = 2 ln 3.
    const fit = fitLogistic(x, y, { l2: 0 });
    expect(fit.converged).toBe(true);
    expect(fit.intercept).toBeCloseTo(Math.log(1 / 3), 8);
    expect(fit.coefficients[0]!).toBeCloseTo(2 * Math.log(3), 8);
  });

  it("does not penalize the intercept", () => {
    // A huge penalty drives w to 0; the intercept still fits the overall rate 3/8: logit = ln(3/5).
    const y2 = [1, 0, 0, 0, 1, 1, 0, 0];
    const fit = fitLogistic(x, y2, { l2: 1e9 });
    expect(Math.abs(fit.coefficients[0]!)).toBeLessThan(1e-6);
    expect(fit.intercept).toBeCloseTo(Math.log(3 / 5), 6);
  });

  it("agrees with gradient descent on the same L2 objective to 1e-4", () => {
    const random = mulberry32(42);
    const rows: number[][] = [];
    const labels: number[] = [];
    for (let i = 0; i < 60; i++) {
      const row = [random(), random(), random() < 0.3 ? 1 : 0, random()];
      const z = -1 + 2 * row[0]! - 1.5 * row[1]! + row[2]! + (random() - 0.5) * 2;
      rows.push(row);
      labels.push(z > 0 ? 1 : 0);
    }
    const l2 = 1;
    const fit = fitLogistic(rows, labels, { l2 });
    const gd = gradientDescent(rows, labels, l2, 40000);
    expect(fit.converged).toBe(true);
    expect(fit.intercept).toBeCloseTo(gd[0]!, 4);
    for (const [j, c] of fit.coefficients.entries()) expect(Math.abs(c - gd[j + 1]!)).toBeLessThan(1e-4);
    // Newton's optimum is no worse than gradient descent's
    expect(fit.objective).toBeLessThanOrEqual(
      logisticObjective(rows, labels, gd[0]!, gd.slice(1), l2) + 1e-12,
    );
  });

  it("is deterministic and rejects bad input", () => {
    expect(fitLogistic(x, y)).toEqual(fitLogistic(x, y));
    expect(() => fitLogistic(x, y.slice(1))).toThrow(/8 rows but 7 labels/);
    expect(() => fitLogistic([[0]], [2])).toThrow(/expected 0 or 1/);
    expect(() => fitLogistic(x, y, { l2: -1 })).toThrow(/l2 must be/);
  });
});

describe("fitWeights", () => {
  it("maps coefficients to the named features", () => {
    const pairs = [0, 1, 2, 3, 4, 5].map((i) => ({
      features: { ...ZERO_FEATURES, exactKey: i % 2, context: i / 5 },
      label: (i % 2) as 0 | 1,
    }));
    const { weights } = fitWeights(pairs);
    expect(Object.keys(weights.features)).toEqual([...FEATURE_NAMES]);
    expect(weights.features.exactKey).toBeGreaterThan(1);
    // A feature that is 0 on every pair says nothing: it keeps its default weight (or the one given).
    expect(weights.features.jaroWinkler).toBe(DEFAULT_WEIGHTS.features.jaroWinkler);
    expect(weights.features.nearSpelling).toBe(DEFAULT_WEIGHTS.features.nearSpelling);
    const unseen = { ...DEFAULT_WEIGHTS.features, jaroWinkler: 1.25 };
    expect(fitWeights(pairs, {}, unseen).weights.features.jaroWinkler).toBe(1.25);
  });
});
