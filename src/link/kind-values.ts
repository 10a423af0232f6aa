/**
 * What a table's kind columns (src/kb/kind-columns.ts) say of its rows: the kind words of one
 * record (kindWordsOf, read by the "kind" name match), and the values a mention's context may
 * name (KindValues, read by the contextConflict feature).
 */
import type { Kb } from "../kb/kb.js";
import { foldTokens } from "../normalize/fold.js";
import { GENERIC_PLACE_TYPES, PARTICULAR_PLACE_KINDS } from "../normalize/lexicon.js";

/**
 * The values of a table's kind columns that are not categories of places (its rows' countries,
 * counties), as the context terms they are made of. A mention's context names a value when it
 * holds all its terms ("Ambry Vale" needs both words: "Port Ambry" is no mention of the county);
 * a record carries a value when its description and attributes hold all its terms.
 */
export class KindValues {
  /** Each value's term ids. */
  private readonly values: Uint32Array[] = [];
  /** Each value as the table gives it (lower case). */
  private readonly texts: string[] = [];
  /** Term id -> the values holding it. */
  private readonly byTerm = new Map<number, number[]>();

  constructor(private readonly kb: Kb) {
    for (const { value, terms } of kb.info.kindValues) {
      const ids = terms.map((t) => kb.termInfo(t).id);
      if (ids.some((id) => id < 0)) continue;
      const v = this.values.length;
      this.values.push(Uint32Array.from(ids));
      this.texts.push(value);
      for (const id of new Set(ids)) {
        const list = this.byTerm.get(id);
        if (list) list.push(v);
        else this.byTerm.set(id, [v]);
      }
    }
  }

  /** True when the table has kind values to read. */
  get any(): boolean {
    return this.values.length > 0;
  }

  /** The values a context names, given its term ids. */
  namedIn(contextIds: ArrayLike<number>): number[] {
    const held = new Set<number>();
    for (let i = 0; i < contextIds.length; i++) held.add(contextIds[i]!);
    const out = new Set<number>();
    for (const t of held)
      for (const v of this.byTerm.get(t) ?? []) if (this.values[v]!.every((id) => held.has(id))) out.add(v);
    return [...out];
  }

  /**
   * 1 when the entity's record carries kind values and none of `named`; 0 when it carries one of
   * them, or none at all (a record that says nothing of its country contradicts no context).
   */
  conflict(named: readonly number[], eid: number): number {
    if (named.length === 0) return 0;
    for (const v of named) if (this.carries(eid, v)) return 0;
    const hot = this.kb.hot;
    const ids = hot.termIds;
    for (let j = hot.termStart[eid]!, end = hot.termStart[eid + 1]!; j < end; j++)
      for (const v of this.byTerm.get(ids[j]!) ?? []) if (this.carries(eid, v)) return 1;
    return 0;
  }

  /** The values' texts, as the table gives them (lower case). */
  textsOf(values: readonly number[]): string[] {
    return values.map((v) => this.texts[v]!);
  }

  private carries(eid: number, v: number): boolean {
    const hot = this.kb.hot;
    return this.values[v]!.every((id) => hot.hasTerm(eid, id));
  }
}

/**
 * The words with which an entity's record gives its kind: those of its values in the table's
 * kind columns (src/kb/kind-columns.ts) and of its table type, unless a generic one
 * (GENERIC_PLACE_TYPES: "region" says nothing of a row's kind). A place whose record names no
 * kind of place of its own (typed "region" or "place", with a country column but no category)
 * may take any of the usual words for the kind of an administrative area (PLACE_KIND_WORDS:
 * "Bhola District", "Ivanovo Oblast"); one typed "town" (PARTICULAR_PLACE_KINDS), or given a
 * value in a category of places, only its own ("Kindia Region" is no name of the prefecture
 * Kindia, nor "Ambry Parish" of the hundred Ambry).
 */
export interface KindWords {
  words: ReadonlySet<string>;
  /** Any of PLACE_KIND_WORDS counts too. */
  open: boolean;
}

export function kindWordsOf(kb: Kb, eid: number): KindWords {
  const e = kb.entity(eid);
  const words = new Set<string>();
  let open = e.cls === "location";
  const { kindColumns, placeCategoryColumns } = kb.info;
  for (const column of kindColumns) {
    const value = e.attributes[column];
    if (value === undefined || value.trim() === "") continue;
    for (const t of foldTokens(value)) words.add(t);
    if (placeCategoryColumns.includes(column)) open = false;
  }
  for (const t of foldTokens(e.type)) {
    if (GENERIC_PLACE_TYPES.has(t)) continue;
    words.add(t);
    if (PARTICULAR_PLACE_KINDS.has(t)) open = false;
  }
  return { words, open };
}
