/** A file that carries hawser's meta rows but not its tables is refused with a clear message. */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import Database from "better-sqlite3";
import { describe, expect, it } from "vitest";
import { openKb } from "../src/kb/kb.js";
import { KB_FORMAT, SCHEMA_VERSION } from "../src/kb/schema.js";
import { NORMALIZER_VERSION } from "../src/normalize/name.js";
import { InputError } from "../src/util/errors.js";

describe("opening a KB whose tables do not match", () => {
  it("fails with an InputError naming the file and asking for a rebuild", () => {
    const dir = mkdtempSync(join(tmpdir(), "hawser-incompat-"));
    const file = join(dir, "old.kb");
    const db = new Database(file);
    db.exec("CREATE TABLE meta (key TEXT PRIMARY KEY, value TEXT NOT NULL)");
    const put = db.prepare("INSERT INTO meta (key, value) VALUES (?, ?)");
    put.run("format", KB_FORMAT);
    put.run("schema_version", String(SCHEMA_VERSION));
    put.run("normalizer_version", NORMALIZER_VERSION);
    db.close();
    let error: unknown;
    try {
      openKb(file).close();
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).file).toBe(file);
    expect((error as Error).message).toMatch(/damaged or was built by an incompatible hawser.*rebuild it/);
    rmSync(dir, { recursive: true, force: true });
  });
});
