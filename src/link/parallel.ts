/**
 * Linking on several threads: a pool of worker threads (src/link/link-worker.ts), each with the
 * KB open and a linker of the same options. The main thread reads the mentions, cuts them into
 * the units linkAll links (src/link/units.ts), sends batches of units to the threads, and gives
 * the rows back in input order: the rows are those of Linker.linkAll on one thread, byte for
 * byte (tests/parallel.test.ts).
 *
 * The first thread loads the KB's in-memory store (about 210 MB at a million entities, see
 * src/kb/hot.ts) into shared memory and the others use it; each thread keeps its own SQLite
 * connection, caches and vocabulary map (peak memory at a million entities: 382 MB for one
 * thread without a pool, 584 MB for a pool of two, 680 for three, 744 for four).
 */
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import type { SharedHotArrays } from "../kb/hot.js";
import type { LabelInfo } from "../labels/builtin.js";
import { LabelMap } from "../labels/label-map.js";
import type { LinkRow, Mention } from "../types.js";
import { checkWhole, type ErrorMessage, errorFromMessage, shown, UsageError } from "../util/errors.js";
import { checkMention, isObject } from "./check-options.js";
import type { LinkerOptions } from "./linker.js";
import { checkMentionSource, type MentionUnit, mentionUnits } from "./units.js";

/** Most threads a pool runs (each keeps its own SQLite connection and caches). */
export const MAX_JOBS = 64;
/**
 * Mentions sent to a thread at a time (whole units: one document's run may make a batch
 * longer). Large enough that messaging costs little beside linking (a few hundred microseconds a
 * mention at a million entities), small enough that the first rows come soon and few wait.
 */
const BATCH_MENTIONS = 256;
/** Batches sent to a thread and not yet answered: one being linked, one queued behind it. */
const BATCHES_IN_FLIGHT = 2;

/** What a linking thread is started with (workerData). */
export interface WorkerSetup {
  kb: string;
  /** The linker's options without the label map (a class instance does not cross threads). */
  options: Omit<LinkerOptions, "labels">;
  /** The label map's own labels over the built-in sets (LabelMap.overrides). */
  labels: Array<[string, LabelInfo]>;
  /** The in-memory store loaded by the first thread; null for the first thread itself. */
  shared: SharedHotArrays | null;
}

/** A batch sent to a thread. */
export interface WorkerRequest {
  seq: number;
  units: MentionUnit[];
}

/**
 * What a thread answers: `rows` of a batch, the rows of its units in order; when a unit failed,
 * the rows of the units before it and the failure (the later units are not linked).
 */
export type WorkerReply =
  | { kind: "ready"; shared: SharedHotArrays }
  | { kind: "rows"; seq: number; rows: LinkRow[]; failure?: ErrorMessage }
  | { kind: "failed"; error: ErrorMessage };

/** The compiled worker script (tests running TypeScript sources use the build's). */
function workerScript(): URL {
  const own = new URL("./link-worker.js", import.meta.url);
  if (existsSync(fileURLToPath(own))) return own;
  const built = new URL("../../dist/link/link-worker.js", import.meta.url);
  if (existsSync(fileURLToPath(built))) return built;
  throw new Error(`the linking thread's script is missing (${fileURLToPath(own)}): run \`npm run build\``);
}

/** A batch's answer: its rows, and the failure of the unit after them, if one failed. */
interface BatchRows {
  rows: LinkRow[];
  failure: Error | null;
}

interface Waiting {
  seq: number;
  resolve: (answer: BatchRows) => void;
  reject: (e: Error) => void;
}

/** One thread and the batches it has not answered yet, oldest first (it answers in order). */
class Thread {
  readonly waiting: Waiting[] = [];
  /** Set when the thread failed outside a batch or stopped: every later batch fails with it. */
  broken: Error | null = null;

  constructor(readonly worker: Worker) {
    worker.on("message", (m: WorkerReply) => this.answer(m));
    worker.on("error", (e) => this.fail(e));
    worker.on("exit", (code) => this.fail(new Error(`a linking thread stopped (exit code ${code})`)));
    // An idle thread does not hold the process open (a caller who forgets close() still exits).
    worker.unref();
  }

  private answer(m: WorkerReply): void {
    // After `ready` (see ready()), a thread sends nothing but rows.
    if (m.kind !== "rows") return;
    const w = this.waiting.shift();
    if (this.waiting.length === 0) this.worker.unref();
    if (w === undefined) return;
    // A thread answers its batches in the order it got them; anything else would misplace rows.
    if (m.seq !== w.seq)
      w.reject(new Error(`a linking thread answered batch ${m.seq} where ${w.seq} was due`));
    else w.resolve({ rows: m.rows, failure: m.failure === undefined ? null : errorFromMessage(m.failure) });
  }

  private fail(e: Error): void {
    this.broken ??= e;
    for (const w of this.waiting.splice(0)) w.reject(e);
    this.worker.unref();
  }

  /** Sends a batch; its answer comes in the order batches were sent to this thread. */
  send(seq: number, units: MentionUnit[]): Promise<BatchRows> {
    if (this.broken !== null) return Promise.reject(this.broken);
    try {
      this.worker.postMessage({ seq, units } satisfies WorkerRequest);
    } catch (e) {
      // Nothing was sent, so nothing is awaited from the thread (plainMention makes this rare).
      return Promise.reject(
        new UsageError(`a mention could not be sent to a linking thread: ${(e as Error).message}`),
      );
    }
    // Kept alive while it owes answers; idle threads do not hold the process open.
    this.worker.ref();
    return new Promise<BatchRows>((resolve, reject) => this.waiting.push({ seq, resolve, reject }));
  }
}

/**
 * The mention as a thread is sent it: a plain object of the Mention fields, read now (a getter,
 * a class instance or a proxy gives its values, and a source that reuses one object for every
 * mention gives each its own copy); other fields, which the linker does not read, are left out.
 */
function plainMention(m: Mention): Mention {
  const out: Record<string, unknown> = {};
  for (const field of MENTION_FIELDS) {
    const v = (m as unknown as Record<string, unknown>)[field];
    if (v !== undefined) out[field] = v;
  }
  if (isObject(out.source)) out.source = { file: out.source.file, line: out.source.line };
  return out as unknown as Mention;
}

/** The fields of a Mention (src/types.ts). */
const MENTION_FIELDS = [
  "id",
  "text",
  "type",
  "context",
  "doc",
  "start",
  "end",
  "sentence",
  "tokenStart",
  "tokenEnd",
  "source",
] as const satisfies ReadonlyArray<keyof Mention>;

/**
 * Consecutive units gathered into batches of at least `size` mentions (the last may be shorter),
 * each mention checked as the linker checks it and copied (plainMention). A unit with a mention
 * the linker would refuse ends the batches there: the batch before it is given, then the error,
 * as Linker.linkAll gives the rows of the units before it and then the error. When the source
 * fails, the batch under way is given first, then the failure.
 */
async function* batchesOf(units: AsyncIterable<MentionUnit>, size: number): AsyncGenerator<MentionUnit[]> {
  let batch: MentionUnit[] = [];
  let mentions = 0;
  try {
    for await (const unit of units) {
      let copied: MentionUnit;
      try {
        for (const m of unit) checkMention(m);
        copied = unit.map(plainMention);
      } catch (error) {
        if (batch.length > 0) yield batch;
        batch = [];
        throw error;
      }
      batch.push(copied);
      mentions += unit.length;
      if (mentions >= size) {
        const full = batch;
        batch = [];
        mentions = 0;
        yield full;
      }
    }
  } catch (error) {
    if (batch.length > 0) yield batch;
    throw error;
  }
  if (batch.length > 0) yield batch;
}

/** A batch sent, with its units (whose labels are counted when its rows are given). */
interface Sent {
  units: MentionUnit[];
  answer: Promise<BatchRows>;
}

/**
 * Threads that link mentions (see the top of this file). Start one with `LinkPool.start`, link
 * with `linkAll` (as often as needed), and `close` it when done.
 */
export class LinkPool {
  private readonly threads: Thread[];
  private nextSeq = 0;
  private closed = false;

  private constructor(
    workers: Worker[],
    /**
     * The label map, counting the unknown and non-linkable labels of the mentions whose rows
     * linkAll has given (as one linker's map counts those it has linked).
     */
    readonly labels: LabelMap,
  ) {
    this.threads = workers.map((w) => new Thread(w));
  }

  /** Number of threads. */
  get jobs(): number {
    return this.threads.length;
  }

  /**
   * Start `jobs` threads (default: one per processor this process may use, at most MAX_JOBS),
   * each opening `kb` and making a linker with `options` (createLinker's; default none);
   * resolves when all are ready. Opening errors (not a KB, bad options) are
   * thrown as openKb and createLinker throw them, and no thread is left running.
   */
  static async start(
    kb: string,
    options: LinkerOptions = {},
    jobs = Math.min(availableParallelism(), MAX_JOBS),
  ): Promise<LinkPool> {
    checkWhole("jobs", jobs, 1, MAX_JOBS);
    if (typeof kb !== "string" || kb === "")
      throw new UsageError(`LinkPool.start needs the KB's file name, got ${JSON.stringify(kb)}`);
    if (!isObject(options)) throw new UsageError(`linker options must be an object, got ${shown(options)}`);
    const { labels, ...rest } = options;
    if (labels !== undefined && !(labels instanceof LabelMap))
      throw new UsageError("labels must be a LabelMap (readLabelMapFile reads one from a file)");
    const labelMap = labels ?? new LabelMap();
    const setup: WorkerSetup = { kb, options: rest, labels: labelMap.overrides(), shared: null };
    const script = workerScript();
    const workers: Worker[] = [];
    const startOne = (shared: SharedHotArrays | null) => {
      try {
        const w = new Worker(script, { workerData: { ...setup, shared } });
        workers.push(w);
        return ready(w);
      } catch (e) {
        if ((e as Error).name === "DataCloneError")
          throw new UsageError(
            `linker options must be plain data to be sent to linking threads: ${(e as Error).message}`,
          );
        throw e;
      }
    };
    try {
      // The first loads the store into shared memory, then the others start on it together.
      const shared = await startOne(null);
      const rest: Array<Promise<SharedHotArrays>> = [];
      for (let i = 1; i < jobs; i++) rest.push(startOne(shared));
      await Promise.all(rest);
    } catch (e) {
      await Promise.all(workers.map((w) => w.terminate()));
      throw e;
    }
    return new LinkPool(workers, labelMap);
  }

  /**
   * Link a stream of mentions, in order, one row each, as Linker.linkAll does (the same rows).
   * When the source fails (a bad line), the rows of the mentions read before it are given, then
   * the failure is thrown.
   */
  async *linkAll(mentions: Iterable<Mention> | AsyncIterable<Mention>): AsyncGenerator<LinkRow> {
    if (this.closed) throw new UsageError("this linking pool is closed");
    checkMentionSource("linkAll", mentions);
    const batches = batchesOf(mentionUnits(mentions), BATCH_MENTIONS);
    /** Batches sent, oldest first: their rows are given in this order. */
    const sent: Sent[] = [];
    let ended = false;
    let sourceFailure: { error: unknown } | null = null;
    const fill = async () => {
      while (!ended && sent.length < this.threads.length * BATCHES_IN_FLIGHT) {
        let next: IteratorResult<MentionUnit[]>;
        try {
          next = await batches.next();
        } catch (error) {
          sourceFailure = { error };
          ended = true;
          return;
        }
        if (next.done) {
          ended = true;
          return;
        }
        const answer = this.leastBusy().send(this.nextSeq++, next.value);
        // Awaited in turn below; until then a failure must not count as unhandled.
        answer.catch(() => {});
        sent.push({ units: next.value, answer });
      }
    };
    try {
      await fill();
      while (sent.length > 0) {
        const batch = sent.shift()!;
        const { rows, failure } = await batch.answer;
        if (failure === null) await fill();
        let at = 0;
        for (const unit of batch.units) {
          if (at >= rows.length) break; // the units after a failed one were not linked
          // Counted as the linker counts them: a unit's labels before its first row is given.
          for (const m of unit) this.labels.forMention(m.type);
          for (let i = 0; i < unit.length; i++) yield rows[at++]!;
        }
        if (failure !== null) throw failure;
      }
      if (sourceFailure !== null) throw (sourceFailure as { error: unknown }).error;
    } finally {
      // Stopped early (the caller broke off, or a batch failed): the source is closed; batches
      // still out are answered into the void.
      if (!ended) await batches.return(undefined);
    }
  }

  private leastBusy(): Thread {
    let best = this.threads[0]!;
    for (const t of this.threads) if (t.waiting.length < best.waiting.length) best = t;
    return best;
  }

  /** Stop the threads. */
  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    await Promise.all(this.threads.map((t) => t.worker.terminate()));
  }
}

/** Resolves with the shared store when the thread says it is ready; rejects with its opening error. */
function ready(worker: Worker): Promise<SharedHotArrays> {
  let shared: SharedHotArrays = new Map();
  return new Promise((resolve, reject) => {
    const onMessage = (m: WorkerReply) => {
      if (m.kind === "ready") {
        shared = m.shared;
        done(null);
      } else if (m.kind === "failed") done(errorFromMessage(m.error));
    };
    const onError = (e: Error) => done(e);
    const onExit = (code: number) =>
      done(new Error(`a linking thread stopped while opening (exit code ${code})`));
    const done = (e: Error | null) => {
      worker.off("message", onMessage);
      worker.off("error", onError);
      worker.off("exit", onExit);
      if (e === null) resolve(shared);
      else reject(e);
    };
    worker.on("message", onMessage);
    worker.on("error", onError);
    worker.on("exit", onExit);
  });
}
