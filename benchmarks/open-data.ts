/**
 * What the open-data benchmarks (open-cities.ts, open-airports.ts) share: their options and
 * working folder, sampling, distance, and the linking and figures they print.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { parseArgs } from "node:util";
import { figuresOf } from "../src/evaluate/metrics.js";
import { buildKb } from "../src/kb/build.js";
import { openKb } from "../src/kb/kb.js";
import { createLinker } from "../src/link/linker.js";
import type { Mention } from "../src/types.js";
import type { Rng } from "./gen/prng.js";

/** Mean radius of the Earth, km (the usual value). */
const EARTH_KM = 6371;

/** Distance in km on a locally flat Earth (equirectangular): exact enough within a few km. */
export function km(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const r = Math.PI / 180;
  const x = (lon2 - lon1) * r * Math.cos(((lat1 + lat2) / 2) * r);
  const y = (lat2 - lat1) * r;
  return EARTH_KM * Math.sqrt(x * x + y * y);
}

/** The figures these benchmarks print, to three decimals (see src/evaluate/metrics.ts). */
export function scores(gold: ReadonlyArray<string | null>, predicted: ReadonlyArray<string | null>) {
  const f = figuresOf(gold, predicted);
  const r3 = (x: number) => Math.round(x * 1000) / 1000;
  return {
    accuracy: r3(f.accuracy),
    precision: r3(f.linkPrecision),
    recall: r3(f.linkRecall),
    f1: r3(f.linkF1),
    wrongLinks: f.predictedLinks - f.correctLinks,
  };
}

/** The options both benchmarks take (see their headers). */
export function openDataOptions() {
  const { values } = parseArgs({
    options: {
      mentions: { type: "string", default: "3000" },
      seed: { type: "string", default: "1" },
      keep: { type: "string" },
      "no-context": { type: "boolean", default: false },
      // open-cities only: keep the mentions whose gold place has at least this many inhabitants.
      "min-population": { type: "string", default: "0" },
    },
  });
  return {
    sample: Number(values.mentions),
    seed: Number(values.seed),
    keep: values.keep,
    withContext: !values["no-context"],
    minPopulation: Number(values["min-population"]),
  };
}

/** Runs `body` in `keep` (created when missing), or in a temporary folder removed afterwards. */
export async function inWorkDir(
  keep: string | undefined,
  prefix: string,
  body: (dir: string) => Promise<void>,
): Promise<void> {
  const dir = keep ?? mkdtempSync(join(tmpdir(), prefix));
  mkdirSync(dir, { recursive: true });
  try {
    await body(dir);
  } finally {
    if (keep === undefined) rmSync(dir, { recursive: true, force: true });
  }
}

/** A CSV field, quoted (RFC 4180). */
export const csvField = (s: string) => `"${s.replace(/"/g, '""')}"`;

/** Items grouped by a key, in input order within each group. */
export function groupBy<T>(items: Iterable<T>, key: (item: T) => string): Map<string, T[]> {
  const out = new Map<string, T[]>();
  for (const item of items) {
    const k = key(item);
    const list = out.get(k);
    if (list) list.push(item);
    else out.set(k, [item]);
  }
  return out;
}

/** Distinct indices in [0, n), drawn at random until none is left. */
export function* distinctDraws(rng: Rng, n: number): Generator<number> {
  const picked = new Set<number>();
  while (picked.size < n) {
    const i = rng.int(n);
    if (picked.has(i)) continue;
    picked.add(i);
    yield i;
  }
}

/** One benchmark's labeled mentions, with the folder holding its table (`<stem>.csv`). */
export interface OpenDataRun {
  /** The `measure` field of the printed lines. */
  measure: string;
  /** File stem of the table, the KB and the labeled mentions in `dir`. */
  stem: string;
  dir: string;
  withContext: boolean;
  mentions: Mention[];
  gold: Array<string | null>;
  /** The hand-written baselines: method and predicted entity per mention. */
  baselines: Array<[string, Array<string | null>]>;
}

/**
 * Writes the labeled mentions (`<stem>-gold.jsonl`), builds the KB (`<stem>.kb`), links every
 * mention at the defaults (without its context unless `withContext`), and prints one JSON line
 * for hawser and one per baseline.
 */
export async function linkAndReport(run: OpenDataRun): Promise<void> {
  const { dir, stem, mentions, gold } = run;
  writeFileSync(
    join(dir, `${stem}-gold.jsonl`),
    mentions.map((m, i) => `${JSON.stringify({ ...m, gold: gold[i] })}\n`).join(""),
  );
  const build = await buildKb({ table: join(dir, `${stem}.csv`), out: join(dir, `${stem}.kb`) });
  const kb = openKb(join(dir, `${stem}.kb`));
  const linker = createLinker(kb);
  const started = performance.now();
  const ours = mentions.map((m) => linker.link(run.withContext ? m : { ...m, context: undefined }).entity);
  const seconds = (performance.now() - started) / 1000;
  kb.close();

  const nil = gold.filter((g) => g === null).length;
  const common = {
    context: run.withContext,
    entities: build.entities,
    mentions: mentions.length,
    nilShare: Math.round((nil / mentions.length) * 1000) / 1000,
  };
  const line = (method: string, predicted: Array<string | null>, extra: Record<string, unknown> = {}) =>
    console.log(
      JSON.stringify({ measure: run.measure, method, ...common, ...scores(gold, predicted), ...extra }),
    );
  line("hawser defaults", ours, { mentionsPerSecond: Math.round(mentions.length / seconds) });
  for (const [method, predicted] of run.baselines) line(method, predicted);
}
