/**
 * Frequency response, magnitude, phase and group delay of an analog transfer
 * function on the jw axis, all computed from the factored form.
 *
 * - `frequencyResponse` forms the products of the factors `(jw - z_i)` and
 *   `(jw - p_i)` point by point and divides once (no polynomial expansion, so
 *   no coefficient cancellation; points where a product would leave the
 *   floating-point range are redone one root at a time); an exact conjugate pair is
 *   applied as one quadratic factor built from the rounded differences
 *   `w - Im r` and `w + Im r`, which keeps the same accuracy. A cascade is
 *   evaluated section by section. Relative error a few units of 2^-53 per
 *   factor (worst 1.6e-15 against scipy.signal.freqs_zpk in the fixtures).
 * - `magnitudeDb` sums `20 log10 |factor|` terms.
 * - `phase` sums the continuous arguments of the factors, so it is unwrapped
 *   analytically rather than by detecting jumps: `arg(jw - r) = atan2(w - Im r, -Re r)`
 *   on a branch continuous in `w >= 0`. Zeros on the jw axis add the jump of
 *   +pi that `H` has when it passes through zero (the limit from Re s > 0).
 *   The whole curve is shifted by a multiple of 2 pi so that its limit at
 *   `w -> 0+` lies in (-pi, pi]; it therefore does not depend on the grid.
 * - `groupDelay` is the exact derivative `tau(w) = -d phase/dw
 *   = sum_poles -Re p / ((w - Im p)^2 + Re p^2) - sum_zeros -Re z / ((w - Im z)^2 + Re z^2)`
 *   (each term is the derivative of `atan2(w - Im r, -Re r)`; the
 *   continuous-time counterpart of the pole/zero group-delay sum in
 *   A. V. Oppenheim and R. W. Schafer, "Discrete-Time Signal Processing",
 *   3rd ed., Pearson 2010, chapter 5; zeros on the jw axis contribute 0
 *   away from the zero itself).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { cdiv, cmul, type Complex } from "../math/complex.ts";
import { isCascade, requireGrid, requireSystem } from "./check.ts";
import { fromSectionsUnchecked } from "./sections.ts";
import type { SectionCascade, Zpk } from "./types.ts";
import { evalZpkUnchecked } from "./zpk.ts";

/** Magnitudes below this (in dB), including an exact transmission zero, are reported as this value. */
export const MAGNITUDE_FLOOR_DB = -400;

/** A complex response on a grid, as separate real and imaginary parts. */
export interface ComplexResponse {
  /** Real parts, one per grid point. */
  readonly re: Float64Array;
  /** Imaginary parts, one per grid point. */
  readonly im: Float64Array;
}

/** Reject a grid point that lands exactly on a jw-axis pole (the response would be infinite). */
function checkNoAxisPole(fn: string, poles: readonly Complex[], w: Float64Array): void {
  for (const p of poles) {
    if (p.re !== 0) continue;
    for (let i = 0; i < w.length; i++) {
      if (w[i] === p.im) {
        throw new InvalidArgumentError({
          fn,
          path: `w[${i}]`,
          received: w[i],
          message: "this frequency is a pole on the jw axis, where the response is infinite; move the grid point",
        });
      }
    }
  }
}

function polesOf(system: Zpk | SectionCascade): readonly Complex[] {
  return isCascade(system) ? fromSectionsUnchecked(system).poles : system.poles;
}

/** One factor of the response: a root r = -a + j b, or the exact conjugate pair r, conj(r) (then b >= 0). */
interface Factor {
  readonly a: number;
  readonly b: number;
  readonly pair: boolean;
}

/** Group exact conjugate pairs (equal real parts, opposite imaginary parts) into one factor each. */
function factorPlan(roots: readonly Complex[]): Factor[] {
  const used = new Uint8Array(roots.length);
  const out: Factor[] = [];
  for (let i = 0; i < roots.length; i++) {
    if (used[i] === 1) continue;
    used[i] = 1;
    const r = roots[i] as Complex;
    if (r.im !== 0) {
      let j = i + 1;
      while (j < roots.length && !(used[j] === 0 && (roots[j] as Complex).re === r.re && (roots[j] as Complex).im === -r.im)) j++;
      if (j < roots.length) {
        used[j] = 1;
        out.push({ a: -r.re, b: Math.abs(r.im), pair: true });
        continue;
      }
    }
    out.push({ a: -r.re, b: r.im, pair: false });
  }
  return out;
}

/** Factors packed into typed arrays for the point-by-point loop. */
interface PackedFactors {
  /** `a` of each conjugate pair. */
  readonly pairA: Float64Array;
  /** `b` of each conjugate pair (>= 0). */
  readonly pairB: Float64Array;
  /** `a` of each single root. */
  readonly singleA: Float64Array;
  /** `b` of each single root. */
  readonly singleB: Float64Array;
}

function pack(factors: readonly Factor[]): PackedFactors {
  const pairs = factors.filter((f) => f.pair);
  const singles = factors.filter((f) => !f.pair);
  return {
    pairA: Float64Array.from(pairs, (f) => f.a),
    pairB: Float64Array.from(pairs, (f) => f.b),
    singleA: Float64Array.from(singles, (f) => f.a),
    singleB: Float64Array.from(singles, (f) => f.b),
  };
}

/** Scratch pair written by {@link productAt} (avoids an allocation per point). */
const acc = new Float64Array(2);

/** prod over the packed factors of `(jw - r)` at one frequency, written into `acc`. */
function productAt(f: PackedFactors, wk: number): void {
  let re = 1;
  let im = 0;
  const { pairA, pairB, singleA, singleB } = f;
  for (let i = 0; i < pairA.length; i++) {
    const a = pairA[i] as number;
    const b = pairB[i] as number;
    const fr = a * a - (wk - b) * (wk + b);
    const fi = 2 * a * wk;
    const t = re * fr - im * fi;
    im = re * fi + im * fr;
    re = t;
  }
  for (let i = 0; i < singleA.length; i++) {
    const fr = singleA[i] as number;
    const fi = wk - (singleB[i] as number);
    const t = re * fr - im * fi;
    im = re * fi + im * fr;
    re = t;
  }
  acc[0] = re;
  acc[1] = im;
}

/**
 * Store `k0 * (nr + j ni) / (dr + j di)` at index `k` when both products are
 * comfortably inside the floating-point range and the quotient is finite;
 * returns false (storing nothing) when the point needs the slow, overflow-safe path.
 */
function storeQuotient(
  k0: number,
  nr: number,
  ni: number,
  dr: number,
  di: number,
  outRe: Float64Array,
  outIm: Float64Array,
  k: number,
): boolean {
  const nm = nr * nr + ni * ni;
  const dm = dr * dr + di * di;
  if (!(nm > 1e-280 && nm < 1e280 && dm > 1e-280 && dm < 1e280)) return false;
  const inv = k0 / dm;
  const re = (nr * dr + ni * di) * inv;
  const im = (ni * dr - nr * di) * inv;
  if (!Number.isFinite(re) || !Number.isFinite(im)) return false;
  outRe[k] = re;
  outIm[k] = im;
  return true;
}

/** Zpk response core (no checks). */
export function zpkResponseUnchecked(system: Zpk, w: Float64Array): ComplexResponse {
  const n = w.length;
  const outRe = new Float64Array(n);
  const outIm = new Float64Array(n);
  const zf = pack(factorPlan(system.zeros));
  const pf = pack(factorPlan(system.poles));
  const k0 = system.gain;
  // Point by point: numerator and denominator products accumulate separately
  // and meet in one division. A conjugate pair is the quadratic
  // `(a + j(w - b))(a + j(w + b)) = a^2 - (w - b)(w + b) + j 2 a w`, formed from
  // the exactly rounded differences `w - b`, `w + b`, so it keeps a relative
  // error of a few ulps even where it nearly cancels. Where either product
  // leaves the comfortable range (large |w| at high order, or a point on an
  // exact transmission zero), the point is redone one root at a time with
  // Smith's division, interleaving zeros and poles so that nothing overflows.
  for (let k = 0; k < n; k++) {
    const wk = w[k] as number;
    productAt(zf, wk);
    const nr = acc[0] as number;
    const ni = acc[1] as number;
    productAt(pf, wk);
    const dr = acc[0] as number;
    const di = acc[1] as number;
    if (storeQuotient(k0, nr, ni, dr, di, outRe, outIm, k)) continue;
    // s = -0 + j wk: `-0 - Re r` is exactly `-Re r`, signed zeros included.
    const v = evalZpkUnchecked(system, -0, wk, true);
    outRe[k] = v.re;
    outIm[k] = v.im;
  }
  return { re: outRe, im: outIm };
}

/** Cascade response core (no checks). */
export function cascadeResponseUnchecked(cascade: SectionCascade, w: Float64Array): ComplexResponse {
  const n = w.length;
  const outRe = new Float64Array(n);
  const outIm = new Float64Array(n);
  const m = cascade.sections.length;
  // Coefficients packed as [b2, b1, b0, a2, a1, a0] per section.
  const c = new Float64Array(6 * m);
  cascade.sections.forEach((sec, i) => {
    c.set(sec.num, 6 * i);
    c.set(sec.den, 6 * i + 3);
  });
  const k0 = cascade.gain;
  // Point by point: numerator and denominator products meet in one division;
  // where either leaves the comfortable range, the point is redone one
  // section at a time (each with Smith's division).
  for (let k = 0; k < n; k++) {
    const wk = w[k] as number;
    const w2 = wk * wk;
    let nr = 1;
    let ni = 0;
    let dr = 1;
    let di = 0;
    for (let i = 0; i < 6 * m; i += 6) {
      const fr = (c[i + 2] as number) - (c[i] as number) * w2;
      const fi = (c[i + 1] as number) * wk;
      const t = nr * fr - ni * fi;
      ni = nr * fi + ni * fr;
      nr = t;
      const gr = (c[i + 5] as number) - (c[i + 3] as number) * w2;
      const gi = (c[i + 4] as number) * wk;
      const u = dr * gr - di * gi;
      di = dr * gi + di * gr;
      dr = u;
    }
    if (storeQuotient(k0, nr, ni, dr, di, outRe, outIm, k)) continue;
    cascadePointBySection(c, m, k0, wk, k, outRe, outIm);
  }
  return { re: outRe, im: outIm };
}

/** One grid point of a cascade, one section at a time with Smith's division (slow, overflow-safe path). */
function cascadePointBySection(
  c: Float64Array,
  m: number,
  k0: number,
  wk: number,
  k: number,
  outRe: Float64Array,
  outIm: Float64Array,
): void {
  const w2 = wk * wk;
  let v: Complex = { re: k0, im: 0 };
  for (let i = 0; i < 6 * m; i += 6) {
    const num = { re: (c[i + 2] as number) - (c[i] as number) * w2, im: (c[i + 1] as number) * wk };
    const den = { re: (c[i + 5] as number) - (c[i + 3] as number) * w2, im: (c[i + 4] as number) * wk };
    v = cmul(v, cdiv(num, den));
  }
  outRe[k] = v.re;
  outIm[k] = v.im;
}

/**
 * Complex frequency response `H(jw)` on a grid of angular frequencies.
 *
 * @param system - a zpk transfer function or a section cascade
 * @param w - angular frequencies (rad/s), finite
 * @returns `{ re, im }` of `H(jw)`, one entry per grid point
 * @throws {@link InvalidArgumentError} when the system or grid is malformed, or a grid point is exactly a jw-axis pole
 * @example
 * ```ts
 * const h = zpk([], [{ re: -1, im: 0 }], 1);
 * frequencyResponse(h, Float64Array.of(0, 1)); //=> { re: Float64Array [1, 0.5], im: Float64Array [0, -0.5] }
 * ```
 */
export function frequencyResponse(system: Zpk | SectionCascade, w: Float64Array): ComplexResponse {
  const fn = "frequencyResponse";
  requireSystem(fn, "system", system);
  const grid = requireGrid(fn, "w", w);
  checkNoAxisPole(fn, polesOf(system), grid);
  if (!isCascade(system)) return zpkResponseUnchecked(system, grid);
  const r = cascadeResponseUnchecked(system, grid);
  repairCascade(system, grid, r.re, r.im);
  return r;
}

/**
 * Where a section's polynomials overflow (w^2 beyond the double range) the
 * cascade value is not finite; recompute those points from the factored form.
 */
function repairCascade(cascade: SectionCascade, w: Float64Array, re: Float64Array, im: Float64Array): void {
  let z: Zpk | undefined;
  for (let k = 0; k < w.length; k++) {
    if (Number.isFinite(re[k] as number) && Number.isFinite(im[k] as number)) continue;
    z ??= fromSectionsUnchecked(cascade);
    const v = zpkResponseUnchecked(z, w.subarray(k, k + 1));
    re[k] = v.re[0] as number;
    im[k] = v.im[0] as number;
  }
}

/** Magnitude in dB core (no checks). */
export function magnitudeDbUnchecked(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  const out = new Float64Array(w.length);
  const LOG = 20 / Math.LN10;
  if (isCascade(system)) {
    const base = LOG * Math.log(Math.abs(system.gain));
    out.fill(base);
    for (const sec of system.sections) {
      const [b2, b1, b0] = sec.num;
      const [a2, a1, a0] = sec.den;
      for (let k = 0; k < w.length; k++) {
        const wk = w[k] as number;
        const w2 = wk * wk;
        const n = Math.hypot(b0 - b2 * w2, b1 * wk);
        const d = Math.hypot(a0 - a2 * w2, a1 * wk);
        out[k] = (out[k] as number) + LOG * (Math.log(n) - Math.log(d));
      }
    }
    // points where a section polynomial overflowed: use the factored form
    let z: Zpk | undefined;
    for (let k = 0; k < w.length; k++) {
      const v = out[k] as number;
      if (!Number.isNaN(v) && v !== Infinity) continue;
      z ??= fromSectionsUnchecked(system);
      out[k] = magnitudeDbUnchecked(z, w.subarray(k, k + 1))[0] as number;
    }
  } else {
    out.fill(LOG * Math.log(Math.abs(system.gain)));
    for (const [roots, sign] of [
      [system.zeros, 1],
      [system.poles, -1],
    ] as const) {
      for (const r of roots) {
        for (let k = 0; k < w.length; k++) {
          out[k] = (out[k] as number) + sign * LOG * Math.log(Math.hypot(r.re, (w[k] as number) - r.im));
        }
      }
    }
  }
  for (let k = 0; k < w.length; k++) {
    const v = out[k] as number;
    if (!(v >= MAGNITUDE_FLOOR_DB)) out[k] = MAGNITUDE_FLOOR_DB;
  }
  return out;
}

/**
 * Magnitude `20 log10 |H(jw)|` in dB on a grid, summed factor by factor (no
 * overflow for high orders). Values below {@link MAGNITUDE_FLOOR_DB}
 * (including an exact transmission zero on the grid) are clamped to it.
 *
 * @param system - a zpk transfer function or a section cascade
 * @param w - angular frequencies (rad/s), finite
 * @returns magnitude in dB per grid point
 * @throws {@link InvalidArgumentError} when the system or grid is malformed, or a grid point is exactly a jw-axis pole
 * @example
 * ```ts
 * magnitudeDb(zpk([], [{ re: -1, im: 0 }], 1), Float64Array.of(1)); //=> Float64Array [-3.0102999566398116]
 * ```
 */
export function magnitudeDb(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  const fn = "magnitudeDb";
  requireSystem(fn, "system", system);
  const grid = requireGrid(fn, "w", w);
  checkNoAxisPole(fn, polesOf(system), grid);
  return magnitudeDbUnchecked(system, grid);
}

/** Continuous argument of (jw - r) on w >= 0, before the global 2 pi shift. */
function factorArg(r: Complex, w: number): number {
  const c = r.re === 0 ? 0 : -r.re;
  const d = w - r.im;
  if (c >= 0) return Math.atan2(d, c); // LHP or axis: (-pi/2, pi/2], continuous (axis: +pi jump)
  // RHP root: atan2 jumps by +2 pi as d crosses 0 upwards; take the branch continuous in w.
  return d >= 0 ? Math.atan2(d, c) - 2 * Math.PI : Math.atan2(d, c);
}

/** Limit of factorArg as w -> 0+ (an origin root gives +pi/2). */
function factorArgAtZero(r: Complex): number {
  if (r.re === 0 && r.im === 0) return Math.PI / 2;
  return factorArg(r, 0);
}

/** Phase core for a zpk (no checks). */
export function zpkPhaseUnchecked(system: Zpk, w: Float64Array): Float64Array {
  const base = system.gain < 0 ? Math.PI : 0;
  let at0 = base;
  for (const z of system.zeros) at0 += factorArgAtZero(z);
  for (const p of system.poles) at0 -= factorArgAtZero(p);
  // shift so that the w -> 0+ value lies in (-pi, pi]
  const shift = -2 * Math.PI * Math.ceil((at0 - Math.PI) / (2 * Math.PI));
  const out = new Float64Array(w.length).fill(base + shift);
  for (const z of system.zeros) for (let k = 0; k < w.length; k++) out[k] = (out[k] as number) + factorArg(z, w[k] as number);
  for (const p of system.poles) for (let k = 0; k < w.length; k++) out[k] = (out[k] as number) - factorArg(p, w[k] as number);
  return out;
}

/**
 * Unwrapped phase of `H(jw)` in radians on a grid of non-negative angular
 * frequencies, as the sum of the continuous arguments of the factors (see
 * the module header): continuous in `w` except for a jump of +pi at each
 * jw-axis zero, and with its `w -> 0+` limit in (-pi, pi].
 *
 * @param system - a zpk transfer function or a section cascade
 * @param w - angular frequencies (rad/s), finite and >= 0, in any order
 * @returns phase in radians per grid point
 * @throws {@link InvalidArgumentError} when the system or grid is malformed, a frequency is negative, or a grid point is exactly a jw-axis pole
 * @example
 * ```ts
 * // three poles at -1: phase -3 atan(w)
 * phase(zpk([], Array(3).fill({ re: -1, im: 0 }), 1), Float64Array.of(1, 1e6)); //=> Float64Array [-2.356194490192345, -4.71238598038469]
 * ```
 */
export function phase(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  const fn = "phase";
  requireSystem(fn, "system", system);
  const grid = requireGrid(fn, "w", w, { nonNegative: true });
  const z = isCascade(system) ? fromSectionsUnchecked(system) : system;
  checkNoAxisPole(fn, z.poles, grid);
  return zpkPhaseUnchecked(z, grid);
}

/** Group delay core for a zpk (no checks). */
export function zpkGroupDelayUnchecked(system: Zpk, w: Float64Array): Float64Array {
  const out = new Float64Array(w.length);
  for (const [roots, sign] of [
    [system.poles, 1],
    [system.zeros, -1],
  ] as const) {
    for (const r of roots) {
      if (r.re === 0) continue; // jw-axis roots: zero delay away from the root itself
      const a = -r.re;
      for (let k = 0; k < w.length; k++) {
        // a / (d^2 + a^2) as (a / h) / h with h = hypot(d, a): no overflow or underflow
        const h = Math.hypot((w[k] as number) - r.im, a);
        out[k] = (out[k] as number) + (sign * (a / h)) / h;
      }
    }
  }
  return out;
}

/**
 * Group delay `tau(w) = -d phase / dw` in seconds (for `w` in rad/s), computed
 * exactly from the poles and zeros (see the module header). Zeros and poles on
 * the jw axis contribute 0 (their phase is piecewise constant).
 *
 * @param system - a zpk transfer function or a section cascade
 * @param w - angular frequencies (rad/s), finite
 * @returns group delay in seconds per grid point
 * @throws {@link InvalidArgumentError} when the system or grid is malformed
 * @example
 * ```ts
 * // one pole at -2: tau = 2 / (w^2 + 4)
 * groupDelay(zpk([], [{ re: -2, im: 0 }], 2), Float64Array.of(0, 2)); //=> Float64Array [0.5, 0.25]
 * ```
 */
export function groupDelay(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  const fn = "groupDelay";
  requireSystem(fn, "system", system);
  const grid = requireGrid(fn, "w", w);
  const z = isCascade(system) ? fromSectionsUnchecked(system) : system;
  return zpkGroupDelayUnchecked(z, grid);
}
