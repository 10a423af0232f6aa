/**
 * A mention from one validated row (JSONL object or CSV record): the fields of `Mention`, the
 * optional `gold` answer, and every other field preserved in `extra`.
 */

import type { LabeledMention, Mention } from "../types.js";
import { InputError } from "../util/errors.js";
import { lookalikeOf } from "./field-hints.js";
import {
  extraFields,
  goldField,
  optionalId,
  optionalOffset,
  optionalString,
  type RowContext,
  requiredString,
} from "./fields.js";

/** A mention as read, with the input's other fields (including `gold`) kept as given. */
export type ReadMention = Mention & { extra: Record<string, unknown> };
/** A labeled mention as read. */
export type ReadLabeledMention = LabeledMention & { extra: Record<string, unknown> };

/** Options shared by the mention readers. */
export interface MentionRowOptions {
  /** Require a `gold` field (entity id or null) and return labeled mentions. Default false. */
  labeled?: boolean;
}

/** The fields of the mentions format; anything else goes to `extra`. */
export const MENTION_FIELDS: ReadonlySet<string> = new Set([
  "id",
  "text",
  "type",
  "context",
  "doc",
  "start",
  "end",
]);

/** The id given to a mention without one: `m` and its line number. */
export function generatedId(line: number): string {
  return `m${line}`;
}

/** Check that a start/end pair is complete and ordered. */
export function checkOffsets(ctx: RowContext, start: number | undefined, end: number | undefined): void {
  const at = { file: ctx.file, line: ctx.line };
  if (start === undefined && end !== undefined)
    throw new InputError({ ...at, field: "start" }, "missing while end is given");
  if (start !== undefined && end === undefined)
    throw new InputError({ ...at, field: "end" }, "missing while start is given");
  if (start !== undefined && end !== undefined && start >= end) {
    throw new InputError({ ...at, field: "end" }, `must be greater than start (start ${start}, end ${end})`);
  }
}

/** Validate one row of the mentions format. */
export function mentionFromRow(
  ctx: RowContext,
  row: Record<string, unknown>,
  options: MentionRowOptions = {},
): ReadMention | ReadLabeledMention {
  const id = optionalId(ctx, row, "id") ?? generatedId(ctx.line);
  if (row.text === undefined) {
    const like = lookalikeOf("text", Object.keys(row));
    if (like !== undefined)
      throw new InputError(
        { file: ctx.file, line: ctx.line, field: "text" },
        `is required (the row has "${like}": hawser reads the mention's text from "text")`,
      );
  }
  const text = requiredString(ctx, row, "text");
  const start = optionalOffset(ctx, row, "start");
  const end = optionalOffset(ctx, row, "end");
  checkOffsets(ctx, start, end);
  const mention: ReadMention = {
    id,
    text,
    type: optionalString(ctx, row, "type"),
    context: optionalString(ctx, row, "context"),
    doc: optionalString(ctx, row, "doc"),
    start,
    end,
    source: { file: ctx.file, line: ctx.line },
    extra: extraFields(row, MENTION_FIELDS),
  };
  if (options.labeled) return { ...mention, gold: goldField(ctx, row) };
  return mention;
}
