import { describe, expect, it } from "vitest";
import { agreement } from "../src/evaluate/agree.js";
import type { LabeledMention } from "../src/types.js";

function labels(pairs: Array<[string | null, string | null]>): [LabeledMention[], LabeledMention[]] {
  const a = pairs.map(([x], i) => ({ id: `m${i}`, text: `t${i}`, gold: x }));
  const b = pairs.map(([, y], i) => ({ id: `m${i}`, text: `t${i}`, gold: y }));
  return [a, b];
}

function repeat<T>(x: T, n: number): T[] {
  return Array.from({ length: n }, () => x);
}

describe("agreement", () => {
  it("matches the textbook 2x2 worked example of Cohen's kappa", () => {
    // Worked example of the Wikipedia article "Cohen's kappa", from memory (50 items: both yes 20,
    // A yes / B no 5, A no / B yes 10, both no 15 -> p_o = 0.70, p_e = 0.50, kappa = 0.40).
    // "yes" is an entity id, "no" is NIL.
    const [a, b] = labels([
      ...repeat<[string | null, string | null]>(["yes", "yes"], 20),
      ...repeat<[string | null, string | null]>(["yes", null], 5),
      ...repeat<[string | null, string | null]>([null, "yes"], 10),
      ...repeat<[string | null, string | null]>([null, null], 15),
    ]);
    const r = agreement(a, b);
    expect(r.n).toBe(50);
    expect(r.observed).toBeCloseTo(0.7, 12);
    expect(r.expected).toBeCloseTo(0.5, 12);
    expect(r.kappa).toBeCloseTo(0.4, 12);
    expect(r.counts).toEqual([
      { a: "yes", b: "yes", count: 20 },
      { a: null, b: null, count: 15 },
      { a: null, b: "yes", count: 10 },
      { a: "yes", b: null, count: 5 },
    ]);
    expect(r.disagreements).toHaveLength(15);
    expect(r.disagreements[0]).toEqual({ id: "m20", text: "t20", a: "yes", b: null });
  });

  it("handles several entity categories plus NIL", () => {
    // Hand-computed: 10 items, agreement on 8. Shares A: X .4, Y .4, NIL .2; B: X .3, Y .4, NIL .3.
    // p_e = .4*.3 + .4*.4 + .2*.3 = 0.34; kappa = (0.8 - 0.34) / (1 - 0.34).
    const [a, b] = labels([
      ["X", "X"],
      ["X", "X"],
      ["X", "X"],
      ["X", "Y"],
      ["Y", "Y"],
      ["Y", "Y"],
      ["Y", "Y"],
      [null, null],
      [null, null],
      ["Y", null],
    ]);
    const r = agreement(a, b);
    expect(r.observed).toBeCloseTo(0.8, 12);
    expect(r.expected).toBeCloseTo(0.34, 12);
    expect(r.kappa).toBeCloseTo((0.8 - 0.34) / (1 - 0.34), 12);
  });

  it("reports perfect agreement on one category as kappa 1", () => {
    const [a, b] = labels([
      [null, null],
      [null, null],
    ]);
    expect(agreement(a, b).kappa).toBe(1);
  });

  it("matches by id regardless of order, and names an id found in one file only", () => {
    const [a, b] = labels([
      ["X", "X"],
      ["Y", "Z"],
    ]);
    expect(agreement(a, [...b].reverse()).observed).toBe(0.5);
    expect(() => agreement(a, b.slice(0, 1), { fileA: "ann-a.jsonl", fileB: "ann-b.jsonl" })).toThrow(
      /ann-a\.jsonl: field "id": mention id "m1" is not in ann-b\.jsonl/,
    );
    const extra = [...b, { id: "m9", text: "t", gold: null, source: { file: "ann-b.jsonl", line: 3 } }];
    expect(() => agreement(a, extra)).toThrow(/ann-b\.jsonl:3: field "id": mention id "m9" is not in \(a\)/);
    expect(() => agreement([...a, a[0]!], b)).toThrow(/duplicate mention id "m0"/);
  });
});
