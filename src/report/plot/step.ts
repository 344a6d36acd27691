/**
 * The step-response plot: the output of the design as built for a 1 V step
 * at its input, from the cascade's as-built poles and zeros
 * (src/analysis/poles-zeros.ts) through the exact zero-order-hold
 * propagation of src/tf/time.ts on a uniform time grid, with the final value
 * and, where there is one (a lowpass or bandstop), the overshoot and 2 %
 * settling time of src/tf/time.ts `stepFigures`.
 *
 * The time span is twice the settling time (where there is one), at most
 * seven time constants of the slowest pole (0.1 % left), unless the caller
 * gives one; the grid has 40 points per period of the fastest pole that
 * shapes the response (poles above 100 times the highest band edge, such as
 * an op-amp's own, are left out of that count), from 400 to 6000 points.
 *
 * @module
 */
import type { DesignResult } from "../../design/index.ts";
import { designPolesZeros } from "../../analysis/poles-zeros.ts";
import { stepFigures, stepResponse } from "../../tf/time.ts";
import { formatValue } from "../../units/index.ts";
import { TWO_PI } from "../../units/constants.ts";
import { drawing, line } from "./draw.ts";
import type { LegendEntry } from "./legend.ts";
import { MAIN } from "./palette.ts";
import { finiteRange } from "./phase.ts";
import type { PlotSettings } from "./settings.ts";

/** The step figures where the response has a final value to settle to (a lowpass or bandstop), else null. */
function figuresOf(result: DesignResult, zpk: Parameters<typeof stepFigures>[0]): ReturnType<typeof stepFigures> | null {
  const r = result.spec.response;
  if (r !== "lowpass" && r !== "bandstop") return null;
  try {
    return stepFigures(zpk);
  } catch {
    return null;
  }
}

/** The time grid of the plot: the caller's length, else twice the settling time, at most seven time constants of the slowest pole. */
function timeGrid(result: DesignResult, poles: readonly { re: number; im: number }[], durationS: number | undefined, settlingS: number | null): Float64Array {
  const top = TWO_PI * 100 * Math.max(...result.spec.passbandHz, ...result.spec.stopbandHz);
  const slow = Math.min(...poles.map((p) => -p.re));
  const shaping = poles.filter((p) => Math.hypot(p.re, p.im) <= top);
  const fast = Math.max(...(shaping.length > 0 ? shaping : poles).map((p) => Math.hypot(p.re, p.im)));
  const tEnd = durationS ?? (settlingS !== null && settlingS > 0 ? Math.min(7 / slow, 2 * settlingS) : 7 / slow);
  const n = Math.min(6000, Math.max(400, Math.ceil((tEnd * fast * 40) / TWO_PI)));
  return Float64Array.from({ length: n }, (_, k) => (tEnd * k) / (n - 1));
}

/** The legend's words for the final value and the step figures. */
function finalLabel(fig: ReturnType<typeof stepFigures> | null, finalV: number): string {
  if (fig === null) return `final value ${formatValue(finalV, { digits: 3, unit: "V" })}`;
  const settle = fig.settlingTimeS === null ? "" : `, within 2 % after ${formatValue(fig.settlingTimeS, { digits: 3, unit: "s" })}`;
  return `final value ${formatValue(finalV, { digits: 3, unit: "V" })}: overshoot ${fig.overshootPercent.toFixed(1)} %${settle}`;
}

/**
 * Draw the step-response plot.
 *
 * @param result - a design (checked by the caller)
 * @param o - size, title, duration
 * @returns SVG text
 */
export function stepPlot(result: DesignResult, o: PlotSettings): string {
  const { zpk } = designPolesZeros(result);
  const s = result.spec;
  const title = o.title ?? `${result.family} ${s.response}, ${result.filterOrder} poles: response to a 1 V step at the input, as built`;
  const stable = zpk.poles.length > 0 && zpk.poles.every((p) => p.re < 0);
  if (!stable) {
    return drawing(
      { width: o.width, height: o.height, title, x: { scale: "linear", min: 0, max: 1, title: "Time", unit: "s", prefixed: true }, y: { scale: "linear", min: -1, max: 1, title: "Output", unit: "V" }, legend: [{ label: "not stable as built: no step response", stroke: "#000000" }], idSeed: "step|unstable" },
      title,
      () => [],
    );
  }
  const fig = figuresOf(result, zpk);
  const t = timeGrid(result, zpk.poles, o.durationS, fig?.settlingTimeS ?? null);
  const y = stepResponse(zpk, t);
  // H(0) = gain prod(-z) / prod(-p), taken as complex products
  let nr = zpk.gain;
  let ni = 0;
  for (const z of zpk.zeros) [nr, ni] = [nr * -z.re - ni * -z.im, nr * -z.im + ni * -z.re];
  let dr = 1;
  let di = 0;
  for (const p of zpk.poles) [dr, di] = [dr * -p.re - di * -p.im, dr * -p.im + di * -p.re];
  const dc = (nr * dr + ni * di) / (dr * dr + di * di);
  const [lo, hi] = finiteRange(y);
  const yMin = Math.min(lo, 0, dc);
  const yMax = Math.max(hi, 0, dc);
  const pad = 0.05 * (yMax - yMin || 1);
  const legend: LegendEntry[] = [{ label: "output, as built", stroke: MAIN, strokeWidth: 1.8 }, { label: finalLabel(fig, dc), stroke: "#555555", dash: "5 4", strokeWidth: 1.2 }];
  const tEnd = t[t.length - 1] as number;
  return drawing(
    {
      width: o.width,
      height: o.height,
      title,
      x: { scale: "linear", min: 0, max: tEnd, title: "Time", unit: "s", prefixed: true, exact: true },
      y: { scale: "linear", min: yMin - pad, max: yMax + pad, title: "Output", unit: "V", prefixed: true },
      legend,
      idSeed: `step|${y.length}|${y[1]}|${y[y.length - 1]}`,
    },
    title,
    (f) => [line(f, [0, tEnd], [dc, dc], { stroke: "#555555", width: 1.2, dash: "5 4" }), line(f, t, y, { stroke: MAIN, width: 1.8 })],
  );
}
