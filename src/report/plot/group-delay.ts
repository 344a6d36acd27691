/**
 * The group-delay plot: `-d(phase)/d(omega)` of the as-built cascade over
 * frequency, in one SI prefix of seconds for the whole axis. The axis is
 * sized to the delay across the passbands (from zero, unless it goes
 * negative there), which is what a design is judged by: the spikes at the
 * transmission zeros, where the phase turns by half a turn over a narrow
 * band, run off the frame and are clipped at its edge.
 *
 * @module
 */
import type { DesignResult } from "../../design/index.ts";
import { drawing, line } from "./draw.ts";
import { MAIN } from "./palette.ts";
import { finiteRange } from "./phase.ts";
import { maskRegions } from "./mask-regions.ts";
import { sampleResponse } from "./response-curves.ts";
import type { PlotSettings } from "./settings.ts";

/**
 * Draw the group-delay plot.
 *
 * @param result - a design (checked by the caller)
 * @param o - size, title, span
 * @returns SVG text
 */
export function groupDelayPlot(result: DesignResult, o: PlotSettings): string {
  const rough = sampleResponse(result, ["group-delay"], { startHz: o.startHz, stopHz: o.stopHz, heightPx: 40, ranges: [[0, 1]], maxPoints: 400 });
  const [rlo, rhi] = finiteRange(rough.curves[0] as Float64Array);
  const { freqHz, curves } = sampleResponse(result, ["group-delay"], {
    startHz: o.startHz,
    stopHz: o.stopHz,
    heightPx: Math.max(100, o.height - 140),
    ranges: [[Math.min(0, rlo), rhi]],
  });
  const gd = curves[0] as Float64Array;
  const pass = maskRegions(result).filter((r) => r.lowDb === -Infinity);
  const inPass = gd.filter((_, i) => pass.some((r) => (freqHz[i] as number) >= r.lowHz && (freqHz[i] as number) <= r.highHz));
  const [lo, hi] = finiteRange(inPass.length >= 2 ? inPass : gd);
  const s = result.spec;
  const title = o.title ?? `${result.family} ${s.response}, ${result.filterOrder} poles: group delay as built`;
  return drawing(
    {
      width: o.width,
      height: o.height,
      title,
      x: { scale: "log", min: o.startHz, max: o.stopHz, title: "Frequency", unit: "Hz", exact: true },
      y: { scale: "linear", min: Math.min(0, lo), max: hi + 0.25 * Math.abs(hi - Math.min(0, lo)), title: "Group delay", unit: "s", prefixed: true },
      legend: [{ label: "as built", stroke: MAIN, strokeWidth: 1.8 }],
      idSeed: `group-delay|${gd.length}|${gd[0]}|${gd[gd.length - 1]}`,
    },
    title,
    (f) => [line(f, freqHz, gd, { stroke: MAIN, width: 1.8 })],
  );
}
