/**
 * Output noise of a finished design: the noise density at node `out` from the
 * thermal noise of every resistor and the input noise of every op-amp, each
 * source's share, and the RMS noise over a band.
 *
 * Method: the adjoint-network noise analysis of src/circuit/noise.ts on the
 * whole-filter circuit (`designCircuit`): every resistor's thermal noise and
 * every op-amp's input voltage and current noise, uncorrelated; the RMS noise
 * by the trapezoidal rule in ln f on a log grid. Accuracy as stated there:
 * densities to about 1e-13 relative, the RMS to 1e-3 for the default
 * 200-point grid unless a stage's Q is above about 20.
 *
 * @module
 */
import { withDisplay } from "../display.ts";
import { noiseBundle } from "./display.ts";
import { InvalidArgumentError } from "../errors.ts";
import { requireInRange, requireInteger, requireOptions } from "../validate.ts";
import type { DesignResult } from "../design/index.ts";
import { designCircuit } from "../design/circuit.ts";
import { responseSpanHz } from "../design/verify.ts";
import { requireDesignResult } from "../design/check.ts";
import { BOLTZMANN_J_PER_K, circuitNoise, integrateLogGrid, logGridHz } from "../circuit/noise.ts";

export { BOLTZMANN_J_PER_K };

/** Options of {@link noiseAnalysis}. */
export interface NoiseAnalysisOptions {
  /**
   * Absolute temperature of the resistors, kelvin (1 to 1000). The default is
   * 27 °C, the nominal temperature SPICE simulators use, so results compare
   * directly with a SPICE `.noise` run.
   * @defaultValue 300.15
   */
  readonly temperatureK?: number;
  /**
   * Input voltage noise density of every op-amp, V/sqrt(Hz) (0 to 1e-3). The
   * default leaves op-amp noise out, so only the resistors count; give the
   * data-sheet figure (e.g. 4e-9) to include it.
   * @defaultValue 0
   */
  readonly opampVoltageNoise?: number;
  /**
   * Input current noise density of every op-amp at each input, A/sqrt(Hz) (0 to 1e-6).
   * @defaultValue 0
   */
  readonly opampCurrentNoise?: number;
  /**
   * Band `[lowHz, highHz]` of the analysis grid and of the RMS integration (0 < lowHz < highHz, finite).
   * @defaultValue the design's response span: a decade below its lowest band edge to a decade above its highest
   */
  readonly bandHz?: readonly [number, number];
  /**
   * Number of log-spaced frequencies (16 to 100000).
   * @defaultValue 200
   */
  readonly points?: number;
}

/** One noise source's share of the output noise. */
export interface NoiseContributor {
  /** Source name: a resistor designator (`"R3"`) or an op-amp source (`"U2.en"`, `"U2.in+"`, `"U2.in-"`). */
  readonly name: string;
  /** The source's RMS output noise over the band, V. */
  readonly rmsV: number;
  /** Fraction of the total output noise power over the band (0 to 1; the fractions sum to 1). */
  readonly powerFraction: number;
}

/** Result of {@link noiseAnalysis}. */
export interface NoiseAnalysisResult {
  /** Analysis frequencies, Hz (log-spaced over the band). */
  readonly freqHz: Float64Array;
  /** Total noise density at `out`, V/sqrt(Hz). */
  readonly outputDensity: Float64Array;
  /**
   * Each source's noise density at `out`, V/sqrt(Hz), by source name. Every
   * resistor appears; op-amp sources appear only when their density option is above 0.
   */
  readonly contributions: Readonly<Record<string, Float64Array>>;
  /** RMS output noise over the band, V. */
  readonly totalRmsV: number;
  /** Band of the RMS integration, Hz. */
  readonly bandHz: readonly [number, number];
  /** Nominal passband gain the input-referred density is divided by, V/V (the spec's gain). */
  readonly passbandGain: number;
  /** Output density divided by the passband gain, V/sqrt(Hz): the equivalent noise at the input for in-band signals. */
  readonly inputReferredDensity: Float64Array;
  /** The sources sorted by their share of the output noise power, largest first. */
  readonly topContributors: readonly NoiseContributor[];
}

function readOptions(options: unknown): {
  temperatureK: number;
  en: number;
  inoise: number;
  band: readonly [number, number] | undefined;
  points: number;
} {
  const fn = "noiseAnalysis";
  const o = requireOptions(fn, "options", options);
  const temperatureK = o["temperatureK"] === undefined ? 300.15 : requireInRange(fn, "options.temperatureK", o["temperatureK"], { min: 1, max: 1000 });
  const en = o["opampVoltageNoise"] === undefined ? 0 : requireInRange(fn, "options.opampVoltageNoise", o["opampVoltageNoise"], { min: 0, max: 1e-3 });
  const inoise = o["opampCurrentNoise"] === undefined ? 0 : requireInRange(fn, "options.opampCurrentNoise", o["opampCurrentNoise"], { min: 0, max: 1e-6 });
  const points = o["points"] === undefined ? 200 : requireInteger(fn, "options.points", o["points"], { min: 16, max: 100000 });
  let band: readonly [number, number] | undefined;
  const b = o["bandHz"];
  if (b !== undefined) {
    if (!Array.isArray(b) || b.length !== 2) {
      throw new InvalidArgumentError({ fn, path: "options.bandHz", received: b, message: "expected [lowHz, highHz] with 0 < lowHz < highHz" });
    }
    const lo = requireInRange(fn, "options.bandHz[0]", b[0], { min: 0, max: 1e12, exclusiveMin: true });
    const hi = requireInRange(fn, "options.bandHz[1]", b[1], { min: 0, max: 1e12, exclusiveMin: true });
    if (!(hi > lo * (1 + 1e-9))) {
      throw new InvalidArgumentError({ fn, path: "options.bandHz", received: b, message: "expected [lowHz, highHz] with lowHz below highHz" });
    }
    band = [lo, hi];
  }
  return { temperatureK, en, inoise, band, points };
}

/**
 * Noise analysis of a design: the output noise density from every resistor's
 * thermal noise and every op-amp's input voltage and current noise, each
 * source's contribution, the RMS output noise over a band and the sources
 * ranked by their share. Uses the design's own op-amp model.
 *
 * @param result - a design from `designFilter`
 * @param options - temperature, op-amp noise densities, band and grid size
 * @returns densities on a log grid, per-source contributions, RMS total and ranking
 * @throws `InvalidArgumentError` for a value that is not a design result, a
 *   temperature outside [1, 1000] K, a noise density outside its range, a band
 *   that is not `[lowHz, highHz]` with `0 < lowHz < highHz`, or a bad point count
 * @throws `SingularCircuitError` when the design's circuit cannot be solved at some frequency
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const n = noiseAnalysis(designFilter(spec), { opampVoltageNoise: 5e-9 });
 * n.topContributors[0]?.name; //=> "R5"
 * n.totalRmsV > 0; //=> true
 * ```
 */
export function noiseAnalysis(result: DesignResult, options?: NoiseAnalysisOptions): NoiseAnalysisResult {
  requireDesignResult("noiseAnalysis", result);
  const fn = "noiseAnalysis";
  const opts = readOptions(options);
  const bandHz = opts.band ?? responseSpanHz(result.spec);
  const [lo, hi] = bandHz;
  const freqHz = logGridHz(lo, hi, opts.points);
  const noise = circuitNoise(fn, designCircuit(result), {
    output: "out",
    freqHz,
    temperatureK: opts.temperatureK,
    opampVoltageNoise: opts.en,
    opampCurrentNoise: opts.inoise,
  });
  const { total, power } = noise;
  const totalPower = integrateLogGrid(total, freqHz);
  const ranked = noise.names.map((name, k) => {
    const pw = integrateLogGrid(power[k] as Float64Array, freqHz);
    return { name, rmsV: Math.sqrt(pw), powerFraction: totalPower > 0 ? pw / totalPower : 0 };
  });
  ranked.sort((a, b) => b.powerFraction - a.powerFraction || (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  const contributions: Record<string, Float64Array> = {};
  noise.names.forEach((name, k) => {
    contributions[name] = (power[k] as Float64Array).map(Math.sqrt);
  });
  const outputDensity = total.map(Math.sqrt);
  const passbandGain = result.spec.gain;
  const inputReferredDensity = outputDensity.map((v) => v / passbandGain);
  return withDisplay({
    freqHz,
    outputDensity,
    contributions,
    totalRmsV: Math.sqrt(totalPower),
    bandHz: [lo, hi],
    passbandGain,
    inputReferredDensity,
    topContributors: ranked,
  }, noiseBundle);
}
