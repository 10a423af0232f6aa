/**
 * Atomic output: write to a temporary file beside the target, rename over it when complete.
 * A run that fails midway removes the temporary file, so no half-written output is ever left.
 */
import { randomBytes } from "node:crypto";
import { createWriteStream, openSync, renameSync, rmSync, type WriteStream, writeFileSync } from "node:fs";
import { basename, dirname, join } from "node:path";
import { once } from "node:events";

export class AtomicWriter {
  private readonly tmp: string;
  private readonly stream: WriteStream;
  private done = false;

  constructor(readonly target: string) {
    this.tmp = join(dirname(target), `.${basename(target)}.tmp-${process.pid}-${Date.now()}`);
    // Opened synchronously: the file exists when the constructor returns, so abort() always finds it.
    const fd = openSync(this.tmp, "w");
    this.stream = createWriteStream(this.tmp, { fd, encoding: "utf8" });
  }

  /** Write a chunk, waiting when the stream's buffer is full (keeps memory flat). */
  async write(chunk: string): Promise<void> {
    if (!this.stream.write(chunk)) await once(this.stream, "drain");
  }

  /** Finish and move into place. */
  async commit(): Promise<void> {
    this.stream.end();
    await once(this.stream, "finish");
    renameSync(this.tmp, this.target);
    this.done = true;
  }

  /** Throw the partial output away (safe to call after commit: then it does nothing). */
  abort(): void {
    if (this.done) return;
    this.done = true;
    this.stream.destroy();
    rmSync(this.tmp, { force: true });
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
    throw e;
  }
}
