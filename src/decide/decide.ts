/**
 * The link-or-NIL decision: link to the best candidate when its score clears the threshold and
 * its margin over the runner-up clears the minimum margin; otherwise NIL, with the reason.
 */

/** Default decision threshold on the combined score (a score is a probability-like value, so 0.5). */
export const DEFAULT_THRESHOLD = 0.5;
/**
 * Default minimum margin between the best and the runner-up score. Small on purpose: candidates
 * that differ by less than this are indistinguishable on the evidence and the mention is ambiguous.
 */
export const DEFAULT_MIN_MARGIN = 0.05;

export type DecisionOutcome = "link" | "no-candidates" | "below-threshold" | "ambiguous";

export interface Decision {
  outcome: DecisionOutcome;
  /** Index (into the score array) of the chosen candidate, or -1 for NIL. */
  chosen: number;
  /** Index of the best candidate (even when NIL), or -1 when there are none. */
  best: number;
  bestScore: number;
  /** Best score minus runner-up score (the best score itself when there is a single candidate). */
  margin: number;
}

/** Decide over candidate scores (any order). Pure: evaluation and tuning sweeps call it too. */
export function decide(scores: readonly number[], threshold: number, minMargin: number): Decision {
  let best = -1;
  let bestScore = 0;
  let second = 0;
  for (let i = 0; i < scores.length; i++) {
    const s = scores[i]!;
    if (best < 0 || s > bestScore) {
      if (best >= 0) second = bestScore;
      best = i;
      bestScore = s;
    } else if (s > second) {
      second = s;
    }
  }
  if (best < 0) return { outcome: "no-candidates", chosen: -1, best: -1, bestScore: 0, margin: 0 };
  const margin = bestScore - second;
  if (bestScore < threshold) return { outcome: "below-threshold", chosen: -1, best, bestScore, margin };
  if (margin < minMargin) return { outcome: "ambiguous", chosen: -1, best, bestScore, margin };
  return { outcome: "link", chosen: best, best, bestScore, margin };
}
