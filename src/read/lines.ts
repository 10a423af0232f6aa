/**
 * Streaming text lines of a file, strictly decoded as UTF-8 (see `utf8.ts`), with 1-based line
 * numbers. Every line-oriented reader (JSONL, CoNLL) is built on this.
 */

import { accessSync, createReadStream, constants as fsConstants, statSync } from "node:fs";
import { createInterface } from "node:readline";
import { pipeline, type Transform } from "node:stream";
import { InputError } from "../util/errors.js";
import { strictUtf8 } from "./utf8.js";

/**
 * The file name that stands for standard input, as Unix tools take it: `hawser link --kb KB -`
 * reads the mentions a pipeline writes. Errors name it "stdin" (see InputError).
 */
export const STDIN = "-";

/** One line of text without its line end. */
export interface TextLine {
  /** 1-based line number in the file. */
  line: number;
  text: string;
}

/** Turn a file-system error (missing file, directory, no permission) into an InputError naming the file. */
export function fileError(file: string, error: unknown): Error {
  if (error instanceof InputError) return error;
  const code = (error as NodeJS.ErrnoException | undefined)?.code;
  if (typeof code === "string" && code.startsWith("E")) {
    // Node's message repeats the code and the path ("ENOENT: no such file or directory, open 'x'"):
    // keep its middle part, the reason.
    const message = (error as Error).message;
    const reason = /^E[A-Z]+: ([^,]+)/.exec(message)?.[1] ?? message;
    return new InputError({ file }, `cannot read the file: ${reason} (${code})`);
  }
  return error instanceof Error ? error : new Error(String(error));
}

/**
 * Throws the error reading `file` would end in when it is missing, unreadable or a folder (the
 * same InputError), without opening it: for a caller with costly work to do before it reads
 * (a pool of linking threads to start). Standard input and named pipes pass.
 */
export function checkReadable(file: string): void {
  if (file === STDIN) return;
  try {
    accessSync(file, fsConstants.R_OK);
    if (statSync(file).isDirectory())
      throw Object.assign(new Error("EISDIR: illegal operation on a directory, read"), { code: "EISDIR" });
  } catch (e) {
    throw fileError(file, e);
  }
}

/** Receives the file's raw bytes as they are read (e.g. to hash the file in the same pass). */
export type BytesTap = (chunk: Buffer) => void;

/**
 * The decoded text of `file` as a readable stream of strings (object mode), for parsers that take
 * a stream (CSV). Errors (file system, invalid UTF-8) surface on the returned stream.
 */
export function openText(file: string, onBytes?: BytesTap): Transform {
  const decoder = strictUtf8(file);
  const raw = file === STDIN ? process.stdin : createReadStream(file);
  if (onBytes) raw.on("data", (chunk: Buffer | string) => onBytes(chunk as Buffer));
  pipeline(raw, decoder, () => {
    // Errors are forwarded to `decoder` by pipeline; its consumer reports them.
  });
  return decoder;
}

/** Yield the lines of `file` one by one (LF, CRLF or CR line ends), streaming. */
export async function* readTextLines(file: string, onBytes?: BytesTap): AsyncGenerator<TextLine> {
  const input = openText(file, onBytes);
  const lines = createInterface({ input, crlfDelay: Number.POSITIVE_INFINITY });
  let line = 0;
  try {
    for await (const text of lines) {
      line++;
      yield { line, text };
    }
  } catch (error) {
    throw fileError(file, error);
  } finally {
    lines.close();
    input.destroy();
  }
}
