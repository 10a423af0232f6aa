import { describe, expect, it } from "vitest";
import { escapeHtml, renderReport } from "../src/tune/report-html.js";
import { THRESHOLD_GRID } from "../src/tune/sweep.js";
import { tune } from "../src/tune/tune.js";
import { syntheticSet } from "./tune-fixtures.js";

const data = syntheticSet(90, { seed: 4, noise: 0.3, missShare: 0.1 });
// A hostile mention text must come out escaped.
data[0]!.mention.text = `<script>alert("x")</script> & Sons`;
data[0]!.mention.gold = "no-such-entity"; // guaranteed error, so the text is listed
const result = tune(data, { folds: 3 });
const html = renderReport({
  tune: result,
  kb: { fingerprint: "sha256:abc<>", entities: 40 },
  created: "1912-01-01",
});

function count(re: RegExp, s: string): number {
  return (s.match(re) ?? []).length;
}

describe("renderReport", () => {
  it("is one self-contained page", () => {
    expect(html.startsWith("<!DOCTYPE html>")).toBe(true);
    expect(html).not.toMatch(/<script|<link|@import|https?:\/\/(?!www\.w3\.org\/2000\/svg)/);
    expect(count(/<svg\b/g, html)).toBe(2);
    expect(count(/<\/svg>/g, html)).toBe(2);
  });

  it("escapes user text", () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe("&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;");
    expect(html).toContain("&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; Sons");
    expect(html).toContain("sha256:abc&lt;&gt;");
  });

  it("has well-formed SVG elements: every circle, line and polyline closed, tags balanced", () => {
    for (const svg of html.match(/<svg\b[\s\S]*?<\/svg>/g)!) {
      // every <circle> either self-closes or is closed by </circle>
      expect(count(/<circle\b[^>]*[^/]>/g, svg)).toBe(count(/<\/circle>/g, svg));
      expect(count(/<polyline\b[^>]*\/>/g, svg)).toBe(count(/<polyline\b/g, svg));
      expect(count(/<line\b[^>]*\/>/g, svg)).toBe(count(/<line\b/g, svg));
      expect(count(/<text\b/g, svg)).toBe(count(/<\/text>/g, svg));
      // no NaN or Infinity reaches the coordinates
      expect(svg).not.toMatch(/NaN|Infinity/);
    }
  });

  it("draws one point per threshold swept on each curve, and marks the chosen point", () => {
    for (const id of ["pr-curve", "f1-curve"]) {
      const svg = html.match(new RegExp(`<svg id="${id}"[\\s\\S]*?</svg>`))![0];
      expect(count(/<circle class="point[ "]/g, svg)).toBe(THRESHOLD_GRID.length);
      const poly = svg.match(/<polyline class="curve"[^>]*points="([^"]*)"/)!;
      expect(poly[1]!.trim().split(/\s+/)).toHaveLength(THRESHOLD_GRID.length);
      expect(count(/<circle class="chosen"/g, svg)).toBe(1);
      expect(svg).toContain(`data-threshold="${result.config.threshold.toFixed(2)}"`);
      // axes with ticks and labels
      expect(count(/class="tick-label"/g, svg)).toBe(12);
      expect(count(/class="axis-label"/g, svg)).toBe(2);
    }
  });

  it("shows the figure tables and the worst errors", () => {
    expect(html).toContain("held-out (cross-validated)");
    expect(html).toContain("in-sample (final config)");
    expect(html).toContain("defaults");
    for (const type of ["PER", "ORG", "LOC"]) expect(html).toContain(`<td>${type}</td>`);
    expect(html).toContain(`at ${result.reports.heldOut.candidateRecall.k}`);
    expect(html).toContain("Highest-scoring wrong links");
    expect(html).toContain("Lowest-scoring missed links");
    expect(html).toMatch(/<code>below-threshold<\/code>|<code>ambiguous<\/code>|<code>no-candidates<\/code>/);
  });
});
