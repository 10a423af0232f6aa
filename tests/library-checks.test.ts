/**
 * What a library caller gets for wrong calls: UsageErrors naming the problem (not TypeErrors from
 * deep inside, not a quietly wrong link), KB handles closed when opening fails, and exported
 * defaults that one caller cannot change for the others.
 */
import { existsSync, readdirSync, readlinkSync, writeFileSync } from "node:fs";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEFAULT_CANDIDATE_OPTIONS } from "../src/candidates/generate.js";
import { decide } from "../src/decide/decide.js";
import { DEFAULT_DOCUMENT_EVIDENCE } from "../src/document/evidence.js";
import { agree } from "../src/commands/agree.js";
import { evaluate } from "../src/commands/evaluate.js";
import { link } from "../src/commands/link.js";
import { tune } from "../src/commands/tune.js";
import { buildKb } from "../src/kb/build.js";
import { type Kb, openKb } from "../src/kb/kb.js";
import { createLinker, type Linker, type LinkerOptions } from "../src/link/linker.js";
import { DEFAULT_WEIGHTS } from "../src/score/combine.js";
import { readConfig } from "../src/tune/config.js";
import type { Mention, Weights } from "../src/types.js";
import { InputError, OutputError, UsageError } from "../src/util/errors.js";
import { buildGazetteKb, jsonl, tempDir, writeText } from "./helpers/gazette.js";

let t: ReturnType<typeof tempDir>;
let kb: Kb;
let linker: Linker;
let table: string;

beforeAll(async () => {
  t = tempDir("hawser-library-checks-");
  const built = await buildGazetteKb(t.dir);
  table = built.table;
  kb = openKb(built.kb);
  linker = createLinker(kb);
});
afterAll(() => {
  kb.close();
  t.cleanup();
});

/** This process's open file descriptors that point at `file`. */
function handlesOn(file: string): number {
  let n = 0;
  for (const fd of readdirSync("/proc/self/fd")) {
    try {
      if (readlinkSync(`/proc/self/fd/${fd}`) === file) n++;
    } catch {
      // closed between the listing and the look
    }
  }
  return n;
}

describe("openKb", () => {
  it("closes the file before refusing one that is not a KB", () => {
    const plain = t.file("plain.sqlite");
    const db = new Database(plain);
    db.exec("CREATE TABLE notes (x TEXT)");
    db.close();
    const empty = writeFileSync(t.file("empty.kb"), "") ?? t.file("empty.kb");
    for (const file of [plain, empty]) {
      for (let i = 0; i < 5; i++) expect(() => openKb(file)).toThrow(InputError);
      // Without the close, each failed open kept a handle until the garbage collector ran.
      expect(handlesOn(file), file).toBe(0);
    }
  });

  it("refuses a path that is not a string as a usage error", () => {
    expect(() => openKb(undefined as unknown as string)).toThrow(UsageError);
    expect(() => openKb("")).toThrow(UsageError);
  });

  it("answers lookups on a closed KB with a usage error", () => {
    const again = openKb(kb.info.file);
    again.close();
    expect(() => again.eidOf("P01")).toThrow(/KB .* is closed/);
    expect(() => [...again.entityRowsOfClass("person")]).toThrow(UsageError);
    expect(() => kb.entity(0)).toThrow(UsageError);
  });
});

describe("createLinker", () => {
  it("needs a KB", () => {
    expect(() => createLinker(null as unknown as Kb)).toThrow(UsageError);
    expect(() => createLinker({} as Kb)).toThrow(/needs a KB from openKb/);
  });

  const refused: Array<[string, LinkerOptions]> = [
    [
      "a weight that is not a number",
      { weights: { bias: 0, features: { context: "x" } } as unknown as Weights },
    ],
    ["weights missing features", { weights: { bias: -10, features: {} } as unknown as Weights }],
    [
      "an unknown feature",
      {
        weights: {
          ...DEFAULT_WEIGHTS,
          features: { ...DEFAULT_WEIGHTS.features, contxt: 3 },
        } as unknown as Weights,
      },
    ],
    ["an infinite bias", { weights: { ...DEFAULT_WEIGHTS, bias: Number.NEGATIVE_INFINITY } }],
    ["too many fuzzy edits", { candidates: { fuzzyMaxEdits: 9 } }],
    ["negative fuzzy edits", { candidates: { fuzzyMaxEdits: -3 } }],
    [
      "an unknown candidate setting",
      { candidates: { ftsLimt: 10 } as unknown as LinkerOptions["candidates"] },
    ],
    [
      "an unknown path inside candidates",
      { candidates: { paths: new Set(["exakt"]) } as unknown as LinkerOptions["candidates"] },
    ],
    ["an unknown document step", { document: { bogus: true } as unknown as LinkerOptions["document"] }],
    [
      "a document step that is not true or false",
      { document: { sameText: 1 } as unknown as LinkerOptions["document"] },
    ],
    ["document output as a path", { paths: ["document"] as unknown as LinkerOptions["paths"] }],
    ["blockMinCompat out of range", { blockMinCompat: 2 }],
    ["a threshold that is not a number", { threshold: Number.NaN }],
  ];
  for (const [what, options] of refused)
    it(`refuses ${what}`, () => {
      expect(() => createLinker(kb, options)).toThrow(UsageError);
    });

  it("accepts the defaults spelled out", () => {
    const spelled = createLinker(kb, {
      weights: DEFAULT_WEIGHTS,
      candidates: { ...DEFAULT_CANDIDATE_OPTIONS },
      document: { ...DEFAULT_DOCUMENT_EVIDENCE },
    });
    expect(spelled.link({ id: "a", text: "Stenmoor", type: "LOC" })).toEqual(
      linker.link({ id: "a", text: "Stenmoor", type: "LOC" }),
    );
  });
});

describe("exported defaults", () => {
  it("cannot be changed by one caller for every linker after", () => {
    const before = linker.link({ id: "a", text: "Aldous", type: "PER", context: "harbour master" });
    // A shallow copy shares the features object: editing it must fail, not change the defaults.
    const copy = { ...DEFAULT_WEIGHTS };
    expect(() => {
      copy.features.context = -50;
    }).toThrow(TypeError);
    expect(() => {
      (DEFAULT_CANDIDATE_OPTIONS as { maxCandidates: number }).maxCandidates = 1;
    }).toThrow(TypeError);
    expect(() => {
      DEFAULT_DOCUMENT_EVIDENCE.sameText = false;
    }).toThrow(TypeError);
    expect(() => (DEFAULT_CANDIDATE_OPTIONS.paths as Set<string>).delete("fuzzy")).toThrow(TypeError);
    expect(DEFAULT_CANDIDATE_OPTIONS.paths.has("fuzzy")).toBe(true);
    expect(
      createLinker(kb).link({ id: "a", text: "Aldous", type: "PER", context: "harbour master" }),
    ).toEqual(before);
  });
});

describe("decide", () => {
  it("never links a score or margin that is not a number", () => {
    expect(decide([Number.NaN], 0.5, 0.5).outcome).toBe("below-threshold");
    expect(decide([Number.NaN, 0.9], 0.5, 0.5).outcome).not.toBe("link");
    expect(decide([0.9], 0.5, 0.5).outcome).toBe("link");
  });
});

describe("mentions from code", () => {
  const bad: Array<[string, unknown]> = [
    ["no id", { text: "Stenmoor" }],
    ["an empty id", { id: "", text: "Stenmoor" }],
    ["a number as id", { id: 7, text: "Stenmoor" }],
    ["a start that is not a number", { id: "a", text: "Stenmoor", start: "x", end: 8 }],
    ["an end before the start", { id: "a", text: "Stenmoor", start: 10, end: 2 }],
    ["a start without an end", { id: "a", text: "Stenmoor", start: 3 }],
  ];
  for (const [what, mention] of bad)
    it(`refuses ${what}`, () => {
      expect(() => linker.link(mention as Mention)).toThrow(UsageError);
    });

  it("accepts offsets in order", () => {
    expect(linker.link({ id: "a", text: "Stenmoor", start: 0, end: 8 }).mention).toBe("a");
  });

  it("refuses what is not a list of mentions", async () => {
    for (const notList of [null, {}, 5]) {
      const rows = linker.linkAll(notList as unknown as Mention[]);
      await expect(rows.next()).rejects.toThrow(UsageError);
    }
    expect(() => linker.linkDocument("abc" as unknown as Mention[])).toThrow(UsageError);
  });
});

describe("library commands", () => {
  it("print nothing unless asked, and return their warnings", async () => {
    const gold = writeText(
      t.file("gold.jsonl"),
      jsonl([
        { id: "g1", text: "Stenmoor", type: "LOC", gold: "L01" },
        { id: "g2", text: "Jonas Aldous", type: "WEIRDLABEL", gold: "NOT-IN-KB" },
      ]),
    );
    const written: string[] = [];
    const write = process.stderr.write.bind(process.stderr);
    process.stderr.write = ((chunk: string | Uint8Array) => {
      written.push(String(chunk));
      return true;
    }) as typeof process.stderr.write;
    let report: Awaited<ReturnType<typeof evaluate>>;
    let summary: Awaited<ReturnType<typeof link>>;
    try {
      report = await evaluate({ kb: kb.info.file, gold });
      summary = await link({ kb: kb.info.file, mentions: gold, out: t.file("links.jsonl") });
    } finally {
      process.stderr.write = write;
    }
    expect(written).toEqual([]);
    expect(report.warnings.join("\n")).toContain("1 of 2 gold ids are not in the KB");
    expect(summary.warnings.join("\n")).toContain("WEIRDLABEL");
    // Asked, they tell as they go.
    const told: string[] = [];
    await evaluate({ kb: kb.info.file, gold, warn: (m) => told.push(m) });
    expect(told.join("\n")).toContain("not in the KB");
  });

  it("report an output that cannot be written as an OutputError", async () => {
    const mentions = writeText(t.file("m.jsonl"), jsonl([{ id: "a", text: "Stenmoor" }]));
    // /proc and /sys take no new files, whoever runs the test (root included).
    await expect(link({ kb: kb.info.file, mentions, out: "/proc/hawser-links.jsonl" })).rejects.toThrow(
      OutputError,
    );
    await expect(buildKb({ table, out: "/sys/hawser.kb" })).rejects.toThrow(OutputError);
  });
});

describe("wrong arguments of every kind", () => {
  it("refuses misspelt, mistyped and misplaced linker options", () => {
    const refused: unknown[] = [
      { treshold: 0.9 },
      [],
      { labels: {} },
      { labels: "labels.json" },
      { paths: ["exact"], candidates: { paths: 42 } },
    ];
    for (const options of refused)
      expect(() => createLinker(kb, options as LinkerOptions), JSON.stringify(options)).toThrow(UsageError);
    // NaN is shown as NaN, not as JSON's null.
    expect(() => createLinker(kb, { threshold: Number.NaN })).toThrow(/got NaN/);
    // An explicit undefined means the default, inside `candidates` as outside.
    expect(() => createLinker(kb, { candidates: { ftsLimit: undefined } })).not.toThrow();
  });

  it("refuses a null among the mentions of linkAll", async () => {
    await expect(linker.linkAll([null as unknown as Mention]).next()).rejects.toThrow(UsageError);
  });

  it("takes a tuned config whole, and refuses one tuned on another KB", async () => {
    const gold = writeText(
      t.file("tune-gold.jsonl"),
      jsonl(
        Array.from({ length: 40 }, (_, i) => {
          // Look-alikes (Stenmoor beside Stenmouth, the two Aldouses) and a NIL: links and non-links to learn from.
          const [text, gold] = (
            [
              ["Stenmoor", "L02"],
              ["Stenmouth", "L01"],
              ["Josiah Aldous", "P01"],
              ["Jonas Aldous", "P02"],
              ["Quentin Fairweather", null],
            ] as const
          )[i % 5]!;
          return { id: `g${i}`, text, gold };
        }),
      ),
    );
    const out = t.file("tuned.json");
    await tune({ kb: kb.info.file, gold, out, folds: 2 });
    const config = readConfig(out);
    expect(createLinker(kb, config as unknown as LinkerOptions).config.threshold).toBe(config.threshold);
    const elsewhere = { ...config, kb: { ...config.kb, fingerprint: "another" } };
    expect(() => createLinker(kb, elsewhere as unknown as LinkerOptions)).toThrow(/tuned on another KB/);
  });

  it("refuses paths that are not file names and values of the wrong type in the commands", async () => {
    const gold = writeText(t.file("g.jsonl"), jsonl([{ id: "a", text: "Stenmoor", gold: "L02" }]));
    const mentions = writeText(t.file("m2.jsonl"), jsonl([{ id: "a", text: "Stenmoor" }]));
    const file = kb.info.file;
    const calls: Array<[string, () => Promise<unknown>]> = [
      ["evaluate without gold", () => evaluate({ kb: file } as never)],
      [
        "evaluate with a number as config (read as a file descriptor)",
        () => evaluate({ kb: file, gold, config: 5 } as never),
      ],
      ["link with 0 as labels (standard input)", () => link({ kb: file, mentions, labels: 0 } as never)],
      ["evaluate with k 0", () => evaluate({ kb: file, gold, k: 0 })],
      ["evaluate with top as a string", () => evaluate({ kb: file, gold, top: "2" } as never)],
      ["tune without out", () => tune({ kb: file, gold } as never)],
      [
        "tune with minPrecision as a string",
        () => tune({ kb: file, gold, out: t.file("x.json"), minPrecision: "0.99" } as never),
      ],
      ["agree without b", () => agree({ a: gold } as never)],
      ["link to an object that is no stream", () => link({ kb: file, mentions, stdout: {} } as never)],
      ["link with a warn that is no function", () => link({ kb: file, mentions, warn: 5 } as never)],
      [
        "buildKb with labels as a string",
        () => buildKb({ table, out: t.file("x.kb"), labels: "x" } as never),
      ],
      ["buildKb with progressEvery 0", () => buildKb({ table, out: t.file("x.kb"), progressEvery: 0 })],
      [
        "a tag column that is no number",
        () => link({ kb: file, mentions: t.file("x.conll"), tagColumn: "x" } as never),
      ],
      [
        "both windows",
        () => link({ kb: file, mentions, documents: mentions, window: { chars: 5, sentences: 1 } } as never),
      ],
    ];
    for (const [what, call] of calls) await expect(call(), what).rejects.toThrow(UsageError);
    expect(existsSync(t.file("x.json"))).toBe(false);
  });

  it("warns when predicted rows list fewer candidates than recall is asked at", async () => {
    const gold = writeText(
      t.file("span-gold.jsonl"),
      jsonl([{ id: "a", text: "Stenmoor", start: 0, end: 8, doc: "d", gold: "L01" }]),
    );
    const predicted = writeText(
      t.file("span-pred.jsonl"),
      jsonl([
        {
          mention: "a",
          text: "Stenmoor",
          start: 0,
          end: 8,
          doc: "d",
          entity: "L01",
          candidates: [{ entity: "L01" }],
        },
      ]),
    );
    const report = await evaluate({ kb: kb.info.file, gold, predicted, k: 5 });
    expect(report.warnings.join("\n")).toContain(
      'rows list at most 1 candidates, so candidate recall "at 5"',
    );
  });
});
