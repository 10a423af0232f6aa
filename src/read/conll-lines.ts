/**
 * Line-level parsing of CoNLL-style token files: one token a line with columns separated by tabs
 * (when the line has a tab) or runs of spaces; blank lines end sentences; `-DOCSTART-` lines
 * separate documents; lines starting with `#` are comments. Ragged rows and unknown tag prefixes
 * are errors naming file and line.
 */

import { InputError } from "../util/errors.js";
import { readTextLines } from "./lines.js";
import { type ParsedTag, parseTag } from "./tags.js";

/** Options for column layout. */
export interface ConllColumns {
  /**
   * Column holding the tag: 0-based from the left, or negative to count from the right
   * (-1 = last column). Default -1 (last), as in the common four-column layout.
   */
  tagColumn?: number | undefined;
  /** Column holding the token text, same numbering. Default 0 (first). */
  tokenColumn?: number | undefined;
}

export const DEFAULT_TAG_COLUMN = -1;
export const DEFAULT_TOKEN_COLUMN = 0;

/** First column of a document separator line. */
const DOCSTART = "-DOCSTART-";
/** Placeholder columns that follow `-DOCSTART-` in the classic layout ("-DOCSTART- -X- -X- O"); not an id. */
const DOCSTART_PLACEHOLDERS: ReadonlySet<string> = new Set(["-X-", "O"]);
/** Comment marker at the start of a line. */
const COMMENT = "#";

export type ConllEvent =
  | { kind: "docstart"; id: string | undefined; line: number }
  | { kind: "token"; token: string; tag: ParsedTag; line: number }
  | { kind: "break"; line: number };

/** Split a line into columns: on tabs when it has any, else on runs of spaces. */
export function splitColumns(text: string): string[] {
  if (text.includes("\t"))
    return text
      .trim()
      .split("\t")
      .map((cell) => cell.trim());
  return text.trim().split(/ +/);
}

function resolveColumn(index: number, count: number): number {
  return index < 0 ? count + index : index;
}

/** Stream the structural events of a CoNLL file. */
export async function* readConllEvents(file: string, columns: ConllColumns = {}): AsyncGenerator<ConllEvent> {
  const tagOption = columns.tagColumn ?? DEFAULT_TAG_COLUMN;
  const tokenOption = columns.tokenColumn ?? DEFAULT_TOKEN_COLUMN;
  let width: number | undefined;
  let tagIndex = 0;
  let tokenIndex = 0;

  const establish = (line: number, count: number): void => {
    tagIndex = resolveColumn(tagOption, count);
    tokenIndex = resolveColumn(tokenOption, count);
    const at = { file, line };
    if (count < 2)
      throw new InputError({ ...at, field: "columns" }, "a token line needs a token and a tag column");
    if (tagIndex < 0 || tagIndex >= count) {
      throw new InputError(
        { ...at, field: "tag" },
        `tag column ${tagOption} does not exist (${count} columns)`,
      );
    }
    if (tokenIndex < 0 || tokenIndex >= count) {
      throw new InputError(
        { ...at, field: "token" },
        `token column ${tokenOption} does not exist (${count} columns)`,
      );
    }
    if (tokenIndex === tagIndex)
      throw new InputError({ ...at, field: "tag" }, "token and tag columns are the same");
    width = count;
  };

  for await (const { line, text } of readTextLines(file)) {
    if (text.trim() === "") {
      yield { kind: "break", line };
      continue;
    }
    const cells = splitColumns(text);
    if (cells[0] === DOCSTART) {
      const id = cells
        .slice(1)
        .filter((c) => c !== "" && !DOCSTART_PLACEHOLDERS.has(c))
        .join(" ");
      yield { kind: "docstart", id: id === "" ? undefined : id, line };
      continue;
    }
    if (text.startsWith(COMMENT) && !looksLikeToken(cells, width, tagIndex)) continue;
    if (width === undefined) establish(line, cells.length);
    if (cells.length !== width) {
      throw new InputError(
        { file, line, field: "columns" },
        `ragged row: ${cells.length} columns where the first token line has ${width}`,
      );
    }
    const tag = parseTag(cells[tagIndex]!);
    if (typeof tag === "string") throw new InputError({ file, line, field: "tag" }, tag);
    yield { kind: "token", token: cells[tokenIndex]!, tag, line };
  }
}

/** A `#` line is a token (the token "#") only when it has the token-line shape and a valid tag. */
function looksLikeToken(cells: string[], width: number | undefined, tagIndex: number): boolean {
  if (width === undefined || cells.length !== width) return false;
  return typeof parseTag(cells[tagIndex] ?? "") !== "string";
}
