/**
 * Candidate generation where namesakes crowd a name (src/candidates/generate.ts): corrections of
 * words that are themselves names, the initial-and-surname fallback, one-word key matches that
 * do not stop the search, and wide token-search pools chosen by the pre-rank. The table is
 * invented (a river-port gazette's index, 1890-1930).
 */
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  bestPositions,
  correctedReadings,
  correctToken,
  DEFAULT_CANDIDATE_OPTIONS,
} from "../src/candidates/generate.js";
import { buildKb } from "../src/kb/build.js";
import { type Kb, openKb } from "../src/kb/kb.js";
import { createLinker, type Linker } from "../src/link/linker.js";
import type { Mention } from "../src/types.js";
import { tempDir, writeText } from "./helpers/gazette.js";

/** Forty popular Frobelsons in the grain trade, and one obscure ferry pilot of the name. */
const FROBELSONS = Array.from(
  { length: 40 },
  (_, i) =>
    `F${String(i).padStart(2, "0")},${["Arthur", "Henry", "Walter", "Thomas", "Edwin"][i % 5]} ${"BCDEFGHJKL"[i % 10]}. Frobelson,person,,grain merchant of Stenmouth exchange,${1000 + i}`,
);

const TABLE = [
  "id,name,type,aliases,description,prior",
  "P01,Robert N. Grimerhurst,person,,tug master at Carow bar,1",
  "P02,Walter Grimehurst,person,,cooper in the brewery lane,900",
  "P03,Joseph Uddale,person,,lighterman of the east basin,2",
  "P04,Elizabeth Ingeldale,person,,milliner of Quay Street,3",
  "P05,Amos Ingeldale,person,Ingeldale,harbour board clerk,800",
  "P06,William D. Frobelson,person,,ferry pilot at Carow crossing steam ferry,1",
  ...FROBELSONS,
].join("\n");

const t = tempDir("hawser-candidates-");
let kb: Kb;
let linker: Linker;

beforeAll(async () => {
  const table = writeText(t.file("crowded.csv"), `${TABLE}\n`);
  await buildKb({ table, out: t.file("crowded.kb") });
  kb = openKb(t.file("crowded.kb"));
  linker = createLinker(kb);
});
afterAll(() => {
  kb.close();
  t.cleanup();
});

/**
 * A KB built from `csv` before the tests of the enclosing describe and closed after them: call
 * the returned function inside a test to get it.
 */
function tableKb(name: string, csv: string): () => Kb {
  let built: Kb | undefined;
  beforeAll(async () => {
    const table = writeText(t.file(`${name}.csv`), csv);
    await buildKb({ table, out: t.file(`${name}.kb`) });
    built = openKb(t.file(`${name}.kb`));
  });
  afterAll(() => built?.close());
  return () => built!;
}

const m = (text: string, context?: string): Mention => ({ id: text, text, type: "PER", context });
const pathsOf = (text: string, entity: string, context?: string) =>
  linker.scoreCandidates(m(text, context)).find((c) => c.entity === entity)?.paths;

describe("scoreCandidates", () => {
  it("gives the link row's candidates, all of them and unrounded", () => {
    const mention = m("Robert N. Grimehurst");
    const all = linker.scoreCandidates(mention);
    const row = linker.link(mention);
    expect(row.candidates.length).toBeGreaterThan(0);
    expect(all.length).toBeGreaterThanOrEqual(row.candidates.length);
    expect(all.map((c) => c.entity).sort()).toEqual([...linker.candidateIds(mention)].sort());
    row.candidates.forEach((c, i) => {
      expect(all[i]!.entity).toBe(c.entity);
      expect(all[i]!.name).toBe(c.name);
      expect(all[i]!.score).toBeCloseTo(c.score, 4);
      expect(all[i]!.paths).toEqual(c.paths);
    });
  });
});

describe("candidates among namesakes", () => {
  it("corrects a word that is itself a name: Grimehurst may be a slip for Grimerhurst", () => {
    expect(kb.tokenDf("grimehurst")).toBe(1);
    const ids = linker.candidateIds(m("Robert N. Grimehurst"));
    expect(ids).toContain("P01");
    expect(pathsOf("Robert N. Grimehurst", "P01")).toContain("fuzzy");
  });

  it("meets an unlisted short given name through the initial and surname", () => {
    expect([...(pathsOf("Js. Uddale", "P03") ?? [])]).toContain("initials");
  });

  it("keeps searching after a one-word key match: a bare surname names nobody in particular", () => {
    const ids = linker.candidateIds(m("Mrs Ingeldale"));
    expect(ids).toContain("P05"); // the alias "Ingeldale" is a whole-key match
    expect(ids).toContain("P04"); // found by token search all the same
  });

  it("takes more token-search hits than it scores, and keeps the ones the context supports", () => {
    const ids = linker.candidateIds(m("Capt. Frobelson", "the steam ferry pilot at the Carow crossing"));
    expect(kb.tokenDf("frobelson")).toBe(41);
    // No whole key names him: all 41 carriers come from token search, which keeps 10 of them.
    expect(ids.length).toBe(10);
    const wider = createLinker(kb, { candidates: { maxSearchCandidates: 30 } });
    expect(wider.candidateIds(m("Capt. Frobelson")).length).toBe(30);
    expect(ids).toContain("P06");
    // With token search cut to the 30 most popular carriers, the obscure pilot is never seen.
    const narrow = createLinker(kb, { candidates: { ftsLimit: 30 } });
    expect(
      narrow.candidateIds(m("Capt. Frobelson", "the steam ferry pilot at the Carow crossing")),
    ).not.toContain("P06");
  });
});

describe("sub-keys: the whole key left when a first or last word is dropped", () => {
  /** One small town, forty popular firms carrying its name, and vessels named Mary. */
  const TABLE2 = [
    "id,name,type,prior",
    "L10,Ormoford,town,1",
    ...Array.from(
      { length: 40 },
      (_, i) => `O${String(i).padStart(2, "0")},Ormoford Works No. ${i} Ltd.,firm,${1000 + i}`,
    ),
    ...Array.from({ length: 12 }, (_, i) => `V${String(i).padStart(2, "0")},SS Mary,vessel,${10 + i}`),
    "P20,Mary Selanlow,person,2",
    "",
  ].join("\n");
  const kb2 = tableKb("subkeys", TABLE2);
  const loc = (text: string): Mention => ({ id: text, text, type: "LOC" });

  it("meets the town in 'Ormoford Quay' although token search stops at its 20 most popular carriers", () => {
    const linker2 = createLinker(kb2(), { candidates: { ftsLimit: 20 } });
    expect(kb2().tokenDf("ormoford")).toBe(41);
    const found = linker2.scoreCandidates(loc("Ormoford Quay")).find((c) => c.entity === "L10");
    expect(found).toBeDefined();
    expect([...found!.paths]).toEqual(["fts"]);
    // With no sub-key left to match ("pier quay", "ormoford pier"), or sub-keys off, the town is not reached.
    expect(linker2.candidateIds(loc("Ormoford Pier Quay"))).not.toContain("L10");
    const off = createLinker(kb2(), { candidates: { ftsLimit: 20, subKeys: false } });
    expect(off.candidateIds(loc("Ormoford Quay"))).not.toContain("L10");
  });

  it("keeps room for a sub-key match when token search alone could fill the list", () => {
    // 40 firms from token search want all 30 places; the town's sub-key match still gets one.
    const wide = createLinker(kb2(), { candidates: { maxSearchCandidates: 30 } });
    const ids = wide.candidateIds(loc("Ormoford Quay"));
    expect(ids.length).toBe(30);
    expect(ids).toContain("L10");
  });

  it("does not probe a person's words among vessels: 'Mary' alone names no one", () => {
    // "mary" is left out of token search (ftsMaxDf), so vessels can only come from sub-keys.
    const linker2 = createLinker(kb2(), { candidates: { ftsMaxDf: 5 } });
    expect(kb2().tokenDf("mary")).toBe(13);
    const vessels = (text: string, type: string) =>
      linker2.candidateIds({ id: text, text, type }).filter((id) => id.startsWith("V"));
    const per = linker2.candidateIds({ id: "p", text: "Mary Selanlaw", type: "PER" });
    expect(per).toContain("P20");
    expect(vessels("Mary Selanlaw", "PER")).toEqual([]);
    // A vessel's mention is probed: "thc Mary" drops the article the OCR misread.
    expect(vessels("thc Mary", "MISC").length).toBeGreaterThan(0);
  });
});

describe("respelling a rare surname after a naming key match", () => {
  /** Two near-namesakes, and a common surname with a rare look-alike. */
  const TABLE3 = [
    "id,name,type,prior",
    "P30,Alexander Elinmore,person,1",
    "P31,Alexander Elingmore,person,1",
    ...Array.from(
      { length: 25 },
      (_, i) =>
        `S${String(i).padStart(2, "0")},${["Ada", "Amos", "Edith", "Ezra", "Ruth"][i % 5]} Smithson,person,${5 + i}`,
    ),
    "P32,Ada Smithsen,person,1",
    "",
  ].join("\n");
  const kb3 = tableKb("respell", TABLE3);

  it("finds Elingmore behind 'Alexander Elinmore', which names an entity of its own", () => {
    const ids = createLinker(kb3()).candidateIds(m("Alexander Elinmore"));
    expect(ids).toEqual(expect.arrayContaining(["P30", "P31"]));
    const off = createLinker(kb3(), { candidates: { respellSurnameOnKeyMatch: false } });
    expect(off.candidateIds(m("Alexander Elinmore"))).toEqual(["P30"]);
    // An initial and the surname: the respelled initials key.
    expect(createLinker(kb3()).candidateIds(m("A. Elinmore"))).toContain("P31");
  });

  it("leaves a common surname as written: 'Ada Smithson' is not a slip for Smithsen", () => {
    expect(kb3().tokenDf("smithson")).toBe(25);
    expect(createLinker(kb3()).candidateIds(m("Ada Smithson"))).not.toContain("P32");
  });
});

describe("correctToken", () => {
  const kb4 = tableKb("correct", `${TABLE}\n`);
  const opts = DEFAULT_CANDIDATE_OPTIONS;

  it("corrects a misreading to the table's tokens within two edits, closest first", () => {
    // "grimehurst" is one edit away (a dropped e), "grimerhurst" two (a dropped e and r).
    expect(correctToken(kb4(), "grimhurst", opts)).toEqual(["grimehurst", "grimerhurst"]);
    expect(correctToken(kb4(), "frobelsen", opts)).toEqual(["frobelson"]);
    expect(correctToken(kb4(), "zzzzzzzz", opts)).toEqual([]);
  });

  it("answers a token asked again from memory, per KB and per setting", () => {
    const first = correctToken(kb4(), "uddal", opts);
    expect(first).toEqual(["uddale"]);
    expect(correctToken(kb4(), "uddal", opts)).toBe(first); // the same list, not recomputed
    // Another setting is another question: one edit does not reach "grimerhurst".
    expect(correctToken(kb4(), "grimhurst", { ...opts, fuzzyMaxEdits: 1 })).toEqual(["grimehurst"]);
    expect(correctToken(kb4(), "grimhurst", { ...opts, fuzzyMaxCorrections: 1 })).toHaveLength(1);
    // Another KB (the crowded one holds the same tokens) keeps its own answers.
    expect(correctToken(kb, "uddal", opts)).toEqual(first);
    expect(correctToken(kb, "uddal", opts)).not.toBe(first);
  });
});

describe("correctedReadings", () => {
  it("lists the preferred reading, then one change, then two, up to its cap", () => {
    const options = new Map([
      ["a", ["a", "a1", "a2"]],
      ["b", ["b1", "b2"]],
    ]);
    expect(correctedReadings(["a", "x", "b"], options)).toEqual([
      ["a", "x", "b1"],
      ["a1", "x", "b1"],
      ["a2", "x", "b1"],
      ["a", "x", "b2"],
      ["a1", "x", "b2"],
      ["a2", "x", "b2"],
    ]);
    const many = new Map([...Array(6).keys()].map((i) => [`t${i}`, [`t${i}`, `u${i}`, `v${i}`]]));
    expect(correctedReadings([...many.keys()], many).length).toBe(12);
  });
});

describe("fuzzy correction with two deletions on the table side", () => {
  /** Towns whose names OCR shortened by two letters, or by one and misread another. */
  const TOWNS = [
    "id,name,type,prior",
    "L01,Halstanmere,town,10",
    "L02,Wickfenholm,town,10",
    "L03,Stenmouth,town,500",
    "",
  ].join("\n");
  const loc = (text: string): Mention => ({ id: text, text, type: "LOC" });

  it("finds table words two letters longer than the misreading, unless the budget says one deletion", async () => {
    const table = writeText(t.file("towns.csv"), TOWNS);
    await buildKb({ table, out: t.file("towns2.kb") });
    // A budget too small for two-deletion variants: the build falls back to one deletion.
    await buildKb({ table, out: t.file("towns1.kb"), maxFuzzyVariants: 20 });
    const two = openKb(t.file("towns2.kb"));
    const one = openKb(t.file("towns1.kb"));
    try {
      expect(two.info.fuzzyDeletions).toBe(2);
      expect(one.info.fuzzyDeletions).toBe(1);
      const deep = createLinker(two);
      const shallow = createLinker(one);
      // "hastnmere" is "halstanmere" less two letters; "wiekfenhom" misreads one and drops one.
      for (const [text, id] of [
        ["HASTNMERE", "L01"],
        ["Wiekfenhom", "L02"],
      ] as const) {
        expect(deep.candidateIds(loc(text))).toContain(id);
        expect(shallow.candidateIds(loc(text))).not.toContain(id);
        expect(deep.link(loc(text)).entity).toBe(id);
      }
      // One edit away is found either way.
      expect(shallow.candidateIds(loc("Stenmonth"))).toContain("L03");
    } finally {
      two.close();
      one.close();
    }
  });
});

describe("bestPositions", () => {
  it("keeps what a full sort would put first, in the same order, ties broken by position", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 5 }), { maxLength: 200 }),
        fc.integer({ min: 0, max: 40 }),
        (values, room) => {
          const before = (a: number, b: number) => values[b]! - values[a]! || a - b;
          const sorted = values.map((_, i) => i).sort(before);
          expect(bestPositions(values.length, room, before)).toEqual(sorted.slice(0, room));
        },
      ),
    );
  });
});
