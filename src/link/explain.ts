/**
 * Reasons: structured codes with the values they cite and one short sentence each, for the chosen
 * candidate (why it won) and for the decision (why a link, or why NIL).
 */
import type { Decision } from "../decide/decide.js";
import { type NameMatch, PROMINENCE_FULL_LEAD } from "../score/features.js";
import type { CandidatePath, Features, Reason } from "../types.js";

const r3 = (x: number) => Math.round(x * 1000) / 1000;

/** A name feature value at or above this is called "similar" in the reasons. */
const SIMILAR_NAME = 0.85;
/** A context cosine at or above this is cited as overlap. */
const CONTEXT_CITED = 0.05;
/** A type compatibility below this is cited as a mismatch. */
const TYPE_MISMATCH_BELOW = 0.99;

export interface Explained {
  entity: string;
  name: string;
  features: Features;
  name_: NameMatch;
  paths: Set<CandidatePath>;
  sharedTerms: string[];
  /** The values of the table's kind columns the context names (cited when contextConflict fires). */
  contextKinds: () => string[];
  /** The entity's table type, asked for only when a type mismatch is cited (it may cost a row read). */
  entityType: () => string;
  mentionType: string | null;
}

/**
 * The reason cited for each key match but an exact one (see NameMatch.keyKind): its code and its
 * sentence, given how the alias is called ("the name", "an alias") and its text.
 */
const KEY_MATCH_REASONS: Record<
  Exclude<NonNullable<NameMatch["keyKind"]>, "exact">,
  { code: string; message: (aliasWord: string, text: string) => string }
> = {
  core: {
    code: "name-core",
    message: (w, t) => `equals ${w} "${t}" once words that many of this table's names carry are set aside`,
  },
  attested: {
    code: "name-attested",
    message: (w, t) =>
      `equals ${w} "${t}" once the words the entry's own record carries (its town, its country) are set aside`,
  },
  part: {
    code: "name-unique-part",
    message: (w, t) => `the first or last words of ${w} "${t}", words no other entry's names carry`,
  },
  head: {
    code: "name-head",
    message: (w, t) => `${w} "${t}", followed in the mention by a complement ("of ...", "and ...")`,
  },
  extended: {
    code: "name-extended",
    message: (w, t) =>
      `${w} "${t}" and a word or two more, as a firm's registered name adds to the name in use`,
  },
  kind: {
    code: "name-kind",
    message: (w, t) => `${w} "${t}" with the kind the entry's record gives it (its type or category)`,
  },
  abbreviated: {
    code: "name-abbreviated",
    message: (w, t) => `${w} "${t}" with words written short ("Calif." for "California")`,
  },
  surname: {
    code: "name-surname",
    message: (w, t) => `the surname of ${w} "${t}", alone; no other person's name in the table holds it`,
  },
  reordered: { code: "name-reordered", message: (w, t) => `the same words as ${w} "${t}", in another order` },
  ocr: { code: "ocr-key", message: (_w, t) => `matches "${t}" once common OCR confusions are folded` },
};

/** Reasons about the evidence for one candidate. */
export function evidenceReasons(c: Explained): Reason[] {
  const out: Reason[] = [];
  const alias = c.name_.bestAlias;
  const aliasWord = alias.canonical ? "the name" : "an alias";
  if (c.name_.sexDiffers === true) {
    out.push({
      code: "sex-differs",
      message: `the mention's honorific and the given name of "${c.name}" say different sexes: no name evidence`,
    });
  }
  if (c.name_.givenNameDiffers === true) {
    out.push({
      code: "given-name-differs",
      message: `the mention's given name is none of "${c.name}"'s, nor a spelling or pet form of one: no name evidence`,
    });
  }
  if (c.name_.keyKind === "exact") {
    out.push({
      code: alias.canonical ? "name-exact" : "alias-exact",
      message: `normalized text equals ${aliasWord} "${alias.text}"`,
      alias: alias.text,
    });
    if (c.name_.possessiveDropped === true) {
      out.push({
        code: "possessive-dropped",
        message:
          "matched once the mention's closing possessive (\"'s\") is set aside, so the key counts less",
        exactKey: r3(c.features.exactKey),
      });
    } else if (c.features.exactKey < 1) {
      out.push({
        code: "qualifier-differs",
        message: "same name, but one side lacks the other's legal form or place designator",
        exactKey: r3(c.features.exactKey),
      });
    }
  } else if (c.name_.keyKind !== null) {
    const r = KEY_MATCH_REASONS[c.name_.keyKind];
    out.push({ code: r.code, message: r.message(aliasWord, alias.text), alias: alias.text });
  }
  if (c.name_.abbreviationKind === "acronym") {
    out.push({ code: "acronym", message: `reads as the acronym of "${c.name}"` });
  } else if (c.name_.abbreviationKind === "initials") {
    out.push({ code: "initials", message: `initials and surname fit "${alias.text}"`, alias: alias.text });
  } else if (c.name_.abbreviationKind === "acronym-inside") {
    out.push({
      code: "acronym-inside",
      message: `the same words as "${c.name}" once the acronym inside is read`,
    });
  }
  if (c.name_.keyKind === null && c.name_.abbreviationKind === null && c.name_.apartWords !== null) {
    out.push({
      code: "words-apart",
      message: `"${alias.text}" adds words other entries' names carry too (${c.name_.apartWords.join(", ")}), which this table tells entries apart by: not read as a short form of it`,
      words: c.name_.apartWords,
    });
  }
  if (c.name_.keyKind === null && c.features.jaroWinkler >= SIMILAR_NAME) {
    out.push({
      code: "name-similar",
      message: `name similar to ${aliasWord} "${alias.text}" (Jaro-Winkler ${r3(c.features.jaroWinkler)})`,
      alias: alias.text,
      jaroWinkler: r3(c.features.jaroWinkler),
      levenshtein: r3(c.features.levenshtein),
      tokenSet: r3(c.features.tokenSet),
    });
  }
  if (c.features.nearSpelling > 0) {
    const pct = Math.round(1000 * c.features.nearSpelling) / 10;
    out.push({
      code: "near-spelling",
      message: `spelled only near the entry's names, in a table where ${pct}% of names have another entry's near spelling: counts less`,
      nearNameRate: r3(c.features.nearSpelling),
    });
  }
  if (c.features.prominence > 0) {
    const lead = Math.round(PROMINENCE_FULL_LEAD ** c.features.prominence);
    out.push({
      code: "prominent",
      message: `the most popular of candidates that name, type and context cannot tell apart: its prior leads theirs about ${lead}-fold`,
      lead,
    });
  }
  if (c.features.contextConflict > 0) {
    const named = c.contextKinds();
    out.push({
      code: "context-conflict",
      message: `the context names ${named.map((v) => `"${v}"`).join(", ")} but not the value the entry's record gives in the same column (its country, its county...): counts against`,
      values: named,
    });
  }
  if (c.features.context >= CONTEXT_CITED) {
    out.push({
      code: "context-overlap",
      message: `context shares ${c.sharedTerms.length} weighted word(s) with the entry (${c.sharedTerms.slice(0, 4).join(", ")}); cosine ${r3(c.features.context)}`,
      cosine: r3(c.features.context),
      terms: c.sharedTerms.slice(0, 8),
    });
  }
  if (c.mentionType !== null && c.features.typeMatch < TYPE_MISMATCH_BELOW) {
    const entityType = c.entityType();
    out.push({
      code: "type-mismatch",
      message: `mention labeled ${c.mentionType} but the entry is a ${entityType} (compatibility ${r3(c.features.typeMatch)})`,
      label: c.mentionType,
      entityType,
      compatibility: r3(c.features.typeMatch),
    });
  }
  out.push({ code: "found-by", message: `found by ${[...c.paths].join(", ")}`, paths: [...c.paths] });
  return out;
}

/** The reason for the decision itself. */
export function decisionReason(
  d: Decision,
  threshold: number,
  minMargin: number,
  best: { entity: string; name: string } | null,
  runnerUp: { entity: string; name: string } | null,
): Reason {
  switch (d.outcome) {
    case "link":
      return {
        code: "linked",
        message: `score ${r3(d.bestScore)} >= threshold ${threshold} and margin ${r3(d.margin)} >= ${minMargin}`,
        score: r3(d.bestScore),
        threshold,
        margin: r3(d.margin),
        minMargin,
      };
    case "no-candidates":
      return {
        code: "no-candidates",
        message: "no entry of a compatible type matched any key, token or fuzzy variant",
      };
    case "below-threshold":
      return {
        code: "below-threshold",
        message: `best candidate ${best?.entity} "${best?.name}" scored ${r3(d.bestScore)}, below the threshold ${threshold}`,
        best: best?.entity,
        score: r3(d.bestScore),
        threshold,
      };
    case "ambiguous":
      return {
        code: "ambiguous",
        message: `${best?.entity} "${best?.name}" and ${runnerUp?.entity} "${runnerUp?.name}" score within ${r3(d.margin)} (< ${minMargin})`,
        best: best?.entity,
        runnerUp: runnerUp?.entity,
        margin: r3(d.margin),
        minMargin,
      };
  }
}
