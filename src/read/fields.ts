/**
 * Field validation shared by the row readers. A row is either a JSON object (typed values) or a
 * CSV record (every value a string, an empty cell meaning "absent"). Each check throws an
 * InputError naming file, line and field.
 */

import { InputError } from "../util/errors.js";
import { jsonKind } from "./jsonl.js";

/** Where a row came from and how its values are typed. */
export interface RowContext {
  file: string;
  line: number;
  /** True for CSV/TSV cells (strings, empty = absent); false for JSON values. */
  cells: boolean;
}

/** Digits only: the text form of a non-negative integer in a CSV cell. */
const NON_NEGATIVE_INTEGER = /^\d+$/;

function fail(ctx: RowContext, field: string, problem: string): never {
  throw new InputError({ file: ctx.file, line: ctx.line, field }, problem);
}

/** True when a value counts as absent: missing, JSON null, or an empty CSV cell. */
export function isAbsent(ctx: RowContext, value: unknown): boolean {
  return value === undefined || value === null || (ctx.cells && value === "");
}

/** An optional string field; absent gives undefined. */
export function optionalString(
  ctx: RowContext,
  row: Record<string, unknown>,
  field: string,
): string | undefined {
  const value = row[field];
  if (isAbsent(ctx, value)) return undefined;
  if (typeof value !== "string") fail(ctx, field, `expected a string, found ${jsonKind(value)}`);
  return value;
}

/** A required string that is not blank. */
export function requiredString(ctx: RowContext, row: Record<string, unknown>, field: string): string {
  const value = row[field];
  if (isAbsent(ctx, value)) fail(ctx, field, "is required");
  if (typeof value !== "string") fail(ctx, field, `expected a string, found ${jsonKind(value)}`);
  if (value.trim() === "") fail(ctx, field, "must not be empty or blank");
  return value;
}

/** An optional identifier: a non-empty string, or (in JSON) an integer, returned as a string. */
export function optionalId(ctx: RowContext, row: Record<string, unknown>, field: string): string | undefined {
  const value = row[field];
  if (isAbsent(ctx, value)) return undefined;
  if (typeof value === "number" && Number.isSafeInteger(value)) return String(value);
  if (typeof value !== "string") fail(ctx, field, `expected a string id, found ${jsonKind(value)}`);
  if (value.trim() === "") fail(ctx, field, "must not be empty or blank");
  return value;
}

/** An optional non-negative integer (a JSON number, or digits in a CSV cell). */
export function optionalOffset(
  ctx: RowContext,
  row: Record<string, unknown>,
  field: string,
): number | undefined {
  const value = row[field];
  if (isAbsent(ctx, value)) return undefined;
  if (ctx.cells) {
    if (typeof value !== "string" || !NON_NEGATIVE_INTEGER.test(value.trim())) {
      fail(ctx, field, `expected a non-negative integer, found "${String(value)}"`);
    }
    const parsed = Number(value.trim());
    if (!Number.isSafeInteger(parsed)) fail(ctx, field, `integer too large: ${value}`);
    return parsed;
  }
  if (typeof value !== "number" || !Number.isSafeInteger(value) || value < 0) {
    fail(ctx, field, `expected a non-negative integer, found ${JSON.stringify(value) ?? jsonKind(value)}`);
  }
  return value;
}

/** A required non-negative integer. */
export function requiredOffset(ctx: RowContext, row: Record<string, unknown>, field: string): number {
  const value = optionalOffset(ctx, row, field);
  if (value === undefined) fail(ctx, field, "is required");
  return value;
}

/** CSV cell words that mean "no entity" (NIL) in a `gold` column, besides an empty cell. */
export const NIL_WORDS: readonly string[] = ["null", "NIL"];

/**
 * Where a labeled set lacks its gold field but has a link row's fields (rows of `hawser link`,
 * JSONL or CSV, given as a labeled set): the sentence that says so, else nothing.
 */
export function linkRowsHint(fields: readonly string[], goldField: string): string {
  return fields.includes("mention") && fields.includes("entity")
    ? `; this looks like a row of \`hawser link\`'s output, whose answer is "entity": a labeled set gives it as "${goldField}"`
    : "";
}

/**
 * The `gold` answer of a labeled row: an entity id, or null for NIL. Required (the field must be
 * present). In JSON: a non-empty string or null. In CSV: an empty cell, `null` or `NIL` mean null.
 */
export function goldField(ctx: RowContext, row: Record<string, unknown>, field = "gold"): string | null {
  if (!Object.hasOwn(row, field))
    fail(
      ctx,
      field,
      `is required in a labeled set (an entity id, or null for NIL)${linkRowsHint(Object.keys(row), field)}`,
    );
  const value = row[field];
  if (ctx.cells) {
    const cell = typeof value === "string" ? value.trim() : "";
    return cell === "" || NIL_WORDS.includes(cell) ? null : cell;
  }
  if (value === null) return null;
  if (typeof value === "number" && Number.isSafeInteger(value)) return String(value);
  if (typeof value !== "string" || value.trim() === "") {
    fail(ctx, field, `expected an entity id or null, found ${JSON.stringify(value) ?? jsonKind(value)}`);
  }
  return value;
}

/** Every field of `row` not in `known`, as given. */
export function extraFields(
  row: Record<string, unknown>,
  known: ReadonlySet<string>,
): Record<string, unknown> {
  const extra: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(row)) if (!known.has(key)) extra[key] = value;
  return extra;
}

/** Rejects a second use of the same mention id within one file. */
export class UniqueIds {
  /** Line of each id's first use, negative when the id was given by default (see generatedId). */
  private readonly seen = new Map<string, number>();

  constructor(private readonly file: string) {}

  /**
   * Record `id` seen at `line`; throws when it was seen before. `generated`: the row had no id
   * and `id` is the one given by default, which an id written elsewhere in the file can match.
   */
  claim(id: string, line: number, generated = false): void {
    const first = this.seen.get(id);
    if (first !== undefined) {
      const at = { file: this.file, line, field: "id" };
      const remedy = "give every mention an id, or none";
      if (generated)
        throw new InputError(
          at,
          `the mention has no id and the one given by default, "${id}", is already used on line ${Math.abs(first)}: ${remedy}`,
        );
      if (first < 0)
        throw new InputError(
          at,
          `duplicate id "${id}" (given by default to the mention on line ${-first}, which has none: ${remedy})`,
        );
      throw new InputError(at, `duplicate id "${id}" (first used on line ${first})`);
    }
    this.seen.set(id, generated ? -line : line);
  }
}
