/**
 * A table's generic name words (src/score/table-words.ts): words so many names carry that they
 * say what an entry is, not which one. An invented table of the gazette's river landings: 120
 * landing stages named "<town> Landing" and 40 wharves named "<town> Wharf", so "landing" (75%
 * of the names) is generic and "wharf" (40 names, under the 100-entity floor) is not.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Kb } from "../src/kb/kb.js";
import { createLinker, type Linker } from "../src/link/linker.js";
import { isContraction, jaroWinkler } from "../src/score/name-similarity.js";
import { genericWordFor, genericWordsOf } from "../src/score/table-words.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const HEADS = ["Ash", "Brom", "Carr", "Dun", "Eld", "Fen", "Gor", "Hal", "Ick", "Kel", "Lon", "Mor"];
const TAILS = ["by", "mouth", "ford", "wick", "ham", "ton", "well", "stead", "ley", "more"];
const TOWNS = HEADS.flatMap((h) => TAILS.map((t) => `${h}${t}`)); // 120 invented towns

let table: TableKb;
let kb: Kb;
let linker: Linker;

beforeAll(async () => {
  const rows = [
    "id,name,type,description",
    ...TOWNS.map((town, i) => `L${i},${town} Landing,landing,landing stage at ${town}`),
    ...TOWNS.slice(0, 40).map((town, i) => `W${i},${town} Wharf,wharf,wharf at ${town}`),
  ];
  table = await openTableKb(`${rows.join("\n")}\n`, "hawser-generic-");
  ({ kb, linker } = table);
});

afterAll(() => table.close());

describe("contractions", () => {
  it("keep the first and last letters and at least three letters, in order", () => {
    expect(isContraction("intl", "international")).toBe(true);
    expect(isContraction("rgnl", "regional")).toBe(true);
    expect(isContraction("ldg", "landing")).toBe(true);
    expect(isContraction("saml", "samuel")).toBe(true);
    expect(isContraction("st", "street")).toBe(false); // too short to tell
    expect(isContraction("intl", "intl")).toBe(false); // not shorter
    expect(isContraction("inta", "international")).toBe(false); // last letters differ
    expect(isContraction("ilnt", "international")).toBe(false); // out of order
  });

  it("let a spelled-out or contracted word stand for the table's generic word", () => {
    const generic = new Set(["intl", "landing"]);
    expect(genericWordFor("intl", generic)).toBe("intl");
    expect(genericWordFor("international", generic)).toBe("intl");
    expect(genericWordFor("ldg", generic)).toBe("landing");
    expect(genericWordFor("ashby", generic)).toBeNull();
    expect(genericWordFor("intl", new Set())).toBeNull();
  });

  it("let a singular or plural stand for the table's generic word", () => {
    // OpenFlights' airlines: "Iran Aseman Airline" for the table's "Iran Aseman Airlines".
    const generic = new Set(["airlines", "landing"]);
    expect(genericWordFor("airline", generic)).toBe("airlines");
    expect(genericWordFor("landings", generic)).toBe("landing");
    expect(genericWordFor("airliner", generic)).toBeNull();
  });
});

describe("genericWordsOf", () => {
  it("finds the words carried by 5% of the names and at least 100 entities", () => {
    expect([...genericWordsOf(kb)]).toEqual(["landing"]);
  });
});

describe("linking with generic words", () => {
  it("links a name that lacks the generic word, citing the core match", () => {
    const r = linker.link({ id: "m1", text: "Ashby", type: "FAC" });
    expect(r.entity).toBe("L0");
    expect(r.reasons.map((x) => x.code)).toContain("name-core");
    expect(r.candidates[0]?.features.exactKey).toBeCloseTo(0.6, 5);
  });

  it("reads a contraction of the generic word as the word", () => {
    expect(linker.link({ id: "m2", text: "Bromford Ldg.", type: "FAC" }).entity).toBe("L12");
  });

  it("compares names by their cores, so a shared generic word does not make them alike", () => {
    // Whole, "Kalby Landing" reads much like "Halby Landing"; their cores differ in the first
    // letter, and only the cores are compared.
    const r = createLinker(kb, { top: 5 }).link({ id: "m3", text: "Kalby Landing", type: "FAC" });
    const halby = r.candidates.find((c) => c.name === "Halby Landing");
    expect(halby).toBeDefined();
    expect(jaroWinkler("kalby landing", "halby landing")).toBeGreaterThan(0.9);
    expect(halby!.features.jaroWinkler).toBeCloseTo(jaroWinkler("kalby", "halby"), 3); // rows round to 4 places
    expect(halby!.features.tokenSet).toBe(0);
    expect(halby!.score).toBeLessThan(0.1);
  });

  it("keeps a word that is not generic: a wharf is not the landing of the same town", () => {
    const r = linker.link({ id: "m4", text: "Ashby Wharf", type: "FAC" });
    expect(r.entity).toBe("W0");
    const landing = r.candidates.find((c) => c.entity === "L0");
    expect(landing === undefined || landing.score < 0.5).toBe(true);
  });
});
