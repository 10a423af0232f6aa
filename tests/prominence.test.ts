/**
 * The prominence feature: namesakes that the name, the type and the context cannot tell apart
 * are told apart by their popularity, the log of the lead at the default weight; never persons.
 * An invented table: the port of Harrowmouth and a hamlet of the same name, two Pell firms, two
 * men called Josiah Pell.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { PROMINENCE_FULL_LEAD, prominenceOf } from "../src/score/features.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

let table: TableKb;

beforeAll(async () => {
  table = await openTableKb(
    [
      "id,name,type,description,prior",
      "T1,Harrowmouth,town,chief port of the Wend estuary,48210",
      "T2,Harrowmouth,town,hamlet on the Sten moors,60",
      "T3,Kellow,town,market town,900",
      "T4,Kellow,town,hamlet,700",
      "T5,Tolleby,town,village,300",
      "T6,Tolleby,town,village,0",
      "P1,Josiah Pell,person,ship owner,40",
      "P2,Josiah Pell,person,carter,2",
    ].join("\n"),
    "hawser-prominence-",
  );
});

afterAll(() => table.close());

const link = (text: string, type: string, context?: string) =>
  table.linker.link({ id: "m", text, type, ...(context === undefined ? {} : { context }) });

describe("prominence", () => {
  it("is the log of the lead, 1 at a thousandfold", () => {
    expect(prominenceOf(999, 0)).toBe(1);
    expect(prominenceOf(PROMINENCE_FULL_LEAD ** 0.5 - 1, 0)).toBeCloseTo(0.5, 10);
    expect(prominenceOf(48210, 60)).toBeCloseTo(Math.log(48211 / 61) / Math.log(1000), 10);
  });

  it("links the far more popular of two namesakes nothing else tells apart, and says so", () => {
    const r = link("Harrowmouth", "LOC");
    expect(r.entity).toBe("T1");
    const reason = r.reasons.find((x) => x.code === "prominent");
    expect(reason?.lead).toBe(Math.round(48211 / 61));
    expect(r.candidates[0]?.features.prominence).toBeGreaterThan(0);
    expect(r.candidates[1]?.features.prominence).toBe(0);
  });

  it("leaves namesakes of like popularity ambiguous, and a known one against an unknown alone", () => {
    // 900 against 700: a lead of 1.3, far less than the minimum margin asks.
    expect(link("Kellow", "LOC").reasons[0]?.code).toBe("ambiguous");
    // A prior of 0 is one not given: 300 leads it, but the lead is small at the default weight.
    expect(link("Tolleby", "LOC").candidates[0]?.features.prominence).toBeGreaterThan(0);
  });

  it("gives way to context that tells the namesakes apart", () => {
    expect(link("Harrowmouth", "LOC", "a hamlet on the Sten moors").entity).toBe("T2");
  });

  it("never decides between two persons", () => {
    const r = link("Josiah Pell", "PER");
    expect(r.entity).toBeNull();
    expect(r.candidates.every((c) => c.features.prominence === 0)).toBe(true);
  });
});
