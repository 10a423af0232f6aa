/**
 * A table's kind columns: attribute columns whose values sort the rows into a few kinds (a
 * subdivision's category "District" or "Province", a place's country, a firm's trade), found
 * while the rows stream in. A mention that follows a name with its row's kind ("Bhola District"
 * for the district "Bhola") names that row; see the "kind" match of src/score/features.ts.
 */

import { foldTokens } from "../normalize/fold.js";
import { PARTICULAR_PLACE_KINDS } from "../normalize/lexicon.js";

/**
 * Fewest rows that must give a column a value for it to count as a kind column: below it, a few
 * rows sharing a value tell nothing of the column.
 */
export const KIND_MIN_ROWS = 20;
/**
 * Largest share of distinct values among a column's non-empty values for the column to count as
 * one of kinds: a category or a country column repeats few values (the 5,099 ISO 3166-2
 * subdivisions have 4% distinct categories, 5% distinct countries); a column of dates, owners or
 * codes repeats few or none.
 */
export const KIND_MAX_DISTINCT_SHARE = 0.1;
/**
 * Longest value, in characters, read as a kind: a kind is a word or a short phrase, a longer text
 * a description. A column may hold a few (a country column's "Macedonia, the Former Yugoslav
 * Republic Of") and still be one of kinds; see KIND_MAX_OTHER_SHARE.
 */
export const KIND_MAX_VALUE_CHARS = 40;
/** Largest share of a kind column's values that may be numbers or longer than KIND_MAX_VALUE_CHARS. */
export const KIND_MAX_OTHER_SHARE = 0.1;

/**
 * Share of a kind column's distinct values that must name a kind of place (hold a word of
 * PARTICULAR_PLACE_KINDS: "District", "Autonomous region") for the column to be a category of
 * places, whose values are the rows' kinds (ISO 3166-2's categories: most); a column of countries
 * holds a few such words by chance ("Holy See (Vatican City State)").
 */
export const PLACE_CATEGORY_SHARE = 0.25;

/**
 * Most distinct values of one kind column kept among the table's kind values (the countries, the
 * counties its rows lie in; see contextConflict in src/types.ts): a column of more is no short
 * list of kinds.
 */
export const MAX_KIND_VALUES = 5_000;

/** A value that is a number (a year, a tonnage, a code of digits): never a kind. */
const NUMERIC = /^[\d\s.,:/+-]+$/;

interface ColumnStats {
  rows: number;
  /** Values that cannot be kinds: numbers, long texts. */
  other: number;
  /** Distinct values, until there are too many for the column to be one of kinds (then null). */
  values: Set<string> | null;
}

/** Gathers the statistics of every attribute column, one row at a time. */
export class KindColumnsBuilder {
  private readonly columns = new Map<string, ColumnStats>();
  private rows = 0;

  observe(attributes: Readonly<Record<string, string>>): void {
    this.rows++;
    for (const column in attributes) {
      const value = attributes[column]!.trim();
      if (value === "") continue;
      let stats = this.columns.get(column);
      if (stats === undefined) {
        stats = { rows: 0, other: 0, values: new Set() };
        this.columns.set(column, stats);
      }
      stats.rows++;
      const values = stats.values;
      if (values === null) continue;
      if (value.length > KIND_MAX_VALUE_CHARS || NUMERIC.test(value)) {
        stats.other++;
        continue;
      }
      values.add(value.toLowerCase());
      // However many rows follow, a column with this many distinct values is no column of kinds.
      if (values.size > KIND_MAX_DISTINCT_SHARE * Math.max(this.rows, KIND_MIN_ROWS * 50))
        stats.values = null;
    }
  }

  /** Every attribute column seen, in order of first appearance. */
  columnNames(): string[] {
    return [...this.columns.keys()];
  }

  /**
   * The kind columns, in order of first appearance; and of them the categories of places, whose
   * values are kinds of places more often than not (see PLACE_CATEGORY_SHARE).
   */
  result(): { kindColumns: string[]; placeCategoryColumns: string[]; kindValues: string[] } {
    const kindColumns: string[] = [];
    const placeCategoryColumns: string[] = [];
    const kindValues: string[] = [];
    for (const [column, { rows, other, values }] of this.columns) {
      if (values === null || rows < KIND_MIN_ROWS || other > KIND_MAX_OTHER_SHARE * rows) continue;
      if (values.size > KIND_MAX_DISTINCT_SHARE * rows) continue;
      kindColumns.push(column);
      let kinds = 0;
      for (const v of values) if (foldTokens(v).some((t) => PARTICULAR_PLACE_KINDS.has(t))) kinds++;
      if (kinds >= PLACE_CATEGORY_SHARE * values.size) placeCategoryColumns.push(column);
      else if (values.size <= MAX_KIND_VALUES) kindValues.push(...values);
    }
    return { kindColumns, placeCategoryColumns, kindValues };
  }
}
