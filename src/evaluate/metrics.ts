/**
 * Link-quality figures of a set of predictions against gold labels.
 *
 * Definitions (every figure is a fraction in [0, 1]; a fraction whose denominator is 0 is
 * reported as 0, the usual zero-division convention — common practice):
 * - accuracy: mentions whose prediction is right (the gold entity, or NIL for a gold NIL) / all mentions;
 * - link precision: correct links / predicted links (a NIL prediction is not a link);
 * - link recall: correct links / gold non-NIL mentions;
 * - link F1: harmonic mean of link precision and recall;
 * - NIL precision: gold-NIL mentions predicted NIL / mentions predicted NIL;
 * - NIL recall: gold-NIL mentions predicted NIL / gold-NIL mentions;
 * - candidate recall at k: gold non-NIL mentions whose gold entity is among the row's k best
 *   candidates (and among all returned candidates): below 1, a miss lies in candidate
 *   generation (blocking), not in scoring or deciding.
 */
import type { LabeledMention, LinkRow, Reason } from "../types.js";

export { formatEvalTable } from "./format.js";

/** Default k of candidate recall at k: the number of candidates a link row carries by default. */
export const DEFAULT_CANDIDATE_K = 3;

/** Group name of mentions without a `type`. */
export const UNTYPED = "(untyped)";

/** One gold mention and the row predicted for it (null: no row, counted as a NIL prediction). */
export interface EvalPair {
  gold: LabeledMention;
  predicted: LinkRow | null;
}

/** Counts and fractions over one group of mentions. */
export interface Figures extends FigureCounts {
  accuracy: number;
  linkPrecision: number;
  linkRecall: number;
  linkF1: number;
  nilPrecision: number;
  nilRecall: number;
}

export type ErrorKind = "wrongEntity" | "falseLink" | "missedLink";

export interface LinkError {
  kind: ErrorKind;
  mention: string;
  text: string;
  type: string | null;
  gold: string | null;
  predicted: string | null;
  /** The row's score (of the chosen, or for NIL of the best, candidate); 0 without a row. */
  score: number;
  margin: number;
  /** Score of the gold entity among the row's candidates, null when it is not among them. */
  goldScore: number | null;
  reasons: Reason[];
}

export interface CandidateRecall {
  k: number;
  /** Gold non-NIL mentions (the denominator). */
  goldLinks: number;
  foundAtK: number;
  foundAtAll: number;
  atK: number;
  atAll: number;
}

export interface EvalReport {
  overall: Figures;
  /** Per mention `type` (the input label, `(untyped)` when absent), sorted by type. */
  byType: Record<string, Figures>;
  candidateRecall: CandidateRecall;
  errorCounts: Record<ErrorKind, number>;
  /** Every error, in input order. */
  errors: LinkError[];
}

export interface EvaluateOptions {
  /** k of candidate recall at k. Default DEFAULT_CANDIDATE_K (3). */
  k?: number;
}

/** a / b, 0 when b is 0. */
export function ratio(a: number, b: number): number {
  return b === 0 ? 0 : a / b;
}

/** Harmonic mean of precision and recall, 0 when both are 0. */
export function f1(precision: number, recall: number): number {
  return precision + recall === 0 ? 0 : (2 * precision * recall) / (precision + recall);
}

/** Raw counts behind Figures. */
export interface FigureCounts {
  mentions: number;
  /** Gold non-NIL mentions. */
  goldLinks: number;
  /** Gold NIL mentions. */
  goldNil: number;
  predictedLinks: number;
  predictedNil: number;
  correctLinks: number;
  correctNil: number;
}

function emptyFigureCounts(): FigureCounts {
  return {
    mentions: 0,
    goldLinks: 0,
    goldNil: 0,
    predictedLinks: 0,
    predictedNil: 0,
    correctLinks: 0,
    correctNil: 0,
  };
}

function add(t: FigureCounts, gold: string | null, predicted: string | null): void {
  t.mentions++;
  if (gold === null) t.goldNil++;
  else t.goldLinks++;
  if (predicted === null) {
    t.predictedNil++;
    if (gold === null) t.correctNil++;
  } else {
    t.predictedLinks++;
    if (predicted === gold) t.correctLinks++;
  }
}

/** The figures of predicted entity ids (null: NIL) against gold ones, without rows. */
export function figuresOf(
  gold: ReadonlyArray<string | null>,
  predicted: ReadonlyArray<string | null>,
): Figures {
  if (gold.length !== predicted.length) throw new Error("figuresOf: gold and predictions differ in length");
  const t = emptyFigureCounts();
  for (let i = 0; i < gold.length; i++) add(t, gold[i] ?? null, predicted[i] ?? null);
  return figuresFromCounts(t);
}

/** Fractions from raw counts (exported for the tuning sweep, which counts without rows). */
export function figuresFromCounts(t: FigureCounts): Figures {
  const linkPrecision = ratio(t.correctLinks, t.predictedLinks);
  const linkRecall = ratio(t.correctLinks, t.goldLinks);
  return {
    ...t,
    accuracy: ratio(t.correctLinks + t.correctNil, t.mentions),
    linkPrecision,
    linkRecall,
    linkF1: f1(linkPrecision, linkRecall),
    nilPrecision: ratio(t.correctNil, t.predictedNil),
    nilRecall: ratio(t.correctNil, t.goldNil),
  };
}

/** The row's candidates, best score first (stable for equal scores). */
function rankedCandidates(row: LinkRow): string[] {
  return row.candidates
    .map((c, i) => ({ entity: c.entity, score: c.score, i }))
    .sort((a, b) => b.score - a.score || a.i - b.i)
    .map((c) => c.entity);
}

function errorKind(gold: string | null, predicted: string | null): ErrorKind | null {
  if (gold === predicted) return null;
  if (gold === null) return "falseLink";
  if (predicted === null) return "missedLink";
  return "wrongEntity";
}

/** Measure predictions against gold labels. */
export function evaluate(pairs: readonly EvalPair[], opts: EvaluateOptions = {}): EvalReport {
  const k = opts.k ?? DEFAULT_CANDIDATE_K;
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`evaluate: k must be a positive integer, got ${k}`);
  const overall = emptyFigureCounts();
  const byType = new Map<string, FigureCounts>();
  const recall = { goldLinks: 0, foundAtK: 0, foundAtAll: 0 };
  const errorCounts: Record<ErrorKind, number> = { wrongEntity: 0, falseLink: 0, missedLink: 0 };
  const errors: LinkError[] = [];

  for (const { gold, predicted } of pairs) {
    const goldEntity = gold.gold;
    const predictedEntity = predicted?.entity ?? null;
    add(overall, goldEntity, predictedEntity);
    const type = gold.type ?? UNTYPED;
    let t = byType.get(type);
    if (!t) {
      t = emptyFigureCounts();
      byType.set(type, t);
    }
    add(t, goldEntity, predictedEntity);

    if (goldEntity !== null) {
      recall.goldLinks++;
      const ranked = predicted ? rankedCandidates(predicted) : [];
      const rank = ranked.indexOf(goldEntity);
      if (rank >= 0) recall.foundAtAll++;
      if (rank >= 0 && rank < k) recall.foundAtK++;
    }

    const kind = errorKind(goldEntity, predictedEntity);
    if (kind) {
      errorCounts[kind]++;
      const goldCandidate =
        goldEntity === null ? undefined : predicted?.candidates.find((c) => c.entity === goldEntity);
      errors.push({
        kind,
        mention: gold.id,
        text: gold.text,
        type: gold.type ?? null,
        gold: goldEntity,
        predicted: predictedEntity,
        score: predicted?.score ?? 0,
        margin: predicted?.margin ?? 0,
        goldScore: goldCandidate ? goldCandidate.score : null,
        reasons: predicted?.reasons ?? [],
      });
    }
  }

  const types = [...byType.keys()].sort();
  return {
    overall: figuresFromCounts(overall),
    byType: Object.fromEntries(types.map((type) => [type, figuresFromCounts(byType.get(type)!)])),
    candidateRecall: {
      k,
      ...recall,
      atK: ratio(recall.foundAtK, recall.goldLinks),
      atAll: ratio(recall.foundAtAll, recall.goldLinks),
    },
    errorCounts,
    errors,
  };
}
