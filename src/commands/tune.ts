/** `hawser tune` as a library call: fit weights and choose the operating point on a labeled set. */
import { openKb } from "../kb/kb.js";
import { createLinker } from "../link/linker.js";
import { configFromTune, type TunedConfig, writeConfig } from "../tune/config.js";
import { renderReport } from "../tune/report-html.js";
import { type TuneResult, tune as tuneScored } from "../tune/tune.js";
import type { Objective, ScoredMention } from "../tune/types.js";
import { checkOutputFile, writeFileAtomic } from "../util/atomic-file.js";
import { requireCallback, requirePaths, shown, UsageError } from "../util/errors.js";
import { keepingWarnings } from "../read/warnings.js";
import { readLabeled, warnUnknownGold } from "./evaluate.js";
import { type LinkOptions, linkerOptionsFrom } from "./link.js";

export interface TuneCommandOptions
  extends Pick<LinkOptions, "maxCandidates" | "paths" | "labels" | "from" | "documents" | "window"> {
  /** KB file the weights are fitted for (its fingerprint goes into the config). */
  kb: string;
  /** Labeled link set. */
  gold: string;
  /** Config file to write (JSON). */
  out: string;
  /** Choose the highest recall whose precision is at least this; default: highest F1. */
  minPrecision?: number | undefined;
  /** Self-contained HTML report to write. */
  report?: string | undefined;
  /** Cross-validation folds. Default 5. */
  folds?: number | undefined;
  /** Seed of the fold assignment. Default 1. */
  seed?: number | undefined;
  /** L2 penalty of the logistic fit. Default 1. */
  l2?: number | undefined;
  /** Called with each warning as it is found. Default: none; the result's `warnings` holds them all. */
  warn?: ((message: string) => void) | undefined;
}

export interface TuneCommandResult {
  config: TunedConfig;
  result: TuneResult;
  /** Warnings met on the way (gold ids the KB lacks, ill-formed tags); the command line prints them. */
  warnings: string[];
}

/** Every candidate the linker scores for each labeled mention: the training data of tuning. */
export function scoredMentionsFor(
  linker: ReturnType<typeof createLinker>,
  gold: Awaited<ReturnType<typeof readLabeled>>,
): ScoredMention[] {
  return gold.map((m) => ({
    mention: m,
    candidates: linker
      .scoreCandidates(m)
      .map((c) => ({ entity: c.entity, features: c.features, name: c.name })),
  }));
}

export async function tune(options: TuneCommandOptions): Promise<TuneCommandResult> {
  requirePaths("tune", options, ["kb", "gold", "out"], ["report", "labels", "documents"]);
  requireCallback("tune", "warn", options.warn);
  for (const name of ["minPrecision", "folds", "seed", "l2"] as const) {
    const v = options[name];
    if (v !== undefined && !(typeof v === "number" && Number.isFinite(v)))
      throw new UsageError(`tune: ${name} must be a number, got ${shown(v)}`);
  }
  if (options.minPrecision !== undefined && !(options.minPrecision > 0 && options.minPrecision <= 1)) {
    throw new UsageError(`--min-precision must be in (0, 1], got ${options.minPrecision}`);
  }
  if (options.l2 !== undefined && !(options.l2 >= 0 && Number.isFinite(options.l2))) {
    throw new UsageError(`--l2 must be a finite number >= 0, got ${options.l2}`);
  }
  const inputs = [
    ["--kb", options.kb],
    ["--gold", options.gold],
    ["--labels", options.labels],
    ["--documents", options.documents],
  ] as const;
  checkOutputFile(options.out, "--out", inputs);
  if (options.report !== undefined)
    checkOutputFile(options.report, "--report", [...inputs, ["--out", options.out]]);
  const { warnings, note } = keepingWarnings(options.warn);
  const gold = await readLabeled(options.gold, options, note);
  const kb = openKb(options.kb);
  try {
    warnUnknownGold(kb, gold, options.gold, note);
    const linker = createLinker(kb, linkerOptionsFrom(options, kb.info.fingerprint));
    const data = scoredMentionsFor(linker, gold);
    const objective: Objective = options.minPrecision !== undefined ? "recall-at-precision" : "f1";
    const result = tuneScored(data, {
      objective,
      ...(options.minPrecision !== undefined ? { minPrecision: options.minPrecision } : {}),
      ...(options.folds !== undefined ? { folds: options.folds } : {}),
      ...(options.seed !== undefined ? { seed: options.seed } : {}),
      ...(options.l2 !== undefined ? { l2: options.l2 } : {}),
    });
    const kbRef = { fingerprint: kb.info.fingerprint, entities: kb.info.entities };
    const created = new Date();
    const config = configFromTune(result, kbRef, created);
    writeConfig(options.out, config);
    if (options.report !== undefined) {
      const html = renderReport({ tune: result, kb: kbRef, created: created.toISOString() });
      writeFileAtomic(options.report, html);
    }
    for (const w of linker.labels.warnings()) note(w);
    return { config, result, warnings };
  } finally {
    kb.close();
  }
}
