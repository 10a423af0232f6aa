import { describe, expect, it } from "vitest";
import { alignSpans, evaluateAligned } from "../src/evaluate/align.js";
import { gold, row } from "./eval-helpers.js";

const g = [
  gold("g1", "A", { doc: "d1", start: 0, end: 10 }),
  gold("g2", "B", { doc: "d1", start: 20, end: 30 }),
  gold("g3", null, { doc: "d2", start: 5, end: 9 }),
  gold("g4", "C", { doc: "d2", start: 40, end: 50 }),
];
const p = [
  row("p1", "A", [["A", 0.9]], { doc: "d1", start: 0, end: 10 }),
  row("p2", "B", [["B", 0.8]], { doc: "d1", start: 22, end: 30 }),
  row("p3", "Z", [["Z", 0.7]], { doc: "d2", start: 5, end: 9 }),
  row("p4", "Q", [["Q", 0.7]], { doc: "d1", start: 60, end: 65 }),
  row("p5", null, [], { doc: "d2", start: 44, end: 47 }),
];

describe("alignSpans", () => {
  it("strict: same document and boundaries only", () => {
    const a = alignSpans(g, p, { mode: "strict" });
    expect(a.pairs.map((x) => [x.gold.id, x.predicted.mention])).toEqual([
      ["g1", "p1"],
      ["g3", "p3"],
    ]);
    expect(a.unmatchedGold.map((m) => m.id)).toEqual(["g2", "g4"]);
    expect(a.unmatchedPredicted.map((r) => r.mention)).toEqual(["p2", "p4", "p5"]);
    expect(a.missedLinks).toBe(2);
    expect(a.falseLinks).toBe(2); // p2 and p4 carry entities, p5 is NIL
  });

  it("relaxed: overlapping spans in the same document", () => {
    const a = alignSpans(g, p, { mode: "relaxed" });
    expect(a.pairs.map((x) => [x.gold.id, x.predicted.mention])).toEqual([
      ["g1", "p1"],
      ["g2", "p2"],
      ["g3", "p3"],
      ["g4", "p5"],
    ]);
    expect(a.unmatchedPredicted.map((r) => r.mention)).toEqual(["p4"]);
    expect(a.falseLinks).toBe(1);
    expect(a.missedLinks).toBe(0);
  });

  it("relaxed is one-to-one, longest overlap first, ties to the earliest", () => {
    const gs = [gold("a", "X", { start: 0, end: 10 }), gold("b", "Y", { start: 8, end: 20 })];
    // q1 overlaps a by 8 and b by 2; q2 overlaps b by 10; q3 overlaps a and b by 1 each
    const ps = [
      row("q1", "X", [], { start: 2, end: 10 }),
      row("q2", "Y", [], { start: 10, end: 20 }),
      row("q3", "Y", [], { start: 9, end: 10 }),
    ];
    const a = alignSpans(gs, ps, { mode: "relaxed" });
    expect(a.pairs.map((x) => [x.gold.id, x.predicted.mention])).toEqual([
      ["a", "q1"],
      ["b", "q2"],
    ]);
    // a tie in overlap goes to the earliest gold span
    const tie = alignSpans(gs, [row("t", "X", [], { start: 9, end: 10 })], { mode: "relaxed" });
    expect(tie.pairs[0]!.gold.id).toBe("a");
  });

  it("names the file, line and field of a mention without offsets", () => {
    const bad = [gold("g1", "A", { doc: "d1", start: 3, source: { file: "gold.jsonl", line: 7 } })];
    expect(() => alignSpans(bad, p)).toThrow(/gold\.jsonl:7: field "end"/);
    expect(() =>
      alignSpans(g, [row("p", null, [], { start: 5, end: 2 })], { predictedFile: "links.jsonl" }),
    ).toThrow(/links\.jsonl:1: field "end": end \(2\) must be greater than start \(5\)/);
  });
});

describe("evaluateAligned", () => {
  it("counts unmatched gold as missed links and unmatched predicted links in end-to-end precision", () => {
    const r = evaluateAligned(alignSpans(g, p, { mode: "strict" }));
    // matched: g1->A (correct), g3 (gold NIL)->Z (false link); unmatched g2, g4: missed links
    expect(r.overall).toMatchObject({ mentions: 4, correctLinks: 1, predictedLinks: 2, goldLinks: 3 });
    expect(r.errorCounts).toEqual({ wrongEntity: 0, falseLink: 1, missedLink: 2 });
    expect(r.alignment).toMatchObject({
      mode: "strict",
      matched: 2,
      unmatchedGold: 2,
      unmatchedPredicted: 3,
      falseLinks: 2,
    });
    // end to end: 1 correct of 2 + 2 unmatched predicted links
    expect(r.alignment.endToEnd.linkPrecision).toBeCloseTo(1 / 4, 12);
    expect(r.alignment.endToEnd.linkRecall).toBeCloseTo(1 / 3, 12);
  });
});
