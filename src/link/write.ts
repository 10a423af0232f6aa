/**
 * Serializing link rows: JSONL (one object a line, the fields of README's links format) or CSV
 * (flat columns; reasons and candidates as JSON text in their own columns).
 */
import type { LinkRow } from "../types.js";

export type OutputFormat = "jsonl" | "csv";

export const CSV_COLUMNS = [
  "mention",
  "text",
  "type",
  "doc",
  "start",
  "end",
  "entity",
  "name",
  "score",
  "margin",
  "reason_codes",
  "reasons",
  "candidates",
] as const;

/** RFC 4180 field: quoted when it holds a comma, quote, CR or LF; quotes doubled. */
export function csvField(v: unknown): string {
  if (v === null || v === undefined) return "";
  const s = typeof v === "string" ? v : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvHeader(): string {
  return `${CSV_COLUMNS.join(",")}\r\n`;
}

export function csvRow(r: LinkRow): string {
  const cells = [
    r.mention,
    r.text,
    r.type,
    r.doc,
    r.start,
    r.end,
    r.entity,
    r.name,
    r.score,
    r.margin,
    r.reasons.map((x) => x.code).join(";"),
    JSON.stringify(r.reasons),
    JSON.stringify(r.candidates),
  ];
  return `${cells.map(csvField).join(",")}\r\n`;
}

export function jsonlRow(r: LinkRow): string {
  return `${JSON.stringify(r)}\n`;
}
