/**
 * The link-time context cosine (src/score/context.ts: entity norm from the index, merge with the
 * mention's terms) must equal the plain TF-IDF cosine of two full vectors (src/score/tfidf.ts).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { contextCosine, termListNorm } from "../src/score/context.js";
import { buildVector, cosine } from "../src/score/tfidf.js";

const idfOf = (t: string) => 1 + (t.charCodeAt(0) % 5) / 2;
const terms: fc.Arbitrary<string[]> = fc.array(
  fc.constantFrom<string>("bar", "pilot", "quay", "grain", "oyster", "ferry", "tug"),
  {
    maxLength: 12,
  },
);

describe("contextCosine", () => {
  it("equals the cosine of the full TF-IDF vectors", () => {
    fc.assert(
      fc.property(terms, terms, (m, e) => {
        const mv = buildVector(m, idfOf);
        const mention = { ...mv, idfs: Float64Array.from(mv.terms, idfOf) };
        const sorted = [...e].sort();
        const shared: string[] = [];
        const c = contextCosine(mention, sorted, termListNorm(sorted, idfOf), shared);
        expect(c).toBeCloseTo(cosine(mv, buildVector(e, idfOf)), 10);
        expect(shared.every((t) => m.includes(t) && e.includes(t))).toBe(true);
      }),
      { seed: 7, numRuns: 300 },
    );
  });
});
