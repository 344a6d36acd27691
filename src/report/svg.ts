/**
 * SVG plots of a design as built, for a design review: magnitude against
 * the spec mask (with the Monte Carlo spread of the boards if given), phase,
 * group delay, step response, pole-zero map, the signal level at every
 * op-amp output, and the output noise density. Plain SVG 1.1 text: no
 * scripts, no external fonts or files, every label inside the drawing.
 *
 * The frequency curves come from the stages' as-built responses with the
 * design's op-amp model on a grid refined where the curves turn, with every
 * peak and notch searched to its true extreme (src/report/plot/adaptive.ts);
 * the axes step by 1, 2 or 5 times a power of ten (degrees by 15 to 360,
 * frequencies by decades with minor lines at 2..9); the margins are sized
 * from the labels (src/report/plot/frame.ts); the traces are clipped at the
 * frame, not flattened onto it.
 *
 * @module
 */
import type { DesignResult } from "../design/index.ts";
import { requireDesignResult } from "../design/check.ts";
import type { MonteCarloEnvelope } from "../analysis/envelope.ts";
import type { NoiseAnalysisOptions } from "../analysis/noise.ts";
import { magnitudePlot } from "./plot/magnitude.ts";
import { phasePlot } from "./plot/phase.ts";
import { groupDelayPlot } from "./plot/group-delay.ts";
import { stepPlot } from "./plot/step.ts";
import { poleZeroPlot } from "./plot/pole-zero.ts";
import { opampLevelsPlot } from "./plot/opamp-levels.ts";
import { noisePlot } from "./plot/noise.ts";
import { plotSettings, PLOT_KINDS, type PlotKind } from "./plot/settings.ts";

export { PLOT_KINDS, type PlotKind };

/** Options of {@link toSvgPlot}. */
export interface SvgPlotOptions {
  /**
   * What to plot: `"magnitude"` (dB against the spec mask), `"phase"`
   * (degrees, unwrapped), `"group-delay"` (seconds), `"step"` (the output
   * for a 1 V step at the input), `"pole-zero"` (the as-built poles and
   * zeros, in Hz), `"opamp-levels"` (the gain to every op-amp output, or its
   * peak voltage when the spec gives signal levels) or `"noise"` (the output
   * noise density).
   * @defaultValue `"magnitude"`
   */
  readonly kind?: PlotKind;
  /**
   * Width in pixels (240 to 4000).
   * @defaultValue 720
   */
  readonly width?: number;
  /**
   * Height in pixels (200 to 4000).
   * @defaultValue 420
   */
  readonly height?: number;
  /**
   * Title above the plot (at most 300 characters; wrapped to the width).
   * @defaultValue the family, response, order and what is plotted
   */
  readonly title?: string;
  /**
   * First frequency of the frequency plots, Hz.
   * @defaultValue a decade below the lowest band edge, rounded down to 1, 2 or 5 times a power of ten
   */
  readonly startHz?: number;
  /**
   * Last frequency of the frequency plots, Hz (above `startHz`, at most nine decades above it).
   * @defaultValue a decade above the highest band edge, rounded up to 1, 2 or 5 times a power of ten
   */
  readonly stopHz?: number;
  /**
   * Shade the regions the spec forbids on the magnitude plot.
   * @defaultValue true
   */
  readonly mask?: boolean;
  /**
   * The spread of Monte Carlo boards to draw on the magnitude plot, from `monteCarloEnvelope`.
   * @defaultValue none
   */
  readonly envelope?: MonteCarloEnvelope;
  /**
   * Options of the noise analysis the noise plot draws (op-amp noise densities, temperature).
   * @defaultValue resistor noise only, at 300.15 K, 400 points over the plot's span
   */
  readonly noise?: NoiseAnalysisOptions;
  /**
   * Length of the step response shown, seconds.
   * @defaultValue twice the 2 % settling time where the response settles to a final value, at most seven time constants of the slowest pole
   */
  readonly durationS?: number;
}

/**
 * Plot a design as built (see the module header).
 *
 * @param result - a design
 * @param options - the kind of plot, its size, title and span, and what the kind draws
 * @returns SVG text
 * @throws {@link InvalidArgumentError} when `result` is not a design result, or an option is out of range (the path names it)
 * @throws `SingularCircuitError` for the noise plot of a circuit that cannot be solved
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const result = designFilter(spec);
 * toSvgPlot(result).startsWith("<svg"); //=> true
 * toSvgPlot(result, { kind: "step", width: 480, height: 300 }).includes('viewBox="0 0 480 300"'); //=> true
 * ```
 */
export function toSvgPlot(result: DesignResult, options: SvgPlotOptions = {}): string {
  const fn = "toSvgPlot";
  requireDesignResult(fn, result);
  const o = plotSettings(fn, result, options);
  switch (o.kind) {
    case "magnitude":
      return magnitudePlot(result, o);
    case "phase":
      return phasePlot(result, o);
    case "group-delay":
      return groupDelayPlot(result, o);
    case "step":
      return stepPlot(result, o);
    case "pole-zero":
      return poleZeroPlot(result, o);
    case "opamp-levels":
      return opampLevelsPlot(result, o);
    case "noise":
      return noisePlot(result, o);
  }
}
