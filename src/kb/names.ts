/**
 * The normalized name forms of every entity, in memory, so that scoring a candidate reads no
 * SQLite row: per name, its key tokens as vocabulary ids and what its full form adds to the key
 * (a legal form, a generational suffix: a short list of distinct "tails"). The key is the tokens
 * joined, the full form the key and its tail, the OCR key is recomputed from the key (ocrFold),
 * exactly as the build's normalizer produced them. The names' original texts stay in the
 * `entities` row, read only for the few candidates a mention's output shows.
 *
 * Memory: 4 bytes per entity, 8 per name and 2 per key token (4 past 65,536 vocabulary tokens);
 * about 39 MB for the 1,000,000-entity benchmark table.
 */
import { ocrFold } from "../normalize/ocr.js";
import { narrowIds, U32List } from "./u32-list.js";

/** One name as the build hands it over: key token ids, the tail of its full form, canonical or alias. */
export interface StoredName {
  tokens: number[];
  tail: string;
  canonical: boolean;
}

/**
 * A name's stored shape from its normalized key and full form. The normalizer builds the full
 * form as the key's tokens followed by the tail's, which this relies on (and checks).
 */
export function storedName(
  key: string,
  full: string,
  canonical: boolean,
  idOf: (token: string) => number,
): StoredName {
  let tail = "";
  if (full !== key) {
    if (!full.startsWith(`${key} `))
      throw new Error(`name store: full form "${full}" does not extend key "${key}"`);
    tail = full.slice(key.length + 1);
  }
  return { tokens: key.split(" ").map(idOf), tail, canonical };
}

/** The arrays of a built name store, as written into the KB's hot table. */
export interface NameArrays {
  /** Entity e's names are numbers nameStart[e] .. nameStart[e + 1] - 1 (entity 0: none). */
  nameStart: Uint32Array;
  /** Name n's key tokens are tokens[tokenStart[n] .. tokenStart[n + 1]). */
  tokenStart: Uint32Array;
  tokens: Uint16Array | Uint32Array;
  /** Per name: its tail's number in `tails` shifted left once, plus 1 when it is the canonical name. */
  info: Uint32Array;
  /** Distinct tails; number 0 is "" (full form = key). */
  tails: string[];
}

export class NameStoreBuilder {
  private readonly nameStart = new U32List();
  private readonly tokenStart = new U32List();
  private readonly tokens = new U32List();
  private readonly info = new U32List();
  private readonly tailOf = new Map<string, number>([["", 0]]);

  constructor() {
    this.nameStart.push(0);
    this.nameStart.push(0);
    this.tokenStart.push(0);
  }

  /** The names of the next entity (ids 1, 2, 3, ... in order). */
  add(names: readonly StoredName[]): void {
    for (const n of names) {
      for (const t of n.tokens) this.tokens.push(t);
      this.tokenStart.push(this.tokens.length);
      let tail = this.tailOf.get(n.tail);
      if (tail === undefined) {
        tail = this.tailOf.size;
        this.tailOf.set(n.tail, tail);
      }
      this.info.push(tail * 2 + (n.canonical ? 1 : 0));
    }
    this.nameStart.push(this.info.length);
  }

  build(vocabularySize: number): NameArrays {
    return {
      nameStart: this.nameStart.toArray(),
      tokenStart: this.tokenStart.toArray(),
      tokens: narrowIds(this.tokens.toArray(), vocabularySize),
      info: this.info.toArray(),
      tails: [...this.tailOf.keys()],
    };
  }
}

/** One name's forms, rebuilt from the store (the original text is not here: see Kb.entities). */
export interface StoredForms {
  /** Position among the entity's names (0: the first, the canonical name when it has a key). */
  aid: number;
  key: string;
  full: string;
  ocr: string;
  canonical: boolean;
  tokens: string[];
}

/**
 * One name's forms; the OCR key is computed when first asked for, since scoring reads it only
 * when no better key matched (about one candidate name in several).
 */
export class NameForms implements StoredForms {
  private ocrKey: string | undefined;
  constructor(
    readonly aid: number,
    readonly key: string,
    readonly full: string,
    readonly canonical: boolean,
    readonly tokens: string[],
  ) {}
  get ocr(): string {
    this.ocrKey ??= ocrFold(this.key);
    return this.ocrKey;
  }
}

/** A loaded name store. */
export class NameStore {
  constructor(
    private readonly a: NameArrays,
    /** Alias tokens by vocabulary id. */
    private readonly vocabTokens: readonly string[],
  ) {
    const names = a.info.length;
    if (a.tokenStart.length !== names + 1 || a.nameStart[a.nameStart.length - 1] !== names)
      throw new Error("name store: arrays of different lengths");
    if (a.tokenStart[names] !== a.tokens.length) throw new Error("name store: token bounds do not match");
  }

  /**
   * Whether one of entity `eid`'s names is `words` and more words after them (`atStart`) or
   * before them, the more words (as a key) passing `test`; asked in table order, stopping at the
   * first that passes. Reads the token ids in place: only a name that holds `words` there builds
   * a string.
   */
  someNameAround(
    eid: number,
    words: readonly string[],
    atStart: boolean,
    test: (rest: string) => boolean,
  ): boolean {
    const a = this.a;
    for (let n = a.nameStart[eid]!; n < a.nameStart[eid + 1]!; n++) {
      const start = a.tokenStart[n]!;
      const len = a.tokenStart[n + 1]! - start;
      if (len <= words.length) continue;
      const off = start + (atStart ? 0 : len - words.length);
      let same = true;
      for (let i = 0; i < words.length && same; i++) same = this.vocabTokens[a.tokens[off + i]!] === words[i];
      if (!same) continue;
      const from = atStart ? start + words.length : start;
      const to = atStart ? start + len : off;
      const rest: string[] = [];
      for (let i = from; i < to; i++) rest.push(this.vocabTokens[a.tokens[i]!]!);
      if (test(rest.join(" "))) return true;
    }
    return false;
  }

  /** Whether one of entity `eid`'s names holds every word of `words` (read in place). */
  hasNameWithAll(eid: number, words: readonly string[]): boolean {
    const a = this.a;
    for (let n = a.nameStart[eid]!; n < a.nameStart[eid + 1]!; n++) {
      let all = true;
      for (const w of words) {
        let found = false;
        for (let i = a.tokenStart[n]!; i < a.tokenStart[n + 1]! && !found; i++)
          found = this.vocabTokens[a.tokens[i]!] === w;
        if (!found) {
          all = false;
          break;
        }
      }
      if (all) return true;
    }
    return false;
  }

  /** The forms of entity `eid`'s names, in table order, each made by `make` (a NameForms or a subclass). */
  formsWith<T>(
    eid: number,
    make: (aid: number, key: string, full: string, canonical: boolean, tokens: string[]) => T,
  ): T[] {
    const a = this.a;
    const out: T[] = [];
    const first = a.nameStart[eid]!;
    const end = a.nameStart[eid + 1]!;
    for (let n = first; n < end; n++) {
      const tokens: string[] = [];
      for (let i = a.tokenStart[n]!; i < a.tokenStart[n + 1]!; i++)
        tokens.push(this.vocabTokens[a.tokens[i]!]!);
      const key = tokens.join(" ");
      const info = a.info[n]!;
      const tail = a.tails[info >>> 1]!;
      out.push(make(n - first, key, tail === "" ? key : `${key} ${tail}`, (info & 1) === 1, tokens));
    }
    return out;
  }
}
