/**
 * The Monte Carlo envelope of a design's magnitude response: over boards
 * built from parts spread within their tolerances, the smallest and largest
 * |H| at each frequency and a central band holding a chosen share of the
 * boards, for a plot of what the built filters will look like.
 *
 * Method: the boards of {@link monteCarlo} (the same seed gives the same
 * boards, board for board), each evaluated as polynomials with the design's
 * op-amp model on a log grid, and the sample quantiles per frequency
 * (src/evaluate/board-envelope.ts: Hyndman & Fan definition 7, exact for the
 * boards drawn). Unstable or singular boards are left out and counted.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireInRange, requireInteger, requireOptions } from "../validate.ts";
import type { DesignResult } from "../design/index.ts";
import { responseSpanHz } from "../design/verify.ts";
import { boardEnvelope } from "../evaluate/board-envelope.ts";
import { cascadeMagnitudeSquared } from "../evaluate/cascade.ts";
import { checkpoint, checkRunControl, watched, type RunControl } from "../evaluate/progress.ts";
import type { ScaledRational } from "../evaluate/types.ts";
import { boardPolynomialsInto } from "../evaluate/stage-polynomials.ts";
import { TWO_PI } from "../units/constants.ts";
import { monteCarloSettings, monteCarloStages, type MonteCarloOptions } from "./tolerance.ts";

/** Largest boards times points of one envelope (the curves are held in memory: 4 bytes each). */
export const ENVELOPE_MAX_SAMPLES = 5_000_000;

/** Options of {@link monteCarloEnvelope}: those of {@link monteCarlo} (runs up to 20000) and the grid and band. */
export interface MonteCarloEnvelopeOptions extends MonteCarloOptions {
  /**
   * Log-spaced frequencies of the curves (16 to 4000; runs times points at most {@link ENVELOPE_MAX_SAMPLES}).
   * @defaultValue 400
   */
  readonly points?: number;
  /**
   * First and last frequency, Hz (0 < lowHz < highHz <= 1e12).
   * @defaultValue the design's response span: a decade below its lowest band edge to a decade above its highest
   */
  readonly bandHz?: readonly [number, number];
  /**
   * Share of the boards inside the central band (`lowerDb` to `upperDb`), above 0 and below 1.
   * @defaultValue 0.9 (the 5th to the 95th percentile)
   */
  readonly coverage?: number;
}

/** Result of {@link monteCarloEnvelope}. */
export interface MonteCarloEnvelope {
  /** Boards built. */
  readonly runs: number;
  /** Boards left out because a stage was unstable or its equations singular. */
  readonly leftOut: number;
  /** The seed (the same boards as {@link monteCarlo} with it). */
  readonly seed: number;
  /** Share of the boards inside `lowerDb` to `upperDb` at each frequency. */
  readonly coverage: number;
  /** Frequencies, Hz. */
  readonly freqHz: Float64Array;
  /** The design as built with nominal parts, dB. */
  readonly nominalDb: Float64Array;
  /** Smallest |H| over the boards, dB. */
  readonly minDb: Float64Array;
  /** Largest |H| over the boards, dB. */
  readonly maxDb: Float64Array;
  /** The `(1 - coverage) / 2` quantile, dB. */
  readonly lowerDb: Float64Array;
  /** The median, dB. */
  readonly medianDb: Float64Array;
  /** The `(1 + coverage) / 2` quantile, dB. */
  readonly upperDb: Float64Array;
}

/** The grid's options, checked. */
function gridOptions(fn: string, result: DesignResult, o: Record<string, unknown>, runs: number): { points: number; band: readonly [number, number]; coverage: number } {
  const points = o["points"] === undefined ? 400 : requireInteger(fn, "options.points", o["points"], { min: 16, max: 4000 });
  if (runs * points > ENVELOPE_MAX_SAMPLES) {
    throw new InvalidArgumentError({ fn, path: "options.runs", received: runs, message: `expected runs times points (${points}) at most ${ENVELOPE_MAX_SAMPLES}: use at most ${Math.floor(ENVELOPE_MAX_SAMPLES / points)} runs, or fewer points` });
  }
  let band = responseSpanHz(result.spec);
  const b = o["bandHz"];
  if (b !== undefined) {
    if (!Array.isArray(b) || b.length !== 2) throw new InvalidArgumentError({ fn, path: "options.bandHz", received: b, message: "expected [lowHz, highHz] with 0 < lowHz < highHz" });
    const lo = requireInRange(fn, "options.bandHz[0]", b[0], { min: 0, max: 1e12, exclusiveMin: true });
    const hi = requireInRange(fn, "options.bandHz[1]", b[1], { min: 0, max: 1e12, exclusiveMin: true });
    if (!(hi > lo * (1 + 1e-9))) throw new InvalidArgumentError({ fn, path: "options.bandHz", received: b, message: "expected [lowHz, highHz] with lowHz below highHz" });
    band = [lo, hi];
  }
  const coverage = o["coverage"] === undefined ? 0.9 : requireInRange(fn, "options.coverage", o["coverage"], { min: 0, max: 1, exclusiveMin: true });
  if (coverage >= 1) throw new InvalidArgumentError({ fn, path: "options.coverage", received: coverage, message: "expected a share below 1 (minDb and maxDb already give the whole spread)" });
  return { points, band, coverage };
}

/**
 * The spread of the boards' magnitude responses over frequency (see the
 * module header): the nominal curve, the smallest and largest over the
 * boards, the median and a central band holding `coverage` of them.
 *
 * @param result - a design from `designFilter`
 * @param options - boards, seed, tolerances and spread as for {@link monteCarlo}; grid, band and coverage
 * @returns the curves on a log grid
 * @throws `InvalidArgumentError` for options {@link monteCarlo} refuses, more than 20000 runs, a bad point count or band, runs times points above {@link ENVELOPE_MAX_SAMPLES}, or a coverage outside (0, 1)
 * @throws `CancelledError` when `onProgress`, `signal` or `timeLimitMs` stops the run
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const e = monteCarloEnvelope(designFilter(spec), { runs: 100, points: 50 });
 * e.freqHz.length;                      //=> 50
 * e.minDb[0] <= e.nominalDb[0];         //=> true
 * e.maxDb[49] >= e.upperDb[49];         //=> true
 * ```
 */
export function monteCarloEnvelope(result: DesignResult, options?: MonteCarloEnvelopeOptions): MonteCarloEnvelope {
  const fn = "monteCarloEnvelope";
  const settings = monteCarloSettings(fn, result, options);
  const o = requireOptions(fn, "options", options);
  if (settings.runs > 20000) throw new InvalidArgumentError({ fn, path: "options.runs", received: settings.runs, message: "expected at most 20000 boards for an envelope" });
  const { points, band, coverage } = gridOptions(fn, result, o, settings.runs);
  const control: RunControl = checkRunControl(fn, "options", options === undefined ? undefined : { onProgress: options.onProgress, signal: options.signal, timeLimitMs: options.timeLimitMs });
  const { stages } = monteCarloStages(result, settings);
  const freqHz = new Float64Array(points);
  const step = Math.log(band[1] / band[0]) / (points - 1);
  for (let i = 0; i < points; i++) freqHz[i] = i === points - 1 ? band[1] : band[0] * Math.exp(step * i);
  const w = freqHz.map((f) => TWO_PI * f);
  const nominal: ScaledRational[] = stages.map((s) => {
    const num = new Float64Array(s.compiled.points);
    const den = new Float64Array(s.compiled.points);
    const scale = boardPolynomialsInto(s.compiled, s.nominal, s.radius, num, den);
    return { num, den, scale };
  });
  const nominalDb = nominal.some((p) => p.scale === 0) ? new Float64Array(points).fill(NaN) : cascadeMagnitudeSquared(nominal, w).map((x) => 10 * Math.log10(x));
  const env = watched(fn, "options", control, () => {
    checkpoint("boards", "Monte Carlo boards", { done: 0, total: settings.runs });
    return boardEnvelope(stages, w, { boards: settings.runs, seed: settings.seed, distribution: settings.distribution, quantiles: [(1 - coverage) / 2, (1 + coverage) / 2] });
  });
  return {
    runs: settings.runs,
    leftOut: env.leftOut,
    seed: settings.seed,
    coverage,
    freqHz,
    nominalDb,
    minDb: env.minDb,
    maxDb: env.maxDb,
    lowerDb: env.lowerDb,
    medianDb: env.medianDb,
    upperDb: env.upperDb,
  };
}
