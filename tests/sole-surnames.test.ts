/**
 * A person's surname given alone ("Lumb", "Mr. Lumb") names the table's only person of that
 * name, as a place's unique part names its place (reason `name-surname`); never when another
 * person's name holds the word, nor for a word that is no surname, nor for short words.
 * An invented table: the auctioneer James Thomas Lumb and the millers Lumb & Sons; two men called
 * Pell; a clerk with a two-letter surname.
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

  it("leaves the firm to an organization's mention of the same word", () => {
    expect(link("Lumb", "ORG").entity).toBe("F1");
  });

  it("gets no credit when another person's name holds the word", () => {
    const r = link("Pell", "PER");
    expect(r.entity).toBeNull();
    expect(r.candidates.every((c) => c.features.exactKey === 0)).toBe(true);
  });

  it("gets no credit for a given name or a short word", () => {
    expect(link("Thomas", "PER").candidates.find((c) => c.entity === "P1")?.features.exactKey ?? 0).toBe(0);
    expect(link("Ng", "PER").candidates.find((c) => c.entity === "P4")?.features.exactKey ?? 0).toBe(0);
  });
});
