/**
 * Span alignment: when the gold mentions carry `doc`, `start`, `end` and the predicted rows came
 * from another NER run, pair each predicted row with the gold mention it covers.
 *
 * Spans are half-open character ranges [start, end). A mention without `doc` belongs to the
 * unnamed document "" (single-document input).
 * - `strict`: same document and identical boundaries;
 * - `relaxed`: same document and overlapping spans; one-to-one, built greedily by overlap length
 *   (longest first), ties broken by the earliest gold start, then the earliest predicted start,
 *   then input order.
 * Unmatched gold mentions count as missed links when their gold is non-NIL; unmatched predicted
 * rows count as false links when they carry an entity. Both are reported separately.
 */
import type { LabeledMention, LinkRow } from "../types.js";
import { InputError } from "../util/errors.js";
import { type EvalPair, type EvalReport, type EvaluateOptions, evaluate, f1, ratio } from "./metrics.js";

export type AlignMode = "strict" | "relaxed";

export interface AlignOptions {
  /** `strict` (same boundaries) or `relaxed` (overlap). Default `strict`. */
  mode?: AlignMode;
  /** File name the gold mentions came from, for error messages when a mention has no `source`. Default "(gold)". */
  goldFile?: string;
  /** File name the predicted rows came from, for error messages. Default "(predicted)". */
  predictedFile?: string;
}

export interface Alignment {
  mode: AlignMode;
  /** Matched pairs, in gold input order. */
  pairs: Array<{ gold: LabeledMention; predicted: LinkRow }>;
  /** Gold mentions no predicted span matched, in input order. */
  unmatchedGold: LabeledMention[];
  /** Predicted rows that matched no gold span, in input order. */
  unmatchedPredicted: LinkRow[];
  /** Unmatched gold mentions whose gold is non-NIL: missed links. */
  missedLinks: number;
  /** Unmatched predicted rows that carry an entity: false links. */
  falseLinks: number;
}

interface Span {
  doc: string;
  start: number;
  end: number;
  index: number;
}

function checkOffset(
  value: unknown,
  field: string,
  where: { file: string; line?: number | undefined },
): number {
  if (value === undefined || value === null)
    throw new InputError(
      { ...where, field },
      "is missing: span alignment (--predicted) needs start and end offsets on every row, gold and predicted; rows without spans are scored by linking the gold mentions (eval without --predicted)",
    );
  if (typeof value !== "number" || !Number.isInteger(value) || value < 0)
    throw new InputError(
      { ...where, field },
      `span alignment needs a non-negative integer offset, got ${JSON.stringify(value)}`,
    );
  return value;
}

function spanOf(
  m: { doc?: string | undefined; start?: number | undefined; end?: number | undefined },
  index: number,
  where: { file: string; line?: number | undefined },
): Span {
  const start = checkOffset(m.start, "start", where);
  const end = checkOffset(m.end, "end", where);
  if (end <= start)
    throw new InputError({ ...where, field: "end" }, `end (${end}) must be greater than start (${start})`);
  return { doc: m.doc ?? "", start, end, index };
}

function overlap(a: Span, b: Span): number {
  return Math.min(a.end, b.end) - Math.max(a.start, b.start);
}

export function alignSpans(
  gold: readonly LabeledMention[],
  predicted: readonly LinkRow[],
  opts: AlignOptions = {},
): Alignment {
  const mode = opts.mode ?? "strict";
  const goldFile = opts.goldFile ?? "(gold)";
  const predictedFile = opts.predictedFile ?? "(predicted)";
  const goldSpans = gold.map((m, i) => spanOf(m, i, m.source ?? { file: goldFile, line: i + 1 }));
  const predSpans = predicted.map((r, i) => spanOf(r, i, { file: predictedFile, line: i + 1 }));

  const goldTaken = new Array<number>(gold.length).fill(-1);
  const predTaken = new Array<boolean>(predicted.length).fill(false);

  if (mode === "strict") {
    const byKey = new Map<string, number[]>();
    for (const p of predSpans) {
      const key = JSON.stringify([p.doc, p.start, p.end]);
      const list = byKey.get(key);
      if (list) list.push(p.index);
      else byKey.set(key, [p.index]);
    }
    for (const g of goldSpans) {
      const list = byKey.get(JSON.stringify([g.doc, g.start, g.end]));
      const p = list?.shift();
      if (p !== undefined) {
        goldTaken[g.index] = p;
        predTaken[p] = true;
      }
    }
  } else {
    const predByDoc = new Map<string, Span[]>();
    for (const p of predSpans) {
      const list = predByDoc.get(p.doc);
      if (list) list.push(p);
      else predByDoc.set(p.doc, [p]);
    }
    const candidates: Array<{ g: Span; p: Span; overlap: number }> = [];
    for (const g of goldSpans) {
      for (const p of predByDoc.get(g.doc) ?? []) {
        const o = overlap(g, p);
        if (o > 0) candidates.push({ g, p, overlap: o });
      }
    }
    candidates.sort(
      (a, b) =>
        b.overlap - a.overlap ||
        a.g.start - b.g.start ||
        a.p.start - b.p.start ||
        a.g.index - b.g.index ||
        a.p.index - b.p.index,
    );
    for (const c of candidates) {
      if (goldTaken[c.g.index]! >= 0 || predTaken[c.p.index]) continue;
      goldTaken[c.g.index] = c.p.index;
      predTaken[c.p.index] = true;
    }
  }

  const pairs: Alignment["pairs"] = [];
  const unmatchedGold: LabeledMention[] = [];
  gold.forEach((m, i) => {
    const p = goldTaken[i]!;
    if (p >= 0) pairs.push({ gold: m, predicted: predicted[p]! });
    else unmatchedGold.push(m);
  });
  const unmatchedPredicted = predicted.filter((_, i) => !predTaken[i]);
  return {
    mode,
    pairs,
    unmatchedGold,
    unmatchedPredicted,
    missedLinks: unmatchedGold.filter((m) => m.gold !== null).length,
    falseLinks: unmatchedPredicted.filter((r) => r.entity !== null).length,
  };
}

/** An evaluation over aligned spans, with the span-level figures beside it. */
export interface AlignedEvalReport extends EvalReport {
  alignment: {
    mode: AlignMode;
    matched: number;
    unmatchedGold: number;
    unmatchedPredicted: number;
    /** Unmatched non-NIL gold mentions (already inside `overall` as missed links). */
    missedLinks: number;
    /** Unmatched predicted links (not inside `overall`, which counts gold mentions only). */
    falseLinks: number;
    /** Link precision, recall and F1 counting the unmatched predicted links as false links too. */
    endToEnd: { linkPrecision: number; linkRecall: number; linkF1: number };
  };
}

/**
 * Evaluate an alignment: matched pairs plus unmatched gold mentions (as predicted NIL, so a
 * non-NIL one is a missed link); unmatched predicted links are added to the end-to-end figures.
 */
export function evaluateAligned(alignment: Alignment, opts: EvaluateOptions = {}): AlignedEvalReport {
  const pairs: EvalPair[] = [
    ...alignment.pairs,
    ...alignment.unmatchedGold.map((gold) => ({ gold, predicted: null })),
  ];
  const report = evaluate(pairs, opts);
  const o = report.overall;
  const linkPrecision = ratio(o.correctLinks, o.predictedLinks + alignment.falseLinks);
  const linkRecall = o.linkRecall;
  return {
    ...report,
    alignment: {
      mode: alignment.mode,
      matched: alignment.pairs.length,
      unmatchedGold: alignment.unmatchedGold.length,
      unmatchedPredicted: alignment.unmatchedPredicted.length,
      missedLinks: alignment.missedLinks,
      falseLinks: alignment.falseLinks,
      endToEnd: { linkPrecision, linkRecall, linkF1: f1(linkPrecision, linkRecall) },
    },
  };
}
