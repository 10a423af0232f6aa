/** Mentions from a CSV or TSV file with a header row, same column names as the JSONL format. */

import { InputError } from "../util/errors.js";
import { type CsvOptions, readCsvRows } from "./csv.js";
import { lookalikeOf, separatorHint } from "./field-hints.js";
import { isAbsent, linkRowsHint, UniqueIds } from "./fields.js";
import {
  type MentionRowOptions,
  mentionFromRow,
  type ReadLabeledMention,
  type ReadMention,
} from "./mention-row.js";

/** Options of `readMentionsCsv`. */
export type MentionsCsvOptions = MentionRowOptions & CsvOptions;

export function readMentionsCsv(
  file: string,
  options: MentionsCsvOptions & { labeled: true },
): AsyncGenerator<ReadLabeledMention>;
export function readMentionsCsv(file: string, options?: MentionsCsvOptions): AsyncGenerator<ReadMention>;
/**
 * Stream validated mentions from a CSV/TSV file. The header must have a `text` column (and a
 * `gold` column when `labeled`); ids must be unique within the file.
 */
export async function* readMentionsCsv(
  file: string,
  options: MentionsCsvOptions = {},
): AsyncGenerator<ReadMention | ReadLabeledMention> {
  const ids = new UniqueIds(file);
  const required = options.labeled ? ["text", "gold"] : ["text"];
  const checkHeader = ({ line, columns }: { line: number; columns: string[] }): void => {
    for (const name of required) {
      if (columns.includes(name)) continue;
      const like = lookalikeOf(name, columns);
      const linkRows = name === "gold" ? linkRowsHint(columns, name) : "";
      throw new InputError(
        { file, line, field: name },
        linkRows !== ""
          ? `missing column in header${linkRows}`
          : like === undefined
            ? `missing column in header${separatorHint(columns, options.delimiter ?? ",")}`
            : `missing column in header (found "${like}": hawser reads the mention's ${name} from "${name}")`,
      );
    }
  };
  for await (const { line, values } of readCsvRows(file, options, checkHeader)) {
    const ctx = { file, line, cells: true };
    const mention = mentionFromRow(ctx, values, options);
    ids.claim(mention.id, line, isAbsent(ctx, values.id));
    yield mention;
  }
}
