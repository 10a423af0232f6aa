/**
 * One-deletion variants for the fuzzy candidate path (the symmetric-deletion method: a token and a
 * misspelling of it within a small edit distance share at least one variant, so a lookup of the
 * mention token's variants finds the table tokens it may be a misreading of).
 */

/** Tokens shorter than this are not indexed for fuzzy lookup: one edit in 3 letters is another word. */
export const FUZZY_MIN_TOKEN_LENGTH = 4;

/** The token itself and every string made by deleting one character from it. */
export function deletionVariants(token: string): string[] {
  const out = new Set<string>([token]);
  for (let i = 0; i < token.length; i++) out.add(token.slice(0, i) + token.slice(i + 1));
  return [...out];
}
