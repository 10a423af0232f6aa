/**
 * Words written short, cut off by a period: "Calif." for California, "Md." for Maryland,
 * "Harrowm. Wharf" for Harrowmouth Wharf; or contracted with an apostrophe: "H'mouth". Checked on an invented table of the gazette and on the
 * US states of the `iso-3166-2` package, named by the abbreviations newspapers and the federal
 * printers used before the postal codes (from memory).
 */
import { createRequire } from "node:module";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { abbreviates, normalizeName } from "../src/normalize/name.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const require = createRequire(import.meta.url);

describe("abbreviates", () => {
  it("reads the first letters of a word, or a contraction keeping its first and last", () => {
    expect(abbreviates("calif", "california")).toBe(true);
    expect(abbreviates("harrowm", "harrowmouth")).toBe(true);
    expect(abbreviates("md", "maryland")).toBe(true);
    expect(abbreviates("rly", "railway")).toBe(true);
    expect(abbreviates("calif", "calif")).toBe(false);
    expect(abbreviates("md", "maryborough")).toBe(false);
    expect(abbreviates("c", "california")).toBe(false);
  });

  it("applies to words a period cuts off, not to initials, acronyms or words the lexicon reads", () => {
    expect(normalizeName("Harrowm. Wharf", "location").abbreviated).toEqual(["harrowm"]);
    expect(normalizeName("W.Va.", "location").abbreviated).toEqual(["va"]);
    expect(normalizeName("S.G.E.", "organization").abbreviated).toEqual([]);
    expect(normalizeName("St. Aldric's", "location").abbreviated).toEqual([]);
    expect(normalizeName("Jno. Aldous", "person").abbreviated).toEqual([]);
  });
});

describe("linking names with words written short", () => {
  let gazette: TableKb;
  beforeAll(async () => {
    gazette = await openTableKb(
      [
        "id,name,type",
        "W1,Harrowmouth Wharf,wharf",
        "W2,Stenmouth Wharf,wharf",
        "R1,Wend Valley Railway,company",
        "T1,Harrowmouth,town",
      ].join("\n"),
      "hawser-abbreviated-",
    );
  });
  afterAll(() => gazette.close());

  it("links them, and says so", () => {
    const r = gazette.linker.link({ id: "m", text: "Harrowm. Wharf", type: "FAC" });
    expect(r.entity).toBe("W1");
    expect(r.reasons.map((x) => x.code)).toContain("name-abbreviated");
    expect(gazette.linker.link({ id: "m", text: "Wend Valley Rly.", type: "ORG" }).entity).toBe("R1");
  });

  it("links a long name contracted with an apostrophe to its first letter and its ending", () => {
    // Clerks' contractions: "H'mouth" for Harrowmouth; "O'Brien" and "Jessop's" are not such.
    expect(normalizeName("H'mouth Wharf", "location").abbreviated).toEqual(["hmouth"]);
    expect(normalizeName("O'Brien Wharf", "location").abbreviated).toEqual([]);
    expect(normalizeName("Jessop's Wharf", "location").abbreviated).toEqual([]);
    const r = gazette.linker.link({ id: "m", text: "H'mouth", type: "LOC" });
    expect(r.entity).toBe("T1");
    expect(r.reasons.map((x) => x.code)).toContain("name-abbreviated");
    expect(gazette.linker.link({ id: "m", text: "S'mouth Wharf", type: "FAC" }).entity).toBe("W2");
  });

  it("not without the period, nor where the table knows the short word", () => {
    expect(
      gazette.linker.link({ id: "m", text: "Harrowm Wharf", type: "FAC" }).reasons.map((x) => x.code),
    ).not.toContain("name-abbreviated");
    // "Harrowmouth." is the town's whole name with a full stop, not a short word.
    expect(gazette.linker.link({ id: "m", text: "Harrowmouth.", type: "LOC" }).entity).toBe("T1");
  });
});

describe("US states named by their old abbreviations", () => {
  // From memory: the abbreviations of newspaper style books and the federal printers.
  const ABBREVIATIONS: Array<[string, string]> = [
    ["Calif.", "US-CA"],
    ["Mass.", "US-MA"],
    ["Penn.", "US-PA"],
    ["Pa.", "US-PA"],
    ["Wash.", "US-WA"],
    ["Ariz.", "US-AZ"],
    ["Ark.", "US-AR"],
    ["Colo.", "US-CO"],
    ["Conn.", "US-CT"],
    ["Del.", "US-DE"],
    ["Fla.", "US-FL"],
    ["Ga.", "US-GA"],
    ["Ill.", "US-IL"],
    ["Ind.", "US-IN"],
    ["Kan.", "US-KS"],
    ["Ky.", "US-KY"],
    ["La.", "US-LA"],
    ["Md.", "US-MD"],
    ["Mich.", "US-MI"],
    ["Minn.", "US-MN"],
    ["Mont.", "US-MT"],
    ["Neb.", "US-NE"],
    ["Nev.", "US-NV"],
    ["Okla.", "US-OK"],
    ["Ore.", "US-OR"],
    ["Tenn.", "US-TN"],
    ["Tex.", "US-TX"],
    ["Vt.", "US-VT"],
    ["Va.", "US-VA"],
    ["Wis.", "US-WI"],
    ["Wyo.", "US-WY"],
    ["W.Va.", "US-WV"],
    ["N. Dak.", "US-ND"],
    ["S. Dak.", "US-SD"],
    ["N. Mex.", "US-NM"],
    ["Ala.", "US-AL"],
    ["Miss.", "US-MS"],
    ["Mo.", "US-MO"],
  ];
  let states: TableKb;
  beforeAll(async () => {
    const us = (require("iso-3166-2") as { data: Record<string, { sub: Record<string, { name: string }> }> })
      .data.US!.sub;
    const rows = ["id,name,type", ...Object.entries(us).map(([code, s]) => `${code},"${s.name}",state`)];
    states = await openTableKb(`${rows.join("\n")}\n`, "hawser-states-");
  });
  afterAll(() => states.close());

  it("links most (a lone compass initial read beside a short word), and leaves the ones that begin two names NIL", () => {
    const rows = ABBREVIATIONS.map(([text, code]) => ({
      code,
      row: states.linker.link({ id: text, text, type: "GPE" }),
    }));
    const right = rows.filter((r) => r.row.entity === r.code).length;
    const wrong = rows.filter((r) => r.row.entity !== null && r.row.entity !== r.code);
    expect(right).toBeGreaterThanOrEqual(35);
    // "Ala." begins Alabama and Alaska, "Miss." Mississippi and Missouri: NIL. "Mo." for Missouri
    // is a convention: the letters begin Montana.
    expect(wrong.map((r) => r.row.mention)).toEqual(["Mo."]);
  });
});
