/**
 * Linking speed on a stream that repeats spellings, as an archive does (the same firms, towns and
 * officials named again and again), with surface reuse (LinkerOptions.surfaceCache, see
 * src/link/surface-cache.ts) off and at its default, in alternating chunks within one process
 * (see ab.ts for why). The stream draws mentions of a labeled file (say the benchmark's
 * mentions.jsonl) by a Zipf law over the file's order: the first mention is drawn most often,
 * the r-th with weight 1 / r^s. Rows of both linkers are compared, and must be identical.
 *
 *   npx tsc -p tsconfig.bench.json
 *   node dist-bench/benchmarks/repeats.js --kb KB --mentions MENTIONS.jsonl [--draws 20000] [--zipf 1] [--seed 1]
 *
 * Prints one JSON line.
 */
import { readFileSync } from "node:fs";
import { parseArgs } from "node:util";
import { openKb } from "../src/kb/kb.js";
import { createLinker, DEFAULT_SURFACE_CACHE } from "../src/link/linker.js";
import type { Mention } from "../src/types.js";
import { mixSeed, Rng } from "./gen/prng.js";

/** Mentions linked per chunk before switching to the other linker. */
const CHUNK = 500;
/** Mentions linked by each linker before timing starts (JIT). */
const WARMUP = 500;

function main(): void {
  const { values } = parseArgs({
    options: {
      kb: { type: "string" },
      mentions: { type: "string" },
      draws: { type: "string", default: "20000" },
      zipf: { type: "string", default: "1" },
      seed: { type: "string", default: "1" },
    },
  });
  if (values.kb === undefined || values.mentions === undefined) {
    console.error("usage: repeats.js --kb KB --mentions MENTIONS.jsonl [--draws N] [--zipf S] [--seed S]");
    process.exit(2);
  }
  const draws = Number(values.draws);
  const s = Number(values.zipf);
  const pool: Mention[] = readFileSync(values.mentions, "utf8")
    .split("\n")
    .filter((l) => l.trim() !== "")
    .map((l) => {
      const m = JSON.parse(l) as Mention;
      return { id: m.id, text: m.text, type: m.type, context: m.context };
    });
  const cum = new Float64Array(pool.length);
  let total = 0;
  for (let r = 0; r < pool.length; r++) {
    total += 1 / (r + 1) ** s;
    cum[r] = total;
  }
  const rng = new Rng(mixSeed(Number(values.seed), 0x7e9e));
  const stream: Mention[] = [];
  for (let i = 0; i < WARMUP + draws; i++) {
    const m = pool[rng.weighted(cum)]!;
    stream.push({ ...m, id: `d${i}` });
  }
  const distinct = new Set(stream.slice(WARMUP).map((m) => `${m.type}\u0000${m.text}`)).size;

  const kb = openKb(values.kb);
  const linkers = [createLinker(kb, { surfaceCache: 0 }), createLinker(kb)];
  for (const m of stream.slice(0, WARMUP)) for (const l of linkers) l.link(m);
  const ms = [0, 0];
  let differing = 0;
  for (let i = WARMUP; i < stream.length; i += CHUNK) {
    const chunk = stream.slice(i, i + CHUNK);
    const order = ((i - WARMUP) / CHUNK) % 2 === 0 ? [0, 1] : [1, 0];
    const rows: string[][] = [[], []];
    for (const w of order) {
      const started = performance.now();
      for (const m of chunk) rows[w]!.push(JSON.stringify(linkers[w]!.link(m)));
      ms[w]! += performance.now() - started;
    }
    rows[0]!.forEach((r, k) => {
      if (r !== rows[1]![k]) differing++;
    });
  }
  kb.close();
  const mps = ms.map((t) => Math.round((draws / t) * 1000));
  console.log(
    JSON.stringify({
      measure: "surface-reuse",
      draws,
      zipf: s,
      distinctShare: Math.round((distinct / draws) * 1000) / 1000,
      surfaceCache: DEFAULT_SURFACE_CACHE,
      mentionsPerSecondOff: mps[0],
      mentionsPerSecondOn: mps[1],
      speedup: Math.round((mps[1]! / mps[0]!) * 100) / 100,
      differingRows: differing,
    }),
  );
}

main();
