/**
 * A person named with a full given name that none of the entry's given names agrees with (not a
 * spelling, a misreading, a shortening or a pet form of one) is another person: "Josiah Aldous"
 * is not Jabez Harcourt Aldous (reason `given-name-differs`). An invented table.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

let table: TableKb;

beforeAll(async () => {
  table = await openTableKb(
    [
      "id,name,type,aliases,description,prior",
      "P1,Jabez Harcourt Aldous,person,J. H. Aldous,harbour master of Harrowmouth,30",
      "P2,Henry Estton,person,,carter of Stenmouth,4",
      "P3,Ernest Caloock,person,,ship chandler,6",
      "P4,Margaret Pell,person,,innkeeper at Fort Ambry,5",
    ].join("\n"),
    "hawser-given-names-",
  );
});

afterAll(() => table.close());

const link = (text: string) => table.linker.link({ id: "m", text, type: "PER" });

describe("given names", () => {
  it("that differ leave the person unlinked, and say why", () => {
    for (const text of ["Josiah Aldous", "ALDOUS, Josiah H.", "Walter Estton"]) {
      const r = link(text);
      expect(r.entity, text).toBeNull();
    }
    const r = link("Josiah Aldous");
    expect(r.reasons.map((x) => x.code)).toContain("given-name-differs");
    expect(r.candidates.find((c) => c.entity === "P1")?.features.tokenSet).toBe(0);
  });

  it("that agree as a spelling, a misreading, a shortening or a middle name still link", () => {
    const cases: Array<[string, string]> = [
      ["Jabez Aldous", "P1"],
      ["Jabcz Aldous", "P1"], // misread
      ["Harcourt Aldous", "P1"], // his middle name
      ["J. H. Aldous", "P1"], // initials say nothing
      ["Emest Caloock", "P3"], // rn read as m
      ["Marg. Pell", "P4"], // a clerk's shortening
    ];
    for (const [text, eid] of cases) expect(link(text).entity, text).toBe(eid);
  });

  it("that are pet forms of each other link, a pet form counting nearly as the name", () => {
    for (const [text, eid] of [
      ["Harry Estton", "P2"],
      ["Peggy Pell", "P4"],
    ] as const) {
      const r = link(text);
      expect(r.entity, text).toBe(eid);
      expect(
        r.reasons.map((x) => x.code),
        text,
      ).not.toContain("given-name-differs");
    }
  });
});
