import { describe, expect, it } from "vitest";
import { decide } from "../src/decide/decide.js";
import { evaluate } from "../src/evaluate/metrics.js";
import { DEFAULT_WEIGHTS } from "../src/score/combine.js";
import { linkRowsFor } from "../src/tune/rows.js";
import {
  MARGIN_GRID,
  measureGrid,
  measurePoint,
  scoreAll,
  sweep,
  THRESHOLD_GRID,
} from "../src/tune/sweep.js";
import type { ScoredMention } from "../src/tune/types.js";
import type { Weights } from "../src/types.js";
import { ZERO_FEATURES } from "./eval-helpers.js";
import { syntheticSet } from "./tune-fixtures.js";

/** Weights under which a candidate's score is sigmoid(logit) of its `prior` feature alone, set as a logit. */
const PRIOR_ONLY: Weights = {
  bias: 0,
  features: {
    ...Object.fromEntries(Object.keys(ZERO_FEATURES).map((k) => [k, 0])),
    prior: 1,
  } as Weights["features"],
};

/** A candidate scoring exactly `score` under PRIOR_ONLY. */
function cand(entity: string, score: number) {
  return { entity, features: { ...ZERO_FEATURES, prior: Math.log(score / (1 - score)) } };
}

// Hand-made: scores are known, so the P/R at a threshold can be counted by hand.
const data: ScoredMention[] = [
  { mention: { id: "a", text: "Port Ellery", gold: "E1" }, candidates: [cand("E1", 0.9), cand("E2", 0.3)] },
  { mention: { id: "b", text: "Vell Ford", gold: "E3" }, candidates: [cand("E3", 0.6), cand("E4", 0.55)] },
  { mention: { id: "c", text: "Calder", gold: "E5" }, candidates: [cand("E6", 0.7), cand("E5", 0.2)] },
  { mention: { id: "d", text: "Tench", gold: null }, candidates: [cand("E7", 0.4)] },
];

describe("sweep", () => {
  it("sweeps the documented grid", () => {
    expect(THRESHOLD_GRID).toHaveLength(101);
    expect(THRESHOLD_GRID[37]).toBe(0.37);
    expect(MARGIN_GRID).toEqual([0, 0.1, 0.25, 0.5, 0.75, 1, 1.5, 2, 3]);
    const r = sweep(data, PRIOR_ONLY);
    expect(r.grid).toHaveLength(101 * MARGIN_GRID.length);
    expect(r.curve).toHaveLength(101);
    expect(new Set(r.curve.map((p) => p.minMargin)).size).toBe(1);
  });

  it("measures points by counting decisions (hand-checked)", () => {
    const sets = scoreAll(data, PRIOR_ONLY);
    // threshold 0.5, margin 0: links a->E1 (right), b->E3 (right), c->E6 (wrong); d NIL (right)
    const p = measurePoint(sets, 0.5, 0);
    expect([p.predictedLinks, p.correctLinks, p.goldLinks]).toEqual([3, 2, 3]);
    expect(p.linkPrecision).toBeCloseTo(2 / 3, 12);
    expect(p.accuracy).toBeCloseTo(3 / 4, 12);
    // margins are in log-odds: margin 0.25 makes b ambiguous (logit 0.6 - logit 0.55 = 0.205)
    const q = measurePoint(sets, 0.5, 0.25);
    expect([q.predictedLinks, q.correctLinks]).toEqual([2, 1]);
    // threshold 0.8: only a
    const s = measurePoint(sets, 0.8, 0);
    expect([s.linkPrecision, s.linkRecall]).toEqual([1, 1 / 3]);
  });

  it("chooses by F1 with ties to higher precision, then the middle of the threshold plateau", () => {
    const r = sweep(data, PRIOR_ONLY);
    // best F1 = 2/3 (P 2/3, R 2/3) at thresholds 0.41..0.60 with a small margin; the smallest margin wins.
    expect(r.chosen!.linkF1).toBeCloseTo(2 / 3, 12);
    // the middle of the tied plateau 0.41..0.60 (see centreOfPlateau in src/tune/sweep.ts)
    expect(r.chosen!.threshold).toBe(0.5);
    expect(r.chosen!.minMargin).toBe(0);
  });

  it("chooses by recall at a minimum precision, or says none reaches it", () => {
    const r = sweep(data, PRIOR_ONLY, { objective: "recall-at-precision", minPrecision: 0.9 });
    // precision >= 0.9 needs c's false link gone. At margin 0 that takes a threshold in (0.7, 0.9];
    // at margin 3 (log-odds: a's gap is 3.04, c's 2.23, b's 0.2) any threshold in (0.4, 0.9] links
    // only a. Ties go to the lower threshold, so margin 3 wins, and the threshold moves to the
    // middle of its plateau 0.41..0.90.
    expect(r.chosen!.linkPrecision).toBe(1);
    expect(r.chosen!.linkRecall).toBeCloseTo(1 / 3, 12);
    expect(r.chosen!.minMargin).toBe(3);
    expect(r.chosen!.threshold).toBe(0.65);
    const none = sweep([data[2]!], PRIOR_ONLY, { objective: "recall-at-precision", minPrecision: 0.5 });
    expect(none.chosen).toBeNull();
    expect(none.message).toMatch(/no operating point reaches link precision 0\.5/);
    expect(none.curve).toHaveLength(101);
    expect(() => sweep(data, PRIOR_ONLY, { objective: "recall-at-precision" })).toThrow(/needs minPrecision/);
  });

  it("measures the whole grid as measurePoint measures each point", () => {
    // measureGrid sorts mentions by best score instead of deciding each at every point: the
    // figures must be the same to the last bit, ties on a grid threshold included.
    for (const seed of [1, 2, 3, 4]) {
      const set = syntheticSet(120, { seed, noise: 0.3 });
      const sets = scoreAll(set, DEFAULT_WEIGHTS);
      // Scores exactly on grid thresholds, and a mention without candidates.
      sets[0]!.scores = [0.5, 0.25];
      sets[1]!.scores = [0.75];
      sets[2]!.scores = [];
      sets[2]!.entities = [];
      const grid = measureGrid(sets, THRESHOLD_GRID, MARGIN_GRID);
      const expected = MARGIN_GRID.flatMap((m) => THRESHOLD_GRID.map((t) => measurePoint(sets, t, m)));
      expect(grid).toEqual(expected);
    }
  });

  it("agrees with evaluate over rebuilt link rows", () => {
    const set = syntheticSet(60, { seed: 3, noise: 0.25 });
    for (const [t, m] of [
      [0.5, 0.05],
      [0.3, 0],
      [0.8, 0.1],
    ] as const) {
      const point = measurePoint(scoreAll(set, DEFAULT_WEIGHTS), t, m);
      const rows = linkRowsFor(set, { weights: DEFAULT_WEIGHTS, threshold: t, minMargin: m });
      const o = evaluate(set.map((s, i) => ({ gold: s.mention, predicted: rows[i]! }))).overall;
      expect([point.linkPrecision, point.linkRecall, point.accuracy]).toEqual([
        o.linkPrecision,
        o.linkRecall,
        o.accuracy,
      ]);
      // and every row's entity is what decide picks
      rows.forEach((r) => {
        const d = decide(
          r.candidates.map((c) => c.score),
          t,
          m,
        );
        expect(r.entity).toBe(d.chosen < 0 ? null : r.candidates[d.chosen]!.entity);
      });
    }
  });
});
