import { describe, expect, it } from "vitest";
import { assignFolds, mulberry32 } from "../src/tune/folds.js";
import { DEFAULT_MIN_MARGIN, DEFAULT_THRESHOLD } from "../src/decide/decide.js";
import { DEFAULT_WEIGHTS } from "../src/score/combine.js";
import { TUNE_PROCEDURES, tune } from "../src/tune/tune.js";
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

  it("keeps the fitted weights where they cross-validate best, and reports every procedure", () => {
    const r = tune(data);
    expect(r.procedure).toBe("fitted");
    expect(Object.keys(r.procedures).sort()).toEqual(["default-weights", "defaults", "fitted"]);
    for (const p of TUNE_PROCEDURES)
      expect(r.procedures.fitted.linkF1).toBeGreaterThanOrEqual(r.procedures[p].linkF1);
    expect(r.figures.heldOut).toEqual(r.procedures.fitted);
    // The defaults, decided without learning anything, score the same held out as in-sample.
    expect(r.procedures.defaults).toEqual(r.figures.defaults);
  });

  it("keeps the defaults where nothing learned does better held out", () => {
    // Gold candidates spelled as the mention, distractors far off: the defaults decide every
    // mention right, and a fit can only tie them.
    const feature = (x: number, exact: number) => ({
      jaroWinkler: x,
      levenshtein: x,
      tokenSet: x,
      abbreviation: 0,
      exactKey: exact,
      context: x / 2,
      typeMatch: 1,
      prior: 0.5,
      nearSpelling: 0,
      contextConflict: 0,
      prominence: 0,
    });
    const clean = Array.from({ length: 90 }, (_, i) => {
      const gold = i % 4 === 0 ? null : `t-${i}`;
      const candidates = [{ entity: `x-${i}`, features: feature(0.3, 0) }];
      if (gold !== null) candidates.push({ entity: gold, features: feature(1, 1) });
      return { mention: { id: `m${i}`, text: "Port Ellery", type: "LOC", gold }, candidates };
    });
    const r = tune(clean, { folds: 3 });
    expect(r.procedures.defaults.linkF1).toBe(1);
    expect(r.procedure).toBe("defaults");
    expect(r.config).toEqual({
      weights: DEFAULT_WEIGHTS,
      threshold: DEFAULT_THRESHOLD,
      minMargin: DEFAULT_MIN_MARGIN,
    });
    expect(r.figures.heldOut.linkF1).toBeGreaterThanOrEqual(r.figures.defaults.linkF1);
    expect(r.notes.some((n) => n.includes("kept the defaults as they are"))).toBe(true);
    expect(r.chosen.threshold).toBeCloseTo(DEFAULT_THRESHOLD, 10);
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
