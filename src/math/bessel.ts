/**
 * Reverse Bessel polynomials `theta_n(s) = sum_k a_k s^k` with
 * `a_k = (2n-k)! / (2^(n-k) k! (n-k)!)` (W. E. Thomson, "Delay networks having
 * maximally flat frequency characteristics", Proc. IEE 96(3):487-490, 1949;
 * H. L. Krall and O. Frink, "A new class of orthogonal polynomials: the Bessel
 * polynomials", Trans. AMS 65:100-115, 1949), and their roots.
 *
 * The coefficients are computed exactly with BigInt and split into a
 * double-double pair `hi + lo`. This matters: the roots are very ill
 * conditioned with respect to the coefficients (condition number about 4e4 at
 * order 10, 1e10 at order 20 and 5e15 at order 30, measured with mpmath), so
 * coefficients rounded to one double move the order-30 roots by about 3 %.
 * With the exact double-double coefficients, {@link polyRoots} (Aberth with
 * double-double polishing) returns the roots to about 1e-15 relative up to
 * order 30, checked against mpmath at 50 digits
 * (`scripts/reference/math_bessel_roots.py`).
 *
 * @module
 */
import { requireInteger } from "../validate.ts";
import type { Complex } from "./complex.ts";
import { polyRoots } from "./roots.ts";

/**
 * Highest order of the reverse Bessel polynomial helpers
 * ({@link reverseBesselCoefficients}, {@link reverseBesselRoots}): roots to
 * about 1e-15 relative up to order 30, a few times 1e-12 at order 40. The
 * Bessel-Thomson filter prototype stops earlier, at `BESSEL_MAX_ORDER` (30)
 * in `approx/bessel.ts`, where the roots are still at full accuracy.
 */
export const REVERSE_BESSEL_MAX_ORDER = 40;

function factorial(n: number): bigint {
  let f = 1n;
  for (let i = 2n; i <= BigInt(n); i++) f *= i;
  return f;
}

/** Exact coefficients, descending powers, as BigInt. */
function exactCoefficients(n: number): bigint[] {
  const out: bigint[] = [];
  for (let k = n; k >= 0; k--) {
    out.push(factorial(2 * n - k) / ((1n << BigInt(n - k)) * factorial(k) * factorial(n - k)));
  }
  return out;
}

/**
 * Coefficients of the reverse Bessel polynomial `theta_n`, descending powers,
 * each rounded to the nearest double (exact up to order 10).
 *
 * @param order - polynomial order n, 0 to {@link REVERSE_BESSEL_MAX_ORDER}
 * @returns `[a_n, ..., a_0]` with `a_n = 1` and `a_0 = (2n)! / (2^n n!)`
 * @throws {@link InvalidArgumentError} when `order` is not an integer in range
 * @example
 * ```ts
 * reverseBesselCoefficients(3); //=> [1, 6, 15, 15]
 * ```
 */
export function reverseBesselCoefficients(order: number): number[] {
  requireInteger("reverseBesselCoefficients", "order", order, { min: 0, max: REVERSE_BESSEL_MAX_ORDER });
  return exactCoefficients(order).map((c) => Number(c));
}

/**
 * Roots of the reverse Bessel polynomial `theta_n(s)` — the poles of the
 * order-n Bessel-Thomson lowpass normalised for unit delay at DC. Computed by
 * {@link polyRoots} on the exact coefficients in double-double form; relative
 * error about 1e-15 up to order 30 (worst measured against mpmath 50-digit
 * roots), a few times 1e-12 at order 40.
 *
 * @param order - polynomial order n, 1 to {@link REVERSE_BESSEL_MAX_ORDER}
 * @returns the n roots, all in the left half-plane, sorted as by {@link polyRoots}
 * @throws {@link InvalidArgumentError} when `order` is not an integer in range
 * @example
 * ```ts
 * reverseBesselRoots(2); //=> [{ re: -1.5, im: 0.8660254037844386 }, { re: -1.5, im: -0.8660254037844386 }]
 * ```
 */
export function reverseBesselRoots(order: number): Complex[] {
  requireInteger("reverseBesselRoots", "order", order, { min: 1, max: REVERSE_BESSEL_MAX_ORDER });
  const exact = exactCoefficients(order);
  const hi = exact.map((c) => Number(c));
  const lo = exact.map((c, i) => Number(c - BigInt(hi[i] as number)));
  return polyRoots(hi, { lowParts: lo });
}
