/**
 * Real open data nobody here wrote: the country subdivisions of four registry packages (see
 * open-subdivisions-data.ts), each linked to a table built from each of the others (12 pairs),
 * with the ISO 3166-2 code as gold. A mention is one package's name for a subdivision whose code
 * the table's package knows, typed GPE, with its country's name as context (a text about
 * Bangladesh that names "Bhola District"); the table holds the other package's names, each
 * row's country and, where the package gives it, its category. A quarter of each table's codes
 * are left out, so their mentions are NIL: a list of subdivisions holds many namesakes ("Central",
 * "Saint George", "La Paz") and a mention of a left-out one must not take another's row.
 *
 * Baselines a practitioner would write by hand: the folded exact name against the table's names
 * (a name two rows share matches neither), and, with context, the same within the mention's
 * country.
 *
 *   npx tsc -p tsconfig.bench.json && node dist-bench/benchmarks/open-subdivisions.js [--leave-out N] [--no-context] [--show]
 *
 * `--leave-out N`: every Nth code from the third is left out of each table (default 4; 0: none).
 * `--no-context`: mentions without their country. `--show`: every mention hawser gets wrong,
 * on stderr. One JSON line per pair, then one for all pairs together.
 */
import { writeFileSync } from "node:fs";
import { join } from "node:path";
import { parseArgs } from "node:util";
import { buildKb } from "../src/kb/build.js";
import { openKb } from "../src/kb/kb.js";
import { createLinker } from "../src/link/linker.js";
import { foldText } from "../src/normalize/fold.js";
import { inWorkDir } from "./open-data.js";
import {
  leftOutCodes,
  type Subdivision,
  type SubdivisionSource,
  subdivisionSources,
  subdivisionTableCsv,
} from "./open-subdivisions-data.js";

/** Folded name -> the one code it names in `rows`, or null when two codes share it. */
function exactNames(
  rows: readonly Subdivision[],
  key: (r: Subdivision) => string,
): Map<string, string | null> {
  const out = new Map<string, string | null>();
  for (const r of rows) {
    const k = key(r);
    out.set(k, out.has(k) && out.get(k) !== r.code ? null : r.code);
  }
  return out;
}

interface Tally {
  mentions: number;
  nil: number;
  hawser: number;
  wrongLinks: number;
  exact: number;
  exactInCountry: number;
}

const emptyTally = (): Tally => ({
  mentions: 0,
  nil: 0,
  hawser: 0,
  wrongLinks: 0,
  exact: 0,
  exactInCountry: 0,
});

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      "leave-out": { type: "string", default: "4" },
      "no-context": { type: "boolean", default: false },
      show: { type: "boolean", default: false },
    },
  });
  const every = Number(values["leave-out"]);
  if (!Number.isInteger(every) || every < 0 || every === 1)
    throw new Error("--leave-out takes 0 or a whole number >= 2");
  const withContext = !values["no-context"];
  const { sources, countryNames } = subdivisionSources();
  const total = emptyTally();
  const share = (n: number, of: number) => Math.round((10000 * n) / of) / 10000;
  const print = (fields: Record<string, unknown>, t: Tally) =>
    console.log(
      JSON.stringify({
        measure: "open-subdivisions",
        ...fields,
        context: withContext,
        leftOutEvery: every,
        mentions: t.mentions,
        nilShare: share(t.nil, t.mentions),
        accuracy: share(t.hawser, t.mentions),
        wrongLinks: t.wrongLinks,
        baselineExact: share(t.exact, t.mentions),
        ...(withContext ? { baselineExactInCountry: share(t.exactInCountry, t.mentions) } : {}),
      }),
    );
  await inWorkDir(undefined, "hawser-subdivisions-", async (dir) => {
    for (const [tableName, all] of Object.entries(sources) as Array<[SubdivisionSource, Subdivision[]]>) {
      const left = leftOutCodes(all, every);
      const held = all.filter((r) => !left.has(r.code));
      const csv = join(dir, `${tableName}.csv`);
      writeFileSync(csv, subdivisionTableCsv(held, countryNames));
      await buildKb({ table: csv, out: join(dir, `${tableName}.kb`) });
      const kb = openKb(join(dir, `${tableName}.kb`));
      const linker = createLinker(kb);
      const known = new Set(all.map((r) => r.code));
      const exact = exactNames(held, (r) => foldText(r.name));
      const exactInCountry = exactNames(held, (r) => `${r.country} ${foldText(r.name)}`);
      for (const [mentionName, mentions] of Object.entries(sources)) {
        if (mentionName === tableName) continue;
        const t = emptyTally();
        for (const m of mentions) {
          if (!known.has(m.code)) continue;
          const gold = left.has(m.code) ? null : m.code;
          const context = withContext ? (countryNames.get(m.country) ?? m.country) : undefined;
          const row = linker.link({ id: m.code, text: m.name, type: "GPE", context });
          t.mentions++;
          if (gold === null) t.nil++;
          if (row.entity === gold) t.hawser++;
          else if (values.show)
            console.error(
              `${tableName} <- ${mentionName}: ${m.name} [${context ?? m.country}] -> ${row.name ?? "NIL"} (gold ${gold})`,
            );
          if (row.entity !== null && row.entity !== gold) t.wrongLinks++;
          if ((exact.get(foldText(m.name)) ?? null) === gold) t.exact++;
          if ((exactInCountry.get(`${m.country} ${foldText(m.name)}`) ?? null) === gold) t.exactInCountry++;
        }
        for (const k of Object.keys(t) as Array<keyof Tally>) total[k] += t[k];
        print({ table: tableName, mentionsFrom: mentionName }, t);
      }
      kb.close();
    }
  });
  print({ pairs: "all" }, total);
}

await main();
