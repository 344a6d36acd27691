/**
 * When `magnitudeDb` may skip its per-point range tracking: bounds on the
 * base-2 logarithm of every factor's squared magnitude over a grid with
 * `|w| <= wmax`, summed per product, prove once per call that no term,
 * partial product or quotient of the grid loop can leave the normal
 * floating-point range; then the loop's values are those of the tracked
 * path, only cheaper. Where the bounds do not allow it, the tracked loop runs.
 *
 * @module
 */
import type { PackedCascade, PackedFactors, PackedZpk } from "./packed.ts";

/**
 * Exponent margin of {@link productsInRange}: bounds within 2^-1000 .. 2^1000
 * leave 22 binary orders to the normal range's ends (2^-1022, 2^1024) for the
 * rounding of the bounds and of the products (a few ulps each).
 */
const LOG2_MARGIN = 1000;

/** Scratch written by {@link factorLogBounds} and {@link sectionLogBounds}: sum of `min(log2 lower, 0)`, sum of `max(log2 upper, 0)`. */
const bounds = new Float64Array(2);

/**
 * Bounds over `|w| <= wmax` of the terms of `squaredProductAt1` (magnitude.ts): a
 * pair's `a^2 + (w -+ b)^2` lies in `[a^2, a^2 + (wmax + b)^2]`, a single
 * root's `a^2 + (w - b)^2` in `[a^2, a^2 + (wmax + |b|)^2]`. Written into
 * `bounds` as sums of log2, clipped at 0 (an exact zero lower bound, such
 * as a jw-axis zero's, gives -Infinity).
 */
function factorLogBounds(f: PackedFactors, wmax: number): void {
  let lo = 0;
  let hi = 0;
  const { pairs, singles } = f;
  for (let i = 0; i < pairs.length; i += 3) {
    const aa = pairs[i] as number;
    const r = wmax + (pairs[i + 2] as number);
    lo += 2 * Math.min(Math.log2(aa), 0);
    hi += 2 * Math.max(Math.log2(aa + r * r), 0);
  }
  for (let i = 0; i < singles.length; i += 2) {
    const a = singles[i] as number;
    const r = wmax + Math.abs(singles[i + 1] as number);
    lo += Math.min(Math.log2(a * a), 0);
    hi += Math.max(Math.log2(a * a + r * r), 0);
  }
  bounds[0] = lo;
  bounds[1] = hi;
}

/**
 * Bounds over `|w| <= wmax` of the terms `(c0 - c2 w^2)^2 + (c1 w)^2` of
 * `sectionSquaredProductsAt1` (magnitude.ts), into `bounds` as {@link factorLogBounds}.
 * Upper: `(|c0| + |c2| wmax^2)^2 + (c1 wmax)^2`. Lower, with `x = w^2 >= 0`:
 * `c0^2` when `c0 c2 <= 0` (then `|c0 - c2 x| >= |c0|`); otherwise the real
 * part vanishes at `x0 = c0 / c2 > 0`, and for `x <= x0 / 2` it is at least
 * `|c0| / 2`, for `x >= x0 / 2` the imaginary part's square `c1^2 x` is at
 * least `c1^2 x0 / 2`, so the term is at least `min(c0^2 / 4, c1^2 c0 / (2 c2))`
 * (0 for a notch, `c1 = 0`).
 */
function sectionLogBounds(c: Float64Array, wmax: number): void {
  const ww = wmax * wmax;
  let lo = 0;
  let hi = 0;
  for (let i = 0; i < c.length; i += 3) {
    const c2 = c[i] as number;
    const c1 = c[i + 1] as number;
    const c0 = c[i + 2] as number;
    const low = c0 * c2 <= 0 ? c0 * c0 : Math.min((c0 * c0) / 4, (c1 * c1 * c0) / (2 * c2));
    const re = Math.abs(c0) + Math.abs(c2) * ww;
    const im = c1 * wmax;
    lo += Math.min(Math.log2(low), 0);
    hi += Math.max(Math.log2(re * re + im * im), 0);
  }
  bounds[0] = lo;
  bounds[1] = hi;
}

/**
 * Whether log2 bounds of the numerator's and the denominator's terms rule
 * out that any term, partial product or quotient leaves the normal range:
 * every partial product of terms in `[2^lo_i, 2^hi_i]` lies within
 * `[2^(sum min(lo_i, 0)), 2^(sum max(hi_i, 0))]`, the quotient within the
 * difference of the two ranges. NaN or infinite bounds answer false.
 */
function productsInRange(numLo: number, numHi: number, denLo: number, denHi: number): boolean {
  const m = LOG2_MARGIN;
  return numLo >= -m && denLo >= -m && numHi <= m && denHi <= m && numLo - denHi >= -m && numHi - denLo <= m;
}

/** {@link productsInRange} for a zpk on a grid with `|w| <= wmax`: then the grid loop needs no per-point range tracking. */
export function zpkProductsInRange(p: PackedZpk, wmax: number): boolean {
  factorLogBounds(p.zeros, wmax);
  const numLo = bounds[0] as number;
  const numHi = bounds[1] as number;
  factorLogBounds(p.poles, wmax);
  return productsInRange(numLo, numHi, bounds[0] as number, bounds[1] as number);
}

/** {@link productsInRange} for a packed cascade on a grid with `|w| <= wmax`. */
export function cascadeProductsInRange(p: PackedCascade, wmax: number): boolean {
  sectionLogBounds(p.num, wmax);
  const numLo = bounds[0] as number;
  const numHi = bounds[1] as number;
  sectionLogBounds(p.den, wmax);
  return productsInRange(numLo, numHi, bounds[0] as number, bounds[1] as number);
}
