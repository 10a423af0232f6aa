/**
 * The hot store: the facts about an entity that candidate generation needs for many entities
 * per mention (class, prior, context norm, context term ids, a signature of its name tokens),
 * and the map from full-text positions to entities, as typed arrays. The build writes them into
 * the KB as BLOBs (table `hot`); opening the KB loads them whole (the position map only when the
 * FTS5 table itself is queried). Choosing among hundreds of same-name candidates, and checking
 * the class of token-search hits, then reads no SQLite rows.
 *
 * The same table holds the hashed indexes of blocking keys and deletion variants
 * (string-index.ts), the word index of the full-text rows (postings.ts), every entity's name
 * forms (names.ts) and its table id and name (display.ts).
 *
 * Memory at the 1,000,000-entity benchmark table, about 210 MB in all: per-entity arrays (class,
 * prior, norm, term bounds, signature) 29 MB; context term ids 20 MB (2 bytes per occurrence, 4
 * past 65,536 distinct terms); blocking keys 39 MB; deletion variants 25 MB; the word index
 * 24 MB; name forms 39 MB (names.ts); table ids and names 34 MB (display.ts).
 */
import type Database from "better-sqlite3";
import { contextCosine, type IdVector, type TermIdArray, termIdListNorm } from "../score/context.js";
import { idf } from "../score/tfidf.js";
import { ENTITY_CLASSES, type EntityClass } from "../types.js";
import type { KeyKind } from "./schema.js";
import { Display, DisplayBuilder } from "./display.js";
import { type NameArrays, NameStoreBuilder, type StoredName } from "./names.js";
import { type PostingArrays, Postings } from "./postings.js";
import { StringIndex, type StringIndexArrays, StringIndexBuilder } from "./string-index.js";
import { narrowIds, U32List } from "./u32-list.js";

/**
 * Largest BLOB written in one row (SQLite's limit is 1 GB). Small parts keep loading lean: see
 * HotTable.read.
 */
const PART_BYTES = 4 * 1024 * 1024;
/** Bits of a name signature: two 32-bit words per entity. */
const SIGNATURE_BITS = 64;

/**
 * The two signature bits of a name token (FNV-1a, 32 bits; low and high bits of the hash pick
 * one bit each). Two bits per token keep false "has this token" answers near 2% for a name of
 * five distinct tokens.
 */
export function tokenBits(token: string): [number, number] {
  let h = 0x811c9dc5;
  for (let i = 0; i < token.length; i++) {
    h ^= token.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  h >>>= 0;
  return [h % SIGNATURE_BITS, (h >>> 16) % SIGNATURE_BITS];
}

const CLASS_CODE = new Map<EntityClass, number>(ENTITY_CLASSES.map((c, i) => [c, i]));

/** Key kinds in the order of their codes in a packed key hit. */
export const KEY_KINDS: readonly KeyKind[] = ["exact", "ocr", "acronym", "initials"];
const KIND_CODE = new Map<KeyKind, number>(KEY_KINDS.map((k, i) => [k, i]));
/**
 * A blocking-key hit packed in 32 bits: the entity id above KEY_HIT_SHIFT bits, then the class
 * (3 bits, room for eight) and the kind (2 bits). Entity ids up to 2^27 (134 million) fit.
 */
const KEY_HIT_SHIFT = 5;
export const MAX_KEYED_ENTITIES = 2 ** (32 - KEY_HIT_SHIFT) - 1;

/** One entity as the hot store takes it (see HotStoreBuilder.add). */
export interface HotEntity {
  cls: EntityClass;
  prior: number;
  /** Context terms, any order, repeats count. */
  terms: readonly string[];
  /** Distinct tokens of the entity's names (for the signature). */
  nameTokens: Iterable<string>;
  names: readonly StoredName[];
  /** Table id and name, as the output shows them. */
  id: string;
  name: string;
  /** Whether the row has attributes (other table columns), which a linked mention's output carries. */
  hasAttributes: boolean;
}

/** Collects the hot store row by row during the build (entity ids 1, 2, 3, ... in order). */
export class HotStoreBuilder {
  private readonly cls = new U32List();
  private readonly prior: number[] = [];
  private readonly termStart = new U32List();
  private readonly termIds = new U32List();
  private readonly sig = new U32List();
  /** Context term -> id, in order of first appearance. */
  readonly termIdOf = new Map<string, number>();
  /** Entities whose context carries each term id. */
  private readonly termDf = new U32List();
  /** Blocking key -> packed hit (see KEY_HIT_SHIFT). */
  private readonly keys = new StringIndexBuilder();
  /** Every entity's name forms (names.ts). */
  private readonly names = new NameStoreBuilder();
  /** Every entity's table id and name (display.ts). */
  private readonly display = new DisplayBuilder();
  /** The current entity's term ids, reused from entity to entity. */
  private scratch = new Uint32Array(64);

  constructor() {
    // Entity ids start at 1: slot 0 is a placeholder.
    this.cls.push(0);
    this.prior.push(0);
    this.termStart.push(0);
    this.termStart.push(0);
    this.sig.push(0);
    this.sig.push(0);
  }

  /**
   * The next entity: its class, prior, context terms (any order, repeats count), name tokens,
   * names (see names.ts), and the table id and name its output shows (display.ts).
   */
  add(e: HotEntity): void {
    const { cls, prior, terms, nameTokens } = e;
    this.names.add(e.names);
    this.display.add(e.id, e.name, e.hasAttributes);
    this.cls.push(CLASS_CODE.get(cls)!);
    this.prior.push(prior);
    if (this.scratch.length < terms.length) this.scratch = new Uint32Array(terms.length * 2);
    let n = 0;
    for (const t of terms) {
      let id = this.termIdOf.get(t);
      if (id === undefined) {
        id = this.termIdOf.size;
        this.termIdOf.set(t, id);
        this.termDf.push(0);
      }
      this.scratch[n++] = id;
    }
    // A typed array sorts numbers without a comparator call per comparison.
    const ids = this.scratch.subarray(0, n).sort();
    for (let i = 0; i < ids.length; i++) {
      this.termIds.push(ids[i]!);
      if (i === 0 || ids[i] !== ids[i - 1]) this.termDf.data[ids[i]!]!++;
    }
    this.termStart.push(this.termIds.length);
    let lo = 0;
    let hi = 0;
    for (const t of nameTokens) {
      for (const b of tokenBits(t)) {
        if (b < 32) lo |= 1 << b;
        else hi |= 1 << (b - 32);
      }
    }
    this.sig.push(lo >>> 0);
    this.sig.push(hi >>> 0);
  }

  /** One blocking key of an entity (each (key, kind) once per entity). */
  addKey(key: string, cls: EntityClass, kind: KeyKind, eid: number): void {
    if (eid > MAX_KEYED_ENTITIES) throw new Error(`a KB holds at most ${MAX_KEYED_ENTITIES} entities`);
    this.keys.add(key, ((eid << KEY_HIT_SHIFT) | (CLASS_CODE.get(cls)! << 2) | KIND_CODE.get(kind)!) >>> 0);
  }

  /** Number of entities whose context carries `term` (0 when none). */
  dfOf(term: string): number {
    const id = this.termIdOf.get(term);
    return id === undefined ? 0 : this.termDf.data[id]!;
  }

  /**
   * The TF-IDF norm of every entity's context terms (weights as in src/score/context.ts), from
   * the final document frequencies: index 0 is the placeholder.
   */
  private norms(): Float64Array {
    const n = this.prior.length;
    const docs = n - 1;
    const idfs = new Float64Array(this.termDf.length);
    for (let i = 0; i < idfs.length; i++) idfs[i] = idf(this.termDf.data[i]!, docs);
    const out = new Float64Array(n);
    const start = this.termStart.data;
    const ids = this.termIds.data;
    const idfOfId = (id: number) => idfs[id]!;
    for (let e = 1; e < n; e++) out[e] = termIdListNorm(ids, start[e]!, start[e + 1]!, idfOfId);
    return out;
  }

  /**
   * Write the store into `db` (table `hot`): `posEid[pos]` maps full-text positions to entity
   * ids, `variants` maps deletion variants to vocabulary token ids (see Kb.tokensForVariants),
   * `postings` is the in-memory word index of the full-text rows (postings.ts); name token ids
   * are ids of a vocabulary of `vocabularySize` tokens.
   */
  write(
    db: Database.Database,
    posEid: Uint32Array,
    variants: StringIndexArrays,
    postings: PostingArrays,
    vocabularySize: number,
  ): void {
    const keys = this.keys.build();
    const names = this.names.build(vocabularySize);
    const display = this.display.build();
    const arrays: Record<string, ArrayBufferView> = {
      keyStart: keys.start,
      keyCheck: keys.check,
      keyValue: keys.value,
      variantStart: variants.start,
      variantCheck: variants.check,
      variantValue: variants.value,
      wordStart: postings.words.start,
      wordCheck: postings.words.check,
      wordValue: postings.words.value,
      postStart: postings.start,
      postEid: postings.eids,
      nameStart: names.nameStart,
      nameTokenStart: names.tokenStart,
      ...idArray("nameTokens", names.tokens),
      nameInfo: names.info,
      nameTails: new TextEncoder().encode(JSON.stringify(names.tails)),
      displayText: display.text,
      displayStart: display.start,
      displayAttributed: display.attributed,
      cls: Uint8Array.from(this.cls.toArray()),
      prior: Float64Array.from(this.prior),
      norm: this.norms(),
      termStart: this.termStart.toArray(),
      ...idArray("termIds", narrowIds(this.termIds.toArray(), this.termDf.length)),
      sig: this.sig.toArray(),
      posEid,
    };
    const ins = db.prepare("INSERT INTO hot (name, part, data) VALUES (?, ?, ?)");
    db.transaction(() => {
      for (const [name, a] of Object.entries(arrays)) {
        const bytes = Buffer.from(a.buffer, a.byteOffset, a.byteLength);
        let part = 0;
        for (let at = 0; at < bytes.length || part === 0; at += PART_BYTES, part++) {
          ins.run(name, part, bytes.subarray(at, Math.min(bytes.length, at + PART_BYTES)));
        }
      }
    })();
  }
}

/**
 * The hot store's arrays in memory that threads share (array name -> its bytes): the linking
 * threads of src/link/parallel.ts hold one copy between them instead of one each.
 */
export type SharedHotArrays = Map<string, SharedArrayBuffer>;

/** The loaded hot store (see the top of this file). Entity ids index every per-entity array. */
export class HotStore {
  readonly entities: number;
  private readonly cls: Uint8Array;
  readonly prior: Float64Array;
  /** Context TF-IDF norm per entity (see src/score/context.ts). */
  readonly norm: Float64Array;
  readonly termStart: Uint32Array;
  readonly termIds: TermIdArray;
  private readonly sig: Uint32Array;
  /** Entity per full-text position, read on first use (only the FTS5 path needs it). */
  private posEid: Uint32Array | null = null;
  /** Blocking key -> packed hits (see forEachKeyHit). */
  private readonly keys: StringIndex;
  /** Deletion variant -> vocabulary token ids (see Kb.tokensForVariants). */
  readonly variants: StringIndex;
  /** Word -> entities carrying it in a name key, most popular first (postings.ts). */
  readonly postings: Postings;
  /** Every entity's name forms (names.ts; the Kb pairs them with its vocabulary). */
  readonly names: NameArrays;
  /** Every entity's table id and name (display.ts). */
  readonly display: Display;

  /** The KB's hot table, kept for the arrays read on first use. */
  private readonly table: HotTable;

  /**
   * Loads the store from the KB's hot table. With `shared`, the arrays it holds are used as they
   * are, and those it lacks are read into shared memory and added to it.
   */
  constructor(db: Database.Database, shared?: SharedHotArrays) {
    const table = new HotTable(db, shared);
    this.table = table;
    const bytes = (name: string) => table.read(name);
    this.cls = new Uint8Array(bytes("cls"));
    this.prior = new Float64Array(bytes("prior"));
    this.norm = new Float64Array(bytes("norm"));
    this.termStart = new Uint32Array(bytes("termStart"));
    this.termIds = table.ids("termIds");
    this.sig = new Uint32Array(bytes("sig"));
    const index = (name: string): StringIndexArrays => ({
      start: new Uint32Array(bytes(`${name}Start`)),
      check: new Uint32Array(bytes(`${name}Check`)),
      value: new Uint32Array(bytes(`${name}Value`)),
    });
    this.keys = new StringIndex(index("key"));
    this.variants = new StringIndex(index("variant"));
    this.postings = new Postings({
      words: index("word"),
      start: new Uint32Array(bytes("postStart")),
      eids: new Uint32Array(bytes("postEid")),
    });
    this.names = {
      nameStart: new Uint32Array(bytes("nameStart")),
      tokenStart: new Uint32Array(bytes("nameTokenStart")),
      tokens: table.ids("nameTokens"),
      info: new Uint32Array(bytes("nameInfo")),
      // Parsed into strings of this thread's own: never shared.
      tails: JSON.parse(new TextDecoder().decode(new Uint8Array(table.read("nameTails", false)))) as string[],
    };
    this.display = new Display({
      text: new Uint8Array(bytes("displayText")),
      start: new Uint32Array(bytes("displayStart")),
      attributed: new Uint8Array(bytes("displayAttributed")),
    });
    this.entities = this.cls.length - 1;
    if (
      this.prior.length !== this.cls.length ||
      this.norm.length !== this.cls.length ||
      this.termStart.length !== this.cls.length + 1 ||
      this.sig.length !== 2 * this.cls.length ||
      this.names.nameStart.length !== this.cls.length + 1 ||
      this.display.entities !== this.entities
    ) {
      throw new Error("hot store: arrays of different lengths");
    }
  }

  /** Calls `each` with the class, kind and entity of every blocking-key row of `key`. */
  forEachKeyHit(key: string, each: (cls: EntityClass, kind: KeyKind, eid: number) => void): void {
    this.keys.forEach(key, (v) =>
      each(ENTITY_CLASSES[(v >>> 2) & 7]!, KEY_KINDS[v & 3]!, v >>> KEY_HIT_SHIFT),
    );
  }

  classOf(eid: number): EntityClass {
    return ENTITY_CLASSES[this.cls[eid]!]!;
  }

  /** The entity's class as its position in ENTITY_CLASSES (for tables indexed by class). */
  classCode(eid: number): number {
    return this.cls[eid]!;
  }

  /** Whether the entity's names may carry a token with these signature bits (false: surely not). */
  mayHaveToken(eid: number, bits: readonly [number, number]): boolean {
    return this.hasBit(eid, bits[0]) && this.hasBit(eid, bits[1]);
  }

  /** Whether bit `b` of the entity's name signature is set. */
  private hasBit(eid: number, b: number): boolean {
    const word = this.sig[2 * eid + (b < 32 ? 0 : 1)]!;
    return (word & (1 << (b % 32))) !== 0;
  }

  /** Whether the entity's context (description and attributes) holds the term with this id. */
  hasTerm(eid: number, termId: number): boolean {
    const ids = this.termIds;
    for (let j = this.termStart[eid]!, end = this.termStart[eid + 1]!; j < end; j++) {
      const id = ids[j]!;
      if (id === termId) return true;
      if (id > termId) return false; // sorted ascending
    }
    return false;
  }

  /** The context cosine of a mention and an entity (see src/score/context.ts), and the shared terms. */
  contextCosine(mention: IdVector, eid: number, shared?: string[]): number {
    return contextCosine(
      mention,
      this.termIds,
      this.termStart[eid]!,
      this.termStart[eid + 1]!,
      this.norm[eid]!,
      shared,
    );
  }

  /** The entity at a full-text position. */
  eidAt(pos: number): number {
    this.posEid ??= new Uint32Array(this.table.read("posEid"));
    return this.posEid[pos]!;
  }
}

/**
 * An id array under its name, or under its name plus "16" when its ids are 16-bit (see
 * narrowIds); HotTable.ids reads either back.
 */
function idArray(name: string, ids: Uint16Array | Uint32Array): Record<string, ArrayBufferView> {
  return ids instanceof Uint16Array ? { [`${name}16`]: ids } : { [name]: ids };
}

/** Reads arrays back from the KB's hot table, with its statements prepared once. */
class HotTable {
  private readonly total: Database.Statement<[string], number | null>;
  private readonly parts: Database.Statement<[string], Buffer>;

  constructor(
    db: Database.Database,
    /** Arrays in shared memory (see SharedHotArrays); none: each read makes a private copy. */
    private readonly shared?: SharedHotArrays,
  ) {
    this.total = db
      .prepare<[string], number | null>("SELECT sum(length(data)) FROM hot WHERE name = ?")
      .pluck(true);
    this.parts = db
      .prepare<[string], Buffer>("SELECT data FROM hot WHERE name = ? ORDER BY part")
      .pluck(true);
  }

  /**
   * One array, its parts copied one at a time into a fresh buffer (aligned for any typed-array
   * view, which a BLOB's own buffer need not be). Parts are small (PART_BYTES) so that the
   * transient copies SQLite and the driver make of each BLOB are small too: with parts of 64 MB,
   * those freed copies stayed in the process's resident set.
   */
  read(name: string, share = true): ArrayBufferLike {
    const held = share ? this.shared?.get(name) : undefined;
    if (held !== undefined) return held;
    const total = this.total.get(name) ?? null;
    if (total === null) throw new Error(`hot store: no "${name}" array`);
    const sharing = share && this.shared !== undefined;
    const out = new Uint8Array(sharing ? new SharedArrayBuffer(total) : new ArrayBuffer(total));
    let at = 0;
    for (const b of this.parts.iterate(name)) {
      if (at + b.length > total) throw new Error(`hot store: "${name}" parts do not add up`);
      out.set(b, at);
      at += b.length;
    }
    if (sharing) this.shared!.set(name, out.buffer as SharedArrayBuffer);
    return out.buffer;
  }

  /** An id array written by idArray, in the width it was stored. */
  ids(name: string): Uint16Array | Uint32Array {
    return this.total.get(`${name}16`) != null
      ? new Uint16Array(this.read(`${name}16`))
      : new Uint32Array(this.read(name));
  }
}
