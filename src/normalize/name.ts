/**
 * Name normalization per entity class. One function, `normalizeName`, turns a raw name or mention
 * text into the forms every later stage uses: folded tokens, a matching key, a full form for
 * string similarity, an OCR-folded key, an acronym reading and initials keys.
 */
import type { EntityClass } from "../types.js";
import { foldTokens } from "./fold.js";
import {
  ACRONYM_SKIP,
  DESIGNATOR_ABBREVIATIONS,
  FEMALE_GIVEN_NAMES,
  GENERATIONAL,
  GIVEN_NAME_ABBREVIATIONS,
  HONORIFICS,
  CLOSING_LEGAL_FORMS,
  LEADING_LEGAL_FORMS,
  LEGAL_FORM_PHRASES,
  LEGAL_FORMS,
  MALE_GIVEN_NAMES,
  PLACE_ABBREVIATIONS,
  PLACE_DESIGNATOR_HEADS,
  PLACE_DESIGNATOR_MODIFIERS,
  POST_NOMINALS,
  TRAILING_DESIGNATOR_HEADS,
  TRAILING_DESIGNATOR_MODIFIERS,
  VESSEL_PREFIXES,
} from "./lexicon.js";
import { ocrFold } from "./ocr.js";

/**
 * Bump when any normalizer output changes, context-term stems included (src/score/porter.ts): a
 * KB records it and a mismatch is reported on open.
 */
export const NORMALIZER_VERSION = "7";

export interface NormalizedName {
  /** Every folded token of the input, nothing removed. */
  folded: string[];
  /**
   * Core tokens: honorifics, generational suffixes, legal forms and place designators removed,
   * abbreviations expanded, order fixed.
   */
  tokens: string[];
  /** `tokens` joined by single spaces: the exact-lookup key. */
  key: string;
  /**
   * Core tokens plus canonical legal form, place designator or suffix (the qualifiers): the form
   * string similarity compares. Equals `key` when the name has no qualifier.
   */
  full: string;
  /** OCR-folded key (see ocr.ts), spaces removed. */
  ocrKey: string;
  /** Generational suffix ("jr", "sr", "ii"...) when present. */
  suffix: string | null;
  /** The letters when the raw text reads as an acronym ("S.G.E." -> "sge"), else null. */
  acronym: string | null;
  /** Acronym formed from the core tokens (2+ tokens), for organizations and places. */
  acronymKey: string | null;
  /** Person names: first initial + surname ("j aldous"); null for other classes or a lone token. */
  initialsKey: string | null;
  /**
   * Core tokens written short, as a word of two letters or more cut off by a period ("Calif.",
   * "Tenn.", "Harrowm."), that the lexicon did not read ("St.", "Co." and the like are read):
   * candidates and scoring may take them for a longer word they begin, or contract (see
   * abbreviates below). Empty for persons, whose short given names the
   * lexicon reads.
   */
  abbreviated: string[];
}

/** A word of two letters or more cut off by a period: "Calif.", "Tenn.", "Md." (not "J." or "S.G.E."). */
const CUT_WORD = /(?<!\p{L})(\p{L}{2,})\.(?!\p{L})/gu;

/**
 * A word contracted with an apostrophe, as clerks write a long place name: its first letter (and
 * perhaps one more), an apostrophe, its ending ("H'mouth" for Harrowmouth, "W'hampton"). After the
 * apostrophe comes a lower-case letter: "O'Brien" and "D'Arcy" are names, not contractions, and a
 * possessive ("Jessop's") has more letters before it.
 */
const APOSTROPHE_CONTRACTION = /(?<!\p{L})(\p{Lu}\p{Ll}?['’]\p{Ll}{3,})(?!\p{L})/gu;

/** The last text cutWords read, and its answer: a mention is normalized once per class. */
let lastCutText = "";
let lastCutWords: ReadonlySet<string> = new Set();

/** The folded words of `text` written short (see NormalizedName.abbreviated). */
function cutWords(text: string): ReadonlySet<string> {
  if (text === lastCutText) return lastCutWords;
  const out = new Set<string>();
  for (const m of text.matchAll(CUT_WORD)) for (const t of foldTokens(m[1]!)) out.add(t);
  for (const m of text.matchAll(APOSTROPHE_CONTRACTION)) for (const t of foldTokens(m[1]!)) out.add(t);
  lastCutText = text;
  lastCutWords = out;
  return out;
}

/** Longest run of letters an acronym may have; longer all-capital words are headlines, not acronyms. */
const MAX_ACRONYM_LETTERS = 6;
/** Shortest acronym worth a key: one letter is an initial, not an acronym. */
const MIN_ACRONYM_LETTERS = 2;

const DOTTED_ACRONYM = /^(?:\p{Lu}\.\s?){2,}\p{Lu}?\.?$/u;
const CAPS_ACRONYM = /^\p{Lu}{2,}$/u;

/** Reads "S.G.E.", "S. G. E.", "SGE" (2-6 capitals, dots optional) as an acronym. */
export function readAcronym(raw: string): string | null {
  const t = raw.trim().replace(/&/g, "");
  if (t.length === 0) return null;
  let letters: string | null = null;
  if (DOTTED_ACRONYM.test(t)) letters = t.replace(/[^\p{Lu}]/gu, "");
  else if (CAPS_ACRONYM.test(t) && t.length <= MAX_ACRONYM_LETTERS) letters = t;
  if (letters === null) return null;
  if (letters.length < MIN_ACRONYM_LETTERS || letters.length > MAX_ACRONYM_LETTERS) return null;
  return letters.toLowerCase();
}

/** First letters of the tokens, joiner words skipped. */
export function acronymOfTokens(tokens: readonly string[]): string {
  let out = "";
  for (const t of tokens) if (!ACRONYM_SKIP.has(t) && t.length > 0) out += t[0];
  return out;
}

/**
 * Parenthesized asides ("Falkland Islands (Malvinas)", "Pell (deceased)") are not part of the name
 * key. The innermost brackets match (no bracket inside), so a run of unclosed brackets in a long
 * text is scanned once rather than once per bracket.
 */
const PARENTHESIZED = /[([{][^()[\]{}]*[)\]}]/g;
/** Nested asides removed, innermost first: "(Malvinas (old))" takes two passes. */
const MAX_ASIDE_NESTING = 3;
/** Leading articles carry no identity: "The Gambia" is "Gambia", "The Pell Line" is "Pell Line". */
const LEADING_ARTICLES: ReadonlySet<string> = new Set(["the"]);
/**
 * Courtesy titles written before a firm's name in running text and directories ("Messrs. Lumb &
 * Sons", "Messrs. Blamire Bros., Ltd."): not part of the name, dropped for organizations as
 * honorifics are for persons (common practice of English commercial writing of the period).
 */
const FIRM_COURTESY_TITLES: ReadonlySet<string> = new Set(["messrs", "mssrs", "messieurs"]);

/**
 * A word broken at the end of a printed line and joined again by the OCR with its hyphen and the
 * line break, or a space, left in: a letter, a hyphen, white space, a lower-case letter ("Har-
 * land", "Sten-\nning"). A hyphen between words ("Stenby-on-Wend") has no space after it, and a
 * compound broken at its own hyphen goes on with a capital ("Stenby-on- Wend").
 */
const LINE_BREAK_HYPHEN = /(?<=\p{L})-\s+(?=\p{Ll})/gu;

/** The text with words broken at line ends joined again (see LINE_BREAK_HYPHEN). */
export function joinLineBreaks(text: string): string {
  return text.includes("-") ? text.replace(LINE_BREAK_HYPHEN, "") : text;
}

/**
 * A possessive closing the text ("Lumb's", "Harrowmouth’s"): a straight, curly or back quote and
 * "s" after two letters or more, at the end.
 */
const CLOSING_POSSESSIVE = /(?<=\p{L}{2})['’`]s$/u;

/**
 * The text without the possessive that closes it ("Lumb's" -> "Lumb", "the Stenning Grain
 * Exchange's" -> "the Stenning Grain Exchange"), or null when it has none. Running text puts the
 * possessive on names ("Lumb's salerooms") and a recognizer's span may keep it, while a table
 * keeps the names that carry one as they are written ("St. Aldric's"): the linker compares such
 * a mention both ways, so neither reading is lost.
 */
export function withoutPossessive(text: string): string | null {
  const trimmed = text.trimEnd();
  const stripped = trimmed.replace(CLOSING_POSSESSIVE, "");
  return stripped === trimmed ? null : stripped;
}

/** A closing aside: the last bracketed group of a name, with nothing after it. */
const CLOSING_ASIDE = /[([{]([^()[\]{}]*)[)\]}]\s*$/;

/**
 * The words of a name's closing aside, outside persons, which the full form keeps as qualifier
 * words (the key drops them with every aside): "Virgin Islands (British)" and "Virgin Islands
 * (U.S.)" share the key "virgin islands" and differ by their qualifiers, as "Pell & Co." and
 * "Pell Ltd." do; "Veltheim (Kreis 5)" is a qualified Veltheim. An aside of articles only, as
 * ISO-style lists write "Gambia (the)", adds nothing.
 */
function closingAsideWords(raw: string): string[] {
  const m = CLOSING_ASIDE.exec(raw);
  if (m === null || m.index === 0) return [];
  return joinLetterRuns(foldTokens(m[1]!).map(fixOcrDigits)).filter((t) => !LEADING_ARTICLES.has(t));
}

function dropParenthesized(raw: string): string {
  let stripped = raw;
  for (let pass = 0; pass < MAX_ASIDE_NESTING; pass++) {
    const next = stripped.replace(PARENTHESIZED, " ");
    if (next === stripped) break;
    stripped = next;
  }
  stripped = stripped.trim();
  return stripped.length > 0 ? stripped : raw;
}

/**
 * Catalogue inversion for organizations and places: "Korea, Republic of" -> "Republic of Korea",
 * "Watermen, Company of the" -> "Company of the Watermen" (the part after the comma ends in "of").
 */
function reorderInverted(raw: string): string {
  const parts = raw.split(",");
  if (parts.length !== 2) return raw;
  const head = parts[0]!.trim();
  const tail = parts[1]!.trim();
  if (head === "" || !/\bof(\s+the)?$/i.test(tail)) return raw;
  return `${tail} ${head}`;
}

/**
 * The same inversion in brackets, as ISO-style country lists write it: "Korea (the Republic of)"
 * -> "the Republic of Korea", "Congo (the Democratic Republic of the)". Only a closing aside
 * ending in "of" or "of the" is read so; other asides are dropped (dropParenthesized).
 */
const BRACKETED_INVERSION = /^(.*\S)\s*\(([^()]*\bof(?:\s+the)?)\s*\)\s*$/i;

function reorderBracketed(raw: string): string {
  const m = BRACKETED_INVERSION.exec(raw);
  return m === null ? raw : `${m[2]!.trim()} ${m[1]!}`;
}

/** The last word of a text and what goes before it, the separating comma or spaces excluded. */
const LAST_WORD = /^(.*?)(,\s*|\s+)([\p{L}.]+)\s*$/su;

/**
 * A person's name without the post-nominal letters that close it ("Capt. W. Harland, R.N." ->
 * "Capt. W. Harland", "Thos. Pell, J.P., M.P." -> "Thos. Pell"): a word of POST_NOMINALS written
 * with its dots ("R.N.", "Bart."), or in capitals after a comma in a text that is not all
 * capitals ("Harland, RN"), so that "John Ma" and "JOHN MA" keep their surname. Something
 * name-like (two letters) always stays.
 */
export function dropPostNominals(raw: string): string {
  let text = raw.trimEnd();
  const allCaps = text === text.toUpperCase();
  for (;;) {
    const m = LAST_WORD.exec(text);
    if (m === null) return text;
    const [, rest, separator, word] = m as unknown as [string, string, string, string];
    const dotted = word.includes(".");
    const capitals = separator.startsWith(",") && !allCaps && word === word.toUpperCase();
    if (!(dotted || capitals) || !POST_NOMINALS.has(word.replace(/\./g, "").toLowerCase())) return text;
    if (!/\p{L}{2}/u.test(rest)) return text;
    text = rest.trimEnd();
  }
}

/** A surname, then given names or initials in brackets, as some lists print a person. */
const BRACKETED_GIVEN_NAMES = /^\s*([\p{L}'’-]+)\s*\(([^()]+)\)\s*$/u;

/**
 * True when the words lead with a given name or an initial, honorifics aside: "J. H. Aldous",
 * "Capt. Jabez Aldous", not "Aldous" or "Van Pell".
 */
function leadsWithGivenName(tokens: readonly string[]): boolean {
  let i = 0;
  while (i < tokens.length - 1 && HONORIFICS.has(tokens[i]!)) i++;
  const t = tokens[i];
  if (t === undefined || i === tokens.length - 1) return false;
  const given = GIVEN_NAME_ABBREVIATIONS[t] ?? t;
  return t.length === 1 || MALE_GIVEN_NAMES.has(given) || FEMALE_GIVEN_NAMES.has(given);
}

/** "Aldous (Jabez)" -> "Jabez Aldous": a surname, then given names or initials in brackets. */
function reorderBracketedGivenNames(raw: string): string {
  const m = BRACKETED_GIVEN_NAMES.exec(raw);
  if (m === null || !leadsWithGivenName(foldTokens(`${m[2]} ${m[1]}`))) return raw;
  return `${m[2]!.trim()} ${m[1]}`;
}

/**
 * "Aldous, J. H." -> "J. H. Aldous" when the text is one comma between two non-empty parts.
 * When the part before the comma is a whole name already (given name or initial, then surname),
 * what follows is an appositive ("Jabez Aldous, harbour master", "J. Pell, of Stenmouth") and is
 * left out.
 */
function reorderLastFirst(raw: string): string {
  const parts = raw.split(",");
  if (parts.length !== 2) return raw;
  const last = parts[0]!.trim();
  const first = parts[1]!.trim();
  if (last.length === 0 || first.length === 0) return raw;
  // "Pell, Sr." is a suffix, not a given name.
  const firstTokens = foldTokens(first);
  if (firstTokens.every((t) => GENERATIONAL[t] !== undefined || HONORIFICS.has(t))) {
    return `${last} ${first}`;
  }
  if (leadsWithGivenName(foldTokens(last))) return last;
  return `${first} ${last}`;
}

interface Stripped {
  tokens: string[];
  suffix: string | null;
  legal: string[];
}

function stripPerson(tokens: string[]): Stripped {
  let start = 0;
  while (start < tokens.length - 1 && HONORIFICS.has(tokens[start]!)) start++;
  const core: string[] = [];
  let suffix: string | null = null;
  for (let i = start; i < tokens.length; i++) {
    const t = tokens[i]!;
    const gen = GENERATIONAL[t];
    // A suffix only counts after the first core token ("Junior Pell" keeps "junior").
    if (gen !== undefined && core.length > 0) {
      suffix = gen;
      continue;
    }
    if ((t === "esq" || t === "esquire") && core.length > 0) continue;
    core.push(GIVEN_NAME_ABBREVIATIONS[t] ?? t);
  }
  return { tokens: core.length > 0 ? initialsFirst(core) : tokens.slice(), suffix, legal: [] };
}

/**
 * A surname followed by initials, as indexes and lists print a name without the comma ("Aldous
 * J. H." -> "j h aldous"): the initials are put first. Not when the first word is a given name
 * ("Walter H." stays), nor for a name of one word.
 */
function initialsFirst(core: string[]): string[] {
  if (core.length < 2 || core[0]!.length < 2) return core;
  for (let i = 1; i < core.length; i++) if (core[i]!.length !== 1) return core;
  const first = core[0]!;
  if (MALE_GIVEN_NAMES.has(first) || FEMALE_GIVEN_NAMES.has(first)) return core;
  return [...core.slice(1), first];
}

/**
 * Words that join a name to another name of the same firm or person in registers and filings:
 * "doing business as", "trading as", "also known as", "formerly known as" and their
 * abbreviations (common practice of company filings).
 */
const TRADE_NAME_MARKER =
  /\s*,?\s+(?:d\/b\/a\/?|d\.b\.a\.?|dba|t\/a|trading\s+as|doing\s+business\s+as|a\/k\/a|a\.k\.a\.?|also\s+known\s+as|f\/k\/a|f\.k\.a\.?|fka|formerly\s+known\s+as|formerly)\s+/i;

/**
 * A name given with another name of the same firm ("Jubba Airways Limited d/b/a Jubba Airways",
 * "Springjet, S.A. t/a HiFly", "Kell Bros. formerly Kell & Sons"), split in two: the name before
 * the marker and the other after it; null when the text has no marker with words on both sides.
 * normalizeName reads the first; the index keeps the second as an alias and the linker compares
 * a mention under both.
 */
export function splitTradeName(text: string): { name: string; alsoNamed: string } | null {
  const m = TRADE_NAME_MARKER.exec(text);
  if (m === null) return null;
  const name = text.slice(0, m.index).replace(/[\s,;]+$/, "");
  const alsoNamed = text.slice(m.index + m[0].length).trim();
  if (!/[\p{L}\p{N}]/u.test(name) || !/[\p{L}\p{N}]/u.test(alsoNamed)) return null;
  return { name, alsoNamed };
}

/**
 * True when `short`, a word written short, stands for `long`: the first letters of it ("calif" /
 * "california", "tenn" / "tennessee"), or a contraction keeping its first and last letters and
 * some between, in order ("md" / "maryland", "rly" / "railway"). Clerks, directories and postal
 * lists write both (common practice; the state abbreviations from memory).
 */
export function abbreviates(short: string, long: string): boolean {
  if (short.length < 2 || short.length >= long.length || short[0] !== long[0]) return false;
  if (long.startsWith(short)) return true;
  if (short[short.length - 1] !== long[long.length - 1]) return false;
  let j = 1;
  for (let i = 1; i < long.length - 1 && j < short.length - 1; i++) if (long[i] === short[j]) j++;
  return j === short.length - 1;
}

/**
 * Short words the lexicon reads in some class ("Dr.", "Chas.", "Jr.", "Co.", "Pt.", "Dept."): in
 * another class's reading of a name they are still those words, not short for a table word.
 */
const LEXICON_SHORT_WORDS: ReadonlySet<string> = new Set([
  ...HONORIFICS,
  ...Object.keys(GIVEN_NAME_ABBREVIATIONS),
  ...Object.keys(GENERATIONAL),
  ...Object.keys(LEGAL_FORMS),
  ...Object.keys(CLOSING_LEGAL_FORMS),
  ...Object.keys(PLACE_ABBREVIATIONS),
  ...Object.keys(DESIGNATOR_ABBREVIATIONS),
]);

/** The core tokens written short (not the lexicon's own short words): each once, in order. */
function abbreviatedTokens(tokens: readonly string[], cut: ReadonlySet<string>): string[] {
  if (cut.size === 0) return [];
  return [...new Set(tokens.filter((t) => cut.has(t) && !LEXICON_SHORT_WORDS.has(t)))];
}

/**
 * Words of a firm's structure that one letter turns into everyday words of firm names ("Folding
 * Chairs", "Moldings"): read as legal forms only as written, never through a slip.
 */
const STRUCTURE_WORDS_AS_WRITTEN: ReadonlySet<string> = new Set(["holding", "holdings"]);

/** Legal forms long enough that one OCR slip cannot turn another word into them. */
const LONG_LEGAL_FORMS = Object.keys(LEGAL_FORMS).filter(
  (f) => f.length >= 7 && !STRUCTURE_WORDS_AS_WRITTEN.has(f),
);

/**
 * The canonical legal form a token spells, also through one OCR slip or typo ("Lirnited",
 * "Limtied", "Cornpany", "Brothesr"): legal words are the most frequent words of firm names, so
 * old print misreads them often, and a misread one must not end up in the matching key.
 */
export function legalFormOf(token: string): string | undefined {
  const direct = LEGAL_FORMS[token];
  if (direct !== undefined) return direct;
  if (token.length < 7) return undefined;
  const read = token.replace(/rn/g, "m").replace(/cl/g, "d");
  if (LEGAL_FORMS[read] !== undefined) return LEGAL_FORMS[read];
  for (const f of LONG_LEGAL_FORMS)
    if (withinOneEdit(token, f) || withinOneEdit(read, f)) return LEGAL_FORMS[f];
  return undefined;
}

/** True when a and b differ by at most one substitution, insertion, deletion or adjacent swap. */
function withinOneEdit(a: string, b: string): boolean {
  if (Math.abs(a.length - b.length) > 1) return false;
  let i = 0;
  while (i < a.length && i < b.length && a[i] === b[i]) i++;
  if (i === a.length && i === b.length) return true;
  if (a.length === b.length) {
    if (a.slice(i + 1) === b.slice(i + 1)) return true; // substitution
    return a[i] === b[i + 1] && a[i + 1] === b[i] && a.slice(i + 2) === b.slice(i + 2); // swap
  }
  return a.length > b.length ? a.slice(i + 1) === b.slice(i) : a.slice(i) === b.slice(i + 1);
}

/** The length and canonical form of a legal-form phrase starting at tokens[i], or null. */
function legalPhraseAt(tokens: readonly string[], i: number): readonly [number, string] | null {
  for (const [words, form] of LEGAL_FORM_PHRASES) {
    if (i + words.length > tokens.length) continue;
    let all = true;
    for (let k = 0; k < words.length && all; k++) all = tokens[i + k] === words[k];
    if (all) return [words.length, form];
  }
  return null;
}

/**
 * The number of tokens a legal form written before the name takes (OJSC "Tajik Air", "Open
 * Joint Stock Company Angara Airlines"), 0 when none or when nothing would be left.
 */
function leadingLegalForm(tokens: readonly string[]): number {
  const phrase = legalPhraseAt(tokens, 0);
  const n =
    phrase !== null && LEADING_LEGAL_FORMS.has(phrase[1])
      ? phrase[0]
      : LEADING_LEGAL_FORMS.has(tokens[0]!)
        ? 1
        : 0;
  return n < tokens.length ? n : 0;
}

/**
 * Where a firm name's closing legal forms start (see CLOSING_LEGAL_FORMS): the index of the first
 * of the trailing tokens that are all legal forms, one of them at least a closing one; the
 * tokens' length when there is none.
 */
function closingLegalStart(tokens: readonly string[]): number {
  // Most names hold no closing form: spare them the legal-form reading of their last words, which
  // stripOrganization does anyway.
  if (!tokens.some((t) => CLOSING_LEGAL_FORMS[t] !== undefined)) return tokens.length;
  let start = tokens.length;
  let closing = false;
  while (start > 1) {
    const t = tokens[start - 1]!;
    if (CLOSING_LEGAL_FORMS[t] !== undefined) closing = true;
    else if (legalFormOf(t) === undefined) break;
    start--;
  }
  return closing ? start : tokens.length;
}

function stripOrganization(tokens: string[]): Stripped {
  const core: string[] = [];
  const legal: string[] = [];
  const lead = leadingLegalForm(tokens);
  if (lead > 0) legal.push(legalPhraseAt(tokens, 0)?.[1] ?? tokens[0]!);
  const closing = closingLegalStart(tokens);
  for (let i = lead; i < tokens.length; i++) {
    const t = tokens[i]!;
    // Legal forms are only stripped after the first core word ("Company of Watermen" keeps its head).
    if (core.length > 0) {
      const closingForm = i >= closing ? CLOSING_LEGAL_FORMS[t] : undefined;
      if (closingForm !== undefined) {
        legal.push(closingForm);
        continue;
      }
      const phrase = legalPhraseAt(tokens, i);
      if (phrase !== null) {
        legal.push(phrase[1]);
        i += phrase[0] - 1;
        continue;
      }
      const form = legalFormOf(t);
      if (form !== undefined) {
        if (form !== "and") legal.push(form);
        continue;
      }
    }
    core.push(PLACE_ABBREVIATIONS[t] ?? t);
  }
  // A trailing "and" left over from "X and Y" is kept inside; only legal words are removed.
  return { tokens: core.length > 0 ? core : tokens.slice(), suffix: null, legal };
}

function stripOther(tokens: string[]): Stripped {
  let start = 0;
  while (start < tokens.length - 1 && VESSEL_PREFIXES.has(tokens[start]!)) start++;
  return { tokens: tokens.slice(start), suffix: null, legal: [] };
}

/** Digits OCR reads in place of letters; a digit between letters is a misreading, not a number. */
const OCR_DIGITS: Readonly<Record<string, string>> = { "0": "o", "1": "l", "5": "s", "8": "b" };
const HAS_LETTER = /\p{L}/u;
const HAS_DIGIT = /[0158]/;

/** "a1dous" -> "aldous", "ing01y" -> "ingoly"; all-digit tokens (years, numbers) stay. */
export function fixOcrDigits(token: string): string {
  if (!HAS_DIGIT.test(token) || !HAS_LETTER.test(token)) return token;
  return token.replace(/[0158]/g, (d) => OCR_DIGITS[d] ?? d);
}

/** Runs of two or more one-letter tokens become one token: "s s sarah" -> "ss sarah". */
function joinLetterRuns(tokens: string[]): string[] {
  const out: string[] = [];
  let run = "";
  for (const t of tokens) {
    if (t.length === 1) {
      run += t;
      continue;
    }
    if (run !== "") out.push(run);
    run = "";
    out.push(t);
  }
  if (run !== "") out.push(run);
  return out;
}

/**
 * Length of a leading place designator, "<modifiers> <head> of [the]" ("Republic of", "Grand Duchy
 * of", "City of the"), in tokens; 0 when there is none or nothing would be left after it.
 */
export function designatorLength(tokens: readonly string[]): number {
  if (tokens[0] === "united" && NAMED_BY_DESIGNATOR.has(tokens[1]!)) return 0;
  let i = 0;
  while (i < tokens.length && PLACE_DESIGNATOR_MODIFIERS.has(designatorWord(tokens[i]!))) i++;
  if (i >= tokens.length || !PLACE_DESIGNATOR_HEADS.has(designatorWord(tokens[i]!))) return 0;
  i++;
  if (tokens[i] !== "of") return 0;
  i++;
  if (tokens[i] === "the") i++;
  return i < tokens.length ? i : 0;
}

/**
 * Heads that, after "united", are the name people use rather than a designator: "United States
 * of America", "United Kingdom of Great Britain..." (but "United Republic of Tanzania" is Tanzania).
 */
const NAMED_BY_DESIGNATOR: ReadonlySet<string> = new Set(["states", "kingdom"]);

/** A designator word as written or abbreviated ("rep" -> "republic"). */
function designatorWord(token: string): string {
  return DESIGNATOR_ABBREVIATIONS[token] ?? token;
}

/** Joiner words of a designator phrase, left out of the full form ("republic of the" -> "republic"). */
const DESIGNATOR_JOINERS: ReadonlySet<string> = new Set(["of", "the", "and"]);

function stripLocation(tokens: string[]): Stripped {
  let core = tokens.map((t) => PLACE_ABBREVIATIONS[t] ?? t);
  const legal: string[] = [];
  // Nested designators go one after the other: "Republic of the Union of Myanmar".
  for (let d = designatorLength(core); d > 0; d = designatorLength(core)) {
    for (const t of core.slice(0, d)) if (!DESIGNATOR_JOINERS.has(t)) legal.push(designatorWord(t));
    core = core.slice(d);
  }
  const t = trailingDesignatorStart(core);
  if (t > 0) {
    for (const w of core.slice(t)) legal.push(designatorWord(w));
    core = core.slice(0, t);
  }
  return { tokens: core, suffix: null, legal };
}

/**
 * Where a trailing designator starts ("Russian Federation", "Syrian Arab Republic", "Lao People's
 * Democratic Republic"): a head of TRAILING_DESIGNATOR_HEADS at the end, with the modifiers
 * before it; 0 when there is none or nothing would be left before it.
 */
export function trailingDesignatorStart(tokens: readonly string[]): number {
  const last = tokens.length - 1;
  if (last < 1 || !TRAILING_DESIGNATOR_HEADS.has(designatorWord(tokens[last]!))) return 0;
  let start = last;
  while (start > 1 && TRAILING_DESIGNATOR_MODIFIERS.has(designatorWord(tokens[start - 1]!))) start--;
  return start;
}

/**
 * Normalize a raw name for the given class.
 * - person: "Last, First" reordered, leading honorifics removed, generational suffix split off,
 *   clerks' given-name abbreviations expanded (Jno. -> john);
 * - organization: a leading courtesy title ("Messrs.") dropped, legal forms removed from the key
 *   (kept canonical in `full`), place abbreviations expanded;
 * - location: place abbreviations expanded (St. -> saint, Ft. -> fort, Pt. -> port, Mt. -> mount),
 *   a leading designator ("Republic of", "City of the") removed from the key (kept in `full`);
 * - other: vessel prefixes (S.S., P.S., H.M.S....) removed from the key.
 * Every class: words broken at a line end joined again ("Har- land"); digits inside words are
 * read as the letters OCR mistakes them for ("A1dous" -> "aldous"); outside persons, runs of single letters are joined ("S. G. E." -> "sge").
 */
export function normalizeName(name: string, cls: EntityClass): NormalizedName {
  // "X d/b/a Y" is normalized as X; Y is the name's other name (see splitTradeName).
  const raw = joinLineBreaks(splitTradeName(name)?.name ?? name);
  const reordered = cls === "person" ? reorderBracketedGivenNames(raw) : reorderBracketed(raw);
  const aside = cls === "person" ? [] : closingAsideWords(reordered);
  const bare = dropParenthesized(reordered);
  const text = cls === "person" ? reorderLastFirst(dropPostNominals(bare)) : reorderInverted(bare);
  const all = foldTokens(text);
  let lead = 0;
  while (
    lead < all.length - 1 &&
    (LEADING_ARTICLES.has(all[lead]!) || (cls === "organization" && FIRM_COURTESY_TITLES.has(all[lead]!)))
  )
    lead++;
  const unread = (lead > 0 ? all.slice(lead) : all).map(fixOcrDigits);
  const folded = cls === "person" ? unread : joinLetterRuns(unread);
  let s: Stripped;
  switch (cls) {
    case "person":
      s = stripPerson(folded);
      break;
    case "organization":
      s = stripOrganization(folded);
      break;
    case "location":
      s = stripLocation(folded);
      break;
    default:
      s = stripOther(folded);
  }
  const key = s.tokens.join(" ");
  const fullParts = s.tokens.slice();
  for (const l of s.legal) fullParts.push(l);
  if (s.suffix !== null) fullParts.push(s.suffix);
  for (const w of aside) fullParts.push(w);
  const acronym = readAcronym(raw);
  // A place's acronym spells its designator too: "USA", "UAE", "DRC".
  const acronymTokens = cls === "location" && s.legal.length > 0 ? folded : s.tokens;
  const acronymKey = cls !== "person" && acronymTokens.length >= 2 ? acronymOfTokens(acronymTokens) : null;
  let initialsKey: string | null = null;
  if (cls === "person" && s.tokens.length >= 2) {
    initialsKey = `${s.tokens[0]![0]} ${s.tokens[s.tokens.length - 1]}`;
  }
  return {
    folded,
    tokens: s.tokens,
    key,
    full: fullParts.join(" "),
    ocrKey: ocrFold(key),
    suffix: s.suffix,
    acronym,
    acronymKey: acronymKey !== null && acronymKey.length >= MIN_ACRONYM_LETTERS ? acronymKey : null,
    initialsKey,
    abbreviated:
      cls === "person" || !(text.includes(".") || text.includes("'") || text.includes("’"))
        ? []
        : abbreviatedTokens(s.tokens, cutWords(text)),
  };
}
