import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { AtomicWriter, OUTPUT_BUFFER_BYTES } from "../src/util/atomic-file.js";
import { tempDir as makeTempDir } from "./helpers/gazette.js";

const made: ReturnType<typeof makeTempDir>[] = [];
afterEach(() => {
  for (const t of made.splice(0)) t.cleanup();
});
function tempDir(): string {
  const t = makeTempDir("hawser-atomic-");
  made.push(t);
  return t.dir;
}

describe("AtomicWriter", () => {
  it("writes many full buffers without piling up stream listeners", async () => {
    const warnings: Error[] = [];
    const onWarning = (w: Error) => warnings.push(w);
    process.on("warning", onWarning);
    try {
      const dir = tempDir();
      const target = join(dir, "links.jsonl");
      const writer = new AtomicWriter(target);
      // Each chunk fills the buffer, so every write waits for a drain: 25 waits, where ten
      // leftover listeners already drew Node's MaxListenersExceededWarning.
      const chunk = `${"x".repeat(OUTPUT_BUFFER_BYTES + 1)}\n`;
      const rounds = 25;
      for (let i = 0; i < rounds; i++) await writer.write(chunk);
      await writer.commit();
      // Warnings are emitted on a later tick.
      await new Promise((r) => setImmediate(r));
      expect(warnings.map((w) => w.name)).not.toContain("MaxListenersExceededWarning");
      expect(readFileSync(target, "utf8").length).toBe(chunk.length * rounds);
      expect(readdirSync(dir)).toEqual(["links.jsonl"]);
    } finally {
      process.off("warning", onWarning);
    }
  });

  it("leaves nothing behind when aborted", async () => {
    const dir = tempDir();
    const writer = new AtomicWriter(join(dir, "links.jsonl"));
    await writer.write("partial\n");
    writer.abort();
    expect(readdirSync(dir)).toEqual([]);
  });
});
