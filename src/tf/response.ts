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
 *   evaluated section by section. Relative error a few units of 2^-53 per
 *   factor (worst 1.6e-15 against scipy.signal.freqs_zpk in the fixtures).
 *   The loop runs over two grid points per pass (two independent chains of
 *   multiplications the CPU overlaps), each formed exactly as alone.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { cdiv, cmul, type Complex } from "../math/complex.ts";
import { isCascade, requireGrid, requireSystem } from "./check.ts";
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

/** Reject a grid point that lands exactly on a jw-axis pole (the response would be infinite). */
export function checkNoAxisPole(fn: string, poles: readonly Complex[], w: Float64Array): void {
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

export function polesOf(system: Zpk | SectionCascade): readonly Complex[] {
  return isCascade(system) ? fromSectionsUnchecked(system).poles : system.poles;
}

/**
 * Factors packed into typed arrays for the point-by-point loops (one array
 * per kind, so that the loop body reads one typed array).
 */
export interface PackedFactors {
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
export function pack(roots: readonly Complex[]): PackedFactors {
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
export function packSections(cascade: SectionCascade): Float64Array {
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
 * @throws {@link InvalidArgumentError} when the system or grid is malformed, a grid point is exactly a jw-axis pole, or the response overflows the double range at a grid point (the message names it: scale the gain or move the roots)
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
  const h = isCascade(system) ? cascadeResponseUnchecked(system, grid) : zpkResponseUnchecked(system, grid);
  for (let i = 0; i < grid.length; i++) {
    if (!Number.isFinite(h.re[i] as number) || !Number.isFinite(h.im[i] as number)) {
      throw new InvalidArgumentError({
        fn,
        path: `w[${i}]`,
        received: grid[i],
        message: "the response at this frequency is beyond the double range (a pole or zero product overflows or underflows to 0/0); scale the gain or the roots, or leave this frequency out",
      });
    }
  }
  return h;
}
