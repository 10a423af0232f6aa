import { describe, expect, it } from "vitest";
import { evaluate, figuresOf, formatEvalTable } from "../src/evaluate/metrics.js";
import { gold, row } from "./eval-helpers.js";

// Six invented mentions covering every outcome; the expected figures below are hand-computed.
const pairs = [
  // correct link
  {
    gold: gold("m1", "A", { type: "PER" }),
    predicted: row("m1", "A", [
      ["A", 0.9],
      ["B", 0.2],
    ]),
  },
  // wrong entity; gold B is 4th of the candidates: found at all, not at 3
  {
    gold: gold("m2", "B", { type: "PER" }),
    predicted: row("m2", "C", [
      ["B", 0.3],
      ["C", 0.9],
      ["D", 0.5],
      ["E", 0.4],
    ]),
  },
  // missed link; gold among the candidates
  {
    gold: gold("m3", "C", { type: "ORG" }),
    predicted: row("m3", null, [
      ["X", 0.4],
      ["C", 0.3],
    ]),
  },
  // correct NIL
  { gold: gold("m4", null, { type: "ORG" }), predicted: row("m4", null, [["Y", 0.2]]) },
  // false link
  { gold: gold("m5", null), predicted: row("m5", "D", [["D", 0.8]]) },
  // missed link with no row at all
  { gold: gold("m6", "D"), predicted: null },
];

describe("evaluate", () => {
  const report = evaluate(pairs);

  it("computes overall accuracy, link and NIL figures", () => {
    const o = report.overall;
    expect(o).toMatchObject({
      mentions: 6,
      goldLinks: 4,
      goldNil: 2,
      predictedLinks: 3,
      predictedNil: 3,
      correctLinks: 1,
      correctNil: 1,
    });
    expect(o.accuracy).toBeCloseTo(2 / 6, 12);
    expect(o.linkPrecision).toBeCloseTo(1 / 3, 12);
    expect(o.linkRecall).toBeCloseTo(1 / 4, 12);
    expect(o.linkF1).toBeCloseTo(2 / 7, 12); // 2PR/(P+R) = (1/6)/(7/12)
    expect(o.nilPrecision).toBeCloseTo(1 / 3, 12);
    expect(o.nilRecall).toBeCloseTo(1 / 2, 12);
  });

  it("gives the same overall figures from bare entity ids (figuresOf)", () => {
    const ids = figuresOf(
      pairs.map((p) => p.gold.gold),
      pairs.map((p) => p.predicted?.entity ?? null),
    );
    expect(ids).toEqual(report.overall);
    expect(() => figuresOf([null], [])).toThrow(/differ in length/);
  });

  it("splits figures by mention type", () => {
    expect(Object.keys(report.byType)).toEqual(["(untyped)", "ORG", "PER"]);
    const per = report.byType.PER!;
    expect([per.linkPrecision, per.linkRecall, per.accuracy]).toEqual([0.5, 0.5, 0.5]);
    const org = report.byType.ORG!;
    // no predicted link: precision is 0 by the zero-division convention
    expect([org.linkPrecision, org.linkRecall, org.nilPrecision, org.nilRecall]).toEqual([0, 0, 0.5, 1]);
    expect(report.byType["(untyped)"]!.accuracy).toBe(0);
  });

  it("measures candidate recall at k and at all returned", () => {
    expect(report.candidateRecall).toEqual({
      k: 3,
      goldLinks: 4,
      foundAtK: 2,
      foundAtAll: 3,
      atK: 0.5,
      atAll: 0.75,
    });
    const atOne = evaluate(pairs, { k: 1 }).candidateRecall;
    expect([atOne.foundAtK, atOne.foundAtAll]).toEqual([1, 3]); // only m1's gold ranks first
    expect(() => evaluate(pairs, { k: 0 })).toThrow(/k must be a positive integer/);
  });

  it("counts and lists errors by kind", () => {
    expect(report.errorCounts).toEqual({ wrongEntity: 1, falseLink: 1, missedLink: 2 });
    expect(report.errors.map((e) => [e.mention, e.kind, e.gold, e.predicted])).toEqual([
      ["m2", "wrongEntity", "B", "C"],
      ["m3", "missedLink", "C", null],
      ["m5", "falseLink", null, "D"],
      ["m6", "missedLink", "D", null],
    ]);
    const m2 = report.errors[0]!;
    expect(m2.score).toBe(0.9);
    expect(m2.goldScore).toBe(0.3);
    expect(m2.reasons[0]!.code).toBe("alias-exact");
    expect(report.errors[3]!.goldScore).toBeNull();
  });

  it("handles an empty input without dividing by zero", () => {
    const empty = evaluate([]);
    expect(empty.overall.accuracy).toBe(0);
    expect(empty.overall.linkF1).toBe(0);
  });

  it("formats an aligned text table", () => {
    const text = formatEvalTable(report);
    const lines = text.split("\n");
    const table = lines.slice(0, 5); // header, 3 types, all
    expect(table[0]).toMatch(/^type\s+mentions\s+accuracy\s+link P\s+link R\s+link F1\s+NIL P\s+NIL R$/);
    expect(new Set(table.map((l) => l.length)).size).toBe(1);
    expect(table[4]).toMatch(/^all\s+6\s+0\.333\s+0\.333\s+0\.250\s+0\.286\s+0\.333\s+0\.500$/);
    expect(text).toContain("at 3");
    expect(text).toMatch(/missed link\s+2/);
  });

  it("shows a figure with nothing to count as '-', not 0", () => {
    // One gold link, linked right: no NIL in the gold nor predicted.
    const one = evaluate([
      { gold: gold("m1", "A", { type: "PER" }), predicted: row("m1", "A", [["A", 0.9]]) },
    ]);
    const all = formatEvalTable(one).split("\n")[2]!;
    expect(all).toMatch(/^all\s+1\s+1\.000\s+1\.000\s+1\.000\s+1\.000\s+-\s+-$/);
    expect(one.overall.nilPrecision).toBe(0);
  });
});
