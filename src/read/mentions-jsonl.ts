/** Mentions from a JSONL file: one mention object a line (see DESIGN.md, "Mentions"). */

import type { LabeledMention } from "../types.js";
import { isAbsent, UniqueIds } from "./fields.js";
import { readJsonLines } from "./jsonl.js";
import {
  type MentionRowOptions,
  mentionFromRow,
  type ReadLabeledMention,
  type ReadMention,
} from "./mention-row.js";

export function readMentionsJsonl(
  file: string,
  options: MentionRowOptions & { labeled: true },
): AsyncGenerator<ReadLabeledMention>;
export function readMentionsJsonl(file: string, options?: MentionRowOptions): AsyncGenerator<ReadMention>;
/** Stream validated mentions from `file`; ids must be unique within the file. */
export async function* readMentionsJsonl(
  file: string,
  options: MentionRowOptions = {},
): AsyncGenerator<ReadMention | (ReadMention & LabeledMention)> {
  const ids = new UniqueIds(file);
  for await (const { line, value } of readJsonLines(file)) {
    const ctx = { file, line, cells: false };
    const row = value as Record<string, unknown>;
    const mention = mentionFromRow(ctx, row, options);
    ids.claim(mention.id, line, isAbsent(ctx, row.id));
    yield mention;
  }
}
