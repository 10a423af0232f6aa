/**
 * The named features of one (mention, candidate entity) pair. Each is in [0, 1]; see `Features`
 * in types.ts for what each measures. Name features are the best over the entity's aliases.
 */
import type { AliasRow, EntityRow } from "../kb/kb.js";
import {
  COMPASS_INITIALS,
  CONTRASTING_WORDS,
  FEMALE_GIVEN_NAMES,
  FEMALE_HONORIFICS,
  HONORIFICS,
  LEGAL_FORMS,
  MALE_GIVEN_NAMES,
  MALE_HONORIFICS,
} from "../normalize/lexicon.js";
import { abbreviates, acronymOfTokens, type NormalizedName } from "../normalize/name.js";
import { ocrFold } from "../normalize/ocr.js";
import type { Features } from "../types.js";
import { foldEmbeddedAcronyms, sameWordsWithEmbeddedAcronyms } from "./embedded-acronyms.js";
import { genericWordFor, NO_GENERIC_WORDS } from "./table-words.js";
import {
  initialsCompatible,
  jaroWinkler,
  levenshteinSimilarity,
  petForms,
  petFormsOfOneName,
  tokenSetSimilarity,
} from "./name-similarity.js";

/** exactKey credit when only the OCR-folded keys agree: strong evidence, weaker than an exact key. */
export const OCR_KEY_CREDIT = 0.75;
/**
 * exactKey credit, outside persons, when the keys hold the same words in another order: "Virgin
 * Islands, British" against "British Virgin Islands", a catalogue's inverted heading against the
 * name as written. As strong as an OCR-key match: the words agree, their order is a convention.
 * Persons are left out, since "Thomas John" and "John Thomas" are two names.
 */
export const REORDERED_KEY_CREDIT = 0.75;
/**
 * exactKey credit, outside persons, when the keys agree but only one side carries a qualifier
 * (legal form, place designator): "Pell" or "Pell & Co." against the other, "Sweden" against
 * "Kingdom of Sweden". Likely the same; but where a table holds both forms ("China" and "Republic
 * of China", a firm and its namesake company) the one spelled alike should win: at the default
 * exactKey weight (2) the 0.4 gap is 0.8 in log-odds, past the default minimum margin (0.5).
 * Measured, not fitted: 0.75 / 0.5 and 0.5 / 0.25 gave the same F1 on the sample archive, the
 * synthetic 100k benchmark and both country-name checks (within 0.0002).
 */
export const ONE_SIDED_QUALIFIER_CREDIT = 0.6;
/**
 * exactKey credit when the keys agree and both sides carry different qualifiers: "Pell & Co."
 * against "Pell Ltd.", "Republic of Korea" against "Democratic People's Republic of Korea". The
 * qualifier is then the only thing telling the two apart, so the shared key earns nothing; the
 * other name features still compare the full forms. Measured: 0.3 linked "Democratic People's
 * Republic of Korea" to the Republic of Korea; 0 cuts the world-to-i18n country check's wrong
 * links 1.0% -> 0.7% at the same accuracy, adds one correct NIL on the sample archive and leaves
 * open cities and the synthetic 10k / 100k benchmarks unchanged.
 */
export const CONFLICTING_QUALIFIER_CREDIT = 0;
/**
 * exactKey credit of a person's surname given alone ("Lumb", "Mr. Lumb", "Capt. Harland") against
 * a fuller name of one person, when no other person of the table has a name holding that word:
 * as strong as a name with a one-sided qualifier, the way a place's unique part counts ("part").
 * Papers name people by surname once they are known; without this, "Lumb" labeled PER took the
 * firm "Lumb & Sons" (spelled alike once its "& Sons" is set aside) over the auctioneer James
 * Thomas Lumb, and a lone surname never reached the threshold. ("Mrs. Lumb" is not James Thomas
 * Lumb: a mention whose honorific says the other sex gets no name evidence, see sexesDiffer.)
 */
export const SOLE_SURNAME_CREDIT = ONE_SIDED_QUALIFIER_CREDIT;

/**
 * exactKey credit of a mention and an alias whose keys are equal: full credit when their full
 * forms agree too, less when their qualifiers differ (see the credits above). Persons' generational
 * suffixes are handled by nameMatch itself.
 */
export function keyCredit(norm: NormalizedName, alias: AliasRow, person: boolean): number {
  if (person || norm.full === alias.full) return 1;
  if (!qualifiersConflict(qualifierOf(norm), qualifierOf(alias))) return ONE_SIDED_QUALIFIER_CREDIT;
  return CONFLICTING_QUALIFIER_CREDIT;
}

/**
 * True when two names' qualifiers tell them apart: both present and different ("& Co." against
 * "Ltd.", "(British)" against "(U.S.)", "Republic of" against "Democratic People's Republic of",
 * where the longer one saying more is what tells the two apart).
 */
function qualifiersConflict(x: string, y: string): boolean {
  return x !== "" && y !== "" && x !== y;
}

export interface NameMatch {
  jaroWinkler: number;
  levenshtein: number;
  tokenSet: number;
  abbreviation: number;
  exactKey: number;
  /** The alias that gave the best Jaro-Winkler value (cited by the reasons). */
  bestAlias: AliasRow;
  /** What the abbreviation feature recognised, when it fired. */
  abbreviationKind: "acronym" | "initials" | "acronym-inside" | null;
  /**
   * What the exactKey feature matched, when it fired: equal keys, equal OCR-folded keys, equal
   * names once the table's generic words are set aside ("core", see table-words.ts), or once the
   * mention's words that the entity's own record carries are ("attested": "Yantai Laishan
   * Airport" for "Laishan", whose city is Yantai), or a mention that is the first or last words
   * of the name, words no other entity's names carry ("part": "Lek" for "Albanian Lek"), a name
   * followed in the mention by a complement ("head": "United Kingdom of Great Britain and
   * Northern Ireland" for "United Kingdom"), a firm's name followed in the mention by a word or
   * two more ("extended": "Polar Air Cargo Worldwide" for "Polar Air Cargo"), the name with the
   * kind its record gives it ("kind":
   * "Bhola District" for the district Bhola, "Metropolitan City of Bologna"), or the same words in
   * another order ("reordered": "Virgin Islands, British"), or the same words some written
   * short ("abbreviated": "Calif." for "California", "Harrowm. Wharf"), or a person's surname
   * alone, no other person's ("surname": "Lumb" for "James Thomas Lumb").
   */
  keyKind:
    | "exact"
    | "ocr"
    | "core"
    | "attested"
    | "part"
    | "head"
    | "extended"
    | "kind"
    | "reordered"
    | "abbreviated"
    | "surname"
    | null;
  /**
   * True when the mention is spelled as one of the entity's names spells it, up to normalization:
   * equal keys (whatever the qualifiers), an acronym or initials reading, or every word of the
   * mention found as written in one alias ("Aldous" in "Josiah Aldous"). False when the name
   * evidence rests on near spellings alone ("Stenrnouth", "Rumania"): see the nearSpelling feature.
   */
  spelledAlike: boolean;
  /**
   * Words of a longer name of the entity, holding every word of the mention, that the mention may
   * not leave out (see wordsNotToLeaveOut): "old" of "Old Hungarian" for "Hungarian" in a table
   * that also lists "Old English" and "English". The name's overlap then gets no credit for
   * covering the mention. Null when no name was refused so.
   */
  apartWords: string[] | null;
  /**
   * True when the match is of the mention read without its closing possessive ("Lumb" for
   * "Lumb's"; see MentionForm.possessiveDropped), its key credit capped. Absent otherwise.
   */
  possessiveDropped?: boolean;
  /**
   * True when the mention's honorific says one sex and the person's given name the other ("Mrs.
   * John Pell" against John Pell; see sexesDiffer): the name then gives no evidence at all.
   * Absent otherwise.
   */
  sexDiffers?: boolean;
  /**
   * True when the mention gives a person's given name in full and the entity's names give
   * another, neither a spelling, pet form nor shortening of the other ("Josiah Aldous" against
   * Jabez Harcourt Aldous; see givenNamesDiffer): no name evidence then. Absent otherwise.
   */
  givenNameDiffers?: boolean;
}

/**
 * What the linker knows of a candidate's name words beyond its names, for names that lose words
 * (see shortFormKind and wordsNotToLeaveOut).
 */
export interface WordEvidence {
  /** The entity's own record (description, attributes) carries the word, rarely enough to tell it. */
  attested(token: string): boolean;
  /** No other entity's names carry the word. */
  unique(token: string): boolean;
  /** No other entity has a name holding all these words (for one word: unique). */
  alone(tokens: readonly string[]): boolean;
  /** The entity's own record carries the word, however many others do. */
  carried(token: string): boolean;
  /**
   * The entity's record gives its kind with the word: the value of one of the table's kind
   * columns (src/kb/kind-columns.ts: a category such as "District", a country), or its table type.
   */
  kind(token: string): boolean;
  /**
   * The table holds a name made of these words and another entry's name, before it (`atStart`) or
   * after: "Old English" beside "English", "Ukrainian Sign Language" beside "Ukrainian".
   */
  separates(words: readonly string[], atStart: boolean): boolean;
  /** No other person of the table has a name holding the word. */
  soleBearer(token: string): boolean;
  /**
   * The mention's label reads it as a thing of the entity's class at least as readily as of any
   * other (a person label for a person, or no label): a firm's label on "Pell" names the firm,
   * not one of the Pells; a place's label on "Fenwold" the county, not the "Fenwold Quarter
   * Sessions".
   */
  labelFits(): boolean;
}

/**
 * The name features of a mention against an entity: each the best over the entity's aliases.
 * `generic` holds the table's generic name words (table-words.ts), set aside as qualifiers are
 * when they make the only difference between two names; `words` what the linker knows of the
 * entity's words, by which a mention may match while lacking some of them (without it, a short
 * form matches by its overlap alone). Persons' names never lose words so.
 */
export function nameMatch(
  norm: NormalizedName,
  entity: EntityRow,
  generic: ReadonlySet<string> = NO_GENERIC_WORDS,
  words: WordEvidence | null = null,
): NameMatch {
  const personLike = entity.cls === "person";
  // "Mrs. John Pell" is John Pell's wife, not John Pell; "Josiah Aldous" is not Jabez Aldous.
  const sexDiffers = personLike && sexesDiffer(norm, entity);
  const givenDiffers = personLike && !sexDiffers && givenNamesDiffer(norm, entity);
  if (sexDiffers || givenDiffers) {
    return {
      jaroWinkler: 0,
      levenshtein: 0,
      tokenSet: 0,
      abbreviation: 0,
      exactKey: 0,
      bestAlias: entity.aliases[0]!,
      abbreviationKind: null,
      keyKind: null,
      spelledAlike: false,
      apartWords: null,
      ...(sexDiffers ? { sexDiffers: true } : { givenNameDiffers: true }),
    };
  }
  let jw = 0;
  let lev = 0;
  let tok = 0;
  let abbr = 0;
  let exact = 0;
  let bestAlias = entity.aliases[0]!;
  let abbreviationKind: NameMatch["abbreviationKind"] = null;
  let keyKind: NameMatch["keyKind"] = null;
  let wordsAlike = false;
  let apartWords: string[] | null = null;
  const mentionQualifier = qualifierOf(norm);
  const mentionSplit = !personLike && generic.size > 0 ? splitGeneric(norm.tokens, generic) : null;
  const aliases = entity.aliases;
  for (let ai = 0; ai < aliases.length; ai++) {
    const a = aliases[ai]!;
    // "Matabeleland South" is not a slip for "Matabeleland North": such a name gives no credit.
    if (!personLike && namesContrast(norm.tokens, a.tokens)) continue;
    // Qualifiers on both sides that differ tell two apart, so the names are compared with them:
    // "Josiah Pell Jr." against "Josiah Pell Sr.", "Pell & Co." against "Pell Ltd.", "Republic of
    // Korea" against "Democratic People's Republic of Korea".
    const conflicting = personLike
      ? norm.suffix !== null && suffixOf(a) !== null && suffixOf(a) !== norm.suffix
      : qualifiersConflict(mentionQualifier, qualifierOf(a));
    if (conflicting) {
      const j = jaroWinkler(norm.full, a.full);
      if (j > jw) {
        jw = j;
        bestAlias = a;
      }
      lev = Math.max(lev, levenshteinSimilarity(norm.full, a.full));
      tok = Math.max(tok, tokenOverlap(norm.full.split(" "), a.full.split(" ")));
      if (norm.key === a.key) wordsAlike = true;
      if (!personLike && norm.key === a.key) {
        const credit = keyCredit(norm, a, false);
        if (credit > exact) {
          exact = credit;
          keyKind = "exact";
        }
      }
      continue;
    }
    // Where the table has generic words and either name carries them (compatibly), the names are
    // compared by their cores: "Mbala Airport" and "Moala Airport" share a word that says nothing.
    const aliasSplit = mentionSplit === null ? null : splitGeneric(a.tokens, generic);
    const cores = aliasSplit !== null && comparableCores(mentionSplit!, aliasSplit);
    let j: number;
    let l: number;
    let t: number;
    if (cores) {
      const mc = mentionSplit!.core.join(" ");
      const ac = aliasSplit!.core.join(" ");
      j = ac === "" ? 0 : jaroWinkler(mc, ac);
      l = ac === "" ? 0 : levenshteinSimilarity(mc, ac);
      t = tokenOverlap(mentionSplit!.core, aliasSplit!.core);
    } else {
      // Most names carry no qualifier: their full forms are their keys, compared once.
      const bare = norm.full === norm.key && a.full === a.key;
      j = Math.max(jaroWinkler(norm.key, a.key), bare ? 0 : jaroWinkler(norm.full, a.full));
      l = Math.max(
        levenshteinSimilarity(norm.key, a.key),
        bare ? 0 : levenshteinSimilarity(norm.full, a.full),
      );
      // A mention found whole within a longer name that adds words the table tells entries apart
      // by ("Hungarian" in "Old Hungarian") may name another entry, one the table lacks: the
      // name's coverage of the mention says nothing then (see wordsNotToLeaveOut).
      const refused =
        personLike || words === null || !containsAll(a.tokens, norm.tokens)
          ? null
          : wordsNotToLeaveOut(norm.tokens, a.tokens, words);
      if (refused !== null) apartWords ??= refused;
      t = tokenOverlap(norm.tokens, a.tokens, refused === null);
      // A surname alone spells the name's surname, whatever its given names: compared with the
      // whole name, its similarity would fall with their length, and of two bearers the one with
      // the shorter given names would win ("Spackman" took "W. I. Spackman" over "Reuben
      // Spackman"). Equal for every bearer, the name leaves them to context.
      if (personLike && surnameAlone(norm, a) && (words?.labelFits() ?? true)) {
        j = 1;
        l = 1;
      }
    }
    if (j > jw) {
      jw = j;
      bestAlias = a;
    }
    if (l > lev) lev = l;
    if (t > tok) tok = t;
    const keyEqual = norm.key === a.key;
    const coreEqual = !keyEqual && cores && sameTokens(mentionSplit!.core, aliasSplit!.core);
    const shortForm =
      keyEqual || coreEqual || personLike || exact >= ONE_SIDED_QUALIFIER_CREDIT
        ? null
        : shortFormKind(
            norm.tokens,
            a.tokens,
            cores ? mentionSplit!.core : norm.tokens,
            cores ? aliasSplit!.core : a.tokens,
            words,
            entity.cls === "organization",
          );
    // A person's name never loses words, but a surname alone may name the table's only bearer
    // ("Lumb" for "James Thomas Lumb"); other names may have words written short.
    const shortKind =
      shortForm ??
      (keyEqual || exact >= ONE_SIDED_QUALIFIER_CREDIT
        ? null
        : personLike
          ? soleSurname(norm, a, words)
            ? "surname"
            : null
          : abbreviatedFrom(norm, a.tokens)
            ? "abbreviated"
            : null);
    if (keyEqual) {
      const credit = keyCredit(norm, a, personLike);
      if (credit > exact || keyKind !== "exact") {
        exact = Math.max(exact, credit);
        keyKind = "exact";
      }
    } else if (coreEqual) {
      // "Goroka Airport" / "Goroka": the same name but for a word many of the table's names carry.
      bestAlias = a;
      wordsAlike = true;
      if (exact < ONE_SIDED_QUALIFIER_CREDIT) {
        exact = ONE_SIDED_QUALIFIER_CREDIT;
        keyKind = "core";
      }
    } else if (shortKind !== null) {
      // A name less words that still point at this entry only, its words some written short, or a
      // person's sole surname: as strong as a name with a one-sided qualifier (SOLE_SURNAME_CREDIT
      // is that credit).
      jw = 1;
      lev = 1;
      tok = 1;
      bestAlias = a;
      wordsAlike = true;
      exact = ONE_SIDED_QUALIFIER_CREDIT;
      keyKind = shortKind;
    } else if (exact < OCR_KEY_CREDIT && norm.ocrKey === a.ocr) {
      exact = OCR_KEY_CREDIT;
      keyKind = "ocr";
    } else if (!personLike && exact < 1 && norm.full === a.full) {
      // The same words, one side reading some as a qualifier: "Virgin Islands, British" against
      // "Virgin Islands (British)".
      bestAlias = a;
      wordsAlike = true;
      exact = 1;
      keyKind = "exact";
    } else if (
      !personLike &&
      exact < REORDERED_KEY_CREDIT &&
      (sameWordsReordered(norm.tokens, a.tokens) ||
        // The full forms hold more words than the keys only where a side carries a qualifier.
        ((norm.full !== norm.key || a.full !== a.key) &&
          sameWordsReordered(norm.full.split(" "), a.full.split(" "))))
    ) {
      // Compared as the same words sorted (a "token sort" comparison), the names are equal.
      jw = 1;
      lev = 1;
      bestAlias = a;
      wordsAlike = true;
      exact = REORDERED_KEY_CREDIT;
      keyKind = "reordered";
    }
    if (abbr < 1) {
      abbreviationKind = abbreviationOf(norm, a, personLike);
      if (abbreviationKind !== null) abbr = 1;
    }
    // Once a name is spelled as the mention, exactly and with the same qualifiers, no other name
    // can raise a name feature: only an abbreviation reading is left to find.
    if (exact === 1 && keyKind === "exact" && jw === 1 && lev === 1 && tok === 1) {
      for (let i = ai + 1; i < aliases.length && abbr < 1; i++) {
        const kind = abbreviationOf(norm, aliases[i]!, personLike);
        // Another alias that is this name's acronym ("S.G.E." beside "Stenning Grain Exchange")
        // reads as "acronym-inside", which a name spelled exactly has no need of.
        if (kind !== null && kind !== "acronym-inside") {
          abbreviationKind = kind;
          abbr = 1;
        }
      }
      break;
    }
  }
  return {
    jaroWinkler: jw,
    levenshtein: lev,
    tokenSet: tok,
    abbreviation: abbr,
    exactKey: exact,
    bestAlias,
    abbreviationKind,
    keyKind,
    spelledAlike:
      wordsAlike ||
      keyKind === "exact" ||
      abbreviationKind !== null ||
      entity.aliases.some((a) => containsAll(a.tokens, norm.tokens)),
    apartWords,
  };
}

/**
 * Popularity lead at which the prominence feature is 1: a thousandfold. The default weight is
 * half its log (see DEFAULT_WEIGHTS), so that the feature adds half the log of the lead, as if
 * mentions named namesakes in proportion to the square root of their popularity.
 */
export const PROMINENCE_FULL_LEAD = 1000;

/** The prominence feature of a prior over its namesakes' highest: log lead, 1 at PROMINENCE_FULL_LEAD. */
export function prominenceOf(prior: number, rival: number): number {
  return Math.min(1, Math.log((1 + prior) / (1 + rival)) / Math.log(PROMINENCE_FULL_LEAD));
}

/**
 * True when the mention is the alias's words with some written short (NormalizedName.abbreviated:
 * "Calif." for "California", "Harrowm. Wharf" for "Harrowmouth Wharf"), the others as written or,
 * beside them, a lone initial of a compass point (COMPASS_INITIALS: "W. Va.", "N. Dak.").
 */
function abbreviatedFrom(norm: NormalizedName, alias: readonly string[]): boolean {
  const m = norm.tokens;
  if (norm.abbreviated.length === 0 || m.length !== alias.length) return false;
  let short = 0;
  for (let i = 0; i < m.length; i++) {
    if (m[i] === alias[i]) continue;
    if (COMPASS_INITIALS[m[i]!]?.includes(alias[i]!)) continue;
    if (!norm.abbreviated.includes(m[i]!) || !abbreviates(m[i]!, alias[i]!)) return false;
    short++;
  }
  return short > 0;
}

/** A token of digits only: "District 1" and "District 2" are two districts. */
const NUMBER = /^\d+$/;

/**
 * True when two names set themselves against each other: a word of one that the other lacks
 * and a word of the other that the first lacks are of one kind but differ in value
 * (CONTRASTING_WORDS: "South" / "North", "Upper" / "Lower", "Great" / "Little"), or are two
 * different numbers.
 */
export function namesContrast(x: readonly string[], y: readonly string[]): boolean {
  for (const a of x) {
    const ka = CONTRASTING_WORDS[a];
    const na = NUMBER.test(a);
    if (ka === undefined && !na) continue;
    if (y.includes(a)) continue;
    for (const b of y) {
      if (x.includes(b)) continue;
      if (na) {
        if (NUMBER.test(b)) return true;
        continue;
      }
      const kb = CONTRASTING_WORDS[b];
      if (kb !== undefined && kb[0] === ka![0] && kb[1] !== ka![1]) return true;
    }
  }
  return false;
}

/** What abbreviation reading, if any, makes the mention one of the alias's forms. */
function abbreviationOf(
  norm: NormalizedName,
  a: AliasRow,
  personLike: boolean,
): NameMatch["abbreviationKind"] {
  if (norm.acronym !== null && aliasAcronyms(a).includes(norm.acronym)) return "acronym";
  if (personLike && initialsCompatible(norm.tokens, a.tokens)) return "initials";
  if (sameWordsWithEmbeddedAcronyms(norm.tokens, a.tokens)) return "acronym-inside";
  return null;
}

/** A name's tokens split into its generic words (table-words.ts) and the rest, its core. */
interface GenericSplit {
  core: string[];
  generic: string[];
}

function splitGeneric(tokens: readonly string[], generic: ReadonlySet<string>): GenericSplit {
  const core: string[] = [];
  const words: string[] = [];
  for (const t of tokens) {
    const g = genericWordFor(t, generic);
    if (g === null) core.push(t);
    else words.push(g);
  }
  return { core, generic: words };
}

/**
 * True when two names are to be compared by their cores: at least one carries generic words, the
 * mention has a core, and one side's generic words are all among the other's (or it has none).
 * An alias of generic words only ("International Airport") then has an empty core and earns
 * nothing from the words it shares with every other name. Two different generic words ("X
 * Airport" / "X Heliport") tell entries apart, as two different legal forms do, so such names
 * are compared whole.
 */
function comparableCores(m: GenericSplit, a: GenericSplit): boolean {
  if (m.generic.length === 0 && a.generic.length === 0) return false;
  if (m.core.length === 0) return false;
  if (m.generic.length === 0 || a.generic.length === 0) return true;
  return containsAll(m.generic, a.generic) || containsAll(a.generic, m.generic);
}

/**
 * Shortest word of a mention set aside because the candidate's record carries it: shorter ones
 * are abbreviations and particles ("Sr.", "St.", "de") that records carry in passing.
 */
export const MIN_ATTESTED_WORD_LENGTH = 3;

/**
 * True when the mention's words are the alias's words led by words its candidate's own record
 * carries (`attested`: in its description or attributes, such as its town): "Yantai Laishan"
 * for "Laishan" of Yantai, "Stockholm-Arlanda" for "Arlanda" of Stockholm. Only leading words
 * are set aside, as a town is put before a name; trailing ones ("Wickinock Cooperage" for the
 * coopers "Wickinock & Sons") more often name something else of the same stem.
 */
function sameBeyondAttested(
  mention: readonly string[],
  alias: readonly string[],
  attested: (token: string) => boolean,
): boolean {
  const lead = mention.length - alias.length;
  if (alias.length === 0 || lead <= 0) return false;
  for (let i = 0; i < alias.length; i++) if (mention[lead + i] !== alias[i]) return false;
  for (let i = 0; i < lead; i++) {
    const t = mention[i]!;
    if (t.length < MIN_ATTESTED_WORD_LENGTH || !attested(t)) return false;
  }
  return true;
}

/**
 * True when the mention is the alias followed by words its record gives as its kind ("Bhola
 * District" for Bhola, a district; "Ivanovo Oblast"), or such words and "of" before the alias
 * ("Metropolitan City of Bologna" for Bologna, a metropolitan city). Gazetteers, directories and
 * registers name a place or a body by its name alone and give its kind in a column of its own;
 * texts put the two together.
 */
function withKindWords(mention: readonly string[], alias: readonly string[], words: WordEvidence): boolean {
  const extra = mention.length - alias.length;
  if (extra <= 0) return false;
  const isKind = (t: string) => t.length >= MIN_ATTESTED_WORD_LENGTH && words.kind(t);
  if (isPrefix(alias, mention) && mention.slice(alias.length).every(isKind)) return true;
  return (
    extra >= 2 &&
    mention[extra - 1] === "of" &&
    isSuffix(alias, mention) &&
    mention.slice(0, extra - 1).every(isKind)
  );
}

/**
 * True when a person's mention is a surname alone (one word, MIN_ATTESTED_WORD_LENGTH letters or
 * more, no initial) that ends the alias, a name of two words or more: as written, or as OCR
 * misreads it ("Cleg" for Clegg: doubled letters and look-alikes folded).
 */
function surnameAlone(norm: NormalizedName, alias: AliasRow): boolean {
  if (norm.tokens.length !== 1 || alias.tokens.length < 2) return false;
  const written = norm.tokens[0]!;
  const surname = alias.tokens[alias.tokens.length - 1]!;
  return (
    written.length >= MIN_ATTESTED_WORD_LENGTH && (written === surname || norm.ocrKey === ocrFold(surname))
  );
}

/**
 * True when a person's mention is a surname alone (surnameAlone) and no other person of the
 * table has a name holding it (see SOLE_SURNAME_CREDIT).
 */
function soleSurname(norm: NormalizedName, alias: AliasRow, words: WordEvidence | null): boolean {
  return (
    words !== null && surnameAlone(norm, alias) && words.soleBearer(alias.tokens[alias.tokens.length - 1]!)
  );
}

/** Least Jaro-Winkler similarity of two given names read as one name misspelled or misread. */
const GIVEN_NAME_SPELLING_JW = 0.85;
/**
 * Shortest given name compared in full: shorter ones are initials, clerks' shortenings ("Geo.",
 * "Saml.", "Wm."), and these misread ("Gco.", "Sarnl.", "Wrn.") too often to tell anything.
 */
const MIN_FULL_GIVEN_NAME = 5;

/** True when two full given names may be one person's: equal, a spelling, shortening or pet form. */
function givenNamesAgree(a: string, b: string): boolean {
  if (a === b || a.startsWith(b) || b.startsWith(a)) return true;
  if (jaroWinkler(a, b) >= GIVEN_NAME_SPELLING_JW) return true;
  // Misread in print: "Emest" for Ernest, "Eclith" for Edith, "Arnbrose" for Ambrose.
  if (jaroWinkler(ocrFold(a), ocrFold(b)) >= GIVEN_NAME_SPELLING_JW) return true;
  return petForms(a, b) || petFormsOfOneName(a, b);
}

/**
 * True when the mention names a person by a full given name and surname and the entity's names
 * give full given names none of which agrees with it (givenNamesAgree), its middle names
 * included: "Josiah Aldous" is not Jabez Harcourt Aldous, while "Harcourt Aldous", "Jabcz Aldous"
 * (misread) and "Harry Pell" for Henry Pell are. A mention whose first word is the entity's
 * surname (a name printed surname first) is not judged.
 */
export function givenNamesDiffer(norm: NormalizedName, entity: EntityRow): boolean {
  const m = norm.tokens;
  if (m.length < 2 || m[0]!.length < MIN_FULL_GIVEN_NAME) return false;
  const given = m[0]!;
  let fullGiven = false;
  for (const a of entity.aliases) {
    const t = a.tokens;
    if (t.length < 2) continue;
    if (t[t.length - 1] === given) return false;
    if (t[0]!.length >= MIN_FULL_GIVEN_NAME) fullGiven = true;
    for (let i = 0; i < t.length - 1; i++) {
      const w = t[i]!;
      if (w.length >= MIN_FULL_GIVEN_NAME && givenNamesAgree(given, w)) return false;
      // The mention's middle names may be the entity's given name ("J. Harcourt Aldous").
      for (let k = 1; k < m.length - 1; k++)
        if (m[k]!.length >= MIN_FULL_GIVEN_NAME && givenNamesAgree(m[k]!, w)) return false;
    }
  }
  return fullGiven;
}

/**
 * True when the mention's honorific says one sex and the entity's given name the other: "Mrs.
 * Lumb" is not James Thomas Lumb (but may be his wife), "Mrs. John Pell" is John Pell's wife,
 * "Mr. Tattersall" is not Mary Tattersall. Record linkage of the period compares sexes where
 * the records give them (common practice); a wrong join of a wife to her husband's record is
 * the kind of harm the README warns of.
 * The given names are the first words of the entity's names (FEMALE_GIVEN_NAMES,
 * MALE_GIVEN_NAMES); an initial or an unknown name says nothing.
 */
function sexesDiffer(norm: NormalizedName, entity: EntityRow): boolean {
  // The honorifics leading the name ("Mrs.", "the late Mr."), or closing it ("Pell, Miss").
  const words = norm.folded;
  let said: "female" | "male" | null = null;
  const read = (t: string) => {
    if (FEMALE_HONORIFICS.has(t)) said = "female";
    else if (MALE_HONORIFICS.has(t)) said = "male";
  };
  for (let i = 0; i < words.length - 1 && HONORIFICS.has(words[i]!); i++) read(words[i]!);
  if (words.length > 1) read(words[words.length - 1]!);
  if (said === null) return false;
  const other = said === "female" ? MALE_GIVEN_NAMES : FEMALE_GIVEN_NAMES;
  return entity.aliases.some((a) => a.tokens.length >= 2 && other.has(a.tokens[0]!));
}

/**
 * How a mention that is an entry's name less some words (or more) still names that entry alone,
 * or null:
 * "attested" when the words left over lead the name and the entry's own record carries them
 * ("Yantai Laishan Airport" / "Laishan" of Yantai; compared by cores where the table has generic
 * words), "part" when the mention is the first or last words of the name and no other entry has
 * a name holding them all, the table's generic words aside ("Lek" / "Albanian Lek", "Brunei" /
 * "Brunei Darussalam", "Saint Helena" / "Saint Helena, Ascension and Tristan da Cunha"; but not
 * "Castro Airport" / "General Leite de Castro Airport" where another Castro is listed), and the
 * words it leaves out may be left out (wordsNotToLeaveOut: "Police Court" / "Harrowmouth Police
 * Court" of Harrowmouth, yes; "Catalan" / "Catalan Sign Language" in a list of languages that
 * also holds "Ukrainian" and "Ukrainian Sign Language", no); "head" when the mention is the name,
 * one entry's alone, followed by a complement after "of" or "and"; "extended" when the candidate
 * is a `firm` and the mention is its name, one entry's alone, and MAX_EXTENSION_WORDS words more.
 */
function shortFormKind(
  mention: readonly string[],
  alias: readonly string[],
  mentionCore: readonly string[],
  aliasCore: readonly string[],
  words: WordEvidence | null,
  firm = false,
): "attested" | "part" | "head" | "extended" | "kind" | null {
  if (words === null) return null;
  if (sameBeyondAttested(mentionCore, aliasCore, (t) => words.attested(t))) return "attested";
  if (aliasCore.length > 0 && withKindWords(mention, alias, words)) return "kind";
  // The mirror of a head before "of" or "and": the mention says more, after a name of the table
  // that is one entry's alone ("United Kingdom of Great Britain and Northern Ireland" for "United
  // Kingdom", "Svalbard and Jan Mayen" for "Svalbard"); a firm's "& Co." or "& Sons" read as
  // words (as a place's name reads them) is no complement.
  if (
    alias.length < mention.length &&
    aliasCore.length > 0 &&
    complementFollows(alias, mention) &&
    !mention.slice(alias.length + 1).every((t) => LEGAL_FORMS[t] !== undefined) &&
    alias.every((t) => t.length >= MIN_ATTESTED_WORD_LENGTH) &&
    words.alone(aliasCore)
  )
    return "head";
  // A firm's registered name says more than the name it goes by ("Polar Air Cargo Worldwide",
  // "Martinair Holland", "Calm Air International"): the name, one entry's alone, then a word or
  // two that the table does not tell entries apart by. Not for places, whose added words make
  // other places ("Saint-Denis-de-Pile" is not Saint-Denis), nor persons, whose names never
  // gain words so.
  if (
    firm &&
    alias.length < mention.length &&
    mention.length - alias.length <= MAX_EXTENSION_WORDS &&
    isPrefix(alias, mention) &&
    aliasCore.length > 0 &&
    words.labelFits() &&
    words.alone(aliasCore) &&
    !words.separates(mention.slice(alias.length), false)
  )
    return "extended";
  // A part of another kind's name is the town a court or a board is named after, or the family
  // a firm is: the part reading is kept to entries of the kind the mention's label says.
  if (
    mention.length < alias.length &&
    (isPrefix(mention, alias) || isSuffix(mention, alias)) &&
    mention.every((t) => t.length >= MIN_ATTESTED_WORD_LENGTH) &&
    mentionCore.length > 0 &&
    words.labelFits()
  ) {
    // Words each carried by this entry's names only may leave out what the table does not tell
    // entries apart by; words that only together are this entry's ("Saint Helena", "United
    // States") only what is the entry's own, since the rest may name the thing itself ("United
    // States Minor Outlying Islands" is not the United States).
    if (mentionCore.every((t) => words.unique(t)))
      return wordsNotToLeaveOut(mention, alias, words) === null ? "part" : null;
    if (
      words.alone(mentionCore) &&
      (notOwnWords(mention, alias, words).length === 0 || complementFollows(mention, alias))
    )
      return "part";
  }
  return null;
}

/**
 * Words of three letters or more that join a name's parts rather than name anything: left out of
 * a name ("Saint Helena, Ascension and Tristan da Cunha") as particles are.
 */
const JOINING_WORDS: ReadonlySet<string> = new Set([
  "and",
  "the",
  "for",
  "del",
  "des",
  "les",
  "los",
  "las",
  "van",
  "von",
]);

/**
 * Words that open a complement after a name's head: what follows them adds to the name rather
 * than naming the thing ("United Kingdom of Great Britain and Northern Ireland", "Svalbard and Jan
 * Mayen").
 */
const COMPLEMENT_OPENERS: ReadonlySet<string> = new Set(["of", "and"]);
/**
 * Most words a firm's mention may add after a name of the table for the "extended" reading: a
 * descriptor or two ("Worldwide", "Air Lease"); more make another firm's name as often as not.
 */
const MAX_EXTENSION_WORDS = 2;

/**
 * True when `mention` is the first words of `alias` and the rest opens with "of" or "and": the
 * mention is the name's head ("United Kingdom"), the rest its complement.
 */
function complementFollows(mention: readonly string[], alias: readonly string[]): boolean {
  return isPrefix(mention, alias) && COMPLEMENT_OPENERS.has(alias[mention.length] ?? "");
}

/** The words of `alias` that `mention` lacks and that are not the entry's own (see wordsNotToLeaveOut). */
function notOwnWords(mention: readonly string[], alias: readonly string[], words: WordEvidence): string[] {
  return alias.filter(
    (t) =>
      t.length >= MIN_ATTESTED_WORD_LENGTH &&
      !JOINING_WORDS.has(t) &&
      !mention.includes(t) &&
      !words.unique(t) &&
      !words.carried(t),
  );
}

/**
 * Null when a mention whose words `alias` holds may stand for it, lacking the alias's other words;
 * else the words it lacks that are not the entry's own. It may when each of those is the entry's
 * own (carried by no other entry's names, or by the entry's own record: "Harrowmouth" of the
 * Harrowmouth Police Court; or a particle: shorter than MIN_ATTESTED_WORD_LENGTH, or one of the
 * JOINING_WORDS), or when they lead or end the alias and the table does not tell entries apart
 * by them (separates). In a list of languages "Khmer" and "Northern Khmer", "English" and "Old
 * English", "Ukrainian" and "Ukrainian Sign Language" are different entries, so a mention of a
 * language the table lacks must not take its "Old" or "Sign Language" namesake; in a list of
 * countries nothing is called "Pitcairn" beside "Pitcairn Islands".
 */
function wordsNotToLeaveOut(
  mention: readonly string[],
  alias: readonly string[],
  words: WordEvidence,
): string[] | null {
  const notOwn = notOwnWords(mention, alias, words);
  if (notOwn.length === 0) return null;
  if (mention.length < alias.length) {
    if (isPrefix(mention, alias) && !words.separates(alias.slice(mention.length), false)) return null;
    if (isSuffix(mention, alias) && !words.separates(alias.slice(0, alias.length - mention.length), true))
      return null;
  }
  return notOwn;
}

/** True when two names of two or more words hold the same words, in another order. */
function sameWordsReordered(x: readonly string[], y: readonly string[]): boolean {
  if (x.length < 2 || x.length !== y.length || sameTokens(x, y)) return false;
  const rest = y.slice();
  for (const t of x) {
    const i = rest.indexOf(t);
    if (i < 0) return false;
    rest.splice(i, 1);
  }
  return true;
}

/** True when `part` is the first words of `whole`. */
function isPrefix(part: readonly string[], whole: readonly string[]): boolean {
  for (let i = 0; i < part.length; i++) if (part[i] !== whole[i]) return false;
  return true;
}

/** True when `part` is the last words of `whole`. */
function isSuffix(part: readonly string[], whole: readonly string[]): boolean {
  const off = whole.length - part.length;
  for (let i = 0; i < part.length; i++) if (part[i] !== whole[off + i]) return false;
  return true;
}

function sameTokens(x: readonly string[], y: readonly string[]): boolean {
  if (x.length !== y.length) return false;
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return false;
  return true;
}

/** True when every token of `part` occurs in `whole` (a mention's words found as written). */
function containsAll(whole: readonly string[], part: readonly string[]): boolean {
  if (part.length === 0 || part.length > whole.length) return false;
  for (const t of part) if (!whole.includes(t)) return false;
  return true;
}

/**
 * Token-set overlap of a mention's tokens and an alias's: the mean of the fuzzy Dice coefficient
 * (penalizes extra tokens on either side) and the mention's coverage (the share of the mention's
 * tokens the alias accounts for). A short form contained in the full name, "Aldous" in "Josiah
 * Aldous" or "Brunei" in "Brunei Darussalam", is covered fully; a mention saying more than the
 * alias is not: "United Mexican States" holds the alias "United States" but names something
 * else, as "Wexcombe Grain Co." is not the town "Wexcombe". Acronyms inside either name are read
 * first ("U.S." for "United States", see embedded-acronyms.ts). With `covers` false the mention's
 * coverage is not counted: the Dice coefficient alone.
 */
export function tokenOverlap(mention: readonly string[], alias: readonly string[], covers = true): number {
  if (mention.length === 0 || alias.length === 0) return 0;
  const m = foldEmbeddedAcronyms(mention, alias);
  const a = foldEmbeddedAcronyms(alias, m);
  const dice = tokenSetSimilarity(m, a);
  if (!covers) return dice;
  const matched = (dice * (m.length + a.length)) / 2;
  const coverage = Math.min(1, matched / m.length);
  return (dice + coverage) / 2;
}

/**
 * The acronyms an alias answers to: of its core tokens (two or more), and of its place designator
 * and core in either order ("DRC" for "Democratic Republic of the Congo", whose key is "congo");
 * the full form holds the core first, then the qualifier words (see normalizeName).
 */
function aliasAcronyms(a: AliasRow): string[] {
  const out = a.tokens.length >= 2 ? [acronymOfTokens(a.tokens)] : [];
  if (a.full.length > a.key.length && a.full.startsWith(a.key)) {
    const qualifier = a.full.slice(a.key.length).trim().split(" ");
    // Leading ("Democratic Republic of the Congo") or trailing ("Lao People's Democratic Republic").
    out.push(acronymOfTokens([...qualifier, ...a.tokens]), acronymOfTokens([...a.tokens, ...qualifier]));
  }
  return out;
}

/**
 * A name's qualifier words (legal form, place designator): what its full form holds beyond its
 * key, or "" when it has none. The full form holds the core first, then the qualifier words; a
 * full form that does not start with the key (a reordered name) counts as its own qualifier.
 */
function qualifierOf(n: { full: string; key: string }): string {
  if (n.full === n.key) return "";
  return n.full.startsWith(n.key) ? n.full.slice(n.key.length).trim() : n.full;
}

/** A person alias's generational suffix: the token its full form has beyond its key. */
function suffixOf(a: AliasRow): string | null {
  if (a.full === a.key || !a.full.startsWith(a.key)) return null;
  return a.full.slice(a.key.length).trim() || null;
}

/**
 * The prior feature for a KB whose largest prior is `maxPrior`: log1p(prior) / log1p(max prior),
 * popularity on a log scale, so a city does not drown a village. The denominator is computed
 * once, since the pre-rank asks for hundreds of entities per mention.
 */
export function priorFeatureFor(maxPrior: number): (prior: number) => number {
  const logMaxPrior = Math.log1p(maxPrior);
  return (prior) => (maxPrior <= 0 || prior <= 0 ? 0 : Math.min(1, Math.log1p(prior) / logMaxPrior));
}

/**
 * Assemble the feature vector; `context` is the TF-IDF cosine (src/score/context.ts), `nearNameRate`
 * the table's (src/link/crowding.ts), which nearSpelling takes when the name is not spelled alike.
 */
export function features(
  name: NameMatch,
  context: number,
  typeMatch: number,
  prior: number,
  nearNameRate: number,
  contextConflict = 0,
): Features {
  return {
    jaroWinkler: name.jaroWinkler,
    levenshtein: name.levenshtein,
    tokenSet: name.tokenSet,
    abbreviation: name.abbreviation,
    exactKey: name.exactKey,
    context,
    typeMatch,
    prior,
    nearSpelling: name.spelledAlike ? 0 : nearNameRate,
    contextConflict,
    prominence: 0,
  };
}
