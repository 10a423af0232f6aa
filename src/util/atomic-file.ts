/**
 * Atomic output: write to a temporary file beside the target, rename over it when complete.
 * A run that fails midway removes the temporary file, so no half-written output is ever left.
 */
import { randomBytes } from "node:crypto";
import {
  accessSync,
  constants,
  createWriteStream,
  lstatSync,
  openSync,
  readdirSync,
  renameSync,
  rmSync,
  statSync,
  type WriteStream,
  writeFileSync,
} from "node:fs";
import { basename, dirname, join, resolve } from "node:path";
import { STDIN } from "../read/lines.js";
import { eventLoopTurn, onInterrupt } from "./interrupt.js";
import { OutputError, UsageError } from "./errors.js";

/**
 * True when two paths name one file: the same path once resolved (whether or not it exists yet,
 * as two outputs may), or the same device and inode.
 */
function sameFile(a: string, b: string): boolean {
  if (resolve(a) === resolve(b)) return true;
  const sa = statSync(a, { throwIfNoEntry: false });
  const sb = statSync(b, { throwIfNoEntry: false });
  return sa !== undefined && sb !== undefined && sa.dev === sb.dev && sa.ino === sb.ino;
}

/**
 * Checks, before any work, that an output file can be written where asked: its folder exists,
 * is a folder and is writable; the file itself, if it exists, is a plain file (the output is
 * renamed into place, which would replace a link, a pipe or a device with a plain file), and
 * none of the run's `inputs` (the table, the KB, the mentions...), which it would overwrite.
 * Throws a UsageError naming the option (`what`, e.g. "--out") and the path; otherwise a run
 * would fail at its end, with a bare system error, or destroy its own input.
 */
export function checkOutputFile(
  file: string,
  what: string,
  inputs: ReadonlyArray<readonly [string, string | undefined]> = [],
): void {
  const dir = dirname(file);
  const folder = statSync(dir, { throwIfNoEntry: false });
  if (folder === undefined) throw new UsageError(`${what} ${file}: the folder ${dir} does not exist`);
  if (!folder.isDirectory()) throw new UsageError(`${what} ${file}: ${dir} is not a folder`);
  try {
    accessSync(dir, constants.W_OK);
  } catch {
    throw new UsageError(`${what} ${file}: the folder ${dir} is not writable`);
  }
  const existing = lstatSync(file, { throwIfNoEntry: false });
  if (existing?.isDirectory()) throw new UsageError(`${what} ${file} is a folder, not a file`);
  if (existing?.isSymbolicLink())
    throw new UsageError(
      `${what} ${file} is a symbolic link; the output is renamed into place and would replace the link: give the path it points to`,
    );
  if (existing !== undefined && !existing.isFile())
    throw new UsageError(`${what} ${file} is not a plain file (a pipe, a device or a socket)`);
  for (const [option, input] of inputs) {
    if (input !== undefined && input !== STDIN && sameFile(file, input))
      throw new UsageError(`${what} ${file} is also ${option}: the output would overwrite it`);
  }
}

/**
 * Bytes an output stream buffers before write() asks the writer to wait. Node's default (16 KiB)
 * holds a dozen link rows: linking then paused for a disk write every dozen mentions, idle while
 * the write ran. A mebibyte keeps memory flat and the pauses rare.
 */
export const OUTPUT_BUFFER_BYTES = 1 << 20;

/** Files SQLite may keep beside a database while writing it. */
const SQLITE_SIDE_FILES = ["-journal", "-wal", "-shm"];

/**
 * The temporary file name of an output under way: the target's name after a dot, the process id
 * and the time, so that removeStaleTemporaries can tell whose it is.
 */
export function temporaryPath(target: string): string {
  return join(dirname(target), `.${basename(target)}.tmp-${process.pid}-${Date.now()}`);
}

/**
 * A temporary file left by a run killed outright (SIGKILL, the out-of-memory killer) is not
 * removed by the run: the next run for the same target removes it, when the process that wrote
 * it is gone from this machine and it has not been written to for this long (a writer on
 * another machine sharing the folder keeps its file fresh).
 */
const STALE_AFTER_MS = 60_000;

/** What follows ".NAME.tmp-" in a temporary file's name: process id, time in milliseconds (ten digits or more), maybe a SQLite side file's ending. */
const STALE_TEMPORARY = new RegExp(`^(\\d+)-\\d{10,}(?:${SQLITE_SIDE_FILES.join("|")})?$`);

/** Removes the temporary files (and SQLite side files) of earlier runs for `target` that died unfinished. */
export function removeStaleTemporaries(target: string): void {
  const folder = dirname(target);
  const prefix = `.${basename(target)}.tmp-`;
  let names: string[];
  try {
    names = readdirSync(folder);
  } catch {
    return; // the output check reports an unreadable folder
  }
  for (const name of names) {
    if (!name.startsWith(prefix)) continue;
    // Exactly the shape temporaryPath gives, or SQLite's side file of one: nothing that merely
    // begins like it ("...tmp-1-2.backup", another output's "....tmp-1-2.tmp-3-4").
    const shape = STALE_TEMPORARY.exec(name.slice(prefix.length));
    if (shape === null) continue;
    const pid = Number(shape[1]);
    if (!Number.isSafeInteger(pid) || pid === process.pid || processAlive(pid)) continue;
    const path = join(folder, name);
    try {
      const stat = lstatSync(path);
      // A plain file only (not a link, a folder), untouched for a while.
      if (!stat.isFile() || Date.now() - stat.mtimeMs < STALE_AFTER_MS) continue;
      rmSync(path, { force: true });
    } catch {
      // gone meanwhile, or not ours to remove: leave it
    }
  }
}

/** Whether a process of this id runs on this machine (one we may not signal still counts). */
function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === "EPERM";
  }
}

/**
 * Records a temporary file (a KB under construction, links under way) as unfinished until the
 * returned function is called (on rename or removal), so that an interrupted command line
 * removes it, with SQLite's side files (see src/util/interrupt.ts).
 */
export function trackUnfinished(path: string, target: string): () => void {
  return onInterrupt({
    output: target,
    run: () => {
      for (const side of ["", ...SQLITE_SIDE_FILES]) rmSync(`${path}${side}`, { force: true });
    },
  });
}

export class AtomicWriter {
  private readonly tmp: string;
  private readonly stream: WriteStream;
  private done = false;
  private readonly finished: () => void;
  /**
   * The stream's first error (a full disk...), reported by the next write or the commit; after an
   * abort, a write under way ends on the destroyed stream, an error nobody needs to hear of.
   */
  private failure: Error | null = null;

  constructor(readonly target: string) {
    removeStaleTemporaries(target);
    this.tmp = temporaryPath(target);
    // Opened synchronously: the file exists when the constructor returns, so abort() always finds it.
    let fd: number;
    try {
      fd = openSync(this.tmp, "w");
    } catch (e) {
      throw new OutputError(target, e as Error);
    }
    this.finished = trackUnfinished(this.tmp, target);
    this.stream = createWriteStream(this.tmp, { fd, encoding: "utf8", highWaterMark: OUTPUT_BUFFER_BYTES });
    this.stream.on("error", (e) => {
      this.failure ??= e;
    });
  }

  /** Write a chunk, waiting when the stream's buffer is full (keeps memory flat). */
  async write(chunk: string): Promise<void> {
    this.check();
    if (!this.stream.write(chunk)) {
      // A failing stream never drains: wait for whichever comes first.
      await this.first("drain", "close");
      this.check();
    }
  }

  /**
   * Resolves on the first of two stream events and removes both listeners then: a race of two
   * `once` promises leaves the loser's listener behind, one more at every full buffer (a long
   * run drew a MaxListenersExceededWarning after ten).
   */
  private first(a: string, b: string): Promise<void> {
    return new Promise((resolve) => {
      const done = () => {
        this.stream.off(a, done);
        this.stream.off(b, done);
        resolve();
      };
      this.stream.on(a, done);
      this.stream.on(b, done);
    });
  }

  /** Throws the stream's error, if any, as an OutputError naming the target. */
  private check(): void {
    if (this.failure !== null) throw new OutputError(this.target, this.failure);
  }

  /** Finish and move into place. */
  async commit(): Promise<void> {
    this.check();
    this.stream.end();
    await this.first("finish", "close");
    this.check();
    await eventLoopTurn(); // an interruption that came meanwhile is handled before the rename
    renameSync(this.tmp, this.target);
    this.finished();
    this.done = true;
  }

  /** Throw the partial output away (safe to call after commit: then it does nothing). */
  abort(): void {
    if (this.done) return;
    this.done = true;
    this.stream.destroy();
    rmSync(this.tmp, { force: true });
    this.finished();
  }
}

/** Random bytes in a temporary file name: enough that two writers never collide. */
const TEMP_NAME_BYTES = 6;

/** Write a whole text file atomically: a new temporary file beside the target, then a rename. */
export function writeFileAtomic(file: string, text: string): void {
  const temp = join(
    dirname(file),
    `.${basename(file)}.${process.pid}.${randomBytes(TEMP_NAME_BYTES).toString("hex")}.tmp`,
  );
  try {
    writeFileSync(temp, text, { encoding: "utf8", flag: "wx" });
    renameSync(temp, file);
  } catch (e) {
    rmSync(temp, { force: true });
    throw new OutputError(file, e as Error);
  }
}
