/**
 * The Porter stemmer: M. F. Porter, "An algorithm for suffix stripping", Program 14(3), 1980,
 * pp. 130-137, with the two changes of Porter's own later reference version (step 2 reads
 * "bli" -> "ble" where the paper has "abli" -> "able", and adds "logi" -> "log").
 *
 * Terms of the paper: a consonant is a letter other than a, e, i, o, u, and other than a y that
 * follows a consonant; any word is [C](VC)^m[V], and m is its measure. In each step the rule with
 * the longest matching suffix is the one tried; when its condition fails, the step does nothing.
 * Input: a lower-case word of ASCII letters (other characters count as consonants).
 */

/** Words this short are left as they are (the reference version's rule). */
const MIN_STEMMED_LENGTH = 3;

/** Whether a letter (char code) is one of a, e, i, o, u. */
function isPlainVowel(code: number): boolean {
  return code === 97 || code === 101 || code === 105 || code === 111 || code === 117; // a e i o u
}

const Y = 121;

/**
 * Whether w[i] is a consonant in the paper's sense. A y is one at the start of the word or after
 * a vowel, so along a run of y's the answer alternates from the letter before the run: counted,
 * not recursed, so a long run costs no stack.
 */
function isConsonant(w: string, i: number): boolean {
  const code = w.charCodeAt(i);
  if (code !== Y) return !isPlainVowel(code);
  let first = i;
  while (first > 0 && w.charCodeAt(first - 1) === Y) first--;
  // The run's first y is a consonant at the start of the word or after a vowel.
  const firstIsConsonant = first === 0 || isPlainVowel(w.charCodeAt(first - 1));
  return (i - first) % 2 === 0 ? firstIsConsonant : !firstIsConsonant;
}

/** The measure m of w[0, end): the number of vowel-consonant sequences. */
function measure(w: string, end: number): number {
  let m = 0;
  let i = 0;
  while (i < end && isConsonant(w, i)) i++;
  while (i < end) {
    while (i < end && !isConsonant(w, i)) i++;
    if (i >= end) break;
    while (i < end && isConsonant(w, i)) i++;
    m++;
  }
  return m;
}

/** *v*: w[0, end) holds a vowel. */
function hasVowel(w: string, end: number): boolean {
  for (let i = 0; i < end; i++) if (!isConsonant(w, i)) return true;
  return false;
}

/** *d: w[0, end) ends with a double consonant. */
function endsDoubleConsonant(w: string, end: number): boolean {
  return end >= 2 && w[end - 1] === w[end - 2] && isConsonant(w, end - 1);
}

/** *o: w[0, end) ends consonant-vowel-consonant, the last consonant not w, x or y. */
function endsCvc(w: string, end: number): boolean {
  if (end < 3) return false;
  if (!isConsonant(w, end - 1) || isConsonant(w, end - 2) || !isConsonant(w, end - 3)) return false;
  const last = w[end - 1];
  return last !== "w" && last !== "x" && last !== "y";
}

/** A rule: suffix, replacement. */
type Rule = readonly [string, string];

/**
 * Tries the rule with the longest suffix `w` ends with (rules given longest first within a step,
 * so the first match is the longest); replaces it when the stem before it has measure > `minM`.
 */
function replaceLongest(w: string, rules: readonly Rule[], minM: number): string {
  for (const [suffix, replacement] of rules) {
    if (!w.endsWith(suffix)) continue;
    const stem = w.length - suffix.length;
    return measure(w, stem) > minM ? w.slice(0, stem) + replacement : w;
  }
  return w;
}

/** Rules sorted longest suffix first, so that the first to match is the longest. */
const longestFirst = (rules: Rule[]): readonly Rule[] => rules.sort((a, b) => b[0].length - a[0].length);

const STEP2: readonly Rule[] = longestFirst([
  ["ational", "ate"],
  ["tional", "tion"],
  ["enci", "ence"],
  ["anci", "ance"],
  ["izer", "ize"],
  ["bli", "ble"],
  ["alli", "al"],
  ["entli", "ent"],
  ["eli", "e"],
  ["ousli", "ous"],
  ["ization", "ize"],
  ["ation", "ate"],
  ["ator", "ate"],
  ["alism", "al"],
  ["iveness", "ive"],
  ["fulness", "ful"],
  ["ousness", "ous"],
  ["aliti", "al"],
  ["iviti", "ive"],
  ["biliti", "ble"],
  ["logi", "log"],
]);

const STEP3: readonly Rule[] = longestFirst([
  ["icate", "ic"],
  ["ative", ""],
  ["alize", "al"],
  ["iciti", "ic"],
  ["ical", "ic"],
  ["ful", ""],
  ["ness", ""],
]);

/** Step 4's suffixes, removed when the stem's measure is above 1 ("ion" also needs s or t before it). */
const STEP4 = [
  "al",
  "ance",
  "ence",
  "er",
  "ic",
  "able",
  "ible",
  "ant",
  "ement",
  "ment",
  "ent",
  "ion",
  "ou",
  "ism",
  "ate",
  "iti",
  "ous",
  "ive",
  "ize",
].sort((a, b) => b.length - a.length);

function step1a(w: string): string {
  if (w.endsWith("sses")) return w.slice(0, -2);
  if (w.endsWith("ies")) return w.slice(0, -2);
  if (w.endsWith("ss")) return w;
  if (w.endsWith("s")) return w.slice(0, -1);
  return w;
}

function step1b(w: string): string {
  if (w.endsWith("eed")) return measure(w, w.length - 3) > 0 ? w.slice(0, -1) : w;
  let stem: string;
  if (w.endsWith("ed") && hasVowel(w, w.length - 2)) stem = w.slice(0, -2);
  else if (w.endsWith("ing") && hasVowel(w, w.length - 3)) stem = w.slice(0, -3);
  else return w;
  if (stem.endsWith("at") || stem.endsWith("bl") || stem.endsWith("iz")) return `${stem}e`;
  const n = stem.length;
  if (endsDoubleConsonant(stem, n)) {
    const last = stem[n - 1];
    return last === "l" || last === "s" || last === "z" ? stem : stem.slice(0, -1);
  }
  if (measure(stem, n) === 1 && endsCvc(stem, n)) return `${stem}e`;
  return stem;
}

function step1c(w: string): string {
  return w.endsWith("y") && hasVowel(w, w.length - 1) ? `${w.slice(0, -1)}i` : w;
}

function step4(w: string): string {
  for (const suffix of STEP4) {
    if (!w.endsWith(suffix)) continue;
    const stem = w.length - suffix.length;
    if (measure(w, stem) <= 1) return w;
    if (suffix === "ion" && !(stem > 0 && (w[stem - 1] === "s" || w[stem - 1] === "t"))) return w;
    return w.slice(0, stem);
  }
  return w;
}

function step5(w: string): string {
  let out = w;
  if (out.endsWith("e")) {
    const stem = out.length - 1;
    const m = measure(out, stem);
    if (m > 1 || (m === 1 && !endsCvc(out, stem))) out = out.slice(0, stem);
  }
  if (out.endsWith("ll") && measure(out, out.length) > 1) out = out.slice(0, -1);
  return out;
}

/** The Porter stem of a lower-case word. */
export function porterStem(word: string): string {
  if (word.length < MIN_STEMMED_LENGTH) return word;
  let w = step1a(word);
  w = step1b(w);
  w = step1c(w);
  w = replaceLongest(w, STEP2, 0);
  w = replaceLongest(w, STEP3, 0);
  w = step4(w);
  return step5(w);
}
