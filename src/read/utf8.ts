/**
 * Strict UTF-8 decoding for every reader: bytes that are not valid UTF-8 are an error naming the
 * file and line, never silently replaced by U+FFFD (which would corrupt names and shift offsets).
 */

import { Transform, type TransformCallback } from "node:stream";
import { InputError } from "../util/errors.js";

/** Line feed: ends a line (alone or after a carriage return). */
const LF = 0x0a;
/** Carriage return: ends a line when not followed by a line feed (old Mac files), as readline does. */
const CR = 0x0d;
/** The byte order mark some editors put at the start of a UTF-8 file; it is not part of the data. */
const BOM = "\ufeff";

/**
 * Count line ends in `bytes`: LF, CRLF and lone CR each count once (every CR, and every LF not
 * right after a CR). Found with Buffer.indexOf, which scans natively, not byte by byte in JS.
 */
function countLineEnds(bytes: Buffer, afterCR: boolean): { count: number; endsWithCR: boolean } {
  let count = 0;
  for (let i = bytes.indexOf(CR); i >= 0; i = bytes.indexOf(CR, i + 1)) count++;
  for (let i = bytes.indexOf(LF); i >= 0; i = bytes.indexOf(LF, i + 1)) {
    const previousCR = i === 0 ? afterCR : bytes[i - 1] === CR;
    if (!previousCR) count++;
  }
  return { count, endsWithCR: bytes.length === 0 ? afterCR : bytes[bytes.length - 1] === CR };
}

/** Index of the last LF or CR byte, or -1. */
function lastLineEnd(bytes: Buffer): number {
  for (let i = bytes.length - 1; i >= 0; i--) {
    const byte = bytes[i];
    if (byte === LF || byte === CR) return i;
  }
  return -1;
}

/**
 * A transform from raw file bytes to decoded strings (object mode on the readable side). It decodes
 * only whole lines (a line end is never inside a multi-byte sequence), so a failure can be pinned
 * to its line: the message reads `file:line: invalid UTF-8 bytes`. A leading BOM is dropped.
 */
export function strictUtf8(file: string): Transform {
  // ignoreBOM keeps a BOM in the output so that only the one at the very start is removed (below).
  const decoder = new TextDecoder("utf-8", { fatal: true, ignoreBOM: true });
  // Bytes after the last line end seen, kept as parts so that a long line is joined only once.
  let carry: Buffer[] = [];
  let line = 1;
  let afterCR = false;
  let first = true;

  const decode = (block: Buffer): string => {
    try {
      return decoder.decode(block);
    } catch {
      throw new InputError({ file, line: line + badLineOffset(block, afterCR) }, "invalid UTF-8 bytes");
    }
  };

  const emit = (stream: Transform, block: Buffer): void => {
    let text = decode(block);
    if (first) {
      if (text.startsWith(BOM)) text = text.slice(BOM.length);
      first = false;
    }
    const ends = countLineEnds(block, afterCR);
    line += ends.count;
    afterCR = ends.endsWithCR;
    if (text.length > 0) stream.push(text);
  };

  return new Transform({
    readableObjectMode: true,
    transform(chunk: Buffer, _encoding: BufferEncoding, callback: TransformCallback) {
      try {
        const cut = lastLineEnd(chunk);
        if (cut < 0) {
          carry.push(chunk);
        } else {
          const head = chunk.subarray(0, cut + 1);
          const block = carry.length === 0 ? head : Buffer.concat([...carry, head]);
          carry = cut + 1 < chunk.length ? [chunk.subarray(cut + 1)] : [];
          emit(this, block);
        }
        callback();
      } catch (error) {
        callback(error as Error);
      }
    },
    flush(callback: TransformCallback) {
      try {
        if (carry.length > 0) emit(this, Buffer.concat(carry));
        callback();
      } catch (error) {
        callback(error as Error);
      }
    },
  });
}

/** Within a block that failed to decode, the 0-based offset (in lines) of the first bad line. */
function badLineOffset(block: Buffer, afterCR: boolean): number {
  const probe = new TextDecoder("utf-8", { fatal: true });
  let offset = 0;
  let previousCR = afterCR;
  let lineStart = 0;
  for (let i = 0; i <= block.length; i++) {
    const byte = block[i];
    const atEnd = i === block.length;
    if (atEnd || byte === LF || byte === CR) {
      try {
        probe.decode(block.subarray(lineStart, i));
      } catch {
        return offset;
      }
      if (atEnd) break;
      if (!(byte === LF && previousCR)) offset++;
      previousCR = byte === CR;
      lineStart = i + 1;
    } else {
      previousCR = false;
    }
  }
  return offset;
}
