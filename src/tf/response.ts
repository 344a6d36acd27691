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
 *   The loop runs over two grid points per pass (two independent chains of
 *   multiplications the CPU overlaps), each formed exactly as alone.
 * - `magnitudeDb` forms per point the products of the squared magnitudes
 *   `|jw - r|^2` (a conjugate pair as `(a^2 + (w - b)^2)(a^2 + (w + b)^2)`,
 *   a section as `(b0 - b2 w^2)^2 + (b1 w)^2`) of numerator and denominator
 *   and takes one logarithm of their quotient: sums and products of
 *   non-negative terms, so a relative error of at most about `(3 m + 1) u`
 *   for `m` factors and `u = 2^-53` (N. J. Higham, "Accuracy and Stability of
 *   Numerical Algorithms", 2nd ed., SIAM 2002, section 3.1, products of
 *   `n` rounded terms: `gamma_n`), i.e. below 1e-13 dB for the orders the
 *   library designs. A point where a term, a partial product or the quotient
 *   leaves the normal range (high orders far from the band, tiny roots, an
 *   exact transmission zero) is redone as the sum of `20 log10 |factor|`
 *   terms, which cannot overflow. The two agree to about 1e-13 dB (property
 *   test: 1e-12 dB).
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

/**
 * Factors packed into typed arrays for the point-by-point loops (one array
 * per kind, so that the loop body reads one typed array).
 */
interface PackedFactors {
  /** `[a^2, 2 a, b]` of each conjugate pair `-a +- j b` (b >= 0). */
  readonly pairs: Float64Array;
  /** `[a, b]` of each single root `-a + j b`. */
  readonly singles: Float64Array;
}

/**
 * Pack the roots: exact conjugate pairs (equal real parts, opposite
 * imaginary parts) become one quadratic factor each, in the order of their
 * first member; the other roots stay single.
 */
function pack(roots: readonly Complex[]): PackedFactors {
  const n = roots.length;
  const used = new Uint8Array(n);
  const pairs = new Float64Array(3 * (n >> 1));
  const singles = new Float64Array(2 * n);
  let np = 0;
  let ns = 0;
  for (let i = 0; i < n; i++) {
    if (used[i] === 1) continue;
    used[i] = 1;
    const r = roots[i] as Complex;
    const a = -r.re;
    if (r.im !== 0) {
      let j = i + 1;
      while (j < n && !(used[j] === 0 && (roots[j] as Complex).re === r.re && (roots[j] as Complex).im === -r.im)) j++;
      if (j < n) {
        used[j] = 1;
        pairs[np++] = a * a;
        pairs[np++] = 2 * a;
        pairs[np++] = Math.abs(r.im);
        continue;
      }
    }
    singles[ns++] = a;
    singles[ns++] = r.im;
  }
  return { pairs: pairs.subarray(0, np), singles: singles.subarray(0, ns) };
}

/** Scratch written by {@link productsAt}: `[re, im]` at the first frequency, then at the second (no allocation per point). */
const acc = new Float64Array(4);

/**
 * prod over the packed factors of `(jw - r)` at two frequencies at once,
 * written into `acc`. The two products are independent chains, so the CPU
 * overlaps them; each is formed exactly as a one-point loop would form it.
 */
function productsAt(f: PackedFactors, wk: number, wl: number): void {
  let xr = 1;
  let xi = 0;
  let yr = 1;
  let yi = 0;
  const { pairs, singles } = f;
  for (let i = 0; i < pairs.length; i += 3) {
    const aa = pairs[i] as number;
    const a2 = pairs[i + 1] as number;
    const b = pairs[i + 2] as number;
    const fr = aa - (wk - b) * (wk + b);
    const fi = a2 * wk;
    const t = xr * fr - xi * fi;
    xi = xr * fi + xi * fr;
    xr = t;
    const gr = aa - (wl - b) * (wl + b);
    const gi = a2 * wl;
    const u = yr * gr - yi * gi;
    yi = yr * gi + yi * gr;
    yr = u;
  }
  for (let i = 0; i < singles.length; i += 2) {
    const a = singles[i] as number;
    const b = singles[i + 1] as number;
    const fi = wk - b;
    const t = xr * a - xi * fi;
    xi = xr * fi + xi * a;
    xr = t;
    const gi = wl - b;
    const u = yr * a - yi * gi;
    yi = yr * gi + yi * a;
    yr = u;
  }
  acc[0] = xr;
  acc[1] = xi;
  acc[2] = yr;
  acc[3] = yi;
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

/** One grid point of a zpk, one root at a time (slow, overflow-safe path). */
function zpkPointByRoot(system: Zpk, wk: number, k: number, outRe: Float64Array, outIm: Float64Array): void {
  // s = -0 + j wk: `-0 - Re r` is exactly `-Re r`, signed zeros included.
  const v = evalZpkUnchecked(system, -0, wk, true);
  outRe[k] = v.re;
  outIm[k] = v.im;
}

/** Zpk response core (no checks). */
export function zpkResponseUnchecked(system: Zpk, w: Float64Array): ComplexResponse {
  const n = w.length;
  const outRe = new Float64Array(n);
  const outIm = new Float64Array(n);
  const zf = pack(system.zeros);
  const pf = pack(system.poles);
  const k0 = system.gain;
  // Point by point (two points per pass, see productsAt): numerator and
  // denominator products accumulate separately and meet in one division. A
  // conjugate pair is the quadratic
  // `(a + j(w - b))(a + j(w + b)) = a^2 - (w - b)(w + b) + j 2 a w`, formed from
  // the exactly rounded differences `w - b`, `w + b`, so it keeps a relative
  // error of a few ulps even where it nearly cancels. Where either product
  // leaves the comfortable range (large |w| at high order, or a point on an
  // exact transmission zero), the point is redone one root at a time with
  // Smith's division, interleaving zeros and poles so that nothing overflows.
  for (let k = 0; k < n; k += 2) {
    const l = k + 1 < n ? k + 1 : k;
    const wk = w[k] as number;
    const wl = w[l] as number;
    // poles first: the first call site is the one the compiler inlines
    productsAt(pf, wk, wl);
    const dr = acc[0] as number;
    const di = acc[1] as number;
    const er = acc[2] as number;
    const ei = acc[3] as number;
    productsAt(zf, wk, wl);
    const nr = acc[0] as number;
    const ni = acc[1] as number;
    const mr = acc[2] as number;
    const mi = acc[3] as number;
    if (!storeQuotient(k0, nr, ni, dr, di, outRe, outIm, k)) zpkPointByRoot(system, wk, k, outRe, outIm);
    if (l !== k && !storeQuotient(k0, mr, mi, er, ei, outRe, outIm, l)) zpkPointByRoot(system, wl, l, outRe, outIm);
  }
  return { re: outRe, im: outIm };
}

/** A zpk with its factors packed once, for repeated one-point evaluation (see {@link packedMagnitudeAt}). */
export interface PackedZpk {
  /** The system (for the overflow-safe path). */
  readonly system: Zpk;
  /** Packed zeros. */
  readonly zeros: PackedFactors;
  /** Packed poles. */
  readonly poles: PackedFactors;
}

/** Pack a zpk for {@link packedMagnitudeAt} (internal core, no checks). */
export function packZpk(system: Zpk): PackedZpk {
  return { system, zeros: pack(system.zeros), poles: pack(system.poles) };
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
  productsAt(p.poles, w, w);
  const dr = acc[0] as number;
  const di = acc[1] as number;
  productsAt(p.zeros, w, w);
  if (!storeQuotient(p.system.gain, acc[0] as number, acc[1] as number, dr, di, oneRe, oneIm, 0)) {
    zpkPointByRoot(p.system, w, 0, oneRe, oneIm);
  }
  return Math.hypot(oneRe[0] as number, oneIm[0] as number);
}

/** Section coefficients packed as `[b2, b1, b0, a2, a1, a0]` per section. */
function packSections(cascade: SectionCascade): Float64Array {
  const c = new Float64Array(6 * cascade.sections.length);
  cascade.sections.forEach((sec, i) => {
    c.set(sec.num, 6 * i);
    c.set(sec.den, 6 * i + 3);
  });
  return c;
}

/**
 * Numerator and denominator products of the packed sections at two
 * frequencies at once, written into `acc2` as `[nr, ni, dr, di]` at the first
 * frequency, then the same at the second.
 */
function sectionProductsAt(c: Float64Array, wk: number, wl: number): void {
  const wk2 = wk * wk;
  const wl2 = wl * wl;
  let nr = 1;
  let ni = 0;
  let dr = 1;
  let di = 0;
  let mr = 1;
  let mi = 0;
  let er = 1;
  let ei = 0;
  for (let i = 0; i < c.length; i += 6) {
    const b2 = c[i] as number;
    const b1 = c[i + 1] as number;
    const b0 = c[i + 2] as number;
    const a2 = c[i + 3] as number;
    const a1 = c[i + 4] as number;
    const a0 = c[i + 5] as number;
    let fr = b0 - b2 * wk2;
    let fi = b1 * wk;
    let t = nr * fr - ni * fi;
    ni = nr * fi + ni * fr;
    nr = t;
    fr = a0 - a2 * wk2;
    fi = a1 * wk;
    t = dr * fr - di * fi;
    di = dr * fi + di * fr;
    dr = t;
    fr = b0 - b2 * wl2;
    fi = b1 * wl;
    t = mr * fr - mi * fi;
    mi = mr * fi + mi * fr;
    mr = t;
    fr = a0 - a2 * wl2;
    fi = a1 * wl;
    t = er * fr - ei * fi;
    ei = er * fi + ei * fr;
    er = t;
  }
  acc2[0] = nr;
  acc2[1] = ni;
  acc2[2] = dr;
  acc2[3] = di;
  acc2[4] = mr;
  acc2[5] = mi;
  acc2[6] = er;
  acc2[7] = ei;
}

/** Scratch written by {@link sectionProductsAt}. */
const acc2 = new Float64Array(8);

/**
 * Cascade response core (no checks). Where a section's polynomials overflow
 * (w^2 beyond the double range) even the section-by-section value is not
 * finite; those points are recomputed from the factored form.
 */
export function cascadeResponseUnchecked(cascade: SectionCascade, w: Float64Array): ComplexResponse {
  const n = w.length;
  const outRe = new Float64Array(n);
  const outIm = new Float64Array(n);
  const c = packSections(cascade);
  const k0 = cascade.gain;
  // Point by point (two points per pass): numerator and denominator products
  // meet in one division; where either leaves the comfortable range, the
  // point is redone one section at a time (each with Smith's division).
  for (let k = 0; k < n; k += 2) {
    const l = k + 1 < n ? k + 1 : k;
    const wk = w[k] as number;
    const wl = w[l] as number;
    sectionProductsAt(c, wk, wl);
    const a = acc2;
    if (!storeQuotient(k0, a[0] as number, a[1] as number, a[2] as number, a[3] as number, outRe, outIm, k)) {
      cascadePointSlow(cascade, c, wk, k, outRe, outIm);
    }
    if (l !== k && !storeQuotient(k0, a[4] as number, a[5] as number, a[6] as number, a[7] as number, outRe, outIm, l)) {
      cascadePointSlow(cascade, c, wl, l, outRe, outIm);
    }
  }
  return { re: outRe, im: outIm };
}

/** One grid point of a cascade off the fast path: section by section, else from the factored form. */
function cascadePointSlow(
  cascade: SectionCascade,
  c: Float64Array,
  wk: number,
  k: number,
  outRe: Float64Array,
  outIm: Float64Array,
): void {
  cascadePointBySection(c, cascade.sections.length, cascade.gain, wk, k, outRe, outIm);
  if (Number.isFinite(outRe[k] as number) && Number.isFinite(outIm[k] as number)) return;
  const v = zpkResponseUnchecked(fromSectionsUnchecked(cascade), Float64Array.of(wk));
  outRe[k] = v.re[0] as number;
  outIm[k] = v.im[0] as number;
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
  return isCascade(system) ? cascadeResponseUnchecked(system, grid) : zpkResponseUnchecked(system, grid);
}

/** `20 / ln 10`: dB per natural-log unit of a magnitude. */
const DB20 = 20 / Math.LN10;
/** `10 / ln 10`: dB per natural-log unit of a squared magnitude. */
const DB10 = 10 / Math.LN10;
/** The smallest normal double, 2^-1022: below it a product has lost relative precision. */
const MIN_NORMAL = 2.2250738585072014e-308;

/** Clamp values below {@link MAGNITUDE_FLOOR_DB} (and NaN) to the floor, in place. */
function applyFloor(out: Float64Array): Float64Array {
  for (let k = 0; k < out.length; k++) {
    const v = out[k] as number;
    if (!(v >= MAGNITUDE_FLOOR_DB)) out[k] = MAGNITUDE_FLOOR_DB;
  }
  return out;
}

/** dB of a zpk at one frequency as the sum of `20 log10 |jw - r|` per factor (overflow-safe reference, before the floor). */
function zpkDbByFactor(system: Zpk, wk: number): number {
  let v = DB20 * Math.log(Math.abs(system.gain));
  for (const z of system.zeros) v += DB20 * Math.log(Math.hypot(z.re, wk - z.im));
  for (const p of system.poles) v -= DB20 * Math.log(Math.hypot(p.re, wk - p.im));
  return v;
}

/**
 * dB of a cascade at one frequency as the sum of the sections' dB values
 * (reference, before the floor); where a section polynomial overflows
 * (w^2 beyond the double range), from the factored form.
 */
function cascadeDbBySection(cascade: SectionCascade, wk: number): number {
  const w2 = wk * wk;
  let v = DB20 * Math.log(Math.abs(cascade.gain));
  for (const sec of cascade.sections) {
    const [b2, b1, b0] = sec.num;
    const [a2, a1, a0] = sec.den;
    const n = Math.hypot(b0 - b2 * w2, b1 * wk);
    const d = Math.hypot(a0 - a2 * w2, a1 * wk);
    v += DB20 * (Math.log(n) - Math.log(d));
  }
  if (!Number.isNaN(v) && v !== Infinity) return v;
  return zpkDbByFactor(fromSectionsUnchecked(cascade), wk);
}

/**
 * Magnitude in dB summed factor by factor (a logarithm per factor per point):
 * the reference that {@link magnitudeDbUnchecked} falls back to where its
 * products leave the safe range, and that it is tested against.
 */
export function magnitudeDbByFactorUnchecked(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  const out = new Float64Array(w.length);
  if (isCascade(system)) for (let k = 0; k < w.length; k++) out[k] = cascadeDbBySection(system, w[k] as number);
  else for (let k = 0; k < w.length; k++) out[k] = zpkDbByFactor(system, w[k] as number);
  return applyFloor(out);
}

/** Scratch written by {@link squaredProductAt}: the product, then the smallest term or partial product met. */
const sq = new Float64Array(2);

/**
 * prod over the packed factors of `|jw - r|^2` at one frequency: a pair is
 * `(a^2 + (w - b)^2)(a^2 + (w + b)^2)`, a single root `a^2 + (w - b)^2`, sums
 * of non-negative terms (no cancellation, a few ulps each). Writes the
 * product and the smallest term or partial product into `sq`, so that the
 * caller can tell whether anything fell below the normal range.
 */
function squaredProductAt(f: PackedFactors, wk: number): void {
  let x = 1;
  let lo = 1;
  const { pairs, singles } = f;
  for (let i = 0; i < pairs.length; i += 3) {
    const aa = pairs[i] as number;
    const b = pairs[i + 2] as number;
    const d = wk - b;
    const e = wk + b;
    const t = aa + d * d;
    const u = aa + e * e;
    x = x * t * u;
    lo = t < lo ? t : lo;
    lo = u < lo ? u : lo;
    lo = x < lo ? x : lo;
  }
  for (let i = 0; i < singles.length; i += 2) {
    const a = singles[i] as number;
    const d = wk - (singles[i + 1] as number);
    const t = a * a + d * d;
    x *= t;
    lo = t < lo ? t : lo;
    lo = x < lo ? x : lo;
  }
  sq[0] = x;
  sq[1] = lo;
}

/** Magnitude in dB of a zpk, one logarithm per point (no checks). */
function zpkMagnitudeDb(system: Zpk, w: Float64Array): Float64Array {
  const out = new Float64Array(w.length);
  const zf = pack(system.zeros);
  const pf = pack(system.poles);
  const gainDb = DB20 * Math.log(Math.abs(system.gain));
  for (let k = 0; k < w.length; k++) {
    const wk = w[k] as number;
    squaredProductAt(zf, wk);
    const num = sq[0] as number;
    const numLo = sq[1] as number;
    squaredProductAt(pf, wk);
    const q = num / (sq[0] as number);
    // every term, partial product and the quotient normal and finite: a few
    // ulps per factor; otherwise (overflow, underflow, an exact zero) the
    // per-factor sum of logarithms at this point only
    if (numLo >= MIN_NORMAL && (sq[1] as number) >= MIN_NORMAL && q >= MIN_NORMAL && q < Infinity) {
      out[k] = gainDb + DB10 * Math.log(q);
    } else out[k] = zpkDbByFactor(system, wk);
  }
  return out;
}

/** Magnitude in dB of a cascade, one logarithm per point (no checks). */
function cascadeMagnitudeDb(cascade: SectionCascade, w: Float64Array): Float64Array {
  const out = new Float64Array(w.length);
  const c = packSections(cascade);
  const gainDb = DB20 * Math.log(Math.abs(cascade.gain));
  for (let k = 0; k < w.length; k++) {
    const wk = w[k] as number;
    const w2 = wk * wk;
    let num = 1;
    let den = 1;
    let lo = 1;
    for (let i = 0; i < c.length; i += 6) {
      const nr = (c[i + 2] as number) - (c[i] as number) * w2;
      const ni = (c[i + 1] as number) * wk;
      const dr = (c[i + 5] as number) - (c[i + 3] as number) * w2;
      const di = (c[i + 4] as number) * wk;
      const t = nr * nr + ni * ni;
      const u = dr * dr + di * di;
      num *= t;
      den *= u;
      lo = t < lo ? t : lo;
      lo = u < lo ? u : lo;
      lo = num < lo ? num : lo;
      lo = den < lo ? den : lo;
    }
    const q = num / den;
    if (lo >= MIN_NORMAL && q >= MIN_NORMAL && q < Infinity) out[k] = gainDb + DB10 * Math.log(q);
    else out[k] = cascadeDbBySection(cascade, wk);
  }
  return out;
}

/**
 * Magnitude in dB core (no checks): per point the products of the squared
 * magnitudes of the factors (or sections) of numerator and denominator and
 * one logarithm of their quotient; points where a product leaves the normal
 * range fall back to the per-factor sum of logarithms. Agrees with
 * {@link magnitudeDbByFactorUnchecked} to about 1e-13 dB (both are a few
 * ulps per factor; the log-sum's own rounding dominates).
 */
export function magnitudeDbUnchecked(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  return applyFloor(isCascade(system) ? cascadeMagnitudeDb(system, w) : zpkMagnitudeDb(system, w));
}

/**
 * Magnitude `20 log10 |H(jw)|` in dB on a grid, from products of squared
 * factor magnitudes with one logarithm per point (points where a product
 * would overflow or underflow, as for high orders far from the band, are
 * summed factor by factor). Accurate to about 1e-13 dB. Values below
 * {@link MAGNITUDE_FLOOR_DB} (including an exact transmission zero on the
 * grid) are clamped to it.
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
