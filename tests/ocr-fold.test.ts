/**
 * ocrFold is one pass over the key; its definition is a sequence of global replacements (the
 * form it had before the one-pass version). The two must agree on every string, including the
 * overlapping pairs ("cli", "vvv"), spaces between the letters of a pair ("r n"), line ends
 * (which a regular expression's "." does not match) and characters outside ASCII.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ocrFold } from "../src/normalize/ocr.js";

/** The definition: spaces removed, rn/cl/vv/li replaced in that order, classes mapped, repeats collapsed. */
function ocrFoldByReplacements(key: string): string {
  let s = key.replace(/ /g, "");
  for (const [re, to] of [
    [/rn/g, "m"],
    [/cl/g, "d"],
    [/vv/g, "w"],
    [/li/g, "h"],
  ] as const)
    s = s.replace(re, to);
  const classes: Record<string, string> = {
    "1": "l",
    i: "l",
    j: "l",
    "|": "l",
    "!": "l",
    "0": "o",
    "5": "s",
    "8": "b",
    c: "e",
  };
  let out = "";
  for (const ch of s) out += classes[ch] ?? ch;
  return out.replace(/(.)\1+/g, "$1");
}

/** Letters of the confusions, their results, separators and a few non-ASCII units. */
const ALPHABET = [
  "r",
  "n",
  "m",
  "c",
  "l",
  "d",
  "v",
  "w",
  "i",
  "h",
  "j",
  "e",
  "1",
  "|",
  "!",
  "0",
  "o",
  "5",
  "s",
  "8",
  "b",
  " ",
  "\n",
  "\r",
  "\u2028",
  "é",
  "ł",
  "\ud835",
  "\udc00",
  "a",
];

describe("ocrFold", () => {
  it("equals the sequence of replacements it is defined by, on any string", () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...ALPHABET), { maxLength: 24 }), (chars) => {
        const key = chars.join("");
        expect(ocrFold(key)).toBe(ocrFoldByReplacements(key));
      }),
      { numRuns: 20_000 },
    );
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 40 }), (key) => {
        expect(ocrFold(key)).toBe(ocrFoldByReplacements(key));
      }),
      { numRuns: 5_000 },
    );
  });

  it("agrees on the worked overlaps and on a key longer than one conversion call", () => {
    for (const key of [
      "cli",
      "clli",
      "vvv",
      "vvvv",
      "r n",
      "lirn",
      "rnrn",
      "ccll",
      "",
      " ",
      "1l",
      "harrington",
    ])
      expect(ocrFold(key)).toBe(ocrFoldByReplacements(key));
    const long = "aldous clinch ".repeat(1_000);
    expect(ocrFold(long)).toBe(ocrFoldByReplacements(long));
  });
});
