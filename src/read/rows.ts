/** Rows of a JSONL or CSV/TSV file in one shape, for readers that accept either. */

import { readCsvRows } from "./csv.js";
import type { RowContext } from "./fields.js";
import { readJsonLines } from "./jsonl.js";

/** Tabular formats a row file can have. */
export type RowFormat = "jsonl" | "csv" | "tsv";

/** One row with where it came from. */
export interface Row {
  ctx: RowContext;
  values: Record<string, unknown>;
}

/** Stream the rows of `file`. `onColumns` sees a CSV/TSV header before the first row. */
export async function* readRows(
  file: string,
  format: RowFormat,
  onColumns?: (line: number, columns: string[]) => void,
): AsyncGenerator<Row> {
  if (format === "jsonl") {
    for await (const { line, value } of readJsonLines(file)) {
      yield { ctx: { file, line, cells: false }, values: value as Record<string, unknown> };
    }
    return;
  }
  // TSV fields are not quoted: quotes in TSV are literal text (see CsvOptions.quoted).
  const options = format === "tsv" ? { delimiter: "\t", quoted: false } : {};
  const header =
    onColumns === undefined
      ? undefined
      : (h: { line: number; columns: string[] }) => onColumns(h.line, h.columns);
  for await (const { line, values } of readCsvRows(file, options, header)) {
    yield { ctx: { file, line, cells: true }, values };
  }
}
