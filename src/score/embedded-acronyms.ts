/**
 * Acronyms inside a name: "U.S. Virgin Islands" against "United States Virgin Islands", "N.Y.
 * Central Railway" against "New York Central Railway". The normalizer joins dotted initials into
 * one token ("us", "ny"); token comparison would then see one unmatched token on one side and two
 * on the other. Here a run of words whose first letters spell a short token of the other name is
 * read as that token, so the two names compare token for token.
 */
import { ACRONYM_SKIP } from "../normalize/lexicon.js";

/**
 * Letters of an embedded acronym read: from two ("us", "ny") to five. One letter is an initial
 * (persons' initials are compared by `initialsCompatible`); longer runs are rare inside names.
 */
const MIN_EMBEDDED_LETTERS = 2;
const MAX_EMBEDDED_LETTERS = 5;

/**
 * `tokens` with each run of words whose first letters spell a token of `other` replaced by that
 * token; the same array when there is none (the common case allocates nothing).
 *
 * A run is two or more words of two letters or more (single letters are initials, not words),
 * consecutive except for joiner words inside it ("Bank of New Zealand" spells "bnz"). A token of
 * `other` that `tokens` already holds is not read as an acronym: it matches as itself.
 */
export function foldEmbeddedAcronyms(tokens: readonly string[], other: readonly string[]): readonly string[] {
  if (tokens.length < MIN_EMBEDDED_LETTERS) return tokens;
  let out: readonly string[] = tokens;
  for (const acronym of other) {
    if (acronym.length < MIN_EMBEDDED_LETTERS || acronym.length > MAX_EMBEDDED_LETTERS) continue;
    if (!isPlainLetters(acronym) || out.includes(acronym)) continue;
    const run = runSpelling(out, acronym);
    if (run === null) continue;
    out = [...out.slice(0, run.start), acronym, ...out.slice(run.end)];
  }
  return out;
}

/** The first run of `tokens` whose words' first letters spell `acronym`: [start, end), or null. */
function runSpelling(tokens: readonly string[], acronym: string): { start: number; end: number } | null {
  const first = acronym.charCodeAt(0);
  for (let start = 0; start + acronym.length <= tokens.length; start++) {
    const head = tokens[start]!;
    if (head.length < 2 || head.charCodeAt(0) !== first || ACRONYM_SKIP.has(head)) continue;
    let spelled = 1;
    let end = start + 1;
    while (end < tokens.length && spelled < acronym.length) {
      const t = tokens[end]!;
      if (ACRONYM_SKIP.has(t)) {
        end++;
        continue;
      }
      if (t.length < 2 || t.charCodeAt(0) !== acronym.charCodeAt(spelled)) break;
      spelled++;
      end++;
    }
    if (spelled === acronym.length) return { start, end };
  }
  return null;
}

/** True for a token of the letters a to z only (digits and other scripts are not read as acronyms). */
function isPlainLetters(t: string): boolean {
  for (let i = 0; i < t.length; i++) {
    const c = t.charCodeAt(i);
    if (c < 97 || c > 122) return false;
  }
  return true;
}

/**
 * True when two names are the same words once an acronym inside one of them is read: "T.V.
 * Railway" and "Tolley Valley Railway", "Virgin Islands U.S." and "United States Virgin Islands"
 * (any order). An abbreviated reading as strong as a whole-name acronym, so the abbreviation
 * feature counts it.
 */
export function sameWordsWithEmbeddedAcronyms(a: readonly string[], b: readonly string[]): boolean {
  const fa = foldEmbeddedAcronyms(a, b);
  const fb = foldEmbeddedAcronyms(b, fa);
  if ((fa === a && fb === b) || fa.length !== fb.length) return false;
  const rest = [...fb];
  for (const t of fa) {
    const at = rest.indexOf(t);
    if (at < 0) return false;
    rest.splice(at, 1);
  }
  return true;
}
