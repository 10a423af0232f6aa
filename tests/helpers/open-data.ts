/** Shared by the open-data checks: how a linker's outcomes on real names compare with a baseline's. */

/** One mention of an open-data check: its gold, hawser's row, the baseline's answer. */
export interface OpenDataOutcome {
  gold: string | null;
  row: { entity: string | null };
  baseline: string | null;
}

/**
 * Accuracy of hawser and of the baseline, and hawser's share of wrong links, over the outcomes;
 * printed as one line under `label`, so that the figures of each run can be read in its output.
 */
export function openDataShares(label: string, outcomes: readonly OpenDataOutcome[]) {
  const n = outcomes.length;
  const ours = outcomes.filter((o) => o.row.entity === o.gold).length / n;
  const base = outcomes.filter((o) => o.baseline === o.gold).length / n;
  const wrong = outcomes.filter((o) => o.row.entity !== null && o.row.entity !== o.gold).length / n;
  const pct = (x: number) => `${(100 * x).toFixed(1)}%`;
  console.log(
    `${label}: ${n} names, hawser accuracy ${pct(ours)}, folded-exact baseline ${pct(base)}, wrong links ${pct(wrong)}`,
  );
  return { n, ours, base, wrong };
}
