/**
 * Double-double arithmetic: a real number held as an unevaluated sum hi + lo
 * of two doubles with |lo| <= ulp(hi)/2, about 106 bits (32 decimal digits);
 * and complex numbers of double-double parts.
 *
 * Method: error-free transformations, Knuth's two-sum and Dekker's exact
 * product by splitting (T. J. Dekker, "A floating-point technique for
 * extending the available precision", Numer. Math. 18:224-242, 1971), and the
 * "accurate" addition, multiplication and division of Y. Hida, X. S. Li and
 * D. H. Bailey, "Algorithms for quad-double precision floating point
 * arithmetic", Proc. 15th IEEE Symposium on Computer Arithmetic, 2001
 * (their QD library's dd_real). Accuracy: relative error below 2^-104 per
 * operation for add, mul; about 2^-103 for div and sqrt. No overflow
 * protection beyond that of double (the splitting overflows above ~1e300);
 * callers keep values normalised. Not exported from the layer index: a
 * numerical core for the ladder synthesis.
 *
 * @module
 */

/** A double-double number hi + lo. */
export interface DD {
  /** Leading part (the double nearest the value). */
  readonly hi: number;
  /** Trailing part, |lo| <= ulp(hi) / 2. */
  readonly lo: number;
}

/** A complex number of double-double parts. */
export interface CDD {
  /** Real part. */
  readonly re: DD;
  /** Imaginary part. */
  readonly im: DD;
}

const SPLITTER = 134217729; // 2^27 + 1 (Dekker)

/** The double-double zero. */
export const DD_ZERO: DD = Object.freeze({ hi: 0, lo: 0 });
/** The double-double one. */
export const DD_ONE: DD = Object.freeze({ hi: 1, lo: 0 });

/**
 * A double as a double-double.
 *
 * @param x - any finite double
 * @returns x + 0
 * @throws never
 * @example
 * ```ts
 * dd(0.5); //=> { hi: 0.5, lo: 0 }
 * ```
 */
export function dd(x: number): DD {
  return { hi: x, lo: 0 };
}

function twoSum(a: number, b: number): DD {
  const s = a + b;
  const v = s - a;
  return { hi: s, lo: a - (s - v) + (b - v) };
}

function quickTwoSum(a: number, b: number): DD {
  const s = a + b;
  return { hi: s, lo: b - (s - a) };
}

function twoProd(a: number, b: number): DD {
  const p = a * b;
  let t = SPLITTER * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLITTER * b;
  const bh = t - (t - b);
  const bl = b - bh;
  return { hi: p, lo: ah * bh - p + ah * bl + al * bh + al * bl };
}

/**
 * Sum of two double-doubles.
 *
 * @param a - addend
 * @param b - addend
 * @returns a + b
 * @throws never
 * @example
 * ```ts
 * ddAdd(dd(1), dd(2 ** -80)); //=> { hi: 1, lo: 8.271806125530277e-25 }
 * ```
 */
export function ddAdd(a: DD, b: DD): DD {
  const s = twoSum(a.hi, b.hi);
  const t = twoSum(a.lo, b.lo);
  let r = quickTwoSum(s.hi, s.lo + t.hi);
  r = quickTwoSum(r.hi, r.lo + t.lo);
  return r;
}

/**
 * Negation.
 *
 * @param a - value
 * @returns -a
 * @throws never
 * @example
 * ```ts
 * ddNeg(dd(2)); //=> { hi: -2, lo: -0 }
 * ```
 */
export function ddNeg(a: DD): DD {
  return { hi: -a.hi, lo: -a.lo };
}

/**
 * Difference of two double-doubles.
 *
 * @param a - minuend
 * @param b - subtrahend
 * @returns a - b
 * @throws never
 * @example
 * ```ts
 * ddSub(dd(1), dd(1)).hi; //=> 0
 * ```
 */
export function ddSub(a: DD, b: DD): DD {
  return ddAdd(a, ddNeg(b));
}

/**
 * Product of two double-doubles.
 *
 * @param a - factor
 * @param b - factor
 * @returns a * b
 * @throws never
 * @example
 * ```ts
 * ddMul(dd(3), dd(1 / 3)).hi; //=> 1
 * ```
 */
export function ddMul(a: DD, b: DD): DD {
  const p = twoProd(a.hi, b.hi);
  return quickTwoSum(p.hi, p.lo + (a.hi * b.lo + a.lo * b.hi));
}

/**
 * Product of a double-double and a double.
 *
 * @param a - double-double factor
 * @param b - double factor
 * @returns a * b
 * @throws never
 * @example
 * ```ts
 * ddMulNum(dd(0.1), 10).hi; //=> 1
 * ```
 */
export function ddMulNum(a: DD, b: number): DD {
  const p = twoProd(a.hi, b);
  return quickTwoSum(p.hi, p.lo + a.lo * b);
}

/**
 * Quotient of two double-doubles (long division with two correction steps).
 *
 * @param a - dividend
 * @param b - divisor, non-zero
 * @returns a / b
 * @throws never (a zero divisor gives a non-finite result)
 * @example
 * ```ts
 * ddToNumber(ddDiv(dd(1), dd(3))); //=> 0.3333333333333333
 * ```
 */
export function ddDiv(a: DD, b: DD): DD {
  const q1 = a.hi / b.hi;
  let r = ddSub(a, ddMulNum(b, q1));
  const q2 = r.hi / b.hi;
  r = ddSub(r, ddMulNum(b, q2));
  const q3 = r.hi / b.hi;
  const q = quickTwoSum(q1, q2);
  return ddAdd(q, dd(q3));
}

/**
 * Square root (one Newton step on the double estimate, Karp's trick).
 *
 * @param a - value, >= 0
 * @returns sqrt(a)
 * @throws never (a negative argument gives NaN)
 * @example
 * ```ts
 * ddSqrt(dd(4)); //=> { hi: 2, lo: 0 }
 * ```
 */
export function ddSqrt(a: DD): DD {
  if (a.hi === 0) return DD_ZERO;
  const x = 1 / Math.sqrt(a.hi);
  const ax = a.hi * x;
  const diff = ddSub(a, twoProd(ax, ax));
  return twoSum(ax, diff.hi * (x * 0.5));
}

/**
 * The double nearest a double-double.
 *
 * @param a - value
 * @returns hi + lo rounded
 * @throws never
 * @example
 * ```ts
 * ddToNumber({ hi: 1, lo: 1e-20 }); //=> 1
 * ```
 */
export function ddToNumber(a: DD): number {
  return a.hi + a.lo;
}

/**
 * A complex double-double from two doubles.
 *
 * @param re - real part
 * @param im - imaginary part
 * @returns re + j im
 * @throws never
 * @example
 * ```ts
 * cdd(1, 2).im; //=> { hi: 2, lo: 0 }
 * ```
 */
export function cdd(re: number, im = 0): CDD {
  return { re: dd(re), im: dd(im) };
}

/**
 * Complex sum.
 *
 * @param a - addend
 * @param b - addend
 * @returns a + b
 * @throws never
 * @example
 * ```ts
 * cddAdd(cdd(1, 1), cdd(1, -1)).im.hi; //=> 0
 * ```
 */
export function cddAdd(a: CDD, b: CDD): CDD {
  return { re: ddAdd(a.re, b.re), im: ddAdd(a.im, b.im) };
}

/**
 * Complex difference.
 *
 * @param a - minuend
 * @param b - subtrahend
 * @returns a - b
 * @throws never
 * @example
 * ```ts
 * cddSub(cdd(1, 1), cdd(1, 1)).re.hi; //=> 0
 * ```
 */
export function cddSub(a: CDD, b: CDD): CDD {
  return { re: ddSub(a.re, b.re), im: ddSub(a.im, b.im) };
}

/**
 * Complex product.
 *
 * @param a - factor
 * @param b - factor
 * @returns a * b
 * @throws never
 * @example
 * ```ts
 * cddMul(cdd(0, 1), cdd(0, 1)).re.hi; //=> -1
 * ```
 */
export function cddMul(a: CDD, b: CDD): CDD {
  return {
    re: ddSub(ddMul(a.re, b.re), ddMul(a.im, b.im)),
    im: ddAdd(ddMul(a.re, b.im), ddMul(a.im, b.re)),
  };
}

/**
 * Complex quotient (plain formula; the ladder synthesis divides only by
 * values far from overflow).
 *
 * @param a - dividend
 * @param b - divisor, non-zero
 * @returns a / b
 * @throws never
 * @example
 * ```ts
 * cddDiv(cdd(1), cdd(0, 1)).im.hi; //=> -1
 * ```
 */
export function cddDiv(a: CDD, b: CDD): CDD {
  const den = ddAdd(ddMul(b.re, b.re), ddMul(b.im, b.im));
  const re = ddAdd(ddMul(a.re, b.re), ddMul(a.im, b.im));
  const im = ddSub(ddMul(a.im, b.re), ddMul(a.re, b.im));
  return { re: ddDiv(re, den), im: ddDiv(im, den) };
}

/**
 * Principal complex square root (real part >= 0).
 *
 * @param a - value
 * @returns sqrt(a)
 * @throws never
 * @example
 * ```ts
 * cddSqrt(cdd(-4)).im.hi; //=> 2
 * ```
 */
export function cddSqrt(a: CDD): CDD {
  const r = ddSqrt(ddAdd(ddMul(a.re, a.re), ddMul(a.im, a.im)));
  if (a.re.hi >= 0) {
    const x = ddSqrt(ddMulNum(ddAdd(r, a.re), 0.5));
    if (x.hi === 0) return { re: DD_ZERO, im: DD_ZERO };
    return { re: x, im: ddDiv(a.im, ddMulNum(x, 2)) };
  }
  let y = ddSqrt(ddMulNum(ddSub(r, a.re), 0.5));
  if (a.im.hi < 0) y = ddNeg(y);
  return { re: ddDiv(a.im, ddMulNum(y, 2)), im: y };
}

/**
 * |a| of a complex double-double, rounded to a double.
 *
 * @param a - value
 * @returns the modulus as a double
 * @throws never
 * @example
 * ```ts
 * cddAbs(cdd(3, 4)); //=> 5
 * ```
 */
export function cddAbs(a: CDD): number {
  return Math.hypot(ddToNumber(a.re), ddToNumber(a.im));
}
