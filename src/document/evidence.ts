/**
 * Document-level evidence: a mention is easier to resolve inside its document than alone. Three
 * steps, each with its own reason code and switch, revise the per-mention decisions of one
 * document (the per-mention scores themselves are never changed):
 *
 * (a) `doc-same-text`: mentions with the same normalized text and class are decided together:
 *     the entity with the best mean score over the group is given to the members left NIL on
 *     their own, unless a member's own context clearly points elsewhere (its own best beats the
 *     group's entity by more than CONFLICT_MARGIN); a member linked on its own keeps its link.
 * (b) `doc-short-form`: a short form (a surname alone, a firm without its legal form, a town
 *     without its qualifier) whose tokens are all in a fuller mention earlier in the document
 *     takes that mention's entity, unless its own best candidate clearly beats it.
 * (c) `doc-acronym`: an acronym defined in the document ("Stenning Grain Exchange (S.G.E.)")
 *     resolves later uses of it to the entity of the defining mention.
 */
import { marginOver } from "../decide/decide.js";
import type { EntityRow } from "../kb/kb.js";
import type { ScoredCandidate } from "../link/linker.js";
import { acronymOfTokens, readAcronym } from "../normalize/name.js";
import type { Mention, Reason } from "../types.js";

export interface DocumentEvidenceOptions {
  /** (a) Decide same-text mentions of a document together. Default true. */
  sameText: boolean;
  /** (b) Resolve short forms to a fuller earlier mention's entity. Default true. */
  shortForm: boolean;
  /** (c) Resolve acronyms defined in the document. Default true. */
  acronyms: boolean;
}

export const DEFAULT_DOCUMENT_EVIDENCE: DocumentEvidenceOptions = Object.freeze({
  sameText: true,
  shortForm: true,
  acronyms: true,
});

/**
 * How much a mention's own best candidate must beat the document's choice to keep its own
 * decision: a clear conflict of evidence, not a small difference in context words.
 */
export const CONFLICT_MARGIN = 0.3;
/**
 * Lowest score of the fuller mention's entity for a short form to take it: token containment is
 * the evidence; the floor only keeps out entities of an incompatible type.
 */
export const SHORT_FORM_MIN_SCORE = 0.02;

/** One mention of the document as the linker saw it. */
export interface DocItem {
  mention: Mention;
  /** Normalized key and tokens under the mention's own class. */
  key: string;
  cls: string;
  tokens: string[];
  /** Every candidate, scored, best first. */
  scored: ScoredCandidate[];
  /** The mention's own decision (null: NIL). */
  chosen: ScoredCandidate | null;
  /** Scores any entity for this mention (used when the document's entity was not a candidate). */
  scoreEntity(e: EntityRow): ScoredCandidate;
}

export interface DocOverride {
  chosen: ScoredCandidate;
  reason: Reason;
}

const r3 = (x: number) => Math.round(x * 1000) / 1000;

function scoreFor(item: DocItem, e: EntityRow): ScoredCandidate {
  return item.scored.find((s) => s.entity.eid === e.eid) ?? item.scoreEntity(e);
}

/** True when the item's own best candidate clearly beats `s` (the document's candidate for it). */
function conflicts(item: DocItem, s: ScoredCandidate): boolean {
  const own = item.scored[0];
  return own !== undefined && own.entity.eid !== s.entity.eid && own.score - s.score > CONFLICT_MARGIN;
}

export function documentEvidence(
  items: readonly DocItem[],
  options: DocumentEvidenceOptions,
  decision: { threshold: number; minMargin: number },
): Map<number, DocOverride> {
  const out = new Map<number, DocOverride>();
  const current = (i: number): ScoredCandidate | null => out.get(i)?.chosen ?? items[i]!.chosen;

  if (options.sameText) sameText(items, decision, out);

  const acronyms = new Map<string, { entity: EntityRow; index: number; text: string }>();
  for (let i = 0; i < items.length; i++) {
    const item = items[i]!;
    if (options.acronyms) {
      const acr = readAcronym(item.mention.text);
      const def = acr === null ? undefined : acronyms.get(acr);
      if (def !== undefined && current(i)?.entity.eid !== def.entity.eid) {
        const s = scoreFor(item, def.entity);
        if (s.features.typeMatch > 0) {
          out.set(i, {
            chosen: s,
            reason: {
              code: "doc-acronym",
              message: `"${item.mention.text}" is defined in this document as the acronym of "${def.text}" (${def.entity.id})`,
              definedBy: items[def.index]!.mention.id,
              acronym: acr,
            },
          });
        }
      }
    }
    if (options.shortForm && item.tokens.length > 0) {
      const mine = current(i);
      for (let j = i - 1; j >= 0; j--) {
        const fuller = items[j]!;
        const theirs = current(j);
        if (theirs === null || fuller.tokens.length <= item.tokens.length) continue;
        if (!item.tokens.every((t) => fuller.tokens.includes(t))) continue;
        if (mine?.entity.eid === theirs.entity.eid) break;
        const s = scoreFor(item, theirs.entity);
        if (s.score >= SHORT_FORM_MIN_SCORE && !conflicts(item, s)) {
          out.set(i, {
            chosen: s,
            reason: {
              code: "doc-short-form",
              message: `short form of "${fuller.mention.text}" earlier in this document, linked to ${theirs.entity.id}`,
              fuller: fuller.mention.id,
              fullerText: fuller.mention.text,
              score: r3(s.score),
            },
          });
        }
        break;
      }
    }
    // Definitions are recorded after this mention is resolved, so later uses can rely on them.
    const resolved = current(i);
    if (options.acronyms && resolved !== null) {
      for (const acr of definedAcronyms(item))
        acronyms.set(acr, { entity: resolved.entity, index: i, text: item.mention.text });
    }
  }
  return out;
}

/** (a) Same normalized text and class: choose together by mean score. */
function sameText(
  items: readonly DocItem[],
  decision: { threshold: number; minMargin: number },
  out: Map<number, DocOverride>,
): void {
  const groups = new Map<string, number[]>();
  items.forEach((item, i) => {
    if (item.key === "") return;
    const k = `${item.cls}\u0000${item.key}`;
    const g = groups.get(k);
    if (g) g.push(i);
    else groups.set(k, [i]);
  });
  for (const members of groups.values()) {
    if (members.length < 2) continue;
    const totals = new Map<number, { entity: EntityRow; sum: number }>();
    for (const i of members) {
      for (const s of items[i]!.scored) {
        const t = totals.get(s.entity.eid);
        if (t) t.sum += s.score;
        else totals.set(s.entity.eid, { entity: s.entity, sum: s.score });
      }
    }
    const ranked = [...totals.values()].sort((a, b) => b.sum - a.sum || a.entity.eid - b.entity.eid);
    const best = ranked[0];
    if (best === undefined) continue;
    const mean = best.sum / members.length;
    // Margin in log-odds, as for single mentions (src/decide/decide.ts).
    const margin = marginOver(mean, ranked[1] ? ranked[1].sum / members.length : undefined);
    if (mean < decision.threshold || margin < decision.minMargin) continue;
    for (const i of members) {
      const item = items[i]!;
      const s = scoreFor(item, best.entity);
      // A mention that links to another entity on its own evidence keeps it: its context conflicts.
      if (item.chosen !== null || conflicts(item, s)) continue;
      out.set(i, {
        chosen: s,
        reason: {
          code: "doc-same-text",
          message: `decided with ${members.length - 1} other mention(s) of the same text in this document (mean score ${r3(mean)})`,
          mentions: members.length,
          meanScore: r3(mean),
        },
      });
    }
  }
}

/** Acronyms the item's context defines for it: `<mention text> (ACR)` whose letters fit the name. */
export function definedAcronyms(item: DocItem): string[] {
  const ctx = item.mention.context;
  if (ctx === undefined || ctx === "") return [];
  const found: string[] = [];
  let from = 0;
  for (;;) {
    const at = ctx.indexOf(item.mention.text, from);
    if (at < 0) break;
    from = at + item.mention.text.length;
    const m = /^\s*\(\s*["'\u201c]?([^()"'\u201d]{2,12}?)["'\u201d]?\s*\)/u.exec(ctx.slice(from));
    if (m === null) continue;
    const acr = readAcronym(m[1]!);
    if (acr !== null && acronymFits(acr, item.tokens)) found.push(acr);
  }
  return found;
}

/** The acronym spells the name's initials (joiner words optional), or at least starts like it. */
function acronymFits(acr: string, tokens: readonly string[]): boolean {
  const initials = acronymOfTokens(tokens);
  const all = tokens.map((t) => t[0]).join("");
  return acr === initials || acr === all || (acr[0] === initials[0] && acr.length <= tokens.length + 1);
}
