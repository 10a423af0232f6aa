/**
 * `hawser demo`: the whole job on the bundled samples (kb-samples/, an invented archive of a
 * river-port trade gazette): index the table, link the mentions, measure against the gold set,
 * tune on it, and measure again.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { alignSpans, evaluateAligned } from "../evaluate/align.js";
import { type EvalReport, evaluate as evaluateRows } from "../evaluate/metrics.js";
import { onInterrupt } from "../util/interrupt.js";
import { UsageError } from "../util/errors.js";
import type { LinkRow } from "../types.js";
import { type EvalResult, evaluate, readLabeled } from "./evaluate.js";
import { index } from "./index-table.js";
import { type LinkOptions, link } from "./link.js";
import { PROCEDURE_WORDS } from "../tune/tune.js";
import { tune } from "./tune.js";

/** The bundled sample folder, found relative to the installed package. */
export const SAMPLES_DIR = fileURLToPath(new URL("../../kb-samples/", import.meta.url));

export interface DemoOptions {
  /** Folder for the KB, links, config and report. Default: a new temporary folder. */
  out?: string | undefined;
  /** Where the summary lines go. Default: stdout. */
  print?: ((line: string) => void) | undefined;
  /** Rows shown with their reasons. Default 4. */
  examples?: number | undefined;
  /**
   * Which form of the sample mentions to start from: `jsonl` (mentions with context), `conll`
   * (the articles as BIO-tagged tokens) or `spans` (the articles plus character spans). Default jsonl.
   */
  from?: DemoInput | undefined;
}

export type DemoInput = "jsonl" | "conll" | "spans";

export interface DemoResult {
  dir: string;
  kb: string;
  links: string;
  config: string;
  report: string;
  before: EvalReport;
  after: EvalReport;
}

const pct = (x: number) => `${(100 * x).toFixed(1)}%`;

export async function demo(options: DemoOptions = {}): Promise<DemoResult> {
  const print = options.print ?? ((s: string) => process.stdout.write(`${s}\n`));
  if (options.out !== undefined && statSync(options.out, { throwIfNoEntry: false })?.isDirectory() === false)
    throw new UsageError(`--out ${options.out} is a file: the demo writes its files into a folder`);
  const dir = options.out ?? mkdtempSync(join(tmpdir(), "hawser-demo-"));
  // A folder of its own making is removed whole if the demo is interrupted (--out's is the user's).
  const made =
    options.out === undefined
      ? onInterrupt({ run: () => rmSync(dir, { recursive: true, force: true }) })
      : () => {};
  try {
    mkdirSync(dir, { recursive: true });
    const table = join(SAMPLES_DIR, "gazette-entities.csv");
    const from = options.from ?? "jsonl";
    const inputs: Record<DemoInput, { mentions: string; extra: Partial<LinkOptions> }> = {
      jsonl: { mentions: join(SAMPLES_DIR, "gazette-mentions.jsonl"), extra: {} },
      conll: { mentions: join(SAMPLES_DIR, "articles/gazette.conll"), extra: {} },
      spans: {
        mentions: join(SAMPLES_DIR, "articles/spans.jsonl"),
        extra: { documents: join(SAMPLES_DIR, "articles/documents.jsonl"), window: { sentences: 1 } },
      },
    };
    const input = inputs[from];
    if (input === undefined) throw new UsageError(`unknown demo input "${from}": use jsonl, conll or spans`);
    const gold = join(SAMPLES_DIR, "gazette-gold.jsonl");
    const kb = join(dir, "gazette.kb");
    const links = join(dir, "links.jsonl");
    const config = join(dir, "tuned-config.json");
    const report = join(dir, "tuning-report.html");

    print("hawser demo: The Harrowmouth Gazette & Shipping List, 1890-1930 (invented sample archive)");
    const built = await index({ table, out: kb, progress: false });
    print(`1. indexed ${built.entities} entities (${built.aliases} names and aliases) from ${table}`);
    const s = await link({
      kb,
      mentions: input.mentions,
      ...input.extra,
      out: links,
      progress: false,
      warn: (m) => print(`   warning: ${m}`),
    });
    print(
      `2. linked ${s.mentions} mentions from ${input.mentions}: ${s.linked} linked, ${s.nil} NIL, in ${s.seconds.toFixed(2)}s`,
    );
    const rows = readFileSync(links, "utf8")
      .split("\n")
      .filter(Boolean)
      .map((l) => JSON.parse(l) as LinkRow);
    const before = await measureRows(rows, gold, from);
    const o = before.overall;
    print(
      `3. against the gold set (defaults): accuracy ${pct(o.accuracy)}, link precision ${pct(o.linkPrecision)}, ` +
        `recall ${pct(o.linkRecall)}, F1 ${pct(o.linkF1)}; gold among candidates ${pct(before.candidateRecall.atAll)}`,
    );
    print("   a few rows with their reasons:");
    for (const r of pickExamples(rows, options.examples ?? 4)) {
      print(
        `   - "${r.text}" (${r.type ?? "no label"}) -> ${r.entity === null ? "NIL" : `${r.entity} ${r.name}`}, score ${r.score}`,
      );
      for (const reason of r.reasons.filter((x) => x.code !== "found-by"))
        print(`       ${reason.code}: ${reason.message}`);
    }
    const warn = (m: string) => print(`   warning: ${m}`);
    const tuned = await tune({ kb, gold, out: config, report, warn });
    const after = (await evaluate({ kb, gold, config, warn })) as EvalResult & EvalReport;
    const f = tuned.result.figures;
    print(
      `4. tuned on the gold set (a logistic fit, the default weights with a swept threshold and the defaults, ` +
        `compared by 5-fold cross-validation; mentions scored one by one): ` +
        `kept ${PROCEDURE_WORDS[tuned.result.procedure]}, threshold ${tuned.config.threshold}, ` +
        `minimum margin ${tuned.config.minMargin} log-odds`,
    );
    print(
      `   link F1: defaults ${pct(f.defaults.linkF1)} -> tuned, held-out ${pct(f.heldOut.linkF1)} ` +
        `(in-sample ${pct(f.inSample.linkF1)})`,
    );
    const a = after.overall;
    print(
      `5. linked again with the tuned config and document evidence: accuracy ${pct(a.accuracy)}, ` +
        `link precision ${pct(a.linkPrecision)}, recall ${pct(a.linkRecall)}, F1 ${pct(a.linkF1)} ` +
        `(in-sample: tuned on these same mentions)`,
    );
    print(`files: KB ${kb}\n       links ${links}\n       config ${config}\n       report ${report}`);
    return { dir, kb, links, config, report, before, after };
  } finally {
    made();
  }
}

/**
 * The linked rows against the gold set: by span alignment for spans input, by position for the
 * others (the samples list mentions in the same order in every form; texts are checked).
 */
async function measureRows(rows: LinkRow[], goldFile: string, from: DemoInput): Promise<EvalReport> {
  const gold = await readLabeled(goldFile);
  if (from === "spans") return evaluateAligned(alignSpans(gold, rows, { mode: "strict", goldFile }));
  if (rows.length !== gold.length)
    throw new Error(`demo: ${rows.length} rows for ${gold.length} gold mentions`);
  rows.forEach((r, i) => {
    if (r.text !== gold[i]!.text)
      throw new Error(`demo: row ${i + 1} "${r.text}" is not gold's "${gold[i]!.text}"`);
  });
  return evaluateRows(gold.map((g, i) => ({ gold: g, predicted: rows[i]! })));
}

/** One clean link, one fuzzy or abbreviated link, one NIL, one ambiguous or type-mismatched row. */
function pickExamples(rows: LinkRow[], n: number): LinkRow[] {
  const has = (r: LinkRow, code: string) => r.reasons.some((x) => x.code === code);
  const picks = [
    rows.find((r) => r.entity !== null && has(r, "context-overlap")),
    rows.find((r) => r.entity !== null && (has(r, "ocr-key") || has(r, "initials") || has(r, "acronym"))),
    rows.find((r) => r.entity === null && has(r, "below-threshold")),
    rows.find((r) => has(r, "ambiguous") || has(r, "type-mismatch")),
  ];
  const out: LinkRow[] = [];
  for (const p of picks) if (p !== undefined && !out.includes(p) && out.length < n) out.push(p);
  return out;
}
