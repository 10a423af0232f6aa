/**
 * Opening a KB file read-only, checking it is one of ours, and the lookups the candidate and
 * scoring stages need (prepared once, cached where the same rows recur).
 */
import { existsSync, statSync } from "node:fs";
import Database from "better-sqlite3";
import { abbreviates, NORMALIZER_VERSION } from "../normalize/name.js";
import { ftsWords } from "./postings.js";
import { HotStore, type SharedHotArrays } from "./hot.js";
import { NameForms, NameStore } from "./names.js";
import type { EntityClass } from "../types.js";
import { InputError, UsageError } from "../util/errors.js";
import { KB_FORMAT, type KeyKind, SCHEMA_VERSION, type UnpackedForm, unpackForms } from "./schema.js";
import { GenerationCache } from "../util/generation-cache.js";

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
  /** Deletions per long table token in the fuzzy index: 2, or 1 for very large vocabularies. */
  fuzzyDeletions: number;
  contextDocs: number;
  maxPrior: number;
  byClass: Record<string, number>;
  /**
   * Attribute columns whose values sort the rows into kinds (see kind-columns.ts); empty for KBs
   * built before they were recorded.
   */
  kindColumns: string[];
  /** The kind columns whose values are kinds of places ("District", "Province"). */
  placeCategoryColumns: string[];
  /**
   * The values of the kind columns that are not categories of places (its rows' countries,
   * counties), each (folded to lower case) with its context terms: see the contextConflict feature.
   */
  kindValues: Array<{ value: string; terms: string[] }>;
  created: string;
}

/** One of an entity's names with its normalized forms (see schema.ts). */
export type AliasRow = UnpackedForm;

export interface EntityRow {
  eid: number;
  id: string;
  name: string;
  type: string;
  cls: EntityClass;
  prior: number;
  /** TF-IDF norm of the entity's context terms, computed at index time (terms: see hot.ts). */
  contextNorm: number;
  aliases: AliasRow[];
  /** The table row's other columns (see the knowledge table format), as given. */
  attributes: Record<string, string>;
}

/** One blocking-key hit: the key, its class and kind, and the entity. */
export interface KeyHit {
  key: string;
  cls: EntityClass;
  kind: KeyKind;
  eid: number;
}

/**
 * Entities kept decoded in memory, so that the rows of one mention's candidates are read once
 * however often scoring, the output and document evidence ask. Kept small on purpose: at a
 * million entities a cache of 4,000 rows made linking no faster (popular entities are not
 * candidates often enough) and held about 75 MB more resident memory, from the decoded rows it
 * kept alive and turned over (benchmarks/README.md).
 */
const ENTITY_CACHE_SIZE = 64;
/** Fewest letters of a word's ending a contraction keeps ("mouth" of "H'mouth"). */
const MIN_CONTRACTED_ENDING = 3;

/**
 * True when `short` is `long`'s first letter or two and its ending, longer than the short word
 * ("hmouth" for "harrowmouth", "whampton" for "wolverhampton"): how clerks contract a long name
 * with an apostrophe ("H'mouth", "W'hampton").
 */
function contractedEnding(short: string, long: string): boolean {
  if (long.length <= short.length) return false;
  for (const head of [1, 2]) {
    const ending = short.length - head;
    if (
      ending >= MIN_CONTRACTED_ENDING &&
      long.startsWith(short.slice(0, head)) &&
      long.endsWith(short.slice(head))
    )
      return true;
  }
  return false;
}

/**
 * Longest word written short read as a contraction too ("Md.", "Rly.", "Bldg."): a longer one is
 * read as the first letters of a word only, which a prefix of the sorted vocabulary answers.
 */
const MAX_CONTRACTION_LETTERS = 4;
/** Words written short whose readings are kept, and readings kept for each. */
const ABBREVIATION_CACHE_SIZE = 4_096;
const MAX_CACHED_READINGS = 50;
/** Context-term and alias-token facts kept in memory. */
const IDF_CACHE_SIZE = 50_000;

/** What the KB knows of one context term: its document frequency and its id (-1: unknown term). */
export interface TermInfo {
  df: number;
  id: number;
}
const UNKNOWN_TERM: TermInfo = { df: 0, id: -1 };

export class Kb {
  readonly db: Database.Database;
  readonly info: KbInfo;
  private readonly stmts: {
    fts: Database.Statement<[string, number], number>;
    idf: Database.Statement<[string], TermInfo>;
    byId: Database.Statement<[string], { eid: number }>;
    stored: Database.Statement<[number], unknown>;
    details: Database.Statement<[number], unknown>;
  };
  private readonly entityCache = new GenerationCache<number, EntityRow>(ENTITY_CACHE_SIZE);
  private readonly idfCache = new GenerationCache<string, TermInfo>(IDF_CACHE_SIZE);
  /** Alias token -> number of entities with it in a name (the whole vocabulary, loaded on open). */
  private readonly vocabDf = new Map<string, number>();
  /** The vocabulary in code-unit order, made on first use (see wordsAbbreviatedBy). */
  private sortedVocabulary: string[] | undefined;
  /** Readings of words written short, as found (see wordsAbbreviatedBy). */
  private readonly abbreviationReadings = new GenerationCache<string, string[]>(ABBREVIATION_CACHE_SIZE);
  /** Alias tokens by vocabulary id (the values of the hot store's deletion-variant index). */
  private readonly vocabTokens: string[] = [];
  /** Per-entity facts for whole candidate pools, in memory (see hot.ts). */
  readonly hot: HotStore;
  /** Every entity's normalized name forms, in memory (see names.ts). */
  readonly names: NameStore;

  /**
   * Opens a KB file (openKb). With `shared`, the in-memory store's arrays are shared memory
   * that other threads can use too (see SharedHotArrays in hot.ts).
   */
  constructor(file: string, shared?: SharedHotArrays) {
    const { db, info } = openKbFile(file);
    this.db = db;
    this.info = info;
    try {
      for (const r of db.prepare("SELECT token, df, id FROM vocab").raw(true).iterate() as Iterable<
        [string, number, number]
      >) {
        this.vocabDf.set(r[0], r[1]);
        this.vocabTokens[r[2]] = r[0];
      }
      this.stmts = {
        // Unranked: rows come in position order, which is falling popularity (see schema.ts).
        fts: db
          .prepare<[string, number], number>("SELECT rowid FROM alias_fts WHERE alias_fts MATCH ? LIMIT ?")
          .pluck(true),
        idf: db.prepare("SELECT df, id FROM idf WHERE term = ?"),
        details: db.prepare(
          "SELECT d.description, e.attributes FROM entity_details d JOIN entities e ON e.eid = d.eid WHERE d.eid = ?",
        ),
        byId: db.prepare("SELECT eid FROM entities WHERE id = ?"),
        stored: db.prepare("SELECT type, forms, attributes FROM entities WHERE eid = ?"),
      };
      this.hot = new HotStore(db, shared);
      if (this.hot.entities !== this.info.entities)
        throw new Error(`hot store holds ${this.hot.entities} entities, meta says ${this.info.entities}`);
      this.names = new NameStore(this.hot.names, this.vocabTokens);
    } catch (e) {
      db.close();
      throw new InputError(
        { file },
        `KB file is damaged or was built by an incompatible hawser (${(e as Error).message}): rebuild it with \`hawser index\``,
      );
    }
  }

  close(): void {
    if (this.db.open) this.db.close();
  }

  /** The prepared statements, refused once the KB is closed (a UsageError, not SQLite's TypeError). */
  private get live(): Kb["stmts"] {
    this.requireOpen();
    return this.stmts;
  }

  private requireOpen(): void {
    if (!this.db.open) throw new UsageError(`the KB ${this.info.file} is closed: open it again`);
  }

  /** Every blocking-key row of `key` (any class and kind), from the in-memory key index. */
  forEachKeyHit(key: string, each: (cls: EntityClass, kind: KeyKind, eid: number) => void): void {
    this.hot.forEachKeyHit(key, each);
  }

  /** Every blocking-key row whose key is one of `keys` (any class and kind). */
  lookupKeys(keys: readonly string[]): KeyHit[] {
    const out: KeyHit[] = [];
    for (const key of keys)
      this.hot.forEachKeyHit(key, (cls, kind, eid) => out.push({ key, cls, kind, eid }));
    return out;
  }

  /**
   * Token search over name keys, one word at a time in the order given (callers pass the rarest
   * first), each giving its most popular carriers, until `limit` distinct entities are found.
   * Answered from the in-memory word index (postings.ts), which holds the FTS5 table's lists.
   */
  searchAliases(tokens: readonly string[], limit: number): number[] {
    return searchWords(tokens, limit, (w, n, take) => this.hot.postings.forEachCarrier(w, n, take));
  }

  /**
   * The same search as searchAliases, run as FTS5 queries on the KB's alias_fts table: the
   * reference the in-memory index is checked against. Each word is quoted as an FTS5 string
   * with embedded quotes doubled, so mention text never reaches the FTS5 query parser as syntax.
   */
  searchAliasesFts(tokens: readonly string[], limit: number): number[] {
    return searchWords(tokens, limit, (w, n, take) => {
      for (const pos of this.live.fts.all(ftsString(w), n)) take(this.hot.eidAt(pos));
    });
  }

  /** Name tokens that at least `count` entities carry in a name or alias, most carried first. */
  tokensCarriedByAtLeast(count: number): string[] {
    const out: Array<[string, number]> = [];
    for (const [token, df] of this.vocabDf) if (df >= count) out.push([token, df]);
    return out.sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1)).map(([t]) => t);
  }

  /**
   * The table's name words that `short` may stand for, written short (see abbreviates in
   * src/normalize/name.ts): at most `limit`, the most frequent first. Read from the vocabulary in
   * memory, sorted on first use.
   */
  wordsAbbreviatedBy(short: string, limit: number): string[] {
    const cached = this.abbreviationReadings.get(short);
    if (cached !== undefined) return cached.slice(0, limit);
    this.sortedVocabulary ??= [...this.vocabDf.keys()].sort();
    const sorted = this.sortedVocabulary;
    // A contraction keeps only the first letter as a prefix, so short words scan every word of
    // that letter; longer ones are read as the first letters of a word, or as its first letter or
    // two and its ending ("hmouth", written "H'mouth", for "harrowmouth"; see contractedEnding).
    const prefix = short[0]!;
    const whole = short.length <= MAX_CONTRACTION_LETTERS;
    let lo = 0;
    let hi = sorted.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (sorted[mid]! < prefix) lo = mid + 1;
      else hi = mid;
    }
    const found: string[] = [];
    for (let i = lo; i < sorted.length && sorted[i]!.startsWith(prefix); i++) {
      const word = sorted[i]!;
      if (whole ? abbreviates(short, word) : word.startsWith(short) || contractedEnding(short, word))
        found.push(word);
    }
    found.sort((a, b) => this.tokenDf(b) - this.tokenDf(a) || (a < b ? -1 : 1));
    const readings = found.slice(0, MAX_CACHED_READINGS);
    this.abbreviationReadings.set(short, readings);
    return readings.slice(0, limit);
  }

  /** How many entities have this token in a name or alias (0 when unknown). */
  tokenDf(token: string): number {
    return this.vocabDf.get(token) ?? 0;
  }

  /** Distinct table tokens that share one of the deletion variants, from the in-memory index. */
  tokensForVariants(variants: readonly string[]): string[] {
    const ids = new Set<number>();
    const add = (id: number) => ids.add(id);
    for (const v of variants) this.hot.variants.forEach(v, add);
    const out: string[] = [];
    for (const id of ids) {
      const token = this.vocabTokens[id];
      if (token === undefined) throw new Error(`KB ${this.info.file}: no vocabulary token with id ${id}`);
      out.push(token);
    }
    return out;
  }

  /** Number of entities whose context mentions `term` (0 when unknown). */
  termDf(term: string): number {
    return this.termInfo(term).df;
  }

  /** Document frequency and hot-store id of a context term. */
  termInfo(term: string): TermInfo {
    let info = this.idfCache.get(term);
    if (info === undefined) {
      info = this.live.idf.get(term) ?? UNKNOWN_TERM;
      this.idfCache.set(term, info);
    }
    return info;
  }

  /** One entity by internal id (cached). */
  entity(eid: number): EntityRow {
    return this.entities([eid])[0]!;
  }

  /**
   * Entities by internal id, in the order asked. What scoring reads (class, prior, context norm,
   * the names' normalized forms) and the table id and name come from memory; the type,
   * attributes and the names' original texts are read from the entity's row when first asked
   * for, which a mention's output does for its best candidate only.
   */
  entities(eids: readonly number[]): EntityRow[] {
    return eids.map((eid) => {
      let row = this.entityCache.get(eid);
      if (row === undefined) {
        if (!(Number.isInteger(eid) && eid >= 1 && eid <= this.hot.entities))
          throw new UsageError(
            `KB ${this.info.file}: no entity with internal id ${eid} (internal ids run from 1 to ${this.hot.entities}; eidOf reads one from a table id)`,
          );
        row = new KbEntity(this, eid, this.hot.classOf(eid), this.hot.prior[eid]!, this.hot.norm[eid]!);
        this.entityCache.set(eid, row);
      }
      return row;
    });
  }

  /** The stored part of an entity's row (see KbEntity). */
  storedRow(eid: number): StoredRow {
    const r = this.live.stored.get(eid) as { type: string; forms: string; attributes: string } | undefined;
    if (r === undefined) throw new Error(`KB ${this.info.file}: no entity with internal id ${eid}`);
    return {
      type: r.type,
      attributes: JSON.parse(r.attributes) as Record<string, string>,
      texts: unpackForms(r.forms).map((f) => f.text),
    };
  }

  /** The description and attributes of an entity (the description is not needed for linking, so stored apart). */
  details(eid: number): { description: string; attributes: Record<string, string> } {
    const r = this.live.details.get(eid) as { description: string; attributes: string } | undefined;
    if (r === undefined) throw new Error(`KB ${this.info.file}: no entity with internal id ${eid}`);
    return { description: r.description, attributes: JSON.parse(r.attributes) as Record<string, string> };
  }

  /** Internal id of a table id, or undefined. */
  eidOf(id: string): number | undefined {
    return this.live.byId.get(id)?.eid;
  }

  /** Every entity row of a class, decoded, streamed in table order without touching the cache. */
  *entityRowsOfClass(cls: EntityClass): Generator<EntityRow> {
    this.requireOpen();
    const stmt = this.db.prepare(
      "SELECT eid, id, name, type, class, prior, forms, attributes FROM entities WHERE class = ? ORDER BY eid",
    );
    for (const r of stmt.iterate(cls)) yield decodeEntity(r as Record<string, unknown>, this.hot);
  }
}

/** What an entity's row holds beyond the in-memory facts (table id and name: display.ts): read on first use. */
interface StoredRow {
  type: string;
  attributes: Record<string, string>;
  /** The original text of each name with a key, in name order (see packForms). */
  texts: string[];
}

/** An entity row whose scoring facts come from memory and the rest from SQLite when asked for. */
class KbEntity implements EntityRow {
  readonly aliases: AliasRow[];
  private stored: StoredRow | null = null;

  constructor(
    private readonly kb: Kb,
    readonly eid: number,
    readonly cls: EntityClass,
    readonly prior: number,
    readonly contextNorm: number,
  ) {
    this.aliases = kb.names.formsWith(
      eid,
      (aid, key, full, canonical, tokens) => new KbAlias(this, aid, key, full, canonical, tokens),
    );
  }

  row(): StoredRow {
    this.stored ??= this.kb.storedRow(this.eid);
    return this.stored;
  }
  get id(): string {
    return this.kb.hot.display.id(this.eid);
  }
  get name(): string {
    return this.kb.hot.display.name(this.eid);
  }
  get type(): string {
    return this.row().type;
  }
  get attributes(): Record<string, string> {
    // Most tables give most rows no attributes: then the row need not be read for them.
    return this.kb.hot.display.hasAttributes(this.eid) ? this.row().attributes : {};
  }
}

/** One name of a KbEntity: forms from memory, the original text from the row when asked for. */
class KbAlias extends NameForms implements AliasRow {
  constructor(
    private readonly entity: KbEntity,
    aid: number,
    key: string,
    full: string,
    canonical: boolean,
    tokens: string[],
  ) {
    super(aid, key, full, canonical, tokens);
  }
  get text(): string {
    // The canonical name's text is the entity's name, held in memory (display.ts).
    return this.canonical ? this.entity.name : this.entity.row().texts[this.aid]!;
  }
}

function decodeEntity(r: Record<string, unknown>, hot: HotStore): EntityRow {
  const eid = r.eid as number;
  return {
    eid,
    id: r.id as string,
    name: r.name as string,
    type: r.type as string,
    cls: r.class as EntityClass,
    prior: r.prior as number,
    contextNorm: hot.norm[eid]!,
    aliases: unpackForms(r.forms as string),
    attributes: JSON.parse(r.attributes as string) as Record<string, string>,
  };
}

/**
 * The search loop of searchAliases and searchAliasesFts: the words of each token in turn, each
 * asked (through `carriers`) for the entities of its first `n` full-text rows, until `limit`
 * distinct entities are found, in the order first met.
 */
function searchWords(
  tokens: readonly string[],
  limit: number,
  carriers: (word: string, n: number, take: (eid: number) => void) => void,
): number[] {
  const seen = new Set<number>();
  const out: number[] = [];
  const take = (eid: number) => {
    if (seen.has(eid)) return;
    seen.add(eid);
    out.push(eid);
  };
  for (const t of tokens) {
    for (const w of ftsWords(t)) {
      if (out.length >= limit) return out;
      carriers(w, limit - out.length, take);
    }
  }
  return out;
}

/** An FTS5 string literal: wrapped in double quotes, inner double quotes doubled. */
export function ftsString(token: string): string {
  return `"${token.replace(/"/g, '""')}"`;
}

/**
 * The KB file opened read-only with its metadata checked (a hawser KB of this schema and
 * normalizer version), else an InputError naming the file; the handle is closed on failure.
 */
function openKbFile(file: string): { db: Database.Database; info: KbInfo } {
  if (typeof file !== "string" || file === "")
    throw new UsageError(
      `openKb: the KB file must be a path (a non-empty string), not ${JSON.stringify(file)}`,
    );
  if (!existsSync(file))
    throw new InputError({ file }, "no such KB file (build one with `hawser index TABLE --out KB`)");
  if (statSync(file).isDirectory())
    throw new InputError(
      { file },
      "is a folder, not a KB file (build one with `hawser index TABLE --out KB`)",
    );
  let db: Database.Database | undefined;
  try {
    db = new Database(file, { readonly: true, fileMustExist: true });
    db.pragma("query_only = ON");
    // Keep the shared (read) lock from the first read until the KB is closed. Otherwise SQLite
    // takes and drops the file lock and re-reads the file header around every statement, which
    // cost about 13 us of the 15 us of a cached single-row read. Other readers are not blocked
    // (they take shared locks too); a rebuild writes a new file and renames it into place.
    db.pragma("locking_mode = EXCLUSIVE");
  } catch (e) {
    db?.close();
    throw new InputError({ file }, `cannot open as a KB: ${(e as Error).message}`);
  }
  try {
    return { db, info: readInfo(db, file) };
  } catch (e) {
    // Not a KB, or another version's: the handle is closed now, not whenever the GC finds it.
    db.close();
    throw e;
  }
}

/**
 * A KB file's metadata (counts, versions, fingerprint), checked as openKb checks it, without
 * loading the KB: for a caller that hands the KB to other threads (src/link/parallel.ts).
 */
export function readKbInfo(file: string): KbInfo {
  const { db, info } = openKbFile(file);
  db.close();
  return info;
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
  if (version < SCHEMA_VERSION) {
    throw new InputError(
      { file },
      `KB schema version ${version} is older than this hawser reads (${SCHEMA_VERSION}): rebuild it with \`hawser index\``,
    );
  }
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
    fuzzyDeletions: num("fuzzy_deletions"),
    contextDocs: num("context_docs"),
    maxPrior: num("max_prior"),
    byClass: JSON.parse(m.get("by_class") ?? "{}") as Record<string, number>,
    kindColumns: JSON.parse(m.get("kind_columns") ?? "[]") as string[],
    placeCategoryColumns: JSON.parse(m.get("place_category_columns") ?? "[]") as string[],
    kindValues: JSON.parse(m.get("kind_values") ?? "[]") as Array<{ value: string; terms: string[] }>,
    created: m.get("created") ?? "",
  };
}

export function openKb(file: string): Kb {
  return new Kb(file);
}
