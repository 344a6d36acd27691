/**
 * Real polynomials as coefficient arrays in DESCENDING powers (the numpy
 * convention): `[a_n, ..., a_1, a_0]` is `a_n x^n + ... + a_1 x + a_0`.
 *
 * Evaluation uses Horner's rule (W. G. Horner, "A new method of solving
 * numerical equations of all orders, by continuous approximation",
 * Phil. Trans. R. Soc. 109, 1819), backward stable with error bounded by
 * `2n u sum|a_k||x|^k` (N. J. Higham, "Accuracy and Stability of Numerical
 * Algorithms", 2nd ed., SIAM 2002, section 5.1). Products are direct convolution.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { Complex } from "./complex.ts";
import { nearestConjugate, requireComplex, requireComplexArray, requireNumberArray } from "./check.ts";

/** Horner evaluation at a complex point, no argument checks (internal core). */
export function hornerComplex(coeffs: ArrayLike<number>, zr: number, zi: number): Complex {
  let pr = 0;
  let pi = 0;
  for (let k = 0; k < coeffs.length; k++) {
    const t = pr * zr - pi * zi + (coeffs[k] as number);
    pi = pr * zi + pi * zr;
    pr = t;
  }
  return { re: pr, im: pi };
}

/**
 * Product of two polynomials (convolution of the coefficient arrays).
 *
 * @param a - first factor, descending powers
 * @param b - second factor, descending powers
 * @returns the coefficients of `a * b`, length `a.length + b.length - 1`
 * @throws {@link InvalidArgumentError} when either argument is not a non-empty array of finite numbers
 * @example
 * ```ts
 * polyMul([1, 1], [1, -1]); //=> [1, 0, -1]
 * ```
 */
export function polyMul(a: readonly number[], b: readonly number[]): number[] {
  requireNumberArray("polyMul", "a", a, 1);
  requireNumberArray("polyMul", "b", b, 1);
  return mulUnchecked(a, b);
}

/** Convolution without argument checks (internal core). */
export function mulUnchecked(a: ArrayLike<number>, b: ArrayLike<number>): number[] {
  const out = new Array<number>(a.length + b.length - 1).fill(0);
  for (let i = 0; i < a.length; i++) {
    const ai = a[i] as number;
    for (let j = 0; j < b.length; j++) out[i + j] = (out[i + j] as number) + ai * (b[j] as number);
  }
  return out;
}

/**
 * Sum of two polynomials; the shorter one is aligned at the constant term.
 *
 * @param a - first term, descending powers
 * @param b - second term, descending powers
 * @returns the coefficients of `a + b`, length `max(a.length, b.length)`
 *   (leading zeros are kept, so the length never depends on cancellation)
 * @throws {@link InvalidArgumentError} when either argument is not a non-empty array of finite numbers
 * @example
 * ```ts
 * polyAdd([1, 2, 3], [1, 1]); //=> [1, 3, 4]
 * ```
 */
export function polyAdd(a: readonly number[], b: readonly number[]): number[] {
  requireNumberArray("polyAdd", "a", a, 1);
  requireNumberArray("polyAdd", "b", b, 1);
  const n = Math.max(a.length, b.length);
  const out = new Array<number>(n).fill(0);
  for (let i = 0; i < a.length; i++) out[n - a.length + i] = a[i] as number;
  for (let i = 0; i < b.length; i++) out[n - b.length + i] = (out[n - b.length + i] as number) + (b[i] as number);
  return out;
}

/**
 * Value of a real polynomial at a complex point, by Horner's rule.
 *
 * @param coeffs - coefficients, descending powers (at least one)
 * @param z - evaluation point
 * @returns `p(z)`
 * @throws {@link InvalidArgumentError} when `coeffs` is not a non-empty array of finite numbers or `z` is not finite
 * @example
 * ```ts
 * polyEval([1, 0, 1], { re: 0, im: 1 }); //=> { re: 0, im: 0 }
 * ```
 */
export function polyEval(coeffs: readonly number[], z: Complex): Complex {
  requireNumberArray("polyEval", "coeffs", coeffs, 1);
  requireComplex("polyEval", "z", z);
  return hornerComplex(coeffs, z.re, z.im);
}

/**
 * Value of a real polynomial at a real point, by Horner's rule.
 *
 * @param coeffs - coefficients, descending powers (at least one)
 * @param x - evaluation point
 * @returns `p(x)`
 * @throws {@link InvalidArgumentError} when `coeffs` is not a non-empty array of finite numbers or `x` is not finite
 * @example
 * ```ts
 * polyEvalReal([2, -3, 1], 2); //=> 3
 * ```
 */
export function polyEvalReal(coeffs: readonly number[], x: number): number {
  requireNumberArray("polyEvalReal", "coeffs", coeffs, 1);
  if (typeof x !== "number" || !Number.isFinite(x)) {
    throw new InvalidArgumentError({ fn: "polyEvalReal", path: "x", received: x, message: "expected a finite number" });
  }
  let p = 0;
  for (const c of coeffs) p = p * x + c;
  return p;
}

/**
 * Monic polynomial with the given roots. The roots must be closed under
 * conjugation (every non-real root has its conjugate in the list, within 1e-9
 * relative), so that the coefficients are real; each conjugate pair is
 * multiplied in as the real quadratic `x^2 - 2 Re(r) x + |r|^2`.
 *
 * @param roots - the roots (may be empty)
 * @returns coefficients of `prod(x - r)`, descending powers, leading 1
 * @throws {@link InvalidArgumentError} when a root is not finite or lacks its conjugate partner
 * @example
 * ```ts
 * polyFromRoots([{ re: -1, im: 1 }, { re: -1, im: -1 }, { re: -2, im: 0 }]); //=> [1, 4, 6, 4]
 * ```
 */
export function polyFromRoots(roots: readonly Complex[]): number[] {
  requireComplexArray("polyFromRoots", "roots", roots);
  const used = new Uint8Array(roots.length);
  let p: number[] = [1];
  for (let i = 0; i < roots.length; i++) {
    if (used[i] === 1) continue;
    const r = roots[i] as Complex;
    used[i] = 1;
    if (r.im === 0) {
      p = mulUnchecked(p, [1, -r.re]);
      continue;
    }
    // every index before i is already used, so the search covers j > i
    const { index: best, distance: bestD } = nearestConjugate(roots, r, used);
    if (best < 0 || bestD > 1e-9 * Math.hypot(r.re, r.im)) {
      throw new InvalidArgumentError({
        fn: "polyFromRoots",
        path: `roots[${i}]`,
        received: r,
        message: "non-real roots must come in conjugate pairs (a+bj with a-bj) so that the coefficients are real",
      });
    }
    used[best] = 1;
    const u = roots[best] as Complex;
    const re = (r.re + u.re) / 2;
    const im = (Math.abs(r.im) + Math.abs(u.im)) / 2;
    p = mulUnchecked(p, [1, -2 * re, re * re + im * im]);
  }
  return p;
}

/**
 * Derivative of a polynomial.
 *
 * @param coeffs - coefficients, descending powers (at least one)
 * @returns coefficients of `p'(x)`, descending powers; `[0]` for a constant
 * @throws {@link InvalidArgumentError} when `coeffs` is not a non-empty array of finite numbers
 * @example
 * ```ts
 * polyDerivative([1, 2, 3]); //=> [2, 2]
 * ```
 */
export function polyDerivative(coeffs: readonly number[]): number[] {
  requireNumberArray("polyDerivative", "coeffs", coeffs, 1);
  const n = coeffs.length - 1;
  if (n === 0) return [0];
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) out[i] = (coeffs[i] as number) * (n - i);
  return out;
}
