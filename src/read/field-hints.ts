/**
 * Names people give the mention format's fields in their own files ("label" for the NER label,
 * "mention" for its text): a missing field's look-alike is named in the error, and a look-alike
 * of an optional field the file lacks is reported once as not read, instead of being silently
 * carried along as an extra field.
 */

/** Field of the mentions format -> names that likely mean it (compared in lower case). */
export const LOOKALIKE_FIELDS: Readonly<Record<string, readonly string[]>> = {
  text: ["mention", "surface", "name", "span", "string", "mention_text", "entity_text", "word"],
  type: ["label", "ner", "ner_label", "ner_type", "tag", "entity_type", "entity_label", "category", "class"],
  context: ["sentence", "snippet", "passage", "window", "context_text", "left_context"],
  doc: ["document", "doc_id", "document_id", "docid", "article", "article_id"],
};

/** The field of `present` that looks like `field`, or undefined. */
export function lookalikeOf(field: string, present: Iterable<string>): string | undefined {
  const names = LOOKALIKE_FIELDS[field];
  if (names === undefined) return undefined;
  for (const p of present) if (names.includes(p.toLowerCase())) return p;
  return undefined;
}

/** Optional column of the knowledge table -> names that likely mean it (compared in lower case). */
export const TABLE_LOOKALIKE_COLUMNS: Readonly<Record<string, readonly string[]>> = {
  aliases: [
    "alias",
    "alt_names",
    "altnames",
    "alternate_names",
    "alternative_names",
    "other_names",
    "synonyms",
    "variants",
    "also_known_as",
  ],
  prior: ["population", "popularity", "frequency", "mention_count", "pop"],
  description: ["desc", "abstract", "summary", "about", "bio", "biography"],
};

/** Separators people use in delimited files besides the one hawser reads (comma for CSV, tab for TSV). */
const OTHER_SEPARATORS = [";", "\t", "|", ","] as const;

/**
 * When a header came out as one column that holds another separator ("id;name;type" read as
 * CSV), the likely cause in a few words: the file is separated by that character. Empty
 * otherwise. `delimiter` is the one the file was read with.
 */
export function separatorHint(columns: readonly string[], delimiter: string): string {
  if (columns.length !== 1) return "";
  const other = OTHER_SEPARATORS.find((s) => s !== delimiter && columns[0]!.includes(s));
  if (other === undefined) return "";
  const name = other === "\t" ? "tabs" : `"${other}"`;
  return `; the header reads as one column: the file looks separated by ${name}, and hawser reads CSV separated by commas and TSV by tabs`;
}
