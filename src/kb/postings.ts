/**
 * The in-memory word index behind token search: for every word of every name key, the entities
 * whose names carry it, most popular first. It holds the same lists as the KB's FTS5 table
 * (alias_fts; the build fills both from the same rows in the same order) and answers the same
 * unranked query, "the first k rows carrying this word", with no SQLite statement per word; a
 * mention makes several such lookups, and as statements they were a tenth of linking time at a
 * million entities. Words are split and lowercased as FTS5's unicode61 tokenizer does for folded
 * keys (tests/postings.test.ts checks the two agree).
 *
 * Layout: word -> list number through a hashed string index (string-index.ts), then the list's
 * entity ids side by side in one array. Memory: 4 bytes per (word, name key) occurrence plus
 * about 9 per distinct word (about 30 MB for the 1,000,000-entity benchmark table).
 */
import { StringIndex, type StringIndexArrays, StringIndexBuilder } from "./string-index.js";
import { groupByBucket, U32List } from "./u32-list.js";

/** What separates the words FTS5 (unicode61) indexes: anything but a letter or a digit. */
const WORD_SEPARATORS = /[^\p{L}\p{N}]+/u;

/** The words of a folded key or token as the full-text index sees them. */
export function ftsWords(text: string): string[] {
  return text
    .toLowerCase()
    .split(WORD_SEPARATORS)
    .filter((w) => w.length > 0);
}

/** The arrays of a built word index, as stored in the KB's hot table. */
export interface PostingArrays {
  words: StringIndexArrays;
  /** List l's entity ids are eids[start[l] .. start[l + 1]). */
  start: Uint32Array;
  eids: Uint32Array;
}

/** Collects (word, entity) occurrences in full-text order (most popular entity first). */
export class PostingsBuilder {
  private readonly listOf = new Map<string, number>();
  private readonly list = new U32List();
  private readonly eid = new U32List();

  /** The next full-text row: one name key of entity `eid`. */
  addKey(key: string, eid: number): void {
    const words = ftsWords(key);
    for (let i = 0; i < words.length; i++) {
      const w = words[i]!;
      // A row matches a word once, however often the word occurs in it.
      if (words.indexOf(w) < i) continue;
      let l = this.listOf.get(w);
      if (l === undefined) {
        l = this.listOf.size;
        this.listOf.set(w, l);
      }
      this.list.push(l);
      this.eid.push(eid);
    }
  }

  /** The lists, each in the order its occurrences were added (a stable counting sort). */
  build(): PostingArrays {
    const lists = this.listOf.size;
    const words = new StringIndexBuilder();
    for (const [w, l] of this.listOf) words.add(w, l);
    this.listOf.clear();
    const list = this.list.data;
    const {
      start,
      grouped: [eids],
    } = groupByBucket(this.eid.length, lists, (i) => list[i]!, [this.eid.data]);
    return { words: words.build(), start, eids: eids! };
  }
}

/** A loaded word index. */
export class Postings {
  private readonly words: StringIndex;
  private readonly start: Uint32Array;
  private readonly eids: Uint32Array;

  constructor(arrays: PostingArrays) {
    if (arrays.start[arrays.start.length - 1] !== arrays.eids.length)
      throw new Error("word index: list bounds do not match the entity array");
    this.words = new StringIndex(arrays.words);
    this.start = arrays.start;
    this.eids = arrays.eids;
  }

  /**
   * Whether `test` holds for one of the entities of the first `limit` rows carrying `word`, asked
   * most popular first and stopping at the first that holds (see forEachCarrier).
   */
  someCarrier(word: string, limit: number, test: (eid: number) => boolean): boolean {
    let list = -1;
    this.words.forEach(word, (l) => {
      list = l;
    });
    if (list < 0) return false;
    const end = Math.min(this.start[list + 1]!, this.start[list]! + limit);
    for (let i = this.start[list]!; i < end; i++) if (test(this.eids[i]!)) return true;
    return false;
  }

  /**
   * Calls `each` with the entities of the first `limit` rows carrying `word` (an entity with two
   * names carrying it comes twice), most popular first: what
   * `SELECT rowid FROM alias_fts WHERE alias_fts MATCH word LIMIT limit` returns, as entities.
   * `word` must be one word (see ftsWords).
   */
  forEachCarrier(word: string, limit: number, each: (eid: number) => void): void {
    let list = -1;
    this.words.forEach(word, (l) => {
      list = l;
    });
    if (list < 0) return;
    const end = Math.min(this.start[list + 1]!, this.start[list]! + limit);
    for (let i = this.start[list]!; i < end; i++) each(this.eids[i]!);
  }
}
