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
 * point: passband loss is the drop below it, stopband attenuation the
 * distance below it, gain error its distance from the wanted gain.
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
  const grid = (b: readonly [number, number], n: number): BandGrid => ({ hz: b, w: logGridRadS(b[0], b[1], n) });
  const pass = bands.pass.map((b) => grid(b, Math.round(PASSBAND_POINTS / bands.pass.length)));
  const stop = bands.stop.map((b) => grid(b, Math.round(STOPBAND_POINTS / bands.stop.length)));
  const longest = Math.max(...pass.map((g) => g.w.length), ...stop.map((g) => g.w.length));
  return { bands, limits, pass, stop, scratch: new Float64Array(longest) };
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
 */
export function refineExtreme(source: ResponseSource, wa: number, wb: number, sign: number, out: Float64Array): void {
  const g = (x: number): number => sign * source.magnitudeSquaredAt(Math.exp(x));
  const x = goldenMax(g, [Math.log(wa), Math.log(wb)], { iterations: 60, width: 1e-9 });
  out[0] = Math.exp(x);
  out[1] = source.magnitudeSquaredAt(out[0] as number);
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
  const found: number[] = [];
  for (let i = 0; i < n; i++) {
    const here = sign * (m[i] as number);
    const left = i > 0 ? sign * (m[i - 1] as number) : -Infinity;
    const right = i < n - 1 ? sign * (m[i + 1] as number) : -Infinity;
    if (!(left > here) && !(right > here)) found.push(i);
  }
  found.sort((a, b) => sign * ((m[b] as number) - (m[a] as number)));
  return found.slice(0, limit);
}

/** How far the band extremes between grid points are searched. */
export type Refinement = "golden" | "parabola";

/**
 * The vertex of the parabola through three neighbouring grid points, in log
 * frequency and log |H|^2 (one step of successive parabolic interpolation,
 * R. P. Brent, "Algorithms for Minimization without Derivatives", Prentice-Hall
 * 1973, ch. 5): exact for a peak that is a parabola there, and within the
 * grid's cubic term otherwise. Written into `out` as [w, |H|^2].
 */
function parabola(source: ResponseSource, g: BandGrid, m: Float64Array, i: number, out: Float64Array): void {
  const x0 = Math.log(g.w[i - 1] as number);
  const x1 = Math.log(g.w[i] as number);
  const x2 = Math.log(g.w[i + 1] as number);
  const y0 = Math.log(m[i - 1] as number);
  const y1 = Math.log(m[i] as number);
  const y2 = Math.log(m[i + 1] as number);
  const d = (x1 - x0) * (y1 - y2) - (x1 - x2) * (y1 - y0);
  const x = d === 0 ? x1 : x1 - ((x1 - x0) ** 2 * (y1 - y2) - (x1 - x2) ** 2 * (y1 - y0)) / (2 * d);
  out[0] = Math.exp(Math.min(x2, Math.max(x0, x)));
  out[1] = source.magnitudeSquaredAt(out[0] as number);
}

/**
 * The band's highest (`sign` = 1) or lowest (-1) |H|^2 and where (rad/s),
 * into `best` as [w, m2], from |H|^2 already sampled on the band's grid.
 */
function bandExtreme(
  source: ResponseSource,
  g: BandGrid,
  m: Float64Array,
  sign: number,
  refinement: Refinement,
  best: Float64Array,
): void {
  const n = g.w.length;
  const better = (a: number, b: number): boolean => sign * a > sign * b;
  best[0] = g.w[0] as number;
  best[1] = m[0] as number;
  if (better(m[n - 1] as number, best[1] as number)) {
    best[0] = g.w[n - 1] as number;
    best[1] = m[n - 1] as number;
  }
  const r = new Float64Array(2);
  for (const i of localExtremes(m, n, sign)) {
    const mi = m[i] as number;
    const a = g.w[Math.max(0, i - 1)] as number;
    const b = g.w[Math.min(n - 1, i + 1)] as number;
    if (a < b) {
      if (refinement === "golden" || i === 0 || i === n - 1) refineExtreme(source, a, b, sign, r);
      else parabola(source, g, m, i, r);
      if (better(r[1] as number, best[1] as number)) best.set(r);
    }
    if (better(mi, best[1] as number)) {
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
  const { limits, scratch } = plan;
  const e = new Float64Array(2);
  let peak = -Infinity;
  let lowW = NaN;
  let low = Infinity;
  for (const g of plan.pass) {
    const m = scratch.subarray(0, g.w.length);
    source.magnitudeSquared(g.w, m);
    bandExtreme(source, g, m, 1, refinement, e);
    peak = Math.max(peak, e[1] as number);
    bandExtreme(source, g, m, -1, refinement, e);
    if ((e[1] as number) < low) [lowW, low] = [e[0] as number, e[1] as number];
  }
  let stopW = NaN;
  let stop = -Infinity;
  for (const g of plan.stop) {
    const m = scratch.subarray(0, g.w.length);
    source.magnitudeSquared(g.w, m);
    bandExtreme(source, g, m, 1, refinement, e);
    if ((e[1] as number) > stop) [stopW, stop] = [e[0] as number, e[1] as number];
  }
  const reference = source.realPartAt(TWO_PI * plan.bands.referenceHz);
  const passbandLossDb = db2(peak) - db2(low);
  const stopbandAttenuationDb = db2(peak) - db2(stop);
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
