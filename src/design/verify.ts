/**
 * As-built verification: the response of the cascade of stages, with the
 * values on the board and the chosen op-amp model, checked against the mask.
 *
 * Method: each stage's as-built transfer function comes as polynomials from
 * its own elements and the op-amp model (src/evaluate/stage-polynomials.ts;
 * the topology's closed form where they cannot be formed); the stages are
 * buffered by op-amp outputs, so the cascade's response is the product of the
 * stage responses. The mask is sampled on log grids (400 points over the
 * passbands, 600 over the stopbands) and the worst points refined by
 * golden-section search (src/evaluate/mask.ts), so equiripple peaks between
 * grid points are not missed.
 *
 * Levels are measured from the passband's highest as-built point: passband
 * loss is the drop below it, stopband attenuation is the distance below it,
 * and gain error is its distance from the requested gain.
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import type { ComponentValues, Topology } from "../topologies/types.ts";
import {
  maskFigures,
  planMask,
  rationalSource,
  type MaskBands,
  type MaskFigures,
  type MaskLimits,
  type MaskPlan,
  type ResponseSource,
} from "../evaluate/mask.ts";
import { stagePolynomials } from "../evaluate/stage-polynomials.ts";
import { multiplyMagnitudeSquared } from "../evaluate/cascade.ts";
import { isHurwitz } from "../evaluate/stability.ts";
import type { ScaledRational } from "../evaluate/types.ts";
import { logGrid } from "../tf/index.ts";
import { TWO_PI } from "../units/constants.ts";
import { requireDesignSpec, type DesignSpec } from "./spec.ts";
import type { ResponseCurve } from "./types.ts";

export type { MaskBands, MaskFigures } from "../evaluate/mask.ts";

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

const db = (x: number): number => 20 * Math.log10(x);

const plans = new WeakMap<DesignSpec, MaskPlan>();

/**
 * The mask's grids for a canonical spec (made once per spec; internal, for
 * the design and analysis layers).
 *
 * @param spec - canonical spec
 * @returns the plan
 */
export function maskPlan(spec: DesignSpec): MaskPlan {
  let plan = plans.get(spec);
  if (plan === undefined) {
    const limits: MaskLimits = {
      maxLossDb: spec.maxLossDb,
      minAttenuationDb: spec.minAttenuationDb,
      gain: spec.gain,
      gainToleranceDb: spec.gainToleranceDb,
    };
    plan = planMask(maskBands(spec), limits);
    plans.set(spec, plan);
  }
  return plan;
}

/**
 * The angular frequencies a mask's bands span, rad/s.
 *
 * @param bands - the bands
 * @returns lowest and highest band edge, rad/s
 */
export function spanRadS(bands: MaskBands): readonly [number, number] {
  const all = [...bands.pass, ...bands.stop].flat();
  return [TWO_PI * Math.min(...all), TWO_PI * Math.max(...all)];
}

/** The cascade through its topologies' closed forms (the path for a stage whose polynomials cannot be formed). */
function closedFormSource(stages: readonly BuiltStage[], opamp: OpAmpModel): ResponseSource {
  const at = (w: number): Samples => cascadeResponse(stages, Float64Array.of(w / TWO_PI), opamp);
  return {
    magnitudeSquared: (w, out) => {
      const h = cascadeResponse(stages, w.map((x) => x / TWO_PI), opamp);
      for (let i = 0; i < w.length; i++) out[i] = (h.re[i] as number) ** 2 + (h.im[i] as number) ** 2;
    },
    magnitudeSquaredAt: (w) => {
      const h = at(w);
      return (h.re[0] as number) ** 2 + (h.im[0] as number) ** 2;
    },
    realPartAt: (w) => at(w).re[0] as number,
  };
}

/** The mask figures of a cascade with the stages that are not stable. */
export interface MaskCheck extends MaskFigures {
  /** Stages (from 1) whose characteristic polynomial with the op-amp model has a root in the closed right half-plane, or whose equations are singular. */
  readonly unstableStages: readonly number[];
}

/**
 * Check a cascade against the spec mask: each stage's as-built polynomials
 * with the op-amp model (src/evaluate/stage-polynomials.ts), the mask
 * figures from them (src/evaluate/mask.ts), and each stage's stability from
 * its characteristic polynomial (src/evaluate/stability.ts).
 *
 * @param spec - canonical spec
 * @param stages - stages in cascade order
 * @param opamp - op-amp model
 * @returns the figures and margins, and the stages that are not stable
 */
export function checkMask(spec: DesignSpec, stages: readonly BuiltStage[], opamp: OpAmpModel): MaskCheck {
  const plan = maskPlan(spec);
  const span = spanRadS(plan.bands);
  const polys: ScaledRational[] = [];
  const unstableStages: number[] = [];
  stages.forEach((s, i) => {
    const p = stagePolynomials(s.topology, s.values, opamp, { spanRadS: span });
    if (p === null || !isHurwitz(p.den)) unstableStages.push(i + 1);
    if (p !== null) polys.push(p);
  });
  if (polys.length < stages.length) return { ...maskFigures(closedFormSource(stages, opamp), plan), unstableStages };
  return { ...maskFigures(rationalSource(polys), plan), unstableStages };
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

const radS = new WeakMap<MaskGrid, Float64Array>();

/** A mask grid's frequencies in rad/s, made once per grid (re-tuning costs many candidates on one grid). */
function gridRadS(grid: MaskGrid): Float64Array {
  let w = radS.get(grid);
  if (w === undefined) {
    w = grid.freqHz.map((f) => TWO_PI * f);
    radS.set(grid, w);
  }
  return w;
}

/**
 * |H|^2 of one stage on a {@link maskGrid} (its polynomials with the op-amp
 * model, or its closed form where they cannot be formed).
 *
 * @param spec - canonical spec (for the span the polynomials must cover)
 * @param stage - the stage
 * @param opamp - op-amp model
 * @param grid - the grid
 * @returns |H|^2 per grid frequency
 */
export function stageMagnitudeSquared(spec: DesignSpec, stage: BuiltStage, opamp: OpAmpModel, grid: MaskGrid): Float64Array {
  const out = new Float64Array(grid.freqHz.length);
  const p = stagePolynomials(stage.topology, stage.values, opamp, { spanRadS: spanRadS(maskPlan(spec).bands) });
  if (p === null) {
    closedFormSource([stage], opamp).magnitudeSquared(gridRadS(grid), out);
    return out;
  }
  out.fill(1);
  multiplyMagnitudeSquared(p.num, p.den, p.scale, gridRadS(grid), out);
  return out;
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
 * {@link gridMarginDb} of the product of per-stage |H|^2 on a
 * {@link maskGrid}: the product at each point formed as `prefix[k]` times the
 * stages' values in order (`prefix` the product of the stages before them,
 * built the same way from 1), so each point has the bits of a running
 * product over all stages. The band extremes are taken on |H|^2 and their
 * square roots formed once: a correctly rounded square root is monotone, so
 * the root of an extreme is the extreme of the roots, bit for bit, and the
 * margin is {@link gridMarginDb}'s on the roots of the products.
 *
 * @param spec - canonical spec
 * @param grid - the grid
 * @param prefix - the product of the stages before `stages`, per point (all ones for none)
 * @param stages - |H|^2 of the remaining stages, in order
 * @returns the smallest of the passband, stopband and gain margins, dB
 * @internal
 */
export function productMarginDb(spec: DesignSpec, grid: MaskGrid, prefix: Float64Array, stages: readonly Float64Array[]): number {
  let peak = 0;
  let low = Infinity;
  let stop = 0;
  const count = stages.length;
  for (let i = 0; i < prefix.length; i++) {
    let m = prefix[i] as number;
    for (let s = 0; s < count; s++) m *= (stages[s] as Float64Array)[i] as number;
    if (grid.band[i] === 1) {
      if (m > peak) peak = m;
      if (m < low) low = m;
    } else if (m > stop) stop = m;
  }
  peak = Math.sqrt(peak);
  low = Math.sqrt(low);
  stop = Math.sqrt(stop);
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
 * @param spanHz - first and last frequency (default {@link responseSpanHz} of the spec)
 * @returns the curve
 */
export function responseCurve(
  spec: DesignSpec,
  stages: readonly BuiltStage[],
  opamp: OpAmpModel,
  points: number,
  spanHz: readonly [number, number] = responseSpanHz(spec),
): ResponseCurve {
  const [lo, hi] = spanHz;
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
 * The verification's figures of a mask check (margins, where they bind,
 * polarity, stability), as the result stores them; `designFilter` and
 * `fromJson`'s re-verification both build them here.
 *
 * @param spec - canonical spec
 * @param m - the mask check of the stages as built
 * @returns the figures
 */
export function maskVerification(spec: DesignSpec, m: MaskCheck) {
  const polarityOk = spec.polarity === "either" || m.polarity === spec.polarity;
  return {
    passbandLossDb: m.passbandLossDb,
    passbandWorstHz: m.passbandWorstHz,
    passbandMarginDb: m.passbandMarginDb,
    stopbandAttenuationDb: m.stopbandAttenuationDb,
    stopbandWorstHz: m.stopbandWorstHz,
    stopbandMarginDb: m.stopbandMarginDb,
    gainDb: m.gainDb,
    targetGainDb: 20 * Math.log10(spec.gain),
    gainErrorDb: m.gainErrorDb,
    gainMarginDb: m.gainMarginDb,
    polarity: m.polarity,
    polarityOk,
    marginDb: m.marginDb,
    stable: m.unstableStages.length === 0,
    unstableStages: [...m.unstableStages],
  };
}
