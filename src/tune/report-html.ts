/**
 * The tuning report: one self-contained HTML page (inline CSS and SVG, no scripts, no network).
 * Charts: precision against recall, and F1 (with precision and recall) against threshold, one
 * point per swept threshold, the chosen operating point marked. Tables: held-out, in-sample and
 * default figures; per-type figures; candidate recall at k; per-fold results; fitted weights; the
 * worst errors with their reasons. All user text is HTML-escaped.
 */
import { DEFAULT_MIN_MARGIN, DEFAULT_THRESHOLD } from "../decide/decide.js";
import type { LinkError, EvalReport, Figures } from "../evaluate/metrics.js";
import { FEATURE_NAMES } from "../types.js";
import type { OperatingPoint } from "./sweep.js";
import { PROCEDURE_WORDS, TUNE_PROCEDURES, type TuneResult } from "./tune.js";

/** Errors listed per table by default: enough to see patterns, short enough to read. */
export const DEFAULT_WORST = 10;
/** Decimal places of fractions: tells 1 error in 1000 apart. */
const DIGITS = 3;
/** Chart geometry in SVG user units. */
const CHART = { width: 460, height: 320, left: 56, right: 16, top: 16, bottom: 48 } as const;
/** Axis ticks at every 0.2 of the [0, 1] range: six labeled ticks stay legible at this size. */
const TICKS = [0, 0.2, 0.4, 0.6, 0.8, 1];
/** Radius of a curve point, and of the ring marking the chosen point. */
const POINT_RADIUS = 2.2;
const CHOSEN_RADIUS = 6;
/** Beyond this fraction of an axis the chosen point's label goes to the other side, to stay inside the plot. */
const LABEL_FLIP = 0.7;
/** Distance of the label from the chosen point, and the height of a label line, in SVG units. */
const LABEL_OFFSET = 10;
const LABEL_LINE = 8;

export interface ReportInput {
  tune: TuneResult;
  /** Page title. Default "hawser tuning report". */
  title?: string;
  /**
   * Report behind the per-type table, candidate recall and error lists. Default the held-out
   * report of `tune` (each mention decided by a model that did not see it).
   */
  report?: EvalReport;
  /** Label of `report` in headings. Default "held-out" (or "given" when `report` is passed). */
  reportLabel?: string;
  /** The KB tuned on, shown in the header when given. */
  kb?: { fingerprint: string; entities: number };
  /** Time shown in the header (ISO 8601). Default: not shown. */
  created?: string;
  /** Errors listed in each worst-errors table. Default DEFAULT_WORST (10). */
  worst?: number;
}

/** Escape text for HTML element content and attribute values. */
export function escapeHtml(s: string): string {
  return s.replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!,
  );
}

function fx(x: number, digits = DIGITS): string {
  return x.toFixed(digits);
}

interface ChartSeries {
  /** `empty`: no link predicted at this threshold (precision undefined), drawn hollow. */
  points: Array<{ x: number; y: number; threshold: number; empty?: boolean }>;
  chosenIndex: number;
}

function sx(x: number): number {
  return CHART.left + x * (CHART.width - CHART.left - CHART.right);
}

function sy(y: number): number {
  return CHART.height - CHART.bottom - y * (CHART.height - CHART.top - CHART.bottom);
}

function axes(xLabel: string, yLabel: string): string {
  const x0 = sx(0);
  const x1 = sx(1);
  const y0 = sy(0);
  const y1 = sy(1);
  const parts = [
    `<rect class="plot-area" x="${x0}" y="${y1}" width="${x1 - x0}" height="${y0 - y1}"/>`,
    ...TICKS.map(
      (t) =>
        `<line class="grid" x1="${sx(t)}" y1="${y0}" x2="${sx(t)}" y2="${y1}"/>` +
        `<line class="grid" x1="${x0}" y1="${sy(t)}" x2="${x1}" y2="${sy(t)}"/>` +
        `<line class="tick" x1="${sx(t)}" y1="${y0}" x2="${sx(t)}" y2="${y0 + 5}"/>` +
        `<text class="tick-label" x="${sx(t)}" y="${y0 + 18}" text-anchor="middle">${t.toFixed(1)}</text>` +
        `<line class="tick" x1="${x0 - 5}" y1="${sy(t)}" x2="${x0}" y2="${sy(t)}"/>` +
        `<text class="tick-label" x="${x0 - 8}" y="${sy(t) + 4}" text-anchor="end">${t.toFixed(1)}</text>`,
    ),
    `<line class="axis" x1="${x0}" y1="${y0}" x2="${x1}" y2="${y0}"/>`,
    `<line class="axis" x1="${x0}" y1="${y0}" x2="${x0}" y2="${y1}"/>`,
    `<text class="axis-label" x="${(x0 + x1) / 2}" y="${CHART.height - 10}" text-anchor="middle">${escapeHtml(xLabel)}</text>`,
    `<text class="axis-label" x="14" y="${(y0 + y1) / 2}" text-anchor="middle" transform="rotate(-90 14 ${(y0 + y1) / 2})">${escapeHtml(yLabel)}</text>`,
  ];
  return parts.join("\n");
}

function polyline(points: ReadonlyArray<{ x: number; y: number }>, cls: string, series: string): string {
  const coords = points.map((p) => `${fx(sx(p.x), 2)},${fx(sy(p.y), 2)}`).join(" ");
  return `<polyline class="${cls}" data-series="${series}" data-points="${points.length}" points="${coords}"/>`;
}

/** The ring around the chosen point and its label, placed inside the plot away from the edges. */
function chosenMarker(p: { x: number; y: number; threshold: number }): string {
  const cx = sx(p.x);
  const cy = sy(p.y);
  const right = p.x > LABEL_FLIP;
  const below = p.y > LABEL_FLIP;
  const lx = cx + (right ? -LABEL_OFFSET : LABEL_OFFSET);
  const ly = cy + (below ? LABEL_OFFSET + LABEL_LINE : -LABEL_OFFSET);
  return (
    `<circle class="chosen" data-threshold="${fx(p.threshold, 2)}" cx="${fx(cx, 2)}" cy="${fx(cy, 2)}" r="${CHOSEN_RADIUS}"/>` +
    `<text class="chosen-label" x="${fx(lx, 2)}" y="${fx(ly, 2)}" text-anchor="${right ? "end" : "start"}">chosen: threshold ${fx(p.threshold, 2)}</text>`
  );
}

function chart(
  id: string,
  title: string,
  xLabel: string,
  yLabel: string,
  main: ChartSeries,
  aux: string[] = [],
): string {
  const chosen = main.points[main.chosenIndex];
  const circles = main.points.map(
    (p) =>
      `<circle class="point${p.empty ? " no-links" : ""}" data-series="${id}" data-threshold="${fx(p.threshold, 2)}" cx="${fx(sx(p.x), 2)}" cy="${fx(sy(p.y), 2)}" r="${POINT_RADIUS}"><title>threshold ${fx(p.threshold, 2)}${p.empty ? " (no link predicted)" : ""}: ${escapeHtml(xLabel)} ${fx(p.x)}, ${escapeHtml(yLabel)} ${fx(p.y)}</title></circle>`,
  );
  const marker = chosen ? chosenMarker(chosen) : "";
  return [
    `<figure class="chart">`,
    `<svg id="${id}" xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${CHART.width} ${CHART.height}" width="${CHART.width}" height="${CHART.height}" role="img" aria-label="${escapeHtml(title)}">`,
    axes(xLabel, yLabel),
    ...aux,
    polyline(main.points, "curve", id),
    ...circles,
    marker,
    `</svg>`,
    `<figcaption>${escapeHtml(title)}</figcaption>`,
    `</figure>`,
  ].join("\n");
}

function prChart(curve: readonly OperatingPoint[], chosenIndex: number): string {
  return chart(
    "pr-curve",
    "Link precision against recall, one point per threshold (hollow: no link predicted)",
    "recall",
    "precision",
    {
      // With no link predicted, precision is undefined: such points are drawn at (0, 1), where
      // a precision-recall curve conventionally starts (common practice), and hollow.
      points: curve.map((p) =>
        p.predictedLinks === 0
          ? { x: 0, y: 1, threshold: p.threshold, empty: true }
          : { x: p.linkRecall, y: p.linkPrecision, threshold: p.threshold },
      ),
      chosenIndex,
    },
  );
}

function f1Chart(curve: readonly OperatingPoint[], chosenIndex: number): string {
  const aux = [
    polyline(
      curve.map((p) => ({ x: p.threshold, y: p.linkPrecision })),
      "aux-curve precision",
      "precision",
    ),
    polyline(
      curve.map((p) => ({ x: p.threshold, y: p.linkRecall })),
      "aux-curve recall",
      "recall",
    ),
  ];
  return chart(
    "f1-curve",
    "Link F1 (dots), precision (dashed) and recall (dotted) against threshold",
    "threshold",
    "F1",
    { points: curve.map((p) => ({ x: p.threshold, y: p.linkF1, threshold: p.threshold })), chosenIndex },
    aux,
  );
}

function table(header: readonly string[], rows: readonly string[][], cls = ""): string {
  const head = `<tr>${header.map((h) => `<th>${escapeHtml(h)}</th>`).join("")}</tr>`;
  const body = rows.map((r) => `<tr>${r.map((c) => `<td>${c}</td>`).join("")}</tr>`).join("\n");
  return `<table${cls ? ` class="${cls}"` : ""}><thead>${head}</thead><tbody>\n${body}\n</tbody></table>`;
}

const FIGURE_HEADER = ["mentions", "accuracy", "link P", "link R", "link F1", "NIL P", "NIL R"];

function figureCells(f: Figures): string[] {
  return [
    String(f.mentions),
    fx(f.accuracy),
    fx(f.linkPrecision),
    fx(f.linkRecall),
    fx(f.linkF1),
    fx(f.nilPrecision),
    fx(f.nilRecall),
  ];
}

function comparisonTable(t: TuneResult): string {
  const c = t.config;
  const rows = [
    ["held-out (cross-validated)", t.figures.heldOut, "per fold", "per fold"],
    ["in-sample (final config)", t.figures.inSample, fx(c.threshold, 2), fx(c.minMargin, 2)],
    ["defaults", t.figures.defaults, fx(DEFAULT_THRESHOLD, 2), fx(DEFAULT_MIN_MARGIN, 2)],
  ] as const;
  return table(
    ["", ...FIGURE_HEADER, "threshold", "min margin"],
    rows.map(([label, f, th, mm]) => [`<strong>${escapeHtml(label)}</strong>`, ...figureCells(f), th, mm]),
    "numeric",
  );
}

function typeTable(report: EvalReport): string {
  const rows = Object.entries(report.byType).map(([type, f]) => [escapeHtml(type), ...figureCells(f)]);
  rows.push([`<strong>all</strong>`, ...figureCells(report.overall)]);
  return table(["type", ...FIGURE_HEADER], rows, "numeric");
}

function recallTable(report: EvalReport): string {
  const cr = report.candidateRecall;
  const e = report.errorCounts;
  return (
    table(
      ["candidate recall", "found", "of gold links", "fraction"],
      [
        [`at ${cr.k}`, String(cr.foundAtK), String(cr.goldLinks), fx(cr.atK)],
        ["at all generated", String(cr.foundAtAll), String(cr.goldLinks), fx(cr.atAll)],
      ],
      "numeric",
    ) +
    "\n" +
    table(
      ["errors", "count"],
      [
        ["wrong entity", String(e.wrongEntity)],
        ["false link (gold NIL)", String(e.falseLink)],
        ["missed link (predicted NIL)", String(e.missedLink)],
      ],
      "numeric",
    )
  );
}

function foldTable(t: TuneResult): string {
  return table(
    ["fold", "held-out mentions", "threshold", "min margin", "link P", "link R", "link F1", "converged"],
    t.perFold.map((f) => [
      String(f.fold),
      String(f.size),
      fx(f.config.threshold, 2),
      fx(f.config.minMargin, 2),
      fx(f.heldOut.linkPrecision),
      fx(f.heldOut.linkRecall),
      fx(f.heldOut.linkF1),
      f.converged ? "yes" : "no",
    ]),
    "numeric",
  );
}

function procedureTable(t: TuneResult): string {
  return table(
    ["procedure", "held-out link P", "link R", "link F1", "accuracy", "kept"],
    TUNE_PROCEDURES.map((p) => {
      const f = t.procedures[p];
      return [
        PROCEDURE_WORDS[p],
        fx(f.linkPrecision),
        fx(f.linkRecall),
        fx(f.linkF1),
        fx(f.accuracy),
        p === t.procedure ? "yes" : "",
      ];
    }),
    "numeric",
  );
}

function weightTable(t: TuneResult): string {
  const w = t.config.weights;
  const rows = [["bias", fx(w.bias)], ...FEATURE_NAMES.map((name) => [name, fx(w.features[name])])];
  return table(["weight", "log-odds"], rows, "numeric");
}

function reasonList(e: LinkError): string {
  if (e.reasons.length === 0) return `<span class="muted">none</span>`;
  return `<ul class="reasons">${e.reasons.map((r) => `<li><code>${escapeHtml(r.code)}</code> ${escapeHtml(r.message)}</li>`).join("")}</ul>`;
}

function goldScoreCell(e: LinkError): string {
  if (e.gold === null) return `<span class="muted">–</span>`;
  return e.goldScore === null ? `<span class="muted">not generated</span>` : fx(e.goldScore);
}

function errorTable(errors: readonly LinkError[]): string {
  if (errors.length === 0) return `<p class="muted">None.</p>`;
  return table(
    ["mention", "text", "type", "gold", "predicted", "score", "gold score", "reasons"],
    errors.map((e) => [
      `<code>${escapeHtml(e.mention)}</code>`,
      escapeHtml(e.text),
      escapeHtml(e.type ?? ""),
      e.gold === null ? `<em>NIL</em>` : `<code>${escapeHtml(e.gold)}</code>`,
      e.predicted === null ? `<em>NIL</em>` : `<code>${escapeHtml(e.predicted)}</code>`,
      fx(e.score),
      goldScoreCell(e),
      reasonList(e),
    ]),
    "errors",
  );
}

/** Highest-scoring wrong links (wrong entity or false link), score descending. */
export function worstWrongLinks(report: EvalReport, n: number): LinkError[] {
  return report.errors
    .filter((e) => e.kind !== "missedLink")
    .sort((a, b) => b.score - a.score)
    .slice(0, n);
}

/** Lowest-scoring missed links: by the gold entity's score ascending (not generated first). */
export function worstMissedLinks(report: EvalReport, n: number): LinkError[] {
  return report.errors
    .filter((e) => e.kind === "missedLink")
    .sort((a, b) => (a.goldScore ?? -1) - (b.goldScore ?? -1))
    .slice(0, n);
}

const CSS = `
:root { color-scheme: light; --ink: #1d2733; --muted: #66727f; --line: #d8dee5; --accent: #1f6fb2; --mark: #c0392b; }
* { box-sizing: border-box; }
body { margin: 0; font: 15px/1.5 system-ui, -apple-system, "Segoe UI", "DejaVu Sans", sans-serif; color: var(--ink); background: #f6f8fa; }
main { max-width: 1080px; margin: 0 auto; padding: 24px 28px 48px; background: #fff; min-height: 100vh; }
h1 { font-size: 1.6rem; margin: 0 0 4px; }
h2 { font-size: 1.15rem; margin: 32px 0 10px; padding-bottom: 4px; border-bottom: 1px solid var(--line); }
.meta { color: var(--muted); margin: 0 0 12px; }
.headline { display: flex; gap: 16px; flex-wrap: wrap; margin: 16px 0; }
.stat { border: 1px solid var(--line); border-radius: 6px; padding: 10px 16px; min-width: 150px; }
.stat .v { font-size: 1.5rem; font-weight: 600; }
.stat .k { color: var(--muted); font-size: 0.85rem; }
.charts { display: flex; flex-wrap: wrap; gap: 24px; }
figure.chart { margin: 0; }
figcaption { color: var(--muted); font-size: 0.85rem; text-align: center; max-width: 460px; }
svg { font: 11px system-ui, "DejaVu Sans", sans-serif; }
svg .plot-area { fill: #fbfcfd; stroke: none; }
svg .grid { stroke: #eceff2; }
svg .axis, svg .tick { stroke: #8a949e; }
svg .tick-label { fill: var(--muted); }
svg .axis-label { fill: var(--ink); font-size: 12px; }
svg .curve { fill: none; stroke: var(--accent); stroke-width: 1.6; }
svg .aux-curve { fill: none; stroke: #8a949e; stroke-width: 1.2; }
svg .aux-curve.precision { stroke-dasharray: 5 3; }
svg .aux-curve.recall { stroke-dasharray: 1.5 2.5; }
svg .point { fill: var(--accent); }
svg .point.no-links { fill: #fff; stroke: var(--accent); stroke-width: 1; }
svg .chosen { fill: none; stroke: var(--mark); stroke-width: 2; }
svg .chosen-label { fill: var(--mark); font-weight: 600; }
table { border-collapse: collapse; margin: 8px 0 12px; font-size: 0.9rem; }
th, td { padding: 4px 10px; border-bottom: 1px solid var(--line); text-align: left; vertical-align: top; }
th { background: #f0f3f6; font-weight: 600; }
table.numeric td:not(:first-child), table.numeric th:not(:first-child) { text-align: right; font-variant-numeric: tabular-nums; }
table.errors { width: 100%; }
table.errors td { overflow-wrap: anywhere; }
table.errors code, th { white-space: nowrap; }
table.errors td:last-child { width: 40%; }
ul.reasons { margin: 0; padding-left: 16px; }
code { font: 0.85em ui-monospace, "DejaVu Sans Mono", monospace; background: #f0f3f6; padding: 0 3px; border-radius: 3px; }
.muted { color: var(--muted); }
.notes li { color: #8a5a00; }
.two { display: flex; flex-wrap: wrap; gap: 32px; align-items: flex-start; }
`;

/** Render the report page. */
export function renderReport(input: ReportInput): string {
  const t = input.tune;
  const report = input.report ?? t.reports.heldOut;
  const reportLabel = input.reportLabel ?? (input.report ? "given" : "held-out");
  const worst = input.worst ?? DEFAULT_WORST;
  const title = input.title ?? "hawser tuning report";
  const chosenIndex = t.curve.findIndex(
    (p) => p.threshold === t.chosen.threshold && p.minMargin === t.chosen.minMargin,
  );
  const objective =
    t.objective === "f1"
      ? "highest link F1"
      : `highest link recall at precision ≥ ${fx(t.minPrecision ?? 0, 2)}`;
  const meta = [
    `${t.mentions} labeled mentions`,
    `${t.pairs} candidate pairs (${t.positives} gold)`,
    `${t.folds}-fold cross-validation, seed ${t.seed}`,
    `L2 ${t.l2}`,
    `objective: ${objective}`,
  ];
  if (input.kb) meta.push(`KB ${input.kb.fingerprint} (${input.kb.entities} entities)`);
  if (input.created) meta.push(`created ${input.created}`);
  const stat = (k: string, v: string) =>
    `<div class="stat"><div class="v">${v}</div><div class="k">${escapeHtml(k)}</div></div>`;
  const notes =
    t.notes.length === 0
      ? ""
      : `<h2>Notes</h2><ul class="notes">${t.notes.map((n) => `<li>${escapeHtml(n)}</li>`).join("")}</ul>`;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>${CSS}</style>
</head>
<body>
<main>
<h1>${escapeHtml(title)}</h1>
<p class="meta">${meta.map(escapeHtml).join(" · ")}</p>
<div class="headline">
${stat("held-out link F1", fx(t.figures.heldOut.linkF1))}
${stat("in-sample link F1", fx(t.figures.inSample.linkF1))}
${stat("defaults link F1", fx(t.figures.defaults.linkF1))}
${stat("chosen threshold", fx(t.config.threshold, 2))}
${stat("chosen min margin", fx(t.config.minMargin, 2))}
</div>
${notes}
<h2>Held-out, in-sample and default figures</h2>
<p class="muted">Held-out figures pool each fold's mentions decided by weights and an operating point chosen without them: the figures to expect on new data. In-sample figures measure the final config on the data it was fitted on.</p>
${comparisonTable(t)}
<h2>Operating curves (final weights, in-sample, min margin ${fx(t.chosen.minMargin, 2)})</h2>
<div class="charts">
${prChart(t.curve, chosenIndex)}
${f1Chart(t.curve, chosenIndex)}
</div>
<h2>By mention type (${escapeHtml(reportLabel)})</h2>
${typeTable(report)}
<h2>Candidate recall and errors (${escapeHtml(reportLabel)})</h2>
<p class="muted">A gold entity missing from the generated candidates is a blocking miss: no weight or threshold can recover it.</p>
<div class="two">${recallTable(report)}</div>
<h2>Procedures compared</h2>
<p class="muted">Each procedure is cross-validated on the same folds; the one whose held-out decisions score best on the objective is kept (the simpler on a tie), so tuning never keeps what does worse held out than the defaults.</p>
${procedureTable(t)}
<h2>Cross-validation folds (${escapeHtml(PROCEDURE_WORDS[t.procedure])})</h2>
${foldTable(t)}
<h2>Weights (final config: ${escapeHtml(PROCEDURE_WORDS[t.procedure])})</h2>
${weightTable(t)}
<h2>Highest-scoring wrong links (${escapeHtml(reportLabel)})</h2>
${errorTable(worstWrongLinks(report, worst))}
<h2>Lowest-scoring missed links (${escapeHtml(reportLabel)})</h2>
${errorTable(worstMissedLinks(report, worst))}
</main>
</body>
</html>
`;
}
