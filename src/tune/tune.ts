/**
 * Tuning: fit the combination weights by logistic regression on (mention, candidate) pairs and
 * choose the operating point (threshold, minimum margin) by a sweep, with deterministic k-fold
 * cross-validation so the reported figures are held-out, not only in-sample.
 *
 * - Folds are by mention (a mention's candidates never straddle folds), from a seeded shuffle.
 * - For each fold: fit on the other folds, choose the point on the other folds, decide the held-out
 *   fold; held-out figures pool the held-out decisions of all folds.
 * - Three procedures are cross-validated so (see TuneProcedure): weights fitted and point swept;
 *   the default weights and the point swept; the defaults as they are. The one whose pooled
 *   held-out decisions score best on the objective is kept (the simpler on a tie), so tuning
 *   never hands back a configuration that cross-validates worse than the defaults.
 * - In-sample: the kept procedure run on all data, measured on all data. This is the final config.
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

/**
 * How a configuration is made from training data:
 * - "fitted": weights fitted by logistic regression on the candidate pairs, operating point
 *   (threshold, minimum margin) swept;
 * - "default-weights": DEFAULT_WEIGHTS, operating point swept;
 * - "defaults": DEFAULT_WEIGHTS, DEFAULT_THRESHOLD and DEFAULT_MIN_MARGIN, nothing learned.
 * Where the defaults already suit the labeled set, a fit on four fifths of it can do worse on the
 * fifth held out than the defaults do; tune then keeps the defaults, or their weights.
 */
export type TuneProcedure = "fitted" | "default-weights" | "defaults";

/** What each procedure keeps, in a few words (for summaries and reports). */
export const PROCEDURE_WORDS: Readonly<Record<TuneProcedure, string>> = {
  fitted: "fitted weights, tuned threshold and margin",
  "default-weights": "default weights, tuned threshold and margin",
  defaults: "the defaults as they are",
};

/** Two procedures' objective values closer than this are a tie (float noise of equal counts). */
const PROCEDURE_TIE = 1e-12;

/** The procedures tune compares, simplest first: a tie goes to the simpler. */
export const TUNE_PROCEDURES: readonly TuneProcedure[] = ["defaults", "default-weights", "fitted"];

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
  /** The final configuration: the kept procedure run on all data. */
  config: LinkConfig;
  /** The procedure kept (see TuneProcedure). */
  procedure: TuneProcedure;
  /** Pooled held-out figures of each procedure compared. */
  procedures: Record<TuneProcedure, Figures>;
  objective: Objective;
  minPrecision?: number;
  folds: number;
  seed: number;
  l2: number;
  mentions: number;
  /** Training pairs of the final fit, and how many were positives. */
  pairs: number;
  positives: number;
  /** The logistic fit on all data (made whatever the procedure kept, for the report). */
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

const DEFAULTS_CONFIG: LinkConfig = {
  weights: DEFAULT_WEIGHTS,
  threshold: DEFAULT_THRESHOLD,
  minMargin: DEFAULT_MIN_MARGIN,
};

/** A procedure run on training data: its configuration, and the fit and sweep behind it if any. */
function runProcedure(
  procedure: TuneProcedure,
  train: readonly ScoredMention[],
  opts: { objective: Objective; minPrecision: number | undefined; l2: number },
  where: string,
  notes: string[],
): { config: LinkConfig; converged: boolean } {
  if (procedure === "fitted") {
    const { config, fit } = fitAndChoose(train, opts, where, notes);
    return { config, converged: fit.converged };
  }
  if (procedure === "defaults") return { config: DEFAULTS_CONFIG, converged: true };
  return { config: sweptDefaultWeights(train, opts, where, notes).config, converged: true };
}

/** The default weights with the operating point swept on `data` ("default-weights"). */
function sweptDefaultWeights(
  data: readonly ScoredMention[],
  opts: { objective: Objective; minPrecision: number | undefined },
  where: string,
  notes: string[],
): { config: LinkConfig; point: OperatingPoint; sweep: SweepResult } {
  const swept = sweep(data, DEFAULT_WEIGHTS, { objective: opts.objective, minPrecision: opts.minPrecision });
  const point = pointOf(swept, where, notes);
  return {
    config: { weights: DEFAULT_WEIGHTS, threshold: point.threshold, minMargin: point.minMargin },
    point,
    sweep: swept,
  };
}

/**
 * The default weights run on all data, with their operating point and the sweep's curve: swept
 * ("default-weights"), or the default threshold and margin on the curve at the default margin
 * ("defaults").
 */
function operatingPointOf(
  procedure: "default-weights" | "defaults",
  data: readonly ScoredMention[],
  opts: { objective: Objective; minPrecision: number | undefined },
  notes: string[],
): { config: LinkConfig; point: OperatingPoint; sweep: SweepResult } {
  if (procedure === "default-weights") return sweptDefaultWeights(data, opts, "all data", notes);
  const swept = sweep(data, DEFAULT_WEIGHTS, {
    objective: opts.objective,
    minPrecision: opts.minPrecision,
    margins: [DEFAULT_MIN_MARGIN],
  });
  let point = swept.curve[0]!;
  for (const p of swept.curve)
    if (Math.abs(p.threshold - DEFAULT_THRESHOLD) < Math.abs(point.threshold - DEFAULT_THRESHOLD)) point = p;
  return { config: DEFAULTS_CONFIG, point, sweep: swept };
}

/**
 * The objective's value of some figures, larger is better: link F1; or, for recall at a minimum
 * precision, the recall where the precision is reached (plus 1, above any point that misses it)
 * and the precision where it is not.
 */
function objectiveValue(f: Figures, objective: Objective, minPrecision: number | undefined): number {
  if (objective === "f1") return f.linkF1;
  return f.linkPrecision >= (minPrecision ?? 0) ? 1 + f.linkRecall : f.linkPrecision;
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
  const heldOutRows = {} as Record<TuneProcedure, LinkRow[]>;
  const perFoldOf = {} as Record<TuneProcedure, FoldResult[]>;
  const foldNotes = {} as Record<TuneProcedure, string[]>;
  for (const procedure of TUNE_PROCEDURES) {
    heldOutRows[procedure] = new Array<LinkRow>(data.length);
    perFoldOf[procedure] = [];
    foldNotes[procedure] = [];
  }
  for (let f = 0; f < folds; f++) {
    const trainData = data.filter((_, i) => foldOf[i] !== f);
    const testIndex = data.map((_, i) => i).filter((i) => foldOf[i] === f);
    const testData = testIndex.map((i) => data[i]!);
    for (const procedure of TUNE_PROCEDURES) {
      const where = `fold ${f + 1}`;
      const { config, converged } = runProcedure(procedure, trainData, fitOpts, where, foldNotes[procedure]);
      const rows = rowsFor(testData, config);
      testIndex.forEach((i, j) => {
        heldOutRows[procedure][i] = rows[j]!;
      });
      perFoldOf[procedure].push({
        fold: f + 1,
        size: testData.length,
        config,
        converged,
        heldOut: evaluate(pairsFor(testData, rows), evalOpts).overall,
      });
    }
  }
  const heldOutReports = {} as Record<TuneProcedure, EvalReport>;
  let procedure: TuneProcedure = TUNE_PROCEDURES[0]!;
  for (const p of TUNE_PROCEDURES) {
    heldOutReports[p] = evaluate(pairsFor(data, heldOutRows[p]), evalOpts);
    const value = (q: TuneProcedure) => objectiveValue(heldOutReports[q].overall, objective, minPrecision);
    const precision = (q: TuneProcedure) => heldOutReports[q].overall.linkPrecision;
    // Better on the objective; for recall at a precision, an equal recall goes to the higher
    // precision (as operating points do); any other tie to the simpler procedure, listed first.
    const diff = value(p) - value(procedure);
    if (
      diff > PROCEDURE_TIE ||
      (Math.abs(diff) <= PROCEDURE_TIE &&
        objective === "recall-at-precision" &&
        precision(p) > precision(procedure) + PROCEDURE_TIE)
    )
      procedure = p;
  }
  notes.push(...foldNotes[procedure]);
  if (procedure !== "fitted") {
    const fitted = heldOutReports.fitted.overall;
    const kept = heldOutReports[procedure].overall;
    const figures =
      objective === "f1"
        ? `link F1 ${fitted.linkF1.toFixed(4)} against ${kept.linkF1.toFixed(4)}`
        : `link precision / recall ${fitted.linkPrecision.toFixed(4)} / ${fitted.linkRecall.toFixed(4)} against ${kept.linkPrecision.toFixed(4)} / ${kept.linkRecall.toFixed(4)}, for the highest recall at precision >= ${minPrecision}`;
    notes.push(
      `fitted weights did no better held out than ${PROCEDURE_WORDS[procedure]} (${figures}): kept ${PROCEDURE_WORDS[procedure]}`,
    );
  }

  const final = fitAndChoose(data, fitOpts, "all data", procedure === "fitted" ? notes : []);
  const kept = procedure === "fitted" ? final : operatingPointOf(procedure, data, fitOpts, notes);
  const finalConfig = kept.config;
  const reports = {
    heldOut: heldOutReports[procedure],
    inSample: evaluate(pairsFor(data, rowsFor(data, finalConfig)), evalOpts),
    defaults: evaluate(pairsFor(data, rowsFor(data, DEFAULTS_CONFIG)), evalOpts),
  };
  const procedures = {} as Record<TuneProcedure, Figures>;
  for (const p of TUNE_PROCEDURES) procedures[p] = heldOutReports[p].overall;
  const perFold = perFoldOf[procedure];
  const result: TuneResult = {
    config: finalConfig,
    procedure,
    procedures,
    objective,
    folds,
    seed,
    l2,
    mentions: data.length,
    pairs: final.pairs.length,
    positives,
    fit: { iterations: final.fit.iterations, converged: final.fit.converged, objective: final.fit.objective },
    chosen: kept.point,
    curve: kept.sweep.curve,
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
