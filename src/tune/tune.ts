/**
 * Tuning: fit the combination weights by logistic regression on (mention, candidate) pairs and
 * choose the operating point (threshold, minimum margin) by a sweep, with deterministic k-fold
 * cross-validation so the reported figures are held-out, not only in-sample.
 *
 * - Folds are by mention (a mention's candidates never straddle folds), from a seeded shuffle.
 * - For each fold: fit on the other folds, choose the point on the other folds, decide the held-out
 *   fold; held-out figures pool the held-out decisions of all folds.
 * - In-sample: fit and choose on all data, measured on all data. This is the final config.
 * - Defaults: DEFAULT_WEIGHTS, DEFAULT_THRESHOLD, DEFAULT_MIN_MARGIN measured on all data.
 */
import { DEFAULT_MIN_MARGIN, DEFAULT_THRESHOLD } from "../decide/decide.js";
import { type EvalReport, evaluate, type Figures } from "../evaluate/metrics.js";
import { DEFAULT_WEIGHTS } from "../score/combine.js";
import type { LinkConfig, LinkRow } from "../types.js";
import { UsageError } from "../util/errors.js";
import { assignFolds } from "./folds.js";
import { DEFAULT_L2, type LogisticFit, fitWeights, type TrainingPair } from "./logistic.js";
import { linkRowsFor as rowsFor } from "./rows.js";
import { type OperatingPoint, type SweepResult, sweep } from "./sweep.js";
import type { Objective, ScoredMention } from "./types.js";

/** Default number of folds: 5 keeps 80% of the data for each fit, the usual choice (common practice). */
export const DEFAULT_FOLDS = 5;
/** Default seed of the fold shuffle. */
export const DEFAULT_SEED = 1;
/** Fewest folds that still hold data out. */
const MIN_FOLDS = 2;

export interface TuneOptions {
  /** Number of cross-validation folds, 2..number of mentions. Default DEFAULT_FOLDS (5). */
  folds?: number;
  /** Seed of the fold shuffle; the same seed gives the same folds and results. Default DEFAULT_SEED (1). */
  seed?: number;
  /** Operating-point objective. Default `f1`. */
  objective?: Objective;
  /** Minimum link precision, required for `recall-at-precision`. */
  minPrecision?: number;
  /** L2 penalty of the logistic fit (intercept not penalized). Default DEFAULT_L2 (1.0). */
  l2?: number;
  /** k of candidate recall at k in the reports. Default 3. */
  k?: number;
}

export interface FoldResult {
  fold: number;
  /** Held-out mentions. */
  size: number;
  config: LinkConfig;
  converged: boolean;
  /** Figures of this fold's held-out mentions. */
  heldOut: Figures;
}

export interface TuneResult {
  /** The final configuration: weights fitted on all data, operating point chosen on all data. */
  config: LinkConfig;
  objective: Objective;
  minPrecision?: number;
  folds: number;
  seed: number;
  l2: number;
  mentions: number;
  /** Training pairs of the final fit, and how many were positives. */
  pairs: number;
  positives: number;
  fit: Pick<LogisticFit, "iterations" | "converged" | "objective">;
  /** The chosen point on all data. */
  chosen: OperatingPoint;
  /** The final sweep's curve: one point per threshold at the chosen margin (in-sample). */
  curve: OperatingPoint[];
  figures: { heldOut: Figures; inSample: Figures; defaults: Figures };
  /** Full reports (per type, candidate recall, errors) behind the figures. */
  reports: { heldOut: EvalReport; inSample: EvalReport; defaults: EvalReport };
  perFold: FoldResult[];
  /** Things the user should know (fallbacks taken, non-converged fits). */
  notes: string[];
}

function trainingPairs(data: readonly ScoredMention[]): TrainingPair[] {
  const pairs: TrainingPair[] = [];
  for (const m of data)
    for (const c of m.candidates)
      pairs.push({ features: c.features, label: c.entity === m.mention.gold ? 1 : 0 });
  return pairs;
}

/** The chosen point, or the highest-precision fallback with a note. */
function pointOf(result: SweepResult, where: string, notes: string[]): OperatingPoint {
  if (result.chosen) return result.chosen;
  notes.push(`${where}: ${result.message}; using the highest-precision point instead`);
  return result.highestPrecision;
}

function fitAndChoose(
  train: readonly ScoredMention[],
  opts: { objective: Objective; minPrecision: number | undefined; l2: number },
  where: string,
  notes: string[],
): {
  config: LinkConfig;
  fit: LogisticFit;
  sweep: SweepResult;
  point: OperatingPoint;
  pairs: TrainingPair[];
} {
  const pairs = trainingPairs(train);
  const { weights, fit } = fitWeights(pairs, { l2: opts.l2 });
  if (!fit.converged)
    notes.push(`${where}: the logistic fit did not converge in ${fit.iterations} iterations`);
  const swept = sweep(train, weights, { objective: opts.objective, minPrecision: opts.minPrecision });
  const point = pointOf(swept, where, notes);
  return {
    config: { weights, threshold: point.threshold, minMargin: point.minMargin },
    fit,
    sweep: swept,
    point,
    pairs,
  };
}

function pairsFor(data: readonly ScoredMention[], rows: readonly LinkRow[]) {
  return data.map((m, i) => ({ gold: m.mention, predicted: rows[i]! }));
}

export function tune(data: readonly ScoredMention[], opts: TuneOptions = {}): TuneResult {
  const folds = opts.folds ?? DEFAULT_FOLDS;
  const seed = opts.seed ?? DEFAULT_SEED;
  const objective = opts.objective ?? "f1";
  const l2 = opts.l2 ?? DEFAULT_L2;
  const minPrecision = opts.minPrecision;
  const evalOpts = opts.k === undefined ? {} : { k: opts.k };
  if (!Number.isInteger(folds) || folds < MIN_FOLDS)
    throw new UsageError(`tune: folds must be an integer >= ${MIN_FOLDS}, got ${folds}`);
  if (folds > data.length)
    throw new UsageError(`tune: ${folds} folds need at least ${folds} labeled mentions, got ${data.length}`);
  if (!Number.isInteger(seed)) throw new UsageError(`tune: seed must be an integer, got ${seed}`);
  if (
    objective === "recall-at-precision" &&
    (minPrecision === undefined || !(minPrecision >= 0 && minPrecision <= 1))
  )
    throw new UsageError(
      `tune: objective recall-at-precision needs minPrecision in [0, 1], got ${minPrecision}`,
    );

  const allPairs = trainingPairs(data);
  const positives = allPairs.filter((p) => p.label === 1).length;
  if (positives === 0)
    throw new UsageError(
      "tune: no candidate of any labeled mention is its gold entity; nothing to learn a link from",
    );
  if (positives === allPairs.length)
    throw new UsageError("tune: every candidate is a gold entity; nothing to learn a non-link from");

  const notes: string[] = [];
  const fitOpts = { objective, minPrecision, l2 };
  const foldOf = assignFolds(data.length, folds, seed);
  const heldOutRows = new Array<LinkRow>(data.length);
  const perFold: FoldResult[] = [];
  for (let f = 0; f < folds; f++) {
    const trainData = data.filter((_, i) => foldOf[i] !== f);
    const testIndex = data.map((_, i) => i).filter((i) => foldOf[i] === f);
    const testData = testIndex.map((i) => data[i]!);
    const { config, fit } = fitAndChoose(trainData, fitOpts, `fold ${f + 1}`, notes);
    const rows = rowsFor(testData, config);
    testIndex.forEach((i, j) => {
      heldOutRows[i] = rows[j]!;
    });
    perFold.push({
      fold: f + 1,
      size: testData.length,
      config,
      converged: fit.converged,
      heldOut: evaluate(pairsFor(testData, rows), evalOpts).overall,
    });
  }

  const final = fitAndChoose(data, fitOpts, "all data", notes);
  const defaultsConfig: LinkConfig = {
    weights: DEFAULT_WEIGHTS,
    threshold: DEFAULT_THRESHOLD,
    minMargin: DEFAULT_MIN_MARGIN,
  };
  const reports = {
    heldOut: evaluate(pairsFor(data, heldOutRows), evalOpts),
    inSample: evaluate(pairsFor(data, rowsFor(data, final.config)), evalOpts),
    defaults: evaluate(pairsFor(data, rowsFor(data, defaultsConfig)), evalOpts),
  };
  const result: TuneResult = {
    config: final.config,
    objective,
    folds,
    seed,
    l2,
    mentions: data.length,
    pairs: final.pairs.length,
    positives,
    fit: { iterations: final.fit.iterations, converged: final.fit.converged, objective: final.fit.objective },
    chosen: final.point,
    curve: final.sweep.curve,
    figures: {
      heldOut: reports.heldOut.overall,
      inSample: reports.inSample.overall,
      defaults: reports.defaults.overall,
    },
    reports,
    perFold,
    notes,
  };
  if (minPrecision !== undefined) result.minPrecision = minPrecision;
  return result;
}
