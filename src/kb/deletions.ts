/**
 * Deletion variants for the fuzzy candidate path (the symmetric-deletion method: a token and a
 * misspelling of it within a small edit distance share at least one variant, so a lookup of the
 * mention token's variants finds the table tokens it may be a misreading of).
 *
 * The mention side always uses one deletion. The table side uses two for tokens of
 * TWO_DELETION_MIN_LENGTH letters or more, while the vocabulary's variants fit in
 * MAX_TABLE_VARIANTS: then a table token is found when OCR dropped two of its letters
 * ("hastnmere" for "halstanmere") or dropped one and misread another ("wiekfenhom" for
 * "wickfenholm"), which one deletion on each side cannot see. At 1,000,000 entities this raised
 * pairs completeness from 0.965 to 0.976 at the same linking speed, for 22 MB more memory
 * (benchmarks/README.md).
 */

/** Tokens shorter than this are not indexed for fuzzy lookup: one edit in 3 letters is another word. */
export const FUZZY_MIN_TOKEN_LENGTH = 4;

/** Table tokens at least this long get two-deletion variants (two edits in five letters is another word). */
export const TWO_DELETION_MIN_LENGTH = 6;

/**
 * Most table-side variants (8 bytes of memory each when linking). A vocabulary whose two-deletion
 * variants would exceed it (several hundred thousand long tokens) is indexed with one deletion.
 */
export const MAX_TABLE_VARIANTS = 8_000_000;

/** The token itself and every string made by deleting one character from it. */
export function deletionVariants(token: string): string[] {
  const out = new Set<string>([token]);
  for (let i = 0; i < token.length; i++) out.add(token.slice(0, i) + token.slice(i + 1));
  return [...out];
}

/** The token and every string made by deleting one or two of its characters. */
export function twoDeletionVariants(token: string): string[] {
  const out = new Set<string>();
  for (const once of deletionVariants(token)) for (const v of deletionVariants(once)) out.add(v);
  return [...out];
}

/** Most variants a token of this length can have with `deletions` deletions (an upper bound). */
function variantBound(length: number, deletions: 1 | 2): number {
  return deletions === 1 ? length + 1 : 1 + length + (length * (length - 1)) / 2;
}

/**
 * How many deletions the table side of a vocabulary is indexed with: 2 when the two-deletion
 * variants of its long tokens surely fit in `maxVariants`, else 1.
 */
export function tableDeletions(tokens: Iterable<string>, maxVariants = MAX_TABLE_VARIANTS): 1 | 2 {
  let bound = 0;
  for (const t of tokens) {
    if (t.length < FUZZY_MIN_TOKEN_LENGTH) continue;
    bound += variantBound(t.length, t.length >= TWO_DELETION_MIN_LENGTH ? 2 : 1);
    if (bound > maxVariants) return 1;
  }
  return 2;
}

/** The variants a table token is indexed under, given the vocabulary's depth (see tableDeletions). */
export function tableVariants(token: string, deletions: 1 | 2): string[] {
  return deletions === 2 && token.length >= TWO_DELETION_MIN_LENGTH
    ? twoDeletionVariants(token)
    : deletionVariants(token);
}
