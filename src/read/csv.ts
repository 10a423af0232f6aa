/**
 * CSV/TSV rows with a header row (RFC 4180 quoting for CSV), streamed through `csv-parse`.
 * Each row comes back as a record keyed by header name, with the 1-based line it starts on.
 * A wrong field count, a bad quote, a duplicate or empty header name and invalid UTF-8 are
 * errors naming file and line.
 */

import { CsvError, parse } from "csv-parse";
import { InputError } from "../util/errors.js";
import { fileError, openText } from "./lines.js";

/** Options of `readCsvRows`. */
export interface CsvOptions {
  /** Field separator. Default "," (CSV); "\t" reads TSV. */
  delimiter?: string;
  /**
   * Whether double quotes delimit fields (RFC 4180). Default true for CSV; TSV files usually
   * carry literal quotes (e.g. a ship named "Swift"), so `readCsvRows` callers pass false for TSV.
   */
  quoted?: boolean;
}

/** One data row. */
export interface CsvRow {
  /** 1-based line where the row starts (a quoted field may span lines). */
  line: number;
  /** Cell text by header name; every header name is present. */
  values: Record<string, string>;
}

/** The header row: column names in file order. */
export interface CsvHeader {
  line: number;
  columns: string[];
}

/** Line ends inside a raw record, used to find the line a multi-line record starts on. */
const LINE_END = /\r\n|\r|\n/g;

function startLine(endLine: number, raw: string | undefined): number {
  if (raw === undefined) return endLine;
  const inner = raw.replace(/^[\r\n]+|[\r\n]+$/g, "");
  return endLine - (inner.match(LINE_END)?.length ?? 0);
}

/** csv-parse messages end with "on line N"; the InputError prefix already says where. */
export function csvProblem(error: Error): string {
  return error.message.replace(/\s*(at|on) line \d+\.?$/, "");
}

function checkHeader(file: string, line: number, columns: string[]): void {
  const seen = new Set<string>();
  columns.forEach((name, index) => {
    if (name.trim() === "") {
      throw new InputError({ file, line }, `header column ${index + 1} has no name`);
    }
    if (seen.has(name)) throw new InputError({ file, line, field: name }, "duplicate column name in header");
    seen.add(name);
  });
}

/**
 * Stream the rows of a CSV/TSV file. `onHeader` sees the header before any row (to check for
 * required columns). An empty file yields nothing and never calls `onHeader`.
 */
export async function* readCsvRows(
  file: string,
  options: CsvOptions = {},
  onHeader?: (header: CsvHeader) => void,
): AsyncGenerator<CsvRow> {
  const delimiter = options.delimiter ?? ",";
  const quoted = options.quoted ?? true;
  const input = openText(file);
  const parser = parse({
    delimiter,
    quote: quoted ? '"' : false,
    relax_column_count: false,
    skip_empty_lines: true,
    info: true,
    raw: true,
  });
  input.on("error", (error) => parser.destroy(error));
  input.pipe(parser);
  let columns: string[] | undefined;
  try {
    for await (const item of parser as AsyncIterable<{
      record: string[];
      raw?: string;
      info: { lines: number };
    }>) {
      const line = startLine(item.info.lines, item.raw);
      if (columns === undefined) {
        // Header names are read without the spaces around them (" id , text "), as tables' are.
        columns = item.record.map((name) => name.trim());
        checkHeader(file, line, columns);
        onHeader?.({ line, columns });
        continue;
      }
      const values: Record<string, string> = {};
      columns.forEach((name, index) => {
        values[name] = item.record[index] ?? "";
      });
      yield { line, values };
    }
  } catch (error) {
    if (error instanceof CsvError) {
      const line = (error as CsvError & { lines?: number }).lines;
      throw new InputError({ file, line }, csvProblem(error));
    }
    throw fileError(file, error);
  } finally {
    parser.destroy();
    input.destroy();
  }
}
