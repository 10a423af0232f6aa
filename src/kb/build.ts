/**
 * `hawser index`: stream a knowledge table into a new KB file, atomically. The build writes a
 * temporary file next to the target and renames it into place only when everything succeeded;
 * any failure removes the temporary file, so no partial KB is ever left behind.
 */
import { createHash } from "node:crypto";
import { existsSync, renameSync, rmSync } from "node:fs";
import { basename } from "node:path";
import Database from "better-sqlite3";
import { LabelMap } from "../labels/label-map.js";
import { NORMALIZER_VERSION } from "../normalize/name.js";
import { contextTerms } from "../score/terms.js";
import { TABLE_LOOKALIKE_COLUMNS } from "../read/field-hints.js";
import { STDIN } from "../read/lines.js";
import {
  checkOutputFile,
  removeStaleTemporaries,
  temporaryPath,
  trackUnfinished,
} from "../util/atomic-file.js";
import { eventLoopTurn } from "../util/interrupt.js";
import {
  checkWhole,
  InputError,
  OutputError,
  requireCallback,
  requirePaths,
  UsageError,
} from "../util/errors.js";
import { BatchInsert } from "./batch-insert.js";
import { FUZZY_MIN_TOKEN_LENGTH, MAX_TABLE_VARIANTS, tableDeletions, tableVariants } from "./deletions.js";
import { readTable, tableFormatOf } from "./read-table.js";
import { RowWriter } from "./row-writer.js";
import { StringIndexBuilder } from "./string-index.js";
import { INDEX_SQL, KB_FORMAT, SCHEMA_SQL, SCHEMA_VERSION } from "./schema.js";

export interface BuildKbOptions {
  /** The knowledge table: CSV (header row), TSV or JSONL; `-` reads standard input (JSONL unless `from`). */
  table: string;
  /** Where to write the KB file. An existing file is replaced only when the build succeeds. */
  out: string;
  /** Table format; default: from the file extension. */
  from?: "csv" | "tsv" | "jsonl" | undefined;
  /** Label map used to reach an entity class from each table type; default: the built-in map. */
  labels?: LabelMap | undefined;
  /** Called every `progressEvery` rows with the number of rows read so far. */
  onProgress?: ((rows: number) => void) | undefined;
  /** Rows between progress calls; default 10,000. */
  progressEvery?: number | undefined;
  /**
   * Most deletion variants of table tokens indexed for fuzzy lookup (see src/kb/deletions.ts):
   * two deletions per long token while they fit, else one. Default 8,000,000.
   */
  maxFuzzyVariants?: number | undefined;
}

export interface BuildSummary {
  entities: number;
  aliases: number;
  keys: number;
  vocabulary: number;
  contextTerms: number;
  byClass: Record<string, number>;
  /** Table types the label map does not know (they were indexed as class "other"), with counts. */
  unknownTypes: Record<string, number>;
  /**
   * Attribute columns that look like an optional column the table does not fill ("population"
   * for `prior`, "synonyms" for `aliases`), one sentence each: read as attributes only.
   */
  columnWarnings: string[];
  fingerprint: string;
  seconds: number;
  /** Seconds per phase of the build (reading and inserting rows, full-text index, ...). */
  phases: Record<string, number>;
}

const DEFAULT_PROGRESS_EVERY = 10_000;

/** SQLite's codes (and prefixes of extended codes) for a file that cannot be written. */
const OUTPUT_FAILURES = ["SQLITE_FULL", "SQLITE_IOERR", "SQLITE_CANTOPEN", "SQLITE_READONLY"];

/**
 * Page cache during the bulk load, KiB. Every table is appended to at its end, so only the last
 * pages of each are hot; a larger cache only holds back writes, grows the process and crowds
 * the CPU caches (inserting a million entity rows alone took 1.5 s with 8 MiB, 1.75 s with
 * 64 MiB and 2.45 s with 256 MiB).
 */
const LOAD_CACHE_KIB = 8_192;
/**
 * Page cache while the indexes are created, KiB. SQLite's sorter sorts runs of at most the cache
 * size in memory, spills them to temporary files and merges them: runs that fit the CPU caches
 * sort faster, and the whole sort stays out of the process's memory (with the sorter in memory,
 * as `temp_store = MEMORY` makes it, the index on blocking keys took 2.5 times as long and a few
 * hundred MB at a million entities).
 */
const INDEX_CACHE_KIB = 4_096;

/**
 * FTS5 settings for the bulk load: a larger in-memory hash before each flush to a new segment
 * (FTS5's 'hashsize', 1 MiB by default) and no incremental merging ('automerge' 0), since the
 * 'optimize' at the end merges every segment once anyway. Inserting the 2.9 million full-text
 * rows of the 1,000,000-entity benchmark table took 2.1 s instead of 2.7 s. The defaults are put
 * back after the load (1 MiB and 4, from memory of the FTS5 documentation), so the file carries
 * no unusual settings.
 */
const FTS_LOAD_SETTINGS =
  "INSERT INTO alias_fts(alias_fts, rank) VALUES ('hashsize', 67108864), ('automerge', 0)";
const FTS_DEFAULT_SETTINGS =
  "INSERT INTO alias_fts(alias_fts, rank) VALUES ('hashsize', 1048576), ('automerge', 4)";

export async function buildKb(options: BuildKbOptions): Promise<BuildSummary> {
  const started = process.hrtime.bigint();
  requirePaths("buildKb", options, ["table", "out"]);
  if (options.labels !== undefined && !(options.labels instanceof LabelMap))
    throw new UsageError("buildKb: labels must be a LabelMap (readLabelMapFile reads one from a file)");
  requireCallback("buildKb", "onProgress", options.onProgress);
  if (options.progressEvery !== undefined) checkWhole("buildKb: progressEvery", options.progressEvery, 1);
  if (options.maxFuzzyVariants !== undefined)
    checkWhole("buildKb: maxFuzzyVariants", options.maxFuzzyVariants, 0);
  tableFormatOf(options.table, options.from); // usage errors before any file is touched
  checkOutputFile(options.out, "--out", [["the table", options.table]]);
  if (options.table !== STDIN && !existsSync(options.table))
    throw new InputError({ file: options.table }, "no such file");
  const labels = options.labels ?? new LabelMap();
  removeStaleTemporaries(options.out);
  const tmp = temporaryPath(options.out);
  let db: Database.Database;
  try {
    db = new Database(tmp);
  } catch (e) {
    throw new OutputError(options.out, e as Error);
  }
  const finished = trackUnfinished(tmp, options.out);
  let ok = false;
  try {
    // The temporary file is private until renamed, so durability pragmas buy nothing during the build.
    db.pragma("page_size = 16384"); // larger pages: fewer B-tree splits during the bulk load
    db.pragma("journal_mode = OFF");
    db.pragma("synchronous = OFF");
    db.pragma("locking_mode = EXCLUSIVE");
    db.pragma(`cache_size = -${LOAD_CACHE_KIB}`);
    db.exec(SCHEMA_SQL);
    db.exec(FTS_LOAD_SETTINGS);
    const summary = await load(db, options, labels);
    const sourceSha = summary.sourceSha256;
    const fingerprint = createHash("sha256")
      .update(`${KB_FORMAT}\n${SCHEMA_VERSION}\n${NORMALIZER_VERSION}\n${sourceSha}\n${summary.entities}`)
      .digest("hex")
      .slice(0, 32);
    const meta = db.prepare("INSERT INTO meta (key, value) VALUES (?, ?)");
    const facts: Record<string, string | number> = {
      format: KB_FORMAT,
      schema_version: SCHEMA_VERSION,
      normalizer_version: NORMALIZER_VERSION,
      source_file: options.table === STDIN ? "stdin" : basename(options.table),
      source_sha256: sourceSha,
      fingerprint,
      entities: summary.entities,
      aliases: summary.aliases,
      keys: summary.keys,
      vocabulary: summary.vocabulary,
      context_terms: summary.contextTerms,
      fuzzy_deletions: summary.fuzzyDeletions,
      context_docs: summary.entities,
      max_prior: summary.maxPrior,
      by_class: JSON.stringify(summary.byClass),
      kind_columns: JSON.stringify(summary.kinds.kindColumns),
      place_category_columns: JSON.stringify(summary.kinds.placeCategoryColumns),
      kind_values: JSON.stringify(
        summary.kinds.kindValues
          .map((value) => ({ value, terms: contextTerms(value) }))
          .filter((v) => v.terms.length > 0),
      ),
      created: new Date().toISOString(),
    };
    db.transaction(() => {
      for (const [k, v] of Object.entries(facts)) meta.run(k, String(v));
    })();
    const before = process.hrtime.bigint();
    db.pragma(`cache_size = -${INDEX_CACHE_KIB}`);
    db.exec(INDEX_SQL);
    db.exec("INSERT INTO alias_fts(alias_fts) VALUES ('optimize')");
    db.exec(FTS_DEFAULT_SETTINGS);
    summary.phases["indexes and statistics"] = Number(process.hrtime.bigint() - before) / 1e9;
    db.close();
    // The last phases are synchronous: an interruption during them is handled here, before the
    // KB lands, so that an interrupted build leaves no KB (and an existing one untouched).
    await eventLoopTurn();
    renameSync(tmp, options.out);
    ok = true;
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    return {
      entities: summary.entities,
      aliases: summary.aliases,
      keys: summary.keys,
      vocabulary: summary.vocabulary,
      contextTerms: summary.contextTerms,
      byClass: summary.byClass,
      unknownTypes: summary.unknownTypes,
      columnWarnings: summary.columnWarnings,
      fingerprint,
      seconds,
      phases: summary.phases,
    };
  } catch (e) {
    // A full disk or a failing write is no fault of the table: say which file could not be written.
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && OUTPUT_FAILURES.some((c) => code.startsWith(c)))
      throw new OutputError(options.out, e as Error);
    throw e;
  } finally {
    if (!ok) {
      if (db.open) db.close();
      rmSync(tmp, { force: true });
    }
    finished();
  }
}

interface LoadSummary {
  entities: number;
  aliases: number;
  keys: number;
  vocabulary: number;
  contextTerms: number;
  /** Deletions per long table token in the fuzzy index (see src/kb/deletions.ts). */
  fuzzyDeletions: 1 | 2;
  maxPrior: number;
  byClass: Record<string, number>;
  unknownTypes: Record<string, number>;
  columnWarnings: string[];
  /** Attribute columns whose values sort the rows into kinds, and the categories of places among them (see kind-columns.ts). */
  kinds: { kindColumns: string[]; placeCategoryColumns: string[]; kindValues: string[] };
  /** Seconds spent in each phase of the build, in order. */
  phases: Record<string, number>;
  /** SHA-256 of the table file, hex. */
  sourceSha256: string;
}

/** Rows written per transaction: enough that commits cost nothing next to the rows themselves. */
const ROWS_PER_TRANSACTION = 20_000;

/** See BuildSummary.columnWarnings. */
function columnWarnings(writer: RowWriter): string[] {
  const out: string[] = [];
  const columns = writer.kinds.columnNames();
  for (const [field, names] of Object.entries(TABLE_LOOKALIKE_COLUMNS)) {
    if (writer.given[field as keyof RowWriter["given"]]) continue;
    const like = columns.find((c) => names.includes(c.toLowerCase()));
    if (like !== undefined)
      out.push(
        `column "${like}" is read as an attribute (context words), not as "${field}": rename it "${field}" to have it read so`,
      );
  }
  return out;
}

async function load(db: Database.Database, options: BuildKbOptions, labels: LabelMap): Promise<LoadSummary> {
  const phases: Record<string, number> = {};
  let last = process.hrtime.bigint();
  const mark = (phase: string) => {
    const now = process.hrtime.bigint();
    phases[phase] = Number(now - last) / 1e9;
    last = now;
  };
  const writer = new RowWriter(db, labels);
  const every = options.progressEvery ?? DEFAULT_PROGRESS_EVERY;
  let rows = 0;
  // The source checksum is taken from the same bytes the rows are parsed from: one read of the file.
  const sourceHash = createHash("sha256");
  // Each row is written as it arrives (no batch of parsed rows is held), in transactions of
  // ROWS_PER_TRANSACTION rows; a failure leaves one open, which closing the database rolls back.
  db.exec("BEGIN");
  for await (const { record } of readTable(options.table, options.from, (chunk) =>
    sourceHash.update(chunk),
  )) {
    writer.write(record);
    rows++;
    if (rows % ROWS_PER_TRANSACTION === 0) {
      writer.flush();
      db.exec("COMMIT; BEGIN");
    }
    if (options.onProgress && rows % every === 0) options.onProgress(rows);
  }
  writer.flush();
  db.exec("COMMIT");
  if (rows === 0) throw new InputError({ file: options.table }, "the table has no rows");
  const sourceSha256 = sourceHash.digest("hex");
  options.onProgress?.(rows);
  const { vocab, hot, eid } = writer;

  mark("read and insert rows");
  // Full-text rows in order of falling popularity (see schema.ts and fts-load.ts).
  const { posEid, postings } = db.transaction(() => writer.fts.write(db))();
  mark("full-text index");
  // The vocabulary with ids in order of first appearance; its deletion variants go into the
  // hot store's in-memory index (variant -> token id), which the fuzzy path reads.
  const variants = new StringIndexBuilder();
  const deletions = tableDeletions(vocab.keys(), options.maxFuzzyVariants ?? MAX_TABLE_VARIANTS);
  const insVocab = new BatchInsert(db, "INSERT INTO vocab (token, df, id)", 3);
  const insIdf = new BatchInsert(db, "INSERT INTO idf (term, df, id)", 3);
  db.transaction(() => {
    for (const [token, { df, id }] of vocab) {
      insVocab.add(token, df, id);
      if (token.length >= FUZZY_MIN_TOKEN_LENGTH)
        for (const v of tableVariants(token, deletions)) variants.add(v, id);
    }
    for (const [term, id] of hot.termIdOf) insIdf.add(term, hot.dfOf(term), id);
    insVocab.flush();
    insIdf.flush();
  })();
  mark("vocabulary and fuzzy index");
  // Context norms need the final IDF, so the hot store computes them once every row is in.
  hot.write(db, posEid, variants.build(), postings, vocab.size);
  mark("hot store and context norms");
  return {
    entities: eid,
    aliases: writer.aliases,
    keys: writer.keys,
    vocabulary: vocab.size,
    contextTerms: hot.termIdOf.size,
    fuzzyDeletions: deletions,
    maxPrior: writer.maxPrior,
    byClass: writer.byClass,
    unknownTypes: writer.unknownTypes,
    kinds: writer.kinds.result(),
    columnWarnings: columnWarnings(writer),
    phases,
    sourceSha256,
  };
}
