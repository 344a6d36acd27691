/**
 * Real polynomials with double-double coefficients, in descending powers
 * (the layout of polynomial.ts): products, sums, division by s^2 + c,
 * evaluation at a complex point, the even polynomial p(s) p(-s) written in
 * x = -s^2, and Newton's iteration for a root.
 *
 * Method: schoolbook products and Horner's rule in double-double arithmetic
 * (see double-double.ts); synthetic division. Accuracy: each coefficient of
 * a product or sum to about 2^-104 relative to the sum of the moduli of its
 * terms; Horner's rule to 2^-104 times sum |a_k| |z|^k (N. J. Higham,
 * "Accuracy and Stability of Numerical Algorithms", 2nd ed., SIAM 2002,
 * section 5.1, with the double-double unit roundoff). Newton's iteration
 * converges quadratically to a simple root from a start accurate to a few
 * digits. Not exported from the layer index: a numerical core for the ladder
 * synthesis.
 *
 * @module
 */
import {
  cdd,
  cddAdd,
  cddDiv,
  cddMul,
  cddSub,
  dd,
  ddAdd,
  ddDiv,
  ddMul,
  ddMulNum,
  ddNeg,
  ddSub,
  ddToNumber,
  DD_ZERO,
  type CDD,
  type DD,
} from "./double-double.ts";

/** A real polynomial with double-double coefficients, descending powers. */
export type DDPoly = readonly DD[];

/**
 * A polynomial of double coefficients as double-double.
 *
 * @param coeffs - coefficients, descending powers
 * @returns the same polynomial
 * @throws never
 * @example
 * ```ts
 * ddPoly([1, 2]).length; //=> 2
 * ```
 */
export function ddPoly(coeffs: readonly number[]): DD[] {
  return coeffs.map((c) => dd(c));
}

/**
 * The coefficients rounded to doubles.
 *
 * @param p - polynomial
 * @returns its coefficients as doubles
 * @throws never
 * @example
 * ```ts
 * ddPolyToNumbers(ddPoly([1, 2])); //=> [1, 2]
 * ```
 */
export function ddPolyToNumbers(p: DDPoly): number[] {
  return p.map(ddToNumber);
}

/**
 * Product of two polynomials.
 *
 * @param a - factor
 * @param b - factor
 * @returns a * b
 * @throws never
 * @example
 * ```ts
 * ddPolyToNumbers(ddPolyMul(ddPoly([1, 1]), ddPoly([1, -1]))); //=> [1, 0, -1]
 * ```
 */
export function ddPolyMul(a: DDPoly, b: DDPoly): DD[] {
  const out: DD[] = new Array<DD>(a.length + b.length - 1).fill(DD_ZERO);
  for (let i = 0; i < a.length; i++) {
    for (let j = 0; j < b.length; j++) out[i + j] = ddAdd(out[i + j] as DD, ddMul(a[i] as DD, b[j] as DD));
  }
  return out;
}

/**
 * Sum of two polynomials (aligned at the constant term).
 *
 * @param a - addend
 * @param b - addend
 * @returns a + b, of the larger length
 * @throws never
 * @example
 * ```ts
 * ddPolyToNumbers(ddPolyAdd(ddPoly([1, 0, 0]), ddPoly([2]))); //=> [1, 0, 2]
 * ```
 */
export function ddPolyAdd(a: DDPoly, b: DDPoly): DD[] {
  const n = Math.max(a.length, b.length);
  const out: DD[] = [];
  for (let i = 0; i < n; i++) {
    const ai = a[i - (n - a.length)] ?? DD_ZERO;
    const bi = b[i - (n - b.length)] ?? DD_ZERO;
    out.push(ddAdd(ai, bi));
  }
  return out;
}

/**
 * Difference of two polynomials (aligned at the constant term).
 *
 * @param a - minuend
 * @param b - subtrahend
 * @returns a - b, of the larger length
 * @throws never
 * @example
 * ```ts
 * ddPolyToNumbers(ddPolySub(ddPoly([1, 2]), ddPoly([2]))); //=> [1, 0]
 * ```
 */
export function ddPolySub(a: DDPoly, b: DDPoly): DD[] {
  return ddPolyAdd(a, b.map(ddNeg));
}

/**
 * A polynomial times a double-double constant.
 *
 * @param a - polynomial
 * @param k - constant
 * @returns k a
 * @throws never
 * @example
 * ```ts
 * ddPolyToNumbers(ddPolyScale(ddPoly([1, 2]), dd(3))); //=> [3, 6]
 * ```
 */
export function ddPolyScale(a: DDPoly, k: DD): DD[] {
  return a.map((c) => ddMul(c, k));
}

/**
 * Drop leading coefficients that are exactly zero (keeps at least one).
 *
 * @param a - polynomial
 * @returns the same polynomial without leading zeros
 * @throws never
 * @example
 * ```ts
 * ddPolyToNumbers(ddPolyTrim(ddPoly([0, 0, 1, 2]))); //=> [1, 2]
 * ```
 */
export function ddPolyTrim(a: DDPoly): DD[] {
  let i = 0;
  while (i < a.length - 1 && (a[i] as DD).hi === 0) i++;
  return a.slice(i);
}

/**
 * Divide by s^2 + c; the remainder (degree below 2) is returned beside the quotient.
 *
 * @param a - dividend, degree >= 2
 * @param c - constant of the divisor s^2 + c
 * @returns `{ quotient, remainder: [r1, r0] }`
 * @throws never
 * @example
 * ```ts
 * ddPolyToNumbers(ddPolyDivQuadratic(ddPoly([1, 0, 4]), dd(4)).quotient); //=> [1]
 * ```
 */
export function ddPolyDivQuadratic(a: DDPoly, c: DD): { quotient: DD[]; remainder: [DD, DD] } {
  const r = [...a];
  const q: DD[] = [];
  for (let i = 0; i + 2 < r.length; i++) {
    const lead = r[i] as DD;
    q.push(lead);
    r[i + 2] = ddSub(r[i + 2] as DD, ddMul(lead, c));
  }
  return { quotient: q, remainder: [r[r.length - 2] as DD, r[r.length - 1] as DD] };
}

/**
 * Value of a polynomial at a complex point (Horner).
 *
 * @param a - polynomial
 * @param z - point
 * @returns a(z)
 * @throws never
 * @example
 * ```ts
 * ddPolyEval(ddPoly([1, 0, 1]), cdd(0, 1)).re.hi; //=> 0
 * ```
 */
export function ddPolyEval(a: DDPoly, z: CDD): CDD {
  let acc: CDD = cdd(0);
  for (const c of a) acc = cddAdd(cddMul(acc, z), { re: c, im: DD_ZERO });
  return acc;
}

/**
 * Value of a polynomial at a real point (Horner).
 *
 * @param a - polynomial
 * @param x - point
 * @returns a(x)
 * @throws never
 * @example
 * ```ts
 * ddPolyEvalReal(ddPoly([1, -2]), dd(2)).hi; //=> 0
 * ```
 */
export function ddPolyEvalReal(a: DDPoly, x: DD): DD {
  let acc = DD_ZERO;
  for (const c of a) acc = ddAdd(ddMul(acc, x), c);
  return acc;
}

/**
 * Derivative.
 *
 * @param a - polynomial
 * @returns da/ds (the zero polynomial [0] for a constant)
 * @throws never
 * @example
 * ```ts
 * ddPolyToNumbers(ddPolyDerivative(ddPoly([1, 0, 0]))); //=> [2, 0]
 * ```
 */
export function ddPolyDerivative(a: DDPoly): DD[] {
  const n = a.length - 1;
  if (n === 0) return [DD_ZERO];
  return a.slice(0, n).map((c, i) => ddMulNum(c, n - i));
}

/**
 * p(s) p(-s), an even polynomial in s, written as a polynomial in x = -s^2
 * (so that its value at x = w^2 is |p(jw)|^2).
 *
 * @param p - polynomial of degree n
 * @returns n + 1 coefficients in x, descending
 * @throws never
 * @example
 * ```ts
 * ddPolyToNumbers(ddPolyMirrorSquare(ddPoly([1, 1]))); //=> [1, 1]
 * ```
 */
export function ddPolyMirrorSquare(p: DDPoly): DD[] {
  const n = p.length - 1;
  const mirrored = p.map((c, i) => ((n - i) % 2 === 1 ? ddNeg(c) : c));
  const q = ddPolyMul(p, mirrored); // degree 2n, odd powers vanish
  const out: DD[] = [];
  for (let k = n; k >= 0; k--) {
    const c = q[2 * n - 2 * k] as DD;
    out.push(k % 2 === 1 ? ddNeg(c) : c);
  }
  return out;
}

/**
 * Newton's iteration for a root of a polynomial in complex double-double
 * arithmetic, from a start near a simple root; stops when the step no longer
 * shrinks or after `maxSteps`.
 *
 * @param a - polynomial
 * @param start - starting point
 * @param maxSteps - iteration limit
 * @returns the refined root
 * @throws never
 * @example
 * ```ts
 * ddToNumber(ddNewtonRoot(ddPoly([1, 0, -2]), cdd(1.4), 8).re); //=> 1.4142135623730951
 * ```
 */
export function ddNewtonRoot(a: DDPoly, start: CDD, maxSteps: number): CDD {
  const da = ddPolyDerivative(a);
  let z = start;
  let last = Number.POSITIVE_INFINITY;
  for (let i = 0; i < maxSteps; i++) {
    const d = ddPolyEval(da, z);
    if (d.re.hi === 0 && d.im.hi === 0) break;
    const step = cddDiv(ddPolyEval(a, z), d);
    const size = Math.hypot(ddToNumber(step.re), ddToNumber(step.im));
    if (!(size < last)) break;
    z = cddSub(z, step);
    last = size;
    const scale = Math.hypot(ddToNumber(z.re), ddToNumber(z.im));
    if (size <= 1e-31 * scale) break;
  }
  return z;
}

/**
 * Newton's iteration for a real root of a polynomial, real double-double.
 *
 * @param a - polynomial
 * @param start - starting point
 * @param maxSteps - iteration limit
 * @returns the refined root
 * @throws never
 * @example
 * ```ts
 * ddToNumber(ddNewtonRealRoot(ddPoly([1, 0, -2]), dd(1.4), 8)); //=> 1.4142135623730951
 * ```
 */
export function ddNewtonRealRoot(a: DDPoly, start: DD, maxSteps: number): DD {
  const da = ddPolyDerivative(a);
  let x = start;
  let last = Number.POSITIVE_INFINITY;
  for (let i = 0; i < maxSteps; i++) {
    const d = ddPolyEvalReal(da, x);
    if (d.hi === 0) break;
    const step = ddDiv(ddPolyEvalReal(a, x), d);
    const size = Math.abs(step.hi);
    if (!(size < last)) break;
    x = ddSub(x, step);
    last = size;
    if (size <= 1e-31 * Math.abs(x.hi)) break;
  }
  return x;
}
