/**
 * The KB file: one SQLite database. Version 8 of the schema.
 *
 * - meta: key/value facts (format tag, schema version, normalizer version, source checksum,
 *   counts, fingerprint, largest prior, number of context documents).
 * - entities: one row per table row, holding what scoring and the output read: the attributes
 *   (other table columns) are here, as JSON, since a linked mention's row carries them (the
 *   description lives in entity_details, so that the rows read per candidate stay small); `forms`
 *   packs the normalized forms of its names (see packForms), so that scoring reads one row per
 *   candidate. The stemmed context words of the description and attributes live in the hot
 *   store, as term ids.
 * - keys: a view of the blocking keys per entity and class (key, class, kind, eid), with kinds
 *   exact, ocr, acronym, initials. The keys are stored in entity_details.keys, one JSON array of
 *   [kind, key] pairs per entity: linking reads them from the hot store's in-memory key index,
 *   built from the same keys, so the file holds them only to be queried and inspected. One value
 *   per entity instead of a row per key (about 4.4 an entity) made the file 6% smaller at 200,000
 *   entities; the build's speed did not change measurably. Nor is there an index on them: one
 *   cost a few seconds of every build and 130 MB of the file at a million entities, while a
 *   query by key that scans the view takes about 0.3 s at 200,000 entities.
 * - alias_fts: FTS5 over alias core tokens (contentless). Its rowids are positions in order of
 *   falling popularity (prior), mapped to entities by the hot store, so an unranked match
 *   returns the most popular entities carrying a token first, at a cost that does not grow with
 *   how common the token is. No per-row token counts are kept (columnsize=0): they serve only
 *   ranking functions, which the unranked lookup never calls, and writing them was a quarter of
 *   the full-text build. Nor positions (detail=none): every query is one quoted word, which
 *   needs only the list of rows carrying it (the file is 2% smaller at 300,000 entities).
 * - vocab: alias tokens with document frequency and an id (loaded whole on open). Their
 *   deletion variants for the fuzzy path (symmetric deletion: one or two deletions on the
 *   table's side, see deletions.ts) are in the hot store, as variant -> token id.
 * - idf: document frequency of each context term, and its id in the hot store's term lists.
 * - hot: typed arrays loaded whole on open (see hot.ts): class, prior, context norm, context
 *   term ids and a name-token signature per entity, full-text position -> entity, and the
 *   hashed key and deletion-variant indexes (see string-index.ts), so that the many probes a
 *   mention makes, most of them for keys that do not exist, never reach SQLite, the word
 *   index of alias_fts's rows (see postings.ts), which answers token search in memory, and
 *   every entity's normalized name forms (see names.ts), which scoring reads, and its table id
 *   and name (see display.ts), which the output shows.
 */

/** Identifies a hawser KB among SQLite files. */
export const KB_FORMAT = "hawser-kb";
/** Bumped on any incompatible schema change; a KB with a newer version is refused. */
export const SCHEMA_VERSION = 8;

export const SCHEMA_SQL = `
CREATE TABLE meta (key TEXT PRIMARY KEY, value TEXT NOT NULL) WITHOUT ROWID;
CREATE TABLE entities (
  eid INTEGER PRIMARY KEY,
  id TEXT NOT NULL,
  name TEXT NOT NULL,
  type TEXT NOT NULL,
  class TEXT NOT NULL,
  prior REAL NOT NULL,
  forms TEXT NOT NULL,
  attributes TEXT NOT NULL
);
CREATE TABLE entity_details (eid INTEGER PRIMARY KEY, description TEXT NOT NULL, keys TEXT NOT NULL);
CREATE VIEW keys AS
  SELECT k.value ->> 1 AS key, e.class AS class, k.value ->> 0 AS kind, d.eid AS eid
  FROM entity_details d JOIN entities e ON e.eid = d.eid, json_each(d.keys) k;
CREATE VIRTUAL TABLE alias_fts USING fts5(tokens, content='', columnsize=0, detail=none, tokenize='unicode61 remove_diacritics 0');
CREATE TABLE vocab (token TEXT PRIMARY KEY, df INTEGER NOT NULL, id INTEGER NOT NULL) WITHOUT ROWID;
CREATE TABLE idf (term TEXT PRIMARY KEY, df INTEGER NOT NULL, id INTEGER NOT NULL) WITHOUT ROWID;
CREATE TABLE hot (name TEXT NOT NULL, part INTEGER NOT NULL, data BLOB NOT NULL, PRIMARY KEY (name, part)) WITHOUT ROWID;
`;

/**
 * Indexes created after the bulk load (faster than maintaining them row by row): table id ->
 * entity, for `eidOf` and for evaluation against gold links.
 */
export const INDEX_SQL = `
CREATE UNIQUE INDEX entities_id ON entities(id);
`;

/** Key kinds of the `keys` view. */
export type KeyKind = "exact" | "ocr" | "acronym" | "initials";

/** Separators of the packed `entities.forms` column: fields of one name, and names. */
const FIELD = "\u001f";
const RECORD = "\u001e";

export interface PackedForm {
  text: string;
  key: string;
  full: string;
  ocr: string;
  canonical: boolean;
}

/** Pack an entity's name forms into one text value (control characters never occur in folded forms). */
export function packForms(forms: readonly PackedForm[]): string {
  return forms
    .map((f) =>
      [f.text.replace(/[\u001e\u001f]/g, " "), f.key, f.full, f.ocr, f.canonical ? "1" : "0"].join(FIELD),
    )
    .join(RECORD);
}

/** A packed form as read back: with its position among the entity's names and its key's tokens. */
export interface UnpackedForm extends PackedForm {
  /** Position among the entity's names (0: the canonical name). */
  aid: number;
  tokens: string[];
}

export function unpackForms(packed: string): UnpackedForm[] {
  if (packed === "") return [];
  return packed.split(RECORD).map((r, aid) => {
    const [text = "", key = "", full = "", ocr = "", canonical = "0"] = r.split(FIELD);
    return { aid, text, key, full, ocr, canonical: canonical === "1", tokens: key.split(" ") };
  });
}
