/**
 * The noise plot: the output noise density of the design over frequency
 * (src/analysis/noise.ts: every resistor's thermal noise and, when given,
 * the op-amps' input noise, through the whole circuit), with the four
 * largest contributors, on logarithmic axes.
 *
 * @module
 */
import type { DesignResult } from "../../design/index.ts";
import { noiseAnalysis, type NoiseAnalysisResult } from "../../analysis/noise.ts";
import { InvalidArgumentError } from "../../errors.ts";
import { formatValue } from "../../units/index.ts";
import { drawing, line } from "./draw.ts";
import type { LegendEntry } from "./legend.ts";
import { traceStyle } from "./palette.ts";
import type { PlotSettings } from "./settings.ts";

/**
 * Draw the noise plot.
 *
 * @param result - a design (checked by the caller)
 * @param o - size, title, span, the noise analysis's options (its band and points are the plot's)
 * @returns SVG text
 */
export function noisePlot(result: DesignResult, o: PlotSettings): string {
  let n: NoiseAnalysisResult;
  try {
    n = noiseAnalysis(result, { ...o.noise, bandHz: [o.startHz, o.stopHz], points: 400 });
  } catch (e) {
    // an option of the caller's noise options: name it where the caller wrote it
    if (e instanceof InvalidArgumentError && e.fn === "noiseAnalysis" && e.path.startsWith("options.")) {
      throw new InvalidArgumentError({ fn: "toSvgPlot", path: `options.noise.${e.path.slice("options.".length)}`, received: e.received, message: e.reason });
    }
    throw e;
  }
  const top = n.topContributors.slice(0, 4).filter((c) => c.powerFraction > 0);
  const curves = [n.outputDensity, ...top.map((c) => n.contributions[c.name] as Float64Array)];
  let hi = 0;
  for (const v of n.outputDensity) if (Number.isFinite(v)) hi = Math.max(hi, v);
  let lo = Infinity;
  for (const c of curves) for (const v of c) if (v > 0 && Number.isFinite(v)) lo = Math.min(lo, v);
  if (!(hi > 0)) hi = 1e-9;
  lo = Math.max(Number.isFinite(lo) ? lo : hi / 100, hi / 1e4);
  const legend: LegendEntry[] = [
    { label: `total: ${formatValue(n.totalRmsV, { digits: 3, unit: "V" })} RMS over the span`, stroke: traceStyle(0).stroke, strokeWidth: 2 },
    ...top.map((c, i) => ({ label: `${c.name}: ${(c.powerFraction * 100).toFixed(1)} % of the power`, stroke: traceStyle(i + 1).stroke, dash: "6 3", strokeWidth: 1.3 })),
  ];
  const s = result.spec;
  const title = o.title ?? `${result.family} ${s.response}, ${result.filterOrder} poles: output noise density`;
  return drawing(
    {
      width: o.width,
      height: o.height,
      title,
      x: { scale: "log", min: o.startHz, max: o.stopHz, title: "Frequency", unit: "Hz", exact: true },
      y: { scale: "log", min: lo, max: hi * 1.2, title: "Noise density", unit: "V/\u221aHz" },
      legend,
      idSeed: `noise|${n.totalRmsV}`,
    },
    title,
    (f) => [
      ...top.map((c, i) => line(f, n.freqHz, n.contributions[c.name] as Float64Array, { stroke: traceStyle(i + 1).stroke, width: 1.3, dash: "6 3" })),
      line(f, n.freqHz, n.outputDensity, { stroke: traceStyle(0).stroke, width: 2 }),
    ],
  );
}
