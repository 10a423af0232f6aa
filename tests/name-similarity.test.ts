import { createRequire } from "node:module";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  CONTRACTION_MATCH_CREDIT,
  PET_NAME_MATCH_CREDIT,
  INITIAL_MATCH_CREDIT,
  initialsCompatible,
  jaro,
  jaroWinkler,
  levenshteinSimilarity,
  TOKEN_MATCH_MIN_JW,
  tokenSetSimilarity,
} from "../src/score/name-similarity.js";

/** natural's Jaro-Winkler (CommonJS, loaded by deep path): (s1, s2, { ignoreCase?, dj? }) => number. */
type NaturalJaroWinkler = (s1: string, s2: string, options?: { ignoreCase?: boolean }) => number;
const requireCjs = createRequire(import.meta.url);
const naturalJaroWinkler = requireCjs(
  "natural/lib/natural/distance/jaro-winkler_distance.js",
) as NaturalJaroWinkler;

/** Property-test runs: enough to find edge cases, small enough for a shared 2-core machine. */
const RUNS = 300;
/** Fixed seed so a failure reproduces. */
const SEED = 20240611;
/** Closeness of two floating-point computations of the same formula. */
const EPS = 1e-12;

/** Short strings over a small alphabet, so random pairs share letters and prefixes. */
const smallWord = fc.string({ unit: fc.constantFrom("a", "b", "c", "d", "e"), maxLength: 12 });
/** Same, with upper and lower case mixed. */
const mixedCaseWord = fc.string({ unit: fc.constantFrom("a", "A", "b", "B", "c"), maxLength: 10 });
const tokenList = fc.array(fc.string({ unit: fc.constantFrom("a", "b", "c", "d"), maxLength: 7 }), {
  maxLength: 5,
});

describe("jaro / jaroWinkler: published examples", () => {
  // Winkler, "String Comparator Metrics and Enhanced Decision Rules in the Fellegi-Sunter Model of
  // Record Linkage" (1990), as reproduced in the Wikipedia article "Jaro-Winkler distance";
  // values from memory, to the three decimals they are published with.
  it("MARTHA / MARHTA: jaro 0.944, Jaro-Winkler 0.961", () => {
    expect(jaro("MARTHA", "MARHTA")).toBeCloseTo(0.944, 3);
    expect(jaroWinkler("MARTHA", "MARHTA")).toBeCloseTo(0.961, 3);
  });
  it("DWAYNE / DUANE: jaro 0.822, Jaro-Winkler 0.840", () => {
    expect(jaro("DWAYNE", "DUANE")).toBeCloseTo(0.822, 3);
    expect(jaroWinkler("DWAYNE", "DUANE")).toBeCloseTo(0.84, 3);
  });
  it("DIXON / DICKSONX: jaro 0.767, Jaro-Winkler 0.813", () => {
    expect(jaro("DIXON", "DICKSONX")).toBeCloseTo(0.767, 3);
    expect(jaroWinkler("DIXON", "DICKSONX")).toBeCloseTo(0.813, 3);
  });
  it("exact fractions behind MARTHA / MARHTA (m = 6, t = 1)", () => {
    // Derived by hand from the Jaro definition: (6/6 + 6/6 + 5/6) / 3, then + 3 * 0.1 * (1 - jaro).
    const j = (1 + 1 + 5 / 6) / 3;
    expect(jaro("MARTHA", "MARHTA")).toBeCloseTo(j, 12);
    expect(jaroWinkler("MARTHA", "MARHTA")).toBeCloseTo(j + 0.3 * (1 - j), 12);
  });
});

describe("jaro / jaroWinkler: edge cases and options", () => {
  it("identical strings score 1, disjoint strings 0, empty against non-empty 0", () => {
    expect(jaro("", "")).toBe(1);
    expect(jaroWinkler("aldous", "aldous")).toBe(1);
    expect(jaro("abc", "xyz")).toBe(0);
    expect(jaro("", "abc")).toBe(0);
    expect(jaroWinkler("abc", "")).toBe(0);
  });
  it("handles names longer than the initial flag buffers", () => {
    const long = "stenning".repeat(20);
    expect(jaro(long, long + "x")).toBeGreaterThan(0.99);
    expect(jaro(long, long.split("").reverse().join(""))).toBeLessThan(1);
  });
  it("boosts only above the threshold (default 0.7, as in Winkler's paper)", () => {
    // m = 2 of 6 (a, b), no transpositions: jaro = (2/6 + 2/6 + 1) / 3 = 5/9 < 0.7. Hand-derived.
    const j = 5 / 9;
    expect(jaro("abcxyz", "abqrst")).toBeCloseTo(j, 12);
    expect(jaroWinkler("abcxyz", "abqrst")).toBeCloseTo(j, 12);
    expect(jaroWinkler("abcxyz", "abqrst", { boostThreshold: 0 })).toBeCloseTo(j + 2 * 0.1 * (1 - j), 12);
  });
  it("honors prefixScale and maxPrefix, and rejects options leaving [0, 1]", () => {
    const j = jaro("MARTHA", "MARHTA");
    expect(jaroWinkler("MARTHA", "MARHTA", { maxPrefix: 2 })).toBeCloseTo(j + 2 * 0.1 * (1 - j), 12);
    expect(jaroWinkler("MARTHA", "MARHTA", { prefixScale: 0.2 })).toBeCloseTo(j + 3 * 0.2 * (1 - j), 12);
    expect(() => jaroWinkler("a", "b", { prefixScale: 0.3 })).toThrow(RangeError);
    expect(() => jaroWinkler("a", "b", { prefixScale: -0.1 })).toThrow(RangeError);
  });
});

describe("jaroWinkler cross-checked against natural's implementation", () => {
  // Reference: natural 8.1.1, lib/natural/distance/jaro-winkler_distance.js. Read from its source:
  // it boosts every pair (no 0.7 threshold), uses p = 0.1 and a prefix of at most 4, and lowercases
  // only with { ignoreCase: true }. So it matches ours with boostThreshold 0.
  it("agrees with boostThreshold 0 on random pairs", () => {
    fc.assert(
      fc.property(smallWord, smallWord, (a, b) => {
        expect(Math.abs(jaroWinkler(a, b, { boostThreshold: 0 }) - naturalJaroWinkler(a, b))).toBeLessThan(
          EPS,
        );
      }),
      { numRuns: RUNS, seed: SEED },
    );
  });
  it("is case-sensitive like natural's default; natural's ignoreCase equals ours on lowercased input", () => {
    fc.assert(
      fc.property(mixedCaseWord, mixedCaseWord, (a, b) => {
        const ours = jaroWinkler(a, b, { boostThreshold: 0 });
        expect(Math.abs(ours - naturalJaroWinkler(a, b))).toBeLessThan(EPS);
        const la = a.toLowerCase();
        const lb = b.toLowerCase();
        if (la === lb && la.length === 1) return; // natural's single-letter slip, next test
        const oursFolded = jaroWinkler(la, lb, { boostThreshold: 0 });
        expect(Math.abs(oursFolded - naturalJaroWinkler(a, b, { ignoreCase: true }))).toBeLessThan(EPS);
      }),
      { numRuns: RUNS, seed: SEED },
    );
  });
  it("documents natural's one difference with ignoreCase: one letter differing only in case", () => {
    // Found by the random cross-check above. natural tests s1 === s2 before lowercasing, then its
    // match window floor(1/2) - 1 = -1 finds no match in two one-letter strings (jaro 0), and its
    // prefix loop runs past the ends of the strings to the cap of 4: 0 + 4 * 0.1 * (1 - 0) = 0.4.
    // Ours clamps the window at 0 and treats equal strings as identical: 1.
    expect(naturalJaroWinkler("B", "b", { ignoreCase: true })).toBeCloseTo(0.4, 12);
    expect(jaroWinkler("b", "b")).toBe(1);
    expect(jaroWinkler("B".toLowerCase(), "b")).toBe(1);
  });
  it("differs from natural only below the boost threshold with the default settings", () => {
    fc.assert(
      fc.property(smallWord, smallWord, (a, b) => {
        const ours = jaroWinkler(a, b);
        const theirs = naturalJaroWinkler(a, b);
        if (jaro(a, b) > 0.7) expect(Math.abs(ours - theirs)).toBeLessThan(EPS);
        else expect(ours).toBeLessThanOrEqual(theirs + EPS);
      }),
      { numRuns: RUNS, seed: SEED },
    );
  });
});

describe("levenshteinSimilarity", () => {
  // Classic Levenshtein distance examples found in textbooks and the Wikipedia article
  // "Levenshtein distance" (from memory): kitten/sitting 3, flaw/lawn 2, saturday/sunday 3.
  it("kitten / sitting: distance 3 of 7", () => {
    expect(levenshteinSimilarity("kitten", "sitting")).toBeCloseTo(1 - 3 / 7, 12);
  });
  it("flaw / lawn: distance 2 of 4", () => {
    expect(levenshteinSimilarity("flaw", "lawn")).toBeCloseTo(1 - 2 / 4, 12);
  });
  it("saturday / sunday: distance 3 of 8", () => {
    expect(levenshteinSimilarity("saturday", "sunday")).toBeCloseTo(1 - 3 / 8, 12);
  });
  it('"" / abc: distance 3 of 3; two empty strings: 1', () => {
    expect(levenshteinSimilarity("", "abc")).toBe(0);
    expect(levenshteinSimilarity("", "")).toBe(1);
  });
});

describe("tokenSetSimilarity", () => {
  it("identical token lists score 1, in any order", () => {
    expect(tokenSetSimilarity(["josiah", "aldous"], ["josiah", "aldous"])).toBe(1);
    expect(tokenSetSimilarity(["aldous", "josiah"], ["josiah", "aldous"])).toBe(1);
  });
  it("counts a one-letter OCR slip in a six-letter token with its Jaro-Winkler value", () => {
    const jw = jaroWinkler("aldous", "aldons");
    expect(jw).toBeGreaterThanOrEqual(TOKEN_MATCH_MIN_JW);
    expect(tokenSetSimilarity(["josiah", "aldous"], ["josiah", "aldons"])).toBeCloseTo(
      (2 * (1 + jw)) / 4,
      12,
    );
  });
  it("does not match unrelated short words", () => {
    expect(jaroWinkler("hill", "hall")).toBeLessThan(TOKEN_MATCH_MIN_JW);
    expect(tokenSetSimilarity(["mill", "hill"], ["mill", "hall"])).toBeCloseTo(0.5, 12);
  });
  it("gives an initial partial credit against a name with that letter", () => {
    // 2 * (0.8 + 1) / (2 + 3): "j" ~ "josiah", "aldous" = "aldous", "henry" unmatched.
    expect(tokenSetSimilarity(["j", "aldous"], ["josiah", "henry", "aldous"])).toBeCloseTo(
      (2 * (INITIAL_MATCH_CREDIT + 1)) / 5,
      12,
    );
    expect(tokenSetSimilarity(["h", "aldous"], ["josiah", "aldous"])).toBeCloseTo(0.5, 12);
  });
  it("gives a contraction partial credit where Jaro-Winkler falls short", () => {
    // "Intl", "Rgnl": a list's contractions of the words another list spells out.
    expect(jaroWinkler("intl", "international")).toBeLessThan(TOKEN_MATCH_MIN_JW);
    expect(tokenSetSimilarity(["tulsa", "intl"], ["tulsa", "international"])).toBeCloseTo(
      (2 * (1 + CONTRACTION_MATCH_CREDIT)) / 4,
      12,
    );
    expect(tokenSetSimilarity(["rgnl"], ["regional"])).toBeCloseTo(CONTRACTION_MATCH_CREDIT, 12);
    // Not a contraction: the last letters differ, or the letters are out of order.
    expect(tokenSetSimilarity(["inta"], ["international"])).toBe(0);
    expect(tokenSetSimilarity(["rngl"], ["regional"])).toBe(0);
  });
  it("gives a pet form of a given name partial credit", () => {
    expect(jaroWinkler("peggy", "margaret")).toBeLessThan(TOKEN_MATCH_MIN_JW);
    expect(tokenSetSimilarity(["peggy", "pell"], ["margaret", "pell"])).toBeCloseTo(
      (2 * (1 + PET_NAME_MATCH_CREDIT)) / 4,
      12,
    );
    expect(tokenSetSimilarity(["harry"], ["henry"])).toBeCloseTo(PET_NAME_MATCH_CREDIT, 12);
    expect(tokenSetSimilarity(["peggy"], ["mary"])).toBe(0); // a pet form of another name
  });
  it("uses each partner once (multisets)", () => {
    expect(tokenSetSimilarity(["port", "port"], ["port"])).toBeCloseTo(2 / 3, 12);
  });
  it("returns 0 for empty input", () => {
    expect(tokenSetSimilarity([], [])).toBe(0);
    expect(tokenSetSimilarity(["a"], [])).toBe(0);
  });
});

describe("initialsCompatible", () => {
  it("accepts initials for given names, in order", () => {
    expect(initialsCompatible(["j", "h", "aldous"], ["josiah", "henry", "aldous"])).toBe(true);
    expect(initialsCompatible(["j", "henry", "aldous"], ["josiah", "henry", "aldous"])).toBe(true);
  });
  it("allows a middle name to be omitted", () => {
    expect(initialsCompatible(["j", "aldous"], ["josiah", "henry", "aldous"])).toBe(true);
    expect(initialsCompatible(["j", "h", "aldous"], ["josiah", "amos", "henry", "aldous"])).toBe(true);
  });
  it("rejects an initial that fits no given name, or names out of order", () => {
    expect(initialsCompatible(["h", "aldous"], ["josiah", "aldous"])).toBe(false);
    expect(initialsCompatible(["h", "j", "aldous"], ["josiah", "henry", "aldous"])).toBe(false);
    expect(initialsCompatible(["j", "h", "aldous"], ["josiah", "aldous"])).toBe(false);
  });
  it("requires at least one initial and a given name", () => {
    expect(initialsCompatible(["aldous"], ["josiah", "aldous"])).toBe(false);
    expect(initialsCompatible(["josiah", "aldous"], ["josiah", "aldous"])).toBe(false);
  });
  it("tolerates a slight surname slip but not a different surname", () => {
    expect(jaroWinkler("aldous", "aldouss")).toBeGreaterThanOrEqual(0.92);
    expect(initialsCompatible(["j", "aldouss"], ["josiah", "aldous"])).toBe(true);
    expect(initialsCompatible(["j", "alden"], ["josiah", "aldous"])).toBe(false);
  });
});

describe("similarity properties", () => {
  const pairFunctions: [string, (a: string, b: string) => number][] = [
    ["jaro", jaro],
    ["jaroWinkler", (a, b) => jaroWinkler(a, b)],
    ["jaroWinkler (boost always)", (a, b) => jaroWinkler(a, b, { boostThreshold: 0 })],
    ["levenshteinSimilarity", levenshteinSimilarity],
  ];
  for (const [name, f] of pairFunctions) {
    it(`${name}: in [0, 1], symmetric, 1 on identical input`, () => {
      fc.assert(
        fc.property(smallWord, smallWord, (a, b) => {
          const s = f(a, b);
          expect(s).toBeGreaterThanOrEqual(0);
          expect(s).toBeLessThanOrEqual(1);
          expect(Math.abs(s - f(b, a))).toBeLessThan(EPS);
          expect(f(a, a)).toBe(1);
        }),
        { numRuns: RUNS, seed: SEED },
      );
    });
  }
  it("tokenSetSimilarity: in [0, 1], symmetric, 1 on identical non-empty input", () => {
    fc.assert(
      fc.property(tokenList, tokenList, (a, b) => {
        const s = tokenSetSimilarity(a, b);
        expect(s).toBeGreaterThanOrEqual(0);
        expect(s).toBeLessThanOrEqual(1 + EPS);
        expect(Math.abs(s - tokenSetSimilarity(b, a))).toBeLessThan(EPS);
        if (a.length > 0) expect(tokenSetSimilarity(a, [...a])).toBeCloseTo(1, 12);
      }),
      { numRuns: RUNS, seed: SEED },
    );
  });
});
