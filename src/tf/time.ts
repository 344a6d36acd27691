/**
 * Step and impulse responses, and the figures of a step response (overshoot,
 * 10-90 % rise time, settling time, peak time).
 *
 * Method: the system is split into first- and second-order sections and
 * realised as a cascade state-space model `x' = A x + B u, y = C x + D u`
 * (each section in a frequency-scaled companion form whose states have unit
 * DC gain, so the matrix is well balanced). The responses follow from one
 * matrix exponential of the augmented matrix `M = [[A, B], [0, 0]]`:
 * `exp(M t) = [[Phi(t), Gamma(t)], [0, 1]]`, with `Gamma(t) = int_0^t exp(A s) ds B`
 * (C. F. Van Loan, "Computing integrals involving the matrix exponential",
 * IEEE Trans. Autom. Control 23(3):395-404, 1978). Then the step response is
 * `C Gamma(t) + D` and the impulse response is `C Phi(t) B` (the `D delta(t)`
 * term of a non-strictly-proper system is omitted, as scipy.signal.impulse
 * does). On a uniform grid the state is propagated with `Phi(h)` and
 * `Gamma(h)`: this zero-order-hold recursion is EXACT for a step input, which
 * is constant between samples, so the only errors are rounding errors; other
 * grids evaluate the exponential at each time. Repeated and clustered poles
 * need no special treatment (no partial fractions are formed).
 * Accuracy: about 1e-13 relative to the peak of the response for the filters
 * in the test fixtures (checked against exact residue sums in mpmath).
 *
 * Step figures refine every crossing found on the sampled grid by
 * regula falsi on the exact response (Illinois variant: M. Dowell and
 * P. Jarratt, "A modified regula falsi method for computing the root of an
 * equation", BIT 11:168-174, 1971), and the peak by the zero of the impulse
 * response (the derivative of the step response).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { bracketRoot, type BracketRootOptions } from "../math/bracket.ts";
import { expmUnchecked } from "../math/expm.ts";
import { TWO_PI } from "../units/constants.ts";
import { requireInRange, requireOptions } from "../validate.ts";
import { isCascade, requireGrid, requireProperStable, requireSystem } from "./check.ts";
import { toSectionsUnchecked } from "./sections.ts";
import type { SectionCascade, Zpk } from "./types.ts";
import { evalZpkUnchecked } from "./zpk.ts";

/** A real state-space model. */
interface StateSpace {
  n: number;
  a: Float64Array; // n x n row-major
  b: Float64Array;
  c: Float64Array;
  d: number;
}

/** Largest number of points {@link stepFigures} samples on its automatic grid. */
export const MAX_AUTO_POINTS = 200_001;

/** Realise a cascade of validated stable sections as one state-space model. */
function realise(cascade: SectionCascade): StateSpace {
  let ss: StateSpace = { n: 0, a: new Float64Array(0), b: new Float64Array(0), c: new Float64Array(0), d: 1 };
  for (const sec of cascade.sections) {
    const [b2, b1, b0] = sec.num;
    let m: number;
    let a2: Float64Array;
    let bb: Float64Array;
    let cc: Float64Array;
    let dd: number;
    if (sec.order === 1) {
      const w0 = sec.den[2];
      m = 1;
      a2 = Float64Array.of(-w0);
      bb = Float64Array.of(w0);
      cc = Float64Array.of((b0 - b1 * w0) / w0);
      dd = b1;
    } else {
      const a1 = sec.den[1];
      const a0 = sec.den[2];
      const w0 = Math.sqrt(a0);
      m = 2;
      a2 = Float64Array.of(0, w0, -w0, -a1);
      bb = Float64Array.of(0, w0);
      cc = Float64Array.of((b0 - b2 * a0) / a0, (b1 - b2 * a1) / w0);
      dd = b2;
    }
    // series connection: previous (A1,B1,C1,D1) feeds this section (A2,B2,C2,D2)
    const n1 = ss.n;
    const n = n1 + m;
    const a = new Float64Array(n * n);
    for (let i = 0; i < n1; i++) for (let j = 0; j < n1; j++) a[i * n + j] = ss.a[i * n1 + j] as number;
    for (let i = 0; i < m; i++) {
      for (let j = 0; j < n1; j++) a[(n1 + i) * n + j] = (bb[i] as number) * (ss.c[j] as number);
      for (let j = 0; j < m; j++) a[(n1 + i) * n + n1 + j] = a2[i * m + j] as number;
    }
    const b = new Float64Array(n);
    for (let i = 0; i < n1; i++) b[i] = ss.b[i] as number;
    for (let i = 0; i < m; i++) b[n1 + i] = (bb[i] as number) * ss.d;
    const c = new Float64Array(n);
    for (let j = 0; j < n1; j++) c[j] = dd * (ss.c[j] as number);
    for (let j = 0; j < m; j++) c[n1 + j] = cc[j] as number;
    ss = { n, a, b, c, d: dd * ss.d };
  }
  const g = cascade.gain;
  return { n: ss.n, a: ss.a, b: ss.b, c: ss.c.map((v) => v * g), d: ss.d * g };
}

/** Augmented matrix [[A, B], [0, 0]]. */
function augmented(ss: StateSpace): Float64Array {
  const n = ss.n + 1;
  const m = new Float64Array(n * n);
  for (let i = 0; i < ss.n; i++) {
    for (let j = 0; j < ss.n; j++) m[i * n + j] = ss.a[i * ss.n + j] as number;
    m[i * n + ss.n] = ss.b[i] as number;
  }
  return m;
}

/** Exact step and impulse values at one time t >= 0. */
function evalAt(ss: StateSpace, aug: Float64Array, t: number): { step: number; impulse: number } {
  const n = ss.n;
  if (n === 0) return { step: ss.d, impulse: 0 };
  const e = expmUnchecked(n + 1, aug, t);
  let step = ss.d;
  let impulse = 0;
  for (let i = 0; i < n; i++) {
    const ci = ss.c[i] as number;
    step += ci * (e[i * (n + 1) + n] as number);
    let phiB = 0;
    for (let j = 0; j < n; j++) phiB += (e[i * (n + 1) + j] as number) * (ss.b[j] as number);
    impulse += ci * phiB;
  }
  return { step, impulse };
}

/** Uniform spacing of a grid, or undefined when it is not uniform (to 1e-12 of its span). */
function uniformStep(t: Float64Array): number | undefined {
  const n = t.length;
  if (n < 3) return undefined;
  const t0 = t[0] as number;
  const h = ((t[n - 1] as number) - t0) / (n - 1);
  if (!(h > 0)) return undefined;
  const tol = 1e-12 * Math.max(Math.abs(t[n - 1] as number), Math.abs(t0));
  for (let k = 1; k < n; k++) if (Math.abs((t[k] as number) - (t0 + k * h)) > tol) return undefined;
  return h;
}

/** Step and impulse responses on a grid (no checks). */
function responses(ss: StateSpace, t: Float64Array, want: "step" | "impulse"): Float64Array {
  const out = new Float64Array(t.length);
  const n = ss.n;
  const aug = augmented(ss);
  const h = uniformStep(t);
  if (n === 0 || h === undefined) {
    for (let k = 0; k < t.length; k++) {
      const v = evalAt(ss, aug, t[k] as number);
      out[k] = want === "step" ? v.step : v.impulse;
    }
    return out;
  }
  const n1 = n + 1;
  const eh = expmUnchecked(n1, aug, h);
  const e0 = expmUnchecked(n1, aug, t[0] as number);
  // state x (step: x = Gamma(t), impulse: x = Phi(t) B)
  let x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (want === "step") x[i] = e0[i * n1 + n] as number;
    else {
      let s = 0;
      for (let j = 0; j < n; j++) s += (e0[i * n1 + j] as number) * (ss.b[j] as number);
      x[i] = s;
    }
  }
  let next = new Float64Array(n);
  for (let k = 0; k < t.length; k++) {
    let y = want === "step" ? ss.d : 0;
    for (let i = 0; i < n; i++) y += (ss.c[i] as number) * (x[i] as number);
    out[k] = y;
    for (let i = 0; i < n; i++) {
      let s = want === "step" ? (eh[i * n1 + n] as number) : 0;
      for (let j = 0; j < n; j++) s += (eh[i * n1 + j] as number) * (x[j] as number);
      next[i] = s;
    }
    const tmp = x;
    x = next;
    next = tmp;
  }
  return out;
}

/** Validate a system for time responses and realise it. */
function prepare(fn: string, system: Zpk | SectionCascade): { ss: StateSpace; dc: number } {
  requireSystem(fn, "system", system);
  let cascade: SectionCascade;
  if (isCascade(system)) {
    system.sections.forEach((s, i) => {
      const stable = s.order === 1 ? s.den[2] > 0 : s.den[1] > 0 && s.den[2] > 0;
      if (!stable) {
        throw new InvalidArgumentError({
          fn,
          path: `system.sections[${i}].den`,
          received: s.den,
          message: "time responses need stable sections (all denominator coefficients > 0)",
        });
      }
    });
    cascade = system;
  } else {
    requireProperStable(fn, system, {
      improper: "has no finite step response; give no more zeros than poles",
      unstable: "time responses need poles in the open left half-plane (Re < 0)",
    });
    cascade = toSectionsUnchecked(system, "as-given");
  }
  const ss = realise(cascade);
  let dc = cascade.gain;
  for (const s of cascade.sections) dc *= s.num[2] / s.den[2];
  return { ss, dc };
}

/**
 * Step response `y(t)` of a stable system to a unit step applied at `t = 0`,
 * exact up to rounding (see the module header; exact zero-order-hold
 * propagation on uniform grids, one matrix exponential per point otherwise).
 *
 * @param system - a stable zpk (no more zeros than poles) or a stable section cascade
 * @param t - times in seconds (for frequencies in rad/s), finite and >= 0
 * @returns `y(t)` per time point
 * @throws {@link InvalidArgumentError} when the system is malformed, improper or unstable, or a time is negative or not finite
 * @example
 * ```ts
 * // 1/(s + 1): y = 1 - exp(-t)
 * stepResponse(zpk([], [{ re: -1, im: 0 }], 1), Float64Array.of(0, 1)); //=> Float64Array [0, 0.6321205588285579]
 * ```
 */
export function stepResponse(system: Zpk | SectionCascade, t: Float64Array): Float64Array {
  const { ss } = prepare("stepResponse", system);
  const grid = requireGrid("stepResponse", "t", t, { nonNegative: true });
  return responses(ss, grid, "step");
}

/**
 * Impulse response `h(t)` of a stable system (the regular part: for a system
 * with a direct feedthrough `D`, the `D delta(t)` term is left out).
 *
 * @param system - a stable zpk (no more zeros than poles) or a stable section cascade
 * @param t - times in seconds, finite and >= 0
 * @returns `h(t)` per time point
 * @throws {@link InvalidArgumentError} when the system is malformed, improper or unstable, or a time is negative or not finite
 * @example
 * ```ts
 * // 2/(s + 2): h = 2 exp(-2t)
 * impulseResponse(zpk([], [{ re: -2, im: 0 }], 2), Float64Array.of(0, 0.5)); //=> Float64Array [2, 0.7357588823428852]
 * ```
 */
export function impulseResponse(system: Zpk | SectionCascade, t: Float64Array): Float64Array {
  const { ss } = prepare("impulseResponse", system);
  const grid = requireGrid("impulseResponse", "t", t, { nonNegative: true });
  return responses(ss, grid, "impulse");
}

/** Options of {@link stepFigures}. */
export interface StepFiguresOptions {
  /**
   * Time grid (s) to search for crossings, starting at 0 and increasing.
   * Every crossing found on it is then refined on the exact response.
   * @defaultValue automatic: uniform, up to 20 / (slowest decay rate), at
   *   least 40 points per period of the fastest pole, at most {@link MAX_AUTO_POINTS}
   */
  readonly t?: Float64Array;
  /**
   * Half-width of the settling band around the final value, in percent.
   * @defaultValue 2
   */
  readonly bandPercent?: number;
}

/** Figures of a step response. */
export interface StepFigures {
  /** Final value `H(0)` (the DC gain). */
  readonly finalValue: number;
  /** Overshoot above the final value, in percent of it (0 when the response never exceeds it). */
  readonly overshootPercent: number;
  /** Value at the peak (the final value when there is no overshoot). */
  readonly peakValue: number;
  /** Time of the peak (s), or `null` when there is no overshoot. */
  readonly peakTimeS: number | null;
  /** 10 % to 90 % rise time (s), or `null` when 90 % is not reached on a given grid. */
  readonly riseTimeS: number | null;
  /**
   * Time (s) after which the response stays within the band up to the end of
   * the grid (the automatic grid is extended until the response has settled;
   * a given grid must be long enough), or `null` when the last sample is
   * still outside the band.
   */
  readonly settlingTimeS: number | null;
}

/** Refinement of a crossing between two grid times: up to 100 Illinois steps, every tenth a bisection, to 4 ulp. */
const CROSSING: BracketRootOptions = Object.freeze({
  maxIterations: 100,
  bisectEvery: 10,
  relWidth: 4 * Number.EPSILON,
  result: "latest",
});

/** Bracketed root of f on [a, b] (see {@link bracketRoot}). */
function refineRoot(f: (t: number) => number, a: number, b: number): number {
  return bracketRoot(f, a, b, CROSSING);
}

/** The automatic grid from the pole positions. */
function autoGrid(system: Zpk | SectionCascade, stretch: number): Float64Array {
  let slow = Infinity;
  let fast = 0;
  const sections = isCascade(system) ? system.sections : toSectionsUnchecked(system, "as-given").sections;
  for (const s of sections) {
    if (s.order === 1) {
      slow = Math.min(slow, s.den[2]);
      fast = Math.max(fast, s.den[2]);
    } else {
      const a1 = s.den[1];
      const a0 = s.den[2];
      const disc = a1 * a1 - 4 * a0;
      // slowest decay rate of the pair: a1/2 for complex poles, the smaller real root otherwise
      const rate = disc < 0 ? a1 / 2 : (2 * a0) / (a1 + Math.sqrt(disc));
      slow = Math.min(slow, rate);
      fast = Math.max(fast, Math.sqrt(a0), a1);
    }
  }
  if (!Number.isFinite(slow)) return Float64Array.of(0, 1);
  const tEnd = (20 * stretch) / slow;
  const dt = Math.min(tEnd / 2000, TWO_PI / (40 * fast));
  const count = Math.min(MAX_AUTO_POINTS, Math.ceil(tEnd / dt) + 1);
  const out = new Float64Array(count);
  for (let k = 0; k < count; k++) out[k] = (tEnd * k) / (count - 1);
  return out;
}

/**
 * Figures of the unit step response: final value, percent overshoot, peak
 * time, 10-90 % rise time and settling time into a band around the final
 * value. Crossings are located on a time grid and then refined on the exact
 * response (see the module header), so the figures do not depend on the grid
 * resolution beyond missing excursions shorter than a grid step.
 *
 * @param system - a stable zpk or section cascade with a non-zero DC gain
 * @param options - time grid and settling band
 * @returns the figures; times in seconds
 * @throws {@link InvalidArgumentError} when the system is malformed, improper, unstable or has zero DC gain (a highpass or bandpass: no final value to refer to), or the options are malformed
 * @example
 * ```ts
 * // second-order lowpass, w0 = 1 rad/s, Q = 1/sqrt(2) (Butterworth)
 * const f = stepFigures(zpk([], [{ re: -Math.SQRT1_2, im: Math.SQRT1_2 }, { re: -Math.SQRT1_2, im: -Math.SQRT1_2 }], 1));
 * f.overshootPercent; //=> 4.321391826377141  (100 exp(-pi) = 4.3213918263772)
 * f.peakTimeS;        //=> 4.442882938158371  (pi sqrt(2) = 4.4428829381584)
 * ```
 */
export function stepFigures(system: Zpk | SectionCascade, options?: StepFiguresOptions): StepFigures {
  const fn = "stepFigures";
  const { ss, dc } = prepare(fn, system);
  const opts = requireOptions(fn, "options", options);
  const band = opts["bandPercent"] === undefined ? 2 : requireInRange(fn, "options.bandPercent", opts["bandPercent"], { min: 0, max: 100, exclusiveMin: true });
  let userGrid: Float64Array | undefined;
  if (opts["t"] !== undefined) {
    userGrid = requireGrid(fn, "options.t", opts["t"], { nonNegative: true, increasing: true });
    if (userGrid.length < 2 || userGrid[0] !== 0) {
      throw new InvalidArgumentError({ fn, path: "options.t", received: userGrid.length < 2 ? userGrid.length : userGrid[0], message: "expected at least two times, starting at 0" });
    }
  }
  const finalValue = isCascade(system) ? dc : evalZpkUnchecked(system, 0, 0).re;
  if (finalValue === 0 || !Number.isFinite(finalValue)) {
    throw new InvalidArgumentError({
      fn,
      path: "system",
      received: finalValue,
      message: "the DC gain is zero (a highpass or bandpass response), so the step response has no final value to measure against",
    });
  }
  const aug = augmented(ss);
  const r = (t: number): number => evalAt(ss, aug, t).step / finalValue;
  const dr = (t: number): number => evalAt(ss, aug, t).impulse / finalValue;
  const b = band / 100;

  let t: Float64Array = userGrid ?? autoGrid(system, 1);
  let y = responses(ss, t, "step").map((v) => v / finalValue);
  // extend the automatic grid until the response has settled
  for (let stretch = 2; userGrid === undefined && stretch <= 64; stretch *= 2) {
    if (Math.abs((y[y.length - 1] as number) - 1) <= b && Math.abs((y[y.length - 2] as number) - 1) <= b) break;
    t = autoGrid(system, stretch);
    y = responses(ss, t, "step").map((v) => v / finalValue);
  }
  const n = t.length;

  const firstReach = (level: number): number | null => {
    if ((y[0] as number) >= level) return 0;
    for (let k = 1; k < n; k++) {
      if ((y[k] as number) >= level) return refineRoot((x) => r(x) - level, t[k - 1] as number, t[k] as number);
    }
    return null;
  };
  const t10 = firstReach(0.1);
  const t90 = firstReach(0.9);
  const riseTimeS = t10 === null || t90 === null ? null : t90 - t10;

  let kMax = 0;
  for (let k = 1; k < n; k++) if ((y[k] as number) > (y[kMax] as number)) kMax = k;
  let peakTimeS: number | null = null;
  let peak = 1;
  if ((y[kMax] as number) > 1) {
    peakTimeS = t[kMax] as number;
    peak = y[kMax] as number;
    if (kMax > 0 && kMax < n - 1) {
      const tp = refineRoot(dr, t[kMax - 1] as number, t[kMax + 1] as number);
      const rp = r(tp);
      if (rp >= peak) {
        peakTimeS = tp;
        peak = rp;
      }
    }
  }

  let last = -1;
  for (let k = n - 1; k >= 0; k--) {
    if (Math.abs((y[k] as number) - 1) > b) {
      last = k;
      break;
    }
  }
  let settlingTimeS: number | null;
  if (last < 0) settlingTimeS = 0;
  else if (last === n - 1) settlingTimeS = null;
  else {
    const level = (y[last] as number) > 1 ? 1 + b : 1 - b;
    settlingTimeS = refineRoot((x) => r(x) - level, t[last] as number, t[last + 1] as number);
  }
  return {
    finalValue,
    overshootPercent: Math.max(0, (peak - 1) * 100),
    peakValue: peak * finalValue,
    peakTimeS,
    riseTimeS,
    settlingTimeS,
  };
}
