/**
 * Short forms made of words only one entry's names carry ("Lek" for "Albanian Lek", "Brunei" for
 * "Brunei Darussalam"): nameMatch's "part" match. An invented table of the gazette's firms.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Linker } from "../src/link/linker.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const TABLE = [
  "id,name,type,description",
  "F1,Ambry Rope Walk,firm,rope makers",
  "F2,Pellow Chandlery,firm,ship chandlers",
  "F3,Quarrie Chandlery,firm,ship chandlers",
  "P1,Josiah Aldous,person,harbour master",
  "L1,Saint Morwen and Carrow Holm,place,parish of two villages",
  "L2,Saint Brannock,town,market town",
  "F4,Tolley Valley Railway Sidings,firm,goods yard",
  "F5,Wexcombe Sidings,firm,goods yard",
  "L3,Tolley Reach,place,stretch of the river",
  "L4,Upper Pool of the Tolley and Gannet Sands,place,anchorage below the town",
  "L5,Carrow Pool,place,mill pond",
  "I1,Fenwold Quarter Sessions,institution,county court",
  "",
].join("\n");

let table: TableKb;
let linker: Linker;
const codes = (text: string, type: string) => linker.link({ id: "m", text, type }).reasons.map((r) => r.code);

beforeAll(async () => {
  table = await openTableKb(TABLE, "hawser-part-");
  linker = table.linker;
});

afterAll(() => table.close());

describe("short forms of words one entry's names carry", () => {
  it("links the first or the last words of a name", () => {
    for (const text of ["Ambry", "Rope Walk", "Ambry Rope"]) {
      const r = linker.link({ id: "m", text, type: "ORG" });
      expect(r.entity, text).toBe("F1");
      expect(codes(text, "ORG"), text).toContain("name-unique-part");
    }
  });

  it("reads a part only as an entry of the kind the mention's label says", () => {
    // The table has the county's court, not the county: a place named Fenwold is not its court.
    expect(codes("Fenwold", "LOC")).not.toContain("name-unique-part");
    expect(linker.link({ id: "m", text: "Fenwold", type: "LOC" }).entity).toBeNull();
    // Labeled as an organization, or not labeled, the part reads as the court's.
    for (const type of ["ORG", ""]) {
      const r = linker.link({ id: "m", text: "Fenwold", ...(type === "" ? {} : { type }) });
      expect(r.entity, type).toBe("I1");
      expect(
        r.reasons.map((x) => x.code),
        type,
      ).toContain("name-unique-part");
    }
  });

  it("does not read a word that other entries' names carry, or a middle word, so", () => {
    // "Chandlery" ends two firms' names; "Rope" is inside "Ambry Rope Walk".
    expect(codes("Chandlery", "ORG")).not.toContain("name-unique-part");
    expect(linker.link({ id: "m", text: "Chandlery", type: "ORG" }).entity).toBeNull();
    expect(codes("Rope", "ORG")).not.toContain("name-unique-part");
  });

  it("links words that only together are one entry's, when the words left out are its own", () => {
    // "Saint" is carried by two names, "Morwen" by one; the words left out are the entry's own
    // ("and" joins, "Carrow" and "Holm" no other name carries).
    const r = linker.link({ id: "m", text: "Saint Morwen", type: "LOC" });
    expect(r.entity).toBe("L1");
    expect(codes("Saint Morwen", "LOC")).toContain("name-unique-part");
    // "Tolley Valley Railway" is one entry's only together, but "Sidings" is another firm's word
    // too: the railway company itself may be meant, not its sidings.
    expect(codes("Tolley Valley Railway", "ORG")).not.toContain("name-unique-part");
    // A name's head before "of" or "and" names the whole, whatever its complement carries
    // ("Pool" ends another name, "Tolley" starts two).
    const pool = linker.link({ id: "m", text: "Upper Pool", type: "LOC" });
    expect(pool.entity).toBe("L4");
    expect(codes("Upper Pool", "LOC")).toContain("name-unique-part");
  });

  it("links a name the mention gives with a complement after it", () => {
    // "Saint Brannock" is one entry's alone ("Saint" starts another name); "and the Downs" adds to it.
    const r = linker.link({ id: "m", text: "Saint Brannock and the Downs", type: "LOC" });
    expect(r.entity).toBe("L2");
    expect(codes("Saint Brannock and the Downs", "LOC")).toContain("name-head");
    // A firm's "& Co." read as words is no complement.
    expect(codes("Saint Brannock & Co.", "ORG")).not.toContain("name-head");
  });

  it("links a firm's name the mention gives with a word or two more, as registers write it", () => {
    for (const text of ["Ambry Rope Walk Stores", "Ambry Rope Walk Stores, Ltd."]) {
      const r = linker.link({ id: "m", text, type: "ORG" });
      expect(r.entity, text).toBe("F1");
      expect(codes(text, "ORG"), text).toContain("name-extended");
    }
    // Three words more make another firm's name as often as not.
    expect(codes("Ambry Rope Walk Coal Tar Stores", "ORG")).not.toContain("name-extended");
    // A place's added words make another place: "Carrow Pool Mill" is not the mill pond.
    expect(codes("Carrow Pool Mill", "LOC")).not.toContain("name-extended");
    expect(codes("Carrow Pool Mill", "ORG")).not.toContain("name-extended");
  });

  it("leaves persons' short forms to context and the document", () => {
    // A surname alone may be any member of a family the table does not list.
    expect(codes("Aldous", "PER")).not.toContain("name-unique-part");
  });
});
