/**
 * Built-in label sets: how NER labels and table type spellings reach an entity class.
 *
 * - CoNLL-2003 shared task: PER, ORG, LOC, MISC (from memory).
 * - OntoNotes 5: PERSON, NORP, FAC, ORG, GPE, LOC, PRODUCT, EVENT, WORK_OF_ART, LAW, LANGUAGE,
 *   DATE, TIME, PERCENT, MONEY, QUANTITY, ORDINAL, CARDINAL (from memory).
 * - Common spellings of table types (person, firm, company, town, place, vessel...).
 *
 * Each label maps to a class and a row of compatibility weights against entity classes, so that
 * confusable types are penalized rather than blocked: GPE vs organization (a town council, a
 * firm named after its town), LOC vs FAC, ORG vs person (a firm named after its founder).
 */
import type { EntityClass } from "../types.js";

/** Compatibility of a label with each entity class, 0 (incompatible) to 1 (same class). */
export type CompatRow = Record<EntityClass, number>;

export interface LabelInfo {
  /** The class a mention with this label is normalized as. */
  cls: EntityClass;
  /** False for numeric and date labels: such mentions are not linked (NIL with reason `not-linkable`). */
  linkable: boolean;
  compat: CompatRow;
}

/** Weights for a person label: firms are often named after people, vessels too. */
const PERSON_ROW: CompatRow = { person: 1, organization: 0.3, location: 0.15, other: 0.3 };
/** Organizations: often named after a town (GPE/ORG confusion is the most common NER type error). */
const ORG_ROW: CompatRow = { person: 0.25, organization: 1, location: 0.5, other: 0.45 };
/** Places: towns are confused with their councils and firms, and with facilities. */
const LOC_ROW: CompatRow = { person: 0.15, organization: 0.5, location: 1, other: 0.45 };
/** GPE (geo-political entity): a place that acts; closer to organization than LOC is. */
const GPE_ROW: CompatRow = { person: 0.15, organization: 0.6, location: 1, other: 0.35 };
/** FAC (facility: wharves, bridges, buildings): between places and other things. */
const FAC_ROW: CompatRow = { person: 0.1, organization: 0.45, location: 0.8, other: 0.8 };
/** MISC, products, events, works: anything but most often an "other" entity (a vessel). */
const MISC_ROW: CompatRow = { person: 0.35, organization: 0.45, location: 0.4, other: 1 };
/** NORP (nationalities, religious or political groups): weakly linked to places and organizations. */
const NORP_ROW: CompatRow = { person: 0.1, organization: 0.5, location: 0.5, other: 0.6 };
/** Not linkable: zero everywhere. */
const NONE_ROW: CompatRow = { person: 0, organization: 0, location: 0, other: 0 };

function info(cls: EntityClass, compat: CompatRow, linkable = true): LabelInfo {
  return { cls, compat, linkable };
}

/** Folded label (lowercase, `-`/space -> `_`) -> info. */
export const BUILTIN_LABELS: ReadonlyMap<string, LabelInfo> = new Map<string, LabelInfo>([
  // CoNLL-2003
  ["per", info("person", PERSON_ROW)],
  ["org", info("organization", ORG_ROW)],
  ["loc", info("location", LOC_ROW)],
  ["misc", info("other", MISC_ROW)],
  // OntoNotes 5
  ["person", info("person", PERSON_ROW)],
  ["norp", info("other", NORP_ROW)],
  ["fac", info("location", FAC_ROW)],
  ["gpe", info("location", GPE_ROW)],
  ["product", info("other", MISC_ROW)],
  ["event", info("other", MISC_ROW)],
  ["work_of_art", info("other", MISC_ROW)],
  ["law", info("other", MISC_ROW)],
  ["language", info("other", MISC_ROW)],
  ["date", info("other", NONE_ROW, false)],
  ["time", info("other", NONE_ROW, false)],
  ["percent", info("other", NONE_ROW, false)],
  ["money", info("other", NONE_ROW, false)],
  ["quantity", info("other", NONE_ROW, false)],
  ["ordinal", info("other", NONE_ROW, false)],
  ["cardinal", info("other", NONE_ROW, false)],
  // Table type spellings
  ["pers", info("person", PERSON_ROW)],
  ["people", info("person", PERSON_ROW)],
  ["individual", info("person", PERSON_ROW)],
  ["human", info("person", PERSON_ROW)],
  ["organization", info("organization", ORG_ROW)],
  ["organisation", info("organization", ORG_ROW)],
  ["company", info("organization", ORG_ROW)],
  ["firm", info("organization", ORG_ROW)],
  ["business", info("organization", ORG_ROW)],
  ["corporation", info("organization", ORG_ROW)],
  ["institution", info("organization", ORG_ROW)],
  ["agency", info("organization", ORG_ROW)],
  ["location", info("location", LOC_ROW)],
  ["place", info("location", LOC_ROW)],
  ["town", info("location", GPE_ROW)],
  ["city", info("location", GPE_ROW)],
  ["village", info("location", GPE_ROW)],
  ["county", info("location", GPE_ROW)],
  ["country", info("location", GPE_ROW)],
  ["region", info("location", LOC_ROW)],
  ["river", info("location", LOC_ROW)],
  ["geo", info("location", LOC_ROW)],
  ["facility", info("location", FAC_ROW)],
  ["wharf", info("location", FAC_ROW)],
  ["building", info("location", FAC_ROW)],
  ["author", info("person", PERSON_ROW)],
  ["politician", info("person", PERSON_ROW)],
  ["official", info("person", PERSON_ROW)],
  ["human_being", info("person", PERSON_ROW)],
  ["org_unit", info("organization", ORG_ROW)],
  ["enterprise", info("organization", ORG_ROW)],
  ["corp", info("organization", ORG_ROW)],
  ["bank", info("organization", ORG_ROW)],
  ["university", info("organization", ORG_ROW)],
  ["school", info("organization", ORG_ROW)],
  ["club", info("organization", ORG_ROW)],
  ["team", info("organization", ORG_ROW)],
  ["party", info("organization", ORG_ROW)],
  ["government", info("organization", ORG_ROW)],
  ["ministry", info("organization", ORG_ROW)],
  ["department", info("organization", ORG_ROW)],
  ["church", info("organization", ORG_ROW)],
  ["newspaper", info("organization", ORG_ROW)],
  ["union", info("organization", ORG_ROW)],
  ["society", info("organization", ORG_ROW)],
  ["association", info("organization", ORG_ROW)],
  ["state", info("location", GPE_ROW)],
  ["province", info("location", GPE_ROW)],
  ["district", info("location", GPE_ROW)],
  ["municipality", info("location", GPE_ROW)],
  ["parish", info("location", GPE_ROW)],
  ["settlement", info("location", GPE_ROW)],
  ["locality", info("location", GPE_ROW)],
  ["neighbourhood", info("location", GPE_ROW)],
  ["neighborhood", info("location", GPE_ROW)],
  ["subdivision", info("location", GPE_ROW)],
  ["territory", info("location", GPE_ROW)],
  ["area", info("location", LOC_ROW)],
  ["administrative_area", info("location", GPE_ROW)],
  ["administrative_region", info("location", GPE_ROW)],
  ["hamlet", info("location", GPE_ROW)],
  ["capital", info("location", GPE_ROW)],
  ["nation", info("location", GPE_ROW)],
  ["island", info("location", LOC_ROW)],
  ["mountain", info("location", LOC_ROW)],
  ["lake", info("location", LOC_ROW)],
  ["sea", info("location", LOC_ROW)],
  ["continent", info("location", LOC_ROW)],
  ["port", info("location", GPE_ROW)],
  ["harbour", info("location", FAC_ROW)],
  ["harbor", info("location", FAC_ROW)],
  ["station", info("location", FAC_ROW)],
  ["street", info("location", FAC_ROW)],
  ["road", info("location", FAC_ROW)],
  ["bridge", info("location", FAC_ROW)],
  ["airport", info("location", FAC_ROW)],
  // More organizations a team's table may hold, by trade or kind.
  ["airline", info("organization", ORG_ROW)],
  ["carrier", info("organization", ORG_ROW)],
  ["operator", info("organization", ORG_ROW)],
  ["shipping_line", info("organization", ORG_ROW)],
  ["shipowner", info("organization", ORG_ROW)],
  ["manufacturer", info("organization", ORG_ROW)],
  ["publisher", info("organization", ORG_ROW)],
  ["brand", info("organization", ORG_ROW)],
  ["employer", info("organization", ORG_ROW)],
  ["supplier", info("organization", ORG_ROW)],
  ["vendor", info("organization", ORG_ROW)],
  ["brewery", info("organization", ORG_ROW)],
  ["mill", info("organization", ORG_ROW)],
  ["foundry", info("organization", ORG_ROW)],
  ["shipyard", info("organization", ORG_ROW)],
  ["hospital", info("organization", ORG_ROW)],
  ["museum", info("organization", ORG_ROW)],
  ["library", info("organization", ORG_ROW)],
  ["college", info("organization", ORG_ROW)],
  ["charity", info("organization", ORG_ROW)],
  ["foundation", info("organization", ORG_ROW)],
  ["trust", info("organization", ORG_ROW)],
  ["cooperative", info("organization", ORG_ROW)],
  ["guild", info("organization", ORG_ROW)],
  ["council", info("organization", ORG_ROW)],
  ["board", info("organization", ORG_ROW)],
  ["committee", info("organization", ORG_ROW)],
  ["court", info("organization", ORG_ROW)],
  ["regiment", info("organization", ORG_ROW)],
  ["ngo", info("organization", ORG_ROW)],
  ["nonprofit", info("organization", ORG_ROW)],
  // More places.
  ["suburb", info("location", GPE_ROW)],
  ["ward", info("location", GPE_ROW)],
  ["valley", info("location", LOC_ROW)],
  ["bay", info("location", LOC_ROW)],
  ["cape", info("location", LOC_ROW)],
  ["forest", info("location", LOC_ROW)],
  ["dock", info("location", FAC_ROW)],
  ["quay", info("location", FAC_ROW)],
  ["pier", info("location", FAC_ROW)],
  ["canal", info("location", LOC_ROW)],
  ["lighthouse", info("location", FAC_ROW)],
  ["airfield", info("location", FAC_ROW)],
  ["aerodrome", info("location", FAC_ROW)],
  // More persons.
  ["artist", info("person", PERSON_ROW)],
  ["writer", info("person", PERSON_ROW)],
  ["scientist", info("person", PERSON_ROW)],
  ["athlete", info("person", PERSON_ROW)],
  ["musician", info("person", PERSON_ROW)],
  ["actor", info("person", PERSON_ROW)],
  ["captain", info("person", PERSON_ROW)],
  ["master_mariner", info("person", PERSON_ROW)],
  ["vessel", info("other", MISC_ROW)],
  ["ship", info("other", MISC_ROW)],
  ["boat", info("other", MISC_ROW)],
  ["other", info("other", MISC_ROW)],
  ["thing", info("other", MISC_ROW)],
]);

/** Compatibility used when a mention carries no label: neutral, so only names and context decide. */
export const UNLABELED_COMPAT = 0.7;
