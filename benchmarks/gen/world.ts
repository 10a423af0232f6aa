/**
 * Builds the entities of the invented gazette world. Entity number i is a pure function of
 * (seed, i), so a table of a million rows can be written row by row and any row rebuilt later
 * (to draw mentions of it) without keeping the table in memory.
 */

import { mixSeed, Rng, zipfTable } from "./prng.js";
import {
  CARGOES,
  DISTRICTS,
  FEMALE_GIVEN,
  FIRST_YEAR,
  LAST_YEAR,
  MALE_GIVEN,
  MIDDLES,
  ONSETS,
  RIVERS,
  ROLES,
  SURNAME_CODAS,
  TOWN_CODAS,
  TOWN_FEATURES,
  TRADES,
  VESSEL_ADJECTIVES,
  VESSEL_KINDS,
  VESSEL_NOUNS,
  VESSEL_PREFIXES,
} from "./vocab.js";

/** The table types the generator writes. */
export type TableType = "person" | "firm" | "town" | "vessel";

/** Share of each table type among generated entities (persons dominate a gazette's index). */
export const TYPE_SHARES: readonly (readonly [TableType, number])[] = [
  ["person", 0.45],
  ["firm", 0.25],
  ["town", 0.18],
  ["vessel", 0.12],
];

/**
 * Zipf exponents of name popularity. With 12,000 surnames, 0.5 gives the most common surname
 * about 0.5% of persons, and 0.7 over 48 male given names gives the most common one about 13%:
 * close to the shares of the commonest names in period censuses (from memory). At a million rows
 * that means many shared surnames and a few hundred exact repeats of the commonest full names.
 */
const SURNAME_ZIPF_EXPONENT = 0.5;
const GIVEN_ZIPF_EXPONENT = 0.7;
/** Town stems are shared as often as surnames. */
const TOWN_ZIPF_EXPONENT = 0.5;
/** The most popular entity's prior; priors fall off as PRIOR_SCALE / rank (Zipf-like). */
const PRIOR_SCALE = 1_000_000;
/** Zipf exponent of priors: 1.0 gives the classic rank-frequency law (common practice). */
const PRIOR_EXPONENT = 1.0;
/** Share of persons who are women (female given names, Mrs./Miss honorifics). */
const FEMALE_SHARE = 0.25;
/** Share of persons printed with a middle initial. */
const MIDDLE_INITIAL_SHARE = 0.35;
/** Letters used as middle initials (I, Q, U, V, X, Y, Z were rare and are left out). */
const MIDDLE_LETTERS = "ABCDEFGHJKLMNOPRSTW";
/** Stream tag mixed into the seed of every table entity, so other streams never overlap it. */
const ENTITY_STREAM = 0x7a11e;
/** Stream tag of the per-seed shuffle of the name pools. */
const POOL_STREAM = 0x9001;

/** The parts a person's surface forms are built from. */
export interface PersonParts {
  kind: "person";
  given: string;
  /** The period abbreviation of the given name ("Wm." for William), when one was usual. */
  givenShort: string | null;
  middle: string | null;
  surname: string;
  female: boolean;
}

/** The parts of a firm's name: a base and an optional legal form. */
export interface FirmParts {
  kind: "firm";
  base: string;
  legal: string | null;
}

/** The parts of a town's name. */
export interface TownParts {
  kind: "town";
  /** "Port", "St." or "Mount" when the name starts with one. */
  prefix: string | null;
  /** The stem without the prefix or the "-on-River" / " Landing" tail. */
  stem: string;
  /** True when the name has a droppable tail (" Landing", "-on-River"). */
  tail: boolean;
  /** The full name minus its prefix. */
  rest: string;
}

/** The parts of a vessel's name. */
export interface VesselParts {
  kind: "vessel";
  prefix: readonly [string, string] | null;
  core: string;
}

export type EntityParts = PersonParts | FirmParts | TownParts | VesselParts;

/** One generated entity: a table row plus what the mention generator needs to vary it. */
export interface GenEntity {
  id: string;
  name: string;
  type: TableType;
  aliases: string[];
  description: string;
  prior: number;
  parts: EntityParts;
  /** The topic words of the description (role, town, river, cargoes...), for mention contexts. */
  topics: string[];
}

/** Per-seed name pools and their popularity tables. */
export interface World {
  seed: number;
  /** Number of table entities; sets the rank range of priors. */
  size: number;
  surnames: string[];
  surnameCum: Float64Array;
  townStems: string[];
  townCum: Float64Array;
  maleCum: Float64Array;
  femaleCum: Float64Array;
}

/**
 * Every onset x (no middle | middle) x coda combination; with `compound`, also every
 * onset x second onset x coda ("Ash" + "dun" + "ton"), which gives towns a pool large enough
 * that NIL town names can still be drawn at a million rows.
 */
function stemPool(codas: readonly string[], compound: boolean): string[] {
  const pool: string[] = [];
  for (const onset of ONSETS) {
    for (const coda of codas) {
      pool.push(onset + coda);
      for (const middle of MIDDLES) pool.push(onset + middle + coda);
      if (compound)
        for (const second of ONSETS) if (second !== onset) pool.push(onset + second.toLowerCase() + coda);
    }
  }
  return pool;
}

/** Builds the name pools of a seed; `size` is the number of table entities. */
export function makeWorld(seed: number, size: number): World {
  const rng = new Rng(mixSeed(seed, POOL_STREAM));
  const surnames = rng.shuffled(stemPool(SURNAME_CODAS, false));
  const townStems = rng.shuffled(stemPool(TOWN_CODAS, true));
  return {
    seed,
    size,
    surnames,
    surnameCum: zipfTable(surnames.length, SURNAME_ZIPF_EXPONENT),
    townStems,
    townCum: zipfTable(townStems.length, TOWN_ZIPF_EXPONENT),
    maleCum: zipfTable(MALE_GIVEN.length, GIVEN_ZIPF_EXPONENT),
    femaleCum: zipfTable(FEMALE_GIVEN.length, GIVEN_ZIPF_EXPONENT),
  };
}

/** Width of the zero-padded number in table ids ("gz0000042"): room for ten million rows. */
const ID_DIGITS = 7;

/** The table id of entity number `index`. */
export function entityId(index: number): string {
  return "gz" + String(index).padStart(ID_DIGITS, "0");
}

/** Builds table entity number `index` of the world. */
export function makeEntity(world: World, index: number): GenEntity {
  const rng = new Rng(mixSeed(world.seed, ENTITY_STREAM, index));
  return buildEntity(world, rng, entityId(index));
}

/** Builds an entity from an arbitrary random stream (also used for NIL names). */
export function buildEntity(world: World, rng: Rng, id: string): GenEntity {
  const rank = 1 + rng.int(world.size);
  const prior = Math.floor(PRIOR_SCALE / rank ** PRIOR_EXPONENT);
  const type = pickType(rng);
  const body = BUILDERS[type](world, rng);
  return { id, type, prior, ...body };
}

function pickType(rng: Rng): TableType {
  let u = rng.next();
  for (const [type, share] of TYPE_SHARES) {
    if (u < share) return type;
    u -= share;
  }
  return "person";
}

type Body = Omit<GenEntity, "id" | "type" | "prior">;

const BUILDERS: Record<TableType, (world: World, rng: Rng) => Body> = {
  person: buildPerson,
  firm: buildFirm,
  town: buildTown,
  vessel: buildVessel,
};

function surname(world: World, rng: Rng): string {
  return world.surnames[rng.weighted(world.surnameCum)] as string;
}

function townStem(world: World, rng: Rng): string {
  return world.townStems[rng.weighted(world.townCum)] as string;
}

function year(rng: Rng): string {
  return String(rng.between(FIRST_YEAR, LAST_YEAR));
}

/** Two different cargoes. */
function twoCargoes(rng: Rng): [string, string] {
  const first = rng.pick(CARGOES);
  let second = rng.pick(CARGOES);
  while (second === first) second = rng.pick(CARGOES);
  return [first, second];
}

function capitalize(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

function givenName(world: World, rng: Rng, female: boolean): [string, string | null] {
  if (female) return [FEMALE_GIVEN[rng.weighted(world.femaleCum)] as string, null];
  const [given, short] = MALE_GIVEN[rng.weighted(world.maleCum)] as readonly [string, string | null];
  return [given, short];
}

function buildPerson(world: World, rng: Rng): Body {
  const female = rng.chance(FEMALE_SHARE);
  const [given, givenShort] = givenName(world, rng, female);
  const middle = rng.chance(MIDDLE_INITIAL_SHARE)
    ? (MIDDLE_LETTERS[rng.int(MIDDLE_LETTERS.length)] as string)
    : null;
  const last = surname(world, rng);
  const initial = given.charAt(0);
  const name = middle === null ? `${given} ${last}` : `${given} ${middle}. ${last}`;
  const aliases = [`${initial}. ${last}`, `${last}, ${given}`];
  if (middle !== null) aliases.push(`${initial}. ${middle}. ${last}`, `${given} ${last}`);
  if (givenShort !== null) aliases.push(`${givenShort} ${last}`);
  const role = rng.pick(ROLES);
  const town = townStem(world, rng);
  const river = rng.pick(RIVERS);
  const [cargoA, cargoB] = twoCargoes(rng);
  const when = year(rng);
  const description = `${capitalize(role)} at ${town} on the ${river}; dealt in ${cargoA} and ${cargoB}; named in the gazette ${when}.`;
  return {
    name,
    aliases,
    description,
    parts: { kind: "person", given, givenShort, middle, surname: last, female },
    topics: [role, town, river, cargoA, cargoB, when],
  };
}

/** Legal forms that follow a bare surname ("Asherton & Sons"). */
const FAMILY_LEGAL_FORMS: readonly string[] = ["& Co.", "& Sons", "Bros.", "Ltd."];
/** Legal forms that follow a descriptive base ("Dunmere Timber Co."). */
const COMPANY_LEGAL_FORMS: readonly string[] = ["Co.", "Company", "Ltd.", "& Co.", "Co. Ltd."];
/** The spelled-out legal form, an alias of single-word family firms ("Asherton Brothers"). */
const SPELLED_LEGAL_FORMS: Record<string, string> = {
  "& Co.": "and Company",
  "& Sons": "and Sons",
  "Bros.": "Brothers",
  "Ltd.": "Limited",
};
/** Bases of at least this many words also get an acronym alias ("DSN Co."). */
const ACRONYM_MIN_WORDS = 3;

function buildFirm(world: World, rng: Rng): Body {
  const trade = rng.pick(TRADES);
  const u = rng.next();
  let base: string;
  let legal: string | null;
  if (u < 0.45) {
    base = surname(world, rng);
    legal = rng.pick(FAMILY_LEGAL_FORMS);
  } else if (u < 0.6) {
    base = `${surname(world, rng)} & ${surname(world, rng)}`;
    legal = rng.chance(0.5) ? "Ltd." : null;
  } else if (u < 0.8) {
    base = `${surname(world, rng)} ${trade}`;
    legal = rng.pick(COMPANY_LEGAL_FORMS);
  } else if (u < 0.93) {
    base = `${townStem(world, rng)} ${trade}`;
    legal = rng.pick(COMPANY_LEGAL_FORMS);
  } else {
    base = `${rng.pick(RIVERS)} ${trade}`;
    legal = rng.pick(COMPANY_LEGAL_FORMS);
  }
  const name = legal === null ? base : `${base} ${legal}`;
  const aliases: string[] = [];
  const words = base.split(" ").filter((w) => w !== "&");
  if (legal !== null && words.length > 1) aliases.push(base);
  const spelled = legal === null ? undefined : SPELLED_LEGAL_FORMS[legal];
  if (spelled !== undefined && words.length === 1) aliases.push(`${base} ${spelled}`);
  if (words.length >= ACRONYM_MIN_WORDS) {
    const acronym = words.map((w) => w.charAt(0).toUpperCase()).join("");
    aliases.push(legal === null ? acronym : `${acronym} ${legal}`);
  }
  const town = townStem(world, rng);
  const river = rng.pick(RIVERS);
  const [cargoA, cargoB] = twoCargoes(rng);
  const when = year(rng);
  const description = `${capitalize(trade.toLowerCase())} firm of ${town} on the ${river}; carried ${cargoA} and ${cargoB}; established ${when}.`;
  return {
    name,
    aliases,
    description,
    parts: { kind: "firm", base, legal },
    topics: [trade.toLowerCase(), town, river, cargoA, cargoB, when],
  };
}

function buildTown(world: World, rng: Rng): Body {
  const stem = townStem(world, rng);
  const river = rng.pick(RIVERS);
  const u = rng.next();
  let prefix: string | null = null;
  let rest = stem;
  let core = stem;
  let tail = false;
  const aliases: string[] = [];
  if (u < 0.35) {
    rest = stem;
  } else if (u < 0.47) {
    prefix = "Port";
    aliases.push(`Pt. ${stem}`);
  } else if (u < 0.57) {
    prefix = "St.";
    aliases.push(`Saint ${stem}`);
  } else if (u < 0.65) {
    prefix = "Mount";
    aliases.push(`Mt. ${stem}`);
  } else if (u < 0.87) {
    const root = rng.pick(ONSETS) + (rng.chance(0.5) ? rng.pick(MIDDLES) : "");
    rest = root + (u < 0.76 ? "mouth" : "ford");
    core = rest;
  } else if (u < 0.93) {
    rest = `${stem} Landing`;
    tail = true;
    aliases.push(stem);
  } else {
    rest = `${stem}-on-${river}`;
    tail = true;
    aliases.push(stem);
  }
  const name = prefix === null ? rest : `${prefix} ${rest}`;
  const district = rng.pick(DISTRICTS);
  const [cargoA, cargoB] = twoCargoes(rng);
  const feature = rng.pick(TOWN_FEATURES);
  const when = year(rng);
  const description = `River port on the ${river} in the ${district} district; ships ${cargoA} and ${cargoB}; has a ${feature}; chartered ${when}.`;
  return {
    name,
    aliases,
    description,
    parts: { kind: "town", prefix, stem: core, tail, rest },
    topics: [river, district, cargoA, cargoB, feature, when],
  };
}

/** Share of vessels whose name carries a prefix such as "SS". */
const VESSEL_PREFIX_SHARE = 0.7;

function buildVessel(world: World, rng: Rng): Body {
  const prefix = rng.chance(VESSEL_PREFIX_SHARE) ? rng.pick(VESSEL_PREFIXES) : null;
  const u = rng.next();
  let core: string;
  if (u < 0.45) core = `${rng.pick(VESSEL_ADJECTIVES)} ${rng.pick(VESSEL_NOUNS)}`;
  else if (u < 0.65) core = givenName(world, rng, true)[0];
  else if (u < 0.8) core = `${givenName(world, rng, rng.chance(0.5))[0]} ${surname(world, rng)}`;
  else if (u < 0.9) core = `${townStem(world, rng)} Belle`;
  else core = `${rng.pick(VESSEL_NOUNS)} of ${townStem(world, rng)}`;
  const name = prefix === null ? core : `${prefix[0]} ${core}`;
  const aliases = prefix === null ? [] : [core, `${prefix[1]} ${core}`];
  const kind = rng.pick(VESSEL_KINDS);
  const town = townStem(world, rng);
  const river = rng.pick(RIVERS);
  const cargo = rng.pick(CARGOES);
  const master = `${givenName(world, rng, false)[0]} ${surname(world, rng)}`;
  const when = year(rng);
  const description = `${capitalize(kind)} out of ${town} on the ${river}; carried ${cargo}; built ${when}; master ${master}.`;
  return {
    name,
    aliases,
    description,
    parts: { kind: "vessel", prefix, core },
    topics: [kind, town, river, cargo, master, when],
  };
}
