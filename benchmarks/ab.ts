/**
 * Linking speed of two builds of hawser compared side by side: each links the same mentions
 * with its own KB, in alternating chunks within one process, so that a drift in the machine's
 * speed (other work, CPU steal on a shared host) falls on both alike and the ratio holds.
 *
 *   git worktree add /tmp/old <commit> && (cd /tmp/old && npm ci && npm run build)
 *   node dist/cli/main.js index TABLE --out new.kb; node /tmp/old/dist/cli/main.js index TABLE --out old.kb
 *   npx tsc -p tsconfig.bench.json && node dist-bench/benchmarks/ab.js /tmp/old/dist old.kb dist new.kb MENTIONS.jsonl
 *
 * Prints one JSON line: mentions per second of A and of B, and B's speed over A's.
 */
import { readFileSync } from "node:fs";
import { resolve } from "node:path";
import { pathToFileURL } from "node:url";

/** What is used of a build's package entry point (old builds export the same calls). */
interface Build {
  openKb(file: string): unknown;
  createLinker(kb: unknown): { link(m: object): unknown };
}

/** Mentions linked per chunk before switching to the other build. */
const CHUNK = 500;
/** Mentions linked by each build before timing starts (JIT, caches). */
const WARMUP = 500;

async function linkerOf(dist: string, kb: string) {
  const build = (await import(pathToFileURL(resolve(dist, "index.js")).href)) as Build;
  return build.createLinker(build.openKb(kb));
}

async function main(): Promise<void> {
  const [distA, kbA, distB, kbB, mentionsFile] = process.argv.slice(2);
  if (mentionsFile === undefined) {
    console.error("usage: ab.js DIST_A KB_A DIST_B KB_B MENTIONS.jsonl");
    process.exit(2);
  }
  const linkers = [await linkerOf(distA!, kbA!), await linkerOf(distB!, kbB!)];
  const mentions = readFileSync(mentionsFile, "utf8")
    .split("\n")
    .filter((l) => l.trim() !== "")
    .map((l) => {
      const m = JSON.parse(l) as { id: string; text: string; type?: string; context?: string };
      return { id: m.id, text: m.text, type: m.type, context: m.context };
    });
  for (const m of mentions.slice(0, WARMUP)) for (const l of linkers) l.link(m);
  const ms = [0, 0];
  for (let i = 0; i < mentions.length; i += CHUNK) {
    const chunk = mentions.slice(i, i + CHUNK);
    // Alternate which build goes first, so neither always runs on a warmer cache.
    const order = (i / CHUNK) % 2 === 0 ? [0, 1] : [1, 0];
    for (const w of order) {
      const started = performance.now();
      for (const m of chunk) linkers[w]!.link(m);
      ms[w]! += performance.now() - started;
    }
  }
  const mps = ms.map((t) => Math.round((mentions.length / t) * 1000));
  console.log(
    JSON.stringify({
      mentions: mentions.length,
      aMentionsPerSecond: mps[0],
      bMentionsPerSecond: mps[1],
      speedup: Math.round((ms[0]! / ms[1]!) * 1000) / 1000,
    }),
  );
}

await main();
