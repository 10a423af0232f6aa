/**
 * Reuse of per-spelling work across mentions (src/link/surface-cache.ts): the rows are the same
 * with reuse on, off, or squeezed into a tiny cache, on the bundled sample archive, whose
 * mentions repeat spellings as a real archive does; and the cache's own bounds.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { SAMPLES_DIR } from "../src/commands/demo.js";
import { buildKb } from "../src/kb/build.js";
import { type Kb, openKb } from "../src/kb/kb.js";
import { createLinker } from "../src/link/linker.js";
import { SurfaceCache } from "../src/link/surface-cache.js";
import type { LinkRow, Mention } from "../src/types.js";
import { UsageError } from "../src/util/errors.js";
import { tempDir } from "./helpers/gazette.js";

let t: ReturnType<typeof tempDir>;
let kb: Kb;
let mentions: Mention[];

beforeAll(async () => {
  t = tempDir("hawser-surface-");
  await buildKb({ table: join(SAMPLES_DIR, "gazette-entities.csv"), out: t.file("kb.sqlite") });
  kb = openKb(t.file("kb.sqlite"));
  mentions = readFileSync(join(SAMPLES_DIR, "gazette-mentions.jsonl"), "utf8")
    .trim()
    .split("\n")
    .map((l) => JSON.parse(l) as Mention);
});
afterAll(() => {
  kb.close();
  t.cleanup();
});

async function linkAllWith(surfaceCache: number): Promise<{ rows: LinkRow[]; held: number }> {
  const linker = createLinker(kb, { surfaceCache });
  const rows: LinkRow[] = [];
  for await (const r of linker.linkAll(mentions)) rows.push(r);
  // Each mention once more on its own, now that its spelling has been seen.
  for (const m of mentions.slice(0, 200)) rows.push(linker.link(m));
  return { rows, held: linker.cachedSurfaces };
}

describe("surface reuse", () => {
  it("gives the same rows with reuse on, off, and in a cache of three surfaces", async () => {
    // Spellings seen at least twice over the run (linkAll, then the first 200 again) are held.
    const seen = new Map<string, number>();
    for (const m of [...mentions, ...mentions.slice(0, 200)]) {
      const key = `${m.type}\u0000${m.text}`;
      seen.set(key, (seen.get(key) ?? 0) + 1);
    }
    const repeated = [...seen.values()].filter((n) => n >= 2).length;
    expect(repeated).toBeGreaterThan(100); // the sample repeats spellings
    const off = await linkAllWith(0);
    const on = await linkAllWith(4096);
    const tiny = await linkAllWith(3);
    expect(off.held).toBe(0);
    expect(on.held).toBe(repeated);
    expect(tiny.held).toBeGreaterThan(0);
    expect(tiny.held).toBeLessThanOrEqual(3);
    expect(on.rows).toEqual(off.rows);
    expect(tiny.rows).toEqual(off.rows);
    expect(off.rows.filter((r) => r.entity !== null).length).toBeGreaterThan(mentions.length / 2);
  });

  it("rejects a cache size that is not a whole number >= 0", () => {
    expect(() => createLinker(kb, { surfaceCache: -1 })).toThrow(UsageError);
    expect(() => createLinker(kb, { surfaceCache: 2.5 })).toThrow(UsageError);
  });
});

describe("SurfaceCache", () => {
  const forms = () => [];
  /** The surface of `key`, held: seen once before, then fetched. */
  const held = (c: SurfaceCache, key: string) => {
    c.get(key, forms);
    return c.get(key, forms);
  };

  it("holds a surface from its second sighting on", () => {
    const c = new SurfaceCache(2, 1000);
    const first = c.get("a", forms);
    expect([first.held, c.size]).toEqual([false, 0]);
    const second = c.get("a", forms);
    expect(second).not.toBe(first);
    expect([second.held, c.size]).toEqual([true, 1]);
    expect(c.get("a", forms)).toBe(second);
  });

  it("forgets single sightings past four per surface it may hold", () => {
    const c = new SurfaceCache(1, 1000);
    for (const k of ["a", "b", "c", "d"]) c.get(k, forms);
    c.get("e", forms); // the fifth: sightings start afresh
    expect(c.get("a", forms).held).toBe(false);
    expect(c.get("e", forms).held).toBe(true);
  });

  it("drops the least recently used surface past its count", () => {
    const c = new SurfaceCache(2, 1000);
    const a = held(c, "a");
    held(c, "b");
    expect(c.get("a", forms)).toBe(a); // a is now the most recent
    held(c, "c"); // drops b
    expect(c.size).toBe(2);
    expect(c.get("a", forms)).toBe(a);
    expect(c.get("b", forms).held).toBe(false); // dropped: seen afresh
    expect(held(c, "b").held).toBe(true); // and held again, dropping c
    expect(a.held).toBe(true);
  });

  it("drops surfaces past its weight, and a surface heavier than the budget at once", () => {
    const c = new SurfaceCache(100, 10);
    const a = held(c, "a");
    const b = held(c, "b");
    c.grow(a, 5); // a 6, b 1: 7
    c.grow(b, 3); // 10: still within
    expect([a.held, b.held]).toEqual([true, true]);
    held(c, "c"); // 11: a, the oldest, goes
    expect([a.held, b.held, c.size]).toEqual([false, true, 2]);
    c.grow(a, 100); // no longer held: not counted
    const d = held(c, "d");
    c.grow(d, 50);
    expect(d.held).toBe(false);
    expect(c.size).toBe(0); // everything older went first, then d itself
  });

  it("holds nothing with a count of 0, yet hands out usable surfaces", () => {
    const c = new SurfaceCache(0, 10);
    const s = c.get("a", () => [{ cls: "person", norm: null as never }]);
    expect(s.forms).toHaveLength(1);
    expect(s.held).toBe(false);
    expect(held(c, "a").held).toBe(false);
    expect(c.size).toBe(0);
  });
});
