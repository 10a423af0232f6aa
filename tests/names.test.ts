/**
 * Entity rows are assembled from the in-memory name store (src/kb/names.ts) and the hot store,
 * with the stored fields read lazily: every field must equal what the entity's SQLite row says
 * (decoded directly, as the brute-force scan reads it), on the sample archive, a generated
 * benchmark table, and names with legal forms, suffixes and other scripts.
 */
import { describe, expect, it } from "vitest";
import { type EntityRow, openKb } from "../src/kb/kb.js";
import { Display, DisplayBuilder } from "../src/kb/display.js";
import { storedName } from "../src/kb/names.js";
import { ENTITY_CLASSES } from "../src/types.js";
import { threeKbs } from "./helpers/three-kbs.js";

const NAMES_CSV = [
  "id,name,type,aliases,prior",
  "N01,Pell & Sons Ltd.,firm,Pell and Sons Limited|Pell Bros. & Co.,12.625",
  "N02,Tobias Pell Jr.,person,T. Pell Jr.|Pell Jnr.,3",
  "N03,Ωμέγα Ναυτιλιακή Α.Ε.,firm,,0.1",
  "N04,(unnamed),vessel,,0",
  "N05,Harbour Board of Stenmouth,organization,The Stenmouth Harbour Board,1e6",
  "",
].join("\n");

const three = threeKbs({ csv: NAMES_CSV, generatedEntities: 2000, generatedMentions: 10, seed: 9 });
const kbs = three.kbs;

/** Every field of a row as plain data (rows from memory answer some fields through getters). */
const plain = (e: EntityRow) => ({
  eid: e.eid,
  id: e.id,
  name: e.name,
  type: e.type,
  cls: e.cls,
  prior: e.prior,
  contextNorm: e.contextNorm,
  attributes: e.attributes,
  aliases: e.aliases.map((a) => ({
    aid: a.aid,
    text: a.text,
    key: a.key,
    full: a.full,
    ocr: a.ocr,
    canonical: a.canonical,
    tokens: a.tokens,
  })),
});

describe("entity rows from memory", () => {
  it("equal the entities' SQLite rows, field for field", () => {
    for (const kb of kbs) {
      let compared = 0;
      let withTail = 0;
      for (const cls of ENTITY_CLASSES) {
        for (const stored of kb.entityRowsOfClass(cls)) {
          const fromMemory = kb.entity(stored.eid);
          expect(plain(fromMemory)).toEqual(plain(stored));
          compared++;
          if (stored.aliases.some((a) => a.full !== a.key)) withTail++;
        }
      }
      expect(compared).toBe(kb.info.entities);
      if (kb === kbs[2]) expect(withTail).toBeGreaterThanOrEqual(2);
    }
  });

  it("read no row until a stored field is asked for", () => {
    // A fresh handle: the first test read every field of the rows the other one caches.
    const kb = openKb(three.file("own.kb"));
    kbs.push(kb);
    const e = kb.entity(kb.eidOf("N02")!);
    // The scoring facts are own fields; id, name, type and attributes are not yet read.
    expect(Object.keys(e)).toEqual(expect.arrayContaining(["eid", "cls", "prior", "contextNorm", "aliases"]));
    expect(Object.hasOwn(e, "stored") && (e as unknown as { stored: unknown }).stored).toBe(null);
    expect(e.aliases.map((a) => a.full)).toEqual(["tobias pell jr", "t pell jr", "pell jr"]);
    expect((e as unknown as { stored: unknown }).stored).toBe(null);
    // The table id and name come from memory too (display.ts).
    expect(e.id).toBe("N02");
    expect(e.name).toBe("Tobias Pell Jr.");
    expect((e as unknown as { stored: unknown }).stored).toBe(null);
    // The canonical name's text is the name; a row without attributes has none to read.
    expect(e.aliases[0]!.text).toBe("Tobias Pell Jr.");
    expect(e.attributes).toEqual({});
    expect((e as unknown as { stored: unknown }).stored).toBe(null);
    expect(e.aliases.map((a) => a.text)).toEqual(["Tobias Pell Jr.", "T. Pell Jr.", "Pell Jnr."]);
    expect((e as unknown as { stored: unknown }).stored).not.toBe(null);
  });

  it("refuses internal ids outside the table", () => {
    const kb = kbs[0]!;
    for (const bad of [0, -1, kb.info.entities + 1, 1.5]) expect(() => kb.entity(bad)).toThrow(/no entity/);
  });
});

describe("storedName", () => {
  it("keeps the key's tokens and what the full form adds", () => {
    const ids = new Map<string, number>();
    const idOf = (w: string) => {
      if (!ids.has(w)) ids.set(w, ids.size);
      return ids.get(w)!;
    };
    expect(storedName("pell sons", "pell sons ltd", true, idOf)).toEqual({
      tokens: [0, 1],
      tail: "ltd",
      canonical: true,
    });
    expect(storedName("tobias pell", "tobias pell", false, idOf)).toEqual({
      tokens: [2, 0],
      tail: "",
      canonical: false,
    });
    expect(() => storedName("pell", "ltd pell", true, idOf)).toThrow(/does not extend/);
  });
});

describe("the display store", () => {
  it("gives back every id and name, in any script, past its first buffer's size", () => {
    const b = new DisplayBuilder();
    const rows = Array.from({ length: 30_000 }, (_, i) => [
      `gz${i}`,
      i % 3 === 0 ? `Ωμέγα Ναυτιλιακή ${i}` : `Harrowmouth Steam Packet & Lighterage Co. No. ${i}`,
    ]);
    rows.forEach(([id, name], i) => {
      b.add(id!, name!, i % 7 === 0);
    });
    const built = b.build();
    expect(built.text.length).toBeGreaterThan(1 << 20);
    const d = new Display(built);
    expect(d.entities).toBe(rows.length);
    rows.forEach(([id, name], i) => {
      expect(d.id(i + 1)).toBe(id);
      expect(d.name(i + 1)).toBe(name);
      expect(d.hasAttributes(i + 1)).toBe(i % 7 === 0);
    });
  });

  it("refuses attribute flags that do not match the entities", () => {
    const b = new DisplayBuilder();
    b.add("a", "Ada", false);
    const built = b.build();
    expect(() => new Display({ ...built, attributed: new Uint8Array(5) })).toThrow(/attribute flags/);
  });
});
