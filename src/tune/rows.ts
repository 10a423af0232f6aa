/**
 * Link rows rebuilt from scored mentions under a given configuration, so the evaluation report
 * (per-type figures, candidate recall, errors) can be computed on tuning data without a database.
 * Every scored candidate is kept in the row (best first), so candidate recall "at all returned"
 * is the recall of candidate generation itself.
 */
import { decide } from "../decide/decide.js";
import { combine, contributions } from "../score/combine.js";
import type { LinkConfig, LinkRow, Reason } from "../types.js";
import type { ScoredMention } from "./types.js";

/** Feature contributions cited in a row's reasons: the two largest tell the story without noise. */
const CITED_CONTRIBUTIONS = 2;

const OUTCOME_MESSAGES = {
  link: "best candidate clears the threshold and the margin",
  "no-candidates": "no candidate was generated",
  "below-threshold": "best score is below the threshold",
  ambiguous: "best score is too close to the runner-up",
} as const;

export function linkRowsFor(data: readonly ScoredMention[], config: LinkConfig): LinkRow[] {
  return data.map(({ mention, candidates }) => {
    const scored = candidates
      .map((c, i) => ({ c, i, score: combine(c.features, config.weights) }))
      .sort((a, b) => b.score - a.score || a.i - b.i);
    const d = decide(
      scored.map((s) => s.score),
      config.threshold,
      config.minMargin,
    );
    const top = d.best >= 0 ? scored[d.best] : undefined;
    const chosen = d.chosen >= 0 ? scored[d.chosen] : undefined;
    const reasons: Reason[] = [
      {
        code: d.outcome,
        message: OUTCOME_MESSAGES[d.outcome],
        score: d.bestScore,
        margin: d.margin,
        threshold: config.threshold,
        minMargin: config.minMargin,
      },
    ];
    if (top) {
      for (const c of contributions(top.c.features, config.weights).slice(0, CITED_CONTRIBUTIONS))
        reasons.push({
          code: "feature",
          message: `${c.feature} = ${c.value.toFixed(2)} adds ${c.contribution.toFixed(2)} log-odds`,
          feature: c.feature,
          value: c.value,
          contribution: c.contribution,
        });
    }
    const row: LinkRow = {
      mention: mention.id,
      text: mention.text,
      type: mention.type ?? null,
      entity: chosen ? chosen.c.entity : null,
      name: chosen ? (chosen.c.name ?? null) : null,
      score: d.bestScore,
      margin: d.margin,
      reasons,
      candidates: scored.map((s) => ({
        entity: s.c.entity,
        name: s.c.name ?? s.c.entity,
        score: s.score,
        features: s.c.features,
        paths: [],
      })),
    };
    if (mention.doc !== undefined) row.doc = mention.doc;
    if (mention.start !== undefined) row.start = mention.start;
    if (mention.end !== undefined) row.end = mention.end;
    return row;
  });
}
