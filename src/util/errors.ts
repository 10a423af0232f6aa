/**
 * Errors hawser raises for bad input and bad usage. The CLI maps them to exit codes:
 * InputError -> 1 (the message names file, line and field), UsageError -> 2.
 */

/** Where in a file a problem was found. `line` is 1-based; `field` is a column or JSON key. */
export interface InputLocation {
  file: string;
  line?: number | undefined;
  field?: string | undefined;
}

/**
 * A file name as messages give it: "-" is standard input (src/read/lines.ts STDIN, not imported
 * here, which it imports), and a message that starts "-:12:" reads as noise.
 */
export function fileShown(file: string): string {
  return file === "-" ? "stdin" : file;
}

/** Bad input data: the message always starts with `file:line` and names the field when known. */
export class InputError extends Error {
  readonly file: string;
  readonly line: number | undefined;
  readonly field: string | undefined;
  /** What is wrong, without the location (the message is the two together). */
  readonly problem: string;

  constructor(location: InputLocation, problem: string) {
    const file = fileShown(location.file);
    const where = location.line === undefined ? file : `${file}:${location.line}`;
    const field = location.field === undefined ? "" : ` field "${location.field}":`;
    super(`${where}:${field} ${problem}`);
    this.name = "InputError";
    this.file = location.file;
    this.line = location.line;
    this.field = location.field;
    this.problem = problem;
  }
}

/** Wrong use of a command or API (unknown option, missing argument, incompatible settings). */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "UsageError";
  }
}

/**
 * A value as a usage error shows it: JSON, but numbers as JavaScript writes them (NaN, Infinity:
 * JSON says null) and a missing value as "nothing".
 */
export function shown(v: unknown): string {
  if (v === undefined) return "nothing";
  return typeof v === "number" ? String(v) : (JSON.stringify(v) ?? String(v));
}

/** A number in [lo, hi], else a UsageError naming it. */
export function checkRange(name: string, v: unknown, lo: number, hi: number): number {
  if (!(typeof v === "number" && v >= lo && v <= hi))
    throw new UsageError(`${name} must be a number in [${lo}, ${hi}], got ${shown(v)}`);
  return v;
}

/** A whole number in [lo, hi] (lo -Infinity: any whole number), else a UsageError naming it. */
export function checkWhole(name: string, v: unknown, lo: number, hi = Number.MAX_SAFE_INTEGER): number {
  if (!(typeof v === "number" && Number.isInteger(v) && v >= lo && v <= hi)) {
    const bounds = hi !== Number.MAX_SAFE_INTEGER ? ` in [${lo}, ${hi}]` : lo > -Infinity ? ` >= ${lo}` : "";
    throw new UsageError(`${name} must be a whole number${bounds}, got ${shown(v)}`);
  }
  return v;
}

/**
 * Throws a UsageError unless each named option of a library call is a non-empty string (a path);
 * `optional` names may also be absent (undefined). A number is no path: Node would read it as a
 * file descriptor (0, standard input).
 */
export function requirePaths(
  call: string,
  options: object,
  names: readonly string[],
  optional: readonly string[] = [],
): void {
  if (typeof options !== "object" || options === null || Array.isArray(options))
    throw new UsageError(`${call} needs an object of options, got ${String(options)}`);
  const o = options as Record<string, unknown>;
  for (const name of [...names, ...optional]) {
    const v = o[name];
    if (v === undefined && optional.includes(name)) continue;
    if (typeof v !== "string" || v === "")
      throw new UsageError(`${call} needs ${name}, a file name, got ${shown(v)}`);
  }
}

/** Throws a UsageError unless `v` is a function or absent (a callback option). */
export function requireCallback(call: string, name: string, v: unknown): void {
  if (v !== undefined && typeof v !== "function")
    throw new UsageError(`${call}: ${name} must be a function, got ${shown(v)}`);
}

/**
 * An output that cannot be written (a full disk, a closed or failing standard output): no fault
 * of the input or of hawser. The command line exits 74 (EX_IOERR of sysexits.h) on it.
 */
export class OutputError extends Error {
  readonly target: string;
  readonly causeMessage: string;

  constructor(target: string, cause: Error) {
    super(`cannot write ${target}: ${cause.message}`);
    this.name = "OutputError";
    this.target = target;
    this.causeMessage = cause.message;
  }
}

/**
 * An error as it crosses from one thread to another (structured cloning keeps an Error's message
 * but not its class, which the command line's exit status and callers' `instanceof` go by).
 */
export interface ErrorMessage {
  name: string;
  message: string;
  stack?: string | undefined;
  location?: InputLocation | undefined;
  problem?: string | undefined;
  target?: string | undefined;
}

/** `e` as another thread can rebuild it (errorFromMessage). */
export function errorToMessage(e: unknown): ErrorMessage {
  if (e instanceof InputError)
    return {
      name: e.name,
      message: e.message,
      location: { file: e.file, line: e.line, field: e.field },
      problem: e.problem,
    };
  if (e instanceof OutputError)
    return { name: e.name, message: e.message, target: e.target, problem: e.causeMessage };
  if (e instanceof Error) return { name: e.name, message: e.message, stack: e.stack };
  return { name: "Error", message: String(e) };
}

/** The error errorToMessage sent: hawser's own classes again, other errors as plain Errors. */
export function errorFromMessage(m: ErrorMessage): Error {
  if (m.name === "InputError" && m.location !== undefined && m.problem !== undefined)
    return new InputError(m.location, m.problem);
  if (m.name === "UsageError") return new UsageError(m.message);
  if (m.name === "OutputError" && m.target !== undefined && m.problem !== undefined)
    return new OutputError(m.target, new Error(m.problem));
  const e = new Error(m.message);
  e.name = m.name;
  if (m.stack !== undefined) e.stack = m.stack;
  return e;
}
