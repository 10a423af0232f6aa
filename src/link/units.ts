/**
 * How a stream of mentions is cut into the units that are linked together: a mention without a
 * `doc` on its own, and a run of consecutive mentions of one `doc` (document-level evidence
 * weighs them together). Linker.linkAll links the units in turn; the worker pool
 * (src/link/parallel.ts) sends them to its threads. Both cut the stream here, so both give the
 * same rows.
 */
import type { Mention } from "../types.js";
import { UsageError } from "../util/errors.js";
import { checkMention } from "./check-options.js";

/**
 * Most mentions of one document held back for document-level evidence; a longer run of one
 * document is decided in slices of this size, so memory stays bounded whatever the input.
 */
export const MAX_DOCUMENT_MENTIONS = 5000;

/** Mentions read between two returns to the event loop (a few milliseconds of linking). */
const MENTIONS_PER_LOOP_TURN = 64;

/**
 * A unit of linking: one mention without a `doc`, or consecutive mentions of one `doc` (every
 * one of them carries it).
 */
export type MentionUnit = Mention[];

/** Whether a unit is linked with document-level evidence (it is one document's mentions). */
export function isDocumentUnit(unit: MentionUnit): boolean {
  return unit[0]?.doc !== undefined;
}

/** Throws a UsageError unless `mentions` is an iterable or async iterable. */
export function checkMentionSource(call: string, mentions: unknown): void {
  const source = mentions as Partial<Iterable<Mention> & AsyncIterable<Mention>> | null | undefined;
  if (typeof source?.[Symbol.iterator] !== "function" && typeof source?.[Symbol.asyncIterator] !== "function")
    throw new UsageError(
      `${call} needs an iterable or async iterable of mentions (an array, a generator, a stream), got ${String(mentions)}`,
    );
}

/**
 * The units of a stream of mentions, in order. When the source fails (a bad line), the mentions
 * of the document under way that came before the failure are still given, as a unit of the part
 * of the document that was read, and then the failure is thrown.
 */
export async function* mentionUnits(
  mentions: Iterable<Mention> | AsyncIterable<Mention>,
): AsyncGenerator<MentionUnit> {
  let batch: Mention[] = [];
  let seen = 0;
  try {
    for await (const m of mentions) {
      if (typeof m !== "object" || m === null) checkMention(m); // throws a UsageError naming it
      // An array is read without ever returning to the event loop otherwise: timers, I/O and
      // signal handlers of the caller would wait for the whole of it.
      if (++seen % MENTIONS_PER_LOOP_TURN === 0) await new Promise((resolve) => setImmediate(resolve));
      if (
        batch.length > 0 &&
        (m.doc === undefined || m.doc !== batch[0]!.doc || batch.length >= MAX_DOCUMENT_MENTIONS)
      ) {
        // Handed over before the consumer links it: a failure there is not the source's.
        const whole = batch;
        batch = [];
        yield whole;
      }
      if (m.doc === undefined) yield [m];
      else batch.push(m);
    }
  } catch (error) {
    if (batch.length > 0) yield batch;
    throw error;
  }
  if (batch.length > 0) yield batch;
}
