/**
 * Token tag schemes and chunking: IOB1, IOB2 (BIO), IOE1, IOE2, BIOES and BILOU.
 *
 * Chunk boundaries follow the chunk semantics of the CoNLL shared-task evaluation script
 * (from memory), which are the same for every scheme: an I- after O or after a tag of another
 * type starts a new chunk; B- and S- always start one; E- and S- end one; a type change ends one.
 * Scheme matters only for deciding whether a chunk is well formed under that scheme.
 */

import { UsageError } from "../util/errors.js";

/** The tag schemes the readers understand. BILOU is BIOES with L = E and U = S. */
export type TagScheme = "IOB1" | "IOB2" | "IOE1" | "IOE2" | "BIOES" | "BILOU";

export const TAG_SCHEMES: readonly TagScheme[] = ["IOB1", "IOB2", "IOE1", "IOE2", "BIOES", "BILOU"];

/** Other names in common use, accepted by `parseScheme` (common practice). */
const SCHEME_ALIASES: Record<string, TagScheme> = { BIO: "IOB2", IOB: "IOB2", IOBES: "BIOES", IOE: "IOE2" };

/** A tag prefix after mapping BILOU's L/U to E/S, or O for the outside tag. */
export type Prefix = "B" | "I" | "E" | "S" | "O";

/** A parsed tag: prefix letter as written, normalized prefix, and the label ("" for O). */
export interface ParsedTag {
  written: string;
  prefix: Prefix;
  label: string;
}

/** Prefix letters as written in files, and their normalized meaning. */
const PREFIXES: Record<string, Prefix> = { B: "B", I: "I", E: "E", S: "S", L: "E", U: "S" };

/** The outside tag. */
const OUTSIDE: ParsedTag = { written: "O", prefix: "O", label: "" };

/** Parse a scheme name (case-insensitive, with aliases); throws UsageError listing the choices. */
export function parseScheme(name: string): TagScheme {
  const upper = name.trim().toUpperCase();
  const scheme = (TAG_SCHEMES as readonly string[]).includes(upper)
    ? (upper as TagScheme)
    : SCHEME_ALIASES[upper];
  if (scheme === undefined) {
    const choices = [...TAG_SCHEMES, ...Object.keys(SCHEME_ALIASES)].join(", ");
    throw new UsageError(`unknown tag scheme "${name}"; choose one of ${choices}`);
  }
  return scheme;
}

/**
 * Parse one tag: `O`, or `P-LABEL` with P one of B, I, E, S, L, U. Returns a problem string
 * (for the caller's error message) when the tag is not of that form.
 */
export function parseTag(tag: string): ParsedTag | string {
  if (tag === "O") return OUTSIDE;
  const dash = tag.indexOf("-");
  if (dash < 0) return `tag "${tag}" has no B-/I-/E-/S-/L-/U- prefix (and is not O)`;
  const written = tag.slice(0, dash);
  const prefix = PREFIXES[written];
  if (prefix === undefined)
    return `unknown tag prefix "${written}-" in "${tag}" (expected B, I, E, S, L, U or O)`;
  const label = tag.slice(dash + 1);
  if (label === "") return `tag "${tag}" has no label after the prefix`;
  return { written, prefix, label };
}

function mustParse(tag: string): ParsedTag {
  const parsed = parseTag(tag);
  if (typeof parsed === "string") throw new UsageError(parsed);
  return parsed;
}

/** One chunk: label and token range (end exclusive) within the tag sequence. */
export interface Chunk {
  label: string;
  start: number;
  end: number;
  /** True when the tags of this chunk are not what `scheme` would produce for it. */
  illFormed: boolean;
}

/** CoNLL evaluation semantics: does the chunk open before `cur` close at `prev`? */
function endsChunk(prev: ParsedTag, cur: ParsedTag): boolean {
  if (prev.prefix === "O") return false;
  if (prev.prefix === "E" || prev.prefix === "S") return true;
  if (cur.prefix === "B" || cur.prefix === "S" || cur.prefix === "O") return true;
  return prev.label !== cur.label;
}

/** CoNLL evaluation semantics: does a chunk start at `cur`? */
function startsChunk(prev: ParsedTag, cur: ParsedTag): boolean {
  if (cur.prefix === "O") return false;
  if (cur.prefix === "B" || cur.prefix === "S") return true;
  if (prev.prefix === "O" || prev.prefix === "E" || prev.prefix === "S") return true;
  return prev.label !== cur.label;
}

/** Is the chunk tags[start, end) what `scheme` would write? `before`/`after` are the neighbours. */
function wellFormed(scheme: TagScheme, tags: ParsedTag[], before: ParsedTag, after: ParsedTag): boolean {
  const first = tags[0]!.prefix;
  const last = tags[tags.length - 1]!.prefix;
  const middleAreI = tags.slice(1, -1).every((t) => t.prefix === "I");
  const label = tags[0]!.label;
  switch (scheme) {
    case "IOB2":
      return first === "B" && tags.slice(1).every((t) => t.prefix === "I");
    case "IOB1":
      // B- only separates two adjacent chunks of the same type; chunks otherwise start with I-.
      if (!tags.slice(1).every((t) => t.prefix === "I")) return false;
      return first === "I" || (first === "B" && before.label === label);
    case "IOE2":
      return last === "E" && tags.slice(0, -1).every((t) => t.prefix === "I");
    case "IOE1":
      // E- only separates two adjacent chunks of the same type; chunks otherwise end with I-.
      if (!tags.slice(0, -1).every((t) => t.prefix === "I")) return false;
      return last === "I" || (last === "E" && after.label === label);
    case "BIOES":
    case "BILOU": {
      const letters = scheme === "BILOU" ? ["B", "I", "L", "U"] : ["B", "I", "E", "S"];
      if (!tags.every((t) => letters.includes(t.written))) return false;
      if (tags.length === 1) return first === "S";
      return first === "B" && last === "E" && middleAreI;
    }
  }
}

/**
 * Chunk a tag sequence (one sentence) into labeled spans. Pure. Throws UsageError on a tag that is
 * not `O` or `P-LABEL` (readers validate tags first and report file and line).
 */
export function chunkTags(tags: readonly string[], scheme: TagScheme): Chunk[] {
  const parsed = tags.map(mustParse);
  return chunkParsed(parsed, scheme);
}

/** `chunkTags` over already parsed tags. */
export function chunkParsed(parsed: readonly ParsedTag[], scheme: TagScheme): Chunk[] {
  const chunks: Chunk[] = [];
  let open = -1;
  const close = (end: number): void => {
    const tags = parsed.slice(open, end);
    const before = parsed[open - 1] ?? OUTSIDE;
    const after = parsed[end] ?? OUTSIDE;
    chunks.push({
      label: tags[0]!.label,
      start: open,
      end,
      illFormed: !wellFormed(scheme, tags, before, after),
    });
    open = -1;
  };
  let prev = OUTSIDE;
  parsed.forEach((cur, i) => {
    if (open >= 0 && endsChunk(prev, cur)) close(i);
    if (startsChunk(prev, cur)) open = i;
    prev = cur;
  });
  if (open >= 0) close(parsed.length);
  return chunks;
}

/**
 * Guesses a file's scheme from its tags, one sentence at a time (so it can run over a stream):
 * L-/U- prefixes mean BILOU; S-, or E- together with B-, mean BIOES; E- without B- means IOE
 * (IOE1 when some chunk ends in I-, else IOE2); otherwise IOB1 when chunks start with I- and B-
 * appears only right after the same type, else IOB2 (the common default).
 */
export class SchemeDetector {
  private readonly letters = new Set<string>();
  private chunkStartsWithI = false;
  private bAfterOther = false;
  private chunkEndsWithI = false;

  /** Feed one sentence's parsed tags. */
  add(tags: readonly ParsedTag[]): void {
    let prev = OUTSIDE;
    tags.forEach((cur, i) => {
      this.letters.add(cur.written);
      const next = tags[i + 1] ?? OUTSIDE;
      const sameAsPrev = prev.prefix !== "O" && prev.label === cur.label;
      const sameAsNext = next.prefix !== "O" && next.label === cur.label;
      if (cur.prefix === "I" && !sameAsPrev) this.chunkStartsWithI = true;
      if (cur.prefix === "B" && !sameAsPrev) this.bAfterOther = true;
      if (cur.prefix === "I" && !sameAsNext) this.chunkEndsWithI = true;
      prev = cur;
    });
  }

  /** The scheme the tags seen so far fit best. */
  result(): TagScheme {
    const has = (letter: string): boolean => this.letters.has(letter);
    if (has("L") || has("U")) return "BILOU";
    if (has("S") || (has("E") && has("B"))) return "BIOES";
    if (has("E")) return this.chunkEndsWithI ? "IOE1" : "IOE2";
    if (this.chunkStartsWithI && !this.bAfterOther) return "IOB1";
    return "IOB2";
  }
}

/** Detect the scheme of whole tag sequences (pure form of `SchemeDetector`, for tests and small inputs). */
export function detectScheme(sentences: Iterable<readonly string[]>): TagScheme {
  const detector = new SchemeDetector();
  for (const tags of sentences) detector.add(tags.map(mustParse));
  return detector.result();
}
