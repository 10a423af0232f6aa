/**
 * Names followed by the kind their record gives them ("Ambry Parish" for the parish Ambry):
 * the kind columns a table's rows are sorted by (src/kb/kind-columns.ts) and nameMatch's "kind"
 * match. Invented tables of the gazette's county, Wendshire: its parishes and hundreds, listed
 * by name with the kind in a column of its own, as a county directory lists them.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { KIND_MIN_ROWS, KindColumnsBuilder } from "../src/kb/kind-columns.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const PARISHES = [
  "Ambry",
  "Kellow",
  "Tolleby",
  "Wexcombe",
  "Nessbury",
  "Ekerby",
  "Quarrington",
  "Fennow",
  "Hobbley",
  "Cordwick",
  "Mossingham",
  "Stenning",
  "Pellworth",
  "Ashmoor",
  "Brackley Wend",
  "Dunstow",
  "Gillerby",
  "Harrowfield",
  "Islip Vale",
  "Jessop",
  "Lathom Cross",
  "Marrowby",
];
/** Hundreds (groups of parishes); Ambry is one too, so "Ambry" alone names two rows. */
const HUNDREDS = ["Ambry", "Wendmoor", "Scarrow"];

const directory = (withKinds: boolean, type: string) => {
  const row = (id: string, name: string, kind: string) =>
    [id, name, type, "Wendshire", ...(withKinds ? [kind] : [])].join(",");
  const rows = [
    withKinds ? "id,name,type,county,kind" : "id,name,type,county",
    ...PARISHES.map((p, i) => row(`P${i}`, p, "Parish")),
    ...HUNDREDS.map((h, i) => row(`H${i}`, h, "Hundred")),
  ];
  return `${rows.join("\n")}\n`;
};

describe("kind columns", () => {
  it("are columns that repeat a few short values over many rows", () => {
    const b = new KindColumnsBuilder();
    for (let i = 0; i < 60; i++)
      b.observe({
        kind: i % 3 === 0 ? "Hundred" : "Parish",
        owner: `Owner ${i}`,
        founded: String(1800 + (i % 2)),
      });
    // owner: every value distinct; founded: numbers, however few.
    expect(b.result().kindColumns).toEqual(["kind"]);
    // Parish is a kind of place (and a hundred is one the lexicon does not know).
    expect(b.result().placeCategoryColumns).toEqual(["kind"]);
  });

  it("need enough rows to tell", () => {
    const b = new KindColumnsBuilder();
    for (let i = 0; i < KIND_MIN_ROWS - 1; i++) b.observe({ kind: "Parish" });
    expect(b.result().kindColumns).toEqual([]);
    b.observe({ kind: "Parish" });
    expect(b.result().kindColumns).toEqual(["kind"]);
  });

  it("take a column with a few long values, and a column of countries is no category of places", () => {
    const b = new KindColumnsBuilder();
    for (let i = 0; i < 100; i++)
      b.observe({
        country: i === 0 ? "Macedonia, the Former Yugoslav Republic Of" : i % 2 ? "Wendland" : "Ambry Vale",
      });
    // Its short values are kept, lower case, for the contextConflict feature.
    expect(b.result()).toEqual({
      kindColumns: ["country"],
      placeCategoryColumns: [],
      kindValues: ["wendland", "ambry vale"],
    });
  });
});

describe("a name followed by the kind its row gives it", () => {
  let kinds: TableKb;
  let generic: TableKb;
  let towns: TableKb;

  beforeAll(async () => {
    kinds = await openTableKb(directory(true, "region"), "hawser-kinds-");
    generic = await openTableKb(directory(false, "region"), "hawser-kinds-generic-");
    towns = await openTableKb(directory(false, "town"), "hawser-kinds-towns-");
  });

  afterAll(() => {
    kinds.close();
    generic.close();
    towns.close();
  });

  it("records the kind columns in the KB", () => {
    // The county column repeats one value too: a kind column (a country is one to a city).
    expect(kinds.kb.info.kindColumns).toEqual(["county", "kind"]);
    expect(kinds.kb.info.placeCategoryColumns).toEqual(["kind"]);
    expect(generic.kb.info.kindColumns).toEqual(["county"]);
    expect(generic.kb.info.placeCategoryColumns).toEqual([]);
  });

  it("tells namesakes apart by the kind the mention gives", () => {
    const parish = kinds.linker.link({ id: "m1", text: "Ambry Parish", type: "LOC" });
    expect(parish.entity).toBe("P0");
    expect(parish.reasons.map((r) => r.code)).toContain("name-kind");
    expect(kinds.linker.link({ id: "m2", text: "Ambry Hundred", type: "LOC" }).entity).toBe("H0");
    // "Ambry" alone names both.
    expect(kinds.linker.link({ id: "m3", text: "Ambry", type: "LOC" }).entity).toBeNull();
  });

  it("reads the kind of a name of several words, and the kind put first with 'of'", () => {
    expect(kinds.linker.link({ id: "m4", text: "Lathom Cross Parish", type: "LOC" }).entity).toBe("P20");
    expect(kinds.linker.link({ id: "m5", text: "Parish of Marrowby", type: "LOC" }).entity).toBe("P21");
  });

  it("does not read a kind the row does not give", () => {
    // Kellow is a parish: "Kellow Hundred" is some other place; "Kellow Mill" no kind at all.
    for (const text of ["Kellow Hundred", "Kellow Mill"]) {
      const r = kinds.linker.link({ id: "m6", text, type: "LOC" });
      expect(
        r.reasons.map((x) => x.code),
        text,
      ).not.toContain("name-kind");
    }
  });

  it("takes the usual words for an area's kind where the rows give no kind but a generic type", () => {
    const r = generic.linker.link({ id: "m7", text: "Kellow District", type: "LOC" });
    expect(r.entity).toBe("P1");
    expect(r.reasons.map((x) => x.code)).toContain("name-kind");
    // Not a word that names no kind of area.
    const mill = generic.linker.link({ id: "m8", text: "Kellow Mill", type: "LOC" });
    expect(mill.reasons.map((x) => x.code)).not.toContain("name-kind");
  });

  it("does not where the type names a kind of place of its own", () => {
    // Rows typed "town": "Kellow District" is the district around the town, not the town.
    const r = towns.linker.link({ id: "m9", text: "Kellow District", type: "LOC" });
    expect(r.reasons.map((x) => x.code)).not.toContain("name-kind");
    // Their own type is a kind they take.
    expect(towns.linker.link({ id: "m10", text: "Kellow Town", type: "LOC" }).entity).toBe("P1");
  });
});
