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

/**
 * Multi-character confusions, in order of precedence: "rn" -> "m", "cl" -> "d", "vv" -> "w",
 * "li" -> "h". Replacing each pair everywhere, one pair after the other, equals one left-to-right
 * scan that tries them in this order at each position: the only pairs that can overlap are
 * "cl" with a following "li" ("cli": "cl" wins either way) and "vv" with itself (leftmost wins).
 */
const PAIRS: ReadonlyArray<[string, string]> = [
  ["rn", "m"],
  ["cl", "d"],
  ["vv", "w"],
  ["li", "h"],
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

/** UTF-16 units below this are looked up in the tables below; all the confusions are ASCII. */
const TABLE_SIZE = 128;
/** PAIR_OF[first * TABLE_SIZE + second]: the unit a pair becomes, 0 when the pair is none. */
const PAIR_OF = new Uint16Array(TABLE_SIZE * TABLE_SIZE);
for (const [pair, to] of PAIRS)
  PAIR_OF[pair.charCodeAt(0) * TABLE_SIZE + pair.charCodeAt(1)] = to.charCodeAt(0);
/** CLASS_OF[unit]: the unit a character maps to (itself when it is in no class). */
const CLASS_OF = new Uint16Array(TABLE_SIZE);
for (let u = 0; u < TABLE_SIZE; u++)
  CLASS_OF[u] = (CHAR_CLASSES[String.fromCharCode(u)] ?? String.fromCharCode(u)).charCodeAt(0);

const SPACE = 0x20;
/** Units a regular expression's `.` does not match: a run of them was never collapsed. */
function isLineTerminator(u: number): boolean {
  return u === 0x0a || u === 0x0d || u === 0x2028 || u === 0x2029;
}

/** Units turned into a string per call of String.fromCharCode (its arguments go on the stack). */
const UNITS_PER_CALL = 4_096;
/** Output buffer of ocrFold, grown to the longest key seen. */
let units = new Uint16Array(64);

/**
 * The OCR-folded form of a folded key; spaces are removed (OCR often splits or joins words).
 * In one pass over the UTF-16 units, in this order: spaces removed, the pairs replaced,
 * characters mapped to their class, and each run of one repeated unit collapsed to one (doubled
 * letters).
 */
export function ocrFold(key: string): string {
  if (units.length < key.length) units = new Uint16Array(key.length * 2);
  let n = 0;
  let last = -1;
  let prev = -1; // unit before the current one in the space-free text, still unread, or -1
  const emit = (u: number) => {
    if (u === last && !isLineTerminator(u)) return;
    units[n++] = u;
    last = u;
  };
  for (let i = 0; i < key.length; i++) {
    const u = key.charCodeAt(i);
    if (u === SPACE) continue;
    if (prev >= 0) {
      const to = prev < TABLE_SIZE && u < TABLE_SIZE ? PAIR_OF[prev * TABLE_SIZE + u]! : 0;
      if (to !== 0) {
        emit(to);
        prev = -1;
        continue;
      }
      emit(prev < TABLE_SIZE ? CLASS_OF[prev]! : prev);
    }
    prev = u;
  }
  if (prev >= 0) emit(prev < TABLE_SIZE ? CLASS_OF[prev]! : prev);
  let out = "";
  for (let at = 0; at < n; at += UNITS_PER_CALL) {
    const part = units.subarray(at, Math.min(n, at + UNITS_PER_CALL));
    out += String.fromCharCode.apply(null, part as unknown as number[]);
  }
  return out;
}
