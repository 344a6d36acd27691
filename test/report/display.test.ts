/**
 * Notebook display: designs, Monte Carlo runs, noise analyses and figures
 * carry `Symbol.for("Jupyter.display")`, which returns HTML (or SVG) and a
 * short plain text; the property stays out of keys, JSON and equality.
 */
import { describe, expect, it } from "vitest";
import { designFilter, designLcLadder, fromJson, monteCarlo, noiseAnalysis, plotFigure, svgFigure, toJson, toMarkdown, toSvgPlot, InvalidArgumentError } from "../../src/index.ts";
import type { MediaBundle } from "../../src/index.ts";
import { escapeHtml, htmlTable, textTable } from "../../src/display.ts";
import { hertz } from "../../src/design/text.ts";
import { thrownBy } from "../helpers/throws.ts";
import { ADC_SPEC, TIGHT } from "../design/lc-ladder-scenarios.ts";

const DISPLAY = Symbol.for("Jupyter.display");
const bundleOf = (x: unknown): MediaBundle => {
  const f = (x as Record<symbol, unknown>)[DISPLAY];
  expect(typeof f).toBe("function");
  return (f as () => MediaBundle)();
};

// A seismometer channel ahead of a 200 S/s converter (our own scenario).
const spec = {
  response: "lowpass",
  passband: { edgeHz: 40, maxLossDb: 0.5 },
  stopband: { edgeHz: 100, minAttenuationDb: 50 },
  opamp: { a0: 2e5, gbwHz: "1M" },
} as const;
const design = designFilter(spec);

describe("designFilter result display", () => {
  it("shows the heading, the verdict and one table row per stage as HTML", () => {
    const b = bundleOf(design);
    const html = b["text/html"] as string;
    expect(html).toContain(`${design.filterOrder} poles`);
    expect(html).toContain(design.verification.boardsMeetSpec ? "Meets the spec" : "Does NOT meet the spec");
    expect(html.match(/<tr>/g)?.length).toBe(design.stages.length + 1);
    for (const h of ["f0 as built", "peak gain at stage output", "GBW required"]) expect(html).toContain(`<th>${h}</th>`);
    for (const st of design.stages) expect(html).toContain(escapeHtml(st.topologyName));
  });

  it("gives a terminal a few lines, not the whole result", () => {
    const text = bundleOf(design)["text/plain"] as string;
    expect(text.split("\n").length).toBeLessThanOrEqual(design.stages.length + 4);
    expect(text.length).toBeLessThan(3000);
    expect(JSON.stringify(design).length).toBeGreaterThan(10 * text.length);
  });

  it("keeps the display out of keys and JSON, and survives a JSON round trip", () => {
    expect(Object.keys(design)).not.toContain(String(DISPLAY));
    expect(Object.getOwnPropertyDescriptor(design, DISPLAY)?.enumerable).toBe(false);
    expect(JSON.stringify(design)).not.toContain("Jupyter");
    const back = fromJson(toJson(design));
    expect(back).toEqual(design);
    expect(bundleOf(back)["text/html"]).toBe(bundleOf(design)["text/html"]);
    expect(Object.isFrozen(design)).toBe(true);
  });
});

describe("designLcLadder result display", () => {
  it("shows the ladder, its verdict on the boards and its parts", () => {
    const d = designLcLadder(ADC_SPEC, { ...TIGHT, boards: 128 });
    const b = bundleOf(d);
    expect(b["text/html"]).toContain(`LC ladder: ${d.family}, order ${d.order}`);
    expect(b["text/html"]).toContain(d.verification.meetsSpec && d.verification.yield.met ? "Meets the spec" : "Does NOT meet the spec");
    expect(b["text/html"]?.match(/<tr>/g)?.length).toBe(d.parts.length + 1);
    expect(b["text/plain"]).toContain("of 128 boards");
    expect(Object.keys(d)).not.toContain(String(DISPLAY));
  });
});

describe("analysis displays", () => {
  it("monteCarlo shows its yield and the spread of each figure", () => {
    const mc = monteCarlo(design, { runs: 200, seed: 7 });
    const b = bundleOf(mc);
    expect(b["text/plain"]).toContain("200 boards");
    expect(b["text/html"]).toContain("worst margin over the mask");
    expect(b["text/html"]).toContain(`${Number((mc.yield * 100).toPrecision(3))} %`);
  });

  it("noiseAnalysis shows the RMS total and the largest contributors", () => {
    const n = noiseAnalysis(design);
    const b = bundleOf(n);
    expect(b["text/plain"]).toMatch(/^Output noise .* rms from /);
    expect(b["text/html"]).toContain(escapeHtml(n.topContributors[0]?.name as string));
  });
});

describe("svgFigure, plotFigure", () => {
  it("displays as an SVG image and converts back to its text", () => {
    const fig = plotFigure(design, { kind: "magnitude" });
    const b = bundleOf(fig);
    expect(b["image/svg+xml"]).toBe(toSvgPlot(design));
    expect(String(fig)).toBe(fig.svg);
    expect(b["text/plain"]).toContain("magnitude plot");
    expect(bundleOf(svgFigure(fig.svg, { title: "t" }))["text/plain"]).toBe("t");
  });

  it("refuses text that is not SVG and a bad title, naming the field", () => {
    expect(thrownBy(() => svgFigure("<html></html>"), InvalidArgumentError).path).toBe("svg");
    expect(thrownBy(() => svgFigure(42 as never), InvalidArgumentError).path).toBe("svg");
    expect(thrownBy(() => svgFigure(design.stages.length > 0 ? toSvgPlot(design) : "", { title: "" }), InvalidArgumentError).path).toBe("options.title");
  });
});

describe("display helpers", () => {
  it("escapes HTML and right-aligns numbers", () => {
    expect(escapeHtml(`<a href="x">&</a>`)).toBe("&lt;a href=&quot;x&quot;&gt;&amp;&lt;/a&gt;");
    expect(htmlTable(["a", "b"], [["x<y", "1.5 dB"]])).toBe(
      '<table><thead><tr><th>a</th><th>b</th></tr></thead><tbody><tr><td>x&lt;y</td><td style="text-align:right">1.5 dB</td></tr></tbody></table>',
    );
    expect(textTable(["a", "bb"], [["ccc", "d"]])).toBe("a    bb\nccc  d");
  });

  it("writes frequencies with k, M or G and never milli", () => {
    expect(hertz(0.05)).toBe("0.05 Hz");
    expect(hertz(1234.6)).toBe("1.235 kHz");
    expect(hertz(2.5e6)).toBe("2.5 MHz");
    expect(hertz(3e9)).toBe("3 GHz");
  });

  it("a sub-hertz design's report has no mHz next to MHz", () => {
    const slow = designFilter({ response: "highpass", passband: { edgeHz: 0.5, maxLossDb: 1 }, stopband: { edgeHz: 0.1, minAttenuationDb: 30 } });
    expect(toMarkdown(slow)).not.toMatch(/\dmHz| mHz/);
  });
});
