/**
 * Context terms: the words of a mention's context, or of an entity's description and attributes,
 * reduced to comparable stems for the TF-IDF context feature.
 */
import { NON_ASCII } from "../normalize/fold.js";
import { porterStem } from "./porter.js";
import { ENGLISH_STOPWORDS } from "./stopwords.js";

/** English stopwords (see stopwords.ts). */
export const STOPWORDS: ReadonlySet<string> = new Set(ENGLISH_STOPWORDS);

/** Tokens shorter than this carry no context (stray letters, OCR specks). */
const MIN_TERM_LENGTH = 2;
/**
 * Tokens longer than this carry no context either: no word of a language is (the longest in
 * English dictionaries has 45 letters), and a run of thousands of letters (a garbled scan, a
 * pasted blob) is no word to stem (the stemmer once used took quadratic time on one).
 */
export const MAX_TERM_LENGTH = 64;

/**
 * Four-digit numbers in this range are kept as terms: years carry context in historical archives
 * ("the 1897 flood", "founded 1902"), while other bare numbers (prices, page numbers) are noise.
 */
export const MIN_YEAR = 1000;
export const MAX_YEAR = 2099;
/** Digits in a year term. */
const YEAR_DIGITS = 4;

/**
 * Most stems memoized. The same words recur across every mention and entity, so a cache of this
 * size holds the working vocabulary of a large batch (tens of thousands of distinct words) while
 * staying a few megabytes; when full, the oldest entry is evicted.
 */
export const STEM_CACHE_SIZE = 50_000;

const stemCache = new Map<string, string>();

/** Porter stem of a lowercase token, memoized in a bounded map. */
export function stem(token: string): string {
  const hit = stemCache.get(token);
  if (hit !== undefined) return hit;
  const stemmed = porterStem(token);
  if (stemCache.size >= STEM_CACHE_SIZE) {
    const oldest = stemCache.keys().next();
    if (oldest.done !== true) stemCache.delete(oldest.value);
  }
  stemCache.set(token, stemmed);
  return stemmed;
}

/** Combining marks left after NFKD decomposition (accents, diaeresis...). */
const COMBINING_MARKS = /\p{M}+/gu;
/** Separators between terms: anything that is neither a letter nor a digit. */
const NON_WORD = /[^\p{L}\p{N}]+/u;

const CODE_0 = 48; // "0"
const CODE_9 = 57; // "9"

/** True when every character of `token` is an ASCII digit. */
function isAllDigits(token: string): boolean {
  for (let i = 0; i < token.length; i++) {
    const c = token.charCodeAt(i);
    if (c < CODE_0 || c > CODE_9) return false;
  }
  return true;
}

/** Unicode fold used for context words: lowercase, NFKD, combining marks removed. */
export function foldText(text: string): string {
  // ASCII text is its own NFKD form and has no combining marks (see NON_ASCII).
  if (!NON_ASCII.test(text)) return text.toLowerCase();
  return text.toLowerCase().normalize("NFKD").replace(COMBINING_MARKS, "");
}

/**
 * Splits text into context terms, in text order, duplicates kept (term frequency matters):
 * fold (lowercase, NFKD, strip combining marks), split on anything that is not a letter or digit,
 * drop tokens shorter than 2 or longer than 64 characters and English stopwords (stopwords.ts), drop pure numbers
 * except years 1000-2099, and Porter-stem the rest. Mixed tokens ("1st", "no5") are kept.
 */
export function contextTerms(text: string): string[] {
  const out: string[] = [];
  if (text.length === 0) return out;
  for (const token of foldText(text).split(NON_WORD)) {
    if (token.length < MIN_TERM_LENGTH || token.length > MAX_TERM_LENGTH || STOPWORDS.has(token)) continue;
    if (isAllDigits(token)) {
      if (token.length === YEAR_DIGITS) {
        const year = Number(token);
        if (year >= MIN_YEAR && year <= MAX_YEAR) out.push(token);
      }
      continue;
    }
    out.push(stem(token));
  }
  return out;
}
