/**
 * Opening a KB file read-only, checking it is one of ours, and the lookups the candidate and
 * scoring stages need (prepared once, cached where the same rows recur).
 */
import { existsSync } from "node:fs";
import Database from "better-sqlite3";
import { NORMALIZER_VERSION } from "../normalize/name.js";
import type { EntityClass } from "../types.js";
import { InputError } from "../util/errors.js";
import { KB_FORMAT, type KeyKind, SCHEMA_VERSION } from "./schema.js";

export interface KbInfo {
  file: string;
  format: string;
  schemaVersion: number;
  normalizerVersion: string;
  fingerprint: string;
  sourceFile: string;
  sourceSha256: string;
  entities: number;
  aliases: number;
  keys: number;
  vocabulary: number;
  contextTerms: number;
  contextDocs: number;
  maxPrior: number;
  byClass: Record<string, number>;
  created: string;
}

export interface AliasRow {
  aid: number;
  text: string;
  key: string;
  full: string;
  ocr: string;
  canonical: boolean;
  tokens: string[];
}

export interface EntityRow {
  eid: number;
  id: string;
  name: string;
  type: string;
  cls: EntityClass;
  description: string;
  prior: number;
  attributes: Record<string, string>;
  /** Sorted stemmed context terms (repeated per occurrence). */
  terms: string[];
  aliases: AliasRow[];
}

/** Entities kept decoded in memory: the same popular entities are candidates again and again. */
const ENTITY_CACHE_SIZE = 20_000;
/** IDF values kept in memory. */
const IDF_CACHE_SIZE = 200_000;

/** A map that forgets its oldest entry past a size (insertion order = age; a hit refreshes). */
class Lru<K, V> {
  private readonly map = new Map<K, V>();
  constructor(private readonly size: number) {}
  get(k: K): V | undefined {
    const v = this.map.get(k);
    if (v !== undefined) {
      this.map.delete(k);
      this.map.set(k, v);
    }
    return v;
  }
  set(k: K, v: V): void {
    if (this.map.size >= this.size) {
      const oldest = this.map.keys().next();
      if (!oldest.done) this.map.delete(oldest.value);
    }
    this.map.set(k, v);
  }
}

export class Kb {
  readonly db: Database.Database;
  readonly info: KbInfo;
  private readonly stmts: {
    key: Database.Statement<[string, string, string], { eid: number }>;
    fts: Database.Statement<[string, number], { eid: number; class: string }>;
    vocab: Database.Statement<[string], { df: number }>;
    deletes: Database.Statement<[string], { token: string }>;
    idf: Database.Statement<[string], { df: number }>;
    entity: Database.Statement<[number], Record<string, unknown>>;
    aliases: Database.Statement<[number], Record<string, unknown>>;
    byClass: Database.Statement<[string], { eid: number }>;
    byId: Database.Statement<[string], { eid: number }>;
  };
  private readonly entityCache = new Lru<number, EntityRow>(ENTITY_CACHE_SIZE);
  private readonly idfCache = new Lru<string, number>(IDF_CACHE_SIZE);
  private readonly vocabCache = new Lru<string, number>(IDF_CACHE_SIZE);

  constructor(file: string) {
    if (!existsSync(file))
      throw new InputError({ file }, "no such KB file (build one with `hawser index TABLE --out KB`)");
    let db: Database.Database;
    try {
      db = new Database(file, { readonly: true, fileMustExist: true });
      db.pragma("query_only = ON");
    } catch (e) {
      throw new InputError({ file }, `cannot open as a KB: ${(e as Error).message}`);
    }
    this.db = db;
    this.info = readInfo(db, file);
    this.stmts = {
      key: db.prepare(
        "SELECT DISTINCT a.eid AS eid FROM keys k JOIN aliases a ON a.aid = k.aid WHERE k.key = ? AND k.class = ? AND k.kind = ?",
      ),
      // Rank inside the subquery (FTS5 stops after LIMIT rows), join outside, keep the rank order.
      fts: db.prepare(
        "SELECT a.eid AS eid, e.class AS class FROM " +
          "(SELECT rowid AS aid, rank FROM alias_fts WHERE alias_fts MATCH ? ORDER BY rank LIMIT ?) f " +
          "JOIN aliases a ON a.aid = f.aid JOIN entities e ON e.eid = a.eid ORDER BY f.rank",
      ),
      vocab: db.prepare("SELECT df FROM vocab WHERE token = ?"),
      deletes: db.prepare("SELECT token FROM deletes WHERE variant = ?"),
      idf: db.prepare("SELECT df FROM idf WHERE term = ?"),
      entity: db.prepare(
        "SELECT eid, id, name, type, class, description, prior, attributes, terms FROM entities WHERE eid = ?",
      ),
      aliases: db.prepare(
        "SELECT aid, text, key, full, ocr, canonical FROM aliases WHERE eid = ? ORDER BY aid",
      ),
      byClass: db.prepare("SELECT eid FROM entities WHERE class = ? ORDER BY eid"),
      byId: db.prepare("SELECT eid FROM entities WHERE id = ?"),
    };
  }

  close(): void {
    if (this.db.open) this.db.close();
  }

  /** Entity ids (internal) whose alias has this key, class and kind. */
  lookupKey(key: string, cls: EntityClass, kind: KeyKind): number[] {
    return this.stmts.key.all(key, cls, kind).map((r) => r.eid);
  }

  /**
   * FTS5 search over alias tokens. `tokens` are folded words (letters and digits only); each is
   * quoted as an FTS5 string with embedded quotes doubled, and they are joined by OR, so mention
   * text never reaches the FTS5 query parser as syntax.
   */
  searchAliases(tokens: readonly string[], limit: number): Array<{ eid: number; cls: EntityClass }> {
    // A token with an inner separator would be an FTS5 phrase; split it into its words first.
    const words = tokens.flatMap((t) => t.split(/[^\p{L}\p{N}]+/u)).filter((w) => w.length > 0);
    if (words.length === 0) return [];
    const query = words.map(ftsString).join(" OR ");
    const out: Array<{ eid: number; cls: EntityClass }> = [];
    for (const row of this.stmts.fts.all(query, limit))
      out.push({ eid: row.eid, cls: row.class as EntityClass });
    return out;
  }

  /** How many entities have this token in a name or alias (0 when unknown). */
  tokenDf(token: string): number {
    let df = this.vocabCache.get(token);
    if (df === undefined) {
      df = this.stmts.vocab.get(token)?.df ?? 0;
      this.vocabCache.set(token, df);
    }
    return df;
  }

  /** Table tokens sharing a one-deletion variant with `variant`. */
  tokensForVariant(variant: string): string[] {
    return this.stmts.deletes.all(variant).map((r) => r.token);
  }

  /** Number of entities whose context mentions `term` (0 when unknown). */
  termDf(term: string): number {
    let df = this.idfCache.get(term);
    if (df === undefined) {
      df = this.stmts.idf.get(term)?.df ?? 0;
      this.idfCache.set(term, df);
    }
    return df;
  }

  entity(eid: number): EntityRow {
    const cached = this.entityCache.get(eid);
    if (cached) return cached;
    const r = this.stmts.entity.get(eid);
    if (!r) throw new Error(`KB ${this.info.file}: no entity with internal id ${eid}`);
    const aliases = this.stmts.aliases.all(eid).map((a) => ({
      aid: a.aid as number,
      text: a.text as string,
      key: a.key as string,
      full: a.full as string,
      ocr: a.ocr as string,
      canonical: a.canonical === 1,
      tokens: (a.key as string).split(" "),
    }));
    const terms = r.terms as string;
    const row: EntityRow = {
      eid: r.eid as number,
      id: r.id as string,
      name: r.name as string,
      type: r.type as string,
      cls: r.class as EntityClass,
      description: r.description as string,
      prior: r.prior as number,
      attributes: JSON.parse(r.attributes as string) as Record<string, string>,
      terms: terms === "" ? [] : terms.split(" "),
      aliases,
    };
    this.entityCache.set(eid, row);
    return row;
  }

  /** Internal id of a table id, or undefined. */
  eidOf(id: string): number | undefined {
    return this.stmts.byId.get(id)?.eid;
  }

  /** Every entity of a class, in table order (the brute-force baseline walks this). */
  *entitiesOfClass(cls: EntityClass): Generator<number> {
    for (const r of this.stmts.byClass.iterate(cls)) yield r.eid;
  }
}

/** An FTS5 string literal: wrapped in double quotes, inner double quotes doubled. */
export function ftsString(token: string): string {
  return `"${token.replace(/"/g, '""')}"`;
}

function readInfo(db: Database.Database, file: string): KbInfo {
  let rows: Array<{ key: string; value: string }>;
  try {
    rows = db.prepare("SELECT key, value FROM meta").all() as Array<{ key: string; value: string }>;
  } catch (e) {
    const msg = (e as Error).message;
    throw new InputError(
      { file },
      /not a database|no such table/.test(msg) ? "not a hawser KB file" : `cannot read KB: ${msg}`,
    );
  }
  const m = new Map(rows.map((r) => [r.key, r.value]));
  if (m.get("format") !== KB_FORMAT)
    throw new InputError({ file }, "not a hawser KB file (no hawser format tag)");
  const version = Number(m.get("schema_version"));
  if (!Number.isInteger(version) || version < 1)
    throw new InputError({ file }, "KB file has no valid schema version");
  if (version > SCHEMA_VERSION) {
    throw new InputError(
      { file },
      `KB schema version ${version} is newer than this hawser reads (${SCHEMA_VERSION}); upgrade hawser`,
    );
  }
  const normalizerVersion = m.get("normalizer_version") ?? "";
  if (normalizerVersion !== NORMALIZER_VERSION) {
    throw new InputError(
      { file },
      `KB was built with normalizer version ${normalizerVersion}, this hawser uses ${NORMALIZER_VERSION}: rebuild it with \`hawser index\``,
    );
  }
  const num = (k: string) => Number(m.get(k) ?? 0);
  return {
    file,
    format: KB_FORMAT,
    schemaVersion: version,
    normalizerVersion,
    fingerprint: m.get("fingerprint") ?? "",
    sourceFile: m.get("source_file") ?? "",
    sourceSha256: m.get("source_sha256") ?? "",
    entities: num("entities"),
    aliases: num("aliases"),
    keys: num("keys"),
    vocabulary: num("vocabulary"),
    contextTerms: num("context_terms"),
    contextDocs: num("context_docs"),
    maxPrior: num("max_prior"),
    byClass: JSON.parse(m.get("by_class") ?? "{}") as Record<string, number>,
    created: m.get("created") ?? "",
  };
}

export function openKb(file: string): Kb {
  return new Kb(file);
}
