/**
 * A light sentence splitter for context windows: a sentence ends at `.`, `!` or `?` (with any
 * closing quotes or brackets) followed by whitespace and a capital letter, except after common
 * abbreviations ("St.", "Mr.", "Co.") and single capital initials ("J. Marsh"). Good enough
 * to pick the sentences around a mention; not a linguistic tool.
 */

/** A sentence as a character range [start, end) of the text. */
export interface SentenceRange {
  start: number;
  end: number;
}

/**
 * Abbreviations that end in a period without ending a sentence (common practice; English titles,
 * business and address forms found in gazettes and directories).
 */
export const ABBREVIATIONS: ReadonlySet<string> = new Set([
  "Mr",
  "Mrs",
  "Ms",
  "Messrs",
  "Dr",
  "Rev",
  "Capt",
  "Col",
  "Gen",
  "Lt",
  "Sgt",
  "Maj",
  "Hon",
  "Prof",
  "Sr",
  "Jr",
  "Esq",
  "St",
  "Mt",
  "Ft",
  "Ave",
  "Rd",
  "Co",
  "Corp",
  "Inc",
  "Ltd",
  "Bros",
  "No",
  "Nos",
  "vs",
  "etc",
  "viz",
  "cf",
  "Jan",
  "Feb",
  "Mar",
  "Apr",
  "Aug",
  "Sept",
  "Sep",
  "Oct",
  "Nov",
  "Dec",
]);

/** Candidate boundary: end punctuation, closing quotes/brackets, whitespace, then (after an optional opening quote) a capital. */
const BOUNDARY = /([.!?]+["'”’)\]]*)(\s+)(?=["'“‘(]?\p{Lu})/gu;
/** The word right before a period. */
const LAST_WORD = /([\p{L}\p{N}]+)$/u;
/** A single capital letter: an initial. */
const INITIAL = /^\p{Lu}$/u;

function isAbbreviation(before: string): boolean {
  const word = LAST_WORD.exec(before)?.[1];
  if (word === undefined) return false;
  return ABBREVIATIONS.has(word) || INITIAL.test(word);
}

/** Split `text` into sentence ranges covering its non-blank parts, in order. */
export function splitSentences(text: string): SentenceRange[] {
  const ranges: SentenceRange[] = [];
  let start = 0;
  const push = (end: number): void => {
    const piece = text.slice(start, end);
    const lead = piece.length - piece.trimStart().length;
    const trimmed = piece.trim();
    if (trimmed !== "") ranges.push({ start: start + lead, end: start + lead + trimmed.length });
  };
  for (const match of text.matchAll(BOUNDARY)) {
    const punct = match[1]!;
    const at = match.index;
    if (punct === "." && isAbbreviation(text.slice(start, at))) continue;
    push(at + punct.length);
    start = at + punct.length + match[2]!.length;
  }
  push(text.length);
  return ranges;
}
