/**
 * The link-time context cosine (src/score/context.ts: entity term ids and norm from the index,
 * merged with the mention's term ids) must equal the plain TF-IDF cosine of two full vectors
 * (src/score/tfidf.ts).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { contextCosine, idVector, termIdListNorm } from "../src/score/context.js";
import { buildVector, cosine } from "../src/score/tfidf.js";

const WORDS = ["bar", "pilot", "quay", "grain", "oyster", "ferry", "tug"];
const idfOf = (t: string) => 1 + (t.charCodeAt(0) % 5) / 2;
/** Term ids in an order unrelated to the words' spelling, as a KB assigns them (first seen first). */
const ID_OF = new Map(WORDS.map((w, i) => [w, (i * 5) % WORDS.length]));
const WORD_OF = new Map([...ID_OF].map(([w, id]) => [id, w]));
const idfOfId = (id: number) => idfOf(WORD_OF.get(id)!);
const terms: fc.Arbitrary<string[]> = fc.array(fc.constantFrom<string>(...WORDS), { maxLength: 12 });

describe("contextCosine", () => {
  it("equals the cosine of the full TF-IDF vectors, and names only shared terms", () => {
    fc.assert(
      fc.property(
        terms,
        fc.array(fc.constantFrom<string>(...WORDS, "unknownword"), { maxLength: 12 }),
        (e, m) => {
          const mv = buildVector(m, idfOf);
          const mention = idVector(mv, idfOf, (t) => ID_OF.get(t) ?? -1);
          const ids = Uint32Array.from(e.map((t) => ID_OF.get(t)!)).sort();
          const norm = termIdListNorm(ids, 0, ids.length, idfOfId);
          expect(norm).toBeCloseTo(buildVector(e, idfOf).norm, 10);
          const shared: string[] = [];
          const c = contextCosine(mention, ids, 0, ids.length, norm, shared);
          expect(c).toBeCloseTo(cosine(mv, buildVector(e, idfOf)), 10);
          expect(shared.every((t) => m.includes(t) && e.includes(t))).toBe(true);
          expect(new Set(shared).size).toBe(new Set(m.filter((t) => e.includes(t))).size);
        },
      ),
      { seed: 7, numRuns: 300 },
    );
  });

  it("reads an entity's slice of a shared id array, not its neighbours'", () => {
    const mention = idVector(buildVector(["quay", "tug"], idfOf), idfOf, (t) => ID_OF.get(t) ?? -1);
    const a = [ID_OF.get("quay")!, ID_OF.get("tug")!].sort((x, y) => x - y);
    const all = Uint32Array.from([...a, ID_OF.get("bar")!]);
    expect(contextCosine(mention, all, 2, 3, 1)).toBe(0);
    expect(contextCosine(mention, all, 0, 2, termIdListNorm(all, 0, 2, idfOfId))).toBeCloseTo(1, 10);
  });
});
