/**
 * Blocking and candidate generation. For each class a mention may belong to, several paths look
 * for entities, each recorded on the candidate:
 * - exact: the mention's normalized key equals an alias key (same class);
 * - ocr: the OCR-folded keys are equal;
 * - acronym: the mention reads as an acronym ("S.G.E.", "SGE") of an alias, or an alias is one;
 * - initials: "J. H. Aldous" meets every alias of the form "j... aldous";
 * - fts: FTS5 token search over alias tokens (escaped terms only), best BM25 first;
 * - fuzzy: tokens unknown to the table are corrected through one-deletion variants of the table's
 *   vocabulary (edit distance <= 2) and searched again.
 * The candidate list is capped; precise paths come first.
 */
import { distance } from "fastest-levenshtein";
import { deletionVariants, FUZZY_MIN_TOKEN_LENGTH } from "../kb/deletions.js";
import type { Kb } from "../kb/kb.js";
import type { NormalizedName } from "../normalize/name.js";
import type { CandidatePath, EntityClass } from "../types.js";

export interface CandidateOptions {
  /** Most candidates kept per mention (after merging paths). Default 30. */
  maxCandidates: number;
  /** FTS5 rows read per query. Default 50. */
  ftsLimit: number;
  /**
   * Tokens found in more aliases than this are left out of the FTS query: they cost the most to
   * rank and say the least (a common given name). Default 5,000.
   */
  ftsMaxDf: number;
  /** Largest edit distance accepted for a fuzzy token correction. Default 2. */
  fuzzyMaxEdits: number;
  /** Corrections kept per unknown token (closest first, then most frequent). Default 3. */
  fuzzyMaxCorrections: number;
  /** Paths that run; default all. Turning one off is how their value is measured. */
  paths: ReadonlySet<CandidatePath>;
}

export const ALL_PATHS: readonly CandidatePath[] = ["exact", "ocr", "acronym", "initials", "fts", "fuzzy"];

export const DEFAULT_CANDIDATE_OPTIONS: CandidateOptions = {
  maxCandidates: 30,
  ftsLimit: 50,
  ftsMaxDf: 5000,
  fuzzyMaxEdits: 2,
  fuzzyMaxCorrections: 3,
  paths: new Set(ALL_PATHS),
};

/** Paths that match a whole key: their hits outrank token-search hits when the list is capped. */
const PRECISE_PATHS: ReadonlySet<CandidatePath> = new Set(["exact", "acronym", "initials", "ocr"]);
/** Shortest token worth an FTS term: single letters are initials, matched by the initials path. */
const MIN_FTS_TOKEN_LENGTH = 2;

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
}

export function generateCandidates(
  kb: Kb,
  forms: readonly MentionForm[],
  opts: CandidateOptions,
): RawCandidate[] {
  const found = new Map<number, RawCandidate>();
  let order = 0;
  const add = (eid: number, cls: EntityClass, path: CandidatePath) => {
    const c = found.get(eid);
    if (c) c.paths.add(path);
    else found.set(eid, { eid, cls, paths: new Set([path]), rank: order++ });
  };
  const classes = new Set(forms.map((f) => f.cls));
  const on = opts.paths;

  for (const { cls, norm } of forms) {
    if (norm.key === "") continue;
    if (on.has("exact")) for (const eid of kb.lookupKey(norm.key, cls, "exact")) add(eid, cls, "exact");
    if (on.has("acronym") && norm.acronym !== null) {
      for (const eid of kb.lookupKey(norm.acronym, cls, "acronym")) add(eid, cls, "acronym");
    }
    if (on.has("initials") && norm.initialsKey !== null && norm.tokens[0]!.length === 1) {
      for (const eid of kb.lookupKey(norm.initialsKey, cls, "initials")) add(eid, cls, "initials");
    }
    if (on.has("ocr") && norm.ocrKey !== "")
      for (const eid of kb.lookupKey(norm.ocrKey, cls, "ocr")) add(eid, cls, "ocr");
  }

  // Token search runs once over the union of the forms' tokens; hits of a class the mention cannot be are dropped.
  const tokens = new Set<string>();
  for (const f of forms) for (const t of f.norm.tokens) tokens.add(t);
  const known: string[] = [];
  const unknown: string[] = [];
  for (const t of tokens) {
    if (t.length < MIN_FTS_TOKEN_LENGTH) continue;
    const df = kb.tokenDf(t);
    if (df === 0) unknown.push(t);
    else if (df <= opts.ftsMaxDf) known.push(t);
  }
  if (on.has("fts") && known.length > 0) {
    for (const hit of kb.searchAliases(known, opts.ftsLimit))
      if (classes.has(hit.cls)) add(hit.eid, hit.cls, "fts");
  }
  if (on.has("fuzzy") && unknown.length > 0) {
    const corrected = new Map<string, string[]>();
    for (const t of unknown) {
      const fixes = correctToken(kb, t, opts);
      if (fixes.length > 0) corrected.set(t, fixes);
    }
    if (corrected.size > 0) {
      const terms = [...known];
      for (const fixes of corrected.values())
        for (const f of fixes) if (kb.tokenDf(f) <= opts.ftsMaxDf) terms.push(f);
      for (const hit of kb.searchAliases(terms, opts.ftsLimit))
        if (classes.has(hit.cls)) add(hit.eid, hit.cls, "fuzzy");
      // The best correction of every token, as a whole key.
      for (const { cls, norm } of forms) {
        const key = norm.tokens.map((t) => corrected.get(t)?.[0] ?? t).join(" ");
        if (key !== norm.key) for (const eid of kb.lookupKey(key, cls, "exact")) add(eid, cls, "fuzzy");
      }
    }
  }

  const all = [...found.values()];
  const isPrecise = (c: RawCandidate) => [...c.paths].some((p) => PRECISE_PATHS.has(p));
  all.sort(
    (a, b) => Number(isPrecise(b)) - Number(isPrecise(a)) || b.paths.size - a.paths.size || a.rank - b.rank,
  );
  if (all.length <= opts.maxCandidates) return all;
  // Too many: precise hits beyond the cap are chosen by popularity (many entities share one full name).
  const precise = all.filter(isPrecise);
  if (precise.length >= opts.maxCandidates) {
    return precise
      .sort((a, b) => kb.entity(b.eid).prior - kb.entity(a.eid).prior || a.rank - b.rank)
      .slice(0, opts.maxCandidates);
  }
  return all.slice(0, opts.maxCandidates);
}

/** Table tokens within `fuzzyMaxEdits` of an unknown token, closest first, then most frequent. */
export function correctToken(kb: Kb, token: string, opts: CandidateOptions): string[] {
  if (token.length < FUZZY_MIN_TOKEN_LENGTH) return [];
  const seen = new Map<string, number>();
  for (const v of deletionVariants(token)) {
    for (const t of kb.tokensForVariant(v)) {
      if (seen.has(t)) continue;
      const d = distance(token, t);
      if (d <= opts.fuzzyMaxEdits) seen.set(t, d);
    }
  }
  return [...seen.entries()]
    .sort((a, b) => a[1] - b[1] || kb.tokenDf(b[0]) - kb.tokenDf(a[0]) || (a[0] < b[0] ? -1 : 1))
    .slice(0, opts.fuzzyMaxCorrections)
    .map(([t]) => t);
}
