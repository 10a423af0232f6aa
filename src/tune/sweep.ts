/**
 * Operating-point sweep: score every candidate with given weights, then decide every mention at
 * each (threshold, minimum margin) of a fixed grid and measure link precision, recall and F1.
 *
 * The threshold grid is 0.00, 0.01, ..., 1.00 (101 points) and nothing else: distinct scores are
 * not added, so every curve has exactly one point per grid threshold and curves of different
 * weights line up point for point.
 */
import { decide } from "../decide/decide.js";
import { combine } from "../score/combine.js";
import type { Weights } from "../types.js";
import { f1, ratio } from "../evaluate/metrics.js";
import type { Objective, ScoredMention } from "./types.js";

/** Threshold steps of the grid: a 0.01 step resolves score differences that matter in practice. */
const THRESHOLD_STEPS = 100;

/** The swept thresholds, 0.00 to 1.00 by 0.01 (computed as i / 100 so they are exact decimals). */
export const THRESHOLD_GRID: readonly number[] = Array.from(
  { length: THRESHOLD_STEPS + 1 },
  (_, i) => i / THRESHOLD_STEPS,
);

/**
 * The swept minimum margins, in log-odds (see src/decide/decide.ts): 0 (no ambiguity check) up
 * to 3 (the winner 20 times as likely in odds), denser below 1 where the gaps between look-alike
 * names fall.
 */
export const MARGIN_GRID: readonly number[] = [0, 0.1, 0.25, 0.5, 0.75, 1, 1.5, 2, 3];

/** Two figures closer than this are equal when ranking operating points (float noise). */
const TIE_EPSILON = 1e-12;

export interface OperatingPoint {
  threshold: number;
  minMargin: number;
  linkPrecision: number;
  linkRecall: number;
  linkF1: number;
  /** Mentions decided right (correct link, or NIL for a gold NIL) / all mentions. */
  accuracy: number;
  predictedLinks: number;
  correctLinks: number;
  goldLinks: number;
  mentions: number;
}

export interface SweepOptions {
  /** How to choose the point. Default `f1`. */
  objective?: Objective;
  /** Minimum link precision for `recall-at-precision` (required there, in [0, 1]). */
  minPrecision?: number;
  /** Thresholds to sweep. Default THRESHOLD_GRID. */
  thresholds?: readonly number[];
  /** Minimum margins to sweep. Default MARGIN_GRID. */
  margins?: readonly number[];
}

export interface SweepResult {
  /** The chosen point; null when no point meets `minPrecision`. */
  chosen: OperatingPoint | null;
  /** Why `chosen` is null (names the best precision reached). */
  message?: string;
  /** The point of highest precision (ties: higher recall, lower threshold): a fallback when chosen is null. */
  highestPrecision: OperatingPoint;
  /** One point per threshold, at the chosen margin (at the fallback's margin when chosen is null). */
  curve: OperatingPoint[];
  /** Every point of the grid, margin-major. */
  grid: OperatingPoint[];
}

/** A mention's candidate scores under the weights, with the gold entity. */
export interface ScoredSet {
  gold: string | null;
  entities: string[];
  scores: number[];
}

export function scoreAll(data: readonly ScoredMention[], weights: Weights): ScoredSet[] {
  return data.map((m) => ({
    gold: m.mention.gold,
    entities: m.candidates.map((c) => c.entity),
    scores: m.candidates.map((c) => combine(c.features, weights)),
  }));
}

/** Measure one (threshold, margin) point over scored mentions, deciding each with `decide`. */
export function measurePoint(
  sets: readonly ScoredSet[],
  threshold: number,
  minMargin: number,
): OperatingPoint {
  let predictedLinks = 0;
  let correctLinks = 0;
  let goldLinks = 0;
  let correctNil = 0;
  for (const s of sets) {
    if (s.gold !== null) goldLinks++;
    const d = decide(s.scores, threshold, minMargin);
    if (d.chosen < 0) {
      if (s.gold === null) correctNil++;
      continue;
    }
    predictedLinks++;
    if (s.entities[d.chosen] === s.gold) correctLinks++;
  }
  return pointOf(threshold, minMargin, {
    predictedLinks,
    correctLinks,
    goldLinks,
    correctNil,
    mentions: sets.length,
  });
}

/** A point's figures from its counts (measurePoint and measureGrid share it, so both give the same numbers). */
function pointOf(
  threshold: number,
  minMargin: number,
  counts: {
    predictedLinks: number;
    correctLinks: number;
    goldLinks: number;
    correctNil: number;
    mentions: number;
  },
): OperatingPoint {
  const { predictedLinks, correctLinks, goldLinks, correctNil, mentions } = counts;
  const linkPrecision = ratio(correctLinks, predictedLinks);
  const linkRecall = ratio(correctLinks, goldLinks);
  return {
    threshold,
    minMargin,
    linkPrecision,
    linkRecall,
    linkF1: f1(linkPrecision, linkRecall),
    accuracy: ratio(correctLinks + correctNil, mentions),
    predictedLinks,
    correctLinks,
    goldLinks,
    mentions,
  };
}

/**
 * Every point of a grid, margin-major: the same as measurePoint at each, computed from each
 * mention's one decision input (its best score and margin: a mention links at (t, m) exactly when
 * best score >= t and margin >= m, see decide) by sorting, instead of deciding every mention at
 * every point. A sweep of 909 points over 50,000 mentions, in every fold of every procedure, was
 * about two fifths of a tune run.
 */
export function measureGrid(
  sets: readonly ScoredSet[],
  thresholds: readonly number[],
  margins: readonly number[],
): OperatingPoint[] {
  const n = sets.length;
  const bestScore = new Float64Array(n);
  const margin = new Float64Array(n);
  const correct = new Uint8Array(n);
  const goldNil = new Uint8Array(n);
  const hasBest = new Uint8Array(n);
  let goldLinks = 0;
  let goldNils = 0;
  sets.forEach((s, i) => {
    // Any threshold and margin: decide's best candidate, score and margin do not depend on them.
    const d = decide(s.scores, 0, 0);
    if (s.gold === null) {
      goldNil[i] = 1;
      goldNils++;
    } else goldLinks++;
    if (d.best < 0) return;
    hasBest[i] = 1;
    bestScore[i] = d.bestScore;
    margin[i] = d.margin;
    correct[i] = s.entities[d.best] === s.gold ? 1 : 0;
  });
  const out: OperatingPoint[] = [];
  for (const m of margins) {
    // The mentions that pass the margin, by best score ascending, with suffix counts: those at
    // index >= k are the ones whose score is at least the k-th.
    const passing: number[] = [];
    // A score that is not a number never links (see decide), and would not sort.
    for (let i = 0; i < n; i++)
      if (hasBest[i] === 1 && margin[i]! >= m && !Number.isNaN(bestScore[i]!)) passing.push(i);
    passing.sort((a, b) => bestScore[a]! - bestScore[b]!);
    const scores = passing.map((i) => bestScore[i]!);
    const correctFrom = new Int32Array(passing.length + 1);
    const nilLinkedFrom = new Int32Array(passing.length + 1);
    for (let k = passing.length - 1; k >= 0; k--) {
      correctFrom[k] = correctFrom[k + 1]! + correct[passing[k]!]!;
      nilLinkedFrom[k] = nilLinkedFrom[k + 1]! + goldNil[passing[k]!]!;
    }
    for (const t of thresholds) {
      // First index whose score is >= t.
      let lo = 0;
      let hi = scores.length;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (scores[mid]! >= t) hi = mid;
        else lo = mid + 1;
      }
      const predictedLinks = scores.length - lo;
      out.push(
        pointOf(t, m, {
          predictedLinks,
          correctLinks: correctFrom[lo]!,
          goldLinks,
          correctNil: goldNils - nilLinkedFrom[lo]!,
          mentions: n,
        }),
      );
    }
  }
  return out;
}

/** Compare two numbers with TIE_EPSILON: positive when a is larger. */
function cmp(a: number, b: number): number {
  return Math.abs(a - b) <= TIE_EPSILON ? 0 : a - b;
}

/** Ties after the objective: higher precision, then lower threshold, then smaller margin (the threshold is then moved to the middle of its plateau by centreOfPlateau). Negative when a is better. */
function tieBreak(a: OperatingPoint, b: OperatingPoint): number {
  return -cmp(a.linkPrecision, b.linkPrecision) || a.threshold - b.threshold || a.minMargin - b.minMargin;
}

/**
 * Among the thresholds at the chosen margin that tie with the chosen point on every figure, take
 * the middle one: the lowest tied threshold sits on the edge of the plateau, where a small shift
 * of scores on new data changes decisions; the middle is as far from both edges as the data allow.
 */
function centreOfPlateau(grid: readonly OperatingPoint[], chosen: OperatingPoint): OperatingPoint {
  const tied = grid
    .filter(
      (p) =>
        p.minMargin === chosen.minMargin &&
        cmp(p.linkF1, chosen.linkF1) === 0 &&
        cmp(p.linkPrecision, chosen.linkPrecision) === 0 &&
        cmp(p.linkRecall, chosen.linkRecall) === 0,
    )
    .sort((a, b) => a.threshold - b.threshold);
  // Only a contiguous run of thresholds around the chosen one is a plateau.
  const at = tied.findIndex((p) => p.threshold === chosen.threshold);
  if (at < 0) return chosen;
  let lo = at;
  let hi = at;
  const step = (i: number) => Math.abs(tied[i + 1]!.threshold - tied[i]!.threshold);
  const gap = tied.length > 1 ? Math.min(...tied.slice(1).map((_, i) => step(i))) : 0;
  while (lo > 0 && Math.abs(step(lo - 1) - gap) < 1e-9) lo--;
  while (hi < tied.length - 1 && Math.abs(step(hi) - gap) < 1e-9) hi++;
  return tied[Math.floor((lo + hi) / 2)]!;
}

function best(
  points: readonly OperatingPoint[],
  better: (a: OperatingPoint, b: OperatingPoint) => number,
): OperatingPoint | null {
  let top: OperatingPoint | null = null;
  for (const p of points) if (top === null || better(p, top) < 0) top = p;
  return top;
}

export function sweep(
  data: readonly ScoredMention[],
  weights: Weights,
  opts: SweepOptions = {},
): SweepResult {
  const objective = opts.objective ?? "f1";
  const thresholds = opts.thresholds ?? THRESHOLD_GRID;
  const margins = opts.margins ?? MARGIN_GRID;
  if (thresholds.length === 0 || margins.length === 0)
    throw new RangeError("sweep: empty threshold or margin grid");
  const minPrecision = opts.minPrecision;
  if (
    objective === "recall-at-precision" &&
    (minPrecision === undefined || !(minPrecision >= 0 && minPrecision <= 1))
  )
    throw new RangeError(`sweep: recall-at-precision needs minPrecision in [0, 1], got ${minPrecision}`);

  const sets = scoreAll(data, weights);
  const grid = measureGrid(sets, thresholds, margins);

  const highestPrecision = best(
    grid,
    (a, b) =>
      -cmp(a.linkPrecision, b.linkPrecision) ||
      -cmp(a.linkRecall, b.linkRecall) ||
      a.threshold - b.threshold ||
      a.minMargin - b.minMargin,
  )!;
  let chosen: OperatingPoint | null;
  let message: string | undefined;
  if (objective === "f1") {
    chosen = best(grid, (a, b) => -cmp(a.linkF1, b.linkF1) || tieBreak(a, b));
  } else {
    const eligible = grid.filter((p) => p.linkPrecision >= minPrecision! - TIE_EPSILON);
    chosen = best(eligible, (a, b) => -cmp(a.linkRecall, b.linkRecall) || tieBreak(a, b));
    if (chosen === null)
      message =
        `no operating point reaches link precision ${minPrecision}; the highest is ` +
        `${highestPrecision.linkPrecision.toFixed(3)} (threshold ${highestPrecision.threshold.toFixed(2)}, ` +
        `margin ${highestPrecision.minMargin})`;
  }
  if (chosen !== null) chosen = centreOfPlateau(grid, chosen);
  const curveMargin = (chosen ?? highestPrecision).minMargin;
  const curve = grid.filter((p) => p.minMargin === curveMargin);
  return message === undefined
    ? { chosen, highestPrecision, curve, grid }
    : { chosen, message, highestPrecision, curve, grid };
}
