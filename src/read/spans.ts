/**
 * Mentions as character spans over documents: a documents file (JSONL `{id, text}`) and a span
 * file (JSONL or CSV/TSV rows `{doc, start, end, label}` with optional `id` and `text`). Offsets
 * are JavaScript string indices (UTF-16 code units), end exclusive. Context comes from the
 * document text around the span (see `context-window.ts`).
 */

import { InputError, UsageError } from "../util/errors.js";
import { type ContextWindow, charWindow, DEFAULT_WINDOW, sentenceWindow } from "./context-window.js";
import {
  extraFields,
  goldField,
  optionalId,
  optionalString,
  type RowContext,
  requiredOffset,
  requiredString,
  UniqueIds,
} from "./fields.js";
import { readJsonLines } from "./jsonl.js";
import { generatedId, type ReadLabeledMention, type ReadMention } from "./mention-row.js";
import { type RowFormat, readRows } from "./rows.js";
import { type SentenceRange, splitSentences } from "./sentences.js";
import { chunkTags, type TagScheme } from "./tags.js";

/** Document texts by id. */
export type Documents = Map<string, string>;

/** True when `offset` falls between the two halves of a character outside the BMP (an emoji...). */
function splitsSurrogatePair(text: string, offset: number): boolean {
  if (offset <= 0 || offset >= text.length) return false;
  const before = text.charCodeAt(offset - 1);
  const after = text.charCodeAt(offset);
  return before >= 0xd800 && before <= 0xdbff && after >= 0xdc00 && after <= 0xdfff;
}

/** Load a documents file: JSONL objects with `id` (string or integer) and `text` (string). */
export async function loadDocuments(file: string): Promise<Documents> {
  const documents: Documents = new Map();
  const ids = new UniqueIds(file);
  for await (const { line, value } of readJsonLines(file)) {
    const ctx: RowContext = { file, line, cells: false };
    const row = value as Record<string, unknown>;
    const id = optionalId(ctx, row, "id");
    if (id === undefined) throw new InputError({ file, line, field: "id" }, "is required");
    const text = row.text;
    if (typeof text !== "string")
      throw new InputError({ file, line, field: "text" }, "is required and must be a string");
    ids.claim(id, line);
    documents.set(id, text);
  }
  return documents;
}

/** Options of `readSpans`. */
export interface SpansOptions {
  /** Context around each span. Default `{ chars: 200 }`. */
  window?: ContextWindow | undefined;
  /** Require `gold` on every row and return labeled mentions. Default false. */
  labeled?: boolean | undefined;
}

/** Fields of a span row; anything else goes to `extra`. */
const SPAN_FIELDS: ReadonlySet<string> = new Set(["id", "doc", "start", "end", "label", "text"]);
/** Longest stretch of text quoted in a mismatch message. */
const QUOTE_LIMIT = 60;

function quote(text: string): string {
  return JSON.stringify(text.length > QUOTE_LIMIT ? `${text.slice(0, QUOTE_LIMIT)}...` : text);
}

function checkWindow(window: ContextWindow): ContextWindow {
  const size = "chars" in window ? window.chars : window.sentences;
  if (!Number.isInteger(size) || size < 0) {
    throw new UsageError(`context window size must be a non-negative integer, got ${JSON.stringify(window)}`);
  }
  return window;
}

export function readSpans(
  file: string,
  format: RowFormat,
  documents: Documents,
  options: SpansOptions & { labeled: true },
): AsyncGenerator<ReadLabeledMention>;
export function readSpans(
  file: string,
  format: RowFormat,
  documents: Documents,
  options?: SpansOptions,
): AsyncGenerator<ReadMention>;
/** Stream span rows of `file` as mentions, validated against `documents`. */
export async function* readSpans(
  file: string,
  format: RowFormat,
  documents: Documents,
  options: SpansOptions = {},
): AsyncGenerator<ReadMention | ReadLabeledMention> {
  const window = checkWindow(options.window ?? DEFAULT_WINDOW);
  const sentenceCache = new Map<string, SentenceRange[]>();
  const ids = new UniqueIds(file);
  const required = ["doc", "start", "end", "label", ...(options.labeled ? ["gold"] : [])];
  const checkColumns = (line: number, columns: string[]): void => {
    for (const name of required) {
      if (!columns.includes(name))
        throw new InputError({ file, line, field: name }, "missing column in header");
    }
  };
  for await (const { ctx, values } of readRows(file, format, checkColumns)) {
    const at = { file, line: ctx.line };
    const doc = optionalId(ctx, values, "doc");
    if (doc === undefined) throw new InputError({ ...at, field: "doc" }, "is required");
    const text = documents.get(doc);
    if (text === undefined) throw new InputError({ ...at, field: "doc" }, `unknown document "${doc}"`);
    const start = requiredOffset(ctx, values, "start");
    const end = requiredOffset(ctx, values, "end");
    if (start >= end)
      throw new InputError(
        { ...at, field: "end" },
        `must be greater than start (start ${start}, end ${end})`,
      );
    if (start >= text.length) {
      throw new InputError(
        { ...at, field: "start" },
        `${start} is outside document "${doc}" (length ${text.length})`,
      );
    }
    if (end > text.length) {
      throw new InputError(
        { ...at, field: "end" },
        `${end} is outside document "${doc}" (length ${text.length})`,
      );
    }
    for (const [field, offset] of [
      ["start", start],
      ["end", end],
    ] as const) {
      if (splitsSurrogatePair(text, offset))
        throw new InputError(
          { ...at, field },
          `${offset} falls inside a character of document "${doc}" (offsets count UTF-16 code units; this character takes two)`,
        );
    }
    const label = requiredString(ctx, values, "label");
    const slice = text.slice(start, end);
    const given = optionalString(ctx, values, "text");
    if (given !== undefined && given !== slice) {
      throw new InputError(
        { ...at, field: "text" },
        `${quote(given)} differs from the document text at ${start}-${end}: ${quote(slice)}`,
      );
    }
    const givenId = optionalId(ctx, values, "id");
    const id = givenId ?? generatedId(ctx.line);
    ids.claim(id, ctx.line, givenId === undefined);
    let context: string;
    if ("chars" in window) {
      context = charWindow(text, start, end, window.chars);
    } else {
      let sentences = sentenceCache.get(doc);
      if (sentences === undefined) {
        sentences = splitSentences(text);
        sentenceCache.set(doc, sentences);
      }
      context = sentenceWindow(text, start, end, window.sentences, sentences);
    }
    const mention: ReadMention = {
      id,
      text: slice,
      type: label,
      context,
      doc,
      start,
      end,
      source: { file, line: ctx.line },
      extra: extraFields(values, SPAN_FIELDS),
    };
    yield options.labeled ? { ...mention, gold: goldField(ctx, values) } : mention;
  }
}

/** A labeled character span. */
export interface Span {
  start: number;
  end: number;
  label: string;
}

/** A token with its character offsets and BIO (IOB2) tag. */
export interface SpanToken {
  text: string;
  start: number;
  end: number;
  tag: string;
}

/** Words (letters and digits) and single punctuation marks: the tokens `tokensFromSpans` makes. */
const TOKEN = /[\p{L}\p{N}]+|[^\s\p{L}\p{N}]/gu;

/**
 * Tokenize a document and tag the tokens with IOB2 tags from non-overlapping spans. Tokens are
 * also cut at every span boundary, so a span whose ends are not whitespace survives the round
 * trip through `spansFromTokens` with the same offsets. Throws UsageError on overlapping spans.
 */
export function tokensFromSpans(doc: { text: string }, spans: readonly Span[]): SpanToken[] {
  const sorted = [...spans].sort((a, b) => a.start - b.start);
  sorted.forEach((span, i) => {
    const previous = sorted[i - 1];
    if (previous !== undefined && span.start < previous.end) {
      throw new UsageError(
        `overlapping spans ${previous.start}-${previous.end} and ${span.start}-${span.end}`,
      );
    }
  });
  const cuts = new Set<number>(sorted.flatMap((s) => [s.start, s.end]));
  const tokens: SpanToken[] = [];
  for (const match of doc.text.matchAll(TOKEN)) {
    let from = match.index;
    const to = match.index + match[0].length;
    for (let i = from + 1; i < to; i++) {
      if (cuts.has(i)) {
        tokens.push({ text: doc.text.slice(from, i), start: from, end: i, tag: "O" });
        from = i;
      }
    }
    tokens.push({ text: doc.text.slice(from, to), start: from, end: to, tag: "O" });
  }
  let next = 0;
  for (const span of sorted) {
    while (next < tokens.length && tokens[next]!.start < span.start) next++;
    let first = true;
    while (next < tokens.length && tokens[next]!.end <= span.end) {
      tokens[next]!.tag = `${first ? "B" : "I"}-${span.label}`;
      first = false;
      next++;
    }
  }
  return tokens;
}

/** Turn tagged tokens with character offsets back into spans (chunked under `scheme`, default IOB2). */
export function spansFromTokens(
  tokens: ReadonlyArray<{ start: number; end: number; tag: string }>,
  scheme: TagScheme = "IOB2",
): Span[] {
  return chunkTags(
    tokens.map((t) => t.tag),
    scheme,
  ).map((chunk) => ({
    label: chunk.label,
    start: tokens[chunk.start]!.start,
    end: tokens[chunk.end - 1]!.end,
  }));
}
