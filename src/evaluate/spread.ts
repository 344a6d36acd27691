/**
 * First-order statistical tolerance model of a board: the response level at
 * the mask's critical frequencies and its gradient with respect to each
 * part's relative deviation, the yield of that linear model, and the
 * designer's per-constraint view (nominal margin, spread, worst-case
 * distance).
 *
 * Method: the critical points are every local extreme of the nominal
 * as-built |H| inside each band (passband maxima and minima, stopband
 * maxima; located on the mask's grid and refined by golden-section search)
 * and the band edges, less the stopband points more than
 * {@link STOP_RELEVANCE_DB} below the highest stopband level (they cannot
 * bind, and near a transmission zero a level in dB is not linear in the
 * parts). The gradient of each level in dB with respect to a
 * part's relative deviation `dx/x` is a central difference of relative step
 * {@link MODEL_STEP} on the owning stage's polynomials (only that stage is
 * re-evaluated). A band extreme moves with the parts, but by the envelope
 * theorem its first-order change equals the partial derivative at the
 * nominal extreme point (J. M. Danskin, "The Theory of Max-Min", Springer
 * 1967, theorem 1; used for yield analysis in H. E. Graeb, "Analog Design
 * Centering and Sizing", Springer 2007, ch. 6), so the model is first-order
 * exact for the extremes it holds. The linear yield evaluates the mask on
 * the linearised levels, `L_i + sum_j g_ij d_j`, taking the band extremes
 * over the points of each sample: O(points x parts) per board, no
 * polynomial work. The per-constraint view is first-order statistical
 * tolerance analysis: `sigma^2 = sum_j (g_j sigma_j)^2` with `g_j` the
 * constraint's gradient at the nominal extreme points, and the worst-case
 * distance `beta = margin / sigma` (Graeb 2007, ch. 6, the worst-case
 * distance of a linearised specification).
 *
 * Accuracy: the gradients carry a truncation error of O(MODEL_STEP^2) and a
 * rounding error of about 1e-8 dB per unit relative deviation. The model's
 * level changes agree with the exact ones to second order in the
 * deviations (test/evaluate/spread.test.ts measures it); its yield agrees
 * with {@link runBoards} within a few per cent at 0.1-1 % tolerances and
 * drifts as the second-order terms grow at 5-10 % (figures in the tests).
 * The per-constraint sigma uses one extreme point per band extreme, so for
 * an equiripple band (several equal peaks) it understates the spread of
 * their maximum; the sampled linear yield takes the maximum over all of them.
 *
 * @module
 */
import { SingularCircuitError } from "../errors.ts";
import { TWO_PI } from "../units/constants.ts";
import type { BoardStage, PartDistribution } from "./boards.ts";
import { multiplyMagnitudeSquared } from "./cascade.ts";
import { localExtremes, rationalSource, refineExtreme, type MaskLimits, type MaskPlan, type ResponseSource } from "./mask.ts";
import { boardLevels, fourBoardLevels, levelScratch, sharedDeviations } from "./linear-boards.ts";
import { boardPolynomialsInto, genericStagePolynomialsInto } from "./stage-polynomials.ts";
import type { ScaledRational } from "./types.ts";

export { linearLevels, sharedDeviations, unitDeviations } from "./linear-boards.ts";

/** Relative step of the central differences. */
export const MODEL_STEP = 1e-5;

/**
 * How far below the highest stopband point (dB) a stopband point is still
 * kept: a 20 dB move is far beyond what parts within a few per cent do to a
 * stopband level away from a transmission zero.
 */
export const STOP_RELEVANCE_DB = 20;

/** Most interior extremes kept per band and kind (maxima, minima). */
const EXTREMES_PER_BAND = 24;

/** {@link LinearModel.band} of a passband point. */
export const PASS_POINT = 1;
/** {@link LinearModel.band} of a stopband point. */
export const STOP_POINT = 2;

/** A part of the board, in board order (stage by stage, component order within a stage). */
export interface ModelPart {
  /** Index of its stage in the board (from 0). */
  readonly stage: number;
  /** Its component name within the stage (`compiled.componentNames`). */
  readonly name: string;
  /** Resistor or capacitor (by the name's first letter). */
  readonly kind: "resistor" | "capacitor";
  /** Nominal value, SI units. */
  readonly value: number;
}

/** The response's figures read off the model's points. */
export interface PointFigures {
  /** Passband loss, dB. */
  readonly passbandLossDb: number;
  /** Stopband attenuation, dB (Infinity without a stopband). */
  readonly stopbandAttenuationDb: number;
  /** Highest passband level, dB. */
  readonly gainDb: number;
  /** Smallest margin over the mask, dB. */
  readonly marginDb: number;
}

/** The first-order model of a board's response at the mask's critical points. */
export interface LinearModel {
  /** The parts, in board order: column `j` of {@link LinearModel.gradient}. */
  readonly parts: readonly ModelPart[];
  /** Frequency of each critical point, Hz. */
  readonly freqHz: Float64Array;
  /** Band of each point: {@link PASS_POINT} or {@link STOP_POINT}. */
  readonly band: Uint8Array;
  /** Nominal level at each point, dB. */
  readonly levelDb: Float64Array;
  /** `d levelDb / d(dx/x)`, row-major by point: entry `i * parts.length + j`. */
  readonly gradient: Float64Array;
  /** Points of the nominal passband maximum, passband minimum and stopband maximum (-1 without a stopband). */
  readonly extremes: { readonly peak: number; readonly low: number; readonly stop: number };
  /** The nominal figures from the points. */
  readonly nominal: PointFigures;
}

/** The board's parts in board order. */
function modelParts(stages: readonly BoardStage[]): ModelPart[] {
  const out: ModelPart[] = [];
  stages.forEach((s, k) => {
    s.compiled.componentNames.forEach((name, j) => {
      out.push({ stage: k, name, kind: name.startsWith("C") ? "capacitor" : "resistor", value: s.nominal[j] as number });
    });
  });
  return out;
}

/** A stage's polynomials at `values` the way a board's are formed; throws when the stage is singular there. */
function stageInto(s: BoardStage, k: number, values: Float64Array, p: { num: Float64Array; den: Float64Array; scale: number }, part: string): void {
  p.scale = boardPolynomialsInto(s.compiled, values, s.radius, p.num, p.den);
  if (p.scale === 0) {
    throw new SingularCircuitError(
      { fn: "linearModel", path: `stages[${k}]`, message: `the stage's equations are singular${part === "" ? "" : ` with ${part} moved`}: no tolerance model` },
      [part],
    );
  }
}

/** One critical point found: angular frequency and band. */
interface Point {
  readonly w: number;
  readonly band: number;
}

/** A band's critical points: its ends and its refined interior extremes. */
function bandPoints(source: ResponseSource, w: Float64Array, m: Float64Array, signs: readonly number[], band: number, out: Point[]): void {
  const n = w.length;
  out.push({ w: w[0] as number, band }, { w: w[n - 1] as number, band });
  const r = new Float64Array(2);
  for (const sign of signs) {
    for (const i of localExtremes(m, n, sign, EXTREMES_PER_BAND)) {
      if (i === 0 || i === n - 1) continue;
      refineExtreme(source, w[i - 1] as number, w[i + 1] as number, sign, r);
      out.push({ w: sign * (r[1] as number) > sign * (m[i] as number) ? (r[0] as number) : (w[i] as number), band });
    }
  }
}

/** Scratch of {@link bandLevels}: highest and lowest passband level, highest stopband level. */
const extremesScratch = new Float64Array(3);

/** The band extremes of levels at points, into {@link extremesScratch}. */
function bandLevels(level: Float64Array, at: number, band: Uint8Array): void {
  let peak = -Infinity;
  let low = Infinity;
  let stop = -Infinity;
  for (let i = 0; i < band.length; i++) {
    const x = level[at + i] as number;
    if (band[i] === PASS_POINT) {
      if (x > peak) peak = x;
      if (x < low) low = x;
    } else if (x > stop) stop = x;
  }
  extremesScratch[0] = peak;
  extremesScratch[1] = low;
  extremesScratch[2] = stop;
}

/**
 * The figures read off levels at points (the mask check on a set of
 * points): passband loss from the highest and lowest passband level,
 * stopband attenuation from the highest stopband level, gain from the
 * highest passband level, as the mask check measures them. No checks.
 *
 * @param level - levels, dB
 * @param at - index of the first point in `level`
 * @param band - band of each point
 * @param limits - the mask's limits
 * @returns the figures
 */
export function pointFigures(level: Float64Array, at: number, band: Uint8Array, limits: MaskLimits): PointFigures {
  bandLevels(level, at, band);
  const [peak, low, stop] = extremesScratch as unknown as [number, number, number];
  const passbandLossDb = peak - low;
  const stopbandAttenuationDb = peak - stop;
  return { passbandLossDb, stopbandAttenuationDb, gainDb: peak, marginDb: pointMargin(level, at, band, limits, 20 * Math.log10(limits.gain)) };
}

/**
 * The smallest margin of levels at points (the allocation-free form of
 * {@link pointFigures}, for the per-board loops). No checks.
 *
 * @param level - levels, dB
 * @param at - index of the first point in `level`
 * @param band - band of each point
 * @param limits - the mask's limits
 * @param targetDb - the wanted gain, dB (`20 log10(limits.gain)`)
 * @returns the smallest of the passband, stopband and gain margins, dB
 */
export function pointMargin(level: Float64Array, at: number, band: Uint8Array, limits: MaskLimits, targetDb: number): number {
  bandLevels(level, at, band);
  const peak = extremesScratch[0] as number;
  const loss = limits.maxLossDb - (peak - (extremesScratch[1] as number));
  const stopband = peak - (extremesScratch[2] as number) - limits.minAttenuationDb;
  const gain = limits.gainToleranceDb - Math.abs(peak - targetDb);
  return Math.min(loss, stopband, gain);
}

/** Index of the highest (`sign` 1) or lowest (-1) level among the points of `band`, or -1. */
function extremePoint(level: Float64Array, bandOf: Uint8Array, band: number, sign: number): number {
  let best = -1;
  for (let i = 0; i < level.length; i++) {
    if (bandOf[i] === band && (best < 0 || sign * (level[i] as number) > sign * (level[best] as number))) best = i;
  }
  return best;
}

/**
 * The first-order model of a board's response at the mask's critical
 * points (see the module header). Internal: no checks.
 *
 * @param stages - the board's stages (nominal values; their tolerances are not used)
 * @param plan - the mask
 * @returns the points, their nominal levels and gradients
 * @throws {@link SingularCircuitError} when a stage is singular at its nominal values or a step away
 * @example
 * ```ts
 * const model = linearModel(stages, plan);
 * model.gradient.length === model.levelDb.length * model.parts.length; //=> true
 * ```
 */
export function linearModel(stages: readonly BoardStage[], plan: MaskPlan): LinearModel {
  const polys = stages.map((s) => ({ num: new Float64Array(s.compiled.points), den: new Float64Array(s.compiled.points), scale: s.radius }));
  stages.forEach((s, k) => {
    const p = polys[k] as (typeof polys)[number];
    // plan the generic path at nominal (a no-op for a closed form), then form the nominal stage as a board's
    if (s.compiled.closedForm === null) genericStagePolynomialsInto(s.compiled, s.nominal, s.radius, p.num, p.den);
    stageInto(s, k, s.nominal, p, "");
  });
  const source = rationalSource(polys as ScaledRational[]);
  const found: Point[] = [];
  for (const g of plan.pass) {
    const m = plan.scratch.subarray(0, g.w.length);
    source.magnitudeSquared(g.w, m);
    bandPoints(source, g.w, m, [1, -1], PASS_POINT, found);
  }
  for (const g of plan.stop) {
    const m = plan.scratch.subarray(0, g.w.length);
    source.magnitudeSquared(g.w, m);
    bandPoints(source, g.w, m, [1], STOP_POINT, found);
  }
  const { w, band, levelDb } = relevantPoints(source, found);
  const parts = modelParts(stages);
  const gradient = stageGradients(stages, w, parts.length);
  const extremes = {
    peak: extremePoint(levelDb, band, PASS_POINT, 1),
    low: extremePoint(levelDb, band, PASS_POINT, -1),
    stop: extremePoint(levelDb, band, STOP_POINT, 1),
  };
  return {
    parts,
    freqHz: w.map((x) => x / TWO_PI),
    band,
    levelDb,
    gradient,
    extremes,
    nominal: pointFigures(levelDb, 0, band, plan.limits),
  };
}

/**
 * The points' levels, without the stopband points more than
 * {@link STOP_RELEVANCE_DB} below the highest stopband point: they cannot
 * bind, and near a transmission zero a level in dB is far from linear in the
 * parts (a maximum between two notch zeros at -100 dB moves by tens of dB
 * for a 1 % part), so their linearisation would only add false failures.
 */
function relevantPoints(source: ResponseSource, found: readonly Point[]): { w: Float64Array; band: Uint8Array; levelDb: Float64Array } {
  const level = Float64Array.from(found, (p) => 10 * Math.log10(source.magnitudeSquaredAt(p.w)));
  let stopMax = -Infinity;
  found.forEach((p, i) => {
    if (p.band === STOP_POINT) stopMax = Math.max(stopMax, level[i] as number);
  });
  const keep = found.map((p, i) => p.band === PASS_POINT || (level[i] as number) >= stopMax - STOP_RELEVANCE_DB);
  const kept = found.filter((_, i) => keep[i]);
  return {
    w: Float64Array.from(kept, (p) => p.w),
    band: Uint8Array.from(kept, (p) => p.band),
    levelDb: level.filter((_, i) => keep[i]),
  };
}

/** The gradient matrix: for each part, its stage at +-MODEL_STEP, the level change at every point. */
function stageGradients(stages: readonly BoardStage[], w: Float64Array, parts: number): Float64Array {
  const n = w.length;
  const gradient = new Float64Array(n * parts);
  const up = new Float64Array(n);
  const down = new Float64Array(n);
  let column = 0;
  stages.forEach((s, k) => {
    const p = { num: new Float64Array(s.compiled.points), den: new Float64Array(s.compiled.points), scale: s.radius };
    const v = s.nominal.slice();
    const level = (x: number, j: number, out: Float64Array): void => {
      v[j] = x;
      stageInto(s, k, v, p, s.compiled.componentNames[j] as string);
      out.fill(1);
      multiplyMagnitudeSquared(p.num, p.den, p.scale, w, out);
    };
    for (let j = 0; j < v.length; j++, column++) {
      const x = s.nominal[j] as number;
      level(x * (1 + MODEL_STEP), j, up);
      level(x * (1 - MODEL_STEP), j, down);
      v[j] = x;
      for (let i = 0; i < n; i++) gradient[i * parts + column] = (10 * Math.log10((up[i] as number) / (down[i] as number))) / (2 * MODEL_STEP);
    }
  });
  return gradient;
}

/**
 * The board's tolerances in board order (the model's parts), from its stages.
 *
 * @param stages - the board's stages
 * @returns one tolerance (fraction) per part
 */
export function boardTolerances(stages: readonly BoardStage[]): Float64Array {
  const out: number[] = [];
  for (const s of stages) out.push(...s.tolerance);
  return Float64Array.from(out);
}

/**
 * Standard deviation of a normal draw with sigma 1/3 truncated at +-1 (the
 * tolerance as 3 sigma, draws beyond it drawn again):
 * `sqrt(1 - 6 phi(3) / (2 Phi(3) - 1)) / 3` with phi(3) = exp(-4.5) / sqrt(2 pi) and
 * 2 Phi(3) - 1 = 0.9973002039367398 (the normal integral, M. Abramowitz &
 * I. A. Stegun, "Handbook of Mathematical Functions", 1964, table 26.1).
 */
const TRUNCATED_NORMAL_SIGMA = Math.sqrt(1 - (6 * Math.exp(-4.5)) / Math.sqrt(2 * Math.PI) / 0.9973002039367398) / 3;

/**
 * Standard deviation of a part's relative deviation per unit of its
 * tolerance: 1/sqrt(3) for a uniform spread over +-t; for a normal spread
 * with t = 3 sigma, 1/3 less the truncation at +-t (0.98658 / 3).
 *
 * @param distribution - the part spread
 * @returns sigma / t
 */
export function sigmaPerTolerance(distribution: PartDistribution): number {
  return distribution === "uniform" ? 1 / Math.sqrt(3) : TRUNCATED_NORMAL_SIGMA;
}

/** One constraint of the mask under first-order statistical tolerance analysis. */
export interface ConstraintSpread {
  /** Which constraint. */
  readonly constraint: "passband" | "stopband" | "gain";
  /** Nominal margin, dB. */
  readonly marginDb: number;
  /** Standard deviation of the margin under the tolerances, dB. */
  readonly sigmaDb: number;
  /** Worst-case distance `marginDb / sigmaDb` (Infinity when sigma is 0). */
  readonly beta: number;
  /** `d margin / d(dx/x)` per part, board order. */
  readonly gradient: Float64Array;
}

/** Row `i` of the gradient matrix times `sign`, added into `out`. */
function addRow(model: LinearModel, i: number, sign: number, out: Float64Array): void {
  const p = model.parts.length;
  for (let j = 0; j < p; j++) out[j] = (out[j] as number) + sign * (model.gradient[i * p + j] as number);
}

/**
 * The mask's constraints one by one: nominal margin, its gradient at the
 * nominal extreme points (envelope theorem), its standard deviation
 * `sqrt(sum_j (g_j sigma_j)^2)` and worst-case distance (H. E. Graeb,
 * "Analog Design Centering and Sizing", Springer 2007, ch. 6). A stopband
 * constraint is listed only when the mask has a stopband. No checks.
 *
 * @param model - the linear model
 * @param plan - the mask
 * @param tolerances - per part, board order (fractions)
 * @param distribution - the part spread
 * @returns one entry per constraint
 * @example
 * ```ts
 * constraintSpreads(model, plan, boardTolerances(stages), "uniform").map((c) => c.constraint); //=> ["passband", "stopband", "gain"]
 * ```
 */
export function constraintSpreads(
  model: LinearModel,
  plan: MaskPlan,
  tolerances: Float64Array,
  distribution: PartDistribution,
): ConstraintSpread[] {
  const { limits } = plan;
  const { peak, low, stop } = model.extremes;
  const p = model.parts.length;
  const unit = sigmaPerTolerance(distribution);
  const spread = (constraint: ConstraintSpread["constraint"], marginDb: number, gradient: Float64Array): ConstraintSpread => {
    let v = 0;
    for (let j = 0; j < p; j++) v += ((gradient[j] as number) * (tolerances[j] as number) * unit) ** 2;
    const sigmaDb = Math.sqrt(v);
    return { constraint, marginDb, sigmaDb, beta: sigmaDb > 0 ? marginDb / sigmaDb : Infinity, gradient };
  };
  const level = (i: number): number => model.levelDb[i] as number;
  const out: ConstraintSpread[] = [];
  // passband: maxLoss - (peak - low)
  const pass = new Float64Array(p);
  addRow(model, peak, -1, pass);
  addRow(model, low, 1, pass);
  out.push(spread("passband", limits.maxLossDb - (level(peak) - level(low)), pass));
  if (stop >= 0) {
    // stopband: (peak - stop) - minAttenuation
    const g = new Float64Array(p);
    addRow(model, peak, 1, g);
    addRow(model, stop, -1, g);
    out.push(spread("stopband", level(peak) - level(stop) - limits.minAttenuationDb, g));
  }
  // gain: tolerance - |peak - target|, on the side the nominal error lies
  const error = level(peak) - 20 * Math.log10(limits.gain);
  const g = new Float64Array(p);
  addRow(model, peak, error >= 0 ? -1 : 1, g);
  out.push(spread("gain", limits.gainToleranceDb - Math.abs(error), g));
  return out;
}

/** Options of {@link predictYield}. */
export interface LinearYieldOptions {
  /**
   * Boards sampled.
   * @defaultValue 4000
   */
  readonly samples?: number;
  /**
   * Seed: with the same seed the samples are the boards {@link runBoards} draws (paired comparison).
   * @defaultValue 1
   */
  readonly seed?: number;
}

/** The yield of the linear model. */
export interface LinearYield {
  /** Fraction of sampled boards whose linearised response meets the mask. */
  readonly fraction: number;
  /** Boards sampled. */
  readonly samples: number;
  /** Boards that met the mask. */
  readonly passed: number;
  /** Each board's linearised margin, dB. */
  readonly marginDb: Float64Array;
  /** The per-constraint first-order view (margin, sigma, worst-case distance). */
  readonly constraints: readonly ConstraintSpread[];
}

/**
 * The yield of the linear model: boards sampled as {@link runBoards} draws
 * them (uniform within +-t, or normal with t = 3 sigma truncated at +-t),
 * the mask checked on their linearised levels, with the per-constraint
 * first-order view. Internal: no checks.
 *
 * @param model - the linear model
 * @param plan - the mask
 * @param tolerances - per part, board order (fractions)
 * @param distribution - the part spread
 * @param options - samples and seed
 * @returns the fraction of boards that meet the mask, their margins and the constraints' spreads
 * @example
 * ```ts
 * predictYield(model, plan, boardTolerances(stages), "uniform", { samples: 2000 }).samples; //=> 2000
 * ```
 */
export function predictYield(
  model: LinearModel,
  plan: MaskPlan,
  tolerances: Float64Array,
  distribution: PartDistribution,
  options: LinearYieldOptions = {},
): LinearYield {
  const samples = options.samples ?? 4000;
  const p = model.parts.length;
  const draws = sharedDeviations(p, samples, distribution, options.seed ?? 1);
  const n = model.levelDb.length;
  const targetDb = 20 * Math.log10(plan.limits.gain);
  const marginDb = new Float64Array(samples);
  // each board's levels as linearLevels computes them (the same sums in the same order), four boards at a time (the last one or two by two), checked at once
  const scratch = levelScratch(p, n);
  let passed = 0;
  let k = 0;
  for (; k + 4 <= samples; k += 4) {
    fourBoardLevels(model, tolerances, draws, k, scratch);
    const m0 = pointMargin(scratch.level0, 0, model.band, plan.limits, targetDb);
    const m1 = pointMargin(scratch.level1, 0, model.band, plan.limits, targetDb);
    const m2 = pointMargin(scratch.level2, 0, model.band, plan.limits, targetDb);
    const m3 = pointMargin(scratch.level3, 0, model.band, plan.limits, targetDb);
    marginDb[k] = m0;
    marginDb[k + 1] = m1;
    marginDb[k + 2] = m2;
    marginDb[k + 3] = m3;
    if (m0 >= 0) passed++;
    if (m1 >= 0) passed++;
    if (m2 >= 0) passed++;
    if (m3 >= 0) passed++;
  }
  for (; k < samples; k += 2) {
    const two = k + 1 < samples;
    boardLevels(model, tolerances, draws, k, two, scratch);
    const m = pointMargin(scratch.level0, 0, model.band, plan.limits, targetDb);
    marginDb[k] = m;
    if (m >= 0) passed++;
    if (two) {
      const m1 = pointMargin(scratch.level1, 0, model.band, plan.limits, targetDb);
      marginDb[k + 1] = m1;
      if (m1 >= 0) passed++;
    }
  }
  return {
    fraction: passed / samples,
    samples,
    passed,
    marginDb,
    constraints: constraintSpreads(model, plan, tolerances, distribution),
  };
}
