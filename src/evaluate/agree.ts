/**
 * Inter-annotator agreement between two labelings of the same mentions: observed agreement and
 * Cohen's kappa over the categories "each entity id" plus NIL.
 *
 * kappa = (p_o - p_e) / (1 - p_e), with p_o the fraction of mentions both label alike and
 * p_e = sum over categories c of (share of c in A) * (share of c in B).
 * When p_e = 1 (both annotators used one and the same category throughout) kappa is undefined;
 * it is reported as 1, since the two labelings are then identical.
 */
import type { LabeledMention } from "../types.js";
import { InputError, UsageError } from "../util/errors.js";

/** The category name NIL is counted under in `counts` (null in JSON). */
export type Category = string | null;

export interface AgreementOptions {
  /** Name of the first file, for error messages when a mention has no `source`. Default "(a)". */
  fileA?: string;
  /** Name of the second file. Default "(b)". */
  fileB?: string;
}

export interface Agreement {
  /** Mentions compared. */
  n: number;
  /** p_o: fraction of mentions labeled alike. */
  observed: number;
  /** p_e: agreement expected by chance from each annotator's category shares. */
  expected: number;
  kappa: number;
  /** Pairs of labels (A's, B's) with their counts, most frequent first, then by labels. */
  counts: Array<{ a: Category; b: Category; count: number }>;
  /** Mentions labeled differently, in A's order. */
  disagreements: Array<{ id: string; text: string; a: Category; b: Category }>;
}

function indexById(list: readonly LabeledMention[], file: string): Map<string, LabeledMention> {
  const byId = new Map<string, LabeledMention>();
  list.forEach((m, i) => {
    if (byId.has(m.id))
      throw new InputError(
        { ...(m.source ?? { file, line: i + 1 }), field: "id" },
        `duplicate mention id "${m.id}"`,
      );
    byId.set(m.id, m);
  });
  return byId;
}

/** A key that keeps NIL apart from any entity id. */
function key(c: Category): string {
  return c === null ? "\u0000NIL" : `=${c}`;
}

export function agreement(
  a: readonly LabeledMention[],
  b: readonly LabeledMention[],
  opts: AgreementOptions = {},
): Agreement {
  const fileA = opts.fileA ?? "(a)";
  const fileB = opts.fileB ?? "(b)";
  const byIdA = indexById(a, fileA);
  const byIdB = indexById(b, fileB);
  for (const [id, m] of byIdA)
    if (!byIdB.has(id))
      throw new InputError(
        { file: m.source?.file ?? fileA, line: m.source?.line, field: "id" },
        `mention id "${id}" is not in ${fileB}`,
      );
  for (const [id, m] of byIdB)
    if (!byIdA.has(id))
      throw new InputError(
        { file: m.source?.file ?? fileB, line: m.source?.line, field: "id" },
        `mention id "${id}" is not in ${fileA}`,
      );
  const n = a.length;
  if (n === 0) throw new UsageError("agreement: no mentions to compare");

  const shareA = new Map<string, number>();
  const shareB = new Map<string, number>();
  const pairCounts = new Map<string, { a: Category; b: Category; count: number }>();
  const disagreements: Agreement["disagreements"] = [];
  let agreed = 0;
  for (const ma of a) {
    const mb = byIdB.get(ma.id)!;
    const ca = ma.gold;
    const cb = mb.gold;
    shareA.set(key(ca), (shareA.get(key(ca)) ?? 0) + 1);
    shareB.set(key(cb), (shareB.get(key(cb)) ?? 0) + 1);
    const pk = `${key(ca)}\u0001${key(cb)}`;
    const entry = pairCounts.get(pk);
    if (entry) entry.count++;
    else pairCounts.set(pk, { a: ca, b: cb, count: 1 });
    if (ca === cb) agreed++;
    else disagreements.push({ id: ma.id, text: ma.text, a: ca, b: cb });
  }

  const observed = agreed / n;
  let expected = 0;
  for (const [k, countA] of shareA) expected += (countA / n) * ((shareB.get(k) ?? 0) / n);
  const kappa = expected === 1 ? 1 : (observed - expected) / (1 - expected);
  const label = (c: Category) => (c === null ? "" : c);
  const counts = [...pairCounts.values()].sort(
    (x, y) =>
      y.count - x.count || label(x.a).localeCompare(label(y.a)) || label(x.b).localeCompare(label(y.b)),
  );
  return { n, observed, expected, kappa, counts, disagreements };
}
