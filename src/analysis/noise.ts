/**
 * Output noise of a finished design: the noise density at node `out` from the
 * thermal noise of every resistor and the input noise of every op-amp, each
 * source's share, and the RMS noise over a band.
 *
 * Method: nodal noise analysis with the adjoint (transposed) network
 * (J. Vlach & K. Singhal, "Computer Methods for Circuit Analysis and Design",
 * 2nd ed., Van Nostrand Reinhold, 1994, chapter on noise analysis, from
 * memory). The whole-filter circuit is assembled as the modified nodal
 * equations `A(s) x = b` of `src/circuit/mna.ts` and solved there (`solveMna`
 * with `transpose`). The output voltage is
 * `v(out) = e_out^T A^-1 b = y^T b` with `A^T y = e_out`, so one solve of the
 * transposed system per frequency gives the transfer from every possible
 * excitation to the output at once: a current `i` injected into node `j`
 * reaches the output as `y_j i`, and a voltage `e` added to an op-amp's
 * non-inverting input enters that op-amp's constraint row, reaching the output
 * as `y_k e` (the sign does not matter for a power).
 *
 * Sources, all uncorrelated (powers add):
 * - each resistor R: thermal (Johnson-Nyquist) noise, a current source of
 *   density `sqrt(4 k T / R)` (A/sqrt(Hz)) across it (H. Nyquist, "Thermal
 *   agitation of electric charge in conductors", Phys. Rev. 32:110-113, 1928,
 *   eq. 7), with Boltzmann's constant k = 1.380649e-23 J/K (exact, SI 2019);
 * - each op-amp: the input voltage noise `en` in series with the
 *   non-inverting input (source `"U1.en"`), and the input current noise `in`
 *   from each input to ground (`"U1.in+"`, `"U1.in-"`), all white.
 *
 * The densities are exact for the linear model up to the rounding of a
 * backward-stable dense LU solve (relative error near 1e-13 for these small,
 * well-scaled systems). The RMS noise integrates the output power density by
 * the trapezoidal rule in ln f (`int S df = int S f d(ln f)`) on a log grid;
 * its error is O(h^2) in the grid step and below 1e-3 for the default
 * 200-point grid over a few decades unless a stage has a Q above about 20.
 *
 * @module
 */
import { withDisplay } from "../display.ts";
import { noiseBundle } from "./display.ts";
import { InvalidArgumentError, SingularCircuitError } from "../errors.ts";
import { requireInRange, requireInteger, requireOptions } from "../validate.ts";
import type { DesignResult } from "../design/index.ts";
import { designCircuit } from "../design/circuit.ts";
import { responseSpanHz } from "../design/verify.ts";
import { requireDesignResult } from "../design/check.ts";
import { assembleMna, checkStructure, solveMna } from "../circuit/mna.ts";
import type { ComplexResponse } from "../tf/response.ts";

/** Boltzmann's constant in J/K (exact since the 2019 SI redefinition). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;

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

interface Source {
  readonly name: string;
  /** Density of the excitation (A or V per sqrt(Hz)). */
  readonly density: number;
  /** Unknown indices excited with +1 and -1 (-1 index = ground, skipped). */
  readonly plus: number;
  readonly minus: number;
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
  const m = opts.points;
  const freqHz = new Float64Array(m);
  const step = Math.log(hi / lo) / (m - 1);
  for (let i = 0; i < m; i++) freqHz[i] = i === m - 1 ? hi : lo * Math.exp(step * i);

  const circuit = designCircuit(result);
  checkStructure(fn, circuit, false);
  const sys = assembleMna(circuit);
  const { n } = sys;
  const idx = (node: string): number => (node === "0" ? -1 : (sys.nodeIndex.get(node) ?? -1));
  const outIndex = idx("out");
  const kT4 = 4 * BOLTZMANN_J_PER_K * opts.temperatureK;
  const sources: Source[] = [];
  for (const e of circuit.elements) {
    if (e.kind === "R") {
      sources.push({ name: e.name, density: Math.sqrt(kT4 / e.value), plus: idx(e.a), minus: idx(e.b) });
    } else if (e.kind === "OA") {
      // The op-amp's constraint row is the row of its branch-current unknown.
      if (opts.en > 0) sources.push({ name: `${e.name}.en`, density: opts.en, plus: sys.unknowns.indexOf(`i(${e.name})`), minus: -1 });
      if (opts.inoise > 0) {
        if (e.inP !== "0") sources.push({ name: `${e.name}.in+`, density: opts.inoise, plus: idx(e.inP), minus: -1 });
        if (e.inN !== "0") sources.push({ name: `${e.name}.in-`, density: opts.inoise, plus: idx(e.inN), minus: -1 });
      }
    }
  }

  const contributions: Record<string, Float64Array> = {};
  const power = sources.map(() => new Float64Array(m));
  const total = new Float64Array(m);
  // One solve of the transposed system A^T y = e_out per frequency gives every source's transfer.
  const all = Array.from({ length: n }, (_, j) => j);
  const y = solveMna(fn, sys, {
    sourceRow: outIndex,
    outputs: all,
    freqHz,
    transpose: true,
    singular: (bad, fHz) => {
      const culprit = sys.unknowns[bad] ?? "?";
      return new SingularCircuitError(
        {
          fn,
          path: "result",
          received: fHz,
          message: `the design's circuit has singular nodal equations at ${fHz} Hz (unknown ${culprit}), so its noise is undefined`,
        },
        [culprit.slice(2, -1)],
      );
    },
  });
  for (let f = 0; f < m; f++) {
    let sum = 0;
    sources.forEach((s, k) => {
      const plus = s.plus >= 0 ? (y[s.plus] as ComplexResponse) : null;
      let tr = plus === null ? 0 : (plus.re[f] as number);
      let ti = plus === null ? 0 : (plus.im[f] as number);
      if (s.minus >= 0) {
        const minus = y[s.minus] as ComplexResponse;
        tr -= minus.re[f] as number;
        ti -= minus.im[f] as number;
      }
      const p = (tr * tr + ti * ti) * s.density * s.density;
      (power[k] as Float64Array)[f] = p;
      sum += p;
    });
    total[f] = sum;
  }

  const integrate = (p: Float64Array): number => {
    let acc = 0;
    for (let i = 1; i < m; i++) {
      acc += 0.5 * step * ((p[i - 1] as number) * (freqHz[i - 1] as number) + (p[i] as number) * (freqHz[i] as number));
    }
    return acc;
  };
  const totalPower = integrate(total);
  const ranked = sources.map((s, k) => {
    const pw = integrate(power[k] as Float64Array);
    return { name: s.name, rmsV: Math.sqrt(pw), powerFraction: totalPower > 0 ? pw / totalPower : 0 };
  });
  ranked.sort((a, b) => b.powerFraction - a.powerFraction || (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  sources.forEach((s, k) => {
    contributions[s.name] = (power[k] as Float64Array).map(Math.sqrt);
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
