/**
 * Buffered line output for large generated files: rows are appended to a small buffer and
 * flushed to disk in chunks, so a million-row table is never held in memory as one string.
 */

import { closeSync, openSync, writeSync } from "node:fs";

/** Flush once this many characters are buffered: large enough to amortize syscalls, small in memory. */
const FLUSH_CHARS = 1 << 20;

/** Appends text to a file through a bounded buffer. */
export class BufferedWriter {
  private readonly fd: number;
  private chunks: string[] = [];
  private buffered = 0;

  /** Creates (or truncates) `path`. */
  constructor(path: string) {
    this.fd = openSync(path, "w");
  }

  write(text: string): void {
    this.chunks.push(text);
    this.buffered += text.length;
    if (this.buffered >= FLUSH_CHARS) this.flush();
  }

  flush(): void {
    if (this.chunks.length === 0) return;
    writeSync(this.fd, this.chunks.join(""));
    this.chunks = [];
    this.buffered = 0;
  }

  close(): void {
    this.flush();
    closeSync(this.fd);
  }
}

/** A field quoted per RFC 4180 when it holds a comma, a quote or a line break. */
export function csvField(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** One CSV record with its line ending. */
export function csvRow(values: readonly string[]): string {
  return values.map(csvField).join(",") + "\n";
}
