import { readFileSync } from "node:fs";
/**
 * Pure bookkeeping of the benchmark measurements: link quality counts and the targets the
 * figures are reported against.
 */

import type { LabeledMention, LinkRow } from "../src/types.js";

/**
 * The targets every run reports against (they are set for N = 1,000,000 entities; smaller runs
 * print them too, for comparison).
 */
export const TARGETS = {
  /** Index build throughput, entities per second. */
  buildEntitiesPerSecond: 50_000,
  /** Linking throughput on one thread, mentions per second. */
  linkMentionsPerSecond: 10_000,
  /** Pairs completeness of candidate generation relative to the brute-force baseline's. */
  completenessRatio: 0.98,
  /** Peak resident set size while linking, MiB. */
  linkPeakRssMb: 400,
  /** Table size the targets are stated for. */
  atEntities: 1_000_000,
} as const;

/** Precision, recall and F1 of link decisions against gold (NIL decisions are not "links"). */
export interface LinkQuality {
  /** Mentions whose gold is an entity. */
  goldLinks: number;
  /** Mentions the linker linked to some entity. */
  predictedLinks: number;
  /** Mentions linked to their gold entity. */
  correctLinks: number;
  /** NIL mentions the linker left NIL. */
  correctNil: number;
  precision: number;
  recall: number;
  f1: number;
  /** Share of all mentions decided right (right entity, or NIL for NIL). */
  accuracy: number;
}

/** Counts link decisions against gold, mention by mention (rows and gold in the same order). */
export class QualityCounter {
  private goldLinks = 0;
  private predictedLinks = 0;
  private correctLinks = 0;
  private correctNil = 0;
  private total = 0;

  add(gold: string | null, row: Pick<LinkRow, "entity">): void {
    this.total++;
    if (gold !== null) this.goldLinks++;
    if (row.entity !== null) this.predictedLinks++;
    if (gold !== null && row.entity === gold) this.correctLinks++;
    if (gold === null && row.entity === null) this.correctNil++;
  }

  result(): LinkQuality {
    const precision = ratio(this.correctLinks, this.predictedLinks);
    const recall = ratio(this.correctLinks, this.goldLinks);
    const f1 = precision + recall === 0 ? 0 : (2 * precision * recall) / (precision + recall);
    return {
      goldLinks: this.goldLinks,
      predictedLinks: this.predictedLinks,
      correctLinks: this.correctLinks,
      correctNil: this.correctNil,
      precision: round(precision),
      recall: round(recall),
      f1: round(f1),
      accuracy: round(ratio(this.correctLinks + this.correctNil, this.total)),
    };
  }
}

/** Share of non-NIL mentions whose gold entity is among the candidate ids. */
export class CompletenessCounter {
  private found = 0;
  private counted = 0;
  private candidates = 0;
  private mentions = 0;

  add(gold: string | null, candidateIds: readonly string[]): void {
    this.mentions++;
    this.candidates += candidateIds.length;
    if (gold === null) return;
    this.counted++;
    if (candidateIds.includes(gold)) this.found++;
  }

  /** Share of non-NIL mentions with their gold among the candidates (1 when none were counted). */
  completeness(): number {
    return this.counted === 0 ? 1 : round(this.found / this.counted);
  }

  /** Mean number of candidates per mention, over every mention added. */
  candidatesPerMention(): number {
    return round(ratio(this.candidates, this.mentions));
  }

  /** Non-NIL mentions counted. */
  nonNil(): number {
    return this.counted;
  }
}

/** Decimal places kept in reported ratios. */
const DIGITS = 4;

export function round(x: number, digits = DIGITS): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}

function ratio(a: number, b: number): number {
  return b === 0 ? 0 : a / b;
}

/** The mention as the linker sees it: gold stripped, so no answer leaks into linking. */
export function unlabeled(m: LabeledMention): Omit<LabeledMention, "gold"> {
  const { gold: _gold, ...mention } = m;
  return mention;
}

/** `count` indexes spread evenly over `[0, length)` (deterministic sampling). */
export function evenSample(length: number, count: number): number[] {
  const n = Math.min(length, count);
  const out: number[] = [];
  for (let i = 0; i < n; i++) out.push(Math.floor((i * length) / n));
  return out;
}

/** The labeled mentions of a generated JSONL file (one object a line; a bad line names file and line). */
export function readLabeled(file: string): LabeledMention[] {
  const lines = readFileSync(file, "utf8").split("\n");
  const out: LabeledMention[] = [];
  lines.forEach((line, i) => {
    if (line.trim() === "") return;
    try {
      out.push(JSON.parse(line) as LabeledMention);
    } catch (err) {
      throw new Error(`${file}:${i + 1}: not a JSON object (${(err as Error).message})`);
    }
  });
  return out;
}
