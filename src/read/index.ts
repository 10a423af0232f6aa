/**
 * `readMentions`: one entry point for every mention input format, chosen by `from` or by the
 * file's extension. Errors name file, line and field (InputError) or the bad option (UsageError).
 */

import { extname } from "node:path";
import { checkWhole, shown, UsageError } from "../util/errors.js";
import { readConll } from "./conll.js";
import type { ContextWindow } from "./context-window.js";
import { lookalikeOf } from "./field-hints.js";
import { STDIN } from "./lines.js";
import type { ReadLabeledMention, ReadMention } from "./mention-row.js";
import { readMentionsCsv } from "./mentions-csv.js";
import { readMentionsJsonl } from "./mentions-jsonl.js";
import type { RowFormat } from "./rows.js";
import { loadDocuments, readSpans } from "./spans.js";
import type { TagScheme } from "./tags.js";
import type { WarningHandler } from "./warnings.js";

export type { ContextWindow } from "./context-window.js";
export type { ReadLabeledMention, ReadMention } from "./mention-row.js";
export { chunkTags, detectScheme, parseScheme, TAG_SCHEMES, type TagScheme } from "./tags.js";
export type { ReadWarning, WarningHandler } from "./warnings.js";
export { type ConllOptions, type ConllSummary, readConll } from "./conll.js";
export { readJsonLines } from "./jsonl.js";
export { readMentionsCsv } from "./mentions-csv.js";
export { readMentionsJsonl } from "./mentions-jsonl.js";
export {
  type Documents,
  loadDocuments,
  readSpans,
  type Span,
  spansFromTokens,
  tokensFromSpans,
} from "./spans.js";

/** Mention input formats. */
export type MentionFormat = "jsonl" | "csv" | "tsv" | "conll" | "spans";

export const MENTION_FORMATS: readonly MentionFormat[] = ["jsonl", "csv", "tsv", "conll", "spans"];

/** File extensions and the format (and, for tables, the row flavour) they imply. */
const EXTENSIONS: Record<string, { format: MentionFormat; rows?: RowFormat }> = {
  ".jsonl": { format: "jsonl", rows: "jsonl" },
  ".ndjson": { format: "jsonl", rows: "jsonl" },
  ".csv": { format: "csv", rows: "csv" },
  ".tsv": { format: "tsv", rows: "tsv" },
  ".conll": { format: "conll" },
  ".bio": { format: "conll" },
  ".iob": { format: "conll" },
};

/** Options of `readMentions`. Format-specific options given for another format are a UsageError. */
export interface ReadMentionsOptions {
  /**
   * Input format. Default: from the extension (`spans` when `documents` is given; `jsonl` for
   * standard input, the file name `-`).
   */
  from?: MentionFormat | undefined;
  /** Spans only (required there): the JSONL documents file the span offsets point into. */
  documents?: string | undefined;
  /** JSONL, CSV, spans: require `gold` and return labeled mentions. Default false. */
  labeled?: boolean | undefined;
  /** CoNLL only: tag column, 0-based or negative from the end. Default -1 (last). */
  tagColumn?: number | undefined;
  /** CoNLL only: token column, same numbering. Default 0. */
  tokenColumn?: number | undefined;
  /** CoNLL only: tag scheme (or alias such as "BIO"). Default: detected from the file. */
  scheme?: TagScheme | string | undefined;
  /** CoNLL only: sentences of context each side. Default 1. */
  contextSentences?: number | undefined;
  /** Spans only: context window. Default `{ chars: 200 }`. */
  window?: ContextWindow | undefined;
  /** Receives non-fatal warnings (ill-formed tags in CoNLL input). Default: ignored. */
  onWarning?: WarningHandler | undefined;
}

function extensionChoices(): string {
  return Object.keys(EXTENSIONS).join(", ");
}

function rowFormat(file: string, purpose: string): RowFormat {
  if (file === STDIN) return "jsonl"; // standard input has no extension: rows are JSONL
  const rows = EXTENSIONS[extname(file).toLowerCase()]?.rows;
  if (rows === undefined) {
    throw new UsageError(
      `cannot tell the format of ${purpose} "${file}" from its extension; use .jsonl, .ndjson, .csv or .tsv`,
    );
  }
  return rows;
}

/** The reader's numeric options, checked: a string or NaN there failed deep inside. */
function checkReaderNumbers(options: ReadMentionsOptions): void {
  const whole = (name: string, v: unknown, least: number) => {
    if (v !== undefined) checkWhole(name, v, least);
  };
  whole("tagColumn", options.tagColumn, -Infinity);
  whole("tokenColumn", options.tokenColumn, -Infinity);
  whole("contextSentences", options.contextSentences, 0);
  const w = options.window as Record<string, unknown> | undefined;
  if (w === undefined) return;
  const keys = typeof w === "object" && w !== null ? Object.keys(w).filter((k) => w[k] !== undefined) : [];
  if (keys.length !== 1 || (keys[0] !== "chars" && keys[0] !== "sentences"))
    throw new UsageError(`window must be { chars: N } or { sentences: N }, one of them, got ${shown(w)}`);
  whole(`window.${keys[0]}`, w[keys[0]!], 0);
}

/** Choose the format; throws UsageError for unknown extensions or options that do not apply. */
export function resolveFormat(file: string, options: ReadMentionsOptions): MentionFormat {
  let format = options.from;
  if (format !== undefined && !MENTION_FORMATS.includes(format)) {
    throw new UsageError(`unknown input format "${format}"; choose one of ${MENTION_FORMATS.join(", ")}`);
  }
  if (format === undefined && options.documents !== undefined) format = "spans";
  // Standard input has no extension to tell its format by: JSONL, the links' own format, unless told.
  if (format === undefined && file === STDIN) format = "jsonl";
  if (format === undefined) {
    format = EXTENSIONS[extname(file).toLowerCase()]?.format;
    if (format === undefined) {
      throw new UsageError(
        `cannot tell the mentions format of "${file}" from its extension (known: ${extensionChoices()}); ` +
          `give the format (--from on the command line): ${MENTION_FORMATS.join(" | ")}`,
      );
    }
  }
  const conllOnly = (["tagColumn", "tokenColumn", "scheme", "contextSentences"] as const).filter(
    (key) => options[key] !== undefined,
  );
  if (format !== "conll" && conllOnly.length > 0) {
    throw new UsageError(
      `${conllOnly.join(", ")} ${conllOnly.length === 1 ? "applies" : "apply"} to CoNLL input only (format is ${format})`,
    );
  }
  checkReaderNumbers(options);
  if (format !== "spans" && options.window !== undefined)
    throw new UsageError(`window applies to spans input only (format is ${format})`);
  if (format !== "spans" && options.documents !== undefined) {
    throw new UsageError(`documents applies to spans input only (format is ${format})`);
  }
  if (format === "spans" && options.documents === undefined) {
    throw new UsageError("spans input needs a documents file (--documents on the command line)");
  }
  if (format === "conll" && options.labeled) {
    throw new UsageError("a labeled set cannot be CoNLL (no gold column); use JSONL, CSV or spans");
  }
  return format;
}

/**
 * Passes the mentions on; on the first, reports each optional field of the format that the file
 * lacks while carrying a look-alike ("label" for "type"): that field is not read.
 */
async function* warnUnreadFields<M extends ReadMention>(
  file: string,
  mentions: AsyncGenerator<M>,
  onWarning: WarningHandler | undefined,
): AsyncGenerator<M> {
  let first = true;
  for await (const m of mentions) {
    if (first && onWarning !== undefined) {
      first = false;
      const extra = Object.keys(m.extra);
      for (const field of ["type", "context", "doc"] as const) {
        const like = m[field] === undefined ? lookalikeOf(field, extra) : undefined;
        if (like === undefined) continue;
        onWarning({
          code: "unread-field",
          file,
          line: m.source?.line,
          count: 1,
          message: `field "${like}" is not read: hawser takes the mention's ${field} from "${field}" (rename it to use it)`,
        });
      }
    }
    yield m;
  }
}

export function readMentions(
  file: string,
  options: ReadMentionsOptions & { labeled: true },
): AsyncGenerator<ReadLabeledMention>;
export function readMentions(file: string, options?: ReadMentionsOptions): AsyncGenerator<ReadMention>;
/** Stream the mentions of `file` in input order. An empty file yields nothing. */
export async function* readMentions(
  file: string,
  options: ReadMentionsOptions = {},
): AsyncGenerator<ReadMention | ReadLabeledMention> {
  const format = resolveFormat(file, options);
  const labeled = options.labeled ?? false;
  switch (format) {
    case "jsonl":
      yield* warnUnreadFields(file, readMentionsJsonl(file, { labeled }), options.onWarning);
      return;
    case "csv":
    case "tsv": {
      // TSV has no quoting: a field runs to the next tab, and quotes are part of its text.
      const tsv = format === "tsv" || extname(file).toLowerCase() === ".tsv";
      const rows = readMentionsCsv(file, tsv ? { labeled, delimiter: "\t", quoted: false } : { labeled });
      yield* warnUnreadFields(file, rows, options.onWarning);
      return;
    }
    case "conll":
      yield* readConll(file, options);
      return;
    case "spans": {
      const rows = rowFormat(file, "span file");
      const documents = await loadDocuments(options.documents!);
      yield* readSpans(file, rows, documents, { labeled, window: options.window });
      return;
    }
  }
}
