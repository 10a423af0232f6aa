/**
 * The index build computes each entity's context norm from term ids kept in typed arrays
 * (src/kb/context-stats.ts); it must equal, bit for bit, termListNorm over the entity's sorted
 * term list with the smoothed IDF of the final document frequencies, which is how the norms were
 * computed before (and the formula the link-time cosine assumes).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ContextStats } from "../src/kb/context-stats.js";
import { termListNorm } from "../src/score/context.js";
import { idf } from "../src/score/tfidf.js";

const docs: fc.Arbitrary<string[][]> = fc.array(
  fc.array(fc.constantFrom("quay", "grain", "oyster", "ferry", "tug", "pilot", "1897", "lime"), {
    maxLength: 14,
  }),
  { minLength: 1, maxLength: 40 },
);

describe("ContextStats", () => {
  it("gives every document the norm termListNorm gives its sorted terms, and the document frequencies", () => {
    fc.assert(
      fc.property(docs, (raw) => {
        const sorted = raw.map((d) => [...d].sort());
        const stats = new ContextStats();
        for (const d of sorted) stats.add(d);
        const df = new Map<string, number>();
        for (const d of sorted) for (const t of new Set(d)) df.set(t, (df.get(t) ?? 0) + 1);
        expect(new Map(stats.frequencies())).toEqual(df);
        expect(stats.size).toBe(df.size);
        expect(stats.documents).toBe(sorted.length);
        const norms = stats.norms();
        sorted.forEach((d, i) => {
          expect(norms[i]).toBe(termListNorm(d, (t) => idf(df.get(t) ?? 0, sorted.length)));
        });
      }),
      { seed: 11, numRuns: 500 },
    );
  });

  it("keeps counting past one storage chunk (more than a million term occurrences)", () => {
    const stats = new ContextStats();
    const doc = ["grain", "grain", "quay"];
    const n = 400_000; // 1.2 million occurrences
    for (let i = 0; i < n; i++) stats.add(doc);
    stats.add(["tug"]);
    const norms = stats.norms();
    const idfs = { grain: idf(n, n + 1), quay: idf(n, n + 1), tug: idf(1, n + 1) };
    expect(norms[n - 1]).toBe(termListNorm(doc, (t) => idfs[t as keyof typeof idfs]));
    expect(norms[n]).toBe(termListNorm(["tug"], () => idfs.tug));
  });
});
