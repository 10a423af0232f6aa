/**
 * Real open data nobody here wrote: the country names of eight registry packages, each linked to
 * a table built from each of the others (56 pairs), with the ISO 3166-1 alpha-2 code as gold.
 * Each package's main English name is the mention; the table holds the other package's names
 * (its main name, and its other names as aliases where it gives any). The baseline is the one
 * the country tests use: folded exact match against the table's names, a name two countries
 * share matching neither.
 *
 *   npx tsc -p tsconfig.bench.json && node dist-bench/benchmarks/open-countries.js [--leave-out N] [--show]
 *
 * `--leave-out N` leaves every Nth country (in code order, from the third) out of each table, so
 * that its mentions are NIL (default 0: none); `--show` prints every mention hawser gets wrong. One JSON
 * line per pair, then one for all pairs together.
 */
import { writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { join } from "node:path";
import { parseArgs } from "node:util";
import { buildKb } from "../src/kb/build.js";
import { openKb } from "../src/kb/kb.js";
import { createLinker } from "../src/link/linker.js";
import { foldText } from "../src/normalize/fold.js";
import { csvField, inWorkDir } from "./open-data.js";

const require = createRequire(import.meta.url);

/** A country as one package gives it: its code and its names, the first the main one. */
interface Country {
  code: string;
  names: string[];
}

/** With --leave-out N, the countries left out of a table: the third in code order, then every Nth. */
const LEAVE_OUT_FROM = 2;

/** Names in Latin script only: a table of English names cannot hold the others. */
const LATIN = /^[\u0020-\u007e\u00a0-\u024f\u2018\u2019]+$/;

function sources(): Record<string, Country[]> {
  const ccl = require("country-code-lookup") as { countries: Array<{ iso2: string; country: string }> };
  const ct = require("countries-and-timezones") as {
    getAllCountries(): Record<string, { id: string; name: string }>;
  };
  const cd = require("country-data") as {
    countries: { all: Array<{ alpha2: string; name: string; status: string }> };
  };
  const iso3166 = require("iso-3166-1") as { all(): Array<{ alpha2: string; country: string }> };
  const world = require("world-countries") as Array<{
    cca2: string;
    name: { common: string; official: string };
  }>;
  const i18n = require("i18n-iso-countries") as {
    getNames(lang: string, o: { select: "all" }): Record<string, string[]>;
  };
  const clist = (
    require("countries-list") as {
      countries: Record<string, { name: string; native: string; alias?: string[] }>;
    }
  ).countries;
  const cl = require("country-list") as { getData(): Array<{ code: string; name: string }> };
  return {
    "country-code-lookup": ccl.countries.map((c) => ({ code: c.iso2, names: [c.country] })),
    "countries-and-timezones": Object.values(ct.getAllCountries()).map((c) => ({
      code: c.id,
      names: [c.name],
    })),
    "country-data": cd.countries.all
      .filter((c) => c.status === "assigned")
      .map((c) => ({ code: c.alpha2, names: [c.name] })),
    "iso-3166-1": iso3166.all().map((c) => ({ code: c.alpha2, names: [c.country] })),
    "world-countries": world.map((c) => ({
      code: c.cca2,
      names: [...new Set([c.name.common, c.name.official])],
    })),
    "i18n-iso-countries": Object.entries(i18n.getNames("en", { select: "all" })).map(([code, names]) => ({
      code,
      names,
    })),
    "countries-list": Object.entries(clist).map(([code, c]) => ({
      code,
      names: [...new Set([c.name, c.native, ...(c.alias ?? [])].filter((n) => n !== "" && LATIN.test(n)))],
    })),
    "country-list": cl.getData().map((c) => ({ code: c.code, names: [c.name] })),
  };
}

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: { "leave-out": { type: "string", default: "0" }, show: { type: "boolean", default: false } },
  });
  const every = Number(values["leave-out"]);
  if (!Number.isInteger(every) || every < 0 || every === 1)
    throw new Error("--leave-out takes 0 or a whole number >= 2");
  const all = sources();
  const total = { mentions: 0, hawser: 0, baseline: 0, wrongLinks: 0 };
  await inWorkDir(undefined, "hawser-countries-", async (dir) => {
    for (const [tableName, table] of Object.entries(all)) {
      const codes = [...new Set(table.map((c) => c.code))].sort();
      const left = new Set(every > 0 ? codes.filter((_, i) => i % every === LEAVE_OUT_FROM % every) : []);
      const held = table.filter((c) => !left.has(c.code));
      const exact = new Map<string, string | null>();
      const lines = ["id,name,type,aliases"];
      for (const c of held) {
        lines.push(
          [c.code, csvField(c.names[0]!), "country", csvField(c.names.slice(1).join("|"))].join(","),
        );
        for (const n of c.names) {
          const k = foldText(n);
          exact.set(k, exact.has(k) && exact.get(k) !== c.code ? null : c.code);
        }
      }
      const csv = join(dir, `${tableName}.csv`);
      writeFileSync(csv, `${lines.join("\n")}\n`);
      await buildKb({ table: csv, out: join(dir, `${tableName}.kb`) });
      const kb = openKb(join(dir, `${tableName}.kb`));
      const linker = createLinker(kb);
      const inTable = new Set(held.map((c) => c.code));
      for (const [mentionName, mentions] of Object.entries(all)) {
        if (mentionName === tableName) continue;
        let hawser = 0;
        let baseline = 0;
        let wrongLinks = 0;
        for (const m of mentions) {
          const text = m.names[0]!;
          const gold = inTable.has(m.code) ? m.code : null;
          const row = linker.link({ id: m.code, text, type: "GPE" });
          if (row.entity === gold) hawser++;
          else if (values.show)
            console.error(`${tableName} <- ${mentionName}: ${text} -> ${row.name ?? "NIL"} (gold ${gold})`);
          if (row.entity !== null && row.entity !== gold) wrongLinks++;
          if ((exact.get(foldText(text)) ?? null) === gold) baseline++;
        }
        const n = mentions.length;
        total.mentions += n;
        total.hawser += hawser;
        total.baseline += baseline;
        total.wrongLinks += wrongLinks;
        console.log(
          JSON.stringify({
            measure: "open-countries",
            table: tableName,
            mentions: mentionName,
            names: n,
            leftOutEvery: every,
            accuracy: Math.round((10000 * hawser) / n) / 10000,
            baselineAccuracy: Math.round((10000 * baseline) / n) / 10000,
            wrongLinks,
          }),
        );
      }
      kb.close();
    }
  });
  console.log(
    JSON.stringify({
      measure: "open-countries",
      pairs: "all",
      names: total.mentions,
      leftOutEvery: every,
      accuracy: Math.round((10000 * total.hawser) / total.mentions) / 10000,
      baselineAccuracy: Math.round((10000 * total.baseline) / total.mentions) / 10000,
      wrongLinks: total.wrongLinks,
    }),
  );
}

await main();
