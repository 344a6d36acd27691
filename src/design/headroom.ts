/**
 * Headroom: the largest gain from the filter input to every stage output and
 * every op-amp output (internal nodes of multi-amplifier stages included),
 * found rather than sampled, and the clipping check of each op-amp output at
 * the spec's signal levels.
 *
 * Method: each stage's as-built transfer functions to its op-amp outputs
 * (src/evaluate/opamp-outputs.ts; nodal equations by Cramer's rule), the
 * partial cascade before it multiplied in, and the maximum of |H|^2 found
 * on a grid that follows the poles' and zeros' Q with golden-section
 * refinement of every local maximum (src/evaluate/peak-gain.ts; J. Kiefer,
 * Proc. AMS 4(3):502-506, 1953), over the peak span ({@link peakSpanHz}: a
 * decade beyond the mask's edges, widened to the passbands the mask checks, so
 * a highpass is searched up to its passband top where a real op-amp's
 * bandwidth makes the response peak), DC and the high-frequency limit. Accuracy: within 1e-6 dB
 * of a 200,000-point evaluation refined the same way (test/design/headroom.test.ts
 * asks for 0.01 dB). The margin of an op-amp output is `20 log10(swing /
 * peak)` with `peak = inputPeakV * gain` (the sinusoidal steady state; a
 * step or a burst can overshoot further).
 *
 * Where a stage's polynomials cannot be formed (its equations singular at
 * every sample radius) the peaks fall back to the values on the design's
 * section grid, by nodal analysis; a grid misses narrow peaks.
 *
 * @module
 */
import { acAnalysis } from "../circuit/mna.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import { opampOutputTransfers, type OpampOutput } from "../evaluate/opamp-outputs.ts";
import { cascadePeaks, type TappedStage } from "../evaluate/peak-gain.ts";
import { INTERNAL_NODE_PREFIX, stageElements } from "../evaluate/stage-polynomials.ts";
import { TWO_PI } from "../units/constants.ts";
import type { DesignSpec } from "./spec.ts";
import { significant } from "./text.ts";
import type { DesignStage, DesignWarning, DynamicRange, Headroom, OpampPeak } from "./types.ts";
import type { SignalLevels } from "./spec-types.ts";
import { stagesElements } from "./circuit.ts";
import { circuitNoise, integrateLogGrid, logGridHz } from "../circuit/noise.ts";
import { maskBands, maskPlan, multiplyInPlace, responseSpanHz, spanRadS, type BuiltStage } from "./verify.ts";

/** A gain peak, V/V at Hz. */
export interface GainAt {
  /** Gain, V/V. */
  readonly gain: number;
  /** Where, Hz. */
  readonly hz: number;
}

/** The peaks of one stage: to its output, and to each op-amp output by local designator and node. */
export interface StagePeakGains {
  /** From the filter input to the stage output. */
  readonly output: GainAt;
  /** From the filter input to each op-amp output, in the order of the stage's elements (its op-amp designators' order). */
  readonly opamps: readonly (GainAt & { readonly node: string })[];
}

/**
 * Where the peaks are searched, Hz: a decade below the lowest mask edge to a
 * decade above the highest, widened to the passbands the mask checks.
 *
 * @param spec - canonical spec
 * @returns `[lowHz, highHz]`
 */
export function peakSpanHz(spec: DesignSpec): readonly [number, number] {
  const [lo, hi] = responseSpanHz(spec);
  const pass = maskBands(spec).pass;
  return [Math.min(lo, ...pass.map((b) => b[0])), Math.max(hi, ...pass.map((b) => b[1]))];
}

/** Peaks as V/V at Hz from a found |H|^2 at rad/s. */
function gainAt(p: { readonly radS: number; readonly magnitudeSquared: number }): GainAt {
  return { gain: Math.sqrt(p.magnitudeSquared), hz: p.radS / TWO_PI };
}

/**
 * The found peaks of a built cascade (see the module header).
 *
 * @param spec - canonical spec (for the span)
 * @param stages - the stages as built, in cascade order
 * @param opamp - the op-amp model
 * @param fallbackHz - the grid for the fallback when a stage's polynomials cannot be formed
 * @returns one entry per stage
 */
export function stagePeakGains(spec: DesignSpec, stages: readonly BuiltStage[], opamp: OpAmpModel, fallbackHz: Float64Array): StagePeakGains[] {
  const polySpan = spanRadS(maskPlan(spec).bands);
  const outputs: OpampOutput[][] = [];
  for (const s of stages) {
    const o = opampOutputTransfers(s.topology, s.values, opamp, polySpan);
    if (o === null) return sampledPeakGains(stages, opamp, fallbackHz);
    outputs.push(o);
  }
  const tapped: TappedStage[] = outputs.map((o) => ({
    output: (o.find((x) => x.node === "out") as OpampOutput).transfer,
    taps: o.map((x) => x.transfer),
  }));
  const [lo, hi] = peakSpanHz(spec);
  return cascadePeaks(tapped, [TWO_PI * lo, TWO_PI * hi]).map((p, i) => ({
    output: gainAt(p.output),
    opamps: p.taps.map((t, j) => ({ ...gainAt(t), node: ((outputs[i] as OpampOutput[])[j] as OpampOutput).node })),
  }));
}

/** The largest |h| on the grid and where. */
function gridMax(re: Float64Array, im: Float64Array, gridHz: Float64Array): GainAt {
  let gain = 0;
  let hz = gridHz[0] as number;
  for (let i = 0; i < gridHz.length; i++) {
    const m = Math.hypot(re[i] as number, im[i] as number);
    if (m > gain) [gain, hz] = [m, gridHz[i] as number];
  }
  return { gain, hz };
}

/**
 * The peaks sampled on a grid by nodal analysis of each stage's elements
 * (the fallback of {@link stagePeakGains}; a grid misses narrow peaks).
 *
 * @param stages - the stages as built
 * @param opamp - the op-amp model
 * @param gridHz - frequencies, Hz
 * @returns one entry per stage
 */
export function sampledPeakGains(stages: readonly BuiltStage[], opamp: OpAmpModel, gridHz: Float64Array): StagePeakGains[] {
  const re = new Float64Array(gridHz.length).fill(1);
  const im = new Float64Array(gridHz.length);
  return stages.map((s) => {
    const elements = stageElements(s.topology, s.values, opamp);
    const taps = elements.flatMap((e) => (e.kind === "OA" ? [e.out] : []));
    const h = acAnalysis({ title: s.topology.id, elements }, { source: "Vin", outputs: taps, freqHz: gridHz }).outputs;
    const opamps = taps.map((node) => {
      const r = re.slice();
      const i = im.slice();
      multiplyInPlace(r, i, h[node] as { re: Float64Array; im: Float64Array });
      return { ...gridMax(r, i, gridHz), node: node === "out" ? "out" : node.slice(INTERNAL_NODE_PREFIX.length) };
    });
    multiplyInPlace(re, im, h["out"] as { re: Float64Array; im: Float64Array });
    return { output: gridMax(re, im, gridHz), opamps };
  });
}

/**
 * The result's op-amp peaks of one stage: each op-amp's designator with its peak.
 *
 * @param peaks - the stage's peaks
 * @param designators - the stage's op-amp designators, in element order
 * @returns one entry per op-amp
 */
export function opampPeaksOf(peaks: StagePeakGains, designators: readonly string[]): OpampPeak[] {
  return peaks.opamps.map((p, j) => ({ opamp: designators[j] as string, gain: p.gain, hz: p.hz, node: p.node }));
}

/**
 * The clipping check of every op-amp output at the spec's signal levels.
 *
 * @param spec - canonical spec
 * @param stages - the result's stages, with their op-amp peaks
 * @returns the headroom, or undefined when the spec gives no levels
 */
export function headroomOf(spec: DesignSpec, stages: readonly DesignStage[]): Headroom | undefined {
  const levels = spec.levels;
  if (levels === null || levels === undefined) return undefined;
  const opamps = stages.flatMap((st) =>
    st.opampPeaks.map((p) => {
      const peakV = levels.inputPeakV * p.gain;
      return { opamp: p.opamp, stage: st.index, peakV, hz: p.hz, marginDb: 20 * Math.log10(levels.outputSwingV / peakV) };
    }),
  );
  let worst = opamps[0] as Headroom["opamps"][number];
  for (const o of opamps) if (o.marginDb < worst.marginDb) worst = o;
  return {
    inputPeakV: levels.inputPeakV,
    outputSwingV: levels.outputSwingV,
    worstOpamp: worst.opamp,
    worstMarginDb: worst.marginDb,
    clips: worst.marginDb < 0,
    opamps,
    dynamicRange: dynamicRangeOf(spec, stages, levels.outputSwingV / Math.max(...stages.flatMap((st) => st.opampPeaks.map((p) => p.gain)))),
  };
}

/** Points of the noise grid over the response span (the default of `noiseAnalysis`). */
const NOISE_POINTS = 200;

/** The resistors' temperature for the noise, kelvin (27 °C, SPICE's nominal). */
const NOISE_TEMPERATURE_K = 300.15;

/** The dynamic range of the cascade at the spec's levels (see `DynamicRange`). */
function dynamicRangeOf(spec: DesignSpec, stages: readonly DesignStage[], maxInputPeakV: number): DynamicRange {
  const levels = spec.levels as SignalLevels;
  const en = levels.opampVoltageNoise ?? 0;
  const inoise = levels.opampCurrentNoise ?? 0;
  const bandHz = responseSpanHz(spec);
  const freqHz = logGridHz(bandHz[0], bandHz[1], NOISE_POINTS);
  const circuit = { title: "dynamic range", elements: stagesElements(stages, spec.opamp, "Vin") };
  const noise = circuitNoise("designFilter", circuit, { output: "out", freqHz, temperatureK: NOISE_TEMPERATURE_K, opampVoltageNoise: en, opampCurrentNoise: inoise });
  const noiseRmsV = Math.sqrt(integrateLogGrid(noise.total, freqHz));
  return {
    maxInputPeakV,
    noiseRmsV,
    rangeDb: 20 * Math.log10((maxInputPeakV * spec.gain) / Math.SQRT2 / noiseRmsV),
    bandHz: [bandHz[0], bandHz[1]],
    opampNoise: en > 0 || inoise > 0,
  };
}

/**
 * The warning for a design whose op-amp outputs clip at the spec's levels.
 *
 * @param h - the headroom check
 * @returns the warning, or null when nothing clips
 */
export function clipWarning(h: Headroom | undefined): DesignWarning | null {
  if (h === undefined || !h.clips) return null;
  const over = h.opamps.filter((o) => o.marginDb < 0);
  const worst = over.reduce((a, b) => (b.marginDb < a.marginDb ? b : a));
  const list = over.map((o) => `${o.opamp} (stage ${o.stage}) ${significant(o.peakV, 3)} V at ${significant(o.hz, 4)} Hz`).join(", ");
  return {
    code: "clips",
    stage: worst.stage,
    message: `at ${significant(h.inputPeakV, 3)} V peak in, ${over.length === 1 ? "an op-amp output exceeds" : "op-amp outputs exceed"} the ${significant(h.outputSwingV, 3)} V output swing: ${list}; the worst, ${worst.opamp}, by ${significant(-worst.marginDb, 3)} dB. Lower the input level or the filter gain, use op-amps with a larger swing, or move gain to the later stages.`,
  };
}
