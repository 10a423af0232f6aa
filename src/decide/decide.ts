/**
 * The link-or-NIL decision: link to the best candidate when its score clears the threshold and
 * its margin over the runner-up clears the minimum margin; otherwise NIL, with the reason.
 */

/** Default decision threshold on the combined score (a score is a probability-like value, so 0.5). */
export const DEFAULT_THRESHOLD = 0.5;
/**
 * The margin is measured in log-odds: logit(best score) - logit(runner-up score). Scores are
 * sigmoids of a sum of evidence, so two strong candidates both sit near 1 (0.997 vs 0.9995) and
 * a difference of scores would call every pair of look-alikes ambiguous however clearly the
 * context separates them; the log-odds difference is exactly the evidence that separates them.
 *
 * Default minimum margin: 0.5 log-odds (the winner at least 1.65 times as likely in odds).
 * Two candidates with the same name and no telling context differ only by their priors, far
 * less than this, and the mention is ambiguous.
 */
export const DEFAULT_MIN_MARGIN = 0.5;

/** Largest margin reported: a lone candidate, or a runner-up e^10 (about 22,000) times less likely. */
export const MARGIN_CAP = 10;

/** Scores are clamped this far from 0 and 1 before taking log-odds, so a rounded 1.0 stays finite. */
const LOGIT_EPSILON = 1e-12;

/** ln(p / (1 - p)) of a score clamped into (0, 1). */
export function logOdds(p: number): number {
  const q = Math.min(1 - LOGIT_EPSILON, Math.max(LOGIT_EPSILON, p));
  return Math.log(q / (1 - q));
}

/** The margin of a best score over the runner-up's: log-odds difference, MARGIN_CAP without a runner-up. */
export function marginOver(best: number, runnerUp: number | undefined): number {
  return runnerUp === undefined ? MARGIN_CAP : Math.min(MARGIN_CAP, logOdds(best) - logOdds(runnerUp));
}

export type DecisionOutcome = "link" | "no-candidates" | "below-threshold" | "ambiguous";

export interface Decision {
  outcome: DecisionOutcome;
  /** Index (into the score array) of the chosen candidate, or -1 for NIL. */
  chosen: number;
  /** Index of the best candidate (even when NIL), or -1 when there are none. */
  best: number;
  bestScore: number;
  /** logOdds(best) - logOdds(runner-up), capped at MARGIN_CAP (MARGIN_CAP for a single candidate). */
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
  const margin = marginOver(bestScore, scores.length < 2 ? undefined : second);
  // Written as "not at least", so that a score or margin that is not a number never links.
  if (!(bestScore >= threshold)) return { outcome: "below-threshold", chosen: -1, best, bestScore, margin };
  if (!(margin >= minMargin)) return { outcome: "ambiguous", chosen: -1, best, bestScore, margin };
  return { outcome: "link", chosen: best, best, bestScore, margin };
}
