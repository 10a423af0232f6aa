import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { parse } from "csv-parse/sync";
import { afterAll, describe, expect, it } from "vitest";
import { generate, MENTIONS_FILE, TABLE_FILE } from "../benchmarks/generate.js";
import { OCR_CONFUSIONS, ocrConfusion } from "../benchmarks/gen/noise.js";
import { mixSeed, Rng } from "../benchmarks/gen/prng.js";
import { CompletenessCounter, evenSample, QualityCounter } from "../benchmarks/measure.js";
import { buildSimple, SimpleLinker } from "../benchmarks/simple-baseline.js";
import type { LabeledMention } from "../src/types.js";

/** Small sizes keep the test fast on a shared 2-core machine. */
const ENTITIES = 3000;
const MENTIONS = 2000;

const dirs: string[] = [];
function freshDir(): string {
  const dir = mkdtempSync(join(tmpdir(), "hawser-bench-gen-"));
  dirs.push(dir);
  return dir;
}
afterAll(() => {
  for (const dir of dirs) rmSync(dir, { recursive: true, force: true });
});

function run(seed: number): string {
  const out = freshDir();
  generate({ entities: ENTITIES, mentions: MENTIONS, seed, out });
  return out;
}

function readMentions(dir: string): LabeledMention[] {
  return readFileSync(join(dir, MENTIONS_FILE), "utf8")
    .trim()
    .split("\n")
    .map((line) => JSON.parse(line) as LabeledMention);
}

describe("benchmark generator", () => {
  const a = run(7);
  const b = run(7);
  const c = run(8);

  it("writes identical bytes for the same seed and sizes", () => {
    for (const file of [TABLE_FILE, MENTIONS_FILE]) {
      expect(readFileSync(join(a, file)).equals(readFileSync(join(b, file)))).toBe(true);
    }
  });

  it("writes different data for another seed", () => {
    expect(readFileSync(join(a, TABLE_FILE)).equals(readFileSync(join(c, TABLE_FILE)))).toBe(false);
  });

  it("writes a parseable table with the documented columns and unique ids", () => {
    const rows = parse(readFileSync(join(a, TABLE_FILE), "utf8"), { columns: true }) as Record<
      string,
      string
    >[];
    expect(rows).toHaveLength(ENTITIES);
    expect(Object.keys(rows[0] ?? {})).toEqual(["id", "name", "type", "aliases", "description", "prior"]);
    expect(new Set(rows.map((r) => r.id)).size).toBe(ENTITIES);
    for (const row of rows) {
      expect(["person", "firm", "town", "vessel"]).toContain(row.type);
      expect(Number(row.prior)).toBeGreaterThanOrEqual(0);
      expect(row.name?.length).toBeGreaterThan(0);
    }
    // Persons with a middle initial carry the "Last, First" alias, which needs CSV quoting.
    expect(rows.some((r) => r.type === "person" && r.aliases?.includes(", "))).toBe(true);
  });

  it("makes about 20% of mentions NIL and every gold id exists in the table", () => {
    const rows = parse(readFileSync(join(a, TABLE_FILE), "utf8"), { columns: true }) as Record<
      string,
      string
    >[];
    const ids = new Set(rows.map((r) => r.id));
    const names = new Set(rows.map((r) => r.name?.toLowerCase()));
    const mentions = readMentions(a);
    expect(mentions).toHaveLength(MENTIONS);
    const nil = mentions.filter((m) => m.gold === null);
    // Binomial(2000, 0.2) has a standard deviation of about 0.9 points; 3 points is > 3 sigma.
    expect(nil.length / MENTIONS).toBeGreaterThan(0.17);
    expect(nil.length / MENTIONS).toBeLessThan(0.23);
    for (const m of mentions) {
      if (m.gold !== null) expect(ids.has(m.gold)).toBe(true);
      expect(["PER", "ORG", "LOC", "MISC"]).toContain(m.type);
      expect(m.text.length).toBeGreaterThan(0);
      expect(m.context?.length).toBeGreaterThan(0);
    }
    // A NIL mention printed without noise is never a canonical table name.
    const cleanNilHits = nil.filter((m) => names.has(m.text.toLowerCase()));
    expect(cleanNilHits.length).toBeLessThan(nil.length * 0.05);
  });

  it("adds noise: many mention texts differ from every table name", () => {
    const rows = parse(readFileSync(join(a, TABLE_FILE), "utf8"), { columns: true }) as Record<
      string,
      string
    >[];
    const byId = new Map(rows.map((r) => [r.id, r]));
    const linked = readMentions(a).filter((m) => m.gold !== null);
    const exact = linked.filter((m) => byId.get(m.gold as string)?.name === m.text).length;
    expect(exact / linked.length).toBeGreaterThan(0.1);
    expect(exact / linked.length).toBeLessThan(0.6);
  });

  it("applies OCR confusions from the documented table", () => {
    const rng = new Rng(mixSeed(1));
    // The invented name "Tamor" admits exactly two confusions of the table: m->rn and o->0.
    for (let i = 0; i < 20; i++) {
      expect(["Tarnor", "Tam0r"]).toContain(ocrConfusion("Tamor", rng));
    }
    expect(OCR_CONFUSIONS).toContainEqual(["rn", "m"]);
    // Only one substitution per call: the length changes by at most one character.
    for (let i = 0; i < 50; i++) {
      const out = ocrConfusion("Quarelby & Sons", rng);
      expect(Math.abs(out.length - "Quarelby & Sons".length)).toBeLessThanOrEqual(1);
      expect(out).not.toBe("Quarelby & Sons");
    }
  });
});

describe("benchmark measures", () => {
  it("counts precision, recall and F1 of link decisions, NIL decisions not being links", () => {
    const q = new QualityCounter();
    q.add("a", { entity: "a" }); // right link
    q.add("b", { entity: "c" }); // wrong link
    q.add("d", { entity: null }); // missed link
    q.add(null, { entity: null }); // right NIL
    q.add(null, { entity: "e" }); // false link
    const r = q.result();
    // 1 right of 3 predicted links, 1 right of 3 gold links.
    expect(r.precision).toBeCloseTo(1 / 3, 4);
    expect(r.recall).toBeCloseTo(1 / 3, 4);
    expect(r.f1).toBeCloseTo(1 / 3, 4);
    expect(r.accuracy).toBeCloseTo(2 / 5, 4);
  });

  it("measures pairs completeness over non-NIL mentions only", () => {
    const c = new CompletenessCounter();
    c.add("a", ["x", "a"]);
    c.add("b", ["x"]);
    c.add(null, ["y", "z", "w"]);
    expect(c.completeness()).toBe(0.5);
    expect(c.nonNil()).toBe(2);
    expect(c.candidatesPerMention()).toBe(2);
  });

  it("samples evenly and never more than there is", () => {
    expect(evenSample(10, 5)).toEqual([0, 2, 4, 6, 8]);
    expect(evenSample(3, 10)).toEqual([0, 1, 2]);
  });
});

describe("the benchmark's simple baseline (folded exact name over SQLite)", () => {
  it("links a folded exact name or alias to its most popular row, first in table order on a tie, else NIL", async () => {
    const dir = freshDir();
    const table = join(dir, "table.csv");
    writeFileSync(
      table,
      [
        "id,name,type,aliases,description,prior",
        "t1,Stenmouth,town,Stenmth.|Port Stenmouth,,40",
        "t2,Stenmouth,town,,,900",
        "t3,Gréyweld,town,,,",
        "t4,Greyweld,village,,,",
        "f1,Pell & Sons,firm,Pell Brothers,,3",
      ].join("\n"),
    );
    const built = await buildSimple(table, join(dir, "simple.sqlite"));
    expect(built.entities).toBe(5);
    expect(built.names).toBe(8); // 3 + 1 + 1 + 1 + 2: "Stenmth." folds to "stenmth", a key of its own
    const linker = new SimpleLinker(join(dir, "simple.sqlite"));
    try {
      expect(linker.link("STENMOUTH")).toBe("t2"); // the more popular namesake
      expect(linker.link("Port Stenmouth")).toBe("t1");
      expect(linker.link("Greyweld")).toBe("t3"); // diacritics folded; tie on prior: table order
      expect(linker.link("pell and sons")).toBe("f1"); // & folds to "and"
      expect(linker.link("Stenmoth")).toBeNull(); // no fuzzy matching
      expect(linker.link("")).toBeNull();
    } finally {
      linker.close();
    }
  });
});
