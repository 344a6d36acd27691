/**
 * Frequency response of an analog transfer function on the jw axis, from the
 * factored form, and the packed factors the magnitude (magnitude.ts) and the
 * phase and group delay (phase.ts) share.
 *
 * - `frequencyResponse` forms the products of the factors `(jw - z_i)` and
 *   `(jw - p_i)` point by point and divides once (no polynomial expansion, so
 *   no coefficient cancellation; points where a product would leave the
 *   floating-point range are redone one root at a time); an exact conjugate pair is
 *   applied as one quadratic factor built from the rounded differences
 *   `w - Im r` and `w + Im r`, which keeps the same accuracy. A cascade is
 *   evaluated section by section, with constant numerators (lowpass
 *   sections) multiplied into the gain once per call. Relative error a few
 *   units of 2^-53 per factor (worst 1.6e-15 against scipy.signal.freqs_zpk
 *   in the fixtures).
 *   The loop runs over four grid points per pass (four independent chains of
 *   multiplications the CPU overlaps, all in registers: no call and no
 *   allocation per point), each formed with exactly the operations of the
 *   one-point path, so a value does not depend on the grid around it.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { cdiv, cmul, type Complex } from "../math/complex.ts";
import { requireGrid } from "./check.ts";
import {
  SAFE_HI,
  SAFE_LO,
  packCascade,
  packSystem,
  packZpk,
  rejectAxisPoles,
  type PackedCascade,
  type PackedFactors,
  type PackedZpk,
} from "./packed.ts";
import { fromSectionsUnchecked } from "./sections.ts";
import type { SectionCascade, Zpk } from "./types.ts";
import { evalZpkUnchecked } from "./zpk.ts";


/** A complex response on a grid, as separate real and imaginary parts. */
export interface ComplexResponse {
  /** Real parts, one per grid point. */
  readonly re: Float64Array;
  /** Imaginary parts, one per grid point. */
  readonly im: Float64Array;
}


/** Scratch written by {@link productsAt1} and {@link sectionProductsAt1}: `[re, im]` of one product. */
const one = new Float64Array(2);

/**
 * prod over the packed factors of `(jw - r)` at one frequency, written into
 * `one`. A conjugate pair is the quadratic
 * `(a + j(w - b))(a + j(w + b)) = a^2 - (w - b)(w + b) + j 2 a w`, formed from
 * the exactly rounded differences `w - b`, `w + b`, so it keeps a relative
 * error of a few ulps even where it nearly cancels. The grid loop
 * ({@link zpkResponseInto}) runs exactly these operations, in this order, for
 * each of its four points.
 */
function productsAt1(f: PackedFactors, wk: number): void {
  let xr = 1;
  let xi = 0;
  const { pairs, singles } = f;
  for (let i = 0; i < pairs.length; i += 3) {
    const aa = pairs[i] as number;
    const b = pairs[i + 2] as number;
    const fr = aa - (wk - b) * (wk + b);
    const fi = (pairs[i + 1] as number) * wk;
    const t = xr * fr - xi * fi;
    xi = xr * fi + xi * fr;
    xr = t;
  }
  for (let i = 0; i < singles.length; i += 2) {
    const a = singles[i] as number;
    const fi = wk - (singles[i + 1] as number);
    const t = xr * a - xi * fi;
    xi = xr * fi + xi * a;
    xr = t;
  }
  one[0] = xr;
  one[1] = xi;
}


/**
 * Store `k0 * (nr + j ni) / (dr + j di)` at index `k` when both products are
 * comfortably inside the floating-point range and the quotient is finite;
 * returns false (storing nothing) when the point needs the slow, overflow-safe
 * path. The grid loops' four-point blocks apply the same test and the same
 * operations to four points at once.
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
  if (!(nm > SAFE_LO && nm < SAFE_HI && dm > SAFE_LO && dm < SAFE_HI)) return false;
  const inv = k0 / dm;
  const re = (nr * dr + ni * di) * inv;
  const im = (ni * dr - nr * di) * inv;
  if (!(re - re === 0 && im - im === 0)) return false;
  outRe[k] = re;
  outIm[k] = im;
  return true;
}

/**
 * One grid point of a zpk, one root at a time (slow, overflow-safe path);
 * returns whether the value stored is finite.
 */
function zpkPointByRoot(system: Zpk, wk: number, k: number, outRe: Float64Array, outIm: Float64Array): boolean {
  // s = -0 + j wk: `-0 - Re r` is exactly `-Re r`, signed zeros included.
  const v = evalZpkUnchecked(system, -0, wk, true);
  outRe[k] = v.re;
  outIm[k] = v.im;
  return v.re - v.re === 0 && v.im - v.im === 0;
}

/** One grid point of a zpk on its own (fast path, else the slow one); returns whether the value stored is finite. */
function zpkPoint(p: PackedZpk, wk: number, k: number, outRe: Float64Array, outIm: Float64Array): boolean {
  productsAt1(p.poles, wk);
  const dr = one[0] as number;
  const di = one[1] as number;
  productsAt1(p.zeros, wk);
  return (
    storeQuotient(p.system.gain, one[0] as number, one[1] as number, dr, di, outRe, outIm, k) ||
    zpkPointByRoot(p.system, wk, k, outRe, outIm)
  );
}

/**
 * Zpk response into `outRe`, `outIm` (no checks, no allocation); returns the
 * first grid index whose value is not finite (beyond the double range even
 * on the slow path), or -1.
 *
 * Four grid points per pass: the products of the four points are independent
 * chains, so the CPU overlaps their multiplications; each point's products
 * are formed with exactly the operations of {@link productsAt1}, and the four
 * quotients with those of {@link storeQuotient}, so a point's value does not
 * depend on its neighbours. When any of the four leaves the comfortable range
 * (large |w| at high order, or a point on an exact transmission zero), the
 * four are redone one by one ({@link zpkPoint}), the failing ones one root at
 * a time with Smith's division, interleaving zeros and poles so that nothing
 * overflows.
 */
function zpkResponseInto(p: PackedZpk, w: Float64Array, outRe: Float64Array, outIm: Float64Array): number {
  const n = w.length;
  const k0 = p.system.gain;
  const dp = p.poles.pairs;
  const ds = p.poles.singles;
  const np = p.zeros.pairs;
  const ns = p.zeros.singles;
  let bad = -1;
  for (let k = 0; k < n; k += 4) {
    if (k + 4 > n) {
      // the last one to three points, one by one (the same values)
      for (let j = k; j < n; j++) if (!zpkPoint(p, w[j] as number, j, outRe, outIm) && bad < 0) bad = j;
      break;
    }
    const w0 = w[k] as number;
    const w1 = w[k + 1] as number;
    const w2 = w[k + 2] as number;
    const w3 = w[k + 3] as number;
    // denominators: a + j b at each point
    let a0 = 1;
    let b0 = 0;
    let a1 = 1;
    let b1 = 0;
    let a2 = 1;
    let b2 = 0;
    let a3 = 1;
    let b3 = 0;
    for (let i = 0; i < dp.length; i += 3) {
      const aa = dp[i] as number;
      const ta = dp[i + 1] as number;
      const b = dp[i + 2] as number;
      let fr = aa - (w0 - b) * (w0 + b);
      let fi = ta * w0;
      let t = a0 * fr - b0 * fi;
      b0 = a0 * fi + b0 * fr;
      a0 = t;
      fr = aa - (w1 - b) * (w1 + b);
      fi = ta * w1;
      t = a1 * fr - b1 * fi;
      b1 = a1 * fi + b1 * fr;
      a1 = t;
      fr = aa - (w2 - b) * (w2 + b);
      fi = ta * w2;
      t = a2 * fr - b2 * fi;
      b2 = a2 * fi + b2 * fr;
      a2 = t;
      fr = aa - (w3 - b) * (w3 + b);
      fi = ta * w3;
      t = a3 * fr - b3 * fi;
      b3 = a3 * fi + b3 * fr;
      a3 = t;
    }
    for (let i = 0; i < ds.length; i += 2) {
      const a = ds[i] as number;
      const b = ds[i + 1] as number;
      let fi = w0 - b;
      let t = a0 * a - b0 * fi;
      b0 = a0 * fi + b0 * a;
      a0 = t;
      fi = w1 - b;
      t = a1 * a - b1 * fi;
      b1 = a1 * fi + b1 * a;
      a1 = t;
      fi = w2 - b;
      t = a2 * a - b2 * fi;
      b2 = a2 * fi + b2 * a;
      a2 = t;
      fi = w3 - b;
      t = a3 * a - b3 * fi;
      b3 = a3 * fi + b3 * a;
      a3 = t;
    }
    // numerators: c + j d at each point
    let c0 = 1;
    let d0 = 0;
    let c1 = 1;
    let d1 = 0;
    let c2 = 1;
    let d2 = 0;
    let c3 = 1;
    let d3 = 0;
    for (let i = 0; i < np.length; i += 3) {
      const aa = np[i] as number;
      const ta = np[i + 1] as number;
      const b = np[i + 2] as number;
      let fr = aa - (w0 - b) * (w0 + b);
      let fi = ta * w0;
      let t = c0 * fr - d0 * fi;
      d0 = c0 * fi + d0 * fr;
      c0 = t;
      fr = aa - (w1 - b) * (w1 + b);
      fi = ta * w1;
      t = c1 * fr - d1 * fi;
      d1 = c1 * fi + d1 * fr;
      c1 = t;
      fr = aa - (w2 - b) * (w2 + b);
      fi = ta * w2;
      t = c2 * fr - d2 * fi;
      d2 = c2 * fi + d2 * fr;
      c2 = t;
      fr = aa - (w3 - b) * (w3 + b);
      fi = ta * w3;
      t = c3 * fr - d3 * fi;
      d3 = c3 * fi + d3 * fr;
      c3 = t;
    }
    for (let i = 0; i < ns.length; i += 2) {
      const a = ns[i] as number;
      const b = ns[i + 1] as number;
      let fi = w0 - b;
      let t = c0 * a - d0 * fi;
      d0 = c0 * fi + d0 * a;
      c0 = t;
      fi = w1 - b;
      t = c1 * a - d1 * fi;
      d1 = c1 * fi + d1 * a;
      c1 = t;
      fi = w2 - b;
      t = c2 * a - d2 * fi;
      d2 = c2 * fi + d2 * a;
      c2 = t;
      fi = w3 - b;
      t = c3 * a - d3 * fi;
      d3 = c3 * fi + d3 * a;
      c3 = t;
    }
    // the four quotients, with the test and the operations of storeQuotient
    // (Math.min/max propagate NaN, which fails both comparisons; x - x is 0
    // for finite x, NaN otherwise); one branch for the four
    const nm0 = c0 * c0 + d0 * d0;
    const nm1 = c1 * c1 + d1 * d1;
    const nm2 = c2 * c2 + d2 * d2;
    const nm3 = c3 * c3 + d3 * d3;
    const dm0 = a0 * a0 + b0 * b0;
    const dm1 = a1 * a1 + b1 * b1;
    const dm2 = a2 * a2 + b2 * b2;
    const dm3 = a3 * a3 + b3 * b3;
    const v0 = k0 / dm0;
    const v1 = k0 / dm1;
    const v2 = k0 / dm2;
    const v3 = k0 / dm3;
    const r0 = (c0 * a0 + d0 * b0) * v0;
    const i0 = (d0 * a0 - c0 * b0) * v0;
    const r1 = (c1 * a1 + d1 * b1) * v1;
    const i1 = (d1 * a1 - c1 * b1) * v1;
    const r2 = (c2 * a2 + d2 * b2) * v2;
    const i2 = (d2 * a2 - c2 * b2) * v2;
    const r3 = (c3 * a3 + d3 * b3) * v3;
    const i3 = (d3 * a3 - c3 * b3) * v3;
    if (
      Math.min(nm0, nm1, nm2, nm3, dm0, dm1, dm2, dm3) > SAFE_LO &&
      Math.max(nm0, nm1, nm2, nm3, dm0, dm1, dm2, dm3) < SAFE_HI &&
      r0 - r0 + (i0 - i0) + (r1 - r1) + (i1 - i1) + (r2 - r2) + (i2 - i2) + (r3 - r3) + (i3 - i3) === 0
    ) {
      outRe[k] = r0;
      outIm[k] = i0;
      outRe[k + 1] = r1;
      outIm[k + 1] = i1;
      outRe[k + 2] = r2;
      outIm[k + 2] = i2;
      outRe[k + 3] = r3;
      outIm[k + 3] = i3;
    } else {
      for (let j = k; j < k + 4; j++) if (!zpkPoint(p, w[j] as number, j, outRe, outIm) && bad < 0) bad = j;
    }
  }
  return bad;
}

/** Zpk response core (no checks). */
export function zpkResponseUnchecked(system: Zpk, w: Float64Array): ComplexResponse {
  const outRe = new Float64Array(w.length);
  const outIm = new Float64Array(w.length);
  zpkResponseInto(packZpk(system), w, outRe, outIm);
  return { re: outRe, im: outIm };
}

/** Scratch point for {@link packedMagnitudeAt}. */
const oneRe = new Float64Array(1);
const oneIm = new Float64Array(1);

/**
 * `|H(jw)|` at one frequency, no checks and no allocation: `Math.hypot` of
 * exactly the value {@link zpkResponseUnchecked} gives at that point, for
 * callers that bisect with one-point evaluations.
 */
export function packedMagnitudeAt(p: PackedZpk, w: number): number {
  zpkPoint(p, w, 0, oneRe, oneIm);
  return Math.hypot(oneRe[0] as number, oneIm[0] as number);
}


/**
 * prod over packed section polynomials `c2 (jw)^2 + c1 jw + c0 = (c0 - c2 w^2) + j c1 w`
 * at one frequency, written into `one`; the grid loop
 * ({@link cascadeResponseInto}) runs exactly these operations for each of its
 * four points.
 */
function sectionProductsAt1(c: Float64Array, wk: number): void {
  const w2 = wk * wk;
  let xr = 1;
  let xi = 0;
  for (let i = 0; i < c.length; i += 3) {
    const fr = (c[i + 2] as number) - (c[i] as number) * w2;
    const fi = (c[i + 1] as number) * wk;
    const t = xr * fr - xi * fi;
    xi = xr * fi + xi * fr;
    xr = t;
  }
  one[0] = xr;
  one[1] = xi;
}

/** One grid point of a cascade on its own (fast path, else the slow one); returns whether the value stored is finite. */
function cascadePoint(p: PackedCascade, wk: number, k: number, outRe: Float64Array, outIm: Float64Array): boolean {
  sectionProductsAt1(p.den, wk);
  const dr = one[0] as number;
  const di = one[1] as number;
  sectionProductsAt1(p.num, wk);
  return (
    storeQuotient(p.gain, one[0] as number, one[1] as number, dr, di, outRe, outIm, k) ||
    cascadePointSlow(p.cascade, wk, k, outRe, outIm)
  );
}

/**
 * Cascade response into `outRe`, `outIm` (no checks, no allocation); returns
 * the first grid index whose value is not finite, or -1. Four points per
 * pass as in {@link zpkResponseInto}: numerator and denominator products meet
 * in one division; where any of the four leaves the comfortable range, they
 * are redone one by one, a failing one one section at a time (each with
 * Smith's division) and, where a section's polynomials overflow (w^2 beyond
 * the double range), from the factored form.
 */
function cascadeResponseInto(p: PackedCascade, w: Float64Array, outRe: Float64Array, outIm: Float64Array): number {
  const n = w.length;
  const k0 = p.gain;
  const den = p.den;
  const num = p.num;
  let bad = -1;
  for (let k = 0; k < n; k += 4) {
    if (k + 4 > n) {
      // the last one to three points, one by one (the same values)
      for (let j = k; j < n; j++) if (!cascadePoint(p, w[j] as number, j, outRe, outIm) && bad < 0) bad = j;
      break;
    }
    const w0 = w[k] as number;
    const w1 = w[k + 1] as number;
    const w2 = w[k + 2] as number;
    const w3 = w[k + 3] as number;
    const ww0 = w0 * w0;
    const ww1 = w1 * w1;
    const ww2 = w2 * w2;
    const ww3 = w3 * w3;
    let a0 = 1;
    let b0 = 0;
    let a1 = 1;
    let b1 = 0;
    let a2 = 1;
    let b2 = 0;
    let a3 = 1;
    let b3 = 0;
    for (let i = 0; i < den.length; i += 3) {
      const e2 = den[i] as number;
      const e1 = den[i + 1] as number;
      const e0 = den[i + 2] as number;
      let fr = e0 - e2 * ww0;
      let fi = e1 * w0;
      let t = a0 * fr - b0 * fi;
      b0 = a0 * fi + b0 * fr;
      a0 = t;
      fr = e0 - e2 * ww1;
      fi = e1 * w1;
      t = a1 * fr - b1 * fi;
      b1 = a1 * fi + b1 * fr;
      a1 = t;
      fr = e0 - e2 * ww2;
      fi = e1 * w2;
      t = a2 * fr - b2 * fi;
      b2 = a2 * fi + b2 * fr;
      a2 = t;
      fr = e0 - e2 * ww3;
      fi = e1 * w3;
      t = a3 * fr - b3 * fi;
      b3 = a3 * fi + b3 * fr;
      a3 = t;
    }
    let c0 = 1;
    let d0 = 0;
    let c1 = 1;
    let d1 = 0;
    let c2 = 1;
    let d2 = 0;
    let c3 = 1;
    let d3 = 0;
    for (let i = 0; i < num.length; i += 3) {
      const e2 = num[i] as number;
      const e1 = num[i + 1] as number;
      const e0 = num[i + 2] as number;
      let fr = e0 - e2 * ww0;
      let fi = e1 * w0;
      let t = c0 * fr - d0 * fi;
      d0 = c0 * fi + d0 * fr;
      c0 = t;
      fr = e0 - e2 * ww1;
      fi = e1 * w1;
      t = c1 * fr - d1 * fi;
      d1 = c1 * fi + d1 * fr;
      c1 = t;
      fr = e0 - e2 * ww2;
      fi = e1 * w2;
      t = c2 * fr - d2 * fi;
      d2 = c2 * fi + d2 * fr;
      c2 = t;
      fr = e0 - e2 * ww3;
      fi = e1 * w3;
      t = c3 * fr - d3 * fi;
      d3 = c3 * fi + d3 * fr;
      c3 = t;
    }
    // the four quotients, with the test and the operations of storeQuotient
    // (Math.min/max propagate NaN, which fails both comparisons; x - x is 0
    // for finite x, NaN otherwise); one branch for the four
    const nm0 = c0 * c0 + d0 * d0;
    const nm1 = c1 * c1 + d1 * d1;
    const nm2 = c2 * c2 + d2 * d2;
    const nm3 = c3 * c3 + d3 * d3;
    const dm0 = a0 * a0 + b0 * b0;
    const dm1 = a1 * a1 + b1 * b1;
    const dm2 = a2 * a2 + b2 * b2;
    const dm3 = a3 * a3 + b3 * b3;
    const v0 = k0 / dm0;
    const v1 = k0 / dm1;
    const v2 = k0 / dm2;
    const v3 = k0 / dm3;
    const r0 = (c0 * a0 + d0 * b0) * v0;
    const i0 = (d0 * a0 - c0 * b0) * v0;
    const r1 = (c1 * a1 + d1 * b1) * v1;
    const i1 = (d1 * a1 - c1 * b1) * v1;
    const r2 = (c2 * a2 + d2 * b2) * v2;
    const i2 = (d2 * a2 - c2 * b2) * v2;
    const r3 = (c3 * a3 + d3 * b3) * v3;
    const i3 = (d3 * a3 - c3 * b3) * v3;
    if (
      Math.min(nm0, nm1, nm2, nm3, dm0, dm1, dm2, dm3) > SAFE_LO &&
      Math.max(nm0, nm1, nm2, nm3, dm0, dm1, dm2, dm3) < SAFE_HI &&
      r0 - r0 + (i0 - i0) + (r1 - r1) + (i1 - i1) + (r2 - r2) + (i2 - i2) + (r3 - r3) + (i3 - i3) === 0
    ) {
      outRe[k] = r0;
      outIm[k] = i0;
      outRe[k + 1] = r1;
      outIm[k + 1] = i1;
      outRe[k + 2] = r2;
      outIm[k + 2] = i2;
      outRe[k + 3] = r3;
      outIm[k + 3] = i3;
    } else {
      for (let j = k; j < k + 4; j++) if (!cascadePoint(p, w[j] as number, j, outRe, outIm) && bad < 0) bad = j;
    }
  }
  return bad;
}

/** Cascade response core (no checks). */
export function cascadeResponseUnchecked(cascade: SectionCascade, w: Float64Array): ComplexResponse {
  const outRe = new Float64Array(w.length);
  const outIm = new Float64Array(w.length);
  cascadeResponseInto(packCascade(cascade), w, outRe, outIm);
  return { re: outRe, im: outIm };
}

/**
 * One grid point of a cascade off the fast path: section by section with
 * Smith's division, else (a section polynomial overflows) from the factored
 * form; returns whether the value stored is finite.
 */
function cascadePointSlow(cascade: SectionCascade, wk: number, k: number, outRe: Float64Array, outIm: Float64Array): boolean {
  const w2 = wk * wk;
  let v: Complex = { re: cascade.gain, im: 0 };
  for (const sec of cascade.sections) {
    const [b2, b1, b0] = sec.num;
    const [a2, a1, a0] = sec.den;
    v = cmul(v, cdiv({ re: b0 - b2 * w2, im: b1 * wk }, { re: a0 - a2 * w2, im: a1 * wk }));
  }
  if (v.re - v.re === 0 && v.im - v.im === 0) {
    outRe[k] = v.re;
    outIm[k] = v.im;
    return true;
  }
  return zpkPoint(packZpk(fromSectionsUnchecked(cascade)), wk, k, outRe, outIm);
}

/**
 * Complex frequency response `H(jw)` on a grid of angular frequencies.
 *
 * @param system - a zpk transfer function or a section cascade
 * @param w - angular frequencies (rad/s), finite
 * @returns `{ re, im }` of `H(jw)`, one entry per grid point
 * @throws {@link InvalidArgumentError} when the system or grid is malformed, a grid point is exactly a jw-axis pole, or the response overflows the double range at a grid point (the message names it: scale the gain or move the roots)
 * @example
 * ```ts
 * const h = zpk([], [{ re: -1, im: 0 }], 1);
 * frequencyResponse(h, Float64Array.of(0, 1)); //=> { re: Float64Array [1, 0.5], im: Float64Array [0, -0.5] }
 * ```
 */
export function frequencyResponse(system: Zpk | SectionCascade, w: Float64Array): ComplexResponse {
  const fn = "frequencyResponse";
  const p = packSystem(fn, system);
  const grid = requireGrid(fn, "w", w);
  rejectAxisPoles(fn, p, grid);
  const re = new Float64Array(grid.length);
  const im = new Float64Array(grid.length);
  const bad = "cascade" in p ? cascadeResponseInto(p, grid, re, im) : zpkResponseInto(p, grid, re, im);
  if (bad >= 0) {
    throw new InvalidArgumentError({
      fn,
      path: `w[${bad}]`,
      received: grid[bad],
      message: "the response at this frequency is beyond the double range (a pole or zero product overflows or underflows to 0/0); scale the gain or the roots, or leave this frequency out",
    });
  }
  return { re, im };
}
