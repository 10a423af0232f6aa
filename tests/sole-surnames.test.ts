/**
 * A person's surname given alone ("Lumb", "Mr. Lumb") names the table's only person of that
 * name, as a place's unique part names its place (reason `name-surname`); never when another
 * person's name holds the word, nor for a word that is no surname, nor for short words.
 * An invented table: the auctioneer James Thomas Lumb and the millers Lumb & Sons; two men called
 * Pell; a clerk with a two-letter surname; a woman ship owner.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

let table: TableKb;

beforeAll(async () => {
  table = await openTableKb(
    [
      "id,name,type,aliases,description,prior",
      "P1,James Thomas Lumb,person,J. T. Lumb,auctioneer at Marlcross,12",
      "F1,Lumb & Sons,firm,,flour millers of Marlcross,93",
      "P2,Josiah Pell,person,,ship owner,40",
      "P3,Ezra Pell,person,,carter,2",
      "P4,Walter Ng,person,,clerk to the harbour board,3",
      "P5,Herbert Feather,person,,surgeon at Stenmouth,18",
      "P6,Mary Tattersall,person,,ship owner of Stenmouth,7",
      "P7,Walter Imrie Spackman,person,W. I. Spackman,wharfinger at Harrowmouth,5",
      "P8,Reuben Spackman,person,,ropemaker of Stenby,5",
    ].join("\n"),
    "hawser-surnames-",
  );
});

afterAll(() => table.close());

const link = (text: string, type: string) => table.linker.link({ id: "m", text, type });
const codes = (text: string, type: string) => link(text, type).reasons.map((r) => r.code);

describe("a surname alone", () => {
  it("links the only person of that name, over a firm named after the family", () => {
    for (const text of ["Lumb", "Mr. Lumb", "LUMB"]) {
      const r = link(text, "PER");
      expect(r.entity, text).toBe("P1");
      expect(codes(text, "PER")).toContain("name-surname");
    }
    expect(link("Feather", "PER").entity).toBe("P5");
  });

  it("gets no credit, nor any name evidence, when the honorific says one sex and the given name the other", () => {
    expect(link("Miss Tattersall", "PER").entity).toBe("P6");
    expect(link("Mrs. Tattersall", "PER").entity).toBe("P6");
    // The auctioneer's wife, or the surgeon's, is not the man himself.
    for (const [text, eid] of [
      ["Mrs. Lumb", "P1"],
      ["Mrs. Feather", "P5"],
      ["Mr. Tattersall", "P6"],
    ] as const) {
      const r = link(text, "PER");
      expect(
        r.reasons.map((x) => x.code),
        text,
      ).not.toContain("name-surname");
      expect(r.candidates.find((c) => c.entity === eid)?.features.exactKey ?? 0, text).toBe(0);
    }
    expect(link("Mrs. Lumb", "PER").entity).toBeNull(); // nor the firm: a PER mention, "& Sons" aside
    for (const text of ["Mrs. Feather", "Mr. Tattersall", "Tattersall, Mr."]) {
      const r = link(text, "PER");
      expect(r.entity, text).toBeNull();
      expect(
        r.reasons.map((x) => x.code),
        text,
      ).toContain("sex-differs");
    }
    // A wife named by her husband's full name is not the husband.
    expect(link("Josiah Pell", "PER").entity).toBe("P2");
    expect(link("Mrs. Josiah Pell", "PER").entity).toBeNull();
    expect(link("Widow Pell", "PER").candidates.every((c) => c.features.tokenSet === 0)).toBe(true);
  });

  it("leaves the firm to an organization's mention of the same word", () => {
    expect(link("Lumb", "ORG").entity).toBe("F1");
  });

  it("gets no credit when another person's name holds the word", () => {
    const r = link("Pell", "PER");
    expect(r.entity).toBeNull();
    expect(r.candidates.every((c) => c.features.exactKey === 0)).toBe(true);
  });

  it("leaves two bearers to context, however long their given names", () => {
    // Compared with whole names, "Spackman" was nearer "W. I. Spackman" than "Reuben Spackman"
    // (Jaro-Winkler 0.89 against 0.29) and linked the wharfinger on no evidence.
    for (const text of ["Spackman", "Mr. Spackman"]) {
      const r = link(text, "PER");
      expect(r.entity, text).toBeNull();
      expect(r.reasons[0]?.code, text).toBe("ambiguous");
      for (const eid of ["P7", "P8"])
        expect(r.candidates.find((c) => c.entity === eid)?.features.jaroWinkler, `${text} ${eid}`).toBe(1);
    }
    const told = table.linker.link({
      id: "m",
      text: "Spackman",
      type: "PER",
      context: "the Stenby ropemaker",
    });
    expect(told.entity).toBe("P8");
  });

  it("gets no credit for a given name or a short word", () => {
    expect(link("Thomas", "PER").candidates.find((c) => c.entity === "P1")?.features.exactKey ?? 0).toBe(0);
    expect(link("Ng", "PER").candidates.find((c) => c.entity === "P4")?.features.exactKey ?? 0).toBe(0);
  });
});
