/** `hawser link` as a library call: link a mentions file against a KB, writing one row per mention. */
import { extname } from "node:path";
import { readKbInfo } from "../kb/kb.js";
import { LabelMap, readLabelMapFile } from "../labels/label-map.js";
import type { LinkerOptions } from "../link/linker.js";
import { type Linking, linkingOn } from "../link/linking.js";
import { MAX_JOBS } from "../link/parallel.js";
import { csvHeader, csvRow, jsonlRow, type OutputFormat } from "../link/write.js";
import { type ReadMentionsOptions, readMentions, resolveFormat } from "../read/index.js";
import { checkReadable } from "../read/lines.js";
import { keepingWarnings, warningLine } from "../read/warnings.js";
import { readConfig } from "../tune/config.js";
import type { SearchPath } from "../types.js";
import { AtomicWriter, checkOutputFile } from "../util/atomic-file.js";
import { checkWhole, requireCallback, requirePaths, UsageError } from "../util/errors.js";
import { progress } from "../util/progress.js";

export interface LinkOptions extends Omit<ReadMentionsOptions, "labeled"> {
  /** KB file built by `index`. */
  kb: string;
  /** Mentions file (JSONL, CSV, CoNLL, or span rows with `documents`). */
  mentions: string;
  /** Output file, written atomically; default: stdout. */
  out?: string | undefined;
  /** Output format; default: from the `out` extension (`.csv` -> csv), else jsonl. */
  to?: OutputFormat | undefined;
  /** Tuned config (from `tune`): weights, threshold, margin. */
  config?: string | undefined;
  /** Use a config tuned on another KB. Default false. */
  force?: boolean | undefined;
  /** Overrides the config's (or the default 0.5) threshold. */
  threshold?: number | undefined;
  /** Overrides the config's (or the default 0.5) minimum margin, in log-odds. */
  minMargin?: number | undefined;
  /** Candidates listed per row; default 3. */
  top?: number | undefined;
  /** Candidates scored per mention; default 30. */
  maxCandidates?: number | undefined;
  /** Candidate paths to run; default all. */
  paths?: SearchPath[] | undefined;
  /** JSON label map file overriding the built-in label sets. */
  labels?: string | undefined;
  /** Document-level evidence steps (same text, short forms, acronyms); `false` turns all off. Default: all on. */
  document?: LinkerOptions["document"] | undefined;
  /** Show a progress bar on stderr. Default false (the command line shows one when stderr is a terminal). */
  progress?: boolean | undefined;
  /**
   * Called with each warning (unknown labels, ill-formed tags) as it is found. Default: none;
   * the summary's `warnings` holds them all either way (the command line prints them).
   */
  warn?: ((message: string) => void) | undefined;
  /** Where rows go when `out` is not given; default process.stdout. */
  stdout?: NodeJS.WritableStream | undefined;
  /**
   * Threads that link (src/link/parallel.ts), 1 to 64; the rows are the same with any number.
   * They share the KB's in-memory store; each keeps its own SQLite connection and caches (peak
   * memory at a million entities: 382 MB on one thread, 584 MB on two). Default 1: linking on
   * the calling thread.
   */
  jobs?: number | undefined;
}

export interface LinkSummary {
  mentions: number;
  linked: number;
  nil: number;
  out: string | null;
  warnings: string[];
  seconds: number;
}

/** Build linker options from a config file and explicit overrides (shared by link, eval, demo). */
export function linkerOptionsFrom(
  o: Pick<
    LinkOptions,
    "config" | "force" | "threshold" | "minMargin" | "top" | "maxCandidates" | "paths" | "labels" | "document"
  >,
  kbFingerprint: string,
): LinkerOptions {
  const opts: LinkerOptions = {};
  if (o.config !== undefined) {
    const c = readConfig(o.config, { kbFingerprint, force: o.force ?? false });
    opts.weights = c.weights;
    opts.threshold = c.threshold;
    opts.minMargin = c.minMargin;
  }
  if (o.threshold !== undefined) opts.threshold = o.threshold;
  if (o.minMargin !== undefined) opts.minMargin = o.minMargin;
  if (o.top !== undefined) opts.top = o.top;
  if (o.maxCandidates !== undefined) opts.maxCandidates = o.maxCandidates;
  if (o.paths !== undefined) opts.paths = o.paths;
  if (o.document !== undefined) opts.document = o.document;
  opts.labels = o.labels !== undefined ? readLabelMapFile(o.labels) : new LabelMap();
  return opts;
}

/** The reader settings among a command's options (only those given, so the reader can check them). */
export function readerOptions(o: Omit<ReadMentionsOptions, "labeled">): ReadMentionsOptions {
  const keys = [
    "from",
    "documents",
    "tagColumn",
    "tokenColumn",
    "scheme",
    "contextSentences",
    "window",
  ] as const;
  const out: Record<string, unknown> = {};
  for (const k of keys) if (o[k] !== undefined) out[k] = o[k];
  return out as ReadMentionsOptions;
}

export function outputFormat(out: string | undefined, to: string | undefined): OutputFormat {
  if (to !== undefined) {
    if (to !== "jsonl" && to !== "csv")
      throw new UsageError(`unknown output format "${to}": use jsonl or csv`);
    return to;
  }
  const extension = out === undefined ? "" : extname(out).toLowerCase();
  if (extension === ".csv") return "csv";
  // Any other extension gets JSONL, but .tsv promises a table in tabs its reader would not find.
  if (extension === ".tsv")
    throw new UsageError(
      `--out ${out}: rows are written as JSONL or CSV; name the file .jsonl or .csv, or give --to jsonl|csv`,
    );
  return "jsonl";
}

export async function link(options: LinkOptions): Promise<LinkSummary> {
  const started = Date.now();
  requirePaths("link", options, ["kb", "mentions"], ["out", "config", "labels", "documents"]);
  requireCallback("link", "warn", options.warn);
  if (options.stdout !== undefined && typeof (options.stdout as { write?: unknown }).write !== "function")
    throw new UsageError("link: stdout must be a writable stream (with a write method)");
  const format = outputFormat(options.out, options.to);
  resolveFormat(options.mentions, readerOptions(options)); // usage errors before any file is opened
  if (options.out !== undefined)
    checkOutputFile(options.out, "--out", [
      ["--kb", options.kb],
      ["the mentions file", options.mentions],
      ["--config", options.config],
      ["--labels", options.labels],
      ["--documents", options.documents],
    ]);
  const jobs = options.jobs === undefined ? 1 : checkWhole("link: jobs", options.jobs, 1, MAX_JOBS);
  const linker = await linking(options, jobs);
  const { warnings, note } = keepingWarnings(options.warn);
  try {
    const source = readMentions(options.mentions, {
      ...readerOptions(options),
      onWarning: (w) => note(warningLine(w)),
    });
    const writer = options.out !== undefined ? new AtomicWriter(options.out) : null;
    const stdout = options.stdout ?? process.stdout;
    const emit = async (s: string) => {
      if (writer) await writer.write(s);
      else if (!stdout.write(s)) await new Promise((r) => stdout.once("drain", r));
    };
    const bar = progress("linking", options.progress);
    let n = 0;
    let linked = 0;
    try {
      if (format === "csv") await emit(csvHeader());
      for await (const row of linker.linkAll(source)) {
        n++;
        if (row.entity !== null) linked++;
        await emit(format === "csv" ? csvRow(row) : jsonlRow(row));
        bar.tick();
      }
      if (writer) await writer.commit();
    } catch (e) {
      writer?.abort();
      throw e;
    } finally {
      bar.stop();
    }
    for (const w of linker.labels.warnings()) note(w);
    return {
      mentions: n,
      linked,
      nil: n - linked,
      out: options.out ?? null,
      warnings,
      seconds: (Date.now() - started) / 1000,
    };
  } finally {
    await linker.close();
  }
}

/**
 * The KB's metadata is read here for the config's KB check, and the KB itself opened by the
 * linker's thread or threads.
 */
async function linking(options: LinkOptions, jobs: number): Promise<Linking> {
  const info = readKbInfo(options.kb);
  const linkerOptions = linkerOptionsFrom(options, info.fingerprint);
  if (jobs > 1) {
    // Starting the threads takes seconds at a million entities: an unreadable input says so first.
    checkReadable(options.mentions);
    if (options.documents !== undefined) checkReadable(options.documents);
  }
  return linkingOn(jobs, options.kb, linkerOptions);
}
