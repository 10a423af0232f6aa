import * as fs from "node:fs";
import * as os from "node:os";
import * as path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { readJsonLines } from "../src/read/jsonl.js";
import { readMentionsCsv } from "../src/read/mentions-csv.js";
import { readMentionsJsonl } from "../src/read/mentions-jsonl.js";
import { readMentions, resolveFormat } from "../src/read/index.js";
import { InputError, UsageError } from "../src/util/errors.js";
import { collect, failure } from "./helpers/streams.js";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "hawser-read-mentions-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

let counter = 0;
function fixture(ext: string, content: string | Buffer): string {
  counter++;
  const file = path.join(dir, `f${counter}${ext}`);
  fs.writeFileSync(file, content);
  return file;
}

const jsonl = (rows: unknown[]): string => rows.map((r) => JSON.stringify(r)).join("\n") + "\n";

describe("readJsonLines", () => {
  it("skips blank lines, keeps physical line numbers and strips a BOM", async () => {
    const file = fixture(".jsonl", '\ufeff{"a":1}\n\n   \n{"a":2}\r\n{"a":3}');
    const lines = await collect(readJsonLines(file));
    expect(lines).toEqual([
      { line: 1, value: { a: 1 } },
      { line: 4, value: { a: 2 } },
      { line: 5, value: { a: 3 } },
    ]);
  });

  it("rejects malformed JSON naming file and line", async () => {
    const file = fixture(".jsonl", '{"a":1}\n{"a":\n');
    const error = await failure(readJsonLines(file));
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).line).toBe(2);
    expect(error.message).toContain(`${file}:2:`);
    expect(error.message).toContain("malformed JSON");
  });

  it("rejects a value that is not an object", async () => {
    const file = fixture(".jsonl", '{"a":1}\n[1,2]\n');
    const error = await failure(readJsonLines(file));
    expect(error.message).toMatch(/:2: expected a JSON object, found an array/);
  });

  it("rejects invalid UTF-8 bytes naming the line instead of replacing them", async () => {
    const bad = Buffer.concat([
      Buffer.from('{"text":"Harlow Quay"}\n{"text":"ok"}\n{"text":"Ferr'),
      Buffer.from([0xc3, 0x28]), // 0xC3 must be followed by a continuation byte (0x80-0xBF)
      Buffer.from('y"}\n'),
    ]);
    const error = await failure(readJsonLines(fixture(".jsonl", bad)));
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).line).toBe(3);
    expect(error.message).toContain("invalid UTF-8");
  });

  it("finds the bad line across read chunks and decodes multi-byte text split between chunks", async () => {
    // Each line is about 60 KB of two-byte characters, so the 64 KB read chunks cut through
    // characters and lines; the decoder must reassemble them and still count lines.
    const long = "ø".repeat(30_000);
    const good = `${JSON.stringify({ text: long })}\n`.repeat(3);
    const file = fixture(".jsonl", good);
    const lines = await collect(readJsonLines(file));
    expect(lines.map((l) => l.line)).toEqual([1, 2, 3]);
    expect((lines[2]!.value as { text: string }).text).toBe(long);

    const bad = Buffer.concat([
      Buffer.from(good),
      Buffer.from('{"text":"'),
      Buffer.from([0xff]),
      Buffer.from('"}\n'),
    ]);
    const error = await failure(readJsonLines(fixture(".jsonl", bad)));
    expect((error as InputError).line).toBe(4);
  });

  it("reports a missing file as an InputError naming it", async () => {
    const missing = path.join(dir, "nope.jsonl");
    const error = await failure(readJsonLines(missing));
    expect(error).toBeInstanceOf(InputError);
    expect(error.message).toContain(missing);
  });
});

describe("readMentionsJsonl", () => {
  it("reads fields, generates ids from the line number and keeps extra fields", async () => {
    const file = fixture(
      ".jsonl",
      jsonl([
        {
          id: "g1",
          text: "Capt. Orrin Vell",
          type: "PER",
          context: "arrived at Harlow Quay",
          doc: "d1",
          start: 4,
          end: 20,
        },
        { text: "Brannock & Tull", type: "ORG", page: 3, gold: "E17" },
      ]),
    );
    const mentions = await collect(readMentionsJsonl(file));
    expect(mentions).toHaveLength(2);
    expect(mentions[0]).toMatchObject({
      id: "g1",
      text: "Capt. Orrin Vell",
      type: "PER",
      context: "arrived at Harlow Quay",
      doc: "d1",
      start: 4,
      end: 20,
      source: { file, line: 1 },
      extra: {},
    });
    expect(mentions[1]).toMatchObject({ id: "m2", text: "Brannock & Tull", extra: { page: 3, gold: "E17" } });
    expect(mentions[1]!.start).toBeUndefined();
  });

  it("requires gold when labeled: an id or null", async () => {
    const file = fixture(
      ".jsonl",
      jsonl([
        { text: "Vell", gold: "P1" },
        { text: "Ostry Mills", gold: null },
      ]),
    );
    const mentions = await collect(readMentionsJsonl(file, { labeled: true }));
    expect(mentions.map((m) => m.gold)).toEqual(["P1", null]);

    const missing = fixture(".jsonl", jsonl([{ text: "Vell", gold: "P1" }, { text: "Ostry Mills" }]));
    const error = await failure(readMentionsJsonl(missing, { labeled: true }));
    expect(error.message).toContain(`${missing}:2: field "gold":`);
  });

  it("rejects a duplicate id naming both lines", async () => {
    const file = fixture(
      ".jsonl",
      jsonl([
        { id: "a", text: "Vell" },
        { id: "b", text: "Tull" },
        { id: "a", text: "Marsh" },
      ]),
    );
    const error = await failure(readMentionsJsonl(file));
    expect(error.message).toContain(`${file}:3: field "id":`);
    expect(error.message).toContain("first used on line 1");
  });

  it("rejects a generated id that collides with an explicit one", async () => {
    const file = fixture(".jsonl", jsonl([{ id: "m2", text: "Vell" }, { text: "Tull" }]));
    const error = await failure(readMentionsJsonl(file));
    expect((error as InputError).line).toBe(2);
    // The mention on line 2 wrote no id: the message says so rather than "duplicate".
    expect(error.message).toContain(
      'has no id and the one given by default, "m2", is already used on line 1',
    );
    // The other order: the default id came first, the written one second.
    const later = fixture(".jsonl", jsonl([{ text: "Vell" }, { id: "m1", text: "Tull" }]));
    expect((await failure(readMentionsJsonl(later))).message).toContain(
      `${later}:2: field "id": duplicate id "m1" (given by default to the mention on line 1, which has none`,
    );
    const csv = fixture(".csv", "id,text\n,Vell\nm2,Tull\n");
    expect((await failure(readMentionsCsv(csv))).message).toContain(
      "given by default to the mention on line 2",
    );
  });

  it.each([
    [{ type: "PER" }, "text", "is required"],
    [{ text: "   " }, "text", "must not be empty"],
    [{ text: 5 }, "text", "expected a string"],
    [{ text: "Vell", type: 3 }, "type", "expected a string"],
    [{ text: "Vell", start: -1, end: 3 }, "start", "non-negative integer"],
    [{ text: "Vell", start: 1.5, end: 3 }, "start", "non-negative integer"],
    [{ text: "Vell", start: 4, end: 4 }, "end", "greater than start"],
    [{ text: "Vell", start: 4 }, "end", "missing"],
  ])("rejects %j naming field %s", async (row, field, problem) => {
    const file = fixture(".jsonl", jsonl([{ text: "fine" }, row]));
    const error = await failure(readMentionsJsonl(file));
    expect(error).toBeInstanceOf(InputError);
    expect(error.message).toContain(`${file}:2: field "${field}":`);
    expect(error.message).toContain(problem);
  });

  it("reads a 10,000-character mention text", async () => {
    const text = "Harlow ".repeat(1428) + "Quay"; // 7 * 1428 + 4 = 10,000 characters
    expect(text).toHaveLength(10_000);
    const file = fixture(".jsonl", jsonl([{ text }]));
    const [mention] = await collect(readMentionsJsonl(file));
    expect(mention!.text).toBe(text);
  });
});

describe("readMentionsCsv", () => {
  it("reads RFC 4180 quoting, multi-line fields and names the start line", async () => {
    const file = fixture(
      ".csv",
      'id,text,type,context,start,end,page\nc1,"Brannock & Tull, Ltd.",ORG,"the firm of\nBrannock & Tull",,,4\n\n,Vell,PER,,0,4,\n',
    );
    const mentions = await collect(readMentionsCsv(file));
    expect(mentions).toHaveLength(2);
    expect(mentions[0]).toMatchObject({
      id: "c1",
      text: "Brannock & Tull, Ltd.",
      type: "ORG",
      context: "the firm of\nBrannock & Tull",
      source: { line: 2 },
      extra: { page: "4" },
    });
    expect(mentions[0]!.start).toBeUndefined();
    expect(mentions[1]).toMatchObject({ id: "m5", text: "Vell", start: 0, end: 4, source: { line: 5 } });
    expect(mentions[1]!.context).toBeUndefined();
  });

  it("reads gold: empty cell, null and NIL mean NIL", async () => {
    const file = fixture(".csv", "text,gold\nVell,P1\nTull,\nMarsh,null\nOstry,NIL\n");
    const mentions = await collect(readMentionsCsv(file, { labeled: true }));
    expect(mentions.map((m) => m.gold)).toEqual(["P1", null, null, null]);
  });

  it("requires the gold column when labeled and the text column always", async () => {
    const noGold = fixture(".csv", "text\nVell\n");
    expect((await failure(readMentionsCsv(noGold, { labeled: true }))).message).toContain(
      `${noGold}:1: field "gold":`,
    );
    const noText = fixture(".csv", "name\nVell\n");
    expect((await failure(readMentionsCsv(noText))).message).toContain(`${noText}:1: field "text":`);
  });

  it("rejects a wrong field count naming the line", async () => {
    const file = fixture(".csv", "id,text\na,Vell\nb,Tull,extra\n");
    const error = await failure(readMentionsCsv(file));
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).line).toBe(3);
    expect(error.message).toContain(`${file}:3:`);
  });

  it("rejects duplicate ids and non-integer offsets", async () => {
    const dup = fixture(".csv", "id,text\na,Vell\na,Tull\n");
    expect((await failure(readMentionsCsv(dup))).message).toContain(`${dup}:3: field "id": duplicate id "a"`);
    const bad = fixture(".csv", "text,start,end\nVell,1x,4\n");
    expect((await failure(readMentionsCsv(bad))).message).toContain(`${bad}:2: field "start":`);
  });

  it("rejects invalid UTF-8 naming the line", async () => {
    const file = fixture(
      ".csv",
      Buffer.concat([Buffer.from("text\nVell\nT"), Buffer.from([0xe2, 0x82]), Buffer.from("ull\n")]),
    );
    const error = await failure(readMentionsCsv(file));
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).line).toBe(3);
  });
});

describe("readMentions", () => {
  it("chooses the format from the extension, TSV with literal quotes", async () => {
    const tsv = fixture(".tsv", 'text\ttype\nthe "Swift" packet\tVESSEL\n');
    const [mention] = await collect(readMentions(tsv));
    expect(mention).toMatchObject({ text: 'the "Swift" packet', type: "VESSEL" });
    const nd = fixture(".ndjson", jsonl([{ text: "Vell" }]));
    expect((await collect(readMentions(nd)))[0]!.text).toBe("Vell");
  });

  it("reads CSV header names without the spaces around them", async () => {
    const csv = fixture(".csv", " id , text ,type\nm7,Stenmoor,LOC\n");
    expect((await collect(readMentions(csv)))[0]).toMatchObject({ id: "m7", text: "Stenmoor", type: "LOC" });
  });

  it("lets `from` override the extension", async () => {
    const file = fixture(".txt", jsonl([{ text: "Vell" }]));
    expect((await collect(readMentions(file, { from: "jsonl" })))[0]!.id).toBe("m1");
  });

  it("rejects an unknown extension with a UsageError listing the choices", async () => {
    const file = fixture(".txt", "x");
    const error = await failure(readMentions(file));
    expect(error).toBeInstanceOf(UsageError);
    expect(error.message).toContain(".jsonl");
    expect(error.message).toContain(".conll");
    expect(error.message).toContain("jsonl | csv | tsv | conll | spans");
  });

  it("rejects options that do not apply to the format", () => {
    expect(() => resolveFormat("a.jsonl", { scheme: "BIO" })).toThrow(UsageError);
    expect(() => resolveFormat("a.csv", { window: { chars: 10 } })).toThrow(UsageError);
    expect(() => resolveFormat("a.jsonl", { from: "spans" })).toThrow(/documents/);
    expect(() => resolveFormat("a.conll", { labeled: true })).toThrow(UsageError);
    expect(resolveFormat("a.jsonl", { documents: "d.jsonl" })).toBe("spans");
  });

  it("yields nothing for empty files of every format", async () => {
    for (const ext of [".jsonl", ".csv", ".tsv", ".conll"]) {
      expect(await collect(readMentions(fixture(ext, "")))).toEqual([]);
    }
    const docs = fixture(".jsonl", "");
    expect(await collect(readMentions(fixture(".jsonl", ""), { from: "spans", documents: docs }))).toEqual(
      [],
    );
  });

  it("returns labeled mentions with gold", async () => {
    const file = fixture(".jsonl", jsonl([{ text: "Vell", gold: null }]));
    const [mention] = await collect(readMentions(file, { labeled: true }));
    expect(mention!.gold).toBeNull();
  });
});

describe("fields named otherwise", () => {
  it("name the look-alike of a missing text column or field in the error", async () => {
    const csv = await failure(readMentions(fixture(".csv", "mention,type\nPell & Co.,ORG\n")));
    expect(csv).toBeInstanceOf(InputError);
    expect((csv as InputError).message).toMatch(/found "mention"/);
    const json = await failure(readMentions(fixture(".jsonl", jsonl([{ surface: "Pell & Co." }]))));
    expect((json as InputError).message).toMatch(/the row has "surface"/);
    expect((json as InputError).field).toBe("text");
  });

  it("say a header read as one column looks separated by another character", async () => {
    const semi = await failure(readMentions(fixture(".csv", "id;text\n1;Pell & Co.\n")));
    expect((semi as InputError).message).toMatch(/looks separated by ";"/);
    const commas = await failure(readMentions(fixture(".tsv", "id,text\n1,Pell & Co.\n")));
    expect((commas as InputError).message).toMatch(/looks separated by ","/);
  });

  it("report a look-alike of an optional field once, as not read", async () => {
    const warnings: Array<{ code: string; message: string; line?: number | undefined }> = [];
    const file = fixture(".csv", "text,label,sentence\nPell & Co.,ORG,At Harrowmouth.\nKell,ORG,x\n");
    const rows = await collect(readMentions(file, { onWarning: (w) => warnings.push(w) }));
    expect(rows).toHaveLength(2);
    expect(rows[0]?.type).toBeUndefined();
    expect(warnings.map((w) => w.code)).toEqual(["unread-field", "unread-field"]);
    expect(warnings[0]?.message).toMatch(/"label" is not read.*"type"/);
    expect(warnings[1]?.message).toMatch(/"sentence" is not read.*"context"/);
    expect(warnings[0]?.line).toBe(2);
    // A file that gives the field itself draws no warning, whatever else it carries.
    const quiet: unknown[] = [];
    await collect(
      readMentions(fixture(".jsonl", jsonl([{ text: "Kell", type: "ORG", label: "x" }])), {
        onWarning: (w) => quiet.push(w),
      }),
    );
    expect(quiet).toEqual([]);
  });
});
