/**
 * Near spellings and the table's near-name rate (src/link/crowding.ts): a name matched only by a
 * near spelling counts less the more crowded the table's names are. Two invented gazette tables:
 * a sparse one, where no name is a slip away from another's, and a crowded one, where every
 * name is. Each is small enough to be measured whole, so the rates are exact.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Kb } from "../src/kb/kb.js";
import { sampleEids } from "../src/link/crowding.js";
import { createLinker, type Linker } from "../src/link/linker.js";
import { DEFAULT_WEIGHTS } from "../src/score/combine.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const SPARSE = [
  "id,name,type,aliases,description,prior",
  "T1,Harrowmouth,town,,river port at the Tolley mouth,40",
  "T2,Stenmouth,town,,market town and ferry,30",
  "T3,Quaybridge,town,,bridge town with grain wharves,20",
  "F1,Josiah Aldous,person,,harbour master,5",
  "",
].join("\n");

/** Every town here has a neighbour one letter away: Tolleby / Tollaby, Wexcombe / Waxcombe, ... */
const CROWDED = [
  "id,name,type,aliases,description,prior",
  "C1,Tolleby,town,,,10",
  "C2,Tollaby,town,,,10",
  "C3,Wexcombe,town,,,10",
  "C4,Waxcombe,town,,,10",
  "C5,Ambridge,town,,,10",
  "C6,Ambrigde,town,,,10",
  "C7,Harrowby,town,,,10",
  "C8,Harroby,town,,,10",
  "",
].join("\n");

let sparseTable: TableKb;
let crowdedTable: TableKb;
let crowdedKb: Kb;
let sparse: Linker;
let crowded: Linker;

beforeAll(async () => {
  sparseTable = await openTableKb(SPARSE, "hawser-near-");
  crowdedTable = await openTableKb(CROWDED, "hawser-near-");
  sparse = sparseTable.linker;
  ({ kb: crowdedKb, linker: crowded } = crowdedTable);
});

afterAll(() => {
  sparseTable.close();
  crowdedTable.close();
});

describe("sampleEids", () => {
  it("takes the whole of a small table and spreads a sample over a large one", () => {
    expect(sampleEids(4, 10)).toEqual([1, 2, 3, 4]);
    expect(sampleEids(0, 10)).toEqual([]);
    const s = sampleEids(1_000_000, 1000);
    expect(s).toHaveLength(1000);
    expect(s[0]).toBe(1);
    expect(s[999]).toBe(999_001);
    for (let i = 1; i < s.length; i++) expect(s[i]! - s[i - 1]!).toBe(1000);
  });
});

describe("the near-name rate", () => {
  it("is 0 where no name is a slip from another's, and 1 where every name is", () => {
    expect(sparse.nearNameRate).toBe(0);
    expect(crowded.nearNameRate).toBe(1);
    // Measured once per open KB, whatever linker asks.
    expect(createLinker(crowdedKb, { threshold: 0.9 }).nearNameRate).toBe(1);
  });
});

describe("linking near spellings", () => {
  it("links an OCR slip in a sparse table at full strength", () => {
    const r = sparse.link({ id: "m1", text: "Harowmouth", type: "GPE" });
    expect(r.entity).toBe("T1");
    expect(r.candidates[0]?.features.nearSpelling).toBe(0);
    expect(r.reasons.map((x) => x.code)).not.toContain("near-spelling");
  });

  it("leaves a near spelling NIL in a crowded table, citing the rate", () => {
    // "Tolloby" is one letter from Tolleby and from Tollaby: in this table that is no evidence.
    const r = crowded.link({ id: "m2", text: "Tolloby", type: "GPE" });
    expect(r.entity).toBeNull();
    const best = r.candidates[0]!;
    expect(best.features.nearSpelling).toBe(1);
    const reason = r.reasons.find((x) => x.code === "near-spelling");
    expect(reason?.nearNameRate).toBe(1);
    // Without the cost, the same candidate would pass the threshold.
    const free = createLinker(crowdedKb, {
      weights: { ...DEFAULT_WEIGHTS, features: { ...DEFAULT_WEIGHTS.features, nearSpelling: 0 } },
    });
    expect(free.link({ id: "m2", text: "Tolloby", type: "GPE" }).score).toBeGreaterThan(0.5);
  });

  it("still links names spelled as the table spells them, in a crowded table", () => {
    const r = crowded.link({ id: "m3", text: "Wexcombe", type: "GPE" });
    expect(r.entity).toBe("C3");
    expect(r.candidates[0]?.features.nearSpelling).toBe(0);
    // The neighbour is scored with the cost.
    expect(r.candidates.find((c) => c.entity === "C4")?.features.nearSpelling).toBe(1);
  });

  it("counts a short form found as written as spelled alike", () => {
    const r = sparse.link({ id: "m4", text: "Aldous", type: "PER" });
    expect(r.candidates[0]?.entity).toBe("F1");
    expect(r.candidates[0]?.features.nearSpelling).toBe(0);
  });
});
