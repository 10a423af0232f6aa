/**
 * JSON Lines reading shared by every stage: one JSON object a line, streamed, blank lines skipped.
 * Malformed JSON, a value that is not an object and invalid UTF-8 are errors naming file and line.
 */

import { InputError } from "../util/errors.js";
import { type BytesTap, readTextLines, STDIN } from "./lines.js";

/** One parsed line: its 1-based line number and the object it holds. */
export interface JsonLine {
  line: number;
  value: unknown;
}

/** Short name of a JSON value's kind, for error messages. */
export function jsonKind(value: unknown): string {
  if (value === null) return "null";
  if (Array.isArray(value)) return "an array";
  return typeof value === "object" ? "an object" : `a ${typeof value}`;
}

/**
 * A hint for a first line of standard input that reads as a CSV or TSV header: standard input
 * has no extension to tell its format by, so it is read as JSONL unless told otherwise.
 */
function stdinHint(file: string, line: number, text: string): string {
  if (file !== STDIN || line !== 1 || text.trimStart().startsWith("{") || !/[,\t;]/.test(text)) return "";
  return " (standard input is read as JSONL; for CSV or TSV give --from csv or --from tsv, or save it to a .csv or .tsv file)";
}

/**
 * Stream the objects of a JSONL file. `value` is always a plain object (never an array, string,
 * number or null); the declared type stays `unknown` so that callers validate fields themselves.
 */
export async function* readJsonLines(file: string, onBytes?: BytesTap): AsyncGenerator<JsonLine> {
  for await (const { line, text } of readTextLines(file, onBytes)) {
    if (text.trim() === "") continue;
    let value: unknown;
    try {
      value = JSON.parse(text);
    } catch (error) {
      throw new InputError(
        { file, line },
        `malformed JSON: ${(error as Error).message}${stdinHint(file, line, text)}`,
      );
    }
    if (typeof value !== "object" || value === null || Array.isArray(value)) {
      throw new InputError({ file, line }, `expected a JSON object, found ${jsonKind(value)}`);
    }
    yield { line, value };
  }
}
