/**
 * Linking real open data nobody here wrote: language names of two registry packages (`langs`'
 * English names and `iso-639-1`'s) linked to a table of every ISO 639-3 language from a third
 * (`iso-639-3`, 7,800 names), with the ISO 639-3 code as gold. A quarter of the languages the
 * mentions name are taken out of the table, so that those mentions are NIL: a list of languages
 * holds "Old Hungarian" beside "Hungarian", "Northern Khmer" beside "Khmer", "Catalan Sign
 * Language" beside "Catalan", and a mention of a language the table lacks must not take its
 * namesake. The baseline is the countries check's: folded exact match of the name against the
 * table's names (a name two entries share matches neither).
 */
import { createRequire } from "node:module";
import { iso6393 } from "iso-639-3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { foldText } from "../src/normalize/fold.js";
import type { LinkRow } from "../src/types.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const require = createRequire(import.meta.url);
const langs = require("langs") as { all(): Array<{ "3": string; name: string }> };
const iso6391 = require("iso-639-1") as { getAllCodes(): string[]; getName(code: string): string };

interface Outcome {
  text: string;
  /** The ISO 639-3 code, or null when the table lacks the language. */
  gold: string | null;
  row: LinkRow;
  baseline: string | null;
}

/** Every fourth language the mentions name, in code order, is left out of the table. */
const LEFT_OUT_EVERY = 4;

const q = (s: string) => `"${s.replace(/"/g, '""')}"`;

let table: TableKb;
let outcomes: Outcome[] = [];
let leftOut = new Set<string>();

beforeAll(async () => {
  const known = new Set(iso6393.map((l) => l.iso6393));
  const from1 = new Map(iso6393.filter((l) => l.iso6391 !== undefined).map((l) => [l.iso6391!, l.iso6393]));
  const named = new Map<string, string | null>();
  for (const l of langs.all()) named.set(l.name, known.has(l["3"]) ? l["3"] : null);
  for (const c of iso6391.getAllCodes())
    if (!named.has(iso6391.getName(c))) named.set(iso6391.getName(c), from1.get(c) ?? null);
  const codes = [...new Set([...named.values()].filter((c): c is string => c !== null))].sort();
  leftOut = new Set(codes.filter((_, i) => i % LEFT_OUT_EVERY === 1));
  const lines = ["id,name,type"];
  const exact = new Map<string, string | null>();
  for (const l of iso6393) {
    if (leftOut.has(l.iso6393)) continue;
    lines.push([l.iso6393, q(l.name), "language"].join(","));
    const k = foldText(l.name);
    exact.set(k, exact.has(k) && exact.get(k) !== l.iso6393 ? null : l.iso6393);
  }
  table = await openTableKb(`${lines.join("\n")}\n`, "hawser-languages-");
  outcomes = [...named].map(([text, code], i) => ({
    text,
    gold: code === null || leftOut.has(code) ? null : code,
    row: table.linker.link({ id: `l${i}`, text, type: "language" }),
    baseline: exact.get(foldText(text)) ?? null,
  }));
});

afterAll(() => table.close());

const byText = (t: string) => outcomes.find((o) => o.text === t);

describe("linking language names to an ISO 639-3 table that lacks a quarter of them", () => {
  it("beats the folded-exact baseline, with few wrong links", () => {
    const n = outcomes.length;
    const ours = outcomes.filter((o) => o.row.entity === o.gold).length / n;
    const base = outcomes.filter((o) => o.baseline === o.gold).length / n;
    const wrong = outcomes.filter((o) => o.row.entity !== null && o.row.entity !== o.gold);
    console.log(
      `languages: ${n} names (${leftOut.size} languages left out), hawser accuracy ${(100 * ours).toFixed(1)}%, folded-exact baseline ${(100 * base).toFixed(1)}%, wrong links ${wrong.length}: ${wrong.map((o) => `${o.text} -> ${o.row.name}`).join("; ")}`,
    );
    expect(n).toBeGreaterThan(180);
    expect(leftOut.size).toBeGreaterThan(40);
    expect(ours).toBeGreaterThan(base);
    expect(wrong.length / n).toBeLessThan(0.02);
  });

  it("does not give a missing language's name to the entries that add words to it", () => {
    // Each of these is left out of the table, which keeps "Old Hungarian", "Northern Khmer",
    // "Catalan Sign Language", "Old Marathi", "Old Tibetan", "Ukrainian Sign Language"...
    for (const text of ["Hungarian", "Khmer", "Catalan", "Marathi", "Tibetan", "Ukrainian"]) {
      const o = byText(text);
      expect(o?.gold, text).toBeNull();
      expect(o?.row.entity, `${text} -> ${o?.row.name}`).toBeNull();
    }
  });

  it("still links the languages the table holds, reading its bracketed qualifiers", () => {
    const held = outcomes.filter((o) => o.gold !== null);
    expect(held.filter((o) => o.row.entity === o.gold).length).toBeGreaterThan(held.length * 0.85);
    // iso-639-3 writes "Occitan (post 1500)" and "Interlingua (International Auxiliary Language
    // Association)": a folded exact match misses them.
    for (const [text, code] of [
      ["Occitan", "oci"],
      ["Interlingua", "ina"],
    ]) {
      expect(byText(text!)?.row.entity, text).toBe(code);
      expect(byText(text!)?.baseline, text).toBeNull();
    }
  });
});
