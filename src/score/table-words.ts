/**
 * A table's own generic name words: words so many of its names carry that they say what kind of
 * thing an entry is, not which one ("airport" in a table of airfields, where 35% of names end
 * with it). Like a firm's legal form or a place's designator, such a word may be present on one
 * side and missing on the other ("Goroka Airport" / "Goroka"); nameMatch sets them aside and
 * credits the rest of the name as a key match with a one-sided qualifier. This is the usual
 * corpus-specific stopword cut of information retrieval (a maximum document frequency), taken
 * over the table's names.
 *
 * Persons are left out: in a table of people the most carried words are given names, which tell
 * people apart.
 */
import type { Kb } from "../kb/kb.js";
import { isContraction } from "./name-similarity.js";

/**
 * Share of the table's entities that must carry a word in a name for it to count as generic: 5%.
 * High enough that no word of the sample gazette (its most carried, "steamship", 4.5%), of a
 * 135,000-place gazetteer ("de" 3.0%, "san" 2.4%) or of the synthetic benchmark tables (their
 * non-initial words at most 4.4%) is generic; in a table of airfields "airport" (35%) and
 * "intl" (9%) are. Common practice sets such cuts between 1% and 10%.
 */
export const GENERIC_WORD_SHARE = 0.05;

/**
 * Fewest entities that must carry a word for it to count, whatever the share: in a table of a
 * few hundred entries a word on 5% of names is a handful of coincidences.
 */
export const GENERIC_WORD_MIN_ENTITIES = 100;

/**
 * Shortest generic word: one- and two-letter tokens are initials, particles ("de", "la") and
 * abbreviations ("st" for saint or street), which a name cannot lose without changing.
 */
export const MIN_GENERIC_WORD_LENGTH = 3;

/** The empty set: no generic words (small tables, persons). */
export const NO_GENERIC_WORDS: ReadonlySet<string> = new Set();

/**
 * The generic word a name token stands for, or null: the word itself, its singular or plural
 * with a closing "s" ("airline" for the table's "airlines", "island" for "islands"), or a generic
 * word that is a contraction of it or that it contracts ("international" for the table's "intl",
 * "ldg" for its "landing"): a contraction keeps the first and last letters and at least three
 * letters, in order.
 */
export function genericWordFor(token: string, generic: ReadonlySet<string>): string | null {
  if (generic.size === 0) return null;
  if (generic.has(token)) return token;
  const plural = `${token}s`;
  if (generic.has(plural)) return plural;
  if (token.endsWith("s") && generic.has(token.slice(0, -1))) return token.slice(0, -1);
  for (const g of generic) if (isContraction(g, token) || isContraction(token, g)) return g;
  return null;
}

const found = new WeakMap<Kb, ReadonlySet<string>>();

/** The KB's generic name words. */
export function genericWordsOf(kb: Kb): ReadonlySet<string> {
  let words = found.get(kb);
  if (words === undefined) {
    const min = Math.max(GENERIC_WORD_MIN_ENTITIES, Math.ceil(GENERIC_WORD_SHARE * kb.info.entities));
    const list = kb.tokensCarriedByAtLeast(min).filter((t) => t.length >= MIN_GENERIC_WORD_LENGTH);
    words = list.length === 0 ? NO_GENERIC_WORDS : new Set(list);
    found.set(kb, words);
  }
  return words;
}
