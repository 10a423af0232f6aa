/**
 * A name's closing aside ("Virgin Islands (British)", as ISO-style lists write them) is kept in
 * the full form as qualifier words, outside persons: the key drops it, so the short name still
 * meets both entries, while the aside tells them apart. Names are invented (the gazette scenario).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { normalizeName } from "../src/normalize/name.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const TABLE = [
  "id,name,type,description",
  "L1,Carrow Islands (Crown),place,islands off the river mouth",
  "L2,Carrow Islands (Company),place,islands leased to the river company",
  "L3,Gambrel (the),town,market town",
  "",
].join("\n");

let table: TableKb;
const link = (text: string) => table.linker.link({ id: "m", text, type: "LOC" });

beforeAll(async () => {
  table = await openTableKb(TABLE, "hawser-asides-");
});

afterAll(() => table.close());

describe("closing asides", () => {
  it("stay in the full form as qualifier words, outside persons", () => {
    const n = normalizeName("Carrow Islands (Crown)", "location");
    expect(n.key).toBe("carrow islands");
    expect(n.full).toBe("carrow islands crown");
    // Letters joined as elsewhere; an aside of articles only adds nothing.
    expect(normalizeName("Carrow Islands (C.I.)", "location").full).toBe("carrow islands ci");
    expect(normalizeName("Gambrel (the)", "location").full).toBe("gambrel");
    // Inner asides are dropped as before, and so are persons' asides.
    expect(normalizeName("Cocks (Keeling) Islands", "location").full).toBe("cocks islands");
    expect(normalizeName("Josiah Pell (deceased)", "person").full).toBe("josiah pell");
  });

  it("tell apart two entries whose names differ only by them", () => {
    expect(link("Carrow Islands (Crown)").entity).toBe("L1");
    expect(link("Carrow Islands (Company)").entity).toBe("L2");
    // Without the aside the name is either entry's.
    const bare = link("Carrow Islands");
    expect(bare.entity).toBeNull();
    expect(bare.reasons.map((r) => r.code)).toContain("ambiguous");
  });

  it("meet the same words written before the name or after a comma", () => {
    const before = link("Crown Carrow Islands");
    expect(before.entity).toBe("L1");
    expect(before.reasons.map((r) => r.code)).toContain("name-reordered");
    expect(link("Carrow Islands, Company").entity).toBe("L2");
    expect(link("Gambrel").entity).toBe("L3");
  });
});
