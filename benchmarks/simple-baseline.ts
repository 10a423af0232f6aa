/**
 * The simple baseline the benchmark measures beside hawser in the same run: what a practitioner
 * writes by hand in an afternoon to link mentions to a table, so that hawser's speed can be read
 * as a ratio to it on the same machine, data and moment, and its quality against what that
 * speed buys.
 *
 * - Build: stream the same CSV table through the same CSV parser, and write one SQLite file
 *   holding each row (id, prior) and each of its names and aliases under a folded key
 *   (lowercase, diacritics and punctuation gone: `foldText`), with a B-tree index on the key.
 *   Same settings as hawser's build where they are not the point (one transaction, journal
 *   and fsync off, a temporary file renamed into place).
 * - Link: fold the mention's text, look the key up through the index, take the most popular
 *   row of that name (highest prior; the first in table order on a tie); NIL when no name
 *   matches. No types, no context, no fuzzy matching: the folded-exact-name baseline of the
 *   open-data checks (benchmarks/open-data.ts), here over SQLite like hawser.
 */

import { createReadStream, renameSync, rmSync } from "node:fs";
import { parse } from "csv-parse";
import Database from "better-sqlite3";
import { foldText } from "../src/normalize/fold.js";

/** Separator of aliases in the benchmark's CSV table (as in hawser's CSV tables). */
const ALIAS_SEPARATOR = "|";

export interface SimpleBuildResult {
  entities: number;
  /** Names and aliases written (after dropping a row's repeats of one folded key). */
  names: number;
  seconds: number;
}

/** Build the baseline's SQLite file at `out` from the CSV `table` (columns id, name, aliases, prior). */
export async function buildSimple(table: string, out: string): Promise<SimpleBuildResult> {
  const started = process.hrtime.bigint();
  const tmp = `${out}.tmp-${process.pid}`;
  rmSync(tmp, { force: true });
  const db = new Database(tmp);
  let entities = 0;
  let names = 0;
  try {
    db.pragma("journal_mode = OFF");
    db.pragma("synchronous = OFF");
    db.exec(`
      CREATE TABLE entity (eid INTEGER PRIMARY KEY, id TEXT NOT NULL, prior REAL NOT NULL);
      CREATE TABLE name (key TEXT NOT NULL, eid INTEGER NOT NULL);
    `);
    const putEntity = db.prepare("INSERT INTO entity (eid, id, prior) VALUES (?, ?, ?)");
    const putName = db.prepare("INSERT INTO name (key, eid) VALUES (?, ?)");
    db.exec("BEGIN");
    const parser = createReadStream(table).pipe(parse({ columns: true }));
    for await (const row of parser as AsyncIterable<Record<string, string>>) {
      entities++;
      const prior = row.prior === undefined || row.prior === "" ? 0 : Number(row.prior);
      putEntity.run(entities, row.id, prior);
      const keys = new Set<string>([foldText(row.name ?? "")]);
      for (const alias of (row.aliases ?? "").split(ALIAS_SEPARATOR))
        if (alias !== "") keys.add(foldText(alias));
      for (const key of keys) {
        if (key === "") continue;
        putName.run(key, entities);
        names++;
      }
    }
    db.exec("CREATE INDEX name_key ON name (key)");
    db.exec("COMMIT");
    db.close();
    renameSync(tmp, out);
  } catch (error) {
    if (db.open) db.close();
    rmSync(tmp, { force: true });
    throw error;
  }
  return { entities, names, seconds: Number(process.hrtime.bigint() - started) / 1e9 };
}

/** Links by folded exact name over a file `buildSimple` wrote; close() when done. */
export class SimpleLinker {
  private readonly db: Database.Database;
  private readonly lookup: Database.Statement<[string], { id: string }>;

  constructor(file: string) {
    this.db = new Database(file, { readonly: true });
    this.lookup = this.db.prepare(
      "SELECT e.id AS id FROM name n JOIN entity e ON e.eid = n.eid WHERE n.key = ? ORDER BY e.prior DESC, e.eid LIMIT 1",
    );
  }

  /** The table id of the most popular row named as `text`, folded; null when none is. */
  link(text: string): string | null {
    return this.lookup.get(foldText(text))?.id ?? null;
  }

  close(): void {
    this.db.close();
  }
}
