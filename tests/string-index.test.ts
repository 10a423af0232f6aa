/**
 * The hashed string multimap behind blocking keys and deletion variants (src/kb/string-index.ts):
 * every value added under a string comes back, in insertion order, and strings never added find
 * nothing (checked over many absent strings, where a false hit needs two 32-bit hashes to agree).
 */
import { describe, expect, it } from "vitest";
import { StringIndex, StringIndexBuilder } from "../src/kb/string-index.js";

const valuesOf = (index: StringIndex, s: string): number[] => {
  const out: number[] = [];
  index.forEach(s, (v) => out.push(v));
  return out;
};

describe("StringIndex", () => {
  it("answers nothing when empty", () => {
    const index = new StringIndex(new StringIndexBuilder().build());
    expect(index.size).toBe(0);
    expect(index.has("")).toBe(false);
    expect(valuesOf(index, "harrow")).toEqual([]);
  });

  it("returns every value of a string in the order added, across many strings", () => {
    const b = new StringIndexBuilder();
    const expected = new Map<string, number[]>();
    // Interleave the strings so values of one string are not added side by side.
    for (let round = 0; round < 3; round++)
      for (let i = 0; i < 5000; i++) {
        const s = `key-${i}`;
        if (i % (round + 1) !== 0) continue;
        const v = i * 10 + round;
        b.add(s, v);
        expected.set(s, [...(expected.get(s) ?? []), v]);
      }
    const index = new StringIndex(b.build());
    expect(index.size).toBe([...expected.values()].reduce((n, vs) => n + vs.length, 0));
    for (const [s, vs] of expected) {
      expect(valuesOf(index, s)).toEqual(vs);
      expect(index.has(s)).toBe(true);
    }
  });

  it("finds no value for strings never added", () => {
    const b = new StringIndexBuilder();
    for (let i = 0; i < 20000; i++) b.add(`w${i}`, i);
    const index = new StringIndex(b.build());
    let falseHits = 0;
    for (let i = 0; i < 20000; i++) if (index.has(`x${i}`) || index.has(`w${i}w`)) falseHits++;
    expect(falseHits).toBe(0);
    expect(valuesOf(index, "w")).toEqual([]);
  });

  it("tells apart strings that differ only in case, accents or one letter", () => {
    const b = new StringIndexBuilder();
    b.add("marsh", 1);
    b.add("Marsh", 2);
    b.add("marsh\u00e9", 3);
    b.add("marah", 4);
    const index = new StringIndex(b.build());
    expect(valuesOf(index, "marsh")).toEqual([1]);
    expect(valuesOf(index, "Marsh")).toEqual([2]);
    expect(valuesOf(index, "marsh\u00e9")).toEqual([3]);
    expect(valuesOf(index, "marah")).toEqual([4]);
  });

  it("keeps full 32-bit values", () => {
    const b = new StringIndexBuilder();
    b.add("big", 0xffffffff);
    b.add("big", 0);
    expect(valuesOf(new StringIndex(b.build()), "big")).toEqual([0xffffffff, 0]);
  });

  it("rejects arrays that were not built together", () => {
    const b = new StringIndexBuilder();
    b.add("a", 1);
    const arrays = b.build();
    expect(() => new StringIndex({ ...arrays, value: new Uint32Array(0) })).toThrow(/different lengths/);
    expect(() => new StringIndex({ ...arrays, start: new Uint32Array(4) })).toThrow(/power of two/);
  });
});
