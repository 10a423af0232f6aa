/** `hawser eval` as a library call: link a labeled set (or read predicted rows) and measure. */
import { type AlignMode, type AlignedEvalReport, alignSpans, evaluateAligned } from "../evaluate/align.js";
import { DEFAULT_CANDIDATE_K, type EvalReport, evaluate as measure } from "../evaluate/metrics.js";
import { type Kb, openKb } from "../kb/kb.js";
import { DEFAULT_TOP, type LinkerOptions } from "../link/linker.js";
import { type Linking, linkingHere, linkingOn } from "../link/linking.js";
import { MAX_JOBS } from "../link/parallel.js";
import { readMentions, readJsonLines } from "../read/index.js";
import { keepingWarnings, type ReadWarning, warningLine } from "../read/warnings.js";
import type { LabeledMention, LinkRow } from "../types.js";
import { checkWhole, InputError, requireCallback, requirePaths, UsageError } from "../util/errors.js";
import { progress } from "../util/progress.js";
import { type LinkOptions, linkerOptionsFrom, readerOptions } from "./link.js";

export interface EvalOptions
  extends Pick<
    LinkOptions,
    | "config"
    | "force"
    | "threshold"
    | "minMargin"
    | "top"
    | "maxCandidates"
    | "paths"
    | "labels"
    | "document"
    | "from"
    | "documents"
    | "window"
    | "jobs"
  > {
  /** KB file (not read when `predicted` is given). */
  kb?: string | undefined;
  /** Labeled link set: mentions plus `gold` (entity id or null). */
  gold: string;
  /**
   * Predicted link rows (JSONL from `link`) from another NER run; when given, they are aligned
   * to the gold spans instead of linking the gold mentions.
   */
  predicted?: string | undefined;
  /** With `predicted`: `strict` (same boundaries) or `relaxed` (overlap). Default strict. */
  spanMatch?: AlignMode | undefined;
  /** k of candidate recall at k. Default 3 (the rows' default candidate count). */
  k?: number | undefined;
  /** Show a progress bar on stderr while linking. Default false (the command line shows one when stderr is a terminal). */
  progress?: boolean | undefined;
  /**
   * Called with each warning (gold ids the KB lacks, ill-formed tags) as it is found. Default:
   * none; the report's `warnings` holds them all either way (the command line prints them).
   */
  warn?: ((message: string) => void) | undefined;
}

/** What `evaluate` returns: the report, and the warnings met on the way. */
export type EvalResult = (EvalReport | AlignedEvalReport) & { warnings: string[] };

export async function readLabeled(
  file: string,
  options: Parameters<typeof readerOptions>[0] = {},
  warn: (message: string) => void = () => {},
): Promise<LabeledMention[]> {
  const out: LabeledMention[] = [];
  const onWarning = (w: ReadWarning) => warn(warningLine(w));
  for await (const m of readMentions(file, { ...readerOptions(options), labeled: true, onWarning }))
    out.push(m);
  if (out.length === 0) throw new InputError({ file }, "the labeled set is empty");
  return out;
}

/** Gold ids named in a warning about ids the KB lacks, at most. */
const UNKNOWN_GOLD_SHOWN = 3;

/**
 * Warns when gold ids of the labeled set are not ids of the KB: those mentions can only count as
 * wrong (a missed or wrong link), and a labeled set made against another table, or a table whose
 * ids changed since, would otherwise pass for a poor linker. Returns the number of such mentions.
 */
export function warnUnknownGold(
  kb: Kb,
  gold: readonly LabeledMention[],
  file: string,
  warn: (message: string) => void = () => {},
): number {
  const unknown = gold.filter((m) => m.gold !== null && kb.eidOf(m.gold) === undefined);
  if (unknown.length > 0) {
    const shown = unknown
      .slice(0, UNKNOWN_GOLD_SHOWN)
      .map((m) => `"${m.gold}" on line ${m.source?.line ?? "?"}`)
      .join(", ");
    warn(
      `${file}: ${unknown.length} of ${gold.length} gold ids are not in the KB (${shown}${unknown.length > UNKNOWN_GOLD_SHOWN ? ", ..." : ""}): ` +
        "those mentions cannot be linked right; was the labeled set made against another table?",
    );
  }
  return unknown.length;
}

async function readLinkRows(file: string): Promise<LinkRow[]> {
  const rows: LinkRow[] = [];
  for await (const { line, value } of readJsonLines(file)) {
    const r = value as Partial<LinkRow>;
    if (typeof r.mention !== "string")
      throw new InputError({ file, line, field: "mention" }, "a link row needs a mention id");
    if (r.entity !== null && typeof r.entity !== "string")
      throw new InputError({ file, line, field: "entity" }, "entity must be an id or null");
    rows.push({
      candidates: [],
      reasons: [],
      score: 0,
      margin: 0,
      text: "",
      type: null,
      name: null,
      ...r,
    } as LinkRow);
  }
  return rows;
}

export async function evaluate(options: EvalOptions): Promise<EvalResult> {
  // The KB is not opened when predicted rows are scored: then it is optional.
  const scoring = options.predicted !== undefined;
  requirePaths("evaluate", options, scoring ? ["gold"] : ["kb", "gold"], [
    ...(scoring ? ["kb"] : []),
    "predicted",
    "config",
    "labels",
    "documents",
  ]);
  requireCallback("evaluate", "warn", options.warn);
  if (options.k !== undefined) checkWhole("evaluate: k", options.k, 1);
  if (options.top !== undefined) checkWhole("evaluate: top", options.top, 0);
  const jobs = options.jobs === undefined ? 1 : checkWhole("evaluate: jobs", options.jobs, 1, MAX_JOBS);
  if (options.spanMatch !== undefined && options.predicted === undefined) {
    throw new UsageError(
      "--span-match needs --predicted (rows from another NER run to align with the gold spans)",
    );
  }
  if (options.spanMatch !== undefined && options.spanMatch !== "strict" && options.spanMatch !== "relaxed") {
    throw new UsageError(`unknown span match "${options.spanMatch}": use strict or relaxed`);
  }
  const { warnings, note } = keepingWarnings(options.warn);
  const gold = await readLabeled(options.gold, options, note);
  const k = options.k !== undefined ? { k: options.k } : {};
  if (options.predicted !== undefined) {
    const predicted = await readLinkRows(options.predicted);
    const wanted = options.k ?? DEFAULT_CANDIDATE_K;
    const listed = predicted.reduce((most, r) => Math.max(most, r.candidates.length), 0);
    if (listed < wanted)
      note(
        `${options.predicted}: the rows list at most ${listed} candidates, so candidate recall "at ${wanted}" counts among those (link with --top ${wanted} to measure it)`,
      );
    const alignment = alignSpans(gold, predicted, {
      mode: options.spanMatch ?? "strict",
      goldFile: options.gold,
      predictedFile: options.predicted,
    });
    return { ...evaluateAligned(alignment, k), warnings };
  }
  const kb = openKb(options.kb as string); // required above when there are no predicted rows
  let linkerOptions: LinkerOptions;
  try {
    warnUnknownGold(kb, gold, options.gold, note);
    linkerOptions = linkerOptionsFrom(options, kb.info.fingerprint);
  } catch (e) {
    kb.close();
    throw e;
  }
  // Candidate recall at k reads the rows' candidate lists: they must hold k candidates.
  linkerOptions.top = Math.max(linkerOptions.top ?? DEFAULT_TOP, options.k ?? DEFAULT_CANDIDATE_K);
  let linking: Linking;
  if (jobs > 1) {
    kb.close(); // the threads open it
    linking = await linkingOn(jobs, options.kb as string, linkerOptions);
  } else linking = linkingHere(kb, linkerOptions);
  try {
    const pairs = [];
    let i = 0;
    const bar = progress("linking", options.progress);
    try {
      for await (const row of linking.linkAll(gold)) {
        pairs.push({ gold: gold[i++]!, predicted: row });
        bar.tick();
      }
    } finally {
      bar.stop();
    }
    for (const w of linking.labels.warnings()) note(w);
    return { ...measure(pairs, k), warnings };
  } finally {
    await linking.close();
  }
}
