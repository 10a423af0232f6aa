import * as fs from "node:fs";
import * as os from "node:os";
import * as path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { type ConllSummary, readConll } from "../src/read/conll.js";
import { joinTokens } from "../src/read/detokenize.js";
import { readMentions } from "../src/read/index.js";
import type { ReadMention } from "../src/read/mention-row.js";
import { chunkTags, detectScheme, parseScheme } from "../src/read/tags.js";
import { type ReadWarning, warningLine } from "../src/read/warnings.js";
import { InputError, UsageError } from "../src/util/errors.js";
import { collect, failure } from "./helpers/streams.js";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "hawser-read-conll-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

let counter = 0;
function fixture(content: string | Buffer, ext = ".conll"): string {
  counter++;
  const file = path.join(dir, `f${counter}${ext}`);
  fs.writeFileSync(file, content);
  return file;
}

/** Chunks as compact strings "LABEL start-end" with "!" for ill-formed ones. */
function chunks(tags: string, scheme: Parameters<typeof chunkTags>[1]): string[] {
  return chunkTags(tags.split(" "), scheme).map(
    (c) => `${c.label} ${c.start}-${c.end}${c.illFormed ? "!" : ""}`,
  );
}

// Chunk boundaries in every case below follow the chunk semantics of the CoNLL shared-task
// evaluation script (from memory): B- and S- start a chunk; an I- (or E-) after O, after E-/S-,
// or after a tag of another type starts a chunk; E- and S- end one; a type change ends one.
describe("chunkTags worked examples", () => {
  it("IOB2 (BIO)", () => {
    expect(chunks("B-PER I-PER O B-LOC B-LOC I-LOC", "IOB2")).toEqual(["PER 0-2", "LOC 3-4", "LOC 4-6"]);
    // Ill-formed: I- after O starts a chunk; I- of another type starts a new chunk.
    expect(chunks("O I-PER I-PER B-ORG I-LOC", "IOB2")).toEqual(["PER 1-3!", "ORG 3-4", "LOC 4-5!"]);
    expect(chunks("I-PER", "IOB2")).toEqual(["PER 0-1!"]);
  });

  it("IOB1", () => {
    // B- separates two adjacent chunks of the same type.
    expect(chunks("I-PER I-PER B-PER O I-LOC", "IOB1")).toEqual(["PER 0-2", "PER 2-3", "LOC 4-5"]);
    // Ill-formed under IOB1: B- that does not follow a chunk of its own type.
    expect(chunks("O B-PER I-PER", "IOB1")).toEqual(["PER 1-3!"]);
  });

  it("IOE2", () => {
    expect(chunks("I-ORG E-ORG E-ORG O E-LOC", "IOE2")).toEqual(["ORG 0-2", "ORG 2-3", "LOC 4-5"]);
    // Ill-formed under IOE2: a chunk that does not end in E-.
    expect(chunks("I-ORG I-ORG O", "IOE2")).toEqual(["ORG 0-2!"]);
  });

  it("IOE1", () => {
    // E- separates two adjacent chunks of the same type; chunks otherwise end with I-.
    expect(chunks("I-ORG E-ORG I-ORG O I-LOC", "IOE1")).toEqual(["ORG 0-2", "ORG 2-3", "LOC 4-5"]);
    expect(chunks("I-ORG E-ORG O", "IOE1")).toEqual(["ORG 0-2!"]);
  });

  it("BIOES", () => {
    expect(chunks("B-PER I-PER E-PER S-LOC O S-ORG S-ORG", "BIOES")).toEqual([
      "PER 0-3",
      "LOC 3-4",
      "ORG 5-6",
      "ORG 6-7",
    ]);
    // A chunk without its E- closes at O; a lone E- or I- is a chunk; B- B- are two chunks.
    expect(chunks("B-PER I-PER O E-LOC O I-ORG", "BIOES")).toEqual(["PER 0-2!", "LOC 3-4!", "ORG 5-6!"]);
    expect(chunks("B-PER B-PER", "BIOES")).toEqual(["PER 0-1!", "PER 1-2!"]);
    // E- ends a chunk: an I- right after it starts a new one.
    expect(chunks("B-PER E-PER I-PER E-PER", "BIOES")).toEqual(["PER 0-2", "PER 2-4!"]);
  });

  it("BILOU (L = E, U = S)", () => {
    expect(chunks("B-PER I-PER L-PER U-LOC O", "BILOU")).toEqual(["PER 0-3", "LOC 3-4"]);
    expect(chunks("B-PER E-PER", "BILOU")).toEqual(["PER 0-2!"]);
    expect(chunks("U-PER U-PER", "BILOU")).toEqual(["PER 0-1", "PER 1-2"]);
  });

  it("a type change inside a chunk splits it", () => {
    expect(chunks("B-PER I-ORG I-ORG", "IOB2")).toEqual(["PER 0-1", "ORG 1-3!"]);
    expect(chunks("B-PER E-ORG", "BIOES")).toEqual(["PER 0-1!", "ORG 1-2!"]);
  });

  it("handles empty and all-O sequences and labels with hyphens", () => {
    expect(chunks("O O", "IOB2")).toEqual([]);
    expect(chunkTags([], "IOB2")).toEqual([]);
    expect(chunks("B-GPE-TOWN I-GPE-TOWN", "IOB2")).toEqual(["GPE-TOWN 0-2"]);
  });

  it("rejects malformed tags", () => {
    expect(() => chunkTags(["X-PER"], "IOB2")).toThrow(UsageError);
    expect(() => chunkTags(["PER"], "IOB2")).toThrow(/prefix/);
  });
});

describe("scheme detection and names", () => {
  it("detects each scheme from its tags", () => {
    expect(detectScheme([["B-PER", "I-PER", "O", "B-LOC"]])).toBe("IOB2");
    expect(detectScheme([["I-PER", "I-PER", "B-PER", "O"]])).toBe("IOB1");
    expect(
      detectScheme([
        ["I-PER", "O"],
        ["O", "I-LOC"],
      ]),
    ).toBe("IOB1");
    expect(detectScheme([["B-PER", "E-PER", "S-LOC"]])).toBe("BIOES");
    expect(detectScheme([["S-LOC", "O"]])).toBe("BIOES");
    expect(detectScheme([["B-PER", "L-PER", "U-LOC"]])).toBe("BILOU");
    expect(detectScheme([["I-ORG", "E-ORG", "O"]])).toBe("IOE2");
    expect(detectScheme([["I-ORG", "E-ORG", "I-ORG", "O"]])).toBe("IOE1");
    expect(detectScheme([["O"]])).toBe("IOB2");
  });

  it("parses scheme names and aliases", () => {
    expect(parseScheme("bio")).toBe("IOB2");
    expect(parseScheme("IOBES")).toBe("BIOES");
    expect(parseScheme("bilou")).toBe("BILOU");
    expect(() => parseScheme("XYZ")).toThrow(/IOB1, IOB2/);
  });
});

describe("joinTokens", () => {
  it("attaches closing punctuation and clitics left and opening brackets right", () => {
    expect(
      joinTokens(["Capt", ".", "Orrin", "Vell", "'s", "packet", "(", "the", "Lark", ")", ",", "sailed", "."]),
    ).toBe("Capt. Orrin Vell's packet (the Lark), sailed.");
    expect(joinTokens([])).toBe("");
  });
});

const GAZETTE = [
  "# issue of the Harlow Gazette, spring 1891",
  "-DOCSTART- -X- -X- O",
  "",
  "Capt.\tNNP\tB-NP\tB-PER",
  "Orrin\tNNP\tI-NP\tI-PER",
  "Vell\tNNP\tI-NP\tI-PER",
  "docked\tVBD\tB-VP\tO",
  "at\tIN\tB-PP\tO",
  "Harlow\tNNP\tB-NP\tB-LOC",
  "Quay\tNNP\tI-NP\tI-LOC",
  ".\t.\tO\tO",
  "",
  "The\tDT\tB-NP\tO",
  "firm\tNN\tI-NP\tO",
  "paid\tVBD\tB-VP\tO",
  ".\t.\tO\tO",
  "",
  "Brannock\tNNP\tB-NP\tB-ORG",
  "&\tCC\tI-NP\tI-ORG",
  "Tull\tNNP\tI-NP\tI-ORG",
  "'s\tPOS\tB-NP\tO",
  "barge\tNN\tI-NP\tO",
  "(\t(\tO\tO",
  "Wren\tNNP\tB-NP\tB-MISC",
  ")\t)\tO\tO",
  "sank\tVBD\tB-VP\tO",
  "",
  "-DOCSTART- gazette-1891-05",
  "",
  "Ostry\tNNP\tB-NP\tB-LOC",
  "Mills\tNNP\tI-NP\tI-LOC",
  "burned\tVBD\tB-VP\tO",
  "",
].join("\n");

describe("readConll", () => {
  it("reads documents, sentences, token offsets, text and context", async () => {
    const file = fixture(GAZETTE);
    const mentions = await collect(readConll(file));
    expect(mentions.map((m) => `${m.id}|${m.text}|${m.type}`)).toEqual([
      "doc1-s1-t0|Capt. Orrin Vell|PER",
      "doc1-s1-t5|Harlow Quay|LOC",
      "doc1-s3-t12|Brannock & Tull|ORG",
      "doc1-s3-t18|Wren|MISC",
      "gazette-1891-05-s1-t0|Ostry Mills|LOC",
    ]);
    const harlow = mentions[1]!;
    expect(harlow).toMatchObject({
      doc: "doc1",
      sentence: 1,
      tokenStart: 5,
      tokenEnd: 7,
      source: { file, line: 9 },
      // Sentence 1 plus one sentence on each side (there is none before it).
      context: "Capt. Orrin Vell docked at Harlow Quay. The firm paid.",
    });
    expect(mentions[2]!.context).toBe("The firm paid. Brannock & Tull's barge (Wren) sank");
    expect(mentions[2]).toMatchObject({ sentence: 3, tokenStart: 12, tokenEnd: 15 });
    expect(mentions[4]!.context).toBe("Ostry Mills burned");
  });

  it("takes contextSentences sentences either side", async () => {
    const file = fixture(GAZETTE);
    const mentions = await collect(readConll(file, { contextSentences: 0 }));
    expect(mentions[2]!.context).toBe("Brannock & Tull's barge (Wren) sank");
    const wide = await collect(readConll(file, { contextSentences: 2 }));
    expect(wide[0]!.context).toBe(
      "Capt. Orrin Vell docked at Harlow Quay. The firm paid. Brannock & Tull's barge (Wren) sank",
    );
  });

  it("splits on runs of spaces, honors tagColumn and numbers documents without -DOCSTART-", async () => {
    const file = fixture(["Vell   B-PER  x", "sailed O   x", "", "Tull B-PER x"].join("\n"), ".bio");
    const mentions = await collect(readMentions(file, { tagColumn: 1 }));
    expect(mentions.map((m) => m.id)).toEqual(["doc1-s1-t0", "doc1-s2-t2"]);
  });

  it("detects the scheme and reports ill-formed sequences as one warning", async () => {
    const file = fixture(["Vell I-PER", "met O", "Tull I-PER", "Marsh B-PER", "", "Harlow B-LOC"].join("\n"));
    const warnings: ReadWarning[] = [];
    const reader = readConll(file, { onWarning: (w) => warnings.push(w) });
    const mentions: ReadMention[] = [];
    let result = await reader.next();
    while (!result.done) {
      mentions.push(result.value);
      result = await reader.next();
    }
    const summary: ConllSummary = result.value;
    // B-LOC after O means B- starts chunks: IOB2, where "I-PER" after O is ill-formed (twice).
    expect(summary.scheme).toBe("IOB2");
    expect(mentions.map((m) => m.text)).toEqual(["Vell", "Tull", "Marsh", "Harlow"]);
    expect(warnings).toHaveLength(1);
    expect(warnings[0]).toMatchObject({ code: "ill-formed-tags", count: 2, line: 1, file });
    expect(summary.warnings).toEqual(warnings);
  });

  it("reads BILOU files with the detected scheme", async () => {
    const file = fixture(["Orrin B-PER", "Vell L-PER", "of O", "Harlow U-LOC"].join("\n"), ".iob");
    const warnings: ReadWarning[] = [];
    const mentions = await collect(readConll(file, { onWarning: (w) => warnings.push(w) }));
    expect(mentions.map((m) => `${m.text}/${m.type}`)).toEqual(["Orrin Vell/PER", "Harlow/LOC"]);
    expect(warnings).toEqual([]);
  });

  it("rejects ragged rows naming file and line", async () => {
    const file = fixture(["Vell\tNNP\tB-PER", "sailed\tO", ""].join("\n"));
    const error = await failure(readConll(file));
    expect(error).toBeInstanceOf(InputError);
    expect(error.message).toContain(`${file}:2:`);
    expect(error.message).toContain("ragged");
  });

  it("rejects unknown tag prefixes naming file and line", async () => {
    const file = fixture(["Vell B-PER", "", "Tull X-PER"].join("\n"));
    const error = await failure(readConll(file, { scheme: "BIO" }));
    expect(error.message).toContain(`${file}:3: field "tag":`);
    expect(error.message).toContain('"X-"');
  });

  it("rejects invalid UTF-8 naming the line", async () => {
    const file = fixture(
      Buffer.concat([Buffer.from("Vell B-PER\nOst"), Buffer.from([0xf0, 0x9f]), Buffer.from("ry B-LOC\n")]),
    );
    const error = await failure(readConll(file));
    expect((error as InputError).line).toBe(2);
  });

  it("rejects a repeated document id", async () => {
    const file = fixture(["-DOCSTART- a", "Vell B-PER", "-DOCSTART- a", "Tull B-PER"].join("\n"));
    const error = await failure(readConll(file));
    expect(error.message).toContain(`${file}:3:`);
  });
});

describe("warnings for people", () => {
  it("name the file and line, and standard input as stdin", () => {
    const w: ReadWarning = {
      code: "ill-formed-tags",
      file: "-",
      line: 13,
      count: 2,
      message: "2 tag sequence(s)",
    };
    expect(warningLine(w)).toBe("stdin:13: 2 tag sequence(s)");
    expect(warningLine({ ...w, file: "a.conll", line: undefined })).toBe("a.conll: 2 tag sequence(s)");
  });
});
