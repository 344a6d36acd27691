/**
 * A cascade's response against a mask: passband loss, stopband attenuation
 * and gain error with their margins, from the stages' polynomials.
 *
 * Method: each band is sampled on a log grid (400 points over the
 * passbands, 600 over the stopbands); the band's extreme and its four best
 * local extremes are then refined by golden-section search on log frequency
 * to a relative width of 1e-9 (J. Kiefer, "Sequential minimax search for a
 * maximum", Proc. AMS 4:502-506, 1953), so an equiripple peak between grid
 * points is not missed. Golden-section search compares values only, so it
 * runs on |H|^2 (no square root or logarithm per point) and takes the same
 * steps as on |H| or on dB. Levels are measured from the passband's highest
 * point (or from a fixed reference level, a passive ladder's, when the
 * limits give one): passband loss is the drop below it, stopband
 * attenuation the distance below it, gain error the peak's distance from
 * the wanted gain.
 *
 * Accuracy: the levels are those of the polynomials (about 1e-12 dB, see
 * stage-polynomials.ts) at extremes located to 1e-9 relative frequency,
 * where a peak's level is flat to second order (below 1e-12 dB).
 *
 * @module
 */
import { goldenMax } from "../math/optimize.ts";
import { logGrid } from "../tf/grid.ts";
import { TWO_PI } from "../units/constants.ts";
import { magnitudeSquaredAt, cascadeMagnitudeSquared, multiplyResponse } from "./cascade.ts";
import type { ScaledRational } from "./types.ts";

/** The bands a mask constrains, as Hz intervals. */
export interface MaskBands {
  /** Passband intervals, Hz. */
  readonly pass: readonly (readonly [number, number])[];
  /** Stopband intervals, Hz. */
  readonly stop: readonly (readonly [number, number])[];
  /** A frequency where the passband gain's sign is read, Hz. */
  readonly referenceHz: number;
}

/** The limits a mask sets. */
export interface MaskLimits {
  /** Largest passband loss below the passband's peak, dB. */
  readonly maxLossDb: number;
  /** Smallest stopband attenuation below the passband's peak, dB. */
  readonly minAttenuationDb: number;
  /** Wanted passband gain magnitude, V/V. */
  readonly gain: number;
  /** Largest gain error, dB. */
  readonly gainToleranceDb: number;
  /**
   * A fixed level (V/V) that passband loss and stopband attenuation are
   * measured from instead of the passband's highest point: a passive
   * ladder's lossless level, so that the loss of real parts counts against
   * the passband. Absent: the passband's peak (every active design).
   */
  readonly reference?: number;
}

/** Figures of a response against the mask. */
export interface MaskFigures {
  /** Passband highest level, V/V. */
  readonly peak: number;
  /** Largest passband loss below the peak, dB. */
  readonly passbandLossDb: number;
  /** Where, Hz. */
  readonly passbandWorstHz: number;
  /** Smallest stopband attenuation below the peak, dB. */
  readonly stopbandAttenuationDb: number;
  /** Where, Hz. */
  readonly stopbandWorstHz: number;
  /** As-built level, dB. */
  readonly gainDb: number;
  /** Gain error, dB. */
  readonly gainErrorDb: number;
  /** Passband margin, dB. */
  readonly passbandMarginDb: number;
  /** Stopband margin, dB. */
  readonly stopbandMarginDb: number;
  /** Gain margin, dB. */
  readonly gainMarginDb: number;
  /** Smallest margin, dB. */
  readonly marginDb: number;
  /** Sign of the passband gain. */
  readonly polarity: "inverting" | "non-inverting";
}

/** Grid points over all passbands together, and over all stopbands. */
export const PASSBAND_POINTS = 400;
/** See {@link PASSBAND_POINTS}. */
export const STOPBAND_POINTS = 600;
/** Local extremes refined per band. */
const REFINED = 4;

/** One band's log grid in rad/s, with its Hz ends. */
interface BandGrid {
  readonly hz: readonly [number, number];
  readonly w: Float64Array;
  /** Step of the grid in log frequency (natural log). */
  readonly step: number;
  /** Scratch for |H|^2 on this grid. */
  readonly m: Float64Array;
}

/** The mask's grids, made once and used for every board. */
export interface MaskPlan {
  /** The bands. */
  readonly bands: MaskBands;
  /** The limits. */
  readonly limits: MaskLimits;
  /** Passband grids. */
  readonly pass: readonly BandGrid[];
  /** Stopband grids. */
  readonly stop: readonly BandGrid[];
  /** Scratch for |H|^2 on the largest grid. */
  readonly scratch: Float64Array;
  /** Scratch for the indices of a band's best local extremes. */
  readonly extremes: Int32Array;
  /** Scratch for a band's extreme and a refined point, [w, m2] each. */
  readonly points: Float64Array;
}

/** The band's log grid (the same points as `logGrid` in Hz), in rad/s. */
function logGridRadS(aHz: number, bHz: number, n: number): Float64Array {
  const f = logGrid(aHz, bHz, n);
  for (let i = 0; i < n; i++) f[i] = TWO_PI * (f[i] as number);
  return f;
}

/**
 * The grids of a mask (no checks: the caller's bands are valid intervals).
 *
 * @param bands - the bands
 * @param limits - the limits
 * @returns the plan
 */
export function planMask(bands: MaskBands, limits: MaskLimits): MaskPlan {
  const grid = (b: readonly [number, number], n: number): BandGrid => ({
    hz: b,
    w: logGridRadS(b[0], b[1], n),
    step: n > 1 ? Math.log(b[1] / b[0]) / (n - 1) : 0,
    m: new Float64Array(n),
  });
  const pass = bands.pass.map((b) => grid(b, Math.round(PASSBAND_POINTS / bands.pass.length)));
  const stop = bands.stop.map((b) => grid(b, Math.round(STOPBAND_POINTS / bands.stop.length)));
  const longest = Math.max(...pass.map((g) => g.w.length), ...stop.map((g) => g.w.length));
  return { bands, limits, pass, stop, scratch: new Float64Array(longest), extremes: new Int32Array(REFINED), points: new Float64Array(4) };
}

/**
 * Golden-section search of `sign * |H|^2` over `[wa, wb]` (rad/s) on log
 * frequency, to a relative width of 1e-9; writes the point found and its
 * |H|^2 into `out` as [w, m2].
 *
 * @param source - the response
 * @param wa - lower end, rad/s
 * @param wb - upper end, rad/s
 * @param sign - 1 to find a maximum, -1 a minimum
 * @param out - written: [w, |H|^2]
 * @param at - where in `out`
 */
export function refineExtreme(source: ResponseSource, wa: number, wb: number, sign: number, out: Float64Array, at: number = 0): void {
  const g = (x: number): number => sign * source.magnitudeSquaredAt(Math.exp(x));
  const x = goldenMax(g, [Math.log(wa), Math.log(wb)], { iterations: 60, width: 1e-9 });
  out[at] = Math.exp(x);
  out[at + 1] = source.magnitudeSquaredAt(out[at] as number);
}

/**
 * Indices of a grid's local extremes, ends included when they are one,
 * best first.
 *
 * @param m - the sampled values
 * @param n - how many of them
 * @param sign - 1 for maxima, -1 for minima
 * @param limit - most indices returned
 * @returns the indices
 */
export function localExtremes(m: Float64Array, n: number, sign: number, limit: number = REFINED): number[] {
  const out = new Int32Array(limit);
  return Array.from(out.subarray(0, bestExtremesInto(m, n, sign, out)));
}

/**
 * The indices {@link localExtremes} returns, written into `out` (its length
 * is the limit) without allocating; returns how many were found.
 *
 * @param m - the sampled values
 * @param n - how many of them
 * @param sign - 1 for maxima, -1 for minima
 * @param out - written: the indices, best first
 * @returns the number written
 */
export function bestExtremesInto(m: Float64Array, n: number, sign: number, out: Int32Array): number {
  const limit = out.length;
  let count = 0;
  for (let i = 0; i < n; i++) {
    const here = sign * (m[i] as number);
    if (i > 0 && sign * (m[i - 1] as number) > here) continue;
    if (i < n - 1 && sign * (m[i + 1] as number) > here) continue;
    // insert by value, best first; a tie keeps the earlier index first (a stable order)
    let j = count < limit ? count++ : limit;
    if (j === limit) {
      if (!(here > sign * (m[out[limit - 1] as number] as number))) continue;
      j = limit - 1;
    }
    while (j > 0 && here > sign * (m[out[j - 1] as number] as number)) {
      out[j] = out[j - 1] as number;
      j--;
    }
    out[j] = i;
  }
  return count;
}

/** How far the band extremes between grid points are searched. */
export type Refinement = "golden" | "parabola";

/**
 * The vertex of the parabola through three neighbouring grid points
 * `c - 1, c, c + 1`, in log frequency and log |H|^2 (one step of successive
 * parabolic interpolation, R. P. Brent, "Algorithms for Minimization without
 * Derivatives", Prentice-Hall 1973, ch. 5; on the grid's equal log steps the
 * vertex is `x_c + h (y_- - y_+) / (2 (y_- - 2 y_c + y_+))`), kept within
 * the grid interval `[lo, hi]` (indices) and evaluated there. Exact for a
 * peak that is a parabola there, and within the grid's cubic term otherwise.
 * Written into `out` at `at` as [w, |H|^2].
 */
function parabola(
  source: ResponseSource,
  g: BandGrid,
  m: Float64Array,
  c: number,
  lo: number,
  hi: number,
  out: Float64Array,
  at: number,
): void {
  const y0 = Math.log(m[c - 1] as number);
  const y1 = Math.log(m[c] as number);
  const y2 = Math.log(m[c + 1] as number);
  const d = y0 - 2 * y1 + y2;
  const shift = d === 0 || !Number.isFinite(d) ? 0 : (g.step * (y0 - y2)) / (2 * d);
  const x = Math.log(g.w[c] as number) + (Number.isFinite(shift) ? shift : 0);
  const w = Math.exp(Math.min(Math.log(g.w[hi] as number), Math.max(Math.log(g.w[lo] as number), x)));
  out[at] = w;
  out[at + 1] = source.magnitudeSquaredAt(w);
}

/**
 * The band's highest (`sign` = 1) or lowest (-1) |H|^2 and where (rad/s),
 * into `plan.points[0..1]` as [w, m2], from |H|^2 already sampled on the
 * band's grid.
 */
function bandExtreme(source: ResponseSource, plan: MaskPlan, g: BandGrid, m: Float64Array, sign: number, refinement: Refinement): void {
  const n = g.w.length;
  const best = plan.points;
  best[0] = g.w[0] as number;
  best[1] = m[0] as number;
  if (sign * (m[n - 1] as number) > sign * (best[1] as number)) {
    best[0] = g.w[n - 1] as number;
    best[1] = m[n - 1] as number;
  }
  const found = bestExtremesInto(m, n, sign, plan.extremes);
  for (let e = 0; e < found; e++) {
    const i = plan.extremes[e] as number;
    const mi = m[i] as number;
    const a = Math.max(0, i - 1);
    const b = Math.min(n - 1, i + 1);
    if ((g.w[a] as number) < (g.w[b] as number)) {
      if (refinement === "golden" || n < 3) refineExtreme(source, g.w[a] as number, g.w[b] as number, sign, best, 2);
      // at an end, the parabola through the end's three points, kept within the end interval
      else if (i === 0) parabola(source, g, m, 1, 0, 1, plan.points, 2);
      else if (i === n - 1) parabola(source, g, m, n - 2, n - 2, n - 1, plan.points, 2);
      else parabola(source, g, m, i, i - 1, i + 1, plan.points, 2);
      if (sign * (best[3] as number) > sign * (best[1] as number)) {
        best[0] = best[2] as number;
        best[1] = best[3] as number;
      }
    }
    if (sign * mi > sign * (best[1] as number)) {
      best[0] = g.w[i] as number;
      best[1] = mi;
    }
  }
}

const db2 = (m2: number): number => 10 * Math.log10(m2);

/** What the mask check reads of a response: |H|^2 on a grid and at a point, and Re H at a point (w in rad/s). */
export interface ResponseSource {
  /** |H(j w)|^2 at each of `w`, written into `out`. */
  readonly magnitudeSquared: (w: Float64Array, out: Float64Array) => void;
  /** |H(j w)|^2 at one frequency. */
  readonly magnitudeSquaredAt: (w: number) => number;
  /** Re H(j w) at one frequency. */
  readonly realPartAt: (w: number) => number;
}

/**
 * A cascade of stage polynomials as a {@link ResponseSource}.
 *
 * @param stages - the stages as rational functions
 * @returns the source
 */
export function rationalSource(stages: readonly ScaledRational[]): ResponseSource {
  const one = new Float64Array(1);
  const re = new Float64Array(1);
  const im = new Float64Array(1);
  return {
    magnitudeSquared: (w, out) => cascadeMagnitudeSquared(stages, w, out),
    magnitudeSquaredAt: (w) => magnitudeSquaredAt(stages, w),
    realPartAt: (w) => {
      one[0] = w;
      re[0] = 1;
      im[0] = 0;
      for (const s of stages) multiplyResponse(s.num, s.den, s.scale, one, re, im);
      return re[0] as number;
    },
  };
}

/**
 * A response's figures against a mask (internal hot path: no checks).
 *
 * @param source - the response (see {@link rationalSource})
 * @param plan - the mask's grids
 * @param refinement - golden-section search of each extreme (the verification's), or one parabolic step (a Monte Carlo board's first look)
 * @returns the figures and margins
 */
export function maskFigures(source: ResponseSource, plan: MaskPlan, refinement: Refinement = "golden"): MaskFigures {
  const { limits } = plan;
  const e = plan.points;
  let peak = -Infinity;
  let lowW = NaN;
  let low = Infinity;
  for (const g of plan.pass) {
    const m = g.m;
    source.magnitudeSquared(g.w, m);
    bandExtreme(source, plan, g, m, 1, refinement);
    peak = Math.max(peak, e[1] as number);
    bandExtreme(source, plan, g, m, -1, refinement);
    if ((e[1] as number) < low) [lowW, low] = [e[0] as number, e[1] as number];
  }
  let stopW = NaN;
  let stop = -Infinity;
  for (const g of plan.stop) {
    const m = g.m;
    source.magnitudeSquared(g.w, m);
    bandExtreme(source, plan, g, m, 1, refinement);
    if ((e[1] as number) > stop) [stopW, stop] = [e[0] as number, e[1] as number];
  }
  const reference = source.realPartAt(TWO_PI * plan.bands.referenceHz);
  const top = limits.reference === undefined ? peak : limits.reference * limits.reference;
  const passbandLossDb = db2(top) - db2(low);
  const stopbandAttenuationDb = db2(top) - db2(stop);
  const gainDb = db2(peak);
  const gainErrorDb = gainDb - 20 * Math.log10(limits.gain);
  const passbandMarginDb = limits.maxLossDb - passbandLossDb;
  const stopbandMarginDb = stopbandAttenuationDb - limits.minAttenuationDb;
  const gainMarginDb = limits.gainToleranceDb - Math.abs(gainErrorDb);
  return {
    peak: Math.sqrt(peak),
    passbandLossDb,
    passbandWorstHz: lowW / TWO_PI,
    stopbandAttenuationDb,
    stopbandWorstHz: stopW / TWO_PI,
    gainDb,
    gainErrorDb,
    passbandMarginDb,
    stopbandMarginDb,
    gainMarginDb,
    marginDb: Math.min(passbandMarginDb, stopbandMarginDb, gainMarginDb),
    polarity: reference < 0 ? "inverting" : "non-inverting",
  };
}
