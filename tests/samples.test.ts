import { execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { parse } from "csv-parse/sync";
import { afterAll, describe, expect, it } from "vitest";

// Checks of the bundled demo data in kb-samples/ (written by scripts/make-samples.mjs).
// The thresholds are the ones the demo data was specified with, not outside facts.

const ROOT = join(import.meta.dirname, "..");
const SAMPLES = join(ROOT, "kb-samples");
const read = (file: string): string => readFileSync(join(SAMPLES, file), "utf8");
const jsonl = <T>(file: string): T[] =>
  read(file)
    .split("\n")
    .filter((line) => line !== "")
    .map((line) => JSON.parse(line) as T);

interface Doc {
  id: string;
  date: string;
  title: string;
  text: string;
}
interface Span {
  id: string;
  doc: string;
  start: number;
  end: number;
  label: string;
  text: string;
}
interface Gold extends Omit<Span, "label"> {
  type: string;
  context: string;
  gold: string | null;
}

/** The reserved columns of a table row (attribute columns are not checked here). */
interface TableRow {
  id: string;
  name: string;
  type: string;
  aliases: string;
}

const table = parse(read("gazette-entities.csv"), { columns: true }) as TableRow[];
const docs = jsonl<Doc>("articles/documents.jsonl");
const spans = jsonl<Span>("articles/spans.jsonl");
const gold = jsonl<Gold>("gazette-gold.jsonl");
const ids = new Set(table.map((row) => row.id));

describe("kb-samples", () => {
  it("has a table of at least 300 entities with unique ids", () => {
    expect(table.length).toBeGreaterThanOrEqual(300);
    expect(ids.size).toBe(table.length);
    const types = new Set(table.map((row) => row.type));
    for (const type of ["person", "firm", "town", "vessel"]) expect(types).toContain(type);
  });

  it("has at least 500 mentions, one gold row per span in the same order", () => {
    expect(spans.length).toBeGreaterThanOrEqual(500);
    expect(gold.map((g) => g.id)).toEqual(spans.map((s) => s.id));
    expect(gold.map((g) => g.type)).toEqual(spans.map((s) => s.label));
  });

  it("keeps the NIL share between 15% and 25%", () => {
    const share = gold.filter((g) => g.gold === null).length / gold.length;
    expect(share).toBeGreaterThanOrEqual(0.15);
    expect(share).toBeLessThanOrEqual(0.25);
  });

  it("links only to ids that exist in the table", () => {
    const missing = gold.filter((g) => g.gold !== null && !ids.has(g.gold));
    expect(missing).toEqual([]);
  });

  it("has span texts equal to the document slices", () => {
    const byId = new Map(docs.map((d) => [d.id, d]));
    for (const span of spans) {
      const doc = byId.get(span.doc);
      expect(doc, span.id).toBeDefined();
      expect(doc!.text.slice(span.start, span.end), span.id).toBe(span.text);
    }
  });

  it("has one B- tag in the CoNLL file per span", () => {
    const lines = read("articles/gazette.conll").split("\n");
    const begins = lines.filter((line) => /\tB-[A-Z]+$/.test(line)).length;
    expect(begins).toBe(spans.length);
    expect(lines.filter((line) => line.startsWith("-DOCSTART- ")).length).toBe(docs.length);
  });

  it("has the mention files equal to the gold rows without gold", () => {
    const mentions = jsonl<Record<string, unknown>>("gazette-mentions.jsonl");
    expect(mentions).toEqual(gold.map(({ gold: _, ...rest }) => rest));
    const csv = parse(read("gazette-mentions.csv"), { columns: true }) as Record<string, string>[];
    expect(csv.map((row) => [row.id, row.text, row.context])).toEqual(
      gold.map((g) => [g.id, g.text, g.context]),
    );
  });

  it("contains the deliberate look-alikes", () => {
    const names = table.map((row) => row.name);
    expect(table.filter((row) => row.type === "person" && row.name.endsWith(" Aldous")).length).toBe(2);
    for (const name of ["Stenmouth", "Stenmoor", "Carrowby", "Carrowby Rope Works Ltd.", "S.S. Carrowby"]) {
      expect(names).toContain(name);
    }
    expect(names).toContain("Josiah Pell Sr.");
    expect(names).toContain("Josiah Pell Jr.");
    const exchange = table.find((row) => row.name === "Stenning Grain Exchange");
    expect(exchange?.aliases.split("|")).toContain("S.G.E.");
    expect(names).not.toContain("Stenford");
    expect(gold.some((g) => g.text === "Stenford" && g.gold === null)).toBe(true);
  });

  describe("generator", () => {
    const out = mkdtempSync(join(tmpdir(), "hawser-samples-"));
    afterAll(() => rmSync(out, { recursive: true, force: true }));

    it("rewrites byte-identical files", () => {
      execFileSync(process.execPath, [join(ROOT, "scripts", "make-samples.mjs"), "--out", out, "--quiet"]);
      const files = [
        "gazette-entities.csv",
        "gazette-gold.jsonl",
        "gazette-mentions.jsonl",
        "gazette-mentions.csv",
      ];
      const articles = readdirSync(join(out, "articles")).map((f) => join("articles", f));
      for (const file of [...files, ...articles]) {
        expect(readFileSync(join(out, file), "utf8"), file).toBe(read(file));
      }
    });
  });
});
