/**
 * The commands as library calls on the bundled sample archive (kb-samples/): eval, tune (with its
 * config and report), the KB fingerprint check, span-aligned evaluation, agreement, and the demo.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { agree } from "../src/commands/agree.js";
import { SAMPLES_DIR } from "../src/commands/demo.js";
import { evaluate, readLabeled, warnUnknownGold } from "../src/commands/evaluate.js";
import { index } from "../src/commands/index-table.js";
import { link } from "../src/commands/link.js";
import { tune } from "../src/commands/tune.js";
import type { AlignedEvalReport } from "../src/evaluate/align.js";
import { formatEvalTable } from "../src/evaluate/format.js";
import type { EvalReport } from "../src/evaluate/metrics.js";
import { openKb } from "../src/kb/kb.js";
import { createLinker } from "../src/link/linker.js";
import { InputError } from "../src/util/errors.js";

const dir = mkdtempSync(join(tmpdir(), "hawser-commands-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const kb = join(dir, "gazette.kb");
const gold = join(SAMPLES_DIR, "gazette-gold.jsonl");

beforeAll(async () => {
  await index({ table: join(SAMPLES_DIR, "gazette-entities.csv"), out: kb, progress: false });
});

describe("tune on the sample labeled set", () => {
  it("reports held-out figures not worse than the defaults', deterministically", async () => {
    const a = await tune({ kb, gold, out: join(dir, "a.json"), report: join(dir, "report.html") });
    const b = await tune({ kb, gold, out: join(dir, "b.json") });
    const f = a.result.figures;
    console.log(
      `sample set: link F1 defaults ${f.defaults.linkF1.toFixed(4)}, tuned held-out ${f.heldOut.linkF1.toFixed(4)}, in-sample ${f.inSample.linkF1.toFixed(4)}`,
    );
    expect(f.heldOut.linkF1).toBeGreaterThanOrEqual(f.defaults.linkF1);
    expect(b.config.weights).toEqual(a.config.weights);
    expect([b.config.threshold, b.config.minMargin]).toEqual([a.config.threshold, a.config.minMargin]);
    const written = JSON.parse(readFileSync(join(dir, "a.json"), "utf8"));
    expect(written.format).toBe("hawser-config");
    expect(written.kb.entities).toBe(337);
    const html = readFileSync(join(dir, "report.html"), "utf8");
    expect(html).toMatch(/^<!DOCTYPE html>/i);
    expect(html).not.toMatch(/<script[^>]+src=|<link[^>]+href="http/);
  });

  it("a tuned config changes eval, and is refused for another KB unless forced", async () => {
    const cfg = join(dir, "a.json");
    const tuned = (await evaluate({ kb, gold, config: cfg })) as EvalReport;
    const plain = (await evaluate({ kb, gold })) as EvalReport;
    expect(tuned.overall.linkF1).not.toBe(plain.overall.linkF1);
    const other = join(dir, "other.csv");
    writeFileSync(other, "id,name,type\nX1,Port Quell,town\n");
    const otherKb = join(dir, "other.kb");
    await index({ table: other, out: otherKb, progress: false });
    const mentions = join(SAMPLES_DIR, "gazette-mentions.jsonl");
    await expect(
      link({ kb: otherKb, mentions, config: cfg, out: join(dir, "x.jsonl"), warn: () => {} }),
    ).rejects.toThrow(/tuned on another KB/);
    await expect(
      link({ kb: otherKb, mentions, config: cfg, force: true, out: join(dir, "x.jsonl"), warn: () => {} }),
    ).resolves.toMatchObject({
      mentions: 1238,
    });
  });
});

describe("eval", () => {
  it("measures the samples and aligns predicted spans", async () => {
    const direct = (await evaluate({ kb, gold })) as EvalReport;
    expect(direct.overall.mentions).toBe(1238);
    expect(direct.candidateRecall.atAll).toBeGreaterThan(0.95);
    const predicted = join(dir, "spans-links.jsonl");
    await link({
      kb,
      mentions: join(SAMPLES_DIR, "articles/spans.jsonl"),
      documents: join(SAMPLES_DIR, "articles/documents.jsonl"),
      window: { sentences: 1 },
      out: predicted,
      warn: () => {},
    });
    const strict = (await evaluate({ kb, gold, predicted, spanMatch: "strict" })) as AlignedEvalReport;
    expect(strict.alignment.matched).toBe(1238);
    expect(strict.alignment.unmatchedGold).toBe(0);
    // Shift every predicted span by one character: strict matches none, relaxed matches all.
    const shifted = join(dir, "shifted.jsonl");
    const rows = readFileSync(predicted, "utf8")
      .trim()
      .split("\n")
      .map((l) => JSON.parse(l));
    writeFileSync(
      shifted,
      rows.map((r) => JSON.stringify({ ...r, start: r.start + 1, end: r.end + 1 })).join("\n"),
    );
    const s2 = (await evaluate({ kb, gold, predicted: shifted, spanMatch: "strict" })) as AlignedEvalReport;
    expect(s2.alignment.matched).toBe(0);
    expect(s2.alignment.unmatchedPredicted).toBe(1238);
    // The text report says how the spans matched, as the JSON does.
    const text = formatEvalTable(s2);
    expect(text).toMatch(/gold unmatched\s+1238/);
    expect(text).toMatch(/predicted unmatched\s+1238/);
    expect(text).toContain("end to end");
    const r2 = (await evaluate({ kb, gold, predicted: shifted, spanMatch: "relaxed" })) as AlignedEvalReport;
    expect(r2.alignment.matched).toBe(1238);
  });

  it("refuses --span-match without --predicted, and an empty labeled set", async () => {
    await expect(evaluate({ kb, gold, spanMatch: "strict" })).rejects.toThrow(/needs --predicted/);
    const empty = join(dir, "empty.jsonl");
    writeFileSync(empty, "");
    await expect(evaluate({ kb, gold: empty })).rejects.toBeInstanceOf(InputError);
  });
});

describe("gold ids the KB lacks", () => {
  it("are counted in a warning naming the first and their lines; none for the sample set", async () => {
    const kbFile = openKb(kb);
    try {
      const labeled = await readLabeled(gold);
      const warnings: string[] = [];
      expect(warnUnknownGold(kbFile, labeled, gold, (m) => warnings.push(m))).toBe(0);
      expect(warnings).toEqual([]);
      const first = labeled.find((m) => m.gold !== null)!;
      const renamed = labeled.map((m) => (m === first ? { ...m, gold: "X-renamed" } : m));
      expect(warnUnknownGold(kbFile, renamed, "g.jsonl", (m) => warnings.push(m))).toBe(1);
      expect(warnings[0]).toContain(
        `g.jsonl: 1 of 1238 gold ids are not in the KB ("X-renamed" on line ${first.source!.line})`,
      );
    } finally {
      kbFile.close();
    }
  });
});

describe("link rows", () => {
  it("return the linked entity's attributes (the table's other columns), none for NIL", () => {
    const k = openKb(kb);
    try {
      const linker = createLinker(k);
      // kb-samples/gazette-entities.csv: T0002 Stenmouth, river Sten, county Ambry Vale.
      const row = linker.link({ id: "a", text: "Stenmouth", type: "LOC" });
      expect(row.entity).toBe("T0002");
      expect(row.attributes).toEqual({ river: "Sten", county: "Ambry Vale" });
      const nil = linker.link({ id: "b", text: "Quorley Xandervane", type: "PER" });
      expect(nil.entity).toBeNull();
      expect(nil.attributes).toBeUndefined();
    } finally {
      k.close();
    }
  });
});

describe("agree", () => {
  it("counts agreement between two labelers and lists the disagreements", async () => {
    const lines = readFileSync(gold, "utf8")
      .trim()
      .split("\n")
      .slice(0, 100)
      .map((l) => JSON.parse(l));
    const a = join(dir, "a.jsonl");
    const b = join(dir, "b.jsonl");
    writeFileSync(a, lines.map((l) => JSON.stringify(l)).join("\n"));
    // Labeler B calls the first ten linked mentions NIL.
    let changed = 0;
    const other = lines.map((l) => {
      if (l.gold === null || changed >= 10) return l;
      changed++;
      return { ...l, gold: null };
    });
    writeFileSync(b, other.map((l) => JSON.stringify(l)).join("\n"));
    const out = join(dir, "disagreements.jsonl");
    const r = await agree({ a, b, out });
    expect(r.n).toBe(100);
    expect(r.observed).toBeCloseTo(0.9, 12);
    expect(r.disagreements).toHaveLength(10);
    expect(readFileSync(out, "utf8").trim().split("\n")).toHaveLength(10);
    expect(r.kappa).toBeLessThan(r.observed);
  });
});
