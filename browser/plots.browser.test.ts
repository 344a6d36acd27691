/**
 * Every plot kind and the schematics rendered by headless Chromium: each
 * screenshot is not blank (many colours, some ink, not all ink), no text
 * element's box as the browser lays it out leaves its drawing, and the
 * conservative width estimate the layout sizes its margins from is never
 * below the browser's measured width. With FW_WRITE_IMAGES=<folder> the
 * screenshots named in DOC_IMAGES are also written there, under those names
 * (`FW_WRITE_IMAGES=docs/images npm run test:browser` makes the committed ones).
 */
import { describe, expect, it } from "vitest";
import { copyFileSync, mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { designFilter, type DesignResult, type FilterSpec } from "../src/design/index.ts";
import { toSvgPlot, PLOT_KINDS, type SvgPlotOptions } from "../src/report/svg.ts";
import { toSvgSchematic } from "../src/report/schematic.ts";
import { monteCarloEnvelope } from "../src/analysis/envelope.ts";
import { textWidth } from "../src/report/plot/text.ts";
import { dumpDom, requireChromium, screenshot } from "./chromium.ts";
import { decodePng } from "./png.ts";

const run = requireChromium();

// scenarios of our own: a sensor front end, a hum notch on a real op-amp, an ultrasonic receiver band with levels
const specs: Record<string, FilterSpec> = {
  lowpass: { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } },
  bandstop: { response: "bandstop", passband: { edgeHz: ["38", "80"], maxLossDb: 1 }, stopband: { edgeHz: ["47", "53"], minAttenuationDb: 30 }, opamp: { a0: 2e5, gbwHz: "1M" } },
  bandpass: { response: "bandpass", passband: { edgeHz: ["36k", "44k"], maxLossDb: 1 }, stopband: { edgeHz: ["25k", "64k"], minAttenuationDb: 30 }, levels: { inputPeakV: 0.5, outputSwingV: 4 } },
  sallenKey: { response: "lowpass", passband: { edgeHz: "2k", maxLossDb: 0.5 }, stopband: { edgeHz: "10k", minAttenuationDb: 45 }, family: "butterworth", topology: "sallen-key-lowpass-unity" },
  stateVariable: { response: "bandpass", passband: { edgeHz: ["950", "1.05k"], maxLossDb: 1 }, stopband: { edgeHz: ["700", "1.4k"], minAttenuationDb: 20 }, topology: "state-variable-bandpass", family: "butterworth" },
};
const designs = new Map<string, DesignResult>();
const design = (name: string): DesignResult => {
  let r = designs.get(name);
  if (r === undefined) {
    r = designFilter(specs[name] as FilterSpec);
    designs.set(name, r);
  }
  return r;
};

/** The drawings: every plot kind of three designs, and schematics. */
function drawings(): { name: string; svg: string }[] {
  const out: { name: string; svg: string }[] = [];
  for (const d of ["lowpass", "bandstop", "bandpass"]) {
    for (const kind of PLOT_KINDS) {
      const o: SvgPlotOptions = { kind, ...(kind === "magnitude" ? { envelope: monteCarloEnvelope(design(d), { runs: 200 }) } : {}), ...(d === "bandstop" && kind !== "step" && kind !== "pole-zero" ? { startHz: 20, stopHz: 200 } : {}) };
      out.push({ name: `${d}-${kind}`, svg: toSvgPlot(design(d), o) });
    }
  }
  out.push({ name: "lowpass-magnitude-small", svg: toSvgPlot(design("lowpass"), { width: 320, height: 240 }) });
  out.push({ name: "schematic-sallen-key", svg: toSvgSchematic(design("sallenKey"), { stage: design("sallenKey").stages.findIndex((s) => s.topology.startsWith("sallen-key")) + 1 }) });
  out.push({ name: "schematic-state-variable", svg: toSvgSchematic(design("stateVariable"), { stage: 1 }) });
  out.push({ name: "schematic-cascade", svg: toSvgSchematic(design("lowpass")) });
  return out;
}

/** The screenshots the guide shows: one of each plot kind and three schematics. */
const DOC_IMAGES: Readonly<Record<string, string>> = {
  "bandstop-magnitude": "plot-magnitude.png",
  "lowpass-phase": "plot-phase.png",
  "lowpass-group-delay": "plot-group-delay.png",
  "lowpass-step": "plot-step.png",
  "bandstop-pole-zero": "plot-pole-zero.png",
  "bandpass-opamp-levels": "plot-opamp-levels.png",
  "lowpass-noise": "plot-noise.png",
  "schematic-sallen-key": "schematic-sallen-key.png",
  "schematic-state-variable": "schematic-state-variable.png",
  "schematic-cascade": "schematic-cascade.png",
};

const page = (body: string, script = ""): string =>
  `<!doctype html><html><head><meta charset="utf-8"><style>html,body{margin:0;padding:0;background:#fff;overflow:hidden}svg{display:block}</style></head><body>${body}${script}</body></html>`;

/** The script that measures every text element against its drawing and writes the findings into the page. */
const MEASURE = `<pre id="findings"></pre><script>
const out = [];
for (const holder of document.querySelectorAll("[data-name]")) {
  const svg = holder.querySelector("svg");
  const r = svg.getBoundingClientRect();
  const texts = [];
  for (const t of svg.querySelectorAll("text")) {
    const b = t.getBoundingClientRect();
    texts.push({ text: t.textContent, fontSize: parseFloat(getComputedStyle(t).fontSize), width: t.getBBox().width,
      left: b.left - r.left, top: b.top - r.top, right: b.right - r.left, bottom: b.bottom - r.top });
  }
  out.push({ name: holder.dataset.name, width: r.width, height: r.height, texts });
}
document.getElementById("findings").textContent = JSON.stringify(out);
</script>`;

interface Finding {
  readonly name: string;
  readonly width: number;
  readonly height: number;
  readonly texts: readonly { text: string; fontSize: number; width: number; left: number; top: number; right: number; bottom: number }[];
}

describe.skipIf(!run)("plots and schematics in headless Chromium", () => {
  const all = drawings();
  const dir = mkdtempSync(join(tmpdir(), "fw-browser-"));

  it("lays out every text element inside its drawing, never wider than the width estimate", () => {
    const file = join(dir, "measure.html");
    // a control drawing whose label runs off its right edge: the measurement must see it
    const control = '<div data-name="control"><svg xmlns="http://www.w3.org/2000/svg" width="100" height="50" viewBox="0 0 100 50" font-size="12"><text x="70" y="20">a label too long</text></svg></div>';
    writeFileSync(file, page([...all.map((d) => `<div data-name="${d.name}">${d.svg}</div>`), control].join("\n"), MEASURE));
    const dom = dumpDom(file);
    const json = /<pre id="findings">([^<]*)<\/pre>/.exec(dom)?.[1];
    expect(json, "the page's script wrote its findings").toBeDefined();
    const measured = JSON.parse((json as string).replace(/&quot;/g, '"').replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&amp;/g, "&")) as Finding[];
    const off = measured.pop() as Finding;
    expect(off.name).toBe("control");
    expect(off.texts[0]?.right, "the control label is seen running off its drawing").toBeGreaterThan(off.width + 10);
    const findings = measured;
    expect(findings.map((f) => f.name)).toEqual(all.map((d) => d.name));
    for (const f of findings) {
      expect(f.texts.length, f.name).toBeGreaterThan(3);
      for (const t of f.texts) {
        const where = `${f.name}: "${t.text}"`;
        expect(t.left, where).toBeGreaterThanOrEqual(-0.5);
        expect(t.top, where).toBeGreaterThanOrEqual(-0.5);
        expect(t.right, where).toBeLessThanOrEqual(f.width + 0.5);
        expect(t.bottom, where).toBeLessThanOrEqual(f.height + 0.5);
        expect(textWidth(t.text, t.fontSize) + 0.5, where).toBeGreaterThanOrEqual(t.width);
      }
    }
  });

  for (const d of all) {
    it(`${d.name}: the screenshot is not blank`, () => {
      const w = Number(/width="(\d+)"/.exec(d.svg)?.[1]);
      const h = Number(/height="(\d+)"/.exec(d.svg)?.[1]);
      const html = join(dir, `${d.name}.html`);
      writeFileSync(html, page(d.svg));
      const png = join(dir, `${d.name}.png`);
      const img = decodePng(screenshot(html, w, h, png));
      expect([img.width, img.height]).toEqual([w, h]);
      const colours = new Set<number>();
      let ink = 0;
      for (let p = 0; p < img.width * img.height; p++) {
        const [r, g, b] = [img.rgba[4 * p] as number, img.rgba[4 * p + 1] as number, img.rgba[4 * p + 2] as number];
        colours.add((r << 16) | (g << 8) | b);
        if (r < 200 || g < 200 || b < 200) ink++;
      }
      const share = ink / (img.width * img.height);
      expect(colours.size, "distinct colours").toBeGreaterThan(16);
      expect(share, "share of inked pixels").toBeGreaterThan(0.01);
      expect(share, "share of inked pixels").toBeLessThan(0.6);
      const target = process.env["FW_WRITE_IMAGES"];
      const docName = DOC_IMAGES[d.name];
      if (target !== undefined && target !== "" && docName !== undefined) {
        expect(statSync(png).size, "a committed screenshot stays small").toBeLessThan(60_000);
        mkdirSync(target, { recursive: true });
        copyFileSync(png, join(target, docName));
      }
    });
  }

  it("cleans up", () => {
    rmSync(dir, { recursive: true, force: true });
  });
});
