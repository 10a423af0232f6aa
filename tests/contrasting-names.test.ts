/**
 * Names that set themselves against each other ("Great Ashcombe" / "Little Ashcombe", "North
 * Wend" / "South Wend", "Dock 1" / "Dock 2") are two places, never a slip of one for the other:
 * such an alias gives a mention no credit. Invented gazette places.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { namesContrast } from "../src/score/features.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const t = (s: string) => s.split(" ");

describe("namesContrast", () => {
  it("holds for words of one kind and two values, or two numbers", () => {
    expect(namesContrast(t("great ashcombe"), t("little ashcombe"))).toBe(true);
    expect(namesContrast(t("wend north"), t("wend south"))).toBe(true);
    expect(namesContrast(t("sud est"), t("sud ouest"))).toBe(true);
    expect(namesContrast(t("haut rhin"), t("bas rhin"))).toBe(true);
    expect(namesContrast(t("dock 1"), t("dock 2"))).toBe(true);
  });

  it("does not for spellings of one value, added words, or words of two kinds", () => {
    expect(namesContrast(t("centre province"), t("central province"))).toBe(false);
    expect(namesContrast(t("ashcombe"), t("great ashcombe"))).toBe(false);
    expect(namesContrast(t("north ashcombe"), t("great ashcombe"))).toBe(false);
    expect(namesContrast(t("north wend"), t("north wend"))).toBe(false);
  });
});

describe("linking against a contrasting name", () => {
  let table: TableKb;
  beforeAll(async () => {
    table = await openTableKb(
      [
        "id,name,type,description",
        "T1,Great Ashcombe,town,market town of Wendshire on the Wend",
        "T2,South Wendmoor,town,moorland parish of Wendshire with a mill",
        "T3,Harrowmouth,town,chief port of the Wend estuary",
      ].join("\n"),
      "hawser-contrast-",
    );
  });
  afterAll(() => table.close());

  it("leaves a mention of the other place NIL", () => {
    // The table lacks Little Ashcombe and North Wendmoor: their namesakes are no answer.
    for (const text of ["Little Ashcombe", "North Wendmoor"]) {
      // The context shares the county and the river with the namesake's record.
      const r = table.linker.link({ id: "m", text, type: "LOC", context: "a mill on the Wend in Wendshire" });
      expect(r.entity, text).toBeNull();
    }
    // A slip in the place's own name still links.
    expect(table.linker.link({ id: "m", text: "Great Ashcornbe", type: "LOC" }).entity).toBe("T1");
  });
});
