/**
 * The phase plot: the as-built phase of the cascade in degrees over
 * frequency, unwrapped from the lowest frequency, in steps of 15, 30, 45,
 * 90, 180 or 360 degrees.
 *
 * @module
 */
import type { DesignResult } from "../../design/index.ts";
import { drawing, line } from "./draw.ts";
import { MAIN } from "./palette.ts";
import { sampleResponse } from "./response-curves.ts";
import type { PlotSettings } from "./settings.ts";

/** The finite range of a curve. */
export function finiteRange(ys: Float64Array): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of ys) {
    if (!Number.isFinite(v)) continue;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  if (!Number.isFinite(lo)) return [0, 1];
  return hi > lo ? [lo, hi] : [lo - 1, hi + 1];
}

/**
 * Draw the phase plot.
 *
 * @param result - a design (checked by the caller)
 * @param o - size, title, span
 * @returns SVG text
 */
export function phasePlot(result: DesignResult, o: PlotSettings): string {
  // a first look at the range on the starting grid sizes the tolerance
  const rough = sampleResponse(result, ["phase"], { startHz: o.startHz, stopHz: o.stopHz, heightPx: 40, ranges: [[0, 360]], maxPoints: 400 });
  const range = finiteRange(rough.curves[0] as Float64Array);
  const { freqHz, curves } = sampleResponse(result, ["phase"], { startHz: o.startHz, stopHz: o.stopHz, heightPx: Math.max(100, o.height - 140), ranges: [range] });
  const ph = curves[0] as Float64Array;
  const [lo, hi] = finiteRange(ph);
  const s = result.spec;
  const title = o.title ?? `${result.family} ${s.response}, ${result.filterOrder} poles: phase as built`;
  return drawing(
    {
      width: o.width,
      height: o.height,
      title,
      x: { scale: "log", min: o.startHz, max: o.stopHz, title: "Frequency", unit: "Hz", exact: true },
      y: { scale: "linear", min: lo, max: hi, title: "Phase", unit: "\u00b0", angular: true },
      legend: [{ label: "as built, unwrapped from the lowest frequency", stroke: MAIN, strokeWidth: 1.8 }],
      idSeed: `phase|${ph.length}|${ph[0]}|${ph[ph.length - 1]}`,
    },
    title,
    (f) => [line(f, freqHz, ph, { stroke: MAIN, width: 1.8 })],
  );
}
