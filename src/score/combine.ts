/**
 * Combining the named features into one score in [0, 1].
 *
 * score = sigmoid(bias + sum over features f of weight[f] * feature[f])
 *
 * A logistic combination keeps the score in (0, 1), makes each weight readable as the change in
 * log-odds that a feature brings, and is exactly the model `hawser tune` fits with logistic
 * regression, so tuned weights drop in without rescaling.
 */
import { FEATURE_NAMES, type Features, type Weights } from "../types.js";

/**
 * Default weights, set by reasoning over worked cases rather than fitted to any sample (tuning
 * fits them on a team's own labeled set). Each is the log-odds a perfect feature value adds:
 * - a full normalized-name match with a compatible type scores about 0.99;
 * - an acronym ("USA", "S.G.E.") or initials ("J. H. Aldous") reading links on its own
 *   (abbreviation), although string similarity to the full name is low;
 * - a short form contained in the full name ("Aldous" in "Josiah Aldous") scores near 0.5,
 *   and links when context supports it (tokenSet counts containment), unless its words are the
 *   first or last of a firm's or place's name and no other entry's names carry them ("Brunei" for
 *   "Brunei Darussalam": a key match, see nameMatch); a mention saying more than
 *   a name ("SS Harrowmouth" against the town "Harrowmouth") scores lower, as it often names
 *   something else;
 * - an OCR-noised full name ("Stenrnouth") links through similarity plus the OCR key;
 * - a name sharing only one token ("Port Ellery" / "Port Stenmouth", "Thomas Aldous" /
 *   "Josiah Aldous") stays well below 0.5 without strong context;
 * - typeMatch is soft: a mismatch lowers the score, it does not block;
 * - prior breaks ties towards popular entities, weakly;
 * - nearSpelling costs a name matched only by a near spelling 8 log-odds per unit of the table's
 *   near-name rate (link/crowding.ts): nothing in the sample gazette (rate 0), about 1.4 in the
 *   synthetic 100,000-entity table (0.171), about 2.9 in a gazetteer of 135,000 places (0.365),
 *   where a name one letter off is more often another place than a slip. Measured, not fitted:
 *   6, 8, 10 and 14 were tried on the open cities check, the synthetic 100k and 1M tables, the
 *   sample archive and the country checks; 8 is in the middle of the range that helps all of
 *   them (benchmarks/README.md, "Near spellings in crowded tables").
 * - contextConflict (the context names another country or county than the record gives) costs
 *   3 log-odds: a name spelled as the table spells it still links (about 4.5 -> 1.5), a near
 *   spelling or a short form, which scores lower, does not. Measured, not fitted: -2, -3, -4 and
 *   -6 on the subdivision and airfield checks and the sample archive; -4 and beyond lose
 *   mentions of the archive, whose articles name counties in passing (benchmarks/README.md,
 *   "Real open data: country subdivisions").
 * - prominence (a tie for first place between namesakes nothing but the prior tells apart) adds
 *   half the log of the popular one's lead (ln(1000) / 2 per unit of the feature, which is 1 at a
 *   thousandfold lead): as if mentions named places in proportion to the square root of their
 *   population, a reading that leaves "Kellow" 900 against 700 ambiguous and gives "London" to
 *   the capital. Measured, not fitted: 0, ln(1000) / 2 and ln(1000) on the place checks
 *   (benchmarks/README.md, "Namesakes told apart by popularity").
 */
// Frozen, as the other exported defaults: a caller who edits them gets a TypeError instead of
// changing the defaults of every linker made after.
export const DEFAULT_WEIGHTS: Weights = Object.freeze({
  bias: -10,
  features: Object.freeze({
    jaroWinkler: 4,
    levenshtein: 2,
    tokenSet: 4.5,
    abbreviation: 6,
    exactKey: 2,
    context: 3,
    typeMatch: 2,
    prior: 0.5,
    nearSpelling: -8,
    contextConflict: -3,
    prominence: Math.log(1000) / 2,
  }),
});

export function sigmoid(x: number): number {
  if (x >= 0) return 1 / (1 + Math.exp(-x));
  const e = Math.exp(x);
  return e / (1 + e);
}

/** The linear predictor (log-odds) of a feature vector under the given weights. */
export function logit(features: Features, weights: Weights): number {
  let z = weights.bias;
  for (const name of FEATURE_NAMES) z += (weights.features[name] ?? 0) * features[name];
  return z;
}

/** The combined score in [0, 1]. */
export function combine(features: Features, weights: Weights): number {
  return sigmoid(logit(features, weights));
}

/** Each feature's contribution in log-odds, largest first: what the reasons cite. */
export function contributions(
  features: Features,
  weights: Weights,
): Array<{ feature: string; value: number; weight: number; contribution: number }> {
  return FEATURE_NAMES.map((name) => ({
    feature: name,
    value: features[name],
    weight: weights.features[name] ?? 0,
    contribution: (weights.features[name] ?? 0) * features[name],
  })).sort((a, b) => b.contribution - a.contribution);
}
