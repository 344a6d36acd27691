/**
 * What each stage asks of its op-amp: gain-bandwidth, output swing and slew
 * rate for a given input amplitude.
 *
 * Method: the output of stage k for a sinusoidal input of peak amplitude A at
 * frequency f has peak A |H_k(f)| and peak slope 2 pi f A |H_k(f)|, where H_k
 * is the as-built transfer function from the filter input to that stage's
 * output; the requirement is the largest value over a dense log grid (200
 * points per decade over the design's response span). The gain-bandwidth
 * demand is the topology's own figure (f0 and Q within about 1 %). Slew rate
 * of a sinusoid: e.g. P. Horowitz and W. Hill, "The Art of Electronics", 3rd
 * ed., 2015, sec. 4.4.
 *
 * @module
 */
import { logGrid } from "../tf/index.ts";
import { requireOptions, requirePositive } from "../validate.ts";
import { TWO_PI } from "../units/constants.ts";
import { responseSpanHz, type DesignResult } from "../design/index.ts";
import { builtStages } from "../design/response.ts";
import { multiplyInPlace } from "../design/verify.ts";
import { requireDesignResult } from "../design/check.ts";

/** Options of {@link opampRequirements}. */
export interface OpampRequirementOptions {
  /**
   * Peak amplitude of the largest sinusoid at the filter input, volts.
   * @defaultValue 1
   */
  readonly inputPeakV?: number;
}

/** What one stage asks of its op-amp(s). */
export interface StageOpampRequirement {
  /** Stage index (from 1). */
  readonly stage: number;
  /** Op-amp designators. */
  readonly opamps: readonly string[];
  /** Gain-bandwidth product needed for about 1 % accuracy of f0 and Q, Hz. */
  readonly gbwDemandHz: number;
  /** Largest gain from the filter input to this stage's output, V/V. */
  readonly peakGain: number;
  /** Frequency of that largest gain, Hz. */
  readonly peakHz: number;
  /** Largest output amplitude for the given input, volts peak. */
  readonly peakOutputV: number;
  /** Largest output slope for the given input, V/s. */
  readonly slewRateVPerS: number;
  /** Frequency at which the slope is largest, Hz. */
  readonly slewHz: number;
}

/**
 * Per-stage op-amp requirements of a design: gain-bandwidth, output swing and
 * slew rate for sinusoids up to `inputPeakV` across the design's frequency span.
 *
 * @param result - a design
 * @param options - the input amplitude
 * @returns one requirement per stage, in cascade order
 * @throws `InvalidArgumentError` when `inputPeakV` is not a positive number
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * opampRequirements(designFilter(spec), { inputPeakV: 2 })[0].peakOutputV; //=> 1.9890423627340301
 * ```
 */
export function opampRequirements(result: DesignResult, options?: OpampRequirementOptions): StageOpampRequirement[] {
  requireDesignResult("opampRequirements", result);
  const fn = "opampRequirements";
  const o = requireOptions(fn, "options", options);
  const amp = o["inputPeakV"] === undefined ? 1 : requirePositive(fn, "options.inputPeakV", o["inputPeakV"]);
  const [lo, hi] = responseSpanHz(result.spec);
  const n = Math.ceil(Math.log10(hi / lo) * 200) + 1;
  const f = logGrid(lo, hi, n);
  const stages = builtStages(result);
  const re = new Float64Array(n).fill(1);
  const im = new Float64Array(n);
  return stages.map((s, k) => {
    multiplyInPlace(re, im, s.topology.response(s.values, f, result.spec.opamp));
    let peak = 0;
    let peakHz = f[0] as number;
    let slew = 0;
    let slewHz = f[0] as number;
    for (let i = 0; i < n; i++) {
      const m = Math.hypot(re[i] as number, im[i] as number);
      if (m > peak) {
        peak = m;
        peakHz = f[i] as number;
      }
      const sl = TWO_PI * (f[i] as number) * m;
      if (sl > slew) {
        slew = sl;
        slewHz = f[i] as number;
      }
    }
    const st = result.stages[k] as DesignResult["stages"][number];
    return {
      stage: st.index,
      opamps: st.opamps,
      gbwDemandHz: st.gbwDemandHz,
      peakGain: peak,
      peakHz,
      peakOutputV: peak * amp,
      slewRateVPerS: slew * amp,
      slewHz,
    };
  });
}
