/**
 * Shared data shapes of the hawser pipeline. Every stage folder under `src/` speaks in these
 * types; the file formats in README.md are their JSON forms.
 */

/** The normalization class an entity or mention belongs to. Table types and NER labels map onto it. */
export type EntityClass = "person" | "organization" | "location" | "other";

export const ENTITY_CLASSES: readonly EntityClass[] = ["person", "organization", "location", "other"];

/** One row of the knowledge table, as read and validated by `src/kb/read-table.ts`. */
export interface EntityRecord {
  id: string;
  name: string;
  /** The table's own type string (e.g. "person", "firm", "town", "vessel"). */
  type: string;
  aliases: string[];
  description: string;
  /** Popularity (population, mention count...); 0 when absent. */
  prior: number;
  /** Every other column. */
  attributes: Record<string, string>;
}

/** One mention to link. `line` is the 1-based source line, kept for error messages. */
export interface Mention {
  id: string;
  text: string;
  /** NER label or table type as given by the input ("PER", "ORG", "person"...). */
  type?: string | undefined;
  context?: string | undefined;
  doc?: string | undefined;
  start?: number | undefined;
  end?: number | undefined;
  /** Sentence number within the document (CoNLL input). */
  sentence?: number | undefined;
  /** Token offsets within the document (CoNLL input), end exclusive. */
  tokenStart?: number | undefined;
  tokenEnd?: number | undefined;
  /** Where the mention came from, for error messages. */
  source?: { file: string; line: number } | undefined;
}

/** A mention with its correct answer: an entity id, or null for NIL. */
export interface LabeledMention extends Mention {
  gold: string | null;
}

/** Structured explanation attached to a link row. Extra keys carry the values the message cites. */
export interface Reason {
  code: string;
  message: string;
  [value: string]: unknown;
}

/** The named features, each in [0, 1]. */
export interface Features {
  /** Best Jaro-Winkler similarity between the mention's normalized name and any alias. */
  jaroWinkler: number;
  /** Best normalized Levenshtein similarity (1 - distance / longer length) over aliases. */
  levenshtein: number;
  /**
   * Best token-set overlap over aliases: mean of fuzzy Dice and the share of the mention's tokens
   * the alias accounts for (a mention contained in an alias counts fully; one saying more does
   * not). Acronyms inside a name are read first (score/embedded-acronyms.ts).
   */
  tokenSet: number;
  /** 1 when the mention reads as initials or an acronym of an alias, or as the same words once an acronym inside either is read; else 0. */
  abbreviation: number;
  /**
   * 1 when the mention's normalized key equals an alias's key (less when only one side carries a
   * qualifier, legal form or place designator, and 0 when both do and they differ; 0.75 when only
   * the OCR-folded keys agree), else 0.
   */
  exactKey: number;
  /** TF-IDF cosine between the mention's context words and the entity's description and attributes. */
  context: number;
  /** Soft compatibility of the mention's label with the entity's type (1 same class, 0 incompatible). */
  typeMatch: number;
  /** Log-scaled popularity: log1p(prior) / log1p(max prior in the table). */
  prior: number;
  /**
   * How crowded the table's names are, when the mention matches this entity only by a near
   * spelling: the table's near-name rate (the share of its names for which another entity's near
   * spelling would link, see link/crowding.ts). 0 when the mention is spelled as one of the
   * entity's names spells it (equal keys, an acronym or initials reading, or every word of the
   * mention found as written). Its weight is negative: in a crowded table (a gazetteer of 100,000
   * places) a name one letter off is often another place, in a small one it is a misspelling.
   */
  nearSpelling: number;
  /**
   * 1 when the mention's context names a value of one of the table's kind columns (a country, a
   * county: src/kb/kind-columns.ts) that the entity's record does not carry, names none it does,
   * and the record carries such values: "Kara" in a text about Nigeria against a region of Togo.
   * Else 0. Its weight is negative.
   */
  contextConflict: number;
  /**
   * For a firm, place or thing spelled as a name of its own, when other candidates match the
   * mention exactly as well on every other feature (namesakes that the name, the type and the
   * context cannot tell apart): the log of its prior's lead over theirs, 1 at a thousandfold
   * lead (link/linker.ts, prominenceOf); else 0. It breaks the tie towards the far more popular
   * namesake ("London" with no context: the capital, not a village of 400), by the log of the
   * lead at the default weight. Never for persons.
   */
  prominence: number;
}

export type FeatureName = keyof Features;

export const FEATURE_NAMES: readonly FeatureName[] = Object.freeze([
  "jaroWinkler",
  "levenshtein",
  "tokenSet",
  "abbreviation",
  "exactKey",
  "context",
  "typeMatch",
  "prior",
  "nearSpelling",
  "contextConflict",
  "prominence",
]);

/** A candidate generation path: the linker's `paths` option names these. */
export type SearchPath = "exact" | "ocr" | "acronym" | "initials" | "fts" | "fuzzy";
/** Which path found a candidate: a search path, or document-level evidence ("document"). */
export type CandidatePath = SearchPath | "document";

/** A candidate as it appears in a link row. */
export interface CandidateOut {
  entity: string;
  name: string;
  score: number;
  features: Features;
  paths: CandidatePath[];
}

/** One output row of `hawser link`, in input order, exactly one per mention. */
export interface LinkRow {
  mention: string;
  text: string;
  type: string | null;
  /** Table id of the chosen entity, or null for NIL. */
  entity: string | null;
  name: string | null;
  score: number;
  margin: number;
  reasons: Reason[];
  candidates: CandidateOut[];
  doc?: string;
  start?: number;
  end?: number;
  /** The attributes (other table columns) of the linked entity; absent for NIL. */
  attributes?: Record<string, string>;
  /** CoNLL input: sentence number and token offsets of the mention within its document. */
  sentence?: number;
  tokenStart?: number;
  tokenEnd?: number;
}

/** Weights of the logistic combination: score = sigmoid(bias + sum(weight[f] * feature[f])). */
export interface Weights {
  bias: number;
  features: Record<FeatureName, number>;
}

/** The decision settings a config file carries. */
export interface LinkConfig {
  weights: Weights;
  /** Link only when the best score is at least this. */
  threshold: number;
  /** Link only when best score minus runner-up score is at least this. */
  minMargin: number;
}
