/**
 * Names that lack words an entry's longer name carries ("Mossingham" against "Upper
 * Mossingham"): the words may be left out unless they are ones the table tells entries apart by,
 * that is, unless it holds a name made of them and another entry's name ("Upper Ekerby" beside
 * "Ekerby"). An invented table of the gazette's places and institutions.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { separatesEntries } from "../src/link/separating-words.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const TABLE = [
  "id,name,type,description,town",
  "L1,Ekerby,town,market town on the river,",
  "L2,Upper Ekerby,town,village above the weir,",
  "L3,Upper Mossingham,town,village on the downs,",
  "L4,Pitwell Sands,town,fishing hamlet,",
  "L5,Garrow Sands,town,fishing hamlet,",
  "I1,Ekerby Police Court,institution,borough magistrates,Ekerby",
  "",
].join("\n");

let table: TableKb;
const link = (text: string, type = "LOC") => table.linker.link({ id: "m", text, type });

beforeAll(async () => {
  table = await openTableKb(TABLE, "hawser-separating-");
});

afterAll(() => table.close());

describe("words the table tells entries apart by", () => {
  it("are found from a name made of them and another entry's name", () => {
    // "Upper Ekerby" is "Upper" before the entry "Ekerby"; no entry is called "Pitwell" or "Garrow".
    expect(separatesEntries(table.kb, ["upper"], true)).toBe(true);
    expect(separatesEntries(table.kb, ["sands"], false)).toBe(false);
    // On the other side of the name they separate nothing: no name ends in "Upper".
    expect(separatesEntries(table.kb, ["upper"], false)).toBe(false);
    expect(separatesEntries(table.kb, ["nowhere"], true)).toBe(false);
  });

  it("may not be left out: a name lacking them is no short form of the longer one", () => {
    // The table lacks a plain "Mossingham"; "Upper Mossingham" is another place.
    const r = link("Mossingham");
    expect(r.entity).toBeNull();
    const best = r.candidates.find((c) => c.entity === "L3");
    // Without its coverage of the mention, the name's token overlap is the Dice coefficient alone.
    expect(best?.features.tokenSet).toBeCloseTo(2 / 3, 3);
    const apart = r.reasons.find((x) => x.code === "words-apart");
    expect(apart?.words).toEqual(["upper"]);
  });

  it("leaves other shared words free to be left out", () => {
    // "Sands" ends two names, but nothing is called "Pitwell" beside "Pitwell Sands".
    const r = link("Pitwell");
    expect(r.entity).toBe("L4");
    expect(r.reasons.map((x) => x.code)).toContain("name-unique-part");
  });

  it("lets a name lose a word its entry's own record carries", () => {
    // "Ekerby" is shared by three names, and separates "Upper Ekerby" from "Ekerby"; but the
    // court's record says its town is Ekerby.
    const r = link("Police Court", "ORG");
    expect(r.entity).toBe("I1");
    expect(r.reasons.map((x) => x.code)).toContain("name-unique-part");
  });
});
