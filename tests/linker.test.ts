/**
 * The linker end to end on the invented gazette table (tests/helpers/gazette.ts): exact, OCR,
 * fuzzy, acronym and initials paths; NIL reasons; look-alikes told apart by context; candidate
 * lists; hostile mention texts; streaming order; path selection; the brute-force baseline.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { type Kb, openKb } from "../src/kb/kb.js";
import { createLinker, type Linker } from "../src/link/linker.js";
import { FEATURE_NAMES, type LinkRow, type Mention } from "../src/types.js";
import { UsageError } from "../src/util/errors.js";
import { buildGazetteKb, tempDir } from "./helpers/gazette.js";

let t: ReturnType<typeof tempDir>;
let kb: Kb;
let linker: Linker;

beforeAll(async () => {
  t = tempDir("hawser-linker-");
  kb = openKb((await buildGazetteKb(t.dir)).kb);
  linker = createLinker(kb);
});
afterAll(() => {
  kb.close();
  t.cleanup();
});

const m = (text: string, type?: string, extra: Partial<Mention> = {}): Mention => ({
  id: extra.id ?? `m-${text.slice(0, 20)}`,
  text,
  type,
  ...extra,
});
const codes = (r: LinkRow) => r.reasons.map((x) => x.code);
const pathsOf = (r: LinkRow, entity: string) => r.candidates.find((c) => c.entity === entity)?.paths ?? [];

describe("links with reasons", () => {
  it("links an exact canonical name, citing name-exact", () => {
    const r = linker.link(m("Josiah Hale Aldous", "PER"));
    expect(r.entity).toBe("P01");
    expect(r.name).toBe("Josiah Hale Aldous");
    expect(codes(r)[0]).toBe("linked");
    expect(codes(r)).toContain("name-exact");
    expect(pathsOf(r, "P01")).toContain("exact");
    expect(r.score).toBeGreaterThanOrEqual(0.5);
    expect(r.margin).toBeGreaterThanOrEqual(0.05);
  });

  it("links an exact alias (after dropping the honorific), citing alias-exact", () => {
    for (const text of ["Quillon Marsh", "Mr. Quillon Marsh"]) {
      const r = linker.link(m(text, "PER"));
      expect(r.entity, text).toBe("P05");
      expect(codes(r), text).toContain("alias-exact");
    }
  });

  it("links OCR-noised mentions through the ocr or fuzzy path", () => {
    const cases: Array<[string, string, string]> = [
      ["Stenrnouth", "LOC", "L01"], // rn for m
      ["Stenmoulh", "GPE", "L01"], // l for t: one edit
      ["Fort Carow", "LOC", "L03"], // a dropped letter
      ["Stenmouht Packet Company", "ORG", "O02"], // transposed letters
    ];
    for (const [text, type, gold] of cases) {
      const r = linker.link(m(text, type));
      expect(r.entity, text).toBe(gold);
      const paths = pathsOf(r, gold);
      expect(
        paths.some((p) => p === "ocr" || p === "fuzzy"),
        `${text}: ${paths.join(",")}`,
      ).toBe(true);
      expect(paths, text).not.toContain("exact");
    }
  });

  it('links the acronym "S.G.E." (and "SGE") to the Stenmouth Grain Exchange', () => {
    for (const text of ["S.G.E.", "SGE", "S. G. E."]) {
      const r = linker.link(m(text, "ORG"));
      expect(r.entity, text).toBe("O01");
      expect(pathsOf(r, "O01"), text).toContain("acronym");
      expect(codes(r), text).toContain("acronym");
    }
  });

  it("finds persons by initials and surname", () => {
    const r = linker.link(m("E. Q. Marsh", "PER"));
    expect(r.entity).toBe("P05");
    expect(pathsOf(r, "P05")).toContain("initials");
    expect(codes(r)).toContain("initials");
    // Both J. H. Aldous of the table are found by the initials path.
    const jh = linker.link(m("J. H. Aldous", "PER"));
    expect(pathsOf(jh, "P01")).toContain("initials");
    expect(pathsOf(jh, "P02")).toContain("initials");
  });

  it("tells a town from the firm named after it by the mention's label and name", () => {
    expect(linker.link(m("Stenmouth", "LOC")).entity).toBe("L01");
    expect(linker.link(m("Stenmouth Packet Co.", "ORG")).entity).toBe("O02");
    expect(linker.link(m("Stenmoor", "LOC")).entity).toBe("L02");
  });

  it("cites a type mismatch with the entry's table type, which the written row keeps", () => {
    const row = linker.link(m("Stenmouth Packet Co.", "LOC"));
    const mismatch = row.reasons.find((r) => r.code === "type-mismatch");
    expect(mismatch?.entityType).toBe("firm");
    expect(mismatch?.message).toMatch(/the entry is a firm/);
    // The row goes out as JSON: the field must be a value, not something JSON drops.
    const written = JSON.parse(JSON.stringify(row)) as LinkRow;
    expect(written.reasons.find((r) => r.code === "type-mismatch")?.entityType).toBe("firm");
  });

  it("expands place abbreviations before matching", () => {
    expect(linker.link(m("Mt. Sorrel", "LOC")).entity).toBe("L06");
    expect(linker.link(m("Pt. Ellery", "GPE")).entity).toBe("L05");
  });
});

describe("NIL with a reason", () => {
  it("gives no-candidates or below-threshold for a name the table does not hold", () => {
    for (const [text, type] of [
      ["Quentin Fairweather", "PER"],
      ["Ravensgill", "LOC"],
    ] as const) {
      const r = linker.link(m(text, type));
      expect(r.entity, text).toBeNull();
      expect(r.name).toBeNull();
      expect(["no-candidates", "below-threshold"]).toContain(codes(r)[0]);
    }
  });

  it("gives below-threshold when the threshold is out of reach", () => {
    const strict = createLinker(kb, { threshold: 1 });
    const r = strict.link(m("Stenmoulh", "LOC"));
    expect(r.entity).toBeNull();
    expect(codes(r)[0]).toBe("below-threshold");
    expect(r.candidates[0]?.entity).toBe("L01"); // still listed
  });

  it("gives ambiguous for two equally good candidates (father and son without a suffix)", () => {
    const r = linker.link(m("Tobias Pell", "PER"));
    expect(r.entity).toBeNull();
    const reason = r.reasons[0]!;
    expect(reason.code).toBe("ambiguous");
    expect([reason.best, reason.runnerUp].sort()).toEqual(["P03", "P04"]);
    expect(r.margin).toBeLessThan(0.05);
  });

  it("leaves a DATE-labeled mention NIL as not-linkable, without candidates", () => {
    const labels = createLinker(kb);
    const r = labels.link(m("Stenmouth", "DATE"));
    expect(r.entity).toBeNull();
    expect(codes(r)).toEqual(["not-linkable"]);
    expect(r.candidates).toEqual([]);
    expect(labels.link(m("12 pounds", "MONEY")).reasons[0]?.code).toBe("not-linkable");
  });
});

describe("context separates look-alikes", () => {
  const captain = "the captain brought the steam packet Wenna Belle up the upper river";
  const clerk = "the harbour board clerk entered the tonnage dues in the customs ledgers";

  it("picks the Aldous whose description the context matches", () => {
    const a = linker.link(m("Aldous", "PER", { context: captain }));
    expect(a.entity).toBe("P01");
    expect(codes(a)).toContain("context-overlap");
    const b = linker.link(m("Aldous", "PER", { context: clerk }));
    expect(b.entity).toBe("P02");
    expect(codes(b)).toContain("context-overlap");
    // The context feature is what differs.
    const pa = a.candidates.find((c) => c.entity === "P01")!.features.context;
    const qa = a.candidates.find((c) => c.entity === "P02")!.features.context;
    expect(pa).toBeGreaterThan(qa);
  });

  // With full initials the name features put both Aldous near a score of 1; the margin is taken in
  // log-odds (src/decide/decide.ts), where the context difference survives that saturation.
  it('picks the right "J. H. Aldous" when the context matches one description', () => {
    expect(linker.link(m("J. H. Aldous", "PER", { context: captain })).entity).toBe("P01");
    expect(linker.link(m("J. H. Aldous", "PER", { context: clerk })).entity).toBe("P02");
  });

  // Different generational suffixes on both sides rule out the key match (src/score/features.ts).
  it("uses the generational suffix to tell father from son", () => {
    expect(linker.link(m("Tobias Pell Jr.", "PER")).entity).toBe("P04");
    expect(linker.link(m("Tobias Pell Sr.", "PER")).entity).toBe("P03");
  });
});

describe("candidate lists", () => {
  it("hold at most `top` entries, best first, each with all 8 features in [0, 1]", () => {
    for (const top of [0, 1, 2, 3, 5]) {
      const l = createLinker(kb, { top });
      for (const text of ["Stenmouth", "Stenmoulh", "Aldous", "Port"]) {
        const r = l.link(m(text));
        expect(r.candidates.length, `${text} top ${top}`).toBeLessThanOrEqual(top);
        for (let i = 1; i < r.candidates.length; i++)
          expect(r.candidates[i - 1]!.score).toBeGreaterThanOrEqual(r.candidates[i]!.score);
        for (const c of r.candidates) {
          expect(Object.keys(c.features).sort()).toEqual([...FEATURE_NAMES].sort());
          for (const f of FEATURE_NAMES) {
            expect(c.features[f], `${text} ${c.entity} ${f}`).toBeGreaterThanOrEqual(0);
            expect(c.features[f], `${text} ${c.entity} ${f}`).toBeLessThanOrEqual(1);
          }
          expect(c.score).toBeGreaterThanOrEqual(0);
          expect(c.score).toBeLessThanOrEqual(1);
        }
      }
    }
    // The default lists 3; this mention has more than 3 candidates, so the cap is reached.
    const many = m("Stenmouth Stenmoor Fort Carrow");
    expect(linker.candidateIds(many).length).toBeGreaterThan(3);
    expect(linker.link(many).candidates).toHaveLength(3);
  });

  it("finds fewer candidates with only the exact path on a noisy mention", () => {
    const exactOnly = createLinker(kb, { paths: ["exact"] });
    for (const text of ["Stenmoulh", "Stenrnouth", "Fort Carow"]) {
      const all = linker.candidateIds(m(text, "LOC"));
      const few = exactOnly.candidateIds(m(text, "LOC"));
      expect(few.length, text).toBeLessThan(all.length);
      expect(exactOnly.link(m(text, "LOC")).entity, text).toBeNull();
    }
  });

  it("brute force (no blocking) finds the gold entity of a clean mention", () => {
    const cases: Array<[string, string, string]> = [
      ["Stenmoor", "LOC", "L02"],
      ["Ezra Quillon Marsh", "PER", "P05"],
      ["Carrow Lime Works", "ORG", "O04"],
    ];
    for (const [text, type, gold] of cases) {
      const r = linker.bruteForce(m(text, type));
      expect(r.entity, text).toBe(gold);
      expect(r.candidates[0]?.entity).toBe(gold);
    }
  });

  it("rejects bad options with a UsageError", () => {
    expect(() => createLinker(kb, { threshold: 1.5 })).toThrow(UsageError);
    expect(() => createLinker(kb, { top: -1 })).toThrow(UsageError);
    expect(() => createLinker(kb, { paths: ["exact", "telepathy" as "exact"] })).toThrow(/telepathy/);
  });
});

describe("hostile mention texts", () => {
  const hostile = [
    '"',
    '""',
    '"Stenmouth',
    "Sten*",
    "*",
    "NEAR(Stenmouth Stenmoor)",
    "NEAR(",
    "Stenmouth AND Stenmoor",
    "Stenmouth OR",
    "OR",
    "AND",
    "NOT Stenmoor",
    "^Stenmouth",
    "name:Stenmouth",
    "tokens:stenmouth",
    "(",
    ")",
    "(Stenmouth",
    "-Stenmoor",
    "+",
    "{",
    "{tokens}: Stenmouth",
    'Pell "& Sons',
    "   ",
    "...",
    "\u0000",
    "Sten\u0301mouth",
  ];

  it("never throw and give exactly one row each, also with every label", async () => {
    for (const type of [undefined, "LOC", "PER", "ORG", "MISC"]) {
      const mentions = hostile.map((text, i) => m(text, type, { id: `h${i}` }));
      const rows: LinkRow[] = [];
      for await (const r of linker.linkAll(mentions)) rows.push(r);
      expect(rows.map((r) => r.mention)).toEqual(mentions.map((x) => x.id));
      for (const r of rows) expect(Array.isArray(r.reasons) && r.reasons.length > 0).toBe(true);
      for (const x of mentions) expect(() => linker.candidateIds(x)).not.toThrow();
    }
  });

  it("quotes FTS5 operator words and syntax characters handed to the KB search", () => {
    // searchAliases takes folded single words; operator words and lone syntax characters must not
    // reach the FTS5 parser as syntax.
    const tokens = ['"', "NEAR", "near", "OR", "AND", "NOT", "*", "^", ":", "{", "}", "(", ")", "-", "+"];
    for (const tok of tokens) expect(() => kb.searchAliases([tok], 10), tok).not.toThrow();
    expect(() => kb.searchAliases(tokens, 10)).not.toThrow();
    expect(kb.searchAliases(["stenmouth"], 10).length).toBeGreaterThan(0);
  });

  it("gives one row for a 10,000-character mention", () => {
    const long = "Stenmouth ".repeat(1000);
    expect(long.length).toBe(10_000);
    const r = linker.link(m(long, "LOC"));
    expect(r.text).toBe(long);
    expect(r.mention).toBe(m(long).id);
    const r2 = linker.link(m("x".repeat(10_000)));
    expect(r2.entity).toBeNull();
  });
});

describe("a mention built in code", () => {
  it("is checked: no text, or a text or label that is not a string, is a UsageError", () => {
    for (const bad of [
      { id: "x" },
      { id: "x", text: null },
      { id: "x", text: 5 },
      { id: "x", text: "Stenmoor", type: {} },
      { id: "x", text: "Stenmoor", context: 5 },
    ]) {
      expect(() => linker.link(bad as unknown as Mention), JSON.stringify(bad)).toThrow(UsageError);
      expect(() => linker.scoreCandidates(bad as unknown as Mention), JSON.stringify(bad)).toThrow(
        UsageError,
      );
    }
  });

  it("is refused once the KB is closed, whatever lookups it needs", () => {
    const again = openKb(kb.info.file);
    const closed = createLinker(again);
    again.close();
    for (const text of ["Stenmoor", "Lumb Brothers"])
      expect(() => closed.link(m(text, "ORG")), text).toThrow(/KB is closed/);
  });
});

describe("linkAll", () => {
  it("returns one row per mention of an async generator, in input order", async () => {
    const texts = [
      "Stenmoor",
      "Quentin Fairweather",
      "S.G.E.",
      "Stenmoor",
      "1903",
      "Tobias Pell",
      "Wenna Belle",
    ];
    async function* source(): AsyncGenerator<Mention> {
      for (let i = 0; i < texts.length; i++) {
        await new Promise((r) => setTimeout(r, 1));
        yield m(texts[i]!, i === 4 ? "DATE" : undefined, { id: `g${i}`, doc: "gazette-1903-04" });
      }
    }
    const rows: LinkRow[] = [];
    for await (const r of linker.linkAll(source())) rows.push(r);
    expect(rows).toHaveLength(texts.length);
    expect(rows.map((r) => r.mention)).toEqual(texts.map((_, i) => `g${i}`));
    expect(rows.map((r) => r.text)).toEqual(texts);
    expect(rows.map((r) => r.entity)).toEqual(["L02", null, "O01", "L02", null, null, "V01"]);
    expect(rows.every((r) => r.doc === "gazette-1903-04")).toBe(true);
  });

  it("gives the rows of the document under way before passing on its source's failure", async () => {
    async function* failing(): AsyncGenerator<Mention> {
      yield m("Stenmoor", "LOC", { id: "d1", doc: "a" });
      yield m("Stenmoor", "LOC", { id: "d2", doc: "b" });
      yield m("Tobias Pell", "PER", { id: "d3", doc: "b" });
      throw new Error("bad line 4");
    }
    const rows: LinkRow[] = [];
    let error: unknown;
    try {
      for await (const r of linker.linkAll(failing())) rows.push(r);
    } catch (e) {
      error = e;
    }
    expect((error as Error).message).toBe("bad line 4");
    expect(rows.map((r) => r.mention)).toEqual(["d1", "d2", "d3"]);
  });
});
