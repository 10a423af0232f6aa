/**
 * OCR-confusion folding: a second, coarser key under which the usual misreadings of old newsprint
 * collapse together. Both the table's aliases and the mentions are folded the same way, so a
 * mention read as "Stenrnouth" meets the alias "Stenmouth", or "A1dous" meets "Aldous", when the
 * exact key misses.
 *
 * The confusion pairs are common practice for OCR of letterpress: rn/m, cl/d, vv/w, li/h,
 * 1/l/i, 0/o, 5/s, 8/b, c/e; doubled letters are also collapsed (a dropped or doubled
 * letter is a frequent misreading).
 */

/** Multi-character confusions, replaced first (longest first). */
const SEQUENCES: ReadonlyArray<[RegExp, string]> = [
  [/rn/g, "m"],
  [/cl/g, "d"],
  [/vv/g, "w"],
  [/li/g, "h"],
];

/** Single-character confusion classes: every member maps to the class's representative. */
const CHAR_CLASSES: Readonly<Record<string, string>> = {
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

const REPEATS = /(.)\1+/g;

/** The OCR-folded form of a folded key; spaces are removed (OCR often splits or joins words). */
export function ocrFold(key: string): string {
  let s = key.replace(/ /g, "");
  for (const [re, to] of SEQUENCES) s = s.replace(re, to);
  let out = "";
  for (const ch of s) out += CHAR_CLASSES[ch] ?? ch;
  return out.replace(REPEATS, "$1");
}
