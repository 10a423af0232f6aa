/**
 * The linker: normalize a mention, generate candidates, score them, decide, explain. One instance
 * per open KB; it is synchronous per mention and keeps no per-mention state, so a stream of any
 * length links in constant memory.
 */
import {
  ALL_PATHS,
  type CandidateOptions,
  DEFAULT_CANDIDATE_OPTIONS,
  cutPool,
  gatherPool,
  type MentionForm,
  type PreRank,
  type RawCandidate,
} from "../candidates/generate.js";
import { DEFAULT_MIN_MARGIN, DEFAULT_THRESHOLD, decide, marginOver } from "../decide/decide.js";
import { type EntityRow, Kb, type TermInfo } from "../kb/kb.js";
import { ftsWords } from "../kb/postings.js";
import type { LabelInfo } from "../labels/builtin.js";
import { LabelMap } from "../labels/label-map.js";
import { PLACE_KIND_WORDS } from "../normalize/lexicon.js";
import { normalizeName, splitTradeName, withoutPossessive } from "../normalize/name.js";
import { combine, DEFAULT_WEIGHTS } from "../score/combine.js";
import {
  features,
  type NameMatch,
  nameMatch,
  ONE_SIDED_QUALIFIER_CREDIT,
  prominenceOf,
  priorFeatureFor,
  type WordEvidence,
} from "../score/features.js";
import { type IdVector, idVector } from "../score/context.js";
import { genericWordsOf } from "../score/table-words.js";
import { contextTerms } from "../score/terms.js";
import { buildVector, idf } from "../score/tfidf.js";
import {
  type CandidateOut,
  type CandidatePath,
  ENTITY_CLASSES,
  type EntityClass,
  FEATURE_NAMES,
  type Features,
  type LinkConfig,
  type LinkRow,
  type Mention,
  type Reason,
  type SearchPath,
  type Weights,
} from "../types.js";
import { checkRange, checkWhole, UsageError } from "../util/errors.js";
import {
  checkCandidateOptions,
  checkCandidateSettings,
  checkDecision,
  checkDocumentOptions,
  checkMention,
  checkOptionNames,
  checkPaths,
  checkWeights,
} from "./check-options.js";
import {
  DEFAULT_DOCUMENT_EVIDENCE,
  type DocItem,
  type DocOverride,
  type DocumentEvidenceOptions,
  documentEvidence,
} from "../document/evidence.js";
import type { Decision } from "../decide/decide.js";
import { measureNearNameRate, nearNameRateOf } from "./crowding.js";
import { type KindWords, KindValues, kindWordsOf } from "./kind-values.js";
import { separatesEntries } from "./separating-words.js";
import { decisionReason, evidenceReasons } from "./explain.js";
import { type Surface, SurfaceCache } from "./surface-cache.js";
import { checkMentionSource, isDocumentUnit, type MentionUnit, mentionUnits } from "./units.js";

export interface LinkerOptions {
  /** Feature weights of the score combination. Default: DEFAULT_WEIGHTS (src/score/combine.ts). */
  weights?: Weights | undefined;
  /** Link only when the best score is at least this. Default 0.5. */
  threshold?: number | undefined;
  /** Link only when the best beats the runner-up by at least this many log-odds. Default 0.5. */
  minMargin?: number | undefined;
  /** Candidates listed per output row. Default 3. */
  top?: number | undefined;
  /** Most candidates scored per mention. Default 30. */
  maxCandidates?: number | undefined;
  /** Candidate paths to run. Default: all (exact, ocr, acronym, initials, fts, fuzzy). */
  paths?: readonly SearchPath[] | undefined;
  /** Further candidate-generation settings (see CandidateOptions). */
  candidates?: Partial<CandidateOptions> | undefined;
  /** Label map: NER labels and table types to classes and compatibilities. Default: built-in. */
  labels?: LabelMap | undefined;
  /**
   * A mention is looked up among the entities of every class whose compatibility with its label is
   * at least this. Default 0.3: a firm named after its town is still found for a LOC mention.
   */
  blockMinCompat?: number | undefined;
  /**
   * Document-level evidence used by `linkAll` and `linkDocument` on mentions that carry a `doc`
   * (see src/document/evidence.ts). Default: all three steps on; `false` turns all off.
   */
  document?: Partial<DocumentEvidenceOptions> | false | undefined;
  /**
   * Most distinct (text, label) pairs whose normalized forms and candidate pool are kept for
   * reuse by later mentions with the same text and label (see
   * src/link/surface-cache.ts); the output is the same with any value. 0 turns reuse off.
   * Default 1,024.
   */
  surfaceCache?: number | undefined;
}

export const DEFAULT_TOP = 3;
export const DEFAULT_SURFACE_CACHE = 1024;
/**
 * Weight budget of the surface cache (pool members held, see SurfaceCache) per surface it may
 * hold, on average: a few surfaces with pools of thousands take the room of many.
 */
const SURFACE_WEIGHT_EACH = 40;
export const DEFAULT_BLOCK_MIN_COMPAT = 0.3;
/**
 * Largest share of the table's records that may carry a word a mention's name is allowed to lose
 * because its candidate's record carries it (see nameMatch's "attested" match; a word only one
 * record carries always may): a town's name is carried by a few records (Stockholm by 5 of
 * 5,878 airfields); a trade or a common noun by many ("port" by 18% of the synthetic table's
 * records, "cooperage" by 0.9%), and is no sign that the record is the one meant.
 */
const ATTESTED_MAX_SHARE = 0.005;
/**
 * Most entities carrying a short form's rarest word for which its words are checked to name one
 * entry alone ("Saint Helena": "helena" is carried by one name, which also holds "saint"); a
 * short form whose rarest word more carry is no name of one entry.
 */
const ALONE_MAX_CARRIERS = 20;
/** Longest stretch of mention text normalized: a 10,000-character "mention" is noise, not a name. */
const MAX_NAME_CHARS = 300;

/** One scored candidate, with everything the reasons and tuning need. */
export interface ScoredCandidate {
  entity: EntityRow;
  features: Features;
  score: number;
  paths: Set<CandidatePath>;
  name: NameMatch;
}

interface Analysis {
  p: Prepared;
  scored: ScoredCandidate[];
  decision: Decision;
}

interface Prepared {
  mention: Mention;
  info: LabelInfo;
  forms: MentionForm[];
  /** What the mention shares with others of the same text and label. */
  surface: Surface;
  /** The mention's context vector by KB term id (null: no context). */
  context: IdVector | null;
  /** Name words' context terms, as looked up (see CandidateWords.termOf). */
  wordTerms?: Map<string, TermInfo | null>;
  /** The values of the table's kind columns the context names (see KindValues). */
  contextKinds: number[] | null;
}

/**
 * What scoring asks of a candidate's words (WordEvidence): one object per linker, pointed at the
 * mention and the entity being scored before each call of nameMatch, which keeps no reference.
 */
class CandidateWords implements WordEvidence {
  p: Prepared | null = null;
  eid = 0;
  /** The class of the entity `eid`. */
  cls: EntityClass = "other";
  /** Most records that may carry an attested word (see ATTESTED_MAX_SHARE). */
  private readonly attestedMaxDf: number;
  /** The entity whose kind words `kinds` holds (0: none yet). */
  private kindsOf = 0;
  private kinds: KindWords = { words: new Set(), open: false };

  constructor(private readonly kb: Kb) {
    this.attestedMaxDf = Math.max(1, ATTESTED_MAX_SHARE * kb.info.entities);
  }

  attested(t: string): boolean {
    const info = this.termOf(t);
    return info !== null && info.df <= this.attestedMaxDf && this.kb.hot.hasTerm(this.eid, info.id);
  }

  unique(t: string): boolean {
    return this.kb.tokenDf(t) === 1;
  }

  labelFits(): boolean {
    const c = this.p!.info.compat;
    return c[this.cls] >= Math.max(c.person, c.organization, c.location, c.other);
  }

  alone(tokens: readonly string[]): boolean {
    if (tokens.length === 1) return this.unique(tokens[0]!);
    let rarest = tokens[0]!;
    let df = this.kb.tokenDf(rarest);
    for (const t of tokens) {
      const d = this.kb.tokenDf(t);
      if (d < df) {
        rarest = t;
        df = d;
      }
    }
    return this.noOtherCarrier(rarest, df, (eid) => this.kb.names.hasNameWithAll(eid, tokens));
  }

  soleBearer(t: string): boolean {
    return this.noOtherCarrier(
      t,
      this.kb.tokenDf(t),
      (eid) => this.kb.hot.classOf(eid) === "person" && this.kb.names.hasNameWithAll(eid, [t]),
    );
  }

  /**
   * True when no entity but this one, among the carriers of word `t` (carried by `df` entities'
   * names), satisfies `holds`; false when more than ALONE_MAX_CARRIERS carry it, or it is no
   * single word of the word index, since then the answer is not known.
   */
  private noOtherCarrier(t: string, df: number, holds: (eid: number) => boolean): boolean {
    if (df > ALONE_MAX_CARRIERS) return false;
    const words = ftsWords(t);
    if (words.length !== 1) return false;
    return !this.kb.hot.postings.someCarrier(
      words[0]!,
      ALONE_MAX_CARRIERS,
      (eid) => eid !== this.eid && holds(eid),
    );
  }

  carried(t: string): boolean {
    const info = this.termOf(t);
    return info !== null && this.kb.hot.hasTerm(this.eid, info.id);
  }

  separates(words: readonly string[], atStart: boolean): boolean {
    return separatesEntries(this.kb, words, atStart);
  }

  kind(t: string): boolean {
    if (this.kindsOf !== this.eid) {
      this.kindsOf = this.eid;
      this.kinds = kindWordsOf(this.kb, this.eid);
    }
    return this.kinds.words.has(t) || (this.kinds.open && PLACE_KIND_WORDS.has(t));
  }

  /** A name word's context term (stemmed) as the KB knows it, or null; kept per mention. */
  private termOf(word: string): TermInfo | null {
    const p = this.p!;
    p.wordTerms ??= new Map();
    let info = p.wordTerms.get(word);
    if (info === undefined) {
      const terms = contextTerms(word);
      const known = terms.length === 1 ? this.kb.termInfo(terms[0]!) : null;
      info = known !== null && known.id >= 0 ? known : null;
      p.wordTerms.set(word, info);
    }
    return info;
  }
}

/** True when two candidates' features are the same but for the prior (and prominence). */
function sameEvidenceButPrior(a: Features, b: Features): boolean {
  for (const f of FEATURE_NAMES) if (f !== "prior" && f !== "prominence" && a[f] !== b[f]) return false;
  return true;
}

const r4 = (x: number) => Math.round(x * 10000) / 10000;

export class Linker {
  readonly kb: Kb;
  readonly labels: LabelMap;
  readonly config: LinkConfig;
  readonly top: number;
  private readonly cand: CandidateOptions;
  private readonly blockMinCompat: number;
  private readonly idfOf: (t: string) => number;
  /** The prior feature of a prior in this KB (see priorFeatureFor). */
  private readonly priorOf: (prior: number) => number;
  /** Document-level evidence steps in force (all off when document evidence is disabled). */
  readonly documentSteps: DocumentEvidenceOptions;
  private readonly surfaces: SurfaceCache;
  /** The table's generic name words (src/score/table-words.ts). */
  private readonly genericWords: ReadonlySet<string>;
  /** The values of the table's kind columns (countries, counties), for contextConflict. */
  private readonly kindValues: KindValues;
  /** What scoring asks of a candidate's words (see CandidateWords). */
  private readonly candidateWords: CandidateWords;
  /** The KB's near-name rate once known (see nearNameRate). */
  private nearRate: number | undefined;

  constructor(kb: Kb, options: LinkerOptions = {}) {
    if (!(kb instanceof Kb)) throw new UsageError(`createLinker needs a KB from openKb, got ${String(kb)}`);
    checkOptionNames(options, kb.info.fingerprint);
    if (options.labels !== undefined && !(options.labels instanceof LabelMap))
      throw new UsageError("labels must be a LabelMap (readLabelMapFile reads one from a file)");
    this.kb = kb;
    this.labels = options.labels ?? new LabelMap();
    this.config = {
      weights: checkWeights(options.weights ?? DEFAULT_WEIGHTS),
      threshold: options.threshold ?? DEFAULT_THRESHOLD,
      minMargin: options.minMargin ?? DEFAULT_MIN_MARGIN,
    };
    checkDecision(this.config.threshold, this.config.minMargin);
    this.top = checkWhole("top", options.top ?? DEFAULT_TOP, 0);
    const settings = checkCandidateSettings(options.candidates);
    const paths = checkPaths(options.paths ?? settings.paths ?? ALL_PATHS);
    this.cand = {
      ...DEFAULT_CANDIDATE_OPTIONS,
      ...settings,
      ...(options.maxCandidates !== undefined ? { maxCandidates: options.maxCandidates } : {}),
      paths: new Set(paths),
    };
    checkCandidateOptions(this.cand);
    this.blockMinCompat = checkRange(
      "blockMinCompat",
      options.blockMinCompat ?? DEFAULT_BLOCK_MIN_COMPAT,
      0,
      1,
    );
    const document = checkDocumentOptions(options.document);
    this.documentSteps =
      document === false
        ? { sameText: false, shortForm: false, acronyms: false }
        : { ...DEFAULT_DOCUMENT_EVIDENCE, ...document };
    const cacheSize = checkWhole("surfaceCache", options.surfaceCache ?? DEFAULT_SURFACE_CACHE, 0);
    this.surfaces = new SurfaceCache(cacheSize, cacheSize * SURFACE_WEIGHT_EACH);
    const n = kb.info.contextDocs;
    this.idfOf = (t: string) => idf(kb.termDf(t), n);
    this.priorOf = priorFeatureFor(kb.info.maxPrior);
    this.genericWords = genericWordsOf(kb);
    this.kindValues = new KindValues(kb);
    this.candidateWords = new CandidateWords(kb);
  }

  /**
   * The KB's near-name rate (src/link/crowding.ts), the value of the nearSpelling feature for
   * names matched only by a near spelling. Measured on first use, once per open KB, at the
   * default settings whatever this linker's: it describes the table, not the configuration.
   */
  get nearNameRate(): number {
    if (this.nearRate === undefined) {
      this.nearRate = nearNameRateOf(this.kb, () => {
        const probe = new Linker(this.kb, { surfaceCache: 0 });
        probe.nearRate = 0; // the probe scores names as they are, without the rate it measures
        return measureNearNameRate(this.kb, (eid) => probe.nearSpellingLinksElsewhere(eid));
      });
    }
    return this.nearRate;
  }

  /**
   * Whether entity `eid`'s own name, looked up among the entities of its class, would pass the
   * threshold for another entity that is not spelled alike: a name near enough to another's to
   * link wrongly were the entity missing from the table.
   */
  private nearSpellingLinksElsewhere(eid: number): boolean {
    const e = this.kb.entity(eid);
    const cls = e.cls;
    const forms: MentionForm[] = [{ cls, norm: normalizeName(e.name, cls), compat: 1 }];
    const compat = Object.fromEntries(ENTITY_CLASSES.map((c) => [c, c === cls ? 1 : 0])) as Record<
      EntityClass,
      number
    >;
    const p: Prepared = {
      mention: { id: e.id, text: e.name },
      info: { cls, linkable: true, compat },
      forms,
      surface: { forms, own: undefined, pool: undefined, weight: 0, held: false },
      context: null,
      contextKinds: null,
    };
    return this.scorePrepared(p).some(
      (s) => s.entity.eid !== eid && !s.name.spelledAlike && s.score >= this.config.threshold,
    );
  }

  /** Number of (text, label) pairs the surface cache holds now (see LinkerOptions.surfaceCache). */
  get cachedSurfaces(): number {
    return this.surfaces.size;
  }

  private prepare(m: Mention): Prepared {
    if (!this.kb.db.open) throw new UsageError("the KB is closed: open it again to link");
    checkMention(m);
    const info = this.labels.forMention(m.type);
    const text = m.text.length > MAX_NAME_CHARS ? m.text.slice(0, MAX_NAME_CHARS) : m.text;
    // The label map is fixed for the linker's life, so the label's spelling stands for its info.
    const key = m.type === undefined ? `\u0000${text}` : `${m.type}\u0000${text}`;
    const surface = this.surfaces.get(key, () => {
      const forms: MentionForm[] = [];
      if (info.linkable) {
        // A mention given with another name ("X d/b/a Y"), or closed by a possessive ("Lumb's"),
        // is compared under both readings (see scoreOne).
        const alsoNamed = splitTradeName(text)?.alsoNamed;
        const bare = withoutPossessive(text);
        for (const cls of ENTITY_CLASSES) {
          const compat = info.compat[cls];
          if (compat < this.blockMinCompat) continue;
          forms.push({ cls, norm: normalizeName(text, cls), compat });
          if (alsoNamed !== undefined) forms.push({ cls, norm: normalizeName(alsoNamed, cls), compat });
          if (bare !== null)
            forms.push({ cls, norm: normalizeName(bare, cls), compat, possessiveDropped: true });
        }
      }
      return forms;
    });
    let context: IdVector | null = null;
    if (m.context !== undefined && m.context.trim() !== "") {
      // The mention's own words are left out: every candidate shares them, so they say nothing.
      surface.own ??= new Set(contextTerms(text));
      const own = surface.own;
      const terms = contextTerms(m.context).filter((t) => !own.has(t));
      if (terms.length > 0) {
        const v = buildVector(terms, this.idfOf);
        context = idVector(v, this.idfOf, (t) => this.kb.termInfo(t).id);
      }
    }
    const contextKinds =
      context === null || !this.kindValues.any ? null : this.kindValues.namedIn(context.ids);
    return { mention: m, info, forms: surface.forms, surface, context, contextKinds };
  }

  private scoreOne(p: Prepared, e: EntityRow, cls: EntityClass, paths: Set<CandidatePath>): ScoredCandidate {
    let best: ScoredCandidate | null = null;
    // Most mentions have one form per class; one given with another name, or closed by a
    // possessive, has two, and the better comparison counts.
    for (const form of p.forms) {
      if (form.cls !== cls) continue;
      const scored = this.scoreForm(p, form, e, paths);
      if (best === null || scored.score > best.score) best = scored;
    }
    return best ?? this.scoreForm(p, p.forms[0]!, e, paths);
  }

  private scoreForm(
    p: Prepared,
    form: MentionForm,
    e: EntityRow,
    paths: Set<CandidatePath>,
  ): ScoredCandidate {
    const words = this.candidateWords;
    words.p = p;
    words.eid = e.eid;
    words.cls = e.cls;
    const matched = nameMatch(form.norm, e, this.genericWords, words);
    const name =
      form.possessiveDropped === true
        ? {
            ...matched,
            exactKey: Math.min(matched.exactKey, ONE_SIDED_QUALIFIER_CREDIT),
            possessiveDropped: true,
          }
        : matched;
    const context = p.context === null ? 0 : this.kb.hot.contextCosine(p.context, e.eid);
    const f = features(
      name,
      context,
      p.info.compat[e.cls],
      this.priorOf(e.prior),
      this.nearNameRate,
      this.contextConflictOf(p, e.eid),
    );
    return { entity: e, features: f, score: combine(f, this.config.weights), paths, name };
  }

  /**
   * The prominence feature (see Features.prominence), which breaks a tie for first place: where
   * the best candidates match the mention exactly as well on every feature but the prior
   * (namesakes that the name, the type and the context cannot tell apart) and are firms, places or
   * things spelled as each of them is named (an exact key match, qualifiers and all), the most popular of them gets the log of
   * its lead over the next, and is rescored. Persons are left out: how often a man is named is no
   * evidence that a mention is of him rather than of his namesake.
   */
  private addProminence(scored: ScoredCandidate[]): void {
    if (scored.length < 2 || (this.config.weights.features.prominence ?? 0) === 0) return;
    let top = scored[0]!;
    for (const c of scored) if (c.score > top.score) top = c;
    if (top.entity.cls === "person" || top.features.exactKey < 1) return;
    // The tie for first place: its most popular member, and the next one's prior.
    let first: ScoredCandidate | null = null;
    let second = -1;
    for (const c of scored) {
      if (c !== top && !sameEvidenceButPrior(c.features, top.features)) continue;
      const prior = c.entity.prior;
      if (first === null || prior > first.entity.prior) {
        if (first !== null) second = Math.max(second, first.entity.prior);
        first = c;
      } else second = Math.max(second, prior);
    }
    if (first === null || second < 0 || first.entity.prior <= second) return;
    first.features.prominence = prominenceOf(first.entity.prior, second);
    first.score = combine(first.features, this.config.weights);
  }

  /** The contextConflict feature (see KindValues.conflict). */
  private contextConflictOf(p: Prepared, eid: number): number {
    return p.contextKinds === null ? 0 : this.kindValues.conflict(p.contextKinds, eid);
  }

  /**
   * The score's cheap part, used to choose among more candidates than maxCandidates: context,
   * type and prior as scored, and the share of the mention's words the entity's names carry in
   * place of the name features (weighted as token-set overlap).
   */
  private preRankFor(p: Prepared): PreRank {
    const w = this.config.weights.features;
    const hot = this.kb.hot;
    const ctx = p.context;
    // The type term of each class, by class code (hot.classCode).
    const typeTerm = ENTITY_CLASSES.map((c) => w.typeMatch * p.info.compat[c]);
    const priorOf = this.priorOf;
    return (eids, nameShare) => {
      const out = new Float64Array(eids.length);
      for (let i = 0; i < eids.length; i++) {
        const e = eids[i]!;
        out[i] =
          w.tokenSet * nameShare[i]! +
          (ctx === null ? 0 : w.context * hot.contextCosine(ctx, e)) +
          typeTerm[hot.classCode(e)]! +
          w.prior * priorOf(hot.prior[e]!);
      }
      return out;
    };
  }

  /**
   * Every generated candidate of a mention, scored, best first, in the shape of a link row's
   * `candidates` (table id, canonical name, score, features, the paths that found it), but all of
   * them and unrounded: the training data of tuning, or a look at what the decision weighed.
   */
  scoreCandidates(m: Mention): CandidateOut[] {
    return this.scorePrepared(this.prepare(m)).map((s) => ({
      entity: s.entity.id,
      name: s.entity.name,
      score: s.score,
      features: s.features,
      paths: [...s.paths],
    }));
  }

  private scorePrepared(p: Prepared): ScoredCandidate[] {
    if (p.forms.length === 0) return [];
    const raw = this.candidatesOf(p);
    const rows = this.kb.entities(raw.map((c) => c.eid));
    const out = raw.map((c, i) => this.scoreOne(p, rows[i]!, c.cls, c.paths));
    this.addProminence(out);
    return out.sort((a, b) => b.score - a.score || a.entity.eid - b.entity.eid);
  }

  /** Table ids of every generated candidate (for measuring pairs completeness). */
  candidateIds(m: Mention): string[] {
    const p = this.prepare(m);
    if (p.forms.length === 0) return [];
    const raw = this.candidatesOf(p);
    return this.kb.entities(raw.map((c) => c.eid)).map((e) => e.id);
  }

  /** The mention's candidates: its surface's pool (gathered once per surface), cut for its context. */
  private candidatesOf(p: Prepared): RawCandidate[] {
    const s = p.surface;
    if (s.pool === undefined) {
      s.pool = gatherPool(this.kb, p.forms, this.cand);
      this.surfaces.grow(s, s.pool.eids.length);
    }
    return cutPool(this.kb, s.pool, this.cand, this.preRankFor(p));
  }

  private analyze(m: Mention): Analysis {
    const p = this.prepare(m);
    const scored = this.scorePrepared(p);
    const decision = decide(
      scored.map((s) => s.score),
      this.config.threshold,
      this.config.minMargin,
    );
    return { p, scored, decision };
  }

  /** Link one mention on its own (no document-level evidence). */
  link(m: Mention): LinkRow {
    return this.rowFor(this.analyze(m));
  }

  /**
   * Link the mentions of one document together: each is analyzed alone, then the document-level
   * steps revise the decisions. Rows come back in input order, one per mention.
   */
  linkDocument(mentions: readonly Mention[]): LinkRow[] {
    if (!Array.isArray(mentions))
      throw new UsageError(`linkDocument needs an array of mentions, got ${String(mentions)}`);
    const analyses = mentions.map((m) => this.analyze(m));
    const steps = this.documentSteps;
    if (mentions.length < 2 || !(steps.sameText || steps.shortForm || steps.acronyms)) {
      return analyses.map((a) => this.rowFor(a));
    }
    // A mention with no form to compare (a label not linked, or compatible with no class) is NIL
    // whatever the document says: it takes no part in the evidence, lending or receiving.
    const taking = analyses.flatMap((a, i) => (a.p.forms.length > 0 ? [i] : []));
    const items: DocItem[] = taking.map((i) => {
      const a = analyses[i]!;
      const form = a.p.forms.find((f) => f.cls === a.p.info.cls) ?? a.p.forms[0]!;
      return {
        mention: a.p.mention,
        key: form.norm.key,
        cls: form.cls,
        tokens: form.norm.tokens,
        scored: a.scored,
        chosen: a.decision.outcome === "link" ? a.scored[a.decision.chosen]! : null,
        scoreEntity: (e: EntityRow) => this.scoreOne(a.p, e, form.cls, new Set(["document"])),
      };
    });
    const overrides = new Map<number, DocOverride>();
    for (const [k, o] of documentEvidence(items, steps, this.config)) overrides.set(taking[k]!, o);
    return analyses.map((a, i) => this.rowFor(a, overrides.get(i)));
  }

  /**
   * The baseline: score every entity of every class the mention may be, no blocking. Slow by
   * design; benchmarks compare candidate generation against it.
   */
  bruteForce(m: Mention): LinkRow {
    return this.bruteForceMany([m])[0]!;
  }

  /**
   * The baseline for many mentions at once: the table is read once per class and every entity is
   * scored against every mention that may be of that class; each mention keeps its best
   * maxCandidates. Same result as calling bruteForce on each, a table scan instead of one per mention.
   */
  bruteForceMany(mentions: readonly Mention[]): LinkRow[] {
    const keep = this.cand.maxCandidates;
    const prepared = mentions.map((m) => this.prepare(m));
    const best: ScoredCandidate[][] = prepared.map(() => []);
    for (const cls of ENTITY_CLASSES) {
      const takers = prepared
        .map((p, i) => [p, i] as const)
        .filter(([p]) => p.forms.some((f) => f.cls === cls));
      if (takers.length === 0) continue;
      for (const e of this.kb.entityRowsOfClass(cls)) {
        for (const [p, i] of takers) {
          const list = best[i]!;
          list.push(this.scoreOne(p, e, cls, new Set()));
          // Prune now and then: memory stays flat however large the class is.
          if (list.length >= 4 * keep) best[i] = bestOf(list, keep);
        }
      }
    }
    return prepared.map((p, i) => {
      const scored = bestOf(best[i]!, keep);
      const decision = decide(
        scored.map((s) => s.score),
        this.config.threshold,
        this.config.minMargin,
      );
      return this.rowFor({ p, scored, decision });
    });
  }

  /**
   * Link a stream of mentions, in order, one row each. Consecutive mentions of the same `doc`
   * are linked together with document-level evidence (up to MAX_DOCUMENT_MENTIONS at a time);
   * mentions without a `doc` are linked alone. Memory is bounded by one document.
   */
  async *linkAll(mentions: Iterable<Mention> | AsyncIterable<Mention>): AsyncGenerator<LinkRow> {
    checkMentionSource("linkAll", mentions);
    for await (const unit of mentionUnits(mentions)) yield* this.linkUnit(unit);
  }

  /** Link one unit of mentionUnits (src/link/units.ts): a mention alone, or one document's run. */
  linkUnit(unit: MentionUnit): LinkRow[] {
    return isDocumentUnit(unit) ? this.linkDocument(unit) : unit.map((m) => this.link(m));
  }

  private rowFor(a: Analysis, override?: DocOverride): LinkRow {
    const { p, scored } = a;
    const m = p.mention;
    const reasons: Reason[] = [];
    const base = {
      mention: m.id,
      text: m.text,
      type: m.type ?? null,
      ...(m.doc !== undefined ? { doc: m.doc } : {}),
      ...(m.start !== undefined ? { start: m.start } : {}),
      ...(m.end !== undefined ? { end: m.end } : {}),
      ...(m.sentence !== undefined ? { sentence: m.sentence } : {}),
      ...(m.tokenStart !== undefined ? { tokenStart: m.tokenStart } : {}),
      ...(m.tokenEnd !== undefined ? { tokenEnd: m.tokenEnd } : {}),
    };
    if (!p.info.linkable) {
      reasons.push({
        code: "not-linkable",
        message: `label ${m.type} marks a value (date, number, amount), not an entity`,
        label: m.type,
      });
      return { ...base, entity: null, name: null, score: 0, margin: 0, reasons, candidates: [] };
    }
    const d = a.decision;
    const label = (s: ScoredCandidate | null) =>
      s === null ? null : { entity: s.entity.id, name: s.entity.name };
    if (override !== undefined) return this.overrideRow(a, override, base);
    const best = d.best >= 0 ? scored[d.best]! : null;
    const runner = scored.length > 1 ? scored[1]! : null;
    reasons.push(decisionReason(d, this.config.threshold, this.config.minMargin, label(best), label(runner)));
    if (best !== null) reasons.push(...this.evidenceFor(p, best, d.outcome === "link" ? runner : null));
    const candidates = this.candidatesOut(scored);
    const chosen = d.outcome === "link" ? best : null;
    return {
      ...base,
      entity: chosen?.entity.id ?? null,
      name: chosen?.entity.name ?? null,
      ...(chosen ? { attributes: chosen.entity.attributes } : {}),
      score: r4(d.bestScore),
      margin: r4(d.margin),
      reasons,
      candidates,
    };
  }

  /** Reasons about the evidence for the chosen (or best) candidate, and the runner-up when given. */
  private evidenceFor(p: Prepared, c: ScoredCandidate, runner: ScoredCandidate | null): Reason[] {
    const m = p.mention;
    const out = evidenceReasons({
      entity: c.entity.id,
      name: c.entity.name,
      features: c.features,
      name_: c.name,
      paths: c.paths,
      sharedTerms: this.sharedTerms(p, c.entity),
      contextKinds: () => this.kindValues.textsOf(p.contextKinds ?? []),
      entityType: () => c.entity.type,
      // An unknown label is compared at a neutral weight (and warned about), not a mismatch.
      mentionType: this.labels.knows(m.type) ? (m.type ?? null) : null,
    });
    if (runner !== null) {
      out.push({
        code: "runner-up",
        message: `next best ${runner.entity.id} "${runner.entity.name}" scored ${r4(runner.score)}`,
        entity: runner.entity.id,
        score: r4(runner.score),
      });
    }
    return out;
  }

  /** Context words the mention shares with the entity, heaviest first (for the reasons). */
  private sharedTerms(p: Prepared, e: EntityRow): string[] {
    const out: string[] = [];
    if (p.context !== null) this.kb.hot.contextCosine(p.context, e.eid, out);
    return out;
  }

  private candidatesOut(scored: readonly ScoredCandidate[]): CandidateOut[] {
    return scored.slice(0, this.top).map((s) => ({
      entity: s.entity.id,
      name: s.entity.name,
      score: r4(s.score),
      features: roundFeaturesOf(s.features),
      paths: [...s.paths],
    }));
  }

  /** A row whose decision document-level evidence made: the document reason first, then the evidence. */
  private overrideRow(
    a: Analysis,
    o: DocOverride,
    base: Omit<LinkRow, "entity" | "name" | "score" | "margin" | "reasons" | "candidates">,
  ): LinkRow {
    const chosen = o.chosen;
    const runner = a.scored.find((s) => s.entity.eid !== chosen.entity.eid);
    const reasons: Reason[] = [o.reason, ...this.evidenceFor(a.p, chosen, runner ?? null)];
    const listed = a.scored.some((s) => s.entity.eid === chosen.entity.eid)
      ? a.scored
      : [chosen, ...a.scored];
    return {
      ...base,
      entity: chosen.entity.id,
      name: chosen.entity.name,
      attributes: chosen.entity.attributes,
      score: r4(chosen.score),
      margin: r4(marginOver(chosen.score, runner?.score)),
      reasons,
      candidates: this.candidatesOut([...listed].sort((x, y) => y.score - x.score)),
    };
  }
}

/** The k best candidates, best first (ties by table order). */
function bestOf(scored: ScoredCandidate[], k: number): ScoredCandidate[] {
  return scored.sort((a, b) => b.score - a.score || a.entity.eid - b.entity.eid).slice(0, k);
}

function roundFeaturesOf(f: Features): Features {
  const out = { ...f };
  for (const k of Object.keys(out) as Array<keyof Features>) out[k] = r4(out[k]);
  return out;
}

export function createLinker(kb: Kb, options?: LinkerOptions): Linker {
  return new Linker(kb, options);
}
