/** A plain, aligned text table of an evaluation report, for a terminal. */
import type { AlignedEvalReport } from "./align.js";
import type { EvalReport, Figures } from "./metrics.js";

/** Decimal places of fractions in the table: enough to tell 1 error in 1000 apart. */
const FRACTION_DIGITS = 3;
/** Spaces between columns. */
const COLUMN_GAP = "  ";

function fraction(x: number): string {
  return x.toFixed(FRACTION_DIGITS);
}

/** Lay out rows as columns: first column left-aligned, the others right-aligned. */
export function alignColumns(rows: readonly string[][]): string {
  const widths: number[] = [];
  for (const row of rows)
    row.forEach((cell, i) => {
      widths[i] = Math.max(widths[i] ?? 0, cell.length);
    });
  return rows
    .map((row) =>
      row
        .map((cell, i) => (i === 0 ? cell.padEnd(widths[i]!) : cell.padStart(widths[i]!)))
        .join(COLUMN_GAP)
        .trimEnd(),
    )
    .join("\n");
}

/**
 * What the table shows for a fraction whose denominator is zero (no links predicted, no NIL in
 * the gold...): it is undefined, not 0. The JSON report gives 0 there, with the counts beside it.
 */
const UNDEFINED_FRACTION = "-";

/** A fraction of `denominator` items, or UNDEFINED_FRACTION when there are none. */
function fractionOf(x: number, denominator: number): string {
  return denominator === 0 ? UNDEFINED_FRACTION : fraction(x);
}

function figureRow(label: string, f: Figures): string[] {
  return [
    label,
    String(f.mentions),
    fraction(f.accuracy),
    fractionOf(f.linkPrecision, f.predictedLinks),
    fractionOf(f.linkRecall, f.goldLinks),
    fractionOf(f.linkF1, f.predictedLinks + f.goldLinks),
    fractionOf(f.nilPrecision, f.predictedNil),
    fractionOf(f.nilRecall, f.goldNil),
  ];
}

export function formatEvalTable(report: EvalReport): string {
  const header = ["type", "mentions", "accuracy", "link P", "link R", "link F1", "NIL P", "NIL R"];
  const rows = [header, ...Object.entries(report.byType).map(([t, f]) => figureRow(t, f))];
  rows.push(figureRow("all", report.overall));
  const cr = report.candidateRecall;
  const e = report.errorCounts;
  const lines = [
    alignColumns(rows),
    "",
    alignColumns([
      ["candidate recall", "found", "of", "fraction"],
      [`at ${cr.k}`, String(cr.foundAtK), String(cr.goldLinks), fractionOf(cr.atK, cr.goldLinks)],
      ["at all returned", String(cr.foundAtAll), String(cr.goldLinks), fractionOf(cr.atAll, cr.goldLinks)],
    ]),
    "",
    alignColumns([
      ["errors", "count"],
      ["wrong entity", String(e.wrongEntity)],
      ["false link", String(e.falseLink)],
      ["missed link", String(e.missedLink)],
    ]),
  ];
  // Evaluated against another run's spans (--predicted): how the spans were matched.
  const alignment = (report as Partial<AlignedEvalReport>).alignment;
  if (alignment !== undefined) {
    const end = alignment.endToEnd;
    lines.push(
      "",
      alignColumns([
        [`spans (${alignment.mode})`, "count"],
        ["matched", String(alignment.matched)],
        ["gold unmatched", String(alignment.unmatchedGold)],
        ["predicted unmatched", String(alignment.unmatchedPredicted)],
        ["  of them links (false links)", String(alignment.falseLinks)],
      ]),
      "",
      `end to end (unmatched predicted links counted as false): link P ${fraction(end.linkPrecision)}  link R ${fraction(end.linkRecall)}  link F1 ${fraction(end.linkF1)}`,
    );
  }
  return lines.join("\n") + "\n";
}
