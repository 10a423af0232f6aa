/**
 * Names led by a word the candidate's own record carries ("Yantai Laishan Airport" for the
 * airfield "Laishan" of Yantai): nameMatch's "attested" match. An invented table of the gazette's
 * ship chandlers, each of one town, the towns named in the descriptions only.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Linker } from "../src/link/linker.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const FIRMS: Array<[string, string]> = [
  ["Pellow", "Stenmouth"],
  ["Hobbard", "Harrowmouth"],
  ["Quarrie", "Wexcombe"],
  ["Ambler", "Tolleby"],
  ["Cordray", "Nessmouth"],
  ["Fennick", "Ekerby"],
];

let table: TableKb;
let linker: Linker;

beforeAll(async () => {
  const rows = [
    "id,name,type,description",
    ...FIRMS.map(([firm, town], i) => `F${i},${firm} & Co.,firm,ship chandlers of ${town}`),
  ];
  table = await openTableKb(`${rows.join("\n")}\n`, "hawser-attested-");
  linker = table.linker;
});

afterAll(() => table.close());

describe("names led by a word of the entity's own record", () => {
  it("links a firm named with its town before its name, citing the record", () => {
    const r = linker.link({ id: "m1", text: "Stenmouth Pellow & Co.", type: "ORG" });
    expect(r.entity).toBe("F0");
    expect(r.reasons.map((x) => x.code)).toContain("name-attested");
    expect(r.candidates[0]?.features.exactKey).toBeCloseTo(0.6, 5);
  });

  it("does not set aside a town the record does not carry", () => {
    // Harrowmouth is Hobbard's town, not Pellow's.
    const r = linker.link({ id: "m2", text: "Harrowmouth Pellow & Co.", type: "ORG" });
    expect(r.reasons.map((x) => x.code)).not.toContain("name-attested");
    expect(r.entity).not.toBe("F0");
  });

  it("sets aside leading words only, and only words few records carry", () => {
    // A trailing town, and a word every record carries ("chandlers"), are not set aside.
    const trailing = linker.link({ id: "m3", text: "Pellow Stenmouth", type: "ORG" });
    expect(trailing.reasons.map((x) => x.code)).not.toContain("name-attested");
    const common = linker.link({ id: "m4", text: "Chandlers Pellow", type: "ORG" });
    expect(common.reasons.map((x) => x.code)).not.toContain("name-attested");
  });
});
