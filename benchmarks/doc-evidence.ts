/**
 * Link F1 on the bundled sample labeled set with document-level evidence on and off, from each
 * input form of the samples (mentions JSONL, documents + spans, CoNLL BIO tokens).
 *
 *   npx tsc -p tsconfig.bench.json && node dist-bench/benchmarks/doc-evidence.js
 *
 * Prints one JSON line per (input, setting). The CoNLL mentions come out in span order, so they
 * are paired with the gold rows by position (their texts are checked to agree).
 */
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { readLabeled } from "../src/commands/evaluate.js";
import { evaluate } from "../src/evaluate/metrics.js";
import { buildKb } from "../src/kb/build.js";
import { openKb } from "../src/kb/kb.js";
import { createLinker, type LinkerOptions } from "../src/link/linker.js";
import { readMentions } from "../src/read/index.js";
import type { LinkRow, Mention } from "../src/types.js";

const samples = fileURLToPath(new URL("../../kb-samples/", import.meta.url));

async function collect(it: AsyncIterable<Mention>): Promise<Mention[]> {
  const out: Mention[] = [];
  for await (const m of it) out.push(m);
  return out;
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), "hawser-docev-"));
  const kbFile = join(dir, "gazette.kb");
  await buildKb({ table: join(samples, "gazette-entities.csv"), out: kbFile });
  const kb = openKb(kbFile);
  const gold = await readLabeled(join(samples, "gazette-gold.jsonl"));
  const inputs: Record<string, Mention[]> = {
    jsonl: await collect(readMentions(join(samples, "gazette-mentions.jsonl"))),
    spans: await collect(
      readMentions(join(samples, "articles/spans.jsonl"), {
        documents: join(samples, "articles/documents.jsonl"),
        window: { sentences: 1 },
      }),
    ),
    conll: await collect(readMentions(join(samples, "articles/gazette.conll"))),
  };
  const settings: Record<string, LinkerOptions["document"]> = {
    on: undefined,
    off: false,
    "same-text only": { sameText: true, shortForm: false, acronyms: false },
    "short-form only": { sameText: false, shortForm: true, acronyms: false },
    "acronyms only": { sameText: false, shortForm: false, acronyms: true },
  };
  for (const [input, mentions] of Object.entries(inputs)) {
    if (mentions.length !== gold.length)
      throw new Error(`${input}: ${mentions.length} mentions, gold has ${gold.length}`);
    mentions.forEach((m, i) => {
      if (m.text !== gold[i]!.text)
        throw new Error(`${input}: mention ${i} "${m.text}" is not gold's "${gold[i]!.text}"`);
    });
    for (const [setting, document] of Object.entries(settings)) {
      const linker = createLinker(kb, document === undefined ? {} : { document });
      const rows: LinkRow[] = [];
      for await (const r of linker.linkAll(mentions)) rows.push(r);
      const report = evaluate(rows.map((r, i) => ({ gold: gold[i]!, predicted: r })));
      const o = report.overall;
      console.log(
        JSON.stringify({
          measure: "doc-evidence",
          input,
          setting,
          mentions: o.mentions,
          accuracy: +o.accuracy.toFixed(4),
          linkPrecision: +o.linkPrecision.toFixed(4),
          linkRecall: +o.linkRecall.toFixed(4),
          linkF1: +o.linkF1.toFixed(4),
        }),
      );
    }
  }
  kb.close();
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
