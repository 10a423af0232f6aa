import * as fs from "node:fs";
import * as os from "node:os";
import * as path from "node:path";
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { charWindow, sentenceWindow } from "../src/read/context-window.js";
import { readMentions } from "../src/read/index.js";
import { splitSentences } from "../src/read/sentences.js";
import { loadDocuments, readSpans, type Span, spansFromTokens, tokensFromSpans } from "../src/read/spans.js";
import { InputError, UsageError } from "../src/util/errors.js";
import { collect, failure } from "./helpers/streams.js";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "hawser-read-spans-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

let counter = 0;
function fixture(ext: string, content: string): string {
  counter++;
  const file = path.join(dir, `f${counter}${ext}`);
  fs.writeFileSync(file, content);
  return file;
}

const jsonl = (rows: unknown[]): string => rows.map((r) => JSON.stringify(r)).join("\n") + "\n";

const NOTICE =
  "Capt. J. Marsh of the packet Wren reached St. Ebbe on Monday. Messrs. Brannock & Tull paid the dues! " +
  "The harbour board at Harlow met. Was the Co. fined? No.";

const DOCS = jsonl([
  { id: "n1", text: NOTICE },
  { id: 7, text: "Ostry Mills burned." },
]);

/** Offsets of `needle` in NOTICE. */
function at(needle: string): { start: number; end: number } {
  const start = NOTICE.indexOf(needle);
  return { start, end: start + needle.length };
}

describe("splitSentences", () => {
  it("splits on .!? before a capital but not after abbreviations or initials", () => {
    const sentences = splitSentences(NOTICE).map((s) => NOTICE.slice(s.start, s.end));
    expect(sentences).toEqual([
      "Capt. J. Marsh of the packet Wren reached St. Ebbe on Monday.",
      "Messrs. Brannock & Tull paid the dues!",
      "The harbour board at Harlow met.",
      "Was the Co. fined?",
      "No.",
    ]);
  });

  it("keeps closing quotes with their sentence", () => {
    const text = 'He said "Sail." Then we left.';
    expect(splitSentences(text).map((s) => text.slice(s.start, s.end))).toEqual([
      'He said "Sail."',
      "Then we left.",
    ]);
  });
});

describe("context windows", () => {
  it("takes N characters each side without cutting words", () => {
    const { start, end } = at("Brannock & Tull");
    // 12 characters each side land inside "Monday" and "dues"; the partial words are dropped.
    expect(charWindow(NOTICE, start, end, 12)).toBe("Messrs. Brannock & Tull paid the");
    // 16 characters each side land on word boundaries: whole words kept.
    expect(charWindow(NOTICE, start, end, 16)).toBe("Monday. Messrs. Brannock & Tull paid the dues!");
    expect(charWindow(NOTICE, start, end, 0)).toBe("Brannock & Tull");
  });

  it("takes whole sentences each side", () => {
    const { start, end } = at("Harlow");
    expect(sentenceWindow(NOTICE, start, end, 0)).toBe("The harbour board at Harlow met.");
    expect(sentenceWindow(NOTICE, start, end, 1)).toBe(
      "Messrs. Brannock & Tull paid the dues! The harbour board at Harlow met. Was the Co. fined?",
    );
  });
});

describe("readSpans", () => {
  it("reads spans as mentions with text from the document and context", async () => {
    const docs = fixture(".jsonl", DOCS);
    const marsh = at("J. Marsh");
    const spans = fixture(
      ".jsonl",
      jsonl([
        { doc: "n1", ...marsh, label: "PER", text: "J. Marsh", source: "ocr" },
        { id: "x", doc: "7", start: 0, end: 11, label: "LOC" },
      ]),
    );
    const mentions = await collect(readMentions(spans, { documents: docs, window: { sentences: 0 } }));
    expect(mentions[0]).toMatchObject({
      id: "m1",
      text: "J. Marsh",
      type: "PER",
      doc: "n1",
      ...marsh,
      context: "Capt. J. Marsh of the packet Wren reached St. Ebbe on Monday.",
      extra: { source: "ocr" },
    });
    expect(mentions[1]).toMatchObject({
      id: "x",
      text: "Ostry Mills",
      doc: "7",
      context: "Ostry Mills burned.",
    });
  });

  it("reads CSV span rows with the default 200-character window", async () => {
    const docs = await loadDocuments(fixture(".jsonl", DOCS));
    const { start, end } = at("Wren");
    const spans = fixture(".csv", `doc,start,end,label,gold\nn1,${start},${end},VESSEL,V3\n`);
    const [mention] = await collect(readSpans(spans, "csv", docs, { labeled: true }));
    expect(mention).toMatchObject({
      text: "Wren",
      gold: "V3",
      start,
      end,
      context: NOTICE.slice(0, end + 200).trim(),
    });
  });

  it.each([
    [{ doc: "n1", start: 10, end: 9999, label: "PER" }, "end", "outside document"],
    [{ doc: "n1", start: 9000, end: 9999, label: "PER" }, "start", "outside document"],
    [{ doc: "n1", start: 6, end: 6, label: "PER" }, "end", "greater than start"],
    [{ doc: "n9", start: 0, end: 4, label: "PER" }, "doc", 'unknown document "n9"'],
    [{ doc: "n1", start: 0, end: 4, label: "PER", text: "Capn" }, "text", "differs"],
    [{ doc: "n1", start: 0.5, end: 4, label: "PER" }, "start", "non-negative integer"],
    [{ doc: "n1", start: "0", end: 4, label: "PER" }, "start", "non-negative integer"],
    [{ doc: "n1", start: 0, end: 4 }, "label", "is required"],
  ])("rejects %j naming field %s", async (row, field, problem) => {
    const docs = await loadDocuments(fixture(".jsonl", DOCS));
    const spans = fixture(".jsonl", jsonl([{ doc: "n1", start: 0, end: 5, label: "PER" }, row]));
    const error = await failure(readSpans(spans, "jsonl", docs));
    expect(error).toBeInstanceOf(InputError);
    expect(error.message).toContain(`${spans}:2: field "${field}":`);
    expect(error.message).toContain(problem);
  });

  it("rejects an offset inside a character that takes two UTF-16 code units", async () => {
    const docs = await loadDocuments(
      fixture(".jsonl", jsonl([{ id: "e1", text: "The \u{1F6A2} Swift sailed." }])),
    );
    const inside = fixture(".jsonl", jsonl([{ doc: "e1", start: 4, end: 5, label: "MISC" }]));
    const error = await failure(readSpans(inside, "jsonl", docs));
    expect(error.message).toContain(`${inside}:1: field "end":`);
    expect(error.message).toContain("inside a character");
    const after = fixture(".jsonl", jsonl([{ doc: "e1", start: 7, end: 12, label: "MISC" }]));
    expect((await collect(readSpans(after, "jsonl", docs)))[0]!.text).toBe("Swift");
  });

  it("rejects non-integer CSV offsets and duplicate ids", async () => {
    const docs = await loadDocuments(fixture(".jsonl", DOCS));
    const bad = fixture(".csv", "doc,start,end,label\nn1,3.0,8,PER\n");
    expect((await failure(readSpans(bad, "csv", docs))).message).toContain(`${bad}:2: field "start":`);
    const dup = fixture(
      ".jsonl",
      jsonl([
        { id: "a", doc: "7", start: 0, end: 5, label: "LOC" },
        { id: "a", doc: "7", start: 6, end: 11, label: "LOC" },
      ]),
    );
    expect((await failure(readSpans(dup, "jsonl", docs))).message).toContain(
      `${dup}:2: field "id": duplicate id`,
    );
  });

  it("rejects duplicate document ids and a bad window", async () => {
    const docs = fixture(
      ".jsonl",
      jsonl([
        { id: "a", text: "x" },
        { id: "a", text: "y" },
      ]),
    );
    await expect(loadDocuments(docs)).rejects.toThrow(`${docs}:2: field "id": duplicate id "a"`);
    const spans = fixture(".jsonl", "");
    await expect(collect(readSpans(spans, "jsonl", new Map(), { window: { chars: -1 } }))).rejects.toThrow(
      UsageError,
    );
  });
});

describe("spans <-> tokens round trip", () => {
  it("keeps offsets for a worked example, including a span that ends inside a word", () => {
    const doc = { text: "Messrs. Brannock & Tull's barge, the Wren, reached Harlow Quay." };
    const spans: Span[] = [
      { start: 8, end: 23, label: "ORG" }, // "Brannock & Tull" (the possessive 's is cut off)
      { start: 37, end: 41, label: "VESSEL" },
      { start: 51, end: 62, label: "LOC" },
    ];
    const tokens = tokensFromSpans(doc, spans);
    expect(tokens.filter((t) => t.tag !== "O").map((t) => `${t.text}/${t.tag}`)).toEqual([
      "Brannock/B-ORG",
      "&/I-ORG",
      "Tull/I-ORG",
      "Wren/B-VESSEL",
      "Harlow/B-LOC",
      "Quay/I-LOC",
    ]);
    expect(spansFromTokens(tokens)).toEqual(spans);
  });

  it("keeps adjacent same-label spans apart", () => {
    const doc = { text: "Vell Tull Marsh" };
    const spans: Span[] = [
      { start: 0, end: 4, label: "PER" },
      { start: 5, end: 15, label: "PER" },
    ];
    expect(spansFromTokens(tokensFromSpans(doc, spans))).toEqual(spans);
  });

  it("rejects overlapping spans", () => {
    expect(() =>
      tokensFromSpans({ text: "Harlow Quay" }, [
        { start: 0, end: 6, label: "LOC" },
        { start: 3, end: 11, label: "LOC" },
      ]),
    ).toThrow(UsageError);
  });

  it("keeps offsets for random texts and non-overlapping spans without edge whitespace", () => {
    const word = fc.stringMatching(/^[A-Za-z0-9.,&'()-]{1,8}$/);
    const text = fc.array(word, { minLength: 1, maxLength: 12 }).map((words) => words.join(" "));
    const input = text.chain((t) =>
      fc.record({
        text: fc.constant(t),
        cuts: fc.uniqueArray(fc.integer({ min: 0, max: t.length }), { maxLength: 8 }),
        labels: fc.array(fc.constantFrom("PER", "ORG", "LOC"), { minLength: 4, maxLength: 4 }),
      }),
    );
    fc.assert(
      fc.property(input, ({ text: t, cuts, labels }) => {
        const sorted = [...cuts].sort((a, b) => a - b);
        const spans: Span[] = [];
        for (let i = 0; i + 1 < sorted.length; i += 2) {
          let start = sorted[i]!;
          let end = sorted[i + 1]!;
          while (start < end && t[start] === " ") start++;
          while (end > start && t[end - 1] === " ") end--;
          if (start < end) spans.push({ start, end, label: labels[(i / 2) % labels.length]! });
        }
        expect(spansFromTokens(tokensFromSpans({ text: t }, spans))).toEqual(spans);
      }),
      { numRuns: 200 },
    );
  });
});
