/**
 * Country subdivisions (states, provinces, districts, oblasts...) as four registry packages give
 * them, each with its ISO 3166-2 code: the data of benchmarks/open-subdivisions.ts and
 * tests/subdivisions-open-data.test.ts. Nobody here wrote it.
 *
 * - `iso-3166-2` (MIT): 5,099 subdivisions, names mostly in the local language's romanization
 *   ("Tiranë", "Bresckaja voblasć"), with the subdivision's category ("District", "Province").
 * - `iso-3166-2.json` (ISC): 3,807 subdivisions, an older edition of the same standard's names,
 *   some with an English form in brackets ("Kabul (Kābol)").
 * - `country-region-data` (MIT): 4,387 regions with English names ("Tirana", "Brest voblast");
 *   the code is the country's and the region's short code, which is the ISO one for most.
 * - `country-state-city` (GPL-3.0, read as data by these checks only, never shipped): 4,963
 *   states with English names that often carry the kind ("Berat County", "Bhola District").
 *
 * The packages disagree on a few hundred codes (country-state-city numbers Uganda's districts one
 * off from the standard), so a share of every method's "errors" are the gold's: it bounds the
 * accuracy any method reaches, the baselines' as much as hawser's.
 */
import { createRequire } from "node:module";

const require = createRequire(import.meta.url);

/** One subdivision as a package gives it. */
export interface Subdivision {
  /** ISO 3166-2 code, "BD-07". */
  code: string;
  name: string;
  /** ISO 3166-1 alpha-2 code of its country. */
  country: string;
  /** Its category ("District"), where the package gives one. */
  category?: string;
}

export type SubdivisionSource =
  | "iso-3166-2"
  | "iso-3166-2.json"
  | "country-region-data"
  | "country-state-city";

/** Every package's subdivisions, and the English country names of `iso-3166-2` by code. */
export function subdivisionSources(): {
  sources: Record<SubdivisionSource, Subdivision[]>;
  countryNames: Map<string, string>;
} {
  const iso = (
    require("iso-3166-2") as {
      data: Record<string, { name: string; sub: Record<string, { type: string; name: string }> }>;
    }
  ).data;
  const isoJson = require("iso-3166-2.json") as Record<
    string,
    { name: string; divisions: Record<string, string> }
  >;
  const regions = require("country-region-data/data.json") as Array<{
    countryShortCode: string;
    regions: Array<{ name: string; shortCode?: string }>;
  }>;
  const { State } = require("country-state-city") as {
    State: { getAllStates(): Array<{ name: string; isoCode: string; countryCode: string }> };
  };
  const countryNames = new Map(Object.entries(iso).map(([cc, c]) => [cc, c.name]));
  return {
    countryNames,
    sources: {
      "iso-3166-2": Object.entries(iso).flatMap(([country, c]) =>
        Object.entries(c.sub).map(([code, s]) => ({ code, name: s.name, country, category: s.type })),
      ),
      "iso-3166-2.json": Object.entries(isoJson).flatMap(([country, c]) =>
        Object.entries(c.divisions).map(([code, name]) => ({ code, name, country })),
      ),
      "country-region-data": regions.flatMap((c) =>
        c.regions
          .filter((r) => r.shortCode !== undefined)
          .map((r) => ({
            code: `${c.countryShortCode}-${r.shortCode}`,
            name: r.name,
            country: c.countryShortCode,
          })),
      ),
      "country-state-city": State.getAllStates().map((s) => ({
        code: `${s.countryCode}-${s.isoCode}`,
        name: s.name,
        country: s.countryCode,
      })),
    },
  };
}

/** A CSV field, quoted (RFC 4180). */
const q = (s: string) => `"${s.replace(/"/g, '""')}"`;

/**
 * A table of subdivisions as CSV text: id (the code), name, type "region", the country's name
 * and, where the package gives them, the categories (first row of each code only).
 */
export function subdivisionTableCsv(
  rows: readonly Subdivision[],
  countryNames: ReadonlyMap<string, string>,
): string {
  const withCategory = rows.some((r) => r.category !== undefined);
  const lines = [`id,name,type,country${withCategory ? ",category" : ""}`];
  const seen = new Set<string>();
  for (const r of rows) {
    if (seen.has(r.code)) continue;
    seen.add(r.code);
    const cells = [r.code, q(r.name), "region", q(countryNames.get(r.country) ?? r.country)];
    if (withCategory) cells.push(q(r.category ?? ""));
    lines.push(cells.join(","));
  }
  return `${lines.join("\n")}\n`;
}

/**
 * The codes left out of a table so that their mentions are NIL: with `every` >= 2, every
 * `every`th code in code order from the third; none with 0.
 */
export function leftOutCodes(rows: readonly Subdivision[], every: number): Set<string> {
  if (every === 0) return new Set();
  const codes = [...new Set(rows.map((r) => r.code))].sort();
  return new Set(codes.filter((_, i) => i % every === 2 % every));
}
