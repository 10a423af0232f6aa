/**
 * The candidate paths measured against each other: for each set of paths, pairs completeness
 * (gold entity among the generated candidates), candidates per mention, link F1 at the defaults
 * and mentions per second, on a synthetic table of N entities and on the bundled sample archive.
 *
 *   npx tsc -p tsconfig.bench.json && node dist-bench/benchmarks/paths.js --entities 100000 [--mentions 5000]
 *
 * One JSON line per (data set, path set) on stdout.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { ALL_PATHS, type CandidateOptions } from "../src/candidates/generate.js";
import { buildKb } from "../src/kb/build.js";
import { openKb } from "../src/kb/kb.js";
import { createLinker, type LinkerOptions } from "../src/link/linker.js";
import type { LabeledMention, SearchPath } from "../src/types.js";
import { generate, MENTIONS_FILE, TABLE_FILE } from "./generate.js";
import { readLabeled } from "./measure.js";

const samples = fileURLToPath(new URL("../../kb-samples/", import.meta.url));

interface Setting {
  name: string;
  paths: SearchPath[];
  candidates?: Partial<CandidateOptions>;
}

const without = (p: SearchPath) => ALL_PATHS.filter((x) => x !== p);
const SETTINGS: Setting[] = [
  { name: "all (default)", paths: [...ALL_PATHS] },
  {
    name: "all, token search even after a key match",
    paths: [...ALL_PATHS],
    candidates: { skipSearchOnKeyMatch: false },
  },
  {
    name: "all, without sub-key probes",
    paths: [...ALL_PATHS],
    candidates: { subKeys: false },
  },
  {
    name: "all, without respelling a rare surname after a key match",
    paths: [...ALL_PATHS],
    candidates: { respellSurnameOnKeyMatch: false },
  },
  {
    name: "all, token search cut to the 30 most popular hits (ftsLimit 30)",
    paths: [...ALL_PATHS],
    candidates: { ftsLimit: 30 },
  },
  {
    name: "all, token search widened to 300 hits (ftsLimit 300)",
    paths: [...ALL_PATHS],
    candidates: { ftsLimit: 300 },
  },
  {
    name: "all, up to 30 candidates from search (maxSearchCandidates 30)",
    paths: [...ALL_PATHS],
    candidates: { maxSearchCandidates: 30 },
  },
  ...ALL_PATHS.map((p) => ({ name: `without ${p}`, paths: without(p) })),
  { name: "exact only", paths: ["exact"] },
  { name: "exact + ocr", paths: ["exact", "ocr"] },
  { name: "exact + fts", paths: ["exact", "fts"] },
];

function measure(dataset: string, kbFile: string, mentions: LabeledMention[]): void {
  const kb = openKb(kbFile);
  for (const s of SETTINGS) {
    const options: LinkerOptions = { paths: s.paths, document: false };
    if (s.candidates) options.candidates = s.candidates;
    const linker = createLinker(kb, options);
    for (const m of mentions.slice(0, 200)) linker.link(m); // warm-up
    let found = 0;
    let golds = 0;
    let candidates = 0;
    for (const m of mentions) {
      const ids = linker.candidateIds(m);
      candidates += ids.length;
      if (m.gold !== null) {
        golds++;
        if (ids.includes(m.gold)) found++;
      }
    }
    let links = 0;
    let right = 0;
    const started = process.hrtime.bigint();
    for (const m of mentions) {
      const r = linker.link(m);
      if (r.entity !== null) {
        links++;
        if (r.entity === m.gold) right++;
      }
    }
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    const p = links === 0 ? 0 : right / links;
    const r = golds === 0 ? 0 : right / golds;
    const round = (x: number) => Math.round(x * 10000) / 10000;
    console.log(
      JSON.stringify({
        measure: "paths",
        dataset,
        setting: s.name,
        mentions: mentions.length,
        pairsCompleteness: round(found / golds),
        candidatesPerMention: round(candidates / mentions.length),
        linkF1: round(p + r === 0 ? 0 : (2 * p * r) / (p + r)),
        mentionsPerSecond: Math.round(mentions.length / seconds),
      }),
    );
  }
  kb.close();
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const arg = (name: string, dflt: number) => {
    const i = args.indexOf(name);
    return i >= 0 ? Number(args[i + 1]) : dflt;
  };
  const entities = arg("--entities", 100_000);
  const mentionCount = arg("--mentions", 5000);
  const dir = mkdtempSync(join(tmpdir(), "hawser-paths-"));
  try {
    await buildKb({ table: join(samples, "gazette-entities.csv"), out: join(dir, "gazette.kb") });
    measure("sample archive", join(dir, "gazette.kb"), readLabeled(join(samples, "gazette-gold.jsonl")));
    generate({ entities, mentions: mentionCount, out: dir });
    await buildKb({ table: join(dir, TABLE_FILE), out: join(dir, "synthetic.kb") });
    measure(`synthetic ${entities}`, join(dir, "synthetic.kb"), readLabeled(join(dir, MENTIONS_FILE)));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
