/**
 * Unicode and punctuation folding shared by every normalizer: the first step for names and for
 * context words alike.
 */

/** Letters that NFKD does not decompose into a base letter plus marks (common practice list). */
const SPECIAL_LETTERS: Record<string, string> = {
  ß: "ss",
  æ: "ae",
  œ: "oe",
  ø: "o",
  ł: "l",
  đ: "d",
  ð: "d",
  þ: "th",
  ı: "i",
  ĸ: "k",
  ŋ: "n",
};

const COMBINING_MARKS = /\p{M}+/gu;
const SPECIAL_RE = /[ßæœøłđðþıĸŋ]/g;
/** Apostrophes inside words are dropped ("O'Brien" -> "obrien"), not turned into spaces. */
const APOSTROPHES = /['\u2018\u2019\u02bc`´]/g;
/** `&` is spelled out so "Pell & Sons" and "Pell and Sons" fold alike. */
const AMPERSAND = /&/g;
/** Anything that is not a letter or digit separates tokens. */
const SEPARATORS = /[^\p{L}\p{N}]+/gu;

/**
 * Any character outside ASCII. ASCII text is its own NFKD form, has no combining marks and no
 * special letters, so folding it is lowercasing alone, which skips the Unicode normalizer (the
 * dearest step for the short strings names are).
 */
export const NON_ASCII = /[^\u0000-\u007f]/;

/** NFKD, strip diacritics, lowercase, expand special letters. Keeps punctuation. */
export function foldCase(text: string): string {
  if (!NON_ASCII.test(text)) return text.toLowerCase();
  return text
    .normalize("NFKD")
    .replace(COMBINING_MARKS, "")
    .toLowerCase()
    .replace(SPECIAL_RE, (c) => SPECIAL_LETTERS[c] ?? c);
}

/**
 * Split raw text into folded tokens: diacritics stripped, lowercase, apostrophes removed,
 * `&` -> "and", every other punctuation mark a separator. Dots are lost here; callers that need
 * to know about abbreviations look at the raw text.
 */
export function foldTokens(text: string): string[] {
  const folded = foldCase(text).replace(APOSTROPHES, "").replace(AMPERSAND, " and ");
  const out: string[] = [];
  for (const t of folded.split(SEPARATORS)) if (t.length > 0) out.push(t);
  return out;
}

/** Folded text as one string with single spaces. */
export function foldText(text: string): string {
  return foldTokens(text).join(" ");
}
