/**
 * Shapes the tuning modules work from. The linker exposes, per labeled mention, every candidate
 * it scored (not only the top k of a link row), so tuning can refit weights and re-decide
 * without a database.
 */
import type { Features, LabeledMention } from "../types.js";

/** One scored candidate of a mention: its table id and its named feature values. */
export interface ScoredCandidate {
  entity: string;
  features: Features;
  /** Canonical name, when the linker knows it (optional: only shown in reports). */
  name?: string | undefined;
}

/** A labeled mention with ALL the candidates the linker generated and scored for it. */
export interface ScoredMention {
  mention: LabeledMention;
  candidates: ScoredCandidate[];
}

/**
 * How the operating point (threshold, minimum margin) is chosen:
 * - `f1`: highest link F1;
 * - `recall-at-precision`: highest link recall among points whose precision is at least `minPrecision`.
 */
export type Objective = "f1" | "recall-at-precision";

export const OBJECTIVES: readonly Objective[] = ["f1", "recall-at-precision"];
