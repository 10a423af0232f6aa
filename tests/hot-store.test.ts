/**
 * The hot store (src/kb/hot.ts) holds copies of facts that also live in SQLite rows: every copy
 * must agree with its source, on the sample archive's table (kb-samples/gazette-entities.csv).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildKb } from "../src/kb/build.js";
import Database from "better-sqlite3";
import { HotStore, HotStoreBuilder, tokenBits } from "../src/kb/hot.js";
import { type Kb, openKb } from "../src/kb/kb.js";
import { idVector } from "../src/score/context.js";
import { buildVector, cosine, idf } from "../src/score/tfidf.js";
import { tempDir } from "./helpers/gazette.js";

const t = tempDir();
let kb: Kb;

beforeAll(async () => {
  await buildKb({ table: "kb-samples/gazette-entities.csv", out: t.file("gazette.kb") });
  kb = openKb(t.file("gazette.kb"));
});
afterAll(() => {
  kb.close();
  t.cleanup();
});

const allEids = () => Array.from({ length: kb.info.entities }, (_, i) => i + 1);

describe("the hot store", () => {
  it("holds one slot per entity, with the entity's class and prior", () => {
    expect(kb.hot.entities).toBe(kb.info.entities);
    for (const e of kb.entities(allEids())) {
      expect(kb.hot.classOf(e.eid)).toBe(e.cls);
      expect(kb.hot.prior[e.eid]).toBeCloseTo(e.prior, 2);
    }
  });

  /** Every entity's context terms, read back from its term ids through the KB's term table. */
  const termsOf = (eid: number): string[] => {
    const termOfId = new Map(
      (kb.db.prepare("SELECT term, id FROM idf").all() as Array<{ term: string; id: number }>).map((r) => [
        r.id,
        r.term,
      ]),
    );
    const h = kb.hot;
    return [...h.termIds.subarray(h.termStart[eid]!, h.termStart[eid + 1]!)].map((id) => termOfId.get(id)!);
  };

  it("stores context norms equal to the TF-IDF norm of the entity's terms", () => {
    const idfOf = (term: string) => idf(kb.termDf(term), kb.info.contextDocs);
    let nonZero = 0;
    for (const e of kb.entities(allEids())) {
      expect(e.contextNorm).toBeCloseTo(buildVector(termsOf(e.eid), idfOf).norm, 9);
      if (e.contextNorm > 0) nonZero++;
    }
    expect(nonZero).toBeGreaterThan(300);
  });

  it("gives the plain TF-IDF cosine of mention and entity context", () => {
    const idfOf = (term: string) => idf(kb.termDf(term), kb.info.contextDocs);
    const n = kb.info.entities;
    let positive = 0;
    // Mention contexts made of the terms of neighbouring entities, plus a word no entity has.
    for (let eid = 1; eid + 1 <= n; eid += 7) {
      const words = [...termsOf(eid).slice(0, 3), ...termsOf(eid + 1).slice(0, 2), "zzqx"];
      const v = buildVector(words, idfOf);
      const mention = idVector(v, idfOf, (term) => kb.termInfo(term).id);
      for (let e = eid; e < Math.min(n + 1, eid + 3); e++) {
        const c = kb.hot.contextCosine(mention, e);
        expect(c).toBeCloseTo(cosine(v, buildVector(termsOf(e), idfOf)), 12);
        if (c > 0) positive++;
      }
    }
    expect(positive).toBeGreaterThan(50);
    expect(kb.termInfo("zzqx")).toEqual({ df: 0, id: -1 });
  });

  it("never denies a token an entity's names carry", () => {
    for (const e of kb.entities(allEids())) {
      for (const a of e.aliases)
        for (const tok of a.tokens) expect(kb.hot.mayHaveToken(e.eid, tokenBits(tok))).toBe(true);
    }
  });

  it("maps full-text hits to entities whose names carry the token searched", () => {
    for (const tok of ["aldous", "stenmouth", "grain", "wharf"]) {
      const eids = kb.searchAliases([tok], 50);
      if (kb.tokenDf(tok) > 0) expect(eids.length).toBeGreaterThan(0);
      for (const e of kb.entities(eids)) expect(e.aliases.some((a) => a.tokens.includes(tok))).toBe(true);
    }
  });
  it("answers every blocking key with exactly the rows of the KB's keys table", () => {
    const rows = kb.db.prepare("SELECT key, class, kind, eid FROM keys").all() as Array<{
      key: string;
      class: string;
      kind: string;
      eid: number;
    }>;
    const sqlHits = new Map<string, string[]>();
    for (const r of rows)
      sqlHits.set(r.key, [...(sqlHits.get(r.key) ?? []), `${r.class}/${r.kind}/${r.eid}`]);
    expect(sqlHits.size).toBeGreaterThan(500);
    for (const [key, want] of sqlHits) {
      const got: string[] = [];
      kb.hot.forEachKeyHit(key, (cls, kind, eid) => got.push(`${cls}/${kind}/${eid}`));
      expect(got.sort()).toEqual(want.sort());
      // The library's batched form answers the same.
      expect(
        kb
          .lookupKeys([key])
          .map((h) => `${h.cls}/${h.kind}/${h.eid}`)
          .sort(),
      ).toEqual(want.sort());
    }
    const none: string[] = [];
    kb.hot.forEachKeyHit("no such key in the gazette", (cls, kind, eid) =>
      none.push(`${cls}/${kind}/${eid}`),
    );
    expect(none).toEqual([]);
  });
});

describe("term ids past 16 bits", () => {
  const many = (n: number) => Array.from({ length: n }, (_, i) => `term${i}`);
  /** A hot store written and loaded through an in-memory SQLite file with the KB's hot table. */
  const roundTrip = (distinctTerms: number) => {
    const b = new HotStoreBuilder();
    const name = (id: number) => [{ tokens: [id], tail: "", canonical: true }];
    b.add({
      cls: "organization",
      prior: 10,
      terms: many(distinctTerms),
      nameTokens: ["pell"],
      names: name(0),
      id: "O1",
      hasAttributes: false,
      name: "Pell",
    });
    b.add({
      cls: "person",
      prior: 5,
      terms: ["term0", `term${distinctTerms - 1}`, `term${distinctTerms - 1}`],
      nameTokens: ["marsh"],
      names: name(1),
      id: "P1",
      hasAttributes: true,
      name: "Marsh",
    });
    const db = new Database(":memory:");
    db.exec(
      "CREATE TABLE hot (name TEXT NOT NULL, part INTEGER NOT NULL, data BLOB NOT NULL, PRIMARY KEY (name, part))",
    );
    const empty = { start: new Uint32Array([0, 0]), check: new Uint32Array(0), value: new Uint32Array(0) };
    b.write(
      db,
      new Uint32Array([0]),
      empty,
      {
        words: empty,
        start: new Uint32Array([0]),
        eids: new Uint32Array(0),
      },
      2,
    );
    const hot = new HotStore(db);
    db.close();
    return { hot, b };
  };

  for (const [distinct, width] of [
    [1000, Uint16Array],
    [70_000, Uint32Array],
  ] as const) {
    it(`stores ${distinct} distinct terms as ${width.name} ids and scores them alike`, () => {
      const { hot, b } = roundTrip(distinct);
      expect(hot.termIds).toBeInstanceOf(width);
      const last = `term${distinct - 1}`;
      expect([...hot.termIds.subarray(hot.termStart[2]!, hot.termStart[3]!)]).toEqual([
        b.termIdOf.get("term0"),
        b.termIdOf.get(last),
        b.termIdOf.get(last),
      ]);
      // Cosines over the stored ids equal the plain TF-IDF cosine of the term lists.
      const idfOf = (t: string) => idf(b.dfOf(t), 2);
      const words = [last, "term1"];
      const v = buildVector(words, idfOf);
      const mention = idVector(v, idfOf, (t) => b.termIdOf.get(t) ?? -1);
      const second = buildVector(["term0", last, last], idfOf);
      expect(hot.contextCosine(mention, 2)).toBeCloseTo(cosine(v, second), 12);
      expect(hot.contextCosine(mention, 2)).toBeGreaterThan(0.3);
      expect(hot.contextCosine(mention, 1)).toBeCloseTo(cosine(v, buildVector(many(distinct), idfOf)), 12);
    });
  }
});
