/**
 * foldCase (names) and foldText (context words) lowercase ASCII text directly instead of running
 * it through the Unicode normalizer: on ASCII text that must give exactly what the full fold
 * gives (NFKD, combining marks stripped, lowercase, special letters expanded), and text with any
 * other character must still take the full fold.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { foldCase } from "../src/normalize/fold.js";
import { foldText } from "../src/score/terms.js";

const SPECIAL: Record<string, string> = {
  ß: "ss",
  æ: "ae",
  œ: "oe",
  ø: "o",
  ł: "l",
  đ: "d",
  ð: "d",
  þ: "th",
  ı: "i",
  ĸ: "k",
  ŋ: "n",
};
/** The full name fold, as foldCase is defined. */
const fullFoldCase = (text: string) =>
  text
    .normalize("NFKD")
    .replace(/\p{M}+/gu, "")
    .toLowerCase()
    .replace(/[ßæœøłđðþıĸŋ]/g, (c) => SPECIAL[c] ?? c);
/** The full context fold, as foldText is defined. */
const fullFoldText = (text: string) =>
  text
    .toLowerCase()
    .normalize("NFKD")
    .replace(/\p{M}+/gu, "");

describe("ASCII folding", () => {
  it("equals the full fold on every ASCII string", () => {
    fc.assert(
      fc.property(
        fc.string({ unit: fc.integer({ min: 0, max: 0x7f }).map((c) => String.fromCharCode(c)) }),
        (s) => {
          expect(foldCase(s)).toBe(fullFoldCase(s));
          expect(foldText(s)).toBe(fullFoldText(s));
        },
      ),
      { seed: 5, numRuns: 5_000 },
    );
  });

  it("still folds text with other characters in full", () => {
    for (const s of ["Ærøskøbing", "Łódź Straße", "Café ﬁne", "Ｐｅｌｌ", "Jos\u0301e"]) {
      expect(foldCase(s)).toBe(fullFoldCase(s));
      expect(foldText(s)).toBe(fullFoldText(s));
    }
    expect(foldCase("Ærøskøbing")).toBe("aeroskobing");
  });
});
