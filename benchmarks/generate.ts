/**
 * Deterministic generator of a synthetic knowledge table and noisy labeled mentions, in the
 * invented world of a river-port trade gazette (1890-1930). Same seed and sizes give
 * byte-identical files.
 *
 *   node dist-bench/benchmarks/generate.js --entities N --mentions M --seed S --out DIR
 *
 * Writes DIR/entities.csv (id,name,type,aliases,description,prior), DIR/mentions.jsonl
 * (LabeledMention objects: id, text, type, context, gold) and DIR/manifest.json.
 */

import { mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { Command } from "commander";
import type { LabeledMention } from "../src/types.js";
import { NameSet } from "./gen/name-set.js";
import { mentionContext, mentionText } from "./gen/noise.js";
import { cumulative, mixSeed, Rng } from "./gen/prng.js";
import { BufferedWriter, csvRow } from "./gen/writer.js";
import { buildEntity, type GenEntity, makeEntity, makeWorld, type TableType } from "./gen/world.js";

/** Version of the generated data; bump when any change alters output bytes (invalidates caches). */
export const GENERATOR_VERSION = 1;

/** File names inside the output folder. */
export const TABLE_FILE = "entities.csv";
export const MENTIONS_FILE = "mentions.jsonl";
export const MANIFEST_FILE = "manifest.json";

/** Default share of NIL mentions (names not in the table). */
export const DEFAULT_NIL_SHARE = 0.2;
/** Default seed. */
export const DEFAULT_SEED = 1;
/**
 * Share of non-NIL mentions drawn in proportion to prior; the rest are drawn uniformly so the
 * long tail of rare entities is exercised too (pure Zipf would spend most mentions on a few rows).
 */
const PRIOR_SAMPLED_SHARE = 0.6;
/** Attempts to draw a NIL name absent from the table before giving up. */
const MAX_NIL_ATTEMPTS = 50;
/** Stream tags, so mentions and NIL names never reuse the table's random numbers. */
const MENTION_STREAM = 0x3e47;
const NIL_STREAM = 0x5111;
/** Report progress every this many rows. */
const PROGRESS_EVERY = 50_000;
/** Width of the zero-padded mention number in mention ids. */
const MENTION_ID_DIGITS = 7;

/** NER label printed for each table type. */
export const NER_LABELS: Record<TableType, string> = {
  person: "PER",
  firm: "ORG",
  town: "LOC",
  vessel: "MISC",
};

export interface GenerateOptions {
  /** Number of table entities (rows of entities.csv). Required. */
  entities: number;
  /** Number of labeled mentions (lines of mentions.jsonl). Required. */
  mentions: number;
  /** PRNG seed. Default 1. */
  seed?: number;
  /** Output folder, created if missing. Required. */
  out: string;
  /** Share of NIL mentions, in [0, 1). Default 0.2. */
  nilShare?: number;
  /** Called every 50,000 rows and at the end of each stage. Default: none. */
  onProgress?: (stage: "entities" | "mentions", done: number, total: number) => void;
}

/** What was generated; written to manifest.json. */
export interface GenerateManifest {
  generatorVersion: number;
  seed: number;
  entities: number;
  mentions: number;
  nilShare: number;
  nilMentions: number;
  types: Record<TableType, number>;
  table: string;
  mentionsFile: string;
}

function checkCount(name: string, value: number, min: number): void {
  if (!Number.isInteger(value) || value < min) {
    throw new RangeError(`generate: option "${name}" must be an integer >= ${min}, got ${value}`);
  }
}

/** Generates the table and the mentions into `opts.out`. */
export function generate(opts: GenerateOptions): GenerateManifest {
  const seed = opts.seed ?? DEFAULT_SEED;
  const nilShare = opts.nilShare ?? DEFAULT_NIL_SHARE;
  checkCount("entities", opts.entities, 1);
  checkCount("mentions", opts.mentions, 0);
  checkCount("seed", seed, 0);
  if (!(nilShare >= 0 && nilShare < 1)) {
    throw new RangeError(`generate: option "nilShare" must be in [0, 1), got ${nilShare}`);
  }
  mkdirSync(opts.out, { recursive: true });
  const world = makeWorld(seed, opts.entities);
  const { priors, names, types } = writeTable(opts, world);
  const nilMentions = writeMentions(opts, world, priors, names, nilShare, seed);
  const manifest: GenerateManifest = {
    generatorVersion: GENERATOR_VERSION,
    seed,
    entities: opts.entities,
    mentions: opts.mentions,
    nilShare,
    nilMentions,
    types,
    table: TABLE_FILE,
    mentionsFile: MENTIONS_FILE,
  };
  writeFileSync(join(opts.out, MANIFEST_FILE), JSON.stringify(manifest, null, 2) + "\n");
  return manifest;
}

function writeTable(opts: GenerateOptions, world: ReturnType<typeof makeWorld>) {
  const total = opts.entities;
  const writer = new BufferedWriter(join(opts.out, TABLE_FILE));
  writer.write(csvRow(["id", "name", "type", "aliases", "description", "prior"]));
  const priors = new Float64Array(total);
  const names = new NameSet();
  const types: Record<TableType, number> = { person: 0, firm: 0, town: 0, vessel: 0 };
  for (let i = 0; i < total; i++) {
    const e = makeEntity(world, i);
    priors[i] = e.prior;
    types[e.type]++;
    names.add(e.name);
    for (const alias of e.aliases) names.add(alias);
    writer.write(csvRow([e.id, e.name, e.type, e.aliases.join("|"), e.description, String(e.prior)]));
    if ((i + 1) % PROGRESS_EVERY === 0) opts.onProgress?.("entities", i + 1, total);
  }
  writer.close();
  names.freeze();
  opts.onProgress?.("entities", total, total);
  return { priors, names, types };
}

/** Sampling weights: a mix of prior-proportional and uniform, as cumulative sums. */
function samplingTable(priors: Float64Array): Float64Array {
  let sum = 0;
  for (const p of priors) sum += p;
  const uniform = (1 - PRIOR_SAMPLED_SHARE) / priors.length;
  const weights = new Float64Array(priors.length);
  for (let i = 0; i < priors.length; i++) {
    weights[i] = (sum > 0 ? (PRIOR_SAMPLED_SHARE * (priors[i] ?? 0)) / sum : 0) + uniform;
  }
  return cumulative(weights);
}

/**
 * A plausible entity whose canonical name is neither a name nor an alias in the table. Its short
 * forms ("G. Surname") may still coincide with a table alias, as in a real archive.
 */
function nilEntity(world: ReturnType<typeof makeWorld>, names: NameSet, seed: number, j: number): GenEntity {
  for (let attempt = 0; attempt < MAX_NIL_ATTEMPTS; attempt++) {
    const e = buildEntity(world, new Rng(mixSeed(seed, NIL_STREAM, j, attempt)), "nil");
    if (!names.has(e.name)) return e;
  }
  throw new Error(`generate: no NIL name absent from the table after ${MAX_NIL_ATTEMPTS} attempts`);
}

function writeMentions(
  opts: GenerateOptions,
  world: ReturnType<typeof makeWorld>,
  priors: Float64Array,
  names: NameSet,
  nilShare: number,
  seed: number,
): number {
  const total = opts.mentions;
  const cum = samplingTable(priors);
  const rng = new Rng(mixSeed(seed, MENTION_STREAM));
  const writer = new BufferedWriter(join(opts.out, MENTIONS_FILE));
  let nil = 0;
  for (let j = 0; j < total; j++) {
    const isNil = rng.chance(nilShare);
    const entity = isNil ? nilEntity(world, names, seed, j) : makeEntity(world, rng.weighted(cum));
    if (isNil) nil++;
    const mention: LabeledMention = {
      id: "m" + String(j + 1).padStart(MENTION_ID_DIGITS, "0"),
      text: mentionText(entity, rng),
      type: NER_LABELS[entity.type],
      context: mentionContext(entity, rng),
      gold: isNil ? null : entity.id,
    };
    writer.write(JSON.stringify(mention) + "\n");
    if ((j + 1) % PROGRESS_EVERY === 0) opts.onProgress?.("mentions", j + 1, total);
  }
  writer.close();
  opts.onProgress?.("mentions", total, total);
  return nil;
}

/** Parses a non-negative integer option, or exits with status 2 naming the option. */
function intOption(name: string) {
  return (value: string): number => {
    const n = Number(value);
    if (!/^\d+$/.test(value) || !Number.isSafeInteger(n)) {
      process.stderr.write(`generate: option --${name} must be a non-negative integer, got "${value}"\n`);
      process.exit(2);
    }
    return n;
  };
}

function main(argv: string[]): void {
  const program = new Command("generate")
    .description("Generate a synthetic gazette knowledge table and noisy labeled mentions.")
    .requiredOption("--entities <n>", "number of table entities", intOption("entities"))
    .option("--mentions <m>", "number of labeled mentions", intOption("mentions"), 20_000)
    .option("--seed <s>", "PRNG seed", intOption("seed"), DEFAULT_SEED)
    .option("--nil-share <x>", "share of NIL mentions in [0, 1)", Number.parseFloat, DEFAULT_NIL_SHARE)
    .requiredOption("--out <dir>", "output folder")
    .exitOverride((err) => process.exit(err.exitCode === 0 ? 0 : 2));
  program.parse(argv);
  const o = program.opts<{
    entities: number;
    mentions: number;
    seed: number;
    nilShare: number;
    out: string;
  }>();
  const started = Date.now();
  const manifest = generate({
    entities: o.entities,
    mentions: o.mentions,
    seed: o.seed,
    nilShare: o.nilShare,
    out: o.out,
    onProgress: (stage, done, total) => process.stderr.write(`generate: ${stage} ${done}/${total}\n`),
  });
  const seconds = (Date.now() - started) / 1000;
  process.stderr.write(
    `generate: wrote ${manifest.entities} entities and ${manifest.mentions} mentions ` +
      `(${manifest.nilMentions} NIL) to ${o.out} in ${seconds.toFixed(1)} s\n`,
  );
}

const invokedPath = process.argv[1];
if (invokedPath !== undefined && import.meta.url === pathToFileURL(invokedPath).href) {
  try {
    main(process.argv);
  } catch (err) {
    process.stderr.write(`generate: ${err instanceof Error ? err.message : String(err)}\n`);
    process.exit(err instanceof RangeError ? 2 : 1);
  }
}
