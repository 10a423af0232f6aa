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

  it("does not read a word that other entries' names carry, or a middle word, so", () => {
    // "Chandlery" ends two firms' names; "Rope" is inside "Ambry Rope Walk".
    expect(codes("Chandlery", "ORG")).not.toContain("name-unique-part");
    expect(linker.link({ id: "m", text: "Chandlery", type: "ORG" }).entity).toBeNull();
    expect(codes("Rope", "ORG")).not.toContain("name-unique-part");
  });

  it("leaves persons' short forms to context and the document", () => {
    // A surname alone may be any member of a family the table does not list.
    expect(codes("Aldous", "PER")).not.toContain("name-unique-part");
  });
});
