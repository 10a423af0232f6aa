/**
 * Name-similarity functions the scorer calls for every (mention, candidate alias) pair.
 *
 * All functions are pure and compare strings code unit by code unit, without any folding: callers
 * pass names that the normalize stage has already folded (case, diacritics, punctuation). They are
 * written to allocate nothing per call on the hot path: the Jaro match flags live in module-level
 * typed arrays that grow on demand and are reused.
 */
import { distance as levenshteinDistance } from "fastest-levenshtein";
import { PET_NAMES } from "../normalize/lexicon.js";

// ---------------------------------------------------------------------------------------------
// Jaro and Jaro-Winkler
// ---------------------------------------------------------------------------------------------

/** Initial size of the reusable match-flag buffers; names are rarely longer than this. */
const INITIAL_FLAG_CAPACITY = 64;

/** Match flags for the first and second string of `jaro`, reused across calls. */
let flagsA = new Uint8Array(INITIAL_FLAG_CAPACITY);
let flagsB = new Uint8Array(INITIAL_FLAG_CAPACITY);

/** Grows the reusable flag buffers so they hold at least `la` and `lb` entries. */
function ensureFlagCapacity(la: number, lb: number): void {
  if (flagsA.length < la) flagsA = new Uint8Array(Math.max(la, flagsA.length * 2));
  if (flagsB.length < lb) flagsB = new Uint8Array(Math.max(lb, flagsB.length * 2));
}

/**
 * Jaro similarity in [0, 1].
 *
 * Two characters match when they are equal and no farther apart than
 * floor(max(|a|, |b|) / 2) - 1 positions (never less than 0); t is half the number of matched
 * characters that appear in a different order. jaro = (m/|a| + m/|b| + (m - t)/m) / 3, and 0 when
 * nothing matches. Two identical strings (including two empty strings) score 1; an empty string
 * against a non-empty one scores 0.
 */
export function jaro(a: string, b: string): number {
  if (a === b) return 1;
  const la = a.length;
  const lb = b.length;
  if (la === 0 || lb === 0) return 0;

  const window = Math.max(0, Math.floor(Math.max(la, lb) / 2) - 1);
  ensureFlagCapacity(la, lb);
  const fa = flagsA;
  const fb = flagsB;
  fa.fill(0, 0, la);
  fb.fill(0, 0, lb);

  let matches = 0;
  for (let i = 0; i < la; i++) {
    const lo = i > window ? i - window : 0;
    const hi = Math.min(i + window + 1, lb);
    const ch = a.charCodeAt(i);
    for (let k = lo; k < hi; k++) {
      if (fb[k] === 0 && b.charCodeAt(k) === ch) {
        fa[i] = 1;
        fb[k] = 1;
        matches++;
        break;
      }
    }
  }
  if (matches === 0) return 0;

  // Count matched characters that are out of order; each transposition shows up twice.
  let outOfOrder = 0;
  let k = 0;
  for (let i = 0; i < la; i++) {
    if (fa[i] === 0) continue;
    while (fb[k] === 0) k++;
    if (a.charCodeAt(i) !== b.charCodeAt(k)) outOfOrder++;
    k++;
  }
  const transpositions = outOfOrder / 2;
  return (matches / la + matches / lb + (matches - transpositions) / matches) / 3;
}

/** Options of `jaroWinkler`. */
export interface JaroWinklerOptions {
  /**
   * Winkler's scaling factor p: how much each common-prefix character moves the score towards 1.
   * Default 0.1 (Winkler's value). Must satisfy 0 <= prefixScale * maxPrefix <= 1 so the result
   * stays in [0, 1].
   */
  prefixScale?: number;
  /** Longest common prefix that earns the boost. Default 4 (Winkler's value). */
  maxPrefix?: number;
  /**
   * The prefix boost is applied only when the Jaro similarity is greater than this. Default 0.7,
   * as in Winkler's paper: a shared first letter should not lift an otherwise poor match. Pass 0 to
   * boost always (what some libraries do, e.g. natural's implementation).
   */
  boostThreshold?: number;
}

/** Winkler's scaling factor p for each common-prefix character. */
export const DEFAULT_PREFIX_SCALE = 0.1;
/** Winkler's cap on the common prefix length that earns the boost. */
export const DEFAULT_MAX_PREFIX = 4;
/** Winkler's threshold: only pairs whose Jaro similarity exceeds it get the prefix boost. */
export const DEFAULT_BOOST_THRESHOLD = 0.7;

/**
 * Jaro-Winkler similarity in [0, 1]: jaro + l * p * (1 - jaro), where l is the length of the common
 * prefix (at most `maxPrefix`), applied when jaro > `boostThreshold`. See `JaroWinklerOptions`.
 * Throws a RangeError when the options would take the result out of [0, 1].
 */
export function jaroWinkler(a: string, b: string, opts?: JaroWinklerOptions): number {
  const p = opts?.prefixScale ?? DEFAULT_PREFIX_SCALE;
  const maxPrefix = opts?.maxPrefix ?? DEFAULT_MAX_PREFIX;
  const threshold = opts?.boostThreshold ?? DEFAULT_BOOST_THRESHOLD;
  if (opts !== undefined && !(p >= 0 && maxPrefix >= 0 && p * maxPrefix <= 1)) {
    throw new RangeError(
      `jaroWinkler: prefixScale (${p}) and maxPrefix (${maxPrefix}) must be >= 0 with prefixScale * maxPrefix <= 1`,
    );
  }
  const j = jaro(a, b);
  if (!(j > threshold) || j === 1) return j;
  const limit = Math.min(maxPrefix, a.length, b.length);
  let prefix = 0;
  while (prefix < limit && a.charCodeAt(prefix) === b.charCodeAt(prefix)) prefix++;
  return j + prefix * p * (1 - j);
}

// ---------------------------------------------------------------------------------------------
// Levenshtein
// ---------------------------------------------------------------------------------------------

/**
 * Normalized Levenshtein similarity in [0, 1]: 1 - distance / max(|a|, |b|), and 1 for two empty
 * strings. The edit distance (insertions, deletions, substitutions, each costing 1) comes from
 * `fastest-levenshtein`.
 */
export function levenshteinSimilarity(a: string, b: string): number {
  const longer = Math.max(a.length, b.length);
  if (longer === 0) return 1;
  return 1 - levenshteinDistance(a, b) / longer;
}

// ---------------------------------------------------------------------------------------------
// Token sets
// ---------------------------------------------------------------------------------------------

/**
 * Lowest Jaro-Winkler similarity at which two tokens count as the same word in
 * `tokenSetSimilarity`. At 0.88 one OCR slip (a wrong, dropped or doubled letter) in a token of six
 * or more letters still matches (e.g. "aldous" / "aldons" ≈ 0.93), while short unrelated words
 * ("hill" / "hall" ≈ 0.85) do not; in a five-letter token a slip in the first letter
 * already falls below it ("aldous" / "bldous" ≈ 0.889 passes, "grain" / "brain" does not).
 */
export const TOKEN_MATCH_MIN_JW = 0.88;

/**
 * Credit for a single-letter token (an initial) against a token that starts with that letter:
 * high enough that "j aldous" stays close to "josiah aldous", below a full match because the
 * initial fits every name with that letter.
 */
export const INITIAL_MATCH_CREDIT = 0.8;

/**
 * Credit for a token that is a contraction of the other ("intl" / "international", "rgnl" /
 * "regional", "natl" / "national", see isContraction), when their Jaro-Winkler similarity is
 * below the match threshold: just over it, below a slip of one letter in a long word, since a
 * contraction fits every word with those letters in that order.
 */
export const CONTRACTION_MATCH_CREDIT = 0.9;

/**
 * Credit for a given name against its pet form ("harry" / "henry", "peggy" / "margaret", see
 * PET_NAMES): as a contraction's, one person's name though spelled otherwise.
 */
export const PET_NAME_MATCH_CREDIT = CONTRACTION_MATCH_CREDIT;

/** Each pet form and each name it stands for -> the other side of the pair (PET_NAMES, both ways). */
const PET_PAIRS: ReadonlyMap<string, ReadonlySet<string>> = (() => {
  const out = new Map<string, Set<string>>();
  const put = (a: string, b: string) => {
    const set = out.get(a) ?? new Set<string>();
    set.add(b);
    out.set(a, set);
  };
  for (const [pet, names] of Object.entries(PET_NAMES))
    for (const name of names) {
      put(pet, name);
      put(name, pet);
    }
  return out;
})();

/** True when one token is a pet form of the other (PET_NAMES). */
export function petForms(x: string, y: string): boolean {
  return PET_PAIRS.get(x)?.has(y) ?? false;
}

/** True when two tokens are pet forms of one name ("hal" and "harry", both Henry's). */
export function petFormsOfOneName(x: string, y: string): boolean {
  const nx = PET_NAMES[x];
  const ny = PET_NAMES[y];
  return nx !== undefined && ny !== undefined && nx.some((name) => ny.includes(name));
}

/**
 * True when `short` is a contraction of `long`: at least three letters, the same first and last
 * letters, and the letters between found in `long` in the same order ("intl" for
 * "international", "saml" for "samuel", "ldg" for "landing").
 */
export function isContraction(short: string, long: string): boolean {
  if (short.length < 3 || short.length >= long.length) return false;
  if (short[0] !== long[0] || short[short.length - 1] !== long[long.length - 1]) return false;
  let j = 1;
  for (let i = 1; i < long.length - 1 && j < short.length - 1; i++) if (long[i] === short[j]) j++;
  return j === short.length - 1;
}

/** Similarity of two tokens as `tokenSetSimilarity` counts it: 0 below the match threshold. */
function tokenPairScore(x: string, y: string): number {
  if (x === y) return 1;
  const lx = x.length;
  const ly = y.length;
  if (lx === 1 || ly === 1) {
    if (lx === 0 || ly === 0) return 0;
    return x.charCodeAt(0) === y.charCodeAt(0) ? INITIAL_MATCH_CREDIT : 0;
  }
  const s = jaroWinkler(x, y);
  if (s >= TOKEN_MATCH_MIN_JW) return s;
  if (lx < ly ? isContraction(x, y) : isContraction(y, x)) return CONTRACTION_MATCH_CREDIT;
  return petForms(x, y) ? PET_NAME_MATCH_CREDIT : 0;
}

/** Reusable "already matched" flags over the longer token list. */
let usedTokens = new Uint8Array(INITIAL_FLAG_CAPACITY);

/** Orders token lists element by element, then by length; used to pick roles deterministically. */
function compareTokenLists(a: readonly string[], b: readonly string[]): number {
  const n = Math.min(a.length, b.length);
  for (let i = 0; i < n; i++) {
    const x = a[i]!;
    const y = b[i]!;
    if (x !== y) return x < y ? -1 : 1;
  }
  return a.length - b.length;
}

/**
 * Fuzzy Dice coefficient over two token multisets, in [0, 1].
 *
 * Each token of the shorter list is matched greedily, in order, to its best still-unused partner in
 * the longer list (ties go to the earlier partner). A pair counts with its Jaro-Winkler similarity
 * when that is at least `TOKEN_MATCH_MIN_JW`; a single-letter token (an initial) counts
 * `INITIAL_MATCH_CREDIT` against a token starting with that letter. Result: 2 * sum / (|a| + |b|);
 * 0 when either list is empty. When both lists have the same length the roles are fixed by a
 * deterministic order of the lists, so the function is symmetric.
 */
export function tokenSetSimilarity(a: readonly string[], b: readonly string[]): number {
  const total = a.length + b.length;
  if (a.length === 0 || b.length === 0) return 0;
  let short = a;
  let long = b;
  if (a.length > b.length || (a.length === b.length && compareTokenLists(a, b) > 0)) {
    short = b;
    long = a;
  }
  const nLong = long.length;
  if (usedTokens.length < nLong) usedTokens = new Uint8Array(Math.max(nLong, usedTokens.length * 2));
  const used = usedTokens;
  used.fill(0, 0, nLong);

  let sum = 0;
  for (let i = 0; i < short.length; i++) {
    const x = short[i]!;
    let best = 0;
    let bestAt = -1;
    for (let k = 0; k < nLong; k++) {
      if (used[k] === 1) continue;
      const s = tokenPairScore(x, long[k]!);
      if (s > best) {
        best = s;
        bestAt = k;
        if (s === 1) break;
      }
    }
    if (bestAt >= 0) {
      used[bestAt] = 1;
      sum += best;
    }
  }
  return (2 * sum) / total;
}

// ---------------------------------------------------------------------------------------------
// Initials
// ---------------------------------------------------------------------------------------------

/**
 * Lowest Jaro-Winkler similarity at which a mention's surname (or a spelled-out given name)
 * counts as the alias's in `initialsCompatible`. Stricter than `TOKEN_MATCH_MIN_JW` because the
 * initials already carry little evidence: the surname has to.
 */
export const INITIALS_SURNAME_MIN_JW = 0.92;

/** True when two full (not single-letter) name tokens are the same word, allowing a slight slip. */
function sameNameToken(x: string, y: string): boolean {
  return x === y || jaroWinkler(x, y) >= INITIALS_SURNAME_MIN_JW;
}

/** True when mention given-name token `m` can stand for alias given-name token `g`. */
function givenNameFits(m: string, g: string): boolean {
  if (m.length === 0 || g.length === 0) return false;
  if (m.length === 1) return m.charCodeAt(0) === g.charCodeAt(0);
  if (g.length === 1) return false; // a spelled-out name cannot stand for a bare initial
  return sameNameToken(m, g);
}

/**
 * True when the mention's tokens read as the alias with some given names shortened to initials.
 *
 * Tokens are normalized name tokens in "given names ... surname" order (dots already removed, so
 * an initial is a one-letter token). The rules:
 * - the mention has at least two tokens and at least one of its given names is an initial (a lone
 *   surname is not initials; token overlap handles it);
 * - the last tokens (surnames) are equal or have Jaro-Winkler >= `INITIALS_SURNAME_MIN_JW`;
 * - the mention's given names map, in order, onto the alias's given names: an initial fits a name
 *   starting with that letter, a spelled-out name fits the same name; the first given names must
 *   correspond, later alias given names (middle names) may be omitted.
 * Example: "j h aldous" and "j aldous" fit "josiah henry aldous"; "h aldous" does not fit
 * "josiah aldous".
 */
export function initialsCompatible(mention: readonly string[], alias: readonly string[]): boolean {
  const nm = mention.length;
  const na = alias.length;
  if (nm < 2 || na < 2 || nm > na) return false;
  let hasInitial = false;
  for (let i = 0; i < nm - 1; i++) {
    if (mention[i]!.length === 1) {
      hasInitial = true;
      break;
    }
  }
  if (!hasInitial) return false;
  const mSurname = mention[nm - 1]!;
  const aSurname = alias[na - 1]!;
  if (mSurname.length < 2 || !sameNameToken(mSurname, aSurname)) return false;
  if (!givenNameFits(mention[0]!, alias[0]!)) return false;
  // Greedy leftmost subsequence match of the remaining given names; leftmost is optimal because
  // each mention token is tested against alias tokens independently.
  let k = 1;
  for (let i = 1; i < nm - 1; i++) {
    const m = mention[i]!;
    while (k < na - 1 && !givenNameFits(m, alias[k]!)) k++;
    if (k >= na - 1) return false;
    k++;
  }
  return true;
}
