/**
 * The same words in another order ("Islands, Carrow" against "Carrow Islands", a catalogue's
 * inverted heading): a key match with less credit, for firms, places and vessels, never for
 * persons. An invented table of the gazette's places, firms and people.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const TABLE = [
  "id,name,type,description",
  "L1,Carrow Islands,place,islands at the river mouth",
  "L2,Carrow,town,market town",
  "F1,Tolley Valley Railway,firm,railway company",
  "P1,Thomas John,person,lighterman",
  "",
].join("\n");

let table: TableKb;
const link = (text: string, type: string) => table.linker.link({ id: "m", text, type });

beforeAll(async () => {
  table = await openTableKb(TABLE, "hawser-reordered-");
});

afterAll(() => table.close());

describe("names whose words are reordered", () => {
  it("link as a key match with less credit than the same order", () => {
    const r = link("Islands, Carrow", "LOC");
    expect(r.entity).toBe("L1");
    expect(r.reasons.map((x) => x.code)).toContain("name-reordered");
    expect(r.candidates[0]?.features.exactKey).toBe(0.75);
    const f = link("Railway, Tolley Valley", "ORG");
    expect(f.entity).toBe("F1");
    expect(f.reasons.map((x) => x.code)).toContain("name-reordered");
  });

  it("do not make a key match of a person's two names swapped", () => {
    const r = link("John Thomas", "PER");
    expect(r.reasons.map((x) => x.code)).not.toContain("name-reordered");
    expect(r.candidates.find((c) => c.entity === "P1")?.features.exactKey ?? 0).toBe(0);
  });
});
