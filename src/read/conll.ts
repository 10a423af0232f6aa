/**
 * Mentions from CoNLL-style token files (`.conll`, `.bio`, `.iob`): chunks of tagged tokens become
 * mentions with document, sentence, token offsets and sentence context. Streams one document at a
 * time. When no scheme is given the file is scanned once first to detect it (a second streaming
 * pass; memory stays at one document). Standard input cannot be read twice: its scheme is detected
 * from its first STDIN_DETECT_SENTENCES sentences, held until linking reads them.
 */

import { InputError, UsageError } from "../util/errors.js";
import { type ConllColumns, type ConllEvent, readConllEvents } from "./conll-lines.js";
import { joinTokens } from "./detokenize.js";
import { STDIN } from "./lines.js";
import type { ReadMention } from "./mention-row.js";
import { chunkParsed, type ParsedTag, parseScheme, SchemeDetector, type TagScheme } from "./tags.js";
import type { ReadWarning, WarningHandler } from "./warnings.js";

/** Options of `readConll`. */
export interface ConllOptions extends ConllColumns {
  /** Tag scheme (name or alias, e.g. "BIO"). Default: detected from the file's tags. */
  scheme?: TagScheme | string | undefined;
  /** Sentences of context on each side of the mention's sentence. Default 1. */
  contextSentences?: number | undefined;
  /** Receives warnings (ill-formed tag sequences) at the end of the file. Default: none (see the summary). */
  onWarning?: WarningHandler | undefined;
}

export const DEFAULT_CONTEXT_SENTENCES = 1;

/** What the reader returns when done (the generator's return value). */
export interface ConllSummary {
  scheme: TagScheme;
  documents: number;
  mentions: number;
  warnings: ReadWarning[];
}

interface Sentence {
  tokens: string[];
  tags: ParsedTag[];
  lines: number[];
}

interface DocumentState {
  ordinal: number;
  id: string | undefined;
  /** Line of the `-DOCSTART-` that opened it, if any. */
  line: number | undefined;
  sentences: Sentence[];
}

/**
 * Sentences of standard input read ahead to detect its tag scheme (it cannot be read twice): tens
 * of thousands of tags, enough to see every tag kind a scheme uses; held in memory until linked.
 */
export const STDIN_DETECT_SENTENCES = 10_000;

/**
 * Detects the tag scheme from the events' sentences, reading at most `maxSentences` of them;
 * returns the scheme and the events read, in order.
 */
async function detect(
  events: AsyncIterator<ConllEvent>,
  maxSentences: number,
): Promise<{ scheme: TagScheme; read: ConllEvent[] }> {
  const detector = new SchemeDetector();
  const read: ConllEvent[] = [];
  let tags: ParsedTag[] = [];
  let sentences = 0;
  while (sentences < maxSentences) {
    const next = await events.next();
    if (next.done) break;
    const event = next.value;
    read.push(event);
    if (event.kind === "token") {
      tags.push(event.tag);
    } else if (tags.length > 0) {
      detector.add(tags);
      tags = [];
      sentences++;
    }
  }
  if (tags.length > 0) detector.add(tags);
  return { scheme: detector.result(), read };
}

/** The events read ahead, then the rest of the stream. */
async function* replay(read: ConllEvent[], rest: AsyncGenerator<ConllEvent>): AsyncGenerator<ConllEvent> {
  yield* read;
  yield* rest;
}

/**
 * The file's events and its tag scheme: given, detected in a first pass over a file, or detected
 * from the first sentences of standard input (see STDIN_DETECT_SENTENCES).
 */
async function schemeAndEvents(
  file: string,
  columns: ConllColumns,
  given: TagScheme | string | undefined,
): Promise<{ scheme: TagScheme; events: AsyncGenerator<ConllEvent> }> {
  if (given !== undefined) return { scheme: parseScheme(given), events: readConllEvents(file, columns) };
  if (file !== STDIN) {
    const { scheme } = await detect(readConllEvents(file, columns), Number.POSITIVE_INFINITY);
    return { scheme, events: readConllEvents(file, columns) };
  }
  const events = readConllEvents(file, columns);
  const { scheme, read } = await detect(events, STDIN_DETECT_SENTENCES);
  return { scheme, events: replay(read, events) };
}

function checkContextSentences(value: number): number {
  if (!Number.isInteger(value) || value < 0) {
    throw new UsageError(`contextSentences must be a non-negative integer, got ${value}`);
  }
  return value;
}

/** Stream the mentions of a CoNLL file. */
export async function* readConll(
  file: string,
  options: ConllOptions = {},
): AsyncGenerator<ReadMention, ConllSummary> {
  const columns: ConllColumns = { tagColumn: options.tagColumn, tokenColumn: options.tokenColumn };
  const around = checkContextSentences(options.contextSentences ?? DEFAULT_CONTEXT_SENTENCES);
  const { scheme, events } = await schemeAndEvents(file, columns, options.scheme);
  const docIds = new Map<string, number>();
  let illFormed = 0;
  let firstIllLine: number | undefined;
  let mentions = 0;
  let documents = 0;

  function* flush(doc: DocumentState): Generator<ReadMention> {
    const id = doc.id ?? `doc${doc.ordinal}`;
    const firstLine = doc.line ?? doc.sentences[0]?.lines[0] ?? 0;
    const seen = docIds.get(id);
    if (seen !== undefined) {
      throw new InputError(
        { file, line: firstLine, field: "-DOCSTART-" },
        `duplicate document id "${id}" (first on line ${seen})`,
      );
    }
    docIds.set(id, firstLine);
    documents++;
    const texts = doc.sentences.map((s) => joinTokens(s.tokens));
    let offset = 0;
    for (const [index, sentence] of doc.sentences.entries()) {
      const context = texts.slice(Math.max(0, index - around), index + around + 1).join(" ");
      for (const chunk of chunkParsed(sentence.tags, scheme)) {
        const line = sentence.lines[chunk.start]!;
        if (chunk.illFormed) {
          illFormed++;
          firstIllLine ??= line;
        }
        mentions++;
        yield {
          id: `${id}-s${index + 1}-t${offset + chunk.start}`,
          text: joinTokens(sentence.tokens.slice(chunk.start, chunk.end)),
          type: chunk.label,
          context,
          doc: id,
          sentence: index + 1,
          tokenStart: offset + chunk.start,
          tokenEnd: offset + chunk.end,
          source: { file, line },
          extra: {},
        };
      }
      offset += sentence.tokens.length;
    }
  }

  let doc: DocumentState = { ordinal: 1, id: undefined, line: undefined, sentences: [] };
  let sentence: Sentence = { tokens: [], tags: [], lines: [] };
  const endSentence = (): void => {
    if (sentence.tokens.length > 0) doc.sentences.push(sentence);
    sentence = { tokens: [], tags: [], lines: [] };
  };

  for await (const event of events) {
    if (event.kind === "token") {
      sentence.tokens.push(event.token);
      sentence.tags.push(event.tag);
      sentence.lines.push(event.line);
    } else if (event.kind === "break") {
      endSentence();
    } else {
      endSentence();
      // A leading stretch without tokens before the first -DOCSTART- is not a document.
      const started = doc.sentences.length > 0 || doc.line !== undefined;
      if (started) yield* flush(doc);
      doc = {
        ordinal: started ? doc.ordinal + 1 : doc.ordinal,
        id: event.id,
        line: event.line,
        sentences: [],
      };
    }
  }
  endSentence();
  if (doc.sentences.length > 0 || doc.line !== undefined) yield* flush(doc);

  const warnings: ReadWarning[] = [];
  if (illFormed > 0) {
    const warning: ReadWarning = {
      code: "ill-formed-tags",
      file,
      line: firstIllLine,
      count: illFormed,
      message:
        `${illFormed} tag sequence(s) are not well formed under ${scheme} (first on line ${firstIllLine}); ` +
        "they were chunked as the CoNLL evaluation script does",
    };
    warnings.push(warning);
    options.onWarning?.(warning);
  }
  return { scheme, documents, mentions, warnings };
}
