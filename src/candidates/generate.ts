/**
 * Blocking and candidate generation. For each class a mention may belong to, several paths look
 * for entities, each recorded on the candidate:
 * - exact: the mention's normalized key equals an alias key (same class);
 * - ocr: the OCR-folded keys are equal;
 * - acronym: the mention reads as an acronym ("S.G.E.", "SGE") of an alias, or an alias is one;
 * - initials: "J. H. Aldous" meets every alias of the form "j... aldous";
 * - fts: token search over alias tokens (the FTS5 table's rows, from the in-memory word index of
 *   src/kb/postings.ts), rarest token first, each token's most popular carriers first;
 * - fuzzy: tokens unknown to the table are corrected through deletion variants (one deletion
 *   on the mention's side, up to two on the table's: src/kb/deletions.ts; edit distance <= 2,
 *   a swap of adjacent letters counting one) and searched again.
 * Token search also probes, for firms, places and other non-person names of two to four words,
 * the whole keys left when the first or the last word is dropped ("Nessmouth Quay" meets
 * "Nessmouth", "thc Mary Ann" meets "Mary Ann"): an entity whose every word the mention carries
 * gets room of its own instead of competing with the hundreds of entities that share one word
 * (recorded as found by "fts").
 * The candidate list is capped: whole-key matches first, then the room left is shared by
 * token-search and fuzzy hits and by sub-key matches (see cutPool).
 */
import { deletionVariants, FUZZY_MIN_TOKEN_LENGTH } from "../kb/deletions.js";
import { tokenBits } from "../kb/hot.js";
import type { Kb } from "../kb/kb.js";
import type { KeyKind } from "../kb/schema.js";
import type { NormalizedName } from "../normalize/name.js";
import { ocrFold } from "../normalize/ocr.js";
import { COMPASS_INITIALS } from "../normalize/lexicon.js";
import { genericWordFor, genericWordsOf } from "../score/table-words.js";
import type { CandidatePath, EntityClass, SearchPath } from "../types.js";
import { GenerationCache } from "../util/generation-cache.js";
import { osaDistance } from "./edit-distance.js";

export interface CandidateOptions {
  /** Most candidates kept per mention (after merging paths). Default 30. */
  maxCandidates: number;
  /**
   * Most candidates kept from token search and fuzzy search (the tier below whole-key matches),
   * chosen by the pre-rank among up to ftsLimit hits. Hits that share one word with the mention
   * are many and rarely right: scoring ten of them keeps the right one about as often as scoring
   * thirty (benchmarks/README.md), at a fraction of the cost. Default 10.
   */
  maxSearchCandidates: number;
  /**
   * Entities taken from FTS5 token search (and again from the fuzzy path's search), most popular
   * carriers of the rarest token first; when more than maxSearchCandidates come back, the
   * pre-rank chooses among them. Wider finds more obscure namesakes and costs linking speed:
   * at 1,000,000 entities 30 / 150 / 300 gave completeness 0.958 / 0.965 / 0.968 at about
   * 3,100 / 2,500 / 1,900 mentions/s (benchmarks/README.md). Default 150.
   */
  ftsLimit: number;
  /**
   * Tokens found in more aliases than this are left out of the FTS query: they cost the most to
   * rank and say the least (a common given name). Default 5,000.
   */
  ftsMaxDf: number;
  /** Largest edit distance accepted for a fuzzy token correction. Default 2. */
  fuzzyMaxEdits: number;
  /** Corrections kept per unknown token (closest first, then most frequent). Default 6. */
  fuzzyMaxCorrections: number;
  /**
   * Skip token search and fuzzy correction when a whole key (exact, acronym, initials, OCR) of
   * two or more words, or an acronym, already matched: they would only add entities sharing some
   * words, which score below the key match. A one-word key match ("Edith") does not skip them.
   * Default true (measured in benchmarks/README.md: completeness barely moves, linking gets much
   * faster).
   */
  skipSearchOnKeyMatch: boolean;
  /**
   * When a person's whole key matched and token search is skipped (skipSearchOnKeyMatch), still
   * respell the surname, when RESPELL_MAX_DF or fewer entities carry it, through the fuzzy
   * index and probe the respelled key (an initials key after an initial): "Alexander Elinmore"
   * names an entity of its own and is also a slip for "Alexander Elingmore", which only a
   * respelling finds. Costs one fuzzy lookup per such mention. Default true (measured in
   * benchmarks/README.md).
   */
  respellSurnameOnKeyMatch: boolean;
  /**
   * Probe the sub-keys of a firm's, place's or vessel's name (see the top of this file) as part
   * of token search. Default true (measured in benchmarks/README.md).
   */
  subKeys: boolean;
  /** Paths that run; default all. Turning one off is how their value is measured. */
  paths: ReadonlySet<SearchPath>;
}

export const ALL_PATHS: readonly SearchPath[] = Object.freeze([
  "exact",
  "ocr",
  "acronym",
  "initials",
  "fts",
  "fuzzy",
]);

/** A set whose members cannot change once made (Object.freeze leaves a Set's add and delete working). */
class FrozenSet<T> extends Set<T> {
  constructor(values: Iterable<T>) {
    super();
    for (const v of values) Set.prototype.add.call(this, v);
    Object.freeze(this);
  }
  override add(): this {
    throw new TypeError("Cannot add to a frozen set: copy it (new Set(...)) to change it");
  }
  override delete(): boolean {
    throw new TypeError("Cannot delete from a frozen set: copy it (new Set(...)) to change it");
  }
  override clear(): void {
    throw new TypeError("Cannot clear a frozen set: copy it (new Set(...)) to change it");
  }
}

/** Frozen (see DEFAULT_WEIGHTS), its `paths` set too. */
export const DEFAULT_CANDIDATE_OPTIONS: CandidateOptions = Object.freeze({
  maxCandidates: 30,
  maxSearchCandidates: 10,
  ftsLimit: 150,
  ftsMaxDf: 5000,
  fuzzyMaxEdits: 2,
  fuzzyMaxCorrections: 6,
  skipSearchOnKeyMatch: true,
  respellSurnameOnKeyMatch: true,
  subKeys: true,
  paths: new FrozenSet(ALL_PATHS),
});

/** One bit per path: a candidate's paths as a bit set while pools of thousands are sorted. */
const PATH_BIT = new Map<CandidatePath, number>(ALL_PATHS.map((p, i) => [p, 1 << i]));
/**
 * A bit beside the paths' for a token-search hit through a sub-key (see the top of the file): it
 * puts the hit in a tier of its own when the list is capped and is reported as the "fts" path.
 */
const SUB_KEY_BIT = 1 << ALL_PATHS.length;
/** Paths that match a whole key: their hits outrank token-search hits when the list is capped. */
const PRECISE_MASK = (["exact", "acronym", "initials", "ocr"] as const).reduce(
  (m, p) => m | PATH_BIT.get(p)!,
  0,
);
/**
 * Least compatibility of the mention's label with a class for sub-key probes in that class: a
 * PER mention "Mary Selanlow" is looked up among vessels (compatibility 0.3) by its whole key,
 * but probing "mary" there would bring in every vessel named Mary.
 */
const SUB_KEY_MIN_COMPAT = 0.4;
/** Surname respellings probed after a naming key match (respellSurnameOnKeyMatch), closest first. */
const RESPELLINGS_ON_KEY_MATCH = 3;
/**
 * Most readings of a word written short looked up (the table's most frequent words it begins or
 * contracts): "Miss." may be Mississippi or Missouri, not fifty things.
 */
export const MAX_ABBREVIATION_READINGS = 20;
/**
 * Only a surname that at most this many entities carry is respelled after a naming key match. A
 * slip that lands on an existing name mostly lands on a rare one, while a common surname is
 * usually meant: at 1,000,000 entities, respelling only these kept two thirds of the misses
 * found by respelling every surname, with almost no candidates added (benchmarks/README.md).
 */
const RESPELL_MAX_DF = 20;
/** Fewest and most words of a mention whose sub-keys are probed. */
const SUB_KEY_MIN_WORDS = 2;
const SUB_KEY_MAX_WORDS = 4;
const bitCount = (mask: number) => {
  let n = 0;
  for (let m = mask; m !== 0; m &= m - 1) n++;
  return n;
};
/** A candidate while the pool is gathered: its paths as bits (see PATH_BIT). */
interface Found {
  eid: number;
  mask: number;
  rank: number;
}
const isPrecise = (c: Found) => (c.mask & PRECISE_MASK) !== 0;
/** Tier of a candidate when the list is capped: whole-key matches, sub-key matches, the rest. */
const tierOf = (c: Found) => (isPrecise(c) ? 0 : c.mask & SUB_KEY_BIT ? 1 : 2);
/** The candidate at position `i` of a pool. Its class is the entity's: every path checks it. */
const toRaw = (kb: Kb, pool: CandidatePool, i: number): RawCandidate => {
  const bits = pool.masks[i]!;
  const mask = bits & SUB_KEY_BIT ? bits | PATH_BIT.get("fts")! : bits;
  const eid = pool.eids[i]!;
  return {
    eid,
    cls: kb.hot.classOf(eid),
    paths: new Set(ALL_PATHS.filter((p) => (mask & PATH_BIT.get(p)!) !== 0)),
    rank: pool.ranks[i]!,
  };
};
/** Shortest token worth an FTS term: single letters are initials, matched by the initials path. */
const MIN_FTS_TOKEN_LENGTH = 2;
/**
 * Most candidates weighed by the pre-rank when there are more than maxCandidates (a common name
 * can have thousands of carriers). The pre-rank reads only the in-memory hot store, so this
 * bounds the cost of the key lookup rows, not of SQLite entity reads.
 */
const PRE_RANK_MAX = 3000;
/** Tokens of one mention looked at by token search; a 10,000-character "name" is noise past this. */
const MAX_QUERY_TOKENS = 12;
/** Unknown tokens of one mention sent to fuzzy correction. */
const MAX_FUZZY_TOKENS = 4;

export interface RawCandidate {
  eid: number;
  cls: EntityClass;
  paths: Set<CandidatePath>;
  /** Order of discovery within its tier (lower first). */
  rank: number;
}

export interface MentionForm {
  cls: EntityClass;
  norm: NormalizedName;
  /**
   * How compatible the mention's label is with this class (see src/labels): sub-keys are probed
   * only for classes at least SUB_KEY_MIN_COMPAT compatible. Default 1.
   */
  compat?: number;
  /**
   * Set on the reading of a mention without its closing possessive ("Harrowmouth" for
   * "Harrowmouth's", see withoutPossessive): a key match of it earns at most
   * ONE_SIDED_QUALIFIER_CREDIT, so a name that carries the possessive itself ("St. John's")
   * outranks one that does not ("Saint John"). Default false.
   */
  possessiveDropped?: boolean;
}

/**
 * Values entities (by internal id) on the evidence that is cheap to weigh for thousands of them
 * (context, type, popularity, from the KB's hot store). `nameShare[i]` is the share of the
 * mention's words (or their corrections) that entity `eids[i]`'s names may carry (from the
 * name-token signatures: it can say yes wrongly, never no wrongly).
 */
export type PreRank = (eids: Int32Array, nameShare: Float64Array) => ArrayLike<number>;

/**
 * What candidate generation finds for one mention's forms before the list is cut: every entity
 * found, in the order the cut takes them (tier, number of paths, discovery), and the words
 * (with their corrections) the pre-rank's name share counts. It depends on the forms and the
 * options only, never on the context, so mentions with the same text and label can share one
 * (see src/link/surface-cache.ts). Kept in typed arrays rather than an object per entity: a
 * cache of pools is then a few objects each, which the garbage collector barely notices.
 * Treat it as read-only; `cutPool` fills `shares`.
 */
export interface CandidatePool {
  /** Entity ids in the order the cut takes them (tier, most paths, discovery). */
  readonly eids: Int32Array;
  /** Paths of each, as bits (see PATH_BIT and SUB_KEY_BIT: seven bits, so a byte holds them). */
  readonly masks: Uint8Array;
  /** Order of discovery of each, the last tie-break of the cut. */
  readonly ranks: Int32Array;
  /**
   * Where each tier starts, and the end: whole-key matches from [0], sub-key matches from [1],
   * token-search and fuzzy hits from [2], to [3].
   */
  readonly tierStart: readonly [number, number, number, number];
  readonly tokens: ReadonlySet<string>;
  readonly corrected: ReadonlyMap<string, readonly string[]>;
  /** Name shares of each tier's first PRE_RANK_MAX candidates, once computed. */
  readonly shares: Array<Float64Array | undefined>;
}

/** Everything the paths find for one mention's forms (see CandidatePool). */
export function gatherPool(kb: Kb, forms: readonly MentionForm[], opts: CandidateOptions): CandidatePool {
  const found = new Map<number, Found>();
  let order = 0;
  // Every path checks the entity's class before adding it, so the pool need not hold it.
  const addBits = (eid: number, bits: number) => {
    const c = found.get(eid);
    if (c) c.mask |= bits;
    else found.set(eid, { eid, mask: bits, rank: order++ });
  };
  const add = (eid: number, path: CandidatePath) => addBits(eid, PATH_BIT.get(path)!);
  const classes = new Set(forms.map((f) => f.cls));
  const on = opts.paths;

  // Every whole-key probe of every form, answered from the KB's in-memory key index. A probe "names" an
  // entity when a match on it is specific: a key of two or more words, or an acronym. A single
  // word ("Mrs Ingeldale", "Edith") is shared by everyone of that surname or given name.
  type Probe = { cls: EntityClass; kind: KeyKind; path: SearchPath; names: boolean };
  const probes = new Map<string, Probe[]>();
  const probe = (key: string | null, cls: EntityClass, kind: KeyKind, path: SearchPath, names: boolean) => {
    if (key === null || key === "" || !on.has(path)) return;
    const list = probes.get(key);
    if (list) list.push({ cls, kind, path, names });
    else probes.set(key, [{ cls, kind, path, names }]);
  };
  for (const { cls, norm } of forms) {
    if (norm.key === "") continue;
    const words = norm.tokens.length >= 2;
    probe(norm.key, cls, "exact", "exact", words);
    probe(norm.acronym, cls, "acronym", "acronym", true);
    if (norm.tokens[0]!.length === 1) probe(norm.initialsKey, cls, "initials", "initials", true);
    probe(norm.ocrKey, cls, "ocr", "ocr", words);
  }

  let named = false;
  const runProbes = () => {
    if (probes.size === 0) return;
    for (const [key, list] of probes) {
      kb.forEachKeyHit(key, (cls, kind, eid) => {
        for (const p of list)
          if (p.cls === cls && p.kind === kind) {
            add(eid, p.path);
            if (p.names) named = true;
          }
      });
    }
    probes.clear();
  };
  runProbes();
  // A whole-key match that names an entity (exact, acronym, initials or OCR key of two or more
  // words) already found it: token search and fuzzy correction would only add entities that
  // share some words, scoring below it.
  const search = !(opts.skipSearchOnKeyMatch && named);
  if (!search && opts.respellSurnameOnKeyMatch && on.has("fuzzy")) {
    for (const { cls, norm } of forms) {
      const words = norm.tokens;
      const surname = words[words.length - 1]!;
      if (cls !== "person" || words.length < 2 || surname.length < FUZZY_MIN_TOKEN_LENGTH) continue;
      if (kb.tokenDf(surname) > RESPELL_MAX_DF) continue;
      for (const fix of correctToken(kb, surname, opts).slice(0, RESPELLINGS_ON_KEY_MATCH)) {
        if (fix === surname) continue;
        const key = [...words.slice(0, -1), fix].join(" ");
        // "A. Garley" is probed as "a gareley", an initials key; "Alexander Elinmore" as a whole key.
        probe(key, cls, words[0]!.length === 1 ? "initials" : "exact", "fuzzy", false);
      }
    }
    runProbes();
  }

  // Tokens known to the table feed the token search; unknown ones go to fuzzy correction.
  const tokens = new Set<string>();
  for (const f of forms) for (const t of f.norm.tokens) tokens.add(t);
  const knownDf: Array<[string, number]> = [];
  const unknown: string[] = [];
  let queried = 0;
  if (search) {
    for (const t of tokens) {
      if (t.length < MIN_FTS_TOKEN_LENGTH || queried >= MAX_QUERY_TOKENS) continue;
      queried++;
      const df = kb.tokenDf(t);
      if (df === 0) unknown.push(t);
      else if (df <= opts.ftsMaxDf) knownDf.push([t, df]);
    }
  }
  const rarestKnown = rarestFirst(knownDf);
  // Corrections of unknown tokens feed token search and whole keys; a known token may be a
  // misreading too ("Grimehurst" is a name, and a slip for "Grimerhurst"), so the rarest known
  // tokens are corrected as well, for whole keys only.
  const corrected = new Map<string, readonly string[]>();
  const respelled = new Map<string, readonly string[]>();
  if (search && on.has("fuzzy")) {
    for (const t of unknown.slice(0, MAX_FUZZY_TOKENS)) {
      const fixes = correctToken(kb, t, opts);
      if (fixes.length > 0) corrected.set(t, fixes);
    }
    const room = MAX_FUZZY_TOKENS - Math.min(unknown.length, MAX_FUZZY_TOKENS);
    for (const t of rarestKnown.slice(0, room)) {
      if (t.length < FUZZY_MIN_TOKEN_LENGTH) continue;
      const fixes = correctToken(kb, t, opts).filter((f) => f !== t);
      if (fixes.length > 0) respelled.set(t, [t, ...fixes]);
    }
  }
  // Words written short ("Calif.", "Tenn.") that the table does not know stand for the words they
  // begin or contract: read like corrections, for whole keys only (as token search terms, twenty
  // readings of "Co." would bring in half the table).
  const expanded = new Map<string, readonly string[]>();
  if (search && on.has("fuzzy")) {
    // In the readings of the label's own class only ("Fcnelworth Bos." is a man, not a firm).
    let labelCompat = 0;
    for (const f of forms) labelCompat = Math.max(labelCompat, f.compat ?? 1);
    for (const { norm, compat } of forms) {
      if ((compat ?? 1) < labelCompat) continue;
      for (const t of norm.abbreviated) {
        if (expanded.has(t) || kb.tokenDf(t) > 0) continue;
        const longer = kb.wordsAbbreviatedBy(t, MAX_ABBREVIATION_READINGS);
        if (longer.length > 0) expanded.set(t, [...(corrected.get(t) ?? []), ...longer]);
      }
      // Beside a word written short, a lone initial may be a compass point ("W. Va.").
      if (norm.abbreviated.length > 0)
        for (const t of norm.tokens) {
          const points = COMPASS_INITIALS[t];
          if (points !== undefined && !expanded.has(t)) expanded.set(t, points);
        }
    }
  }
  if (search) {
    const options = new Map([...corrected, ...respelled, ...expanded]);
    for (const { cls, norm } of forms) {
      // Whole keys again, from the corrected tokens (fewest changes first).
      for (const tokens of correctedReadings(norm.tokens, options)) {
        const key = tokens.join(" ");
        const fixed = key !== norm.key;
        if (fixed) probe(key, cls, "exact", "fuzzy", false);
        // A person's given name may be written short in a way no table spells out ("Js.",
        // "Thos"), or misread: the initial and the surname still meet the "J. Uddale" keys.
        if (cls === "person" && tokens.length >= 2 && (fixed || tokens[0]!.length > 1)) {
          probe(
            `${tokens[0]![0]} ${tokens[tokens.length - 1]}`,
            cls,
            "initials",
            fixed ? "fuzzy" : "initials",
            false,
          );
        }
      }
    }
    runProbes();
  }

  // Sub-keys: the whole keys left when the first or the last word is dropped.
  if (search && opts.subKeys && on.has("fts")) {
    for (const { cls, norm, compat } of forms) {
      const n = norm.tokens.length;
      if (cls === "person" || (compat ?? 1) < SUB_KEY_MIN_COMPAT) continue;
      if (n < SUB_KEY_MIN_WORDS || n > SUB_KEY_MAX_WORDS) continue;
      for (const sub of [norm.tokens.slice(1), norm.tokens.slice(0, -1)]) {
        const key = sub.join(" ");
        const each = (hitCls: EntityClass, kind: KeyKind, eid: number) => {
          if (hitCls === cls && (kind === "exact" || kind === "ocr")) addBits(eid, SUB_KEY_BIT);
        };
        kb.forEachKeyHit(key, each);
        const ocr = ocrFold(key);
        if (ocr !== key) kb.forEachKeyHit(ocr, each);
      }
    }
  }

  // Token search hits carry no class: the hot store knows it.
  const searched: Array<[number, CandidatePath]> = [];
  if (on.has("fts") && knownDf.length > 0) {
    for (const eid of kb.searchAliases(rarestKnown, opts.ftsLimit)) searched.push([eid, "fts"]);
  }
  if (corrected.size > 0) {
    const termDf: Array<[string, number]> = [];
    for (const fixes of corrected.values()) {
      for (const f of fixes) {
        const df = kb.tokenDf(f);
        if (df <= opts.ftsMaxDf) termDf.push([f, df]);
      }
    }
    for (const eid of kb.searchAliases(rarestFirst(termDf), opts.ftsLimit)) searched.push([eid, "fuzzy"]);
  }
  for (const [eid, path] of searched) {
    const cls = kb.hot.classOf(eid);
    if (classes.has(cls)) add(eid, path);
  }

  const all = [...found.values()];
  all.sort((a, b) => tierOf(a) - tierOf(b) || bitCount(b.mask) - bitCount(a.mask) || a.rank - b.rank);
  const n = all.length;
  const eids = new Int32Array(n);
  const masks = new Uint8Array(n);
  const ranks = new Int32Array(n);
  const counts = [0, 0, 0];
  for (let i = 0; i < n; i++) {
    const c = all[i]!;
    eids[i] = c.eid;
    masks[i] = c.mask;
    ranks[i] = c.rank;
    counts[tierOf(c)]!++;
  }
  const tierStart: [number, number, number, number] = [0, counts[0]!, counts[0]! + counts[1]!, n];
  return { eids, masks, ranks, tierStart, tokens, corrected, shares: [undefined, undefined, undefined] };
}

/**
 * The candidates kept from a pool: all of them when they fit, else each tier that does not fit
 * is cut by the pre-rank (context, type, popularity and the share of the mention's words), or
 * without one by that share and popularity.
 */
export function cutPool(
  kb: Kb,
  pool: CandidatePool,
  opts: CandidateOptions,
  preRank?: PreRank,
): RawCandidate[] {
  const at = pool.tierStart;
  const n = at[3];
  if (
    n <= opts.maxCandidates &&
    at[2] - at[1] <= opts.maxSearchCandidates &&
    n - at[2] <= opts.maxSearchCandidates
  ) {
    const out: RawCandidate[] = [];
    for (let i = 0; i < n; i++) out.push(toRaw(kb, pool, i));
    return out;
  }
  // Too many (many entities share one name, or one word). At most PRE_RANK_MAX candidates of a
  // tier are weighed. Positions in the pool's arrays are kept.
  const out: number[] = [];
  const tierEnd = (t: number) => Math.min(at[t + 1]!, at[t]! + PRE_RANK_MAX);
  // Whole-key matches first (up to maxCandidates); the room left goes to token-search hits and
  // sub-key matches, at most maxSearchCandidates each, split evenly when it cannot hold both.
  const whole = 0;
  const subTier = 1;
  const searchTier = 2;
  const keep = (t: number, room: number) => {
    if (room <= 0) return;
    const start = at[t]!;
    const end = tierEnd(t);
    if (end - start <= room) {
      for (let i = start; i < end; i++) out.push(i);
      return;
    }
    const eids = pool.eids.subarray(start, end);
    pool.shares[t] ??= nameShares(kb, eids, pool.tokens, pool.corrected);
    const share = pool.shares[t]!;
    // Without a pre-rank: the share of the mention's words first, then popularity.
    const pre = preRank ? preRank(eids, share) : share;
    const prior = (i: number) => (preRank ? 0 : kb.hot.prior[eids[i]!]!);
    const ranks = pool.ranks;
    const before = (a: number, b: number) =>
      pre[b]! - pre[a]! || prior(b) - prior(a) || ranks[start + a]! - ranks[start + b]! || a - b;
    for (const i of bestPositions(end - start, room, before)) out.push(start + i);
  };
  keep(whole, opts.maxCandidates);
  const left = opts.maxCandidates - out.length;
  const wantSearch = Math.min(tierEnd(searchTier) - at[searchTier]!, opts.maxSearchCandidates);
  const wantSub = Math.min(tierEnd(subTier) - at[subTier]!, opts.maxSearchCandidates);
  let roomSearch = wantSearch;
  let roomSub = wantSub;
  if (wantSearch + wantSub > left) {
    // Half each, and what one of them cannot use goes to the other.
    roomSearch = Math.min(wantSearch, Math.max(Math.ceil(left / 2), left - wantSub));
    roomSub = Math.min(wantSub, left - roomSearch);
  }
  keep(searchTier, roomSearch);
  keep(subTier, roomSub);
  return out.map((i) => toRaw(kb, pool, i));
}

/**
 * The `room` best of positions 0..n-1, best first, under `before` (negative: a goes before b; a
 * total order, ties broken by position): what sorting all n and taking the first `room` gives,
 * without sorting all n. A tier holds up to PRE_RANK_MAX entities and keeps a few dozen, so most
 * positions are turned away by one comparison with the worst kept so far.
 */
export function bestPositions(n: number, room: number, before: (a: number, b: number) => number): number[] {
  const best: number[] = [];
  if (room <= 0) return best;
  for (let i = 0; i < n; i++) {
    if (best.length === room) {
      if (before(i, best[room - 1]!) >= 0) continue;
      best.pop();
    }
    let at = best.length;
    while (at > 0 && before(i, best[at - 1]!) < 0) at--;
    best.splice(at, 0, i);
  }
  return best;
}

/**
 * For each entity, the share of the mention's words (of two or more letters) whose spelling, or
 * one of whose corrections, its names may carry. The table's generic words ("airport" in a table
 * of airfields, see src/score/table-words.ts) are not counted when the mention has other words:
 * every other entry carries them, and "Midland International Airport" should keep "Midland Intl"
 * before a hundred international airports.
 */
function nameShares(
  kb: Kb,
  eids: ArrayLike<number>,
  tokens: ReadonlySet<string>,
  corrected: ReadonlyMap<string, readonly string[]>,
): Float64Array {
  const generic = genericWordsOf(kb);
  const words = [...tokens].filter((t) => t.length >= MIN_FTS_TOKEN_LENGTH);
  const specific = words.filter((t) => genericWordFor(t, generic) === null);
  const slots: Array<Array<[number, number]>> = [];
  for (const t of specific.length > 0 ? specific : words) {
    slots.push([t, ...(corrected.get(t) ?? [])].map(tokenBits));
  }
  const out = new Float64Array(eids.length);
  if (slots.length === 0) return out;
  const hot = kb.hot;
  // Plain loops: this runs for every entity of pools of hundreds, and a closure per entity and
  // word was a quarter of what a mention allocated.
  for (let i = 0; i < eids.length; i++) {
    const e = eids[i]!;
    let n = 0;
    for (let s = 0; s < slots.length; s++) {
      const slot = slots[s]!;
      for (let k = 0; k < slot.length; k++) {
        if (hot.mayHaveToken(e, slot[k]!)) {
          n++;
          break;
        }
      }
    }
    out[i] = n / slots.length;
  }
  return out;
}

/** Most whole keys built from combinations of token corrections. */
const MAX_CORRECTED_KEYS = 12;

/**
 * Readings of a token list where each token with options (`options.get(t)`, first = preferred)
 * is replaced by one of them: first the reading of every token's first option, then those that
 * change one token to a later option, then two tokens; at most MAX_CORRECTED_KEYS readings.
 */
export function correctedReadings(
  tokens: readonly string[],
  options: ReadonlyMap<string, readonly string[]>,
): string[][] {
  const alts = tokens.map((t) => options.get(t) ?? [t]);
  const base = alts.map((a) => a[0]!);
  const out: string[][] = [base];
  const varied = alts.flatMap((a, i) => a.slice(1).map((o) => [i, o] as const));
  for (const [i, o] of varied) {
    if (out.length >= MAX_CORRECTED_KEYS) return out;
    out.push(base.map((t, k) => (k === i ? o : t)));
  }
  for (let x = 0; x < varied.length; x++) {
    for (let y = x + 1; y < varied.length; y++) {
      const [i, o] = varied[x]!;
      const [k, q] = varied[y]!;
      if (i === k) continue;
      if (out.length >= MAX_CORRECTED_KEYS) return out;
      out.push(base.map((t, n) => (n === i ? o : n === k ? q : t)));
    }
  }
  return out;
}

/** Tokens ordered rarest first: the rarest token says most about which entity is meant. */
function rarestFirst(tokens: Array<[string, number]>): string[] {
  return tokens.sort((a, b) => a[1] - b[1] || (a[0] < b[0] ? -1 : 1)).map(([t]) => t);
}

/**
 * OCR misreadings that change a token's length ("rn" for "m", "cl" for "d"...): an edit-distance
 * search cannot see through them cheaply, so each is undone (and done) once before the deletion
 * lookup. The pairs are common practice for OCR of letterpress (see src/normalize/ocr.ts).
 */
const OCR_SWAPS: ReadonlyArray<[string, string]> = [
  ["rn", "m"],
  ["m", "rn"],
  ["cl", "d"],
  ["d", "cl"],
  ["vv", "w"],
  ["w", "vv"],
  ["li", "h"],
  ["h", "li"],
];
/** Most OCR readings of one token tried (each costs one deletion-variant lookup per letter). */
const MAX_OCR_READINGS = 6;

/** The token with one OCR swap applied at each place it can be (capped). */
export function ocrReadings(token: string): string[] {
  const out: string[] = [];
  for (const [from, to] of OCR_SWAPS) {
    let at = token.indexOf(from);
    while (at >= 0 && out.length < MAX_OCR_READINGS) {
      out.push(token.slice(0, at) + to + token.slice(at + from.length));
      at = token.indexOf(from, at + 1);
    }
  }
  return out;
}

/**
 * Corrections kept per KB (see correctToken). A token's corrections are the same wherever it
 * occurs, and a name's words recur across its spellings ("Wickakin" in "S. Wickakin" and
 * "Wickakin, Samuel"): about half the corrections asked for while linking the 1,000,000-entity
 * benchmark's mentions had been asked for before. An entry is a token and a few references to
 * vocabulary strings.
 */
const CORRECTION_CACHE_SIZE = 10_000;
const correctionCaches = new WeakMap<Kb, GenerationCache<string, readonly string[]>>();

/**
 * Table tokens within `fuzzyMaxEdits` of an unknown token, closest first, then most frequent
 * (at most `fuzzyMaxCorrections`). The list may be shared between calls: do not change it.
 */
export function correctToken(kb: Kb, token: string, opts: CandidateOptions): readonly string[] {
  if (token.length < FUZZY_MIN_TOKEN_LENGTH) return [];
  let cache = correctionCaches.get(kb);
  if (cache === undefined) {
    cache = new GenerationCache(CORRECTION_CACHE_SIZE);
    correctionCaches.set(kb, cache);
  }
  const key = `${opts.fuzzyMaxEdits}\u0000${opts.fuzzyMaxCorrections}\u0000${token}`;
  let fixes = cache.get(key);
  if (fixes === undefined) {
    fixes = corrections(kb, token, opts);
    cache.set(key, fixes);
  }
  return fixes;
}

/** What correctToken returns, computed. */
function corrections(kb: Kb, token: string, opts: CandidateOptions): string[] {
  const seen = new Map<string, number>();
  // Every reading's deletion variants in one batched lookup; distances are checked per reading.
  const readings: Array<[string, number]> = [[token, 0]];
  for (const r of ocrReadings(token)) {
    if (kb.tokenDf(r) > 0) seen.set(r, 1);
    else if (r.length >= FUZZY_MIN_TOKEN_LENGTH) readings.push([r, 1]); // an OCR swap counts as one edit
  }
  const variants = new Set<string>();
  for (const [r] of readings) for (const v of deletionVariants(r)) variants.add(v);
  for (const t of kb.tokensForVariants([...variants])) {
    for (let k = 0; k < readings.length; k++) {
      const [r, extra] = readings[k]!;
      // The distance is at least the difference in length: no need to compute it past the limit.
      if (Math.abs(r.length - t.length) + extra > opts.fuzzyMaxEdits) continue;
      const d = osaDistance(r, t) + extra;
      if (d <= opts.fuzzyMaxEdits && d < (seen.get(t) ?? Number.POSITIVE_INFINITY)) seen.set(t, d);
    }
  }
  return [...seen.entries()]
    .sort((a, b) => a[1] - b[1] || kb.tokenDf(b[0]) - kb.tokenDf(a[0]) || (a[0] < b[0] ? -1 : 1))
    .slice(0, opts.fuzzyMaxCorrections)
    .map(([t]) => t);
}
