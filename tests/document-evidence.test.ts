/**
 * Document-level evidence: same-text grouping, short forms and defined acronyms, each with its
 * reason code and its switch. Invented gazette entities.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { definedAcronyms } from "../src/document/evidence.js";
import { buildKb } from "../src/kb/build.js";
import { type Kb, openKb } from "../src/kb/kb.js";
import { LabelMap } from "../src/labels/label-map.js";
import { createLinker } from "../src/link/linker.js";
import type { LinkRow, Mention } from "../src/types.js";

const TABLE = `id,name,type,aliases,description,prior
P1,Jabez Harcourt Aldous,person,,Harbour master of Harrowmouth; pilots moorings and the lighthouse,40
P2,Cornelius Aldous,person,,Collector of customs; bonded warehouses and excise duties,30
P3,Josiah Pell Sr.,person,,Ship owner and timber merchant of the old yard,30
P4,Josiah Pell Jr.,person,,Ship owner who ran the colliers and the schooner trade,20
F1,Wend Valley Steam Navigation Company,firm,,Steamers on the Wend between Harrowmouth and Ekerby,60
F2,Warrender Victualling Stores Ltd.,firm,,Ship chandlers and victuallers on the quay,10
F3,Wend Valley Sugar Negotiators Ltd.,firm,,Sugar brokers,60
T1,Upper Stenmoor,town,,Moorland village above the falls,300
T2,Stenmoor,town,,Market town on the Sten,3000
`;

const dir = mkdtempSync(join(tmpdir(), "hawser-doc-"));
let kb: Kb;
beforeAll(async () => {
  writeFileSync(join(dir, "t.csv"), TABLE);
  await buildKb({ table: join(dir, "t.csv"), out: join(dir, "t.kb") });
  kb = openKb(join(dir, "t.kb"));
});
afterAll(() => {
  kb.close();
  rmSync(dir, { recursive: true, force: true });
});

const codes = (r: LinkRow) => r.reasons.map((x) => x.code);

describe("short forms", () => {
  const doc: Mention[] = [
    {
      id: "a",
      doc: "D1",
      text: "Capt. Jabez Harcourt Aldous",
      type: "PER",
      context: "Capt. Jabez Harcourt Aldous spoke.",
    },
    { id: "b", doc: "D1", text: "Aldous", type: "PER", context: "Aldous then left the room." },
  ];
  it("a surname alone takes the entity of the fuller mention earlier in the document", () => {
    const rows = createLinker(kb).linkDocument(doc);
    expect(rows[0]!.entity).toBe("P1");
    expect(rows[1]!.entity).toBe("P1");
    expect(codes(rows[1]!)[0]).toBe("doc-short-form");
    expect(rows[1]!.reasons[0]!.fuller).toBe("a");
    // The margin of a document decision is in log-odds too: the chosen entity over the best other
    // candidate (negative here, as the document chose the one that scored lower alone).
    const chosen = rows[1]!.candidates.find((c) => c.entity === "P1")!;
    const other = rows[1]!.candidates.find((c) => c.entity !== "P1")!;
    const logit = (p: number) => Math.log(p / (1 - p));
    expect(rows[1]!.margin).toBeCloseTo(logit(chosen.score) - logit(other.score), 2);
  });
  it("alone (or with the step off) the surname is NIL: two Aldous in the table", () => {
    const alone = createLinker(kb).link(doc[1]!);
    expect(alone.entity).toBeNull();
    const off = createLinker(kb, { document: { shortForm: false } }).linkDocument(doc);
    expect(off[1]!.entity).toBeNull();
  });
  it("a short form that is itself a better-matching entity keeps its own link", () => {
    const rows = createLinker(kb).linkDocument([
      { id: "a", doc: "D2", text: "Upper Stenmoor", type: "LOC" },
      { id: "b", doc: "D2", text: "Stenmoor", type: "LOC" },
    ]);
    expect(rows[0]!.entity).toBe("T1");
    expect(rows[1]!.entity).toBe("T2");
    expect(codes(rows[1]!)).not.toContain("doc-short-form");
  });
});

describe("acronyms defined in the document", () => {
  const doc: Mention[] = [
    {
      id: "a",
      doc: "D3",
      text: "Wend Valley Steam Navigation Company",
      type: "ORG",
      context: "The Wend Valley Steam Navigation Company (W.V.S.N.) announced a new sailing.",
    },
    { id: "b", doc: "D3", text: "WVSN", type: "ORG", context: "The WVSN answered at noon." },
  ];
  it("finds the definition in the context", () => {
    const linker = createLinker(kb);
    const item = {
      mention: doc[0]!,
      key: "wend valley steam navigation",
      cls: "organization",
      tokens: ["wend", "valley", "steam", "navigation"],
      scored: [],
      chosen: null,
      scoreEntity: () => {
        throw new Error("unused");
      },
    };
    expect(definedAcronyms(item)).toEqual(["wvsn"]);
    expect(linker).toBeDefined();
  });
  it("resolves later uses through the definition", () => {
    // Alone, "WVSN" is the acronym of two firms (F1 and F3): ambiguous.
    expect(createLinker(kb).link(doc[1]!).entity).toBeNull();
    const rows = createLinker(kb).linkDocument(doc);
    expect(rows[0]!.entity).toBe("F1");
    expect(rows[1]!.entity).toBe("F1");
    expect(codes(rows[1]!)).toContain("doc-acronym");
  });
  it("a mention of a label that is not linked takes no part: it stays NIL, and nothing fails", () => {
    // A user's label that is not linked but leans to a class (compat above zero): the document's
    // acronym once scored it with no name form to compare and threw a TypeError.
    const labels = new LabelMap(
      new Map([
        [
          "VESSEL_CODE",
          {
            cls: "other" as const,
            linkable: false,
            compat: { person: 0, organization: 1, location: 0, other: 1 },
          },
        ],
      ]),
    );
    for (const step of ["acronym", "short form", "same text"]) {
      const second: Mention =
        step === "acronym"
          ? { ...doc[1]!, type: "VESSEL_CODE" }
          : step === "short form"
            ? { id: "b", doc: "D3", text: "Wend Valley", type: "VESSEL_CODE" }
            : { ...doc[0]!, id: "b", type: "VESSEL_CODE" };
      const rows = createLinker(kb, { labels }).linkDocument([doc[0]!, second]);
      expect(rows[0]!.entity).toBe("F1");
      expect(rows[1]!.entity).toBeNull();
      expect(codes(rows[1]!)).toEqual(["not-linkable"]);
    }
  });
  it("without the step, the acronym stays ambiguous", () => {
    const rows = createLinker(kb, { document: { acronyms: false } }).linkDocument(doc);
    expect(rows[1]!.entity).toBeNull();
    expect(codes(rows[1]!)).not.toContain("doc-acronym");
  });
});

describe("same text decided together", () => {
  const doc: Mention[] = [
    {
      id: "a",
      doc: "D4",
      text: "Josiah Pell",
      type: "PER",
      context: "Josiah Pell, who ran the colliers and the schooner trade",
    },
    { id: "b", doc: "D4", text: "Josiah Pell", type: "PER", context: "Josiah Pell said little." },
  ];
  it("the mention without telling context follows the one with it", () => {
    const rows = createLinker(kb).linkDocument(doc);
    expect(rows[1]!.entity).toBe(rows[0]!.entity);
    if (rows[0]!.entity !== null) expect(codes(rows[1]!)).toContain("doc-same-text");
  });
  it("linkAll groups consecutive mentions of a document, and keeps order and count", async () => {
    const linker = createLinker(kb);
    const input: Mention[] = [
      ...doc,
      { id: "c", text: "Stenmoor", type: "LOC" },
      { id: "d", doc: "D5", text: "Aldous", type: "PER" },
    ];
    const rows: LinkRow[] = [];
    for await (const r of linker.linkAll(input)) rows.push(r);
    expect(rows.map((r) => r.mention)).toEqual(["a", "b", "c", "d"]);
  });
});
