import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { contextTerms, foldText, STOPWORDS, stem } from "../src/score/terms.js";
import { buildVector, cosine, idf } from "../src/score/tfidf.js";

/** Property-test runs: enough to find edge cases, small enough for a shared 2-core machine. */
const RUNS = 200;
/** Fixed seed so a failure reproduces. */
const SEED = 20240611;

describe("contextTerms", () => {
  it("drops a token too long to be a word, in linear time", () => {
    // A garbled scan's run of letters: the stemmer's patterns took quadratic time on it (80,000
    // letters: 15 s).
    expect(contextTerms(`harbour ${"x".repeat(200_000)} quay`)).toEqual(["harbour", "quai"]);
  });

  it("folds case and diacritics before splitting", () => {
    expect(foldText("Société Müller-Ærø")).toBe("societe muller-ærø");
    expect(contextTerms("QUAY Société")).toEqual(["quai", "societ"]);
  });
  it("splits on anything that is not a letter or digit and drops short tokens", () => {
    expect(contextTerms("wharf/quay—warehouse; x, y")).toEqual(["wharf", "quai", "warehous"]);
  });
  it("drops natural's English stopwords", () => {
    expect(STOPWORDS.has("the")).toBe(true);
    expect(STOPWORDS.has("wharf")).toBe(false);
    expect(contextTerms("The owner of the barge and his steamers")).toEqual(["owner", "barg", "steamer"]);
  });
  it("keeps 4-digit years 1000-2099, drops other bare numbers, keeps mixed tokens", () => {
    expect(contextTerms("In 1897 the 12 barges paid 3000 or 0999 at berth 1st and 2099 1000")).toEqual([
      "1897",
      "barg",
      "paid",
      "berth",
      "1st",
      "2099",
      "1000",
    ]);
  });
  it("Porter-stems: classic examples of Porter's algorithm", () => {
    // M. F. Porter, "An algorithm for suffix stripping" (1980): caresses -> caress, ponies -> poni,
    // hopping -> hop; generalizations -> gener is the usual full-run example. From memory.
    expect(contextTerms("caresses ponies hopping generalizations")).toEqual([
      "caress",
      "poni",
      "hop",
      "gener",
    ]);
  });
  it("memoizes stems consistently", () => {
    expect(stem("shipping")).toBe("ship");
    expect(stem("shipping")).toBe("ship");
    expect(contextTerms("Shipping shipping SHIPPING")).toEqual(["ship", "ship", "ship"]);
  });
  it("returns nothing for empty or punctuation-only text", () => {
    expect(contextTerms("")).toEqual([]);
    expect(contextTerms(" -- ,, ")).toEqual([]);
  });
});

describe("idf", () => {
  // Smoothed IDF ln((1 + N) / (1 + df)) + 1, common practice in text retrieval toolkits.
  it("is 1 for a term in every document and grows as the term gets rarer", () => {
    expect(idf(10, 10)).toBeCloseTo(1, 12);
    expect(idf(0, 9)).toBeCloseTo(Math.log(10) + 1, 12);
    expect(idf(1, 9)).toBeCloseTo(Math.log(5) + 1, 12);
    expect(idf(0, 0)).toBe(1);
  });
  it("rejects negative or non-finite counts", () => {
    expect(() => idf(-1, 5)).toThrow(RangeError);
    expect(() => idf(1, Number.NaN)).toThrow(RangeError);
  });
});

describe("buildVector / cosine", () => {
  const one = () => 1;
  it("sorts distinct terms and log-scales term frequency", () => {
    const v = buildVector(["quay", "barge", "quay"], one);
    expect(v.terms).toEqual(["barge", "quay"]);
    expect(v.weights[0]).toBeCloseTo(1, 12);
    expect(v.weights[1]).toBeCloseTo(1 + Math.log(2), 12);
    expect(v.norm).toBeCloseTo(Math.sqrt(1 + (1 + Math.log(2)) ** 2), 12);
  });
  it("multiplies by the term's idf", () => {
    const v = buildVector(["quay"], (t) => (t === "quay" ? 2.5 : 1));
    expect(v.weights[0]).toBeCloseTo(2.5, 12);
  });
  it("computes a hand-checked cosine", () => {
    // (a, b) . (b, c) with unit weights = 1; norms sqrt(2) each: 1 / 2.
    expect(cosine(buildVector(["a", "b"], one), buildVector(["b", "c"], one))).toBeCloseTo(0.5, 12);
    expect(cosine(buildVector(["a"], one), buildVector(["b"], one))).toBe(0);
    expect(cosine(buildVector([], one), buildVector(["b"], one))).toBe(0);
  });
  it("is in [0, 1], symmetric, and 1 on identical non-empty vectors", () => {
    const terms = fc.array(fc.constantFrom("barg", "quai", "wharf", "1897", "steamer", "grain"), {
      maxLength: 8,
    });
    const idfOf = (t: string) => idf(t.length % 3, 5);
    fc.assert(
      fc.property(terms, terms, (x, y) => {
        const a = buildVector(x, idfOf);
        const b = buildVector(y, idfOf);
        const c = cosine(a, b);
        expect(c).toBeGreaterThanOrEqual(0);
        expect(c).toBeLessThanOrEqual(1);
        expect(c).toBeCloseTo(cosine(b, a), 12);
        if (x.length > 0) expect(cosine(a, buildVector([...x].reverse(), idfOf))).toBeCloseTo(1, 12);
      }),
      { numRuns: RUNS, seed: SEED },
    );
  });
});
