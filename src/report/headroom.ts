/**
 * The headroom section of a design report: the largest gain from the filter
 * input to every op-amp output (internal nodes of multi-amplifier stages
 * included), and with the spec's signal levels each output's peak voltage,
 * its margin to the output swing, and the dynamic range.
 *
 * Dynamic range: the largest input that clips no op-amp output
 * (`min over op-amps of swing / gain`), carried to the output by the
 * passband gain as a sinusoid (RMS = peak / sqrt 2), over the RMS output
 * noise of the resistors' thermal noise across the response span
 * (src/analysis/noise.ts; op-amp noise is not in the spec, so it is left
 * out and the figure is an upper bound).
 *
 * @module
 */
import { formatValue } from "../units/index.ts";
import { responseSpanHz, type DesignResult } from "../design/index.ts";
import { noiseAnalysis } from "../analysis/index.ts";
import { hertz } from "../design/text.ts";

const hz = (x: number): string => hertz(x);
const dB = (x: number): string => `${x.toFixed(2)} dB`;
const n4 = (x: number): string => Number(x.toPrecision(4)).toString();

/** The figures of the dynamic range at the spec's levels. */
export interface DynamicRange {
  /** The largest input amplitude that clips no op-amp output, volts peak. */
  readonly maxInputPeakV: number;
  /** RMS output noise over the response span (resistors only), volts. */
  readonly noiseRmsV: number;
  /** `20 log10((maxInputPeakV * passband gain / sqrt 2) / noiseRmsV)`, dB. */
  readonly rangeDb: number;
}

/**
 * The dynamic range of a design at its spec's output swing (see the module
 * header), or undefined when the spec gives no signal levels.
 *
 * @param result - a design (checked by the caller)
 * @returns the figures, or undefined
 */
export function dynamicRange(result: DesignResult): DynamicRange | undefined {
  const h = result.verification.headroom;
  if (h === undefined) return undefined;
  const gains = result.stages.flatMap((st) => st.opampPeaks.map((p) => p.gain));
  const maxInputPeakV = h.outputSwingV / Math.max(...gains);
  const noiseRmsV = noiseAnalysis(result).totalRmsV;
  return { maxInputPeakV, noiseRmsV, rangeDb: 20 * Math.log10((maxInputPeakV * result.spec.gain) / Math.SQRT2 / noiseRmsV) };
}

/**
 * The Markdown lines of the headroom section.
 *
 * @param result - a design (checked by the caller)
 * @returns the lines, ending with an empty one
 */
export function headroomLines(result: DesignResult): string[] {
  const h = result.verification.headroom;
  const L: string[] = ["## Headroom (every op-amp output)", ""];
  L.push(
    h === undefined
      ? "Largest gain from the filter input to each op-amp output, from a decade below the lowest band edge to a decade above the highest (and over every passband the mask checks), DC and the high-frequency limit, found by search (not sampled). Give the spec's `levels` for a clipping check."
      : `At ${n4(h.inputPeakV)} V peak in, against an output swing of ${n4(h.outputSwingV)} V peak: ${h.clips ? `**clips**, worst ${h.worstOpamp} by ${dB(-h.worstMarginDb)}` : `no op-amp output clips; least margin ${dB(h.worstMarginDb)} (${h.worstOpamp})`}.`,
    "",
  );
  L.push(
    `| op-amp | stage | node | peak gain | at |${h === undefined ? "" : " peak output | margin |"}`,
    `|---|---|---|---|---|${h === undefined ? "" : "---|---|"}`,
  );
  for (const st of result.stages) {
    for (const p of st.opampPeaks) {
      const o = h?.opamps.find((x) => x.opamp === p.opamp);
      const levels = o === undefined ? "" : ` ${n4(o.peakV)} V | ${dB(o.marginDb)}${o.marginDb < 0 ? " (clips)" : ""} |`;
      L.push(`| ${p.opamp} | ${st.index} | ${p.node === "out" ? "stage output" : p.node} | ${dB(20 * Math.log10(p.gain))} (${n4(p.gain)} V/V) | ${hz(p.hz)} |${levels}`);
    }
  }
  L.push("");
  const dr = dynamicRange(result);
  if (dr !== undefined) {
    const [lo, hi] = responseSpanHz(result.spec);
    L.push(
      `Dynamic range: ${dB(dr.rangeDb)}, from the largest input that clips nothing (${n4(dr.maxInputPeakV)} V peak) through the passband gain, over ${formatValue(dr.noiseRmsV, { digits: 3, unit: "V" })} RMS of resistor noise at the output across ${hz(lo)} – ${hz(hi)} (op-amp noise not included).`,
      "",
    );
  }
  return L;
}
