/**
 * buildKb and openKb: a good table builds a KB whose facts can be read back; every bad table is an
 * InputError naming file, line and column; a failed build leaves nothing behind; files that are not
 * (current) hawser KBs are refused with a clear message. All tables are invented.
 */
import { copyFileSync, existsSync, readdirSync, readFileSync } from "node:fs";
import Database from "better-sqlite3";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { buildKb } from "../src/kb/build.js";
import { openKb } from "../src/kb/kb.js";
import { SCHEMA_VERSION } from "../src/kb/schema.js";
import { InputError, UsageError } from "../src/util/errors.js";
import { rejectsNaming, throwsInput } from "./helpers/errors.js";
import { GAZETTE_CSV, GAZETTE_ROWS, jsonl, tempDir, writeText } from "./helpers/gazette.js";

let t: ReturnType<typeof tempDir>;
beforeEach(() => {
  t = tempDir("hawser-kb-");
});
afterEach(() => t.cleanup());

const HEADER = "id,name,type,aliases,description,prior";
/** A CSV table: the header plus the given data lines. */
const csv = (...rows: string[]) => [HEADER, ...rows, ""].join("\n");

describe("buildKb on a good table", () => {
  it("counts entities, names and classes, and records them in the KB's meta", async () => {
    const table = writeText(t.file("gazette.csv"), GAZETTE_CSV);
    const s = await buildKb({ table, out: t.file("gazette.kb") });
    expect(s.entities).toBe(GAZETTE_ROWS);
    // 20 canonical names + 10 aliases written in the table's aliases column.
    expect(s.aliases).toBe(30);
    expect(s.byClass).toEqual({ person: 7, location: 6, organization: 6, other: 1 });
    expect(s.unknownTypes).toEqual({});
    expect(s.fingerprint).toMatch(/^[0-9a-f]{32}$/);

    const kb = openKb(t.file("gazette.kb"));
    try {
      expect(kb.info.format).toBe("hawser-kb");
      expect(kb.info.schemaVersion).toBe(SCHEMA_VERSION);
      expect(kb.info.fingerprint).toBe(s.fingerprint);
      expect(kb.info.entities).toBe(GAZETTE_ROWS);
      expect(kb.info.aliases).toBe(30);
      expect(kb.info.byClass).toEqual(s.byClass);
      expect(kb.info.sourceFile).toBe("gazette.csv");
      expect(kb.info.maxPrior).toBe(12000);
      // Attributes (the extra `port` column) come back with the entity row and in its details,
      // with the description; the aliases with the entity.
      const eid = kb.eidOf("P05");
      expect(eid).toBeDefined();
      const e = kb.entity(eid!);
      expect(e.name).toBe("Ezra Quillon Marsh");
      expect(e.attributes).toEqual({ port: "Fort Carrow" });
      expect(kb.details(eid!)).toEqual({
        description: "wharfinger at the coal staithes",
        attributes: { port: "Fort Carrow" },
      });
      expect(e.aliases.map((a) => a.text)).toEqual(["Ezra Quillon Marsh", "Quillon Marsh"]);
    } finally {
      kb.close();
    }
  });

  it("gives two builds of the same file the same fingerprint, and a changed file another", async () => {
    const table = writeText(t.file("gazette.csv"), GAZETTE_CSV);
    const a = await buildKb({ table, out: t.file("a.kb") });
    const b = await buildKb({ table, out: t.file("b.kb") });
    expect(a.fingerprint).toBe(b.fingerprint);
    const ia = openKb(t.file("a.kb"));
    const ib = openKb(t.file("b.kb"));
    expect(ia.info.fingerprint).toBe(ib.info.fingerprint);
    ia.close();
    ib.close();
    writeText(table, GAZETTE_CSV.replace("Stenmoor,village", "Stenmoor,town"));
    const c = await buildKb({ table, out: t.file("c.kb") });
    expect(c.fingerprint).not.toBe(a.fingerprint);
  });

  it("reads TSV and JSONL tables (JSONL aliases as an array, TSV aliases |-separated)", async () => {
    const tsv = writeText(
      t.file("towns.tsv"),
      "id\tname\ttype\taliases\tprior\nL1\tFort Carrow\ttown\tFt. Carrow|Carrow\t4000\nL2\tStenmoor\tvillage\t\t800\n",
    );
    const s1 = await buildKb({ table: tsv, out: t.file("tsv.kb") });
    expect(s1.entities).toBe(2);
    expect(s1.aliases).toBe(4);
    expect(s1.byClass).toEqual({ location: 2 });

    const table = writeText(
      t.file("people.jsonl"),
      jsonl([
        { id: "P1", name: "Josiah Hale Aldous", type: "person", aliases: ["Capt. Aldous"], prior: 3 },
        { id: "P2", name: "Wenna Belle", type: "vessel", description: "steam packet", tonnage: 212 },
      ]),
    );
    const s2 = await buildKb({ table, out: t.file("jsonl.kb") });
    expect(s2.entities).toBe(2);
    expect(s2.aliases).toBe(3);
    expect(s2.byClass).toEqual({ person: 1, other: 1 });
    const kb = openKb(t.file("jsonl.kb"));
    expect(kb.details(kb.eidOf("P2")!).attributes).toEqual({ tonnage: "212" });
    kb.close();
  });

  it("reports table types the label map does not know, indexed as class other", async () => {
    const table = writeText(t.file("t.csv"), csv("X1,Carrow Weir,sluice,,,"));
    const s = await buildKb({ table, out: t.file("t.kb") });
    expect(s.unknownTypes).toEqual({ sluice: 1 });
    expect(s.byClass).toEqual({ other: 1 });
  });

  it("warns of an attribute column that looks like an optional column the table leaves empty", async () => {
    const table = writeText(
      t.file("towns.csv"),
      "id,name,type,population,synonyms\nT1,Harrowmouth,town,48210,Harrow Mouth\nT2,Stenmouth,town,6240,\n",
    );
    const s = await buildKb({ table, out: t.file("towns.kb") });
    expect(s.columnWarnings).toHaveLength(2);
    expect(s.columnWarnings.join(" ")).toMatch(/"synonyms".*"aliases"/);
    expect(s.columnWarnings.join(" ")).toMatch(/"population".*"prior"/);
    // The gazette fills its aliases, prior and description: nothing to say.
    const gazette = await buildKb({ table: writeText(t.file("g.csv"), GAZETTE_CSV), out: t.file("g.kb") });
    expect(gazette.columnWarnings).toEqual([]);
  });
});

describe("buildKb validation: each error names file, line and column", () => {
  const build = (table: string) => buildKb({ table, out: t.file("out.kb") });

  for (const column of ["id", "name", "type"]) {
    it(`rejects a header without a ${column} column (line 1)`, async () => {
      const header = HEADER.split(",").filter((c) => c !== column);
      const table = writeText(t.file("h.csv"), `${header.join(",")}\n${header.map(() => "x").join(",")}\n`);
      await rejectsNaming(build(table), { file: table, line: 1, field: column });
    });
  }

  it("says a header read as one column looks separated by another character", async () => {
    const table = writeText(t.file("semi.csv"), "id;name;type\nP1;Ezra Marsh;person\n");
    await expect(build(table)).rejects.toThrow(/semi\.csv:1: .*looks separated by ";"/);
    const plain = writeText(t.file("plain.csv"), "ident,name,type\nP1,Ezra Marsh,person\n");
    await expect(build(plain)).rejects.not.toThrow(/looks separated/); // several columns: no guess
  });

  it("rejects a row with an empty id, name or type, naming the row's line", async () => {
    const good = "P1,Ezra Marsh,person,,,";
    const cases: Array<[string, string]> = [
      [",Jonas Aldous,person,,,", "id"],
      ["P2,,person,,,", "name"],
      ["P2,Jonas Aldous,,,,", "type"],
      ["P2,   ,person,,,", "name"], // blank is empty once trimmed
    ];
    for (const [row, field] of cases) {
      const table = writeText(t.file("e.csv"), csv(good, good.replace("P1", "P0"), row));
      await rejectsNaming(build(table), { file: table, line: 4, field });
    }
  });

  it("rejects a duplicate id at the line of the second occurrence", async () => {
    const table = writeText(
      t.file("d.csv"),
      csv(
        "L1,Stenmouth,town,,,",
        "L2,Stenmoor,village,,,",
        "L3,Fort Carrow,town,,,",
        "L2,Saint Wenna,town,,,",
      ),
    );
    const e = await rejectsNaming(build(table), { file: table, line: 5, field: "id" });
    expect(e.message).toContain('"L2"');
  });

  it("counts physical lines when a quoted field spans lines", async () => {
    const table = writeText(
      t.file("q.csv"),
      csv('L1,Stenmouth,town,,"river port,\nat the mouth of the Sten",', "L1,Stenmoor,village,,,"),
    );
    // Header line 1, the first record lines 2-3, the duplicate on line 4.
    await rejectsNaming(build(table), { file: table, line: 4, field: "id" });
  });

  it("rejects a non-numeric and a negative prior", async () => {
    const bad = writeText(t.file("p.csv"), csv("L1,Stenmouth,town,,,12000", "L2,Stenmoor,village,,,many"));
    const e1 = await rejectsNaming(build(bad), { file: bad, line: 3, field: "prior" });
    expect(e1.message).toContain("many");
    const neg = writeText(t.file("n.csv"), csv("L1,Stenmouth,town,,,-5"));
    const e2 = await rejectsNaming(build(neg), { file: neg, line: 2, field: "prior" });
    expect(e2.message).toContain(">= 0");
  });

  it("reads a prior as a decimal number only, and refuses a name with nothing to link it by", async () => {
    for (const [prior, ok] of [
      ["1e3", true],
      [" 7 ", true],
      ["0x10", false],
      ["Infinity", false],
      ["NaN", false],
    ] as const) {
      const table = writeText(t.file(`pr${ok}.csv`), csv(`L1,Stenmouth,town,,,${prior}`));
      if (ok) expect((await build(table)).entities, prior).toBe(1);
      else await rejectsNaming(build(table), { file: table, line: 2, field: "prior" });
    }
    const array = writeText(
      t.file("pa.jsonl"),
      `${JSON.stringify({ id: "L1", name: "Stenmouth", type: "town", prior: [5] })}\n`,
    );
    await rejectsNaming(build(array), { file: array, line: 1, field: "prior" });
    const marks = writeText(t.file("nm.csv"), csv("L1,Stenmouth,town,,,", "L2,!!!,town,,,"));
    const e = await rejectsNaming(build(marks), { file: marks, line: 3, field: "name" });
    expect(e.message).toContain("no letter or digit");
  });

  it("rejects a CSV row with the wrong number of fields (no single column to name)", async () => {
    const table = writeText(t.file("f.csv"), csv("L1,Stenmouth,town,,,", "L2,Stenmoor,village,,,,surplus"));
    const e = await rejectsNaming(build(table), { file: table, line: 3 });
    expect(e.message).toMatch(/number of fields/);
  });

  it("rejects a stray quote inside a CSV field, and a folder given as the table", async () => {
    const table = writeText(t.file("q.csv"), csv("L1,Stenmouth,town,,,", 'L2,Sten"moor,village,,,'));
    const e = await rejectsNaming(build(table), { file: table, line: 3 });
    expect(e.message).toMatch(/Invalid Opening Quote/);
    const folder = await buildKb({ table: t.dir, out: t.file("folder.kb"), from: "csv" }).catch((x) => x);
    expect(folder).toBeInstanceOf(InputError);
    expect((folder as Error).message).toContain("EISDIR");
  });

  it("is a UsageError without a table or an output file (library callers)", async () => {
    const noOut = await buildKb({ table: t.file("x.csv") } as never).catch((x) => x);
    expect(noOut).toBeInstanceOf(UsageError);
    expect((noOut as Error).message).toContain("needs out");
  });

  it("rejects a malformed JSON line in a JSONL table", async () => {
    const table = writeText(
      t.file("m.jsonl"),
      `${JSON.stringify({ id: "L1", name: "Stenmouth", type: "town" })}\n{"id": "L2", "name": Stenmoor}\n`,
    );
    const e = await rejectsNaming(build(table), { file: table, line: 2 });
    expect(e.message).toMatch(/malformed JSON/);
  });

  it("rejects JSONL aliases that are not an array of strings", async () => {
    const row = (aliases: unknown) =>
      jsonl([
        { id: "O1", name: "Pell & Sons Ltd.", type: "firm", aliases: ["Pell and Sons"] },
        { id: "O2", name: "Carrow Lime Works", type: "firm", aliases },
      ]);
    const a = writeText(t.file("a.jsonl"), row(["Carrow Lime", 7]));
    await rejectsNaming(build(a), { file: a, line: 2, field: "aliases[1]" });
    const b = writeText(t.file("b.jsonl"), row({ short: "Carrow Lime" }));
    await rejectsNaming(build(b), { file: b, line: 2, field: "aliases" });
  });

  it("rejects invalid UTF-8 bytes, naming their line", async () => {
    const head = Buffer.from(csv("L1,Stenmouth,town,,,"));
    const bad = Buffer.from([
      0x4c, 0x32, 0x2c, 0x53, 0x74, 0xff, 0x6e, 0x2c, 0x74, 0x6f, 0x77, 0x6e, 0x2c, 0x2c, 0x2c, 0x0a,
    ]);
    const table = writeText(t.file("u.csv"), Buffer.concat([head, bad]));
    const e = await rejectsNaming(build(table), { file: table, line: 3 });
    expect(e.message).toMatch(/UTF-8/);
    const jl = writeText(
      t.file("u.jsonl"),
      Buffer.concat([
        Buffer.from('{"id":"L1","name":"Sten'),
        Buffer.from([0xc3, 0x28]),
        Buffer.from('","type":"town"}\n'),
      ]),
    );
    await rejectsNaming(build(jl), { file: jl, line: 1 });
  });

  it("rejects an empty file and a header-only file", async () => {
    const empty = writeText(t.file("empty.csv"), "");
    const e1 = await rejectsNaming(build(empty), { file: empty });
    expect(e1.message).toMatch(/no rows/);
    const headerOnly = writeText(t.file("header.csv"), `${HEADER}\n`);
    await rejectsNaming(build(headerOnly), { file: headerOnly });
    const emptyJsonl = writeText(t.file("empty.jsonl"), "\n\n");
    await rejectsNaming(build(emptyJsonl), { file: emptyJsonl });
  });

  it("names a table that does not exist", async () => {
    await rejectsNaming(build(t.file("missing.csv")), { file: t.file("missing.csv") });
  });
});

describe("buildKb is atomic", () => {
  it("leaves neither a KB nor a temporary file after a failed build", async () => {
    // The error is on the last row, after every other row was written to the temporary database.
    const rows = Array.from({ length: 50 }, (_, i) => `L${i},Reach ${i},place,,,`);
    const table = writeText(t.file("bad.csv"), csv(...rows, "L7,Duplicate Reach,place,,,"));
    await expect(buildKb({ table, out: t.file("out.kb") })).rejects.toBeInstanceOf(InputError);
    expect(readdirSync(t.dir)).toEqual(["bad.csv"]);
  });

  it("leaves an existing KB untouched when a rebuild fails", async () => {
    const good = writeText(t.file("gazette.csv"), GAZETTE_CSV);
    const out = t.file("gazette.kb");
    await buildKb({ table: good, out });
    const before = readFileSync(out);
    const bad = writeText(t.file("bad.csv"), csv("L1,Stenmouth,town,,,", "L1,Stenmoor,village,,,"));
    await expect(buildKb({ table: bad, out })).rejects.toBeInstanceOf(InputError);
    expect(readFileSync(out).equals(before)).toBe(true);
    expect(readdirSync(t.dir).sort()).toEqual(["bad.csv", "gazette.csv", "gazette.kb"]);
    const kb = openKb(out);
    expect(kb.info.entities).toBe(GAZETTE_ROWS);
    kb.close();
  });
});

describe("openKb refuses files that are not current hawser KBs", () => {
  it("names a missing file", () => {
    const e = throwsInput(() => openKb(t.file("none.kb")));
    expect(e.file).toBe(t.file("none.kb"));
    expect(e.message).toMatch(/no such KB file/);
  });

  it("refuses a file that is not SQLite", () => {
    const file = writeText(t.file("notes.kb"), "Stenmouth harbour dues, 1903\n".repeat(200));
    const e = throwsInput(() => openKb(file));
    expect(e.file).toBe(file);
    expect(e.message).toMatch(/not a hawser KB/);
  });

  it("refuses a SQLite file that is not a hawser KB", () => {
    const file = t.file("other.sqlite");
    const db = new Database(file);
    db.exec("CREATE TABLE ledger (ship TEXT, dues REAL); INSERT INTO ledger VALUES ('Wenna Belle', 3.5)");
    db.close();
    const e = throwsInput(() => openKb(file));
    expect(e.message).toMatch(/not a hawser KB/);
    // A meta table without our format tag is refused too.
    const file2 = t.file("other2.sqlite");
    const db2 = new Database(file2);
    db2.exec("CREATE TABLE meta (key TEXT, value TEXT); INSERT INTO meta VALUES ('format', 'ledger')");
    db2.close();
    expect(throwsInput(() => openKb(file2)).message).toMatch(/not a hawser KB/);
  });

  it("refuses a KB whose schema version is newer than this code reads", async () => {
    const table = writeText(t.file("gazette.csv"), GAZETTE_CSV);
    await buildKb({ table, out: t.file("gazette.kb") });
    const copy = t.file("future.kb");
    copyFileSync(t.file("gazette.kb"), copy);
    const db = new Database(copy);
    db.prepare("UPDATE meta SET value='99' WHERE key='schema_version'").run();
    db.close();
    const e = throwsInput(() => openKb(copy));
    expect(e.file).toBe(copy);
    expect(e.message).toMatch(/schema version 99/);
    expect(e.message).toMatch(/upgrade/);
    // The original is still fine.
    expect(existsSync(t.file("gazette.kb"))).toBe(true);
    openKb(t.file("gazette.kb")).close();
  });
  it("refuses a KB built with an older schema, asking for a rebuild", async () => {
    const table = writeText(t.file("gazette.csv"), GAZETTE_CSV);
    await buildKb({ table, out: t.file("gazette.kb") });
    const copy = t.file("past.kb");
    copyFileSync(t.file("gazette.kb"), copy);
    const db = new Database(copy);
    db.prepare("UPDATE meta SET value='1' WHERE key='schema_version'").run();
    db.close();
    const e = throwsInput(() => openKb(copy));
    expect(e.file).toBe(copy);
    expect(e.message).toMatch(/schema version 1 is older/);
    expect(e.message).toMatch(/rebuild it with `hawser index`/);
  });
});
