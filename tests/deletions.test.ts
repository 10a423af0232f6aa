/**
 * Deletion variants (src/kb/deletions.ts), checked against their definition: the variants of a
 * token are exactly the strings obtained by deleting up to one (or two) of its characters,
 * enumerated here independently by choosing which positions to keep.
 */
import { describe, expect, it } from "vitest";
import {
  deletionVariants,
  tableDeletions,
  tableVariants,
  TWO_DELETION_MIN_LENGTH,
  twoDeletionVariants,
} from "../src/kb/deletions.js";

/** Every string made by deleting exactly the characters at one set of `k` positions, for k <= max. */
function byPositions(token: string, max: number): Set<string> {
  const out = new Set<string>();
  const n = token.length;
  for (let mask = 0; mask < 1 << n; mask++) {
    let dropped = 0;
    for (let i = 0; i < n; i++) if (mask & (1 << i)) dropped++;
    if (dropped > max) continue;
    let s = "";
    for (let i = 0; i < n; i++) if (!(mask & (1 << i))) s += token[i];
    out.add(s);
  }
  return out;
}

describe("deletion variants", () => {
  for (const token of ["pell", "harrow", "halstanmere", "aabba"]) {
    it(`of "${token}" are the strings with one or two characters deleted`, () => {
      expect(new Set(deletionVariants(token))).toEqual(byPositions(token, 1));
      expect(new Set(twoDeletionVariants(token))).toEqual(byPositions(token, 2));
    });
  }

  it("are two deep only for long tokens, and only when the vocabulary's budget allows", () => {
    const long = "x".repeat(TWO_DELETION_MIN_LENGTH - 1) + "y";
    expect(tableVariants(long, 2)).toEqual(twoDeletionVariants(long));
    expect(tableVariants("pell", 2)).toEqual(deletionVariants("pell"));
    expect(tableVariants("halstanmere", 1)).toEqual(deletionVariants("halstanmere"));
    // halstanmere: at most 1 + 11 + 55 = 67 variants, pell 5 (72 in all); "ab" is not indexed.
    expect(tableDeletions(["halstanmere", "pell", "ab"], 72)).toBe(2);
    expect(tableDeletions(["halstanmere", "pell", "ab"], 71)).toBe(1);
  });
});
