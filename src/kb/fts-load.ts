/**
 * The full-text rows of the KB (see schema.ts): every name key of every entity, in order of
 * falling prior (ties: table order, then the entity's name order), numbered from 1. The keys and
 * priors are kept in memory while the table streams in, so the order is found by sorting entity
 * numbers instead of joining and sorting tables in SQLite.
 */
import type Database from "better-sqlite3";
import { type PostingArrays, PostingsBuilder } from "./postings.js";

/** Separates the name keys of one entity in memory (folded keys never contain control characters). */
const KEY_SEPARATOR = "\u001e";
/**
 * Full-text rows handed to SQLite per statement, as one JSON array expanded by json_each: FTS5
 * then tokenizes rows inside one statement instead of one statement call per row (a quarter
 * less time at a million entities).
 */
const ROWS_PER_STATEMENT = 20_000;
/** Initial number of entities the prior array holds; it doubles when full. */
const INITIAL_ENTITIES = 1 << 16;

export class FtsRows {
  private priors = new Float64Array(INITIAL_ENTITIES);
  /** Per entity (in order added): its name keys joined by KEY_SEPARATOR, "" when it has none. */
  private readonly keys: string[] = [];

  /** Adds the next entity (internal id = number added so far + 1) with its name keys in order. */
  add(prior: number, keys: readonly string[]): void {
    const i = this.keys.length;
    if (i === this.priors.length) {
      const p = new Float64Array(this.priors.length * 2);
      p.set(this.priors);
      this.priors = p;
    }
    this.priors[i] = prior;
    this.keys.push(keys.join(KEY_SEPARATOR));
  }

  /**
   * Writes alias_fts (inside the caller's transaction), then lets go of the keys; returns the
   * entity id at each full-text position (index 0 unused) and the in-memory word index of the
   * same rows (postings.ts), for the hot store.
   */
  write(db: Database.Database): { posEid: Uint32Array; postings: PostingArrays } {
    const n = this.keys.length;
    const priors = this.priors;
    const order = new Uint32Array(n);
    for (let i = 0; i < n; i++) order[i] = i;
    order.sort((a, b) => priors[b]! - priors[a]! || a - b);
    // Positions are json_each's 0-based array index plus the position of the slice's first row.
    const insFts = db.prepare(
      "INSERT INTO alias_fts (rowid, tokens) SELECT key + ?, value FROM json_each(?)",
    );
    const eids: number[] = [0];
    const postings = new PostingsBuilder();
    let texts: string[] = [];
    let written = 0;
    const flush = () => {
      insFts.run(written + 1, JSON.stringify(texts));
      written += texts.length;
      texts = [];
    };
    for (let o = 0; o < n; o++) {
      const i = order[o]!;
      const joined = this.keys[i]!;
      if (joined === "") continue;
      for (const key of joined.split(KEY_SEPARATOR)) {
        eids.push(i + 1);
        texts.push(key);
        postings.addKey(key, i + 1);
        if (texts.length === ROWS_PER_STATEMENT) flush();
      }
    }
    if (texts.length > 0) flush();
    this.keys.length = 0;
    this.priors = new Float64Array(0);
    return { posEid: Uint32Array.from(eids), postings: postings.build() };
  }
}
