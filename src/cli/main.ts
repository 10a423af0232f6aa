#!/usr/bin/env node
/**
 * The `hawser` command line. Each subcommand is a thin shell over the library call of the same
 * name in src/commands/. Exit status: 0 done, 1 bad input (the message names file, line and
 * field), 2 bad usage.
 */
import { readFileSync } from "node:fs";
import { constants as osConstants } from "node:os";
import { Command, CommanderError, InvalidArgumentError, Option } from "commander";
import { agree } from "../commands/agree.js";
import { demo } from "../commands/demo.js";
import { evaluate } from "../commands/evaluate.js";
import { index } from "../commands/index-table.js";
import { link } from "../commands/link.js";
import { tune } from "../commands/tune.js";
import { PROCEDURE_WORDS, type TuneResult } from "../tune/tune.js";
import { formatEvalTable } from "../evaluate/format.js";
import { openKb } from "../kb/kb.js";
import { createLinker } from "../link/linker.js";
import { MAX_JOBS } from "../link/parallel.js";
import { ALL_PATHS } from "../candidates/generate.js";
import { MARGIN_CAP } from "../decide/decide.js";
import type { SearchPath } from "../types.js";
import { printWarning } from "../read/warnings.js";
import { undoAll, watchUndos } from "../util/interrupt.js";
import { InputError, OutputError, UsageError } from "../util/errors.js";

/** Exit status when an output cannot be written: EX_IOERR of sysexits.h. */
const OUTPUT_ERROR_EXIT = 74;

const pkg = JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as {
  version: string;
};

/**
 * A decimal number as options are written ("0.6", "30", "1e-3"). `Number` alone read an empty
 * value as 0 and "0x1" as 1.
 */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/** An option's value as a number; anything but a decimal number is refused. */
function numberOf(name: string, v: string): number {
  if (v.trim() === "") throw new InvalidArgumentError(`${name} needs a number, got an empty value`);
  if (!DECIMAL.test(v.trim())) throw new InvalidArgumentError(`${name} needs a decimal number, got "${v}"`);
  return Number(v);
}
function unit(name: string) {
  return (v: string) => {
    const x = numberOf(name, v);
    if (!(x >= 0 && x <= 1)) throw new InvalidArgumentError(`${name} must be a number in [0, 1]`);
    return x;
  };
}
function whole(name: string, min: number, max = Number.POSITIVE_INFINITY) {
  return (v: string) => {
    const x = numberOf(name, v);
    if (!Number.isInteger(x) || x < min || x > max)
      throw new InvalidArgumentError(
        max === Number.POSITIVE_INFINITY
          ? `${name} must be a whole number >= ${min}`
          : `${name} must be a whole number from ${min} to ${max}`,
      );
    return x;
  };
}
/** --jobs of the commands that link (link, eval). */
function jobsOption(): Option {
  return new Option(
    "--jobs <n>",
    `threads that link, 1-${MAX_JOBS}, same rows; more memory (at a million entities 380 MB on 1, 580 on 2); no more than the processors (default 1)`,
  ).argParser(whole("--jobs", 1, MAX_JOBS));
}
function nonNegative(name: string) {
  return (v: string) => {
    const x = numberOf(name, v);
    if (!(x >= 0 && Number.isFinite(x))) throw new InvalidArgumentError(`${name} must be a number >= 0`);
    return x;
  };
}
function pathList(v: string): SearchPath[] {
  const list = v
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean) as SearchPath[];
  if (list.length === 0)
    throw new InvalidArgumentError(`--paths needs at least one of ${ALL_PATHS.join(",")}`);
  for (const p of list)
    if (!ALL_PATHS.includes(p))
      throw new InvalidArgumentError(`unknown path "${p}"; use ${ALL_PATHS.join(",")}`);
  return list;
}

const out = (s: string) => process.stdout.write(s.endsWith("\n") ? s : `${s}\n`);
const err = (s: string) => process.stderr.write(s.endsWith("\n") ? s : `${s}\n`);
const pct = (x: number) => `${(100 * x).toFixed(1)}%`;

/** Options shared by link, eval and tune for reading mentions. */
function readerOptions(cmd: Command): Command {
  return cmd
    .addOption(
      new Option("--from <format>", "mentions format (default: from the extension)").choices([
        "jsonl",
        "csv",
        "tsv",
        "conll",
        "spans",
      ]),
    )
    .option("--documents <file>", "documents JSONL ({id, text}) the span rows point into (spans input)")
    .option("--tag-column <n>", "CoNLL: tag column, 0-based, negative from the end (default -1)", Number)
    .option(
      "--scheme <scheme>",
      "CoNLL: tag scheme IOB1, IOB2/BIO, IOE1, IOE2, BIOES/BILOU (default: detected)",
    )
    .option(
      "--context-sentences <n>",
      "CoNLL: sentences of context either side (default 1)",
      whole("--context-sentences", 0),
    )
    .option(
      "--window-chars <n>",
      "spans: characters of context either side (default 200)",
      whole("--window-chars", 0),
    )
    .option(
      "--window-sentences <n>",
      "spans: sentences of context either side instead of characters",
      whole("--window-sentences", 0),
    );
}
function linkerOptions(cmd: Command): Command {
  return cmd
    .option("--config <file>", "tuned config (from `hawser tune`): weights, threshold, margin")
    .option("--force", "use a config tuned on another KB")
    .option(
      "--threshold <x>",
      "link when the best score is at least this (default 0.5, or the config's)",
      unit("--threshold"),
    )
    .option(
      "--min-margin <x>",
      "and beats the runner-up by at least this many log-odds (default 0.5, or the config's)",
      (v: string) => {
        const x = numberOf("--min-margin", v);
        if (!(x >= 0 && x <= MARGIN_CAP))
          throw new InvalidArgumentError(`--min-margin must be a number in [0, ${MARGIN_CAP}]`);
        return x;
      },
    )
    .option("--top <k>", "candidates listed per row (default 3)", whole("--top", 0))
    .option(
      "--max-candidates <n>",
      "candidates scored per mention (default 30)",
      whole("--max-candidates", 1),
    )
    .option(
      "--paths <list>",
      `candidate paths to run, comma-separated (default ${ALL_PATHS.join(",")})`,
      pathList,
    )
    .option("--labels <file>", "JSON label map overriding the built-in NER label sets")
    .option("--no-doc-evidence", "turn off all document-level evidence")
    .option("--no-doc-same-text", "do not decide same-text mentions of a document together")
    .option("--no-doc-short-form", "do not resolve short forms to a fuller earlier mention")
    .option("--no-doc-acronyms", "do not resolve acronyms defined in the document");
}
function documentOption(o: Record<string, unknown>) {
  if (o.docEvidence === false) return { document: false as const };
  return {
    document: {
      sameText: o.docSameText !== false,
      shortForm: o.docShortForm !== false,
      acronyms: o.docAcronyms !== false,
    },
  };
}
function window(o: { windowChars?: number; windowSentences?: number }) {
  if (o.windowChars !== undefined && o.windowSentences !== undefined)
    throw new UsageError("give --window-chars or --window-sentences, not both");
  if (o.windowChars !== undefined) return { window: { chars: o.windowChars } };
  if (o.windowSentences !== undefined) return { window: { sentences: o.windowSentences } };
  return {};
}
/** Commander's camelCase option object -> library options (only those given). */
function common(o: Record<string, unknown>) {
  const keep = [
    "from",
    "documents",
    "tagColumn",
    "scheme",
    "contextSentences",
    "config",
    "force",
    "threshold",
    "minMargin",
    "top",
    "maxCandidates",
    "paths",
    "labels",
  ];
  const r: Record<string, unknown> = {};
  for (const k of keep) if (o[k] !== undefined) r[k] = o[k];
  return {
    ...r,
    ...window(o as { windowChars?: number; windowSentences?: number }),
    ...(o.docEvidence !== undefined ? documentOption(o) : {}),
  };
}

export function program(): Command {
  const p = new Command("hawser")
    .description("Link named-entity mentions to your own entity table, with scores and reasons.")
    .version(pkg.version)
    .showHelpAfterError("(add --help for every option and its default)")
    .exitOverride();

  p.command("index")
    .description("build a KB file (SQLite) from a knowledge table (CSV, TSV or JSONL)")
    .argument(
      "<table>",
      "knowledge table: id, name, type, aliases, description, prior, other columns as attributes; - reads stdin (JSONL unless --from)",
    )
    .requiredOption("--out <kb>", "KB file to write (atomically)")
    .addOption(
      new Option("--from <format>", "table format (default: from the extension)").choices([
        "csv",
        "tsv",
        "jsonl",
      ]),
    )
    .option("--labels <file>", "JSON label map for table types")
    .action(async (table: string, o: { out: string; from?: "csv" | "tsv" | "jsonl"; labels?: string }) => {
      const s = await index({ table, ...o, progress: process.stderr.isTTY === true });
      err(
        `indexed ${s.entities} entities (${s.aliases} names and aliases, ${s.keys} keys) into ${o.out} in ${s.seconds.toFixed(2)}s`,
      );
      for (const [t, n] of Object.entries(s.unknownTypes))
        err(`hawser: warning: table type "${t}" is not a known type (${n} rows): indexed as class "other"`);
      for (const w of s.columnWarnings) err(`hawser: warning: ${table}: ${w}`);
    });

  linkerOptions(
    readerOptions(
      p
        .command("link")
        .description("link a file of mentions: one output row per mention, in input order")
        .argument(
          "<mentions>",
          "mentions: JSONL, CSV, CoNLL (.conll/.bio/.iob) or span rows with --documents; - reads stdin (JSONL unless --from)",
        )
        .requiredOption("--kb <kb>", "KB file built by `hawser index`")
        .option("--out <file>", "output file, written atomically (default: stdout)")
        .addOption(
          new Option("--to <format>", "output format (default: jsonl, or csv for a .csv --out)").choices([
            "jsonl",
            "csv",
          ]),
        )
        .addOption(jobsOption()),
    ),
  ).action(async (mentions: string, o: Record<string, unknown>) => {
    const s = await link({
      kb: o.kb as string,
      mentions,
      ...common(o),
      // Not when the rows go to the same terminal: the bar would land among them.
      progress: process.stderr.isTTY === true && (o.out !== undefined || process.stdout.isTTY !== true),
      warn: printWarning,
      ...(o.out ? { out: o.out as string } : {}),
      ...(o.to ? { to: o.to as "jsonl" | "csv" } : {}),
      ...(o.jobs !== undefined ? { jobs: o.jobs as number } : {}),
    });
    err(
      `linked ${s.linked} of ${s.mentions} mentions (${s.nil} NIL) in ${s.seconds.toFixed(2)}s${s.out ? ` -> ${s.out}` : ""}`,
    );
  });

  linkerOptions(
    readerOptions(
      p
        .command("eval")
        .description("measure linking against a labeled link set")
        .option("--kb <kb>", "KB file (not needed with --predicted)")
        .requiredOption("--gold <file>", "labeled link set: mentions plus gold (entity id or null)")
        .option("--predicted <file>", "link rows (JSONL) from another NER run, aligned to the gold spans")
        .addOption(
          new Option("--span-match <mode>", "span alignment with --predicted (default strict)").choices([
            "strict",
            "relaxed",
          ]),
        )
        .option("--k <k>", "k of candidate recall at k (default 3)", whole("--k", 1))
        .addOption(jobsOption())
        .option("--json", "print the full report as JSON"),
    ),
  ).action(async (o: Record<string, unknown>) => {
    if (o.kb === undefined && o.predicted === undefined)
      throw new UsageError(
        "eval needs --kb to link the gold mentions (or --predicted rows to score instead)",
      );
    const { warnings: _printed, ...report } = await evaluate({
      kb: o.kb as string,
      gold: o.gold as string,
      ...common(o),
      progress: process.stderr.isTTY === true,
      warn: printWarning,
      ...(o.predicted ? { predicted: o.predicted as string } : {}),
      ...(o.spanMatch ? { spanMatch: o.spanMatch as "strict" | "relaxed" } : {}),
      ...(o.k ? { k: o.k as number } : {}),
      ...(o.jobs !== undefined ? { jobs: o.jobs as number } : {}),
    });
    out(o.json ? JSON.stringify(report, null, 2) : formatEvalTable(report));
  });

  readerOptions(
    p
      .command("tune")
      .description(
        "fit feature weights and choose threshold and margin on a labeled link set, keeping the defaults where nothing fitted does better held out",
      )
      .requiredOption("--kb <kb>", "KB file")
      .requiredOption("--gold <file>", "labeled link set")
      .requiredOption("--out <config>", "config file to write (JSON)")
      .option(
        "--min-precision <p>",
        "choose the highest recall with precision >= p (default: highest F1)",
        unit("--min-precision"),
      )
      .option("--report <html>", "write a self-contained HTML report")
      .option("--folds <k>", "cross-validation folds (default 5)", whole("--folds", 2))
      .option("--seed <s>", "seed of the fold assignment (default 1)", whole("--seed", 0))
      .option("--l2 <x>", "L2 penalty of the logistic fit (default 1)", nonNegative("--l2"))
      .option(
        "--max-candidates <n>",
        "candidates scored per mention (default 30)",
        whole("--max-candidates", 1),
      )
      .option("--labels <file>", "JSON label map"),
  ).action(async (o: Record<string, unknown>) => {
    const opt = {
      kb: o.kb as string,
      gold: o.gold as string,
      out: o.out as string,
      ...common(o),
      warn: printWarning,
    } as Parameters<typeof tune>[0];
    for (const k of ["minPrecision", "report", "folds", "seed", "l2"] as const)
      if (o[k] !== undefined) (opt as unknown as Record<string, unknown>)[k] = o[k];
    const { config, result } = await tune(opt);
    const f = result.figures;
    out(
      [
        `tuned on ${result.mentions} mentions (${result.pairs} candidate pairs), ${result.folds}-fold cross-validation, seed ${result.seed}`,
        keptLine(result, config.minPrecision),
        `operating point: threshold ${config.threshold}, minimum margin ${config.minMargin} (objective ${config.objective})`,
        `                 link precision  recall     F1   accuracy`,
        `defaults         ${pct(f.defaults.linkPrecision).padStart(9)} ${pct(f.defaults.linkRecall).padStart(7)} ${pct(f.defaults.linkF1).padStart(6)} ${pct(f.defaults.accuracy).padStart(9)}`,
        `tuned, held-out  ${pct(f.heldOut.linkPrecision).padStart(9)} ${pct(f.heldOut.linkRecall).padStart(7)} ${pct(f.heldOut.linkF1).padStart(6)} ${pct(f.heldOut.accuracy).padStart(9)}`,
        `tuned, in-sample ${pct(f.inSample.linkPrecision).padStart(9)} ${pct(f.inSample.linkRecall).padStart(7)} ${pct(f.inSample.linkF1).padStart(6)} ${pct(f.inSample.accuracy).padStart(9)}`,
        ...result.notes.map((n) => `note: ${n}`),
        `config -> ${o.out}${o.report ? `, report -> ${o.report}` : ""}`,
      ].join("\n"),
    );
  });

  p.command("agree")
    .description("agreement of two labeled files over the same mentions (Cohen's kappa)")
    .argument("<a>", "first labeled file")
    .argument("<b>", "second labeled file")
    .option("--out <file>", "write the disagreements to adjudicate (JSONL)")
    .option("--json", "print the result as JSON")
    .action(async (a: string, b: string, o: { out?: string; json?: boolean }) => {
      const r = await agree({ a, b, ...(o.out ? { out: o.out } : {}) });
      if (o.json) out(JSON.stringify(r, null, 2));
      else {
        out(
          `mentions ${r.n}\nobserved agreement ${r.observed.toFixed(4)}\nchance agreement ${r.expected.toFixed(4)}\nCohen's kappa ${r.kappa.toFixed(4)}\ndisagreements ${r.disagreements.length}`,
        );
        for (const line of differingPairLines(r.counts)) out(line);
        if (!o.out) for (const d of r.disagreements) out(JSON.stringify(d));
      }
    });

  p.command("info")
    .description("print what a KB file holds")
    .argument("<kb>", "KB file")
    .action((file: string) => {
      const kb = openKb(file);
      try {
        // The near-name rate is measured, not stored (src/link/crowding.ts): up to a second at 1M.
        // The kind values (a table's countries, counties) are counted, not listed: there may be thousands.
        const { kindValues, ...info } = kb.info;
        out(
          JSON.stringify(
            { ...info, kindValues: kindValues.length, nearNameRate: createLinker(kb).nearNameRate },
            null,
            2,
          ),
        );
      } finally {
        kb.close();
      }
    });

  p.command("demo")
    .description("run the whole job on the bundled sample tables (a river-port trade gazette archive)")
    .option("--out <dir>", "folder for the KB, links and config (default: a new temporary folder)")
    .addOption(
      new Option(
        "--from <input>",
        "start from the sample mentions as JSONL, CoNLL BIO tokens, or documents + spans",
      )
        .choices(["jsonl", "conll", "spans"])
        .default("jsonl"),
    )
    .action(async (o: { out?: string; from: "jsonl" | "conll" | "spans" }) => {
      await demo({ ...(o.out ? { out: o.out } : {}), from: o.from, print: out });
    });
  return p;
}

/** Label pairs of `agree`'s text summary: the most frequent first, the rest counted (all with --json). */
const AGREE_PAIRS_SHOWN = 20;

/** The label pairs on which the two files differ, most frequent first, as lines for people. */
function differingPairLines(
  counts: ReadonlyArray<{ a: string | null; b: string | null; count: number }>,
): string[] {
  const differing = counts.filter((c) => c.a !== c.b);
  if (differing.length === 0) return [];
  const label = (c: string | null) => c ?? "NIL";
  const lines = ["label pairs that differ (A -> B: mentions), most frequent first:"];
  for (const c of differing.slice(0, AGREE_PAIRS_SHOWN))
    lines.push(`  ${label(c.a)} -> ${label(c.b)}: ${c.count}`);
  if (differing.length > AGREE_PAIRS_SHOWN)
    lines.push(`  ... ${differing.length - AGREE_PAIRS_SHOWN} more pairs (--json lists every pair)`);
  return lines;
}

/**
 * The procedure tune kept, with the held-out figures it was chosen by: link F1, or, for the
 * highest recall at a minimum precision, precision and recall (F1 would make a procedure kept
 * for its recall look the worse).
 */
function keptLine(result: TuneResult, minPrecision: number | undefined): string {
  const p = result.procedures;
  const shown = (f: TuneResult["procedures"]["fitted"]) =>
    minPrecision === undefined ? pct(f.linkF1) : `${pct(f.linkPrecision)} / ${pct(f.linkRecall)}`;
  const what =
    minPrecision === undefined
      ? "held-out link F1"
      : `held-out link precision / recall, for the highest recall at precision >= ${minPrecision}`;
  return `kept: ${PROCEDURE_WORDS[result.procedure]} (${what}: fitted ${shown(p.fitted)}, default weights ${shown(p["default-weights"])}, defaults ${shown(p.defaults)})`;
}

export async function main(argv: string[]): Promise<number> {
  try {
    await program().parseAsync(argv, { from: "user" });
    return 0;
  } catch (e) {
    if (e instanceof CommanderError) return e.exitCode === 0 ? 0 : 2;
    if (e instanceof InputError) {
      err(`hawser: ${e.message}`);
      return 1;
    }
    if (e instanceof UsageError) {
      err(`hawser: ${e.message}`);
      return 2;
    }
    if (e instanceof OutputError) {
      err(`hawser: ${e.message}`);
      return OUTPUT_ERROR_EXIT;
    }
    err(`hawser: internal error: ${(e as Error).stack ?? String(e)}`);
    return 70;
  }
}

/**
 * A reader that stops early (`hawser link ... | head`) closes the pipe: the rest of the output has
 * nowhere to go, which is no failure of hawser's. Stop quietly, as Unix tools do, instead of
 * dying of an unhandled EPIPE with a stack trace.
 */
process.stdout.on("error", (e: NodeJS.ErrnoException) => {
  // Exiting here runs no `finally` block: a progress bar gives the cursor back first.
  undoAll();
  if (e.code === "EPIPE") process.exit(0);
  // Any other failure of standard output (a full disk behind a redirection): say so, exit 74.
  err(`hawser: ${new OutputError("standard output", e).message}`);
  process.exit(OUTPUT_ERROR_EXIT);
});

/**
 * Interrupted (Ctrl-C, a kill, a closed terminal): no `finally` block runs, so the temporary KB
 * or links file under way is removed here, a progress bar gives the terminal its cursor back,
 * and the exit status says which signal it was (128 + its number, as shells report it). Handled
 * only while there is something to undo (see src/util/interrupt.ts): otherwise the process ends
 * at once, however long the computation under way.
 */
const SIGNAL_HANDLERS = (["SIGINT", "SIGTERM", "SIGHUP"] as const).map((signal) => {
  const handler = () => {
    const unfinished = undoAll();
    err(
      `hawser: interrupted (${signal})${unfinished.length > 0 ? `; not written: ${unfinished.join(", ")} (the unfinished file was removed)` : ""}`,
    );
    process.exit(128 + osConstants.signals[signal]);
  };
  return [signal, handler] as const;
});
watchUndos((pending) => {
  for (const [signal, handler] of SIGNAL_HANDLERS) {
    process.off(signal, handler);
    if (pending) process.on(signal, handler);
  }
});

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
