/**
 * Words running text puts around a name: a closing possessive ("Harrowmouth's wharves") and a
 * firm's courtesy title ("Messrs. Lumb & Sons"). A mention closed by a possessive is compared as
 * written and without it, the latter earning less key credit, so that a name that carries the
 * possessive itself ("St. Wend's") keeps its mentions from one that does not ("Saint Wend").
 * An invented table.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { normalizeName, withoutPossessive } from "../src/normalize/name.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

let table: TableKb;

beforeAll(async () => {
  table = await openTableKb(
    [
      "id,name,type,description,prior",
      "T1,Harrowmouth,town,chief port of the Wend estuary,48210",
      "T2,St. Wend's,town,fishing village on the north shore,900",
      "T3,Saint Wend,town,market town on the Tolley,1200",
      "F1,Lumb & Sons,firm,flour millers of Marlcross,93",
      "F2,Blamire Bros. Ltd.,firm,wine and spirit merchants,40",
    ].join("\n"),
    "hawser-possessives-",
  );
});

afterAll(() => table.close());

const link = (text: string, type: string) => table.linker.link({ id: "m", text, type });

describe("a closing possessive", () => {
  it("is found and dropped only at the end, after two letters or more", () => {
    expect(withoutPossessive("Lumb's")).toBe("Lumb");
    expect(withoutPossessive("Harrowmouth’s")).toBe("Harrowmouth"); // curly apostrophe
    expect(withoutPossessive("the Stenning Grain Exchange's ")).toBe("the Stenning Grain Exchange");
    expect(withoutPossessive("Lumb")).toBeNull();
    expect(withoutPossessive("St. Wend's Quay")).toBeNull(); // not at the end
    expect(withoutPossessive("O's")).toBeNull();
  });

  it("links the name without it, saying so", () => {
    const r = link("Harrowmouth's", "LOC");
    expect(r.entity).toBe("T1");
    expect(r.reasons.map((x) => x.code)).toContain("possessive-dropped");
  });

  it("leaves a name that carries it to its own mentions, and the other to the bare name", () => {
    expect(link("St. Wend's", "LOC").entity).toBe("T2");
    expect(link("Saint Wend", "LOC").entity).toBe("T3");
    const r = link("St. Wend's", "LOC");
    const bare = r.candidates.find((c) => c.entity === "T3");
    expect(bare?.features.exactKey).toBeLessThan(1);
  });
});

describe("a firm's courtesy title", () => {
  it("is no part of an organization's key", () => {
    expect(normalizeName("Messrs. Lumb & Sons", "organization").key).toBe(
      normalizeName("Lumb & Sons", "organization").key,
    );
    expect(normalizeName("Messrs. Blamire Bros., Ltd.", "organization").key).toBe("blamire");
  });

  it("links the firm", () => {
    expect(link("Messrs. Lumb & Sons", "ORG").entity).toBe("F1");
    expect(link("Messrs. Blamire Bros., Ltd.", "ORG").entity).toBe("F2");
  });
});
