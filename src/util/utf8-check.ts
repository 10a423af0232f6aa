/**
 * A pass-through stream that fails on invalid UTF-8 instead of letting a decoder replace bad
 * bytes with U+FFFD: lost bytes in a name would silently change what links. The error names
 * the file and the line of the first bad byte.
 */
import { Transform, type TransformCallback } from "node:stream";
import { InputError } from "./errors.js";

const NEWLINE = 0x0a;

export class Utf8Check extends Transform {
  private readonly decoder = new TextDecoder("utf-8", { fatal: true });
  private lines = 1;
  private first = true;

  constructor(private readonly file: string) {
    super();
  }

  override _transform(chunk: Buffer, _enc: BufferEncoding, done: TransformCallback): void {
    let data = chunk;
    if (this.first) {
      this.first = false;
      // A UTF-8 byte-order mark is legal but carries no text.
      if (data.length >= 3 && data[0] === 0xef && data[1] === 0xbb && data[2] === 0xbf) data = data.subarray(3);
    }
    try {
      this.decoder.decode(data, { stream: true });
    } catch {
      done(new InputError({ file: this.file, line: this.lineOfBadByte(data) }, "invalid UTF-8 byte sequence"));
      return;
    }
    for (let i = 0; i < data.length; i++) if (data[i] === NEWLINE) this.lines++;
    done(null, data);
  }

  override _flush(done: TransformCallback): void {
    try {
      this.decoder.decode();
    } catch {
      done(new InputError({ file: this.file, line: this.lines }, "invalid UTF-8: the file ends inside a character"));
      return;
    }
    done();
  }

  /** Best effort: the first line of the chunk that does not decode on its own. */
  private lineOfBadByte(data: Buffer): number {
    const probe = new TextDecoder("utf-8", { fatal: true });
    let line = this.lines;
    let start = 0;
    for (let i = 0; i <= data.length; i++) {
      if (i === data.length || data[i] === NEWLINE) {
        try {
          probe.decode(data.subarray(start, i));
        } catch {
          return line;
        }
        line++;
        start = i + 1;
      }
    }
    return this.lines;
  }
}
