/**
 * A table's near-name rate: how often a name that is not in the table would still link by a near
 * spelling to an entity that is. In a small table (a gazette's few hundred firms and towns) a name
 * one letter off an entry's is almost always that entry, misspelled or misread; in a gazetteer of
 * 100,000 places it is often another place ("Anaka" and "Annaka", "Nysted" and "Ansted"). The
 * rate is measured on the table itself, with no labels: each sampled entity's own name is looked
 * up as if the entity were absent, and counts when another entity, not spelled alike, would take
 * the link at the default settings. The nearSpelling feature carries the rate, so its (negative)
 * weight costs a near spelling more the more crowded the table is; this is the u-probability of
 * Fellegi-Sunter's "approximate agreement" level, estimated from the table.
 */
import type { Kb } from "../kb/kb.js";

/**
 * Names sampled, evenly spaced over the table: at the rates seen (0 to 0.4) the estimate's
 * standard error is at most 1.6 points; a table of fewer entities is measured whole.
 */
export const NEAR_NAME_SAMPLE = 1000;

/** Internal ids (1-based) of up to `n` entities evenly spaced over a table of `total`. */
export function sampleEids(total: number, n: number): number[] {
  if (total <= n) return Array.from({ length: total }, (_, i) => i + 1);
  const out: number[] = [];
  for (let i = 0; i < n; i++) out.push(1 + Math.floor((i * total) / n));
  return out;
}

/**
 * The share of sampled entities for which `linksElsewhere(eid)` holds: the caller looks up the
 * entity's name with the entity left out and says whether a near spelling would link.
 */
export function measureNearNameRate(kb: Kb, linksElsewhere: (eid: number) => boolean): number {
  const eids = sampleEids(kb.hot.entities, NEAR_NAME_SAMPLE);
  if (eids.length === 0) return 0;
  let hits = 0;
  for (const eid of eids) if (linksElsewhere(eid)) hits++;
  return hits / eids.length;
}

/** Rates already measured, per open KB: measured once, whatever linkers the KB serves. */
const measured = new WeakMap<Kb, number>();

/** The KB's near-name rate, measured on first use by `measure`. */
export function nearNameRateOf(kb: Kb, measure: () => number): number {
  let rate = measured.get(kb);
  if (rate === undefined) {
    rate = measure();
    measured.set(kb, rate);
  }
  return rate;
}
