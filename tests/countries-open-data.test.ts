/**
 * Linking real open data nobody here wrote: the English country names of the registry package
 * `i18n-iso-countries` (official short names plus the alternatives it lists, e.g. "Korea,
 * Republic of", "USA", "The Gambia") linked to a table built from another registry package,
 * `world-countries` (its common and official names only, not its alternative spellings), with
 * the ISO 3166-1 alpha-2 code as gold. The baseline is what a practitioner writes by hand:
 * folded exact match of the name against the table's names.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { buildKb } from "../src/kb/build.js";
import { openKb } from "../src/kb/kb.js";
import { createLinker } from "../src/link/linker.js";
import { foldText } from "../src/normalize/fold.js";
import type { LinkRow } from "../src/types.js";

const require = createRequire(import.meta.url);
const iso = require("i18n-iso-countries") as {
  getNames(lang: string, o: { select: "all" }): Record<string, string[]>;
};
const world = require("world-countries") as Array<{
  cca2: string;
  area: number;
  name: { common: string; official: string };
}>;

const q = (s: string) => `"${s.replace(/"/g, '""')}"`;

interface Outcome {
  text: string;
  gold: string;
  row: LinkRow;
  baseline: string | null;
}

const outcomes: Outcome[] = [];

beforeAll(async () => {
  const dir = mkdtempSync(join(tmpdir(), "hawser-countries-"));
  const table = join(dir, "countries.csv");
  const lines = ["id,name,type,aliases,prior"];
  for (const c of world)
    lines.push([c.cca2, q(c.name.common), "country", q(c.name.official), Math.max(0, c.area)].join(","));
  writeFileSync(table, `${lines.join("\n")}\n`);
  await buildKb({ table, out: join(dir, "countries.kb") });
  const kb = openKb(join(dir, "countries.kb"));
  const linker = createLinker(kb);
  const exact = new Map<string, string | null>();
  for (const c of world) {
    for (const n of [c.name.common, c.name.official]) {
      const k = foldText(n);
      exact.set(k, exact.has(k) && exact.get(k) !== c.cca2 ? null : c.cca2);
    }
  }
  let i = 0;
  for (const [code, names] of Object.entries(iso.getNames("en", { select: "all" }))) {
    for (const text of names) {
      i++;
      outcomes.push({
        text,
        gold: code,
        row: linker.link({ id: `c${i}`, text, type: "GPE" }),
        baseline: exact.get(foldText(text)) ?? null,
      });
    }
  }
  kb.close();
});

describe("linking i18n-iso-countries names to a world-countries table", () => {
  it("beats the folded-exact baseline clearly, with few wrong links", () => {
    const n = outcomes.length;
    const ours = outcomes.filter((o) => o.row.entity === o.gold).length / n;
    const base = outcomes.filter((o) => o.baseline === o.gold).length / n;
    const wrong = outcomes.filter((o) => o.row.entity !== null && o.row.entity !== o.gold).length / n;
    console.log(
      `countries: ${n} names, hawser accuracy ${(100 * ours).toFixed(1)}%, folded-exact baseline ${(100 * base).toFixed(1)}%, wrong links ${(100 * wrong).toFixed(1)}%`,
    );
    expect(n).toBeGreaterThan(250);
    expect(ours).toBeGreaterThan(base + 0.04);
    expect(wrong).toBeLessThan(0.02);
  });

  it("reads catalogue inversions, leading articles and acronyms", () => {
    const byText = (t: string) => outcomes.find((o) => o.text === t);
    // Names as i18n-iso-countries spells them; the table only has world-countries' common/official names.
    expect(byText("Korea, Republic of")?.row.entity).toBe("KR");
    expect(byText("The Gambia")?.row.entity).toBe("GM");
    expect(byText("USA")?.row.entity).toBe("US");
    expect(byText("UK")?.row.entity).toBe("GB");
    expect(byText("USA")?.row.reasons.some((r) => r.code === "acronym")).toBe(true);
  });
});
