import { describe, expect, it } from "vitest";
import { assignFolds, mulberry32 } from "../src/tune/folds.js";
import { tune } from "../src/tune/tune.js";
import { syntheticSet } from "./tune-fixtures.js";

describe("folds", () => {
  it("mulberry32 is a fixed sequence per seed", () => {
    const a = mulberry32(1);
    const b = mulberry32(1);
    const xs = [a(), a(), a()];
    expect([b(), b(), b()]).toEqual(xs);
    for (const x of xs) expect(x >= 0 && x < 1).toBe(true);
    expect(mulberry32(2)()).not.toBe(xs[0]);
  });

  it("deals balanced folds", () => {
    const folds = assignFolds(23, 5, 1);
    const sizes = [0, 1, 2, 3, 4].map((f) => folds.filter((x) => x === f).length);
    expect(sizes.sort()).toEqual([4, 4, 5, 5, 5]);
    expect(assignFolds(23, 5, 1)).toEqual(folds);
    expect(assignFolds(23, 5, 2)).not.toEqual(folds);
  });
});

describe("tune", () => {
  // The defaults reward context and exact keys that this synthetic set does not always carry,
  // so a fitted model has room to do better.
  const data = syntheticSet(150, { seed: 11, noise: 0.12, missShare: 0.05 });

  it("is deterministic for a seed", () => {
    const a = tune(data, { folds: 3, seed: 5 });
    const b = tune(data, { folds: 3, seed: 5 });
    expect(b.config).toEqual(a.config);
    expect(b.figures).toEqual(a.figures);
    expect(b.perFold.map((f) => f.config)).toEqual(a.perFold.map((f) => f.config));
  });

  it("on a separable set, held-out F1 is at least the defaults'", () => {
    const r = tune(data);
    expect(r.folds).toBe(5);
    expect(r.perFold).toHaveLength(5);
    expect(r.perFold.reduce((s, f) => s + f.size, 0)).toBe(150);
    expect(r.figures.heldOut.linkF1).toBeGreaterThanOrEqual(r.figures.defaults.linkF1);
    expect(r.figures.heldOut.linkF1).toBeGreaterThan(0.9);
    expect(r.figures.inSample.linkF1).toBeGreaterThanOrEqual(r.figures.heldOut.linkF1 - 0.05);
    expect(r.fit.converged).toBe(true);
    expect(r.curve).toHaveLength(101);
    // the final config's in-sample figures are the chosen sweep point's
    expect(r.figures.inSample.linkF1).toBeCloseTo(r.chosen.linkF1, 12);
    expect(r.config.threshold).toBe(r.chosen.threshold);
    // blocking misses show up as candidate recall below 1, whatever the weights
    expect(r.reports.heldOut.candidateRecall.atAll).toBeLessThan(1);
    expect(r.pairs).toBeGreaterThan(r.positives);
  });

  it("supports recall at a minimum precision", () => {
    const r = tune(data, { folds: 3, objective: "recall-at-precision", minPrecision: 0.99 });
    expect(r.chosen.linkPrecision).toBeGreaterThanOrEqual(0.99);
    expect(r.minPrecision).toBe(0.99);
  });

  it("rejects bad options and data with nothing to learn", () => {
    expect(() => tune(data, { folds: 1 })).toThrow(/folds must be an integer >= 2/);
    expect(() => tune(data.slice(0, 3), { folds: 5 })).toThrow(/5 folds need at least 5 labeled mentions/);
    expect(() => tune(data, { objective: "recall-at-precision" })).toThrow(/needs minPrecision/);
    const nils = data.map((m) => ({ ...m, mention: { ...m.mention, gold: null } }));
    expect(() => tune(nils)).toThrow(/no candidate of any labeled mention is its gold entity/);
  });
});
