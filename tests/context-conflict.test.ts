/**
 * The contextConflict feature: a mention's context that names a value of one of the table's kind
 * columns (here the county) the candidate's record does not give, and not the one it gives. An
 * invented table of the gazette's landing places in two counties, Wendshire and Ambry Vale, with
 * the county in a column of its own.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEFAULT_WEIGHTS } from "../src/score/combine.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const WENDSHIRE = [
  "Harrowmouth",
  "Stenmouth",
  "Tolleby",
  "Wexcombe",
  "Nessbury",
  "Ekerby",
  "Quarrington",
  "Fennow",
  "Hobbley",
  "Cordwick",
  "Mossingham",
  "Stenning",
];
const AMBRY_VALE = [
  "Kellow",
  "Pellworth",
  "Ashmoor",
  "Dunstow",
  "Gillerby",
  "Harrowfield",
  "Jessop",
  "Marrowby",
  "Lathom",
  "Brackley",
  "Scarrow",
  "Wendmoor",
];

let table: TableKb;

beforeAll(async () => {
  const rows = [
    "id,name,type,county",
    ...WENDSHIRE.map((t, i) => `W${i},${t},town,Wendshire`),
    ...AMBRY_VALE.map((t, i) => `A${i},${t},town,Ambry Vale`),
    // A landing place whose record gives no county.
    "X0,Skelby,town,",
  ];
  table = await openTableKb(`${rows.join("\n")}\n`, "hawser-conflict-");
});

afterAll(() => table.close());

const conflictOf = (text: string, context: string) => {
  const r = table.linker.link({ id: "m", text, type: "LOC", context });
  return { row: r, conflict: r.candidates[0]?.features.contextConflict };
};

describe("a context that names another county than the candidate's", () => {
  it("counts against the candidate, and says why", () => {
    expect(table.kb.info.kindValues.map((v) => v.value)).toEqual(["wendshire", "ambry vale"]);
    const { row, conflict } = conflictOf(
      "Kellow",
      "At the Wendshire Quarter Sessions a carter of Kellow was fined.",
    );
    expect(conflict).toBe(1);
    const reason = row.reasons.find((r) => r.code === "context-conflict");
    expect(reason?.values).toEqual(["wendshire"]);
    // Not enough to overturn a name spelled as the table spells it.
    expect(row.entity).toBe("A0");
  });

  it("does not count when the context names the candidate's county too, or none", () => {
    expect(conflictOf("Kellow", "Wendshire and Ambry Vale carters met at Kellow.").conflict).toBe(0);
    expect(conflictOf("Kellow", "Ambry Vale news: a fire at Kellow.").conflict).toBe(0);
    expect(conflictOf("Kellow", "A fire at Kellow on Tuesday.").conflict).toBe(0);
  });

  it("needs every word of a value: 'Port Ambry' names no county", () => {
    expect(conflictOf("Harrowmouth", "Arrived from Port Ambry with bricks.").conflict).toBe(0);
  });

  it("does not count against a record that gives no county", () => {
    expect(conflictOf("Skelby", "At the Ambry Vale petty sessions, of Skelby.").conflict).toBe(0);
  });

  it("costs its weight in log-odds: a near spelling in another county scores far lower", () => {
    // "Kelow" is a slip for Kellow (Ambry Vale). Neither context shares a word with its record.
    const logit = (p: number) => Math.log(p / (1 - p));
    const plain = table.linker.link({
      id: "m",
      text: "Kelow",
      type: "LOC",
      context: "At the Quarter Sessions, of Kelow.",
    });
    const elsewhere = conflictOf("Kelow", "At the Wendshire Quarter Sessions, of Kelow.");
    expect(plain.entity).toBe("A0");
    expect(plain.candidates[0]?.features.contextConflict).toBe(0);
    expect(elsewhere.conflict).toBe(1);
    expect(logit(elsewhere.row.score) - logit(plain.score)).toBeCloseTo(
      DEFAULT_WEIGHTS.features.contextConflict,
      1,
    );
  });
});
