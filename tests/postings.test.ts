/**
 * The in-memory word index (src/kb/postings.ts) answers token search instead of FTS5 queries:
 * for every word, and any limit, it must return exactly what SQLite's FTS5 (unicode61 tokenizer)
 * returns on the same KB's alias_fts table. SQLite is the reference here; the tables are the
 * sample archive, a generated benchmark table and names in other scripts and with punctuation.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { MENTIONS_FILE } from "../benchmarks/generate.js";
import type { Kb } from "../src/kb/kb.js";
import { ftsWords, PostingsBuilder, Postings } from "../src/kb/postings.js";
import { foldText } from "../src/normalize/fold.js";
import { threeKbs } from "./helpers/three-kbs.js";

/** Names in other scripts, with apostrophes, hyphens, digits and FTS5 operator words. */
const SCRIPTS_CSV = [
  "id,name,type,aliases,prior",
  "X01,Ωμέγα Ναυτιλιακή,firm,Omega Shipping,30",
  "X02,Волга-Дон Пароходство,firm,Volga-Don,20",
  'X03,O\'Brannigan & Sons,firm,"O Brannigan and Sons",10',
  "X04,Zürich-Ost Lagerhaus,firm,Zuerich Ost,5",
  'X05,NEAR AND OR NOT,firm,"near, and or not",4',
  "X06,Pier 7 Stores,firm,Pier No. 7,3",
  "X07,İskele Kahvesi,firm,,2",
  "",
].join("\n");

const three = threeKbs({ csv: SCRIPTS_CSV, generatedEntities: 3000, generatedMentions: 300, seed: 5 });
const kbs = three.kbs;

/** Every vocabulary token of the KB, plus words that are in no name. */
const queryWords = (kb: Kb): string[] => [
  ...(kb.db.prepare("SELECT token FROM vocab").pluck(true).all() as string[]),
  "zzqx",
  '"',
  "a*",
  // FTS5 query syntax: split into plain words (or none) before any query is made.
  'NEAR(stenmouth, "quay")',
  "^harrow",
  "col:stenmouth",
  "(pell OR marsh) AND NOT quay",
  "-*'\"",
];

describe("the in-memory word index", () => {
  it("returns what FTS5 returns for every word and limit", () => {
    for (const kb of kbs) {
      const words = queryWords(kb);
      expect(words.length).toBeGreaterThan(10);
      let nonEmpty = 0;
      for (const w of words) {
        for (const limit of [1, 3, 150]) {
          const got = kb.searchAliases([w], limit);
          expect(got, `${w} limit ${limit}`).toEqual(kb.searchAliasesFts([w], limit));
          if (got.length > 0) nonEmpty++;
        }
      }
      expect(nonEmpty).toBeGreaterThan(words.length);
    }
  });

  it("returns what FTS5 returns for the words of generated mentions, several at a time", () => {
    const gen = kbs[1]!;
    const lines = readFileSync(join(three.file("gen"), MENTIONS_FILE), "utf8")
      .trim()
      .split("\n");
    let nonEmpty = 0;
    for (const line of lines) {
      const tokens = foldText(JSON.parse(line).text as string).split(" ");
      for (const limit of [2, 10, 150]) {
        const got = gen.searchAliases(tokens, limit);
        expect(got, `${tokens.join(" ")} limit ${limit}`).toEqual(gen.searchAliasesFts(tokens, limit));
        if (got.length > 0) nonEmpty++;
      }
    }
    expect(nonEmpty).toBeGreaterThan(lines.length);
  });

  it("finds names in other scripts and across punctuation", () => {
    const kb = kbs[2]!;
    const ids = (eids: number[]) => kb.entities(eids).map((e) => e.id);
    expect(ids(kb.searchAliases(["наутилиакн"], 5))).toEqual([]);
    expect(ids(kb.searchAliases([foldText("Волга")], 5))).toEqual(["X02"]);
    expect(ids(kb.searchAliases([foldText("Ναυτιλιακή")], 5))).toEqual(["X01"]);
    expect(ids(kb.searchAliases(["near"], 5))).toEqual(["X05"]);
    expect(ids(kb.searchAliases(["7"], 5))).toEqual(["X06"]);
    expect(ids(kb.searchAliases(["brannigan"], 5))).toEqual(["X03"]);
  });
});

describe("Postings", () => {
  it("keeps each word's entities in the order added and cuts at the limit", () => {
    const b = new PostingsBuilder();
    b.addKey("marsh quay", 4);
    b.addKey("quay", 2);
    b.addKey("marsh", 9);
    b.addKey("marsh-end quay", 4);
    b.addKey("end end", 6);
    const p = new Postings(b.build());
    const carriers = (w: string, limit: number) => {
      const out: number[] = [];
      p.forEachCarrier(w, limit, (e) => out.push(e));
      return out;
    };
    expect(carriers("marsh", 10)).toEqual([4, 9, 4]);
    expect(carriers("quay", 10)).toEqual([4, 2, 4]);
    expect(carriers("quay", 2)).toEqual([4, 2]);
    // A row carrying a word twice is one row, as in FTS5.
    expect(carriers("end", 10)).toEqual([4, 6]);
    expect(carriers("harbour", 10)).toEqual([]);
    expect(carriers("marsh", 0)).toEqual([]);
  });

  it("splits and lowercases words as the full-text tokenizer does", () => {
    expect(ftsWords("o'brien & co-op  No.7")).toEqual(["o", "brien", "co", "op", "no", "7"]);
    expect(ftsWords("ΩΜΕΓΑ")).toEqual(["ωμεγα"]);
    expect(ftsWords(" ,; ")).toEqual([]);
  });
});
