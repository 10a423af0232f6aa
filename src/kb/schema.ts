/**
 * The KB file: one SQLite database. Version 1 of the schema.
 *
 * - meta: key/value facts (format tag, schema version, normalizer version, source checksum,
 *   counts, fingerprint, largest prior, number of context documents).
 * - entities: one row per table row, holding what scoring reads (the description and the
 *   attributes live in entity_details, so that the rows read per candidate stay small); `terms` holds the stemmed context words of the description
 *   and attributes (sorted, repeated per occurrence) from which TF-IDF vectors are built;
 *   `forms` packs the normalized forms of its names (see packForms), so that scoring reads one
 *   row per candidate.
 * - keys: blocking keys per entity and class: exact, ocr, acronym, initials.
 * - alias_fts: FTS5 over alias core tokens (contentless). Its rowids are positions in order of
 *   falling popularity (prior), mapped to entity ids by fts_rows, so an unranked match returns
 *   the most popular entities carrying a token first, at a cost that does not grow with how
 *   common the token is. No per-row token counts are kept (columnsize=0): they serve only
 *   ranking functions, which the unranked lookup never calls, and writing them was a quarter of
 *   the full-text build.
 * - vocab / deletes: alias tokens with document frequency, and their one-deletion variants for
 *   the fuzzy path (symmetric deletion: two tokens within edit distance ~2 share a variant).
 * - idf: document frequency of each context term.
 * - filters: Bloom filters (see bloom.ts) over blocking keys, deletion variants and alias tokens,
 *   loaded into memory on open so probes for absent keys never reach SQLite.
 */

/** Identifies a hawser KB among SQLite files. */
export const KB_FORMAT = "hawser-kb";
/** Bumped on any incompatible schema change; a KB with a newer version is refused. */
export const SCHEMA_VERSION = 1;

export const SCHEMA_SQL = `
CREATE TABLE meta (key TEXT PRIMARY KEY, value TEXT NOT NULL) WITHOUT ROWID;
CREATE TABLE entities (
  eid INTEGER PRIMARY KEY,
  id TEXT NOT NULL,
  name TEXT NOT NULL,
  type TEXT NOT NULL,
  class TEXT NOT NULL,
  prior REAL NOT NULL,
  terms TEXT NOT NULL,
  ctx_norm REAL NOT NULL DEFAULT 0,
  forms TEXT NOT NULL
);
CREATE TABLE entity_details (eid INTEGER PRIMARY KEY, description TEXT NOT NULL, attributes TEXT NOT NULL);
CREATE TABLE keys (key TEXT NOT NULL, class TEXT NOT NULL, kind TEXT NOT NULL, eid INTEGER NOT NULL);
CREATE VIRTUAL TABLE alias_fts USING fts5(tokens, content='', columnsize=0, detail=column, tokenize='unicode61 remove_diacritics 0');
CREATE TABLE fts_rows (pos INTEGER PRIMARY KEY, eid INTEGER NOT NULL);
CREATE TABLE vocab (token TEXT PRIMARY KEY, df INTEGER NOT NULL) WITHOUT ROWID;
CREATE TABLE deletes (variant TEXT NOT NULL, token TEXT NOT NULL, PRIMARY KEY (variant, token)) WITHOUT ROWID;
CREATE TABLE idf (term TEXT PRIMARY KEY, df INTEGER NOT NULL) WITHOUT ROWID;
CREATE TABLE filters (name TEXT PRIMARY KEY, m INTEGER NOT NULL, k INTEGER NOT NULL, bits BLOB NOT NULL) WITHOUT ROWID;
`;

/**
 * Indexes created after the bulk load (faster than maintaining them row by row). The key index
 * covers every column, so a lookup never touches the table itself.
 */
export const INDEX_SQL = `
CREATE UNIQUE INDEX entities_id ON entities(id);
CREATE INDEX keys_lookup ON keys(key, class, kind, eid);
`;

/** Key kinds stored in `keys.kind`. */
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

export function unpackForms(packed: string): PackedForm[] {
  if (packed === "") return [];
  return packed.split(RECORD).map((r) => {
    const [text = "", key = "", full = "", ocr = "", canonical = "0"] = r.split(FIELD);
    return { text, key, full, ocr, canonical: canonical === "1" };
  });
}
