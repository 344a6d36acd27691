import { describe, expect, it } from "vitest";
import { toSvgPlot, PLOT_KINDS } from "../../../src/report/svg.ts";
import { monteCarloEnvelope } from "../../../src/analysis/envelope.ts";
import { InvalidArgumentError } from "../../../src/errors.ts";
import { thrownBy } from "../../helpers/throws.ts";
import { textBoxes, viewBox } from "../../helpers/svg-bounds.ts";
import { plotDesign } from "../../helpers/plot-designs.ts";

const designs = ["lowpass", "bandstop", "bandpass"] as const;
const sizes = [
  { width: 720, height: 420 },
  { width: 320, height: 240 },
];

describe("toSvgPlot: every kind for a lowpass, a bandstop with a notch and a bandpass", () => {
  for (const name of designs) {
    for (const kind of PLOT_KINDS) {
      it(`${kind} of the ${name}: well-formed, no label outside the viewBox, traces in a clip path`, () => {
        const r = plotDesign(name);
        for (const size of sizes) {
          const svg = toSvgPlot(r, { kind, ...size });
          expect(svg.startsWith("<svg")).toBe(true);
          expect(svg.trimEnd().endsWith("</svg>")).toBe(true);
          expect(svg).not.toMatch(/NaN|Infinity|undefined/);
          expect(svg).not.toContain("<script");
          const vb = viewBox(svg);
          expect(vb).toEqual(size);
          const boxes = textBoxes(svg);
          expect(boxes.length).toBeGreaterThan(5);
          for (const b of boxes) {
            expect(b.x0, `"${b.text}" left`).toBeGreaterThanOrEqual(0);
            expect(b.x1, `"${b.text}" right`).toBeLessThanOrEqual(vb.width);
            expect(b.y0, `"${b.text}" top`).toBeGreaterThanOrEqual(0);
            expect(b.y1, `"${b.text}" bottom`).toBeLessThanOrEqual(vb.height);
          }
          // the data sit in the clip group, which references a clip path defined in this drawing
          const id = /<clipPath id="(fw-clip-[0-9a-f]{8})">/.exec(svg)?.[1];
          expect(id).toBeDefined();
          expect(svg).toContain(`<g clip-path="url(#${id})">`);
        }
      });
    }
  }

  it("labels no two ticks of an axis alike and the axes with their units", () => {
    const svg = toSvgPlot(plotDesign("lowpass"));
    expect(svg).toContain("Frequency (Hz)");
    expect(svg).toContain("Magnitude (dB)");
    const labels = [...svg.matchAll(/<text[^>]*text-anchor="end">([^<]*)<\/text>/g)].map((m) => m[1]);
    expect(new Set(labels).size).toBe(labels.length);
    // every dB tick a multiple of 10 or 20 (1-2-5 steps), none at odd values such as -15 or -39
    for (const l of labels) expect(Math.abs(Number((l as string).replace("\u2212", "-")) % 10)).toBe(0);
  });

  it("draws the trace past the frame's edge into the clip path rather than clamping it onto the edge (no false floor)", () => {
    // the lowpass's stopband zero is on the j-omega axis (ideal op-amp): an infinitely deep notch, far below the frame
    const svg = toSvgPlot(plotDesign("lowpass"));
    const frame = /<rect x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)" fill="none" stroke="#333333"/.exec(svg);
    expect(frame).not.toBeNull();
    const bottom = Number(frame?.[2]) + Number(frame?.[4]);
    const main = [...svg.matchAll(/<path d="([^"]+)" fill="none" stroke="#0072b2" stroke-width="1.8"/g)].map((m) => m[1] as string);
    expect(main).toHaveLength(1);
    const ys = [...(main[0] as string).matchAll(/[ML][-\d.]+,([-\d.]+)/g)].map((m) => Number(m[1]));
    // the notch goes below the frame: the line reaches past the bottom edge (cut at 4 px beyond it)
    expect(Math.max(...ys)).toBeGreaterThan(bottom + 1);
    // and no run of points lies along the bottom edge
    const onEdge = ys.filter((y) => Math.abs(y - bottom) < 0.05).length;
    expect(onEdge).toBeLessThan(3);
  });

  it("draws a Monte Carlo envelope as a band and its outer lines", () => {
    const r = plotDesign("lowpass");
    const envelope = monteCarloEnvelope(r, { runs: 64, points: 120 });
    const svg = toSvgPlot(r, { envelope });
    expect(svg).toContain(`90 % of ${64 - envelope.leftOut} boards`);
    expect(svg).toMatch(/fill="#56b4e9" fill-opacity="0.45" stroke="none"/);
  });

  it("keeps the old calls working: no options, kind magnitude, kind group-delay", () => {
    const r = plotDesign("lowpass");
    expect(toSvgPlot(r)).toBe(toSvgPlot(r, { kind: "magnitude" }));
    expect(toSvgPlot(r, { kind: "group-delay", width: 600, height: 300 })).toContain('viewBox="0 0 600 300"');
  });

  it("gives the same text for the same call (no counters, no clock)", () => {
    const r = plotDesign("bandpass");
    expect(toSvgPlot(r, { kind: "pole-zero" })).toBe(toSvgPlot(r, { kind: "pole-zero" }));
    expect(toSvgPlot(r, { kind: "pole-zero" })).not.toBe(toSvgPlot(plotDesign("lowpass"), { kind: "pole-zero" }).replace(/x/g, "x"));
  });

  it("names the option that is out of range", () => {
    const r = plotDesign("lowpass");
    const path = (o: unknown): string | undefined => thrownBy(() => toSvgPlot(r, o as never), InvalidArgumentError).path;
    expect(path({ kind: "bode" })).toBe("options.kind");
    expect(path({ width: 10 })).toBe("options.width");
    expect(path({ height: 1.5e9 })).toBe("options.height");
    expect(path({ startHz: -1 })).toBe("options.startHz");
    expect(path({ startHz: 1000, stopHz: 10 })).toBe("options.stopHz");
    expect(path({ mask: "yes" })).toBe("options.mask");
    expect(path({ envelope: { freqHz: [1, 2] } })).toBe("options.envelope.freqHz");
    expect(path({ durationS: 0 })).toBe("options.durationS");
    expect(path({ title: 5 })).toBe("options.title");
    expect(path({ kind: "noise", noise: { temperatureK: -3 } })).toBe("options.noise.temperatureK");
    expect(thrownBy(() => toSvgPlot({} as never), InvalidArgumentError).fn).toBe("toSvgPlot");
  });
});
