/**
 * Streaming reader and validator of the knowledge table (CSV with header, TSV, or JSONL).
 * Every problem is an InputError naming the file, line and column.
 */
import { extname } from "node:path";
import { CsvError, Parser } from "csv-parse";
import type { EntityRecord } from "../types.js";
import { InputError, UsageError } from "../util/errors.js";
import { csvProblem } from "../read/csv.js";
import { separatorHint } from "../read/field-hints.js";
import { readJsonLines } from "../read/jsonl.js";
import { type BytesTap, fileError, openText, STDIN } from "../read/lines.js";

export type TableFormat = "csv" | "tsv" | "jsonl";

/** The columns with a meaning of their own; every other column is an attribute. */
export const RESERVED_COLUMNS = ["id", "name", "type", "aliases", "description", "prior"] as const;
const RESERVED: ReadonlySet<string> = new Set(RESERVED_COLUMNS);
const REQUIRED_COLUMNS = ["id", "name", "type"] as const;
/** Separator of aliases inside one CSV/TSV cell. */
export const ALIAS_SEPARATOR = "|";

export interface TableRow {
  record: EntityRecord;
  line: number;
}

export function tableFormatOf(file: string, from?: string): TableFormat {
  // Standard input has no extension: JSONL unless told, as for mentions (src/read/index.ts).
  const f = (from ?? (file === STDIN ? "jsonl" : extname(file).slice(1))).toLowerCase();
  if (f === "csv") return "csv";
  if (f === "tsv" || f === "tab") return "tsv";
  if (f === "jsonl" || f === "ndjson") return "jsonl";
  throw new UsageError(
    from === undefined
      ? `cannot tell the table format of ${file} from its extension: use .csv, .tsv or .jsonl, or give --from csv|tsv|jsonl`
      : `unknown table format "${from}": use csv, tsv or jsonl`,
  );
}

/** A letter or digit: a name without one normalizes to nothing, and no mention could reach it. */
const HAS_WORD_CHARACTER = /[\p{L}\p{N}]/u;
/** A prior as text: a decimal number ("12", "0.5", "1e3"); not hexadecimal, not "Infinity". */
const DECIMAL_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/** Validates and builds one record; `get` reads a column's raw value. Shared by all formats. */
class RowValidator {
  private readonly seen = new Set<string>();
  constructor(private readonly file: string) {}

  build(line: number, raw: Record<string, unknown>, aliasesRaw: unknown): EntityRecord {
    const file = this.file;
    const str = (field: string): string => {
      const v = raw[field];
      if (v === undefined || v === null) return "";
      if (typeof v === "string") return v.trim();
      if (typeof v === "number" || typeof v === "boolean") return String(v);
      throw new InputError(
        { file, line, field },
        `expected text, got ${Array.isArray(v) ? "an array" : typeof v}`,
      );
    };
    // The required columns, each read once, checked in the order of REQUIRED_COLUMNS.
    const required = (field: (typeof REQUIRED_COLUMNS)[number]): string => {
      const v = str(field);
      if (v === "")
        throw new InputError({ file, line, field }, `missing ${field}: every row needs id, name and type`);
      return v;
    };
    const id = required("id");
    const name = required("name");
    if (!HAS_WORD_CHARACTER.test(name))
      throw new InputError(
        { file, line, field: "name" },
        `name "${name}" has no letter or digit: nothing to link it by`,
      );
    const type = required("type");
    // One set operation per row: adding an id already there leaves the size unchanged.
    const before = this.seen.size;
    this.seen.add(id);
    if (this.seen.size === before) throw new InputError({ file, line, field: "id" }, `duplicate id "${id}"`);
    let prior = 0;
    const priorRaw = raw.prior;
    if (priorRaw !== undefined && priorRaw !== null && priorRaw !== "") {
      const text = typeof priorRaw === "string" ? priorRaw.trim() : "";
      prior =
        typeof priorRaw === "number"
          ? priorRaw
          : typeof priorRaw === "string" && DECIMAL_NUMBER.test(text)
            ? Number(text)
            : Number.NaN;
      if (!Number.isFinite(prior)) {
        throw new InputError(
          { file, line, field: "prior" },
          `prior must be a number, got ${typeof priorRaw === "string" ? `"${priorRaw}"` : JSON.stringify(priorRaw)}`,
        );
      }
      if (prior < 0) throw new InputError({ file, line, field: "prior" }, `prior must be >= 0, got ${prior}`);
    }
    const aliases = this.aliases(line, aliasesRaw, name);
    const attributes: Record<string, string> = {};
    for (const [k, v] of Object.entries(raw)) {
      if (RESERVED.has(k) || v === undefined || v === null) continue;
      const s = typeof v === "string" ? v.trim() : typeof v === "object" ? JSON.stringify(v) : String(v);
      if (s !== "") attributes[k] = s;
    }
    return { id, name, type, aliases, description: str("description"), prior, attributes };
  }

  private aliases(line: number, v: unknown, name: string): string[] {
    let list: string[];
    if (v === undefined || v === null || v === "") list = [];
    else if (typeof v === "string") list = v.split(ALIAS_SEPARATOR);
    else if (Array.isArray(v)) {
      list = v.map((a, i) => {
        if (typeof a !== "string")
          throw new InputError({ file: this.file, line, field: `aliases[${i}]` }, "aliases must be strings");
        return a;
      });
    } else
      throw new InputError(
        { file: this.file, line, field: "aliases" },
        "aliases must be an array of strings or a |-separated string",
      );
    const out: string[] = [];
    const seen = new Set<string>([name]);
    for (const a of list) {
      const t = a.trim();
      if (t === "" || seen.has(t)) continue;
      seen.add(t);
      out.push(t);
    }
    return out;
  }
}

/** A parsed CSV/TSV record and the line count of the file when it ended (csv-parse's `info.lines`). */
interface NumberedRecord {
  record: Record<string, string>;
  lines: number;
}

/**
 * A csv-parse stream whose records carry the parser's line count, read from its live counters at
 * the moment the record is pushed, which is the value csv-parse's `info` option reports: that
 * option builds two objects of a dozen fields per record, and only the line count is used here.
 */
class LineNumberedParser extends Parser {
  override push(record: unknown, encoding?: BufferEncoding): boolean {
    if (record === null) return super.push(null, encoding);
    const numbered: NumberedRecord = { record: record as Record<string, string>, lines: this.info.lines };
    return super.push(numbered, encoding);
  }
}

async function* readDelimited(file: string, delimiter: string, onBytes?: BytesTap): AsyncGenerator<TableRow> {
  const validator = new RowValidator(file);
  const parser = new LineNumberedParser({
    delimiter,
    columns: (header: string[]) => {
      const cols = header.map((h) => h.trim());
      for (const c of REQUIRED_COLUMNS) {
        if (!cols.includes(c))
          throw new InputError(
            { file, line: 1, field: c },
            `the header has no "${c}" column (found: ${cols.join(", ")})${separatorHint(cols, delimiter)}`,
          );
      }
      const dup = cols.find((c, i) => cols.indexOf(c) !== i);
      if (dup !== undefined)
        throw new InputError({ file, line: 1, field: dup }, `column "${dup}" appears twice in the header`);
      return cols;
    },
    relax_quotes: false,
    skip_empty_lines: true,
    quote: delimiter === "\t" ? false : '"',
  });
  const text = openText(file, onBytes);
  text.on("error", (e) => parser.destroy(e));
  text.pipe(parser);
  try {
    for await (const item of parser as AsyncIterable<NumberedRecord>) {
      const line = item.lines;
      yield { record: validator.build(line, item.record, item.record.aliases), line };
    }
  } catch (e) {
    if (e instanceof InputError) throw e;
    const ce = e as CsvError & { lines?: number; code?: string };
    if (
      ce.code === "CSV_RECORD_INCONSISTENT_FIELDS_LENGTH" ||
      ce.code === "CSV_RECORD_INCONSISTENT_COLUMNS"
    ) {
      throw new InputError(
        { file, line: ce.lines },
        `wrong number of fields: ${ce.message.replace(/^Invalid Record Length: /, "")}`,
      );
    }
    // Every error of the CSV parser is about the file's text ("Invalid Opening Quote", ...).
    if (e instanceof CsvError || (typeof ce.code === "string" && ce.code.startsWith("CSV_")))
      throw new InputError({ file, line: ce.lines }, csvProblem(ce));
    throw fileError(file, e);
  } finally {
    text.destroy();
  }
}

async function* readJsonlTable(file: string, onBytes?: BytesTap): AsyncGenerator<TableRow> {
  const validator = new RowValidator(file);
  for await (const { line, value } of readJsonLines(file, onBytes)) {
    const obj = value as Record<string, unknown>;
    yield { record: validator.build(line, obj, obj.aliases), line };
  }
}

/** Stream the validated rows of a knowledge table; `onBytes` sees the file's raw bytes as they are read. */
export function readTable(file: string, from?: string, onBytes?: BytesTap): AsyncGenerator<TableRow> {
  const format = tableFormatOf(file, from);
  if (format === "jsonl") return readJsonlTable(file, onBytes);
  return readDelimited(file, format === "tsv" ? "\t" : ",", onBytes);
}
