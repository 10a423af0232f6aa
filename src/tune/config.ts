/**
 * The tuned configuration file (JSON): weights, operating point, the figures that justify them,
 * and the fingerprint of the KB they were tuned on. A config tuned on one KB is refused for
 * another unless forced, since weights and thresholds depend on the table's names and priors.
 */
import { readFileSync } from "node:fs";
import { MARGIN_CAP } from "../decide/decide.js";
import { DEFAULT_WEIGHTS } from "../score/combine.js";
import type { Figures } from "../evaluate/metrics.js";
import { FEATURE_NAMES, type FeatureName, type LinkConfig } from "../types.js";
import { writeFileAtomic } from "../util/atomic-file.js";
import { InputError } from "../util/errors.js";
import { fileError } from "../read/lines.js";
import type { TuneResult } from "./tune.js";
import { OBJECTIVES, type Objective } from "./types.js";

export const CONFIG_FORMAT = "hawser-config";
export const CONFIG_VERSION = 1;
/**
 * Features added since config version 1 was first written: a config file without one of these
 * weights still loads, and the feature takes its default weight.
 */
const ADDED_FEATURES: readonly FeatureName[] = ["nearSpelling", "contextConflict", "prominence"];

/** The figures a config carries: link quality held-out, in-sample, and of the defaults. */
export interface ConfigFigures {
  heldOut: FigureSummary;
  inSample: FigureSummary;
  defaults: FigureSummary;
  folds: number;
  seed: number;
  mentions: number;
}

export interface FigureSummary {
  accuracy: number;
  linkPrecision: number;
  linkRecall: number;
  linkF1: number;
}

export interface TunedConfig extends LinkConfig {
  format: typeof CONFIG_FORMAT;
  version: typeof CONFIG_VERSION;
  objective: Objective;
  minPrecision?: number;
  figures: ConfigFigures;
  /** The KB tuned on: its fingerprint and entity count. */
  kb: { fingerprint: string; entities: number };
  /** ISO 8601 time of tuning. */
  created: string;
}

export interface ReadConfigOptions {
  /** Fingerprint of the KB the config will be used with; when given, it must match `kb.fingerprint`. */
  kbFingerprint?: string | undefined;
  /** Accept a config tuned on another KB. Default false. */
  force?: boolean | undefined;
}

function summary(f: Figures): FigureSummary {
  return { accuracy: f.accuracy, linkPrecision: f.linkPrecision, linkRecall: f.linkRecall, linkF1: f.linkF1 };
}

/** The config file content of a tuning result. */
export function configFromTune(
  result: TuneResult,
  kb: { fingerprint: string; entities: number },
  created: Date = new Date(),
): TunedConfig {
  const config: TunedConfig = {
    format: CONFIG_FORMAT,
    version: CONFIG_VERSION,
    weights: result.config.weights,
    threshold: result.config.threshold,
    minMargin: result.config.minMargin,
    objective: result.objective,
    figures: {
      heldOut: summary(result.figures.heldOut),
      inSample: summary(result.figures.inSample),
      defaults: summary(result.figures.defaults),
      folds: result.folds,
      seed: result.seed,
      mentions: result.mentions,
    },
    kb: { fingerprint: kb.fingerprint, entities: kb.entities },
    created: created.toISOString(),
  };
  if (result.minPrecision !== undefined) config.minPrecision = result.minPrecision;
  return config;
}

type Json = Record<string, unknown>;

function isObject(v: unknown): v is Json {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

/** Validation that names the file and the dotted field path of the first problem. */
class Checker {
  constructor(readonly file: string) {}

  fail(field: string, problem: string): never {
    throw new InputError({ file: this.file, field }, problem);
  }

  object(v: unknown, field: string): Json {
    if (!isObject(v)) this.fail(field, `expected an object, got ${describe(v)}`);
    return v;
  }

  number(v: unknown, field: string, min = -Infinity, max = Infinity): number {
    if (typeof v !== "number" || !Number.isFinite(v))
      this.fail(field, `expected a finite number, got ${describe(v)}`);
    if (v < min || v > max) this.fail(field, `expected a number in [${min}, ${max}], got ${v}`);
    return v;
  }

  string(v: unknown, field: string): string {
    if (typeof v !== "string" || v === "")
      this.fail(field, `expected a non-empty string, got ${describe(v)}`);
    return v;
  }
}

function describe(v: unknown): string {
  if (v === undefined) return "nothing (missing)";
  if (v === null) return "null";
  if (Array.isArray(v)) return "an array";
  return `${typeof v} ${JSON.stringify(v)}`;
}

function checkSummary(c: Checker, v: unknown, field: string): FigureSummary {
  const o = c.object(v, field);
  return {
    accuracy: c.number(o.accuracy, `${field}.accuracy`, 0, 1),
    linkPrecision: c.number(o.linkPrecision, `${field}.linkPrecision`, 0, 1),
    linkRecall: c.number(o.linkRecall, `${field}.linkRecall`, 0, 1),
    linkF1: c.number(o.linkF1, `${field}.linkF1`, 0, 1),
  };
}

/** Validate parsed JSON as a TunedConfig; `file` names the source in errors. */
export function validateConfig(value: unknown, file: string): TunedConfig {
  const c = new Checker(file);
  const o = c.object(value, "(top level)");
  if (o.format !== CONFIG_FORMAT) c.fail("format", `expected "${CONFIG_FORMAT}", got ${describe(o.format)}`);
  if (o.version !== CONFIG_VERSION)
    c.fail("version", `expected ${CONFIG_VERSION}, got ${describe(o.version)}`);
  const w = c.object(o.weights, "weights");
  const wf = c.object(w.features, "weights.features");
  for (const name of Object.keys(wf))
    if (!(FEATURE_NAMES as readonly string[]).includes(name))
      c.fail(`weights.features.${name}`, `unknown feature; known: ${FEATURE_NAMES.join(", ")}`);
  const features = {} as Record<FeatureName, number>;
  for (const name of FEATURE_NAMES) {
    // A feature added after a config was written takes its default weight.
    features[name] =
      wf[name] === undefined && ADDED_FEATURES.includes(name)
        ? DEFAULT_WEIGHTS.features[name]
        : c.number(wf[name], `weights.features.${name}`);
  }
  const objective = o.objective;
  if (typeof objective !== "string" || !(OBJECTIVES as readonly string[]).includes(objective))
    c.fail("objective", `expected one of ${OBJECTIVES.join(", ")}, got ${describe(objective)}`);
  const figures = c.object(o.figures, "figures");
  const kb = c.object(o.kb, "kb");
  const created = c.string(o.created, "created");
  if (Number.isNaN(Date.parse(created)))
    c.fail("created", `expected an ISO 8601 time, got ${JSON.stringify(created)}`);
  const config: TunedConfig = {
    format: CONFIG_FORMAT,
    version: CONFIG_VERSION,
    weights: { bias: c.number(w.bias, "weights.bias"), features },
    threshold: c.number(o.threshold, "threshold", 0, 1),
    minMargin: c.number(o.minMargin, "minMargin", 0, MARGIN_CAP),
    objective: objective as Objective,
    figures: {
      heldOut: checkSummary(c, figures.heldOut, "figures.heldOut"),
      inSample: checkSummary(c, figures.inSample, "figures.inSample"),
      defaults: checkSummary(c, figures.defaults, "figures.defaults"),
      folds: c.number(figures.folds, "figures.folds", 0),
      seed: c.number(figures.seed, "figures.seed"),
      mentions: c.number(figures.mentions, "figures.mentions", 0),
    },
    kb: {
      fingerprint: c.string(kb.fingerprint, "kb.fingerprint"),
      entities: c.number(kb.entities, "kb.entities", 0),
    },
    created,
  };
  if (o.minPrecision !== undefined) config.minPrecision = c.number(o.minPrecision, "minPrecision", 0, 1);
  else if (objective === "recall-at-precision")
    c.fail("minPrecision", "required when objective is recall-at-precision");
  return config;
}

/** 1-based line of a character offset in a text. */
function lineAt(text: string, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset && i < text.length; i++) if (text.charCodeAt(i) === 10) line++;
  return line;
}

/** Read and validate a config file; refuse one tuned on another KB unless `force`. */
export function readConfig(file: string, opts: ReadConfigOptions = {}): TunedConfig {
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (e) {
    throw fileError(file, e);
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    const message = (e as Error).message;
    const position = /position (\d+)/.exec(message);
    const line = position ? lineAt(text, Number(position[1])) : undefined;
    throw new InputError({ file, line }, `not valid JSON: ${message}`);
  }
  const config = validateConfig(value, file);
  if (opts.kbFingerprint !== undefined && opts.kbFingerprint !== config.kb.fingerprint && !opts.force)
    throw new InputError(
      { file, field: "kb.fingerprint" },
      `this config was tuned on another KB (fingerprint ${config.kb.fingerprint}, ${config.kb.entities} entities) ` +
        `but the KB given has fingerprint ${opts.kbFingerprint}; tune again on this KB, or force its use (--force on the command line)`,
    );
  return config;
}

/** Write a config atomically: a temporary file beside the target, then a rename. */
export function writeConfig(file: string, config: TunedConfig): void {
  writeFileAtomic(file, `${JSON.stringify(config, null, 2)}\n`);
}
