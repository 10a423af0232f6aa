/** Non-fatal findings of the readers (e.g. ill-formed tag sequences), reported through `onWarning`. */

import { fileShown } from "../util/errors.js";

export interface ReadWarning {
  /** Stable code for programs: e.g. "ill-formed-tags". */
  code: string;
  file: string;
  /** First line where the problem was seen. */
  line?: number | undefined;
  /** How many times it was seen in the file. */
  count: number;
  /** A sentence for people. */
  message: string;
}

/** Callback receiving warnings as they are found. */
export type WarningHandler = (warning: ReadWarning) => void;

/** A warning as one line for people: "file:line: message" (standard input, "-", named "stdin"). */
export function warningLine(w: ReadWarning): string {
  return `${fileShown(w.file)}${w.line === undefined ? "" : `:${w.line}`}: ${w.message}`;
}

/** The command line's report of a warning: one line on stderr, "hawser: warning: ...". */
export function printWarning(message: string): void {
  process.stderr.write(`hawser: warning: ${message}\n`);
}

/** A warning handler that also keeps every message, for a result's `warnings`. */
export function keepingWarnings(warn: ((message: string) => void) | undefined): {
  warnings: string[];
  note: (message: string) => void;
} {
  const warnings: string[] = [];
  return {
    warnings,
    note: (message) => {
      warnings.push(message);
      warn?.(message);
    },
  };
}
