/**
 * Token overlap between a mention and an alias: acronyms inside a name are read ("T.V. Railway"
 * for "Tolley Valley Railway"), and a mention contained in an alias counts fully while a mention
 * saying more than the alias does not ("Little Quaybridge" is not the town "Quaybridge"). Names
 * are invented (the gazette scenario).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Linker } from "../src/link/linker.js";
import { normalizeName } from "../src/normalize/name.js";
import { foldEmbeddedAcronyms } from "../src/score/embedded-acronyms.js";
import { tokenOverlap } from "../src/score/features.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const tokens = (name: string) => normalizeName(name, "organization").tokens;

describe("foldEmbeddedAcronyms", () => {
  it("reads a run of words whose first letters spell a token of the other name", () => {
    expect(foldEmbeddedAcronyms(["tolley", "valley", "railway"], ["tv", "railway"])).toEqual([
      "tv",
      "railway",
    ]);
    // A run anywhere in the name, joiner words inside it skipped.
    expect(foldEmbeddedAcronyms(["bank", "of", "nether", "ambry", "ltd"], ["bna"])).toEqual(["bna", "ltd"]);
    expect(
      foldEmbeddedAcronyms(["virgin", "islands", "united", "states"], ["virgin", "islands", "us"]),
    ).toEqual(["virgin", "islands", "us"]);
  });

  it("leaves names alone when nothing spells, and returns the same array", () => {
    const name = ["tolley", "railway"];
    expect(foldEmbeddedAcronyms(name, ["tv", "railway"])).toBe(name);
    // Single letters are initials, not words: "t v railway" is compared token by token.
    const initials = ["t", "v", "railway"];
    expect(foldEmbeddedAcronyms(initials, ["tv"])).toBe(initials);
    // A token both names hold matches as itself, not as an acronym.
    const own = ["us", "united", "states"];
    expect(foldEmbeddedAcronyms(own, ["us"])).toBe(own);
    // One letter is an initial; past five letters is not read; digits are not letters.
    expect(foldEmbeddedAcronyms(["tolley", "valley"], ["t"])).toEqual(["tolley", "valley"]);
    expect(foldEmbeddedAcronyms(["a", "b"], ["a1"])).toEqual(["a", "b"]);
  });

  it("needs the whole acronym spelled by consecutive words", () => {
    expect(foldEmbeddedAcronyms(["tolley", "grain", "valley"], ["tv"])).toEqual([
      "tolley",
      "grain",
      "valley",
    ]);
    expect(foldEmbeddedAcronyms(["tolley"], ["tv"])).toEqual(["tolley"]);
  });
});

describe("tokenOverlap", () => {
  it("counts a mention contained in an alias fully, and one saying more than the alias less", () => {
    const short = tokens("Quaybridge");
    const long = tokens("Little Quaybridge");
    // Mention "Quaybridge" against the alias "Little Quaybridge": fully covered (Dice 2/3).
    expect(tokenOverlap(short, long)).toBeCloseTo((2 / 3 + 1) / 2, 6);
    // Mention "Little Quaybridge" against the alias "Quaybridge": half the mention unexplained.
    expect(tokenOverlap(long, short)).toBeCloseTo((2 / 3 + 1 / 2) / 2, 6);
  });

  it("matches an acronym inside a name against the words it stands for", () => {
    expect(tokenOverlap(tokens("T.V. Railway"), tokens("Tolley Valley Railway"))).toBe(1);
    expect(tokenOverlap(tokens("Tolley Valley Railway"), tokens("T.V. Railway"))).toBe(1);
    expect(tokenOverlap(tokens("T.V. Railway"), tokens("Tolley Railway"))).toBeLessThan(0.75);
  });
});

describe("linking with token overlap", () => {
  const TABLE = [
    "id,name,type,aliases,description,prior",
    "R1,Tolley Valley Railway,firm,,line from Stenmouth up the Tolley,8",
    "R2,Tolley Railway Works,firm,,engine sheds at Carrow,8",
    "R3,N.A. Ropeworks,firm,,rope makers of Nether Ambry,4",
    "R4,Stenning Grain Exchange,firm,S.G.E.,corn exchange,9",
    "T1,Quaybridge,town,,market town on the Tolley,30",
    "T2,Harrowmouth,town,,port at the river mouth,40",
    "",
  ].join("\n");
  let table: TableKb;
  let linker: Linker;

  beforeAll(async () => {
    table = await openTableKb(TABLE, "hawser-token-overlap-");
    linker = table.linker;
  });
  afterAll(() => table.close());

  it("links a name written with an acronym inside it", () => {
    const r = linker.link({ id: "m1", text: "T.V. Railway", type: "ORG" });
    expect(r.entity).toBe("R1");
    expect(r.reasons.map((x) => x.code)).toContain("acronym-inside");
    // Spelled out against a table that writes the acronym.
    expect(linker.link({ id: "m6", text: "Nether Ambry Ropeworks", type: "ORG" }).entity).toBe("R3");
  });

  it("does not read an acronym into a name spelled exactly, beside an alias that is its acronym", () => {
    const r = linker.link({ id: "m7", text: "Stenning Grain Exchange", type: "ORG" });
    expect(r.entity).toBe("R4");
    expect(r.reasons.map((x) => x.code)).toContain("name-exact");
    expect(r.reasons.map((x) => x.code)).not.toContain("acronym-inside");
    expect(linker.link({ id: "m8", text: "S.G.E.", type: "ORG" }).entity).toBe("R4");
  });

  it("leaves NIL a longer name that merely holds a table name", () => {
    // A vessel named after the town, and a different place named after it.
    expect(linker.link({ id: "m2", text: "SS Harrowmouth", type: "MISC" }).entity).toBeNull();
    expect(linker.link({ id: "m3", text: "Little Quaybridge", type: "LOC" }).entity).toBeNull();
    // The names themselves still link.
    expect(linker.link({ id: "m4", text: "Harrowmouth", type: "LOC" }).entity).toBe("T2");
    expect(linker.link({ id: "m5", text: "Quaybridge", type: "LOC" }).entity).toBe("T1");
  });
});
