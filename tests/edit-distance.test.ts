/**
 * The optimal-string-alignment distance that accepts fuzzy token corrections
 * (src/candidates/edit-distance.ts), against published values and a registry implementation.
 */
import { createRequire } from "node:module";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { osaDistance } from "../src/candidates/edit-distance.js";

/** natural 8.1.1, lib/natural/distance/levenshtein_distance.js (CommonJS, loaded by deep path). */
const requireCjs = createRequire(import.meta.url);
const natural = requireCjs("natural/lib/natural/distance/levenshtein_distance.js") as {
  DamerauLevenshteinDistance: (a: string, b: string, options?: { restricted?: boolean }) => number;
};

describe("osaDistance", () => {
  it("gives the textbook values", () => {
    // The standard example separating OSA from unrestricted Damerau-Levenshtein (from memory):
    // OSA("CA", "ABC") = 3, since the transposed pair cannot be edited again; unrestricted = 2.
    expect(osaDistance("CA", "ABC")).toBe(3);
    // Levenshtein's textbook case (from memory): kitten -> sitting takes 3 edits, none a swap.
    expect(osaDistance("kitten", "sitting")).toBe(3);
    // One adjacent swap is one edit (plain Levenshtein counts two).
    expect(osaDistance("radolnig", "radoling")).toBe(1);
    expect(osaDistance("", "abc")).toBe(3);
    expect(osaDistance("abc", "")).toBe(3);
    expect(osaDistance("wharf", "wharf")).toBe(0);
  });

  it("agrees with natural's restricted Damerau-Levenshtein on random pairs", () => {
    const word = fc.string({ unit: fc.constantFrom("a", "b", "c", "d", "r", "n", "m"), maxLength: 9 });
    fc.assert(
      fc.property(word, word, (a, b) => {
        expect(osaDistance(a, b)).toBe(natural.DamerauLevenshteinDistance(a, b, { restricted: true }));
      }),
      { seed: 11, numRuns: 500 },
    );
  });
});
