/**
 * Turns a generated entity into a noisy mention, as a digitized gazette prints it: another
 * surface form (alias, initials, honorific, "Last, First", legal-form or prefix variation), then
 * character noise (OCR confusions, dropped or swapped letters, case changes), and a context of
 * the entity's topic words mixed with distractors.
 */

import type { Rng } from "./prng.js";
import { CARGOES, DISTRACTORS, FEMALE_HONORIFICS, MALE_HONORIFICS, RIVERS, ROLES } from "./vocab.js";
import type { FirmParts, GenEntity, PersonParts, TownParts, VesselParts } from "./world.js";

/** Share of mentions printed exactly as the canonical name (before character noise). */
const CANONICAL_SHARE = 0.4;
/** Share printed as one of the table's aliases; the rest get a structural variant. */
const ALIAS_SHARE = 0.3;
/**
 * Cumulative probabilities of applying 0, 1, 2 or 3 character-noise operations. Half the
 * mentions stay clean; the tail models badly scanned pages.
 */
const NOISE_COUNT_CUMULATIVE: readonly number[] = [0.5, 0.8, 0.95, 1];

/** OCR confusion pairs, both directions: what was printed -> what the scanner read. */
export const OCR_CONFUSIONS: readonly (readonly [string, string])[] = [
  ["m", "rn"],
  ["rn", "m"],
  ["d", "cl"],
  ["cl", "d"],
  ["l", "1"],
  ["1", "l"],
  ["o", "0"],
  ["0", "o"],
  ["s", "5"],
  ["5", "s"],
  ["e", "c"],
  ["c", "e"],
];

/** Equivalent printings of legal forms. */
const LEGAL_VARIANTS: Record<string, readonly string[]> = {
  "& Co.": ["and Co.", "& Company", "& Co", "and Company"],
  "& Sons": ["and Sons", "& Son", "& Sons Ltd."],
  "Bros.": ["Brothers", "Bros", "Bro's"],
  "Ltd.": ["Limited", "Ltd", "Ltd"],
  "Co.": ["Company", "Co", "Coy."],
  Company: ["Co.", "Coy.", "Co"],
  "Co. Ltd.": ["Company Limited", "Co. Limited", "Co Ltd"],
};

/** The surface text of a mention of `entity`, with structural and character noise. */
export function mentionText(entity: GenEntity, rng: Rng): string {
  const u = rng.next();
  let text: string;
  if (u < CANONICAL_SHARE || (u < CANONICAL_SHARE + ALIAS_SHARE && entity.aliases.length === 0)) {
    text = entity.name;
  } else if (u < CANONICAL_SHARE + ALIAS_SHARE) {
    text = rng.pick(entity.aliases);
  } else {
    text = structuralVariant(entity, rng);
  }
  const v = rng.next();
  const count = NOISE_COUNT_CUMULATIVE.findIndex((p) => v < p);
  for (let i = 0; i < count; i++) text = characterNoise(text, rng);
  return text;
}

/** A different printing of the entity's name, built from its parts. */
export function structuralVariant(entity: GenEntity, rng: Rng): string {
  const parts = entity.parts;
  switch (parts.kind) {
    case "person":
      return personVariant(parts, rng);
    case "firm":
      return firmVariant(parts, rng);
    case "town":
      return townVariant(parts, rng);
    case "vessel":
      return vesselVariant(parts, rng);
  }
}

function personVariant(p: PersonParts, rng: Rng): string {
  const initial = `${p.given.charAt(0)}.`;
  const initials = p.middle === null ? initial : `${initial} ${p.middle}.`;
  const full = p.middle === null ? `${p.given} ${p.surname}` : `${p.given} ${p.middle}. ${p.surname}`;
  const u = rng.next();
  if (u < 0.3) return `${initials} ${p.surname}`;
  if (u < 0.55) {
    const honorific = rng.pick(p.female ? FEMALE_HONORIFICS : MALE_HONORIFICS);
    const w = rng.next();
    if (w < 0.4) return `${honorific} ${full}`;
    if (w < 0.7) return `${honorific} ${initials} ${p.surname}`;
    return `${honorific} ${p.surname}`;
  }
  if (u < 0.8) return rng.chance(0.5) ? `${p.surname}, ${p.given}` : `${p.surname}, ${initials}`;
  if (p.givenShort !== null) return `${p.givenShort} ${p.surname}`;
  return full.toUpperCase();
}

function firmVariant(p: FirmParts, rng: Rng): string {
  const base = rng.chance(0.3) ? p.base.replace(" & ", " and ") : p.base;
  if (p.legal === null) return rng.chance(0.5) ? `${base} Ltd.` : `The ${base}`;
  const u = rng.next();
  if (u < 0.25) return base;
  const variants = LEGAL_VARIANTS[p.legal];
  const legal = variants === undefined ? p.legal : rng.pick(variants);
  return `${base} ${legal}`;
}

function townVariant(p: TownParts, rng: Rng): string {
  const u = rng.next();
  if (p.prefix === "Port") return u < 0.5 ? `Pt ${p.rest}` : `Port of ${p.rest}`;
  if (p.prefix === "St.") return u < 0.5 ? `St ${p.rest}` : `S. ${p.rest}`;
  if (p.prefix === "Mount") return u < 0.5 ? `Mt ${p.rest}` : `Mount ${p.rest.toUpperCase()}`;
  if (p.tail) return u < 0.5 ? p.stem : p.rest.replace(/-/g, " ");
  return u < 0.5 ? p.rest.toUpperCase() : `${p.rest} Quay`;
}

function vesselVariant(p: VesselParts, rng: Rng): string {
  const u = rng.next();
  if (p.prefix === null) return u < 0.5 ? `the ${p.core}` : `SS ${p.core}`;
  if (u < 0.4) return `the ${p.core}`;
  if (u < 0.7) return `${p.prefix[1].toLowerCase()} ${p.core}`;
  return `${p.prefix[0]} "${p.core}"`;
}

/** One character-level corruption: OCR confusion, dropped letter, swapped letters or case change. */
export function characterNoise(text: string, rng: Rng): string {
  const u = rng.next();
  if (u < 0.5) return ocrConfusion(text, rng);
  if (u < 0.65) return dropLetter(text, rng);
  if (u < 0.8) return swapLetters(text, rng);
  return rng.chance(0.5) ? text.toUpperCase() : text.toLowerCase();
}

/** Applies one OCR confusion found in the text (falls back to a dropped letter when none fits). */
export function ocrConfusion(text: string, rng: Rng): string {
  const applicable = OCR_CONFUSIONS.filter(([from]) => text.includes(from));
  if (applicable.length === 0) return dropLetter(text, rng);
  const [from, to] = rng.pick(applicable);
  const positions: number[] = [];
  for (let at = text.indexOf(from); at !== -1; at = text.indexOf(from, at + 1)) positions.push(at);
  const at = rng.pick(positions);
  return text.slice(0, at) + to + text.slice(at + from.length);
}

/** Indexes of letters that are inside a word (not the first letter, so the name stays findable). */
function innerLetterPositions(text: string): number[] {
  const positions: number[] = [];
  for (let i = 1; i < text.length; i++) {
    if (/\p{L}/u.test(text.charAt(i)) && /\p{L}/u.test(text.charAt(i - 1))) positions.push(i);
  }
  return positions;
}

/** Drops one inner letter of a word. */
export function dropLetter(text: string, rng: Rng): string {
  const positions = innerLetterPositions(text);
  if (positions.length === 0) return text;
  const at = rng.pick(positions);
  return text.slice(0, at) + text.slice(at + 1);
}

/** Swaps an inner letter with the letter before it. */
export function swapLetters(text: string, rng: Rng): string {
  const positions = innerLetterPositions(text).filter((i) => i >= 2);
  if (positions.length === 0) return text;
  const at = rng.pick(positions);
  return text.slice(0, at - 1) + text.charAt(at) + text.charAt(at - 1) + text.slice(at + 1);
}

/** Range of topic words of the entity kept in a context (the rest of the description is unseen). */
const CONTEXT_TOPICS_MIN = 2;
const CONTEXT_TOPICS_MAX = 4;
/** Range of distractor words added to a context. */
const CONTEXT_DISTRACTORS_MIN = 3;
const CONTEXT_DISTRACTORS_MAX = 7;
/** Chance that a context also carries a topic word of some other entity (a misleading cue). */
const MISLEADING_CUE_SHARE = 0.5;

/** The words printed around the mention: some of its topics, distractors, maybe a false cue. */
export function mentionContext(entity: GenEntity, rng: Rng): string {
  const topics = rng.shuffled(entity.topics).slice(0, rng.between(CONTEXT_TOPICS_MIN, CONTEXT_TOPICS_MAX));
  const words = [...topics];
  const distractors = rng.between(CONTEXT_DISTRACTORS_MIN, CONTEXT_DISTRACTORS_MAX);
  for (let i = 0; i < distractors; i++) words.push(rng.pick(DISTRACTORS));
  if (rng.chance(MISLEADING_CUE_SHARE)) words.push(rng.pick(rng.pick([CARGOES, RIVERS, ROLES])));
  return rng.shuffled(words).join(" ");
}
