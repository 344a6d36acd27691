/**
 * As-built verification: the response of the cascade of stages, with the
 * values on the board and the chosen op-amp model, checked against the mask.
 *
 * Method: each stage's response comes from its topology's `response` (closed
 * form or nodal analysis); the stages are buffered by op-amp outputs (ideal
 * voltage sources in both op-amp models), so the cascade's response is the
 * product of the stage responses. The mask is sampled on dense log grids
 * (about 400-600 points per band); the worst points (global and up to four
 * local extremes per band) are then refined by golden-section search on log
 * frequency to a relative width of 1e-9 (J. Kiefer, "Sequential minimax search
 * for a maximum", Proc. AMS 4, 1953), so equiripple peaks between grid points
 * are not missed.
 *
 * Levels are measured from the passband's highest as-built point: passband
 * loss is the drop below it, stopband attenuation is the distance below it,
 * and gain error is its distance from the requested gain.
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import type { ComponentValues, Topology } from "../topologies/types.ts";
import { goldenMax } from "../math/optimize.ts";
import { logGrid } from "../tf/index.ts";
import { TWO_PI } from "../units/constants.ts";
import { requireDesignSpec, type DesignSpec } from "./spec.ts";
import type { ResponseCurve } from "./types.ts";

/** A stage as placed on the board. */
export interface BuiltStage {
  /** Topology. */
  readonly topology: Topology;
  /** Values by local designator. */
  readonly values: ComponentValues;
}

/** Complex response samples. */
export interface Samples {
  /** Real parts. */
  readonly re: Float64Array;
  /** Imaginary parts. */
  readonly im: Float64Array;
}

/**
 * Response of a cascade of stages at the given frequencies.
 *
 * @param stages - stages in cascade order
 * @param freqHz - frequencies in Hz
 * @param opamp - op-amp model for every stage
 * @returns the complex response
 */
export function cascadeResponse(stages: readonly BuiltStage[], freqHz: Float64Array, opamp: OpAmpModel): Samples {
  const re = new Float64Array(freqHz.length).fill(1);
  const im = new Float64Array(freqHz.length);
  for (const s of stages) multiplyInPlace(re, im, s.topology.response(s.values, freqHz, opamp));
  return { re, im };
}

/**
 * Multiply a complex response in place by another of the same length, point
 * by point: `(re + j im) *= (h.re + j h.im)`.
 *
 * @param re - real parts, overwritten
 * @param im - imaginary parts, overwritten
 * @param h - the factor
 */
export function multiplyInPlace(re: Float64Array, im: Float64Array, h: Samples): void {
  for (let i = 0; i < re.length; i++) {
    const a = re[i] as number;
    const b = im[i] as number;
    const c = h.re[i] as number;
    const d = h.im[i] as number;
    re[i] = a * c - b * d;
    im[i] = a * d + b * c;
  }
}

/** The bands of the mask as Hz intervals. */
export interface MaskBands {
  /** Passband intervals. */
  readonly pass: readonly (readonly [number, number])[];
  /** Stopband intervals. */
  readonly stop: readonly (readonly [number, number])[];
  /** A frequency where the passband gain's sign is read. */
  readonly referenceHz: number;
}

/**
 * The frequency intervals the mask constrains. Passbands and stopbands that
 * extend to DC or infinity are checked over three decades beyond their edge
 * (two decades, or up to the spec's `passband.topHz`, for passbands above the
 * top edge, where a real op-amp's bandwidth ends every active filter's passband).
 *
 * @param spec - canonical spec
 * @returns the intervals in Hz
 */
export function maskBands(spec: DesignSpec): MaskBands {
  const [p1, p2] = [spec.passbandHz[0] as number, spec.passbandHz[1] as number];
  const [s1, s2] = [spec.stopbandHz[0] as number, spec.stopbandHz[1] as number];
  switch (spec.response) {
    case "lowpass":
      return { pass: [[p1 / 1000, p1]], stop: [[s1, s1 * 1000]], referenceHz: p1 / 1000 };
    case "highpass":
      return { pass: [[p1, spec.passbandTopHz ?? p1 * 100]], stop: [[s1 / 1000, s1]], referenceHz: spec.passbandTopHz ?? p1 * 100 };
    case "bandpass":
      return {
        pass: [[p1, p2]],
        stop: [
          [s1 / 1000, s1],
          [s2, s2 * 1000],
        ],
        referenceHz: Math.sqrt(p1 * p2),
      };
    case "bandstop":
      return {
        pass: [
          [p1 / 1000, p1],
          [p2, spec.passbandTopHz ?? p2 * 100],
        ],
        stop: [[s1, s2]],
        referenceHz: p1 / 1000,
      };
  }
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
  /** Margins, dB. */
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

type MagFn = (f: number) => number;

function golden(fn: MagFn, a: number, b: number, maximise: boolean): { f: number; m: number } {
  const g = (x: number): number => (maximise ? fn(Math.exp(x)) : -fn(Math.exp(x)));
  const x = goldenMax(g, [Math.log(a), Math.log(b)], { iterations: 60, width: 1e-9 });
  return { f: Math.exp(x), m: fn(Math.exp(x)) };
}

/** Extreme of |H| over a band: grid scan, then refinement of the best local extremes. */
function bandExtreme(
  fn: MagFn,
  many: (f: Float64Array) => Float64Array,
  band: readonly [number, number],
  points: number,
  maximise: boolean,
): { f: number; m: number } {
  const grid = logGrid(band[0], band[1], points);
  const m = many(grid);
  const better = (a: number, b: number): boolean => (maximise ? a > b : a < b);
  let best = { f: grid[0] as number, m: m[0] as number };
  const n = grid.length;
  if (better(m[n - 1] as number, best.m)) best = { f: grid[n - 1] as number, m: m[n - 1] as number };
  const locals: number[] = [];
  for (let i = 0; i < n; i++) {
    const here = m[i] as number;
    const left = i > 0 ? (m[i - 1] as number) : maximise ? -Infinity : Infinity;
    const right = i < n - 1 ? (m[i + 1] as number) : maximise ? -Infinity : Infinity;
    if (!better(left, here) && !better(right, here)) locals.push(i);
  }
  locals.sort((a, b) => (maximise ? (m[b] as number) - (m[a] as number) : (m[a] as number) - (m[b] as number)));
  for (const i of locals.slice(0, 4)) {
    const a = grid[Math.max(0, i - 1)] as number;
    const b = grid[Math.min(n - 1, i + 1)] as number;
    const r = a < b ? golden(fn, a, b, maximise) : { f: grid[i] as number, m: m[i] as number };
    if (better(r.m, best.m)) best = r;
    if (better(m[i] as number, best.m)) best = { f: grid[i] as number, m: m[i] as number };
  }
  return best;
}

const db = (x: number): number => 20 * Math.log10(x);

/**
 * Check a cascade against the spec mask.
 *
 * @param spec - canonical spec
 * @param stages - stages in cascade order
 * @param opamp - op-amp model
 * @returns the figures and margins
 */
export function checkMask(spec: DesignSpec, stages: readonly BuiltStage[], opamp: OpAmpModel): MaskFigures {
  const many = (f: Float64Array): Float64Array => {
    const h = cascadeResponse(stages, f, opamp);
    const out = new Float64Array(f.length);
    for (let i = 0; i < f.length; i++) out[i] = Math.hypot(h.re[i] as number, h.im[i] as number);
    return out;
  };
  const one: MagFn = (f) => many(Float64Array.of(f))[0] as number;
  const bands = maskBands(spec);
  let peak = { f: NaN, m: -Infinity };
  let low = { f: NaN, m: Infinity };
  for (const b of bands.pass) {
    const pts = Math.round(400 / bands.pass.length);
    const hi = bandExtreme(one, many, b, pts, true);
    const lo = bandExtreme(one, many, b, pts, false);
    if (hi.m > peak.m) peak = hi;
    if (lo.m < low.m) low = lo;
  }
  let stopMax = { f: NaN, m: -Infinity };
  for (const b of bands.stop) {
    const s = bandExtreme(one, many, b, Math.round(600 / bands.stop.length), true);
    if (s.m > stopMax.m) stopMax = s;
  }
  const ref = cascadeResponse(stages, Float64Array.of(bands.referenceHz), opamp);
  const polarity = (ref.re[0] as number) < 0 ? "inverting" : "non-inverting";
  const passbandLossDb = db(peak.m) - db(low.m);
  const stopbandAttenuationDb = db(peak.m) - db(stopMax.m);
  const gainDb = db(peak.m);
  const gainErrorDb = gainDb - db(spec.gain);
  const passbandMarginDb = spec.maxLossDb - passbandLossDb;
  const stopbandMarginDb = stopbandAttenuationDb - spec.minAttenuationDb;
  const gainMarginDb = spec.gainToleranceDb - Math.abs(gainErrorDb);
  return {
    peak: peak.m,
    passbandLossDb,
    passbandWorstHz: low.f,
    stopbandAttenuationDb,
    stopbandWorstHz: stopMax.f,
    gainDb,
    gainErrorDb,
    passbandMarginDb,
    stopbandMarginDb,
    gainMarginDb,
    marginDb: Math.min(passbandMarginDb, stopbandMarginDb, gainMarginDb),
    polarity,
  };
}

/** The mask's bands sampled on one grid (no refinement), for fast comparisons. */
export interface MaskGrid {
  /** Frequencies, Hz. */
  readonly freqHz: Float64Array;
  /** 1 for a passband sample, 2 for a stopband sample. */
  readonly band: Uint8Array;
}

/**
 * The mask's bands on the same log grids {@link checkMask} scans, as one array.
 *
 * @param spec - canonical spec
 * @returns the grid and the band of each sample
 */
export function maskGrid(spec: DesignSpec): MaskGrid {
  const bands = maskBands(spec);
  const parts: { f: Float64Array; b: number }[] = [];
  for (const b of bands.pass) parts.push({ f: logGrid(b[0], b[1], Math.round(400 / bands.pass.length)), b: 1 });
  for (const b of bands.stop) parts.push({ f: logGrid(b[0], b[1], Math.round(600 / bands.stop.length)), b: 2 });
  const n = parts.reduce((k, p) => k + p.f.length, 0);
  const freqHz = new Float64Array(n);
  const band = new Uint8Array(n);
  let k = 0;
  for (const p of parts) {
    freqHz.set(p.f, k);
    band.fill(p.b, k, k + p.f.length);
    k += p.f.length;
  }
  return { freqHz, band };
}

/**
 * The worst margin (as {@link checkMask}'s `marginDb`) from magnitudes sampled
 * on a {@link maskGrid}, without refining extremes between samples.
 *
 * @param spec - canonical spec
 * @param grid - the grid
 * @param magnitude - |H| at each grid frequency
 * @returns the smallest of the passband, stopband and gain margins, dB
 */
export function gridMarginDb(spec: DesignSpec, grid: MaskGrid, magnitude: Float64Array): number {
  let peak = 0;
  let low = Infinity;
  let stop = 0;
  for (let i = 0; i < magnitude.length; i++) {
    const m = magnitude[i] as number;
    if (grid.band[i] === 1) {
      if (m > peak) peak = m;
      if (m < low) low = m;
    } else if (m > stop) stop = m;
  }
  const pass = spec.maxLossDb - (db(peak) - db(low));
  const att = db(peak) - db(stop) - spec.minAttenuationDb;
  const gain = spec.gainToleranceDb - Math.abs(db(peak) - db(spec.gain));
  return Math.min(pass, att, gain);
}

/**
 * The frequency span a design's response curve and netlist sweep cover: a
 * decade below the lowest spec edge to a decade above the highest.
 *
 * @param spec - canonical spec
 * @returns `[startHz, stopHz]`
 * @throws {@link InvalidArgumentError} when `spec` is not a canonical spec (the path names the field)
 * @example
 * ```ts
 * responseSpanHz(validateSpec({ response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 1 },
 *   stopband: { edgeHz: 5000, minAttenuationDb: 40 } })); //=> [100, 50000]
 * ```
 */
export function responseSpanHz(spec: DesignSpec): readonly [number, number] {
  requireDesignSpec("responseSpanHz", spec);
  const all = [...spec.passbandHz, ...spec.stopbandHz];
  const lo = Math.min(...all);
  const hi = Math.max(...all);
  return [lo / 10, hi * 10];
}

/**
 * The as-built response on log-spaced points: magnitude, unwrapped phase and
 * group delay (central difference of the phase over +-1e-6 relative frequency).
 *
 * @param spec - canonical spec (for the span)
 * @param stages - stages
 * @param opamp - op-amp model
 * @param points - number of points
 * @returns the curve
 */
export function responseCurve(
  spec: DesignSpec,
  stages: readonly BuiltStage[],
  opamp: OpAmpModel,
  points: number,
): ResponseCurve {
  const [lo, hi] = responseSpanHz(spec);
  const f = logGrid(lo, hi, points);
  const d = 1e-6;
  const all = new Float64Array(points * 3);
  for (let i = 0; i < points; i++) {
    const x = f[i] as number;
    all[3 * i] = x * (1 - d);
    all[3 * i + 1] = x;
    all[3 * i + 2] = x * (1 + d);
  }
  const h = cascadeResponse(stages, all, opamp);
  const magnitudeDb: number[] = [];
  const phaseDeg: number[] = [];
  const groupDelayS: number[] = [];
  let offset = 0;
  let prev = NaN;
  for (let i = 0; i < points; i++) {
    const re = h.re[3 * i + 1] as number;
    const im = h.im[3 * i + 1] as number;
    magnitudeDb.push(db(Math.hypot(re, im)));
    const ph = Math.atan2(im, re);
    if (!Number.isNaN(prev)) {
      while (ph + offset - prev > Math.PI) offset -= TWO_PI;
      while (ph + offset - prev < -Math.PI) offset += TWO_PI;
    }
    prev = ph + offset;
    phaseDeg.push((prev * 180) / Math.PI);
    const pa = Math.atan2(h.im[3 * i] as number, h.re[3 * i] as number);
    const pb = Math.atan2(h.im[3 * i + 2] as number, h.re[3 * i + 2] as number);
    let dp = pb - pa;
    while (dp > Math.PI) dp -= TWO_PI;
    while (dp < -Math.PI) dp += TWO_PI;
    const x = f[i] as number;
    groupDelayS.push(-dp / (TWO_PI * (2 * d * x)));
  }
  return { freqHz: Array.from(f), magnitudeDb, phaseDeg, groupDelayS };
}

/**
 * Largest magnitude of each partial cascade (input to each stage's output) on
 * a grid, with its frequency.
 *
 * @param stages - stages
 * @param gridHz - frequencies, Hz
 * @param opamp - op-amp model
 * @returns one peak per stage
 */
export function partialPeaks(
  stages: readonly BuiltStage[],
  gridHz: Float64Array,
  opamp: OpAmpModel,
): { gain: number; hz: number }[] {
  const re = new Float64Array(gridHz.length).fill(1);
  const im = new Float64Array(gridHz.length);
  const out: { gain: number; hz: number }[] = [];
  for (const s of stages) {
    multiplyInPlace(re, im, s.topology.response(s.values, gridHz, opamp));
    let best = 0;
    let at = gridHz[0] as number;
    for (let i = 0; i < gridHz.length; i++) {
      const m = Math.hypot(re[i] as number, im[i] as number);
      if (m > best) {
        best = m;
        at = gridHz[i] as number;
      }
    }
    out.push({ gain: best, hz: at });
  }
  return out;
}
