/**
 * The headroom section of a design report: the largest gain from the filter
 * input to every op-amp output (internal nodes of multi-amplifier stages
 * included), and with the spec's signal levels each output's peak voltage,
 * its margin to the output swing, and the dynamic range.
 *
 * Dynamic range: the design's own `verification.headroom.dynamicRange`
 * (src/design/headroom.ts): the largest input that clips no op-amp output
 * through the passband gain, over the RMS output noise across the response
 * span (resistors, and the op-amps when the spec's levels give their noise).
 *
 * @module
 */
import { formatValue } from "../units/index.ts";
import type { DesignResult } from "../design/index.ts";
import { hertz } from "../design/text.ts";

const hz = (x: number): string => hertz(x);
const dB = (x: number): string => `${x.toFixed(2)} dB`;
const n4 = (x: number): string => Number(x.toPrecision(4)).toString();

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
  const dr = h?.dynamicRange;
  if (dr !== undefined) {
    const [lo, hi] = dr.bandHz;
    const levels = result.spec.levels;
    const opamps = dr.opampNoise && levels !== null
      ? `resistor and op-amp noise (${formatValue(levels.opampVoltageNoise, { digits: 3, unit: "V" })}/√Hz, ${formatValue(levels.opampCurrentNoise, { digits: 3, unit: "A" })}/√Hz)`
      : "resistor noise (op-amp noise not included: give levels.opampVoltageNoise for it)";
    L.push(
      `Dynamic range: ${dB(dr.rangeDb)}, from the largest input that clips nothing (${n4(dr.maxInputPeakV)} V peak) through the passband gain, over ${formatValue(dr.noiseRmsV, { digits: 3, unit: "V" })} RMS of ${opamps} at the output across ${hz(lo)} – ${hz(hi)}.`,
      "",
    );
  }
  return L;
}
