/** Small builders of link rows and labeled mentions for the evaluation tests (invented data). */
import type { Features, LabeledMention, LinkRow } from "../src/types.js";

export const ZERO_FEATURES: Features = {
  jaroWinkler: 0,
  levenshtein: 0,
  tokenSet: 0,
  abbreviation: 0,
  exactKey: 0,
  context: 0,
  typeMatch: 0,
  prior: 0,
  nearSpelling: 0,
  contextConflict: 0,
  prominence: 0,
};

export function gold(
  id: string,
  goldEntity: string | null,
  extra: Partial<LabeledMention> = {},
): LabeledMention {
  return { id, text: `text of ${id}`, gold: goldEntity, ...extra };
}

/** A row predicting `entity`, with candidates given as [entity, score] best first or in any order. */
export function row(
  mention: string,
  entity: string | null,
  candidates: Array<[string, number]>,
  extra: Partial<LinkRow> = {},
): LinkRow {
  const best = candidates.reduce((m, [, s]) => Math.max(m, s), 0);
  return {
    mention,
    text: `text of ${mention}`,
    type: null,
    entity,
    name: entity,
    score: best,
    margin: 0,
    reasons: [{ code: entity === null ? "below-threshold" : "alias-exact", message: "test reason" }],
    candidates: candidates.map(([e, score]) => ({
      entity: e,
      name: e,
      score,
      features: ZERO_FEATURES,
      paths: [],
    })),
    ...extra,
  };
}
