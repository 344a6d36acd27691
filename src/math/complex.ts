/**
 * Complex arithmetic on plain immutable `{ re, im }` values.
 *
 * Division uses Smith's algorithm to avoid needless overflow and underflow
 * (R. L. Smith, "Algorithm 116: Complex division", Commun. ACM 5(8):435, 1962);
 * the modulus uses `Math.hypot`. All functions are pure and return fresh objects.
 *
 * These are the primitives of the numerical core and sit in inner loops, so,
 * unlike the rest of the public API, they do not check their arguments: pass
 * `{ re, im }` objects with finite parts (NaN in gives NaN out).
 *
 * @module
 */

/** A complex number as plain data. */
export interface Complex {
  /** Real part. */
  readonly re: number;
  /** Imaginary part. */
  readonly im: number;
}

/**
 * Make a complex number.
 *
 * @param re - real part
 * @param im - imaginary part
 * @returns `{ re, im }`
 * @example
 * ```ts
 * complex(1, -2); //=> { re: 1, im: -2 }
 * ```
 */
export function complex(re: number, im = 0): Complex {
  return { re, im };
}

/**
 * Sum `a + b`.
 *
 * @param a - first term
 * @param b - second term
 * @returns the sum
 * @example
 * ```ts
 * cadd(complex(1, 2), complex(3, -1)); //=> { re: 4, im: 1 }
 * ```
 */
export function cadd(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im };
}

/**
 * Difference `a - b`.
 *
 * @param a - minuend
 * @param b - subtrahend
 * @returns the difference
 * @example
 * ```ts
 * csub(complex(1, 2), complex(3, -1)); //=> { re: -2, im: 3 }
 * ```
 */
export function csub(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

/**
 * Product `a * b`.
 *
 * @param a - first factor
 * @param b - second factor
 * @returns the product
 * @example
 * ```ts
 * cmul(complex(0, 1), complex(0, 1)); //=> { re: -1, im: 0 }
 * ```
 */
export function cmul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

/**
 * Quotient `a / b` by Smith's algorithm. Division by zero gives infinite or NaN
 * parts, as in IEEE arithmetic; callers divide only by non-zero values.
 *
 * @param a - dividend
 * @param b - divisor
 * @returns the quotient
 * @example
 * ```ts
 * cdiv(complex(1, 0), complex(0, 1)); //=> { re: 0, im: -1 }
 * ```
 */
export function cdiv(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

/**
 * Multiply by a real scalar.
 *
 * @param a - complex value
 * @param k - real factor
 * @returns `k * a`
 * @example
 * ```ts
 * cscale(complex(1, 2), 3); //=> { re: 3, im: 6 }
 * ```
 */
export function cscale(a: Complex, k: number): Complex {
  return { re: a.re * k, im: a.im * k };
}

/**
 * Negation `-a`.
 *
 * @param a - complex value
 * @returns `-a`
 * @example
 * ```ts
 * cneg(complex(1, -2)); //=> { re: -1, im: 2 }
 * ```
 */
export function cneg(a: Complex): Complex {
  return { re: -a.re, im: -a.im };
}

/**
 * Complex conjugate.
 *
 * @param a - complex value
 * @returns `conj(a)`
 * @example
 * ```ts
 * cconj(complex(1, 2)); //=> { re: 1, im: -2 }
 * ```
 */
export function cconj(a: Complex): Complex {
  return { re: a.re, im: -a.im };
}

/**
 * Modulus `|a|`, without overflow for large parts.
 *
 * @param a - complex value
 * @returns `|a|`
 * @example
 * ```ts
 * cabs(complex(3, 4)); //=> 5
 * ```
 */
export function cabs(a: Complex): number {
  return Math.hypot(a.re, a.im);
}

/**
 * Argument (phase angle) in radians, in `(-pi, pi]`.
 *
 * @param a - complex value
 * @returns `atan2(im, re)`
 * @example
 * ```ts
 * carg(complex(0, 1)); //=> 1.5707963267948966
 * ```
 */
export function carg(a: Complex): number {
  return Math.atan2(a.im, a.re);
}

/**
 * Reciprocal `1 / a`.
 *
 * @param a - non-zero complex value
 * @returns `1 / a`
 * @example
 * ```ts
 * cinv(complex(0, 2)); //=> { re: 0, im: -0.5 }
 * ```
 */
export function cinv(a: Complex): Complex {
  return cdiv({ re: 1, im: 0 }, a);
}

/**
 * Principal square root, branch cut on the negative real axis, computed
 * without cancellation (W. Kahan, "Branch cuts for complex elementary
 * functions", 1987).
 *
 * @param a - complex value
 * @returns `sqrt(a)` with non-negative real part
 * @example
 * ```ts
 * csqrt(complex(-4, 0)); //=> { re: 0, im: 2 }
 * ```
 */
export function csqrt(a: Complex): Complex {
  if (a.re === 0 && a.im === 0) return { re: 0, im: a.im };
  const m = Math.hypot(a.re, a.im);
  if (a.re >= 0) {
    const t = Math.sqrt((m + a.re) / 2);
    return { re: t, im: a.im / (2 * t) };
  }
  const t = Math.sqrt((m - a.re) / 2);
  return { re: Math.abs(a.im) / (2 * t), im: a.im < 0 || Object.is(a.im, -0) ? -t : t };
}

/**
 * Exponential `e^a`.
 *
 * @param a - complex value
 * @returns `exp(a)`
 * @example
 * ```ts
 * cexp(complex(0, Math.PI)); //=> { re: -1, im: 1.2246467991473532e-16 }
 * ```
 */
export function cexp(a: Complex): Complex {
  const e = Math.exp(a.re);
  return { re: e * Math.cos(a.im), im: e * Math.sin(a.im) };
}

/**
 * Complex number from modulus and argument.
 *
 * @param r - modulus
 * @param theta - argument in radians
 * @returns `r e^{i theta}`
 * @example
 * ```ts
 * fromPolar(2, 0); //=> { re: 2, im: 0 }
 * ```
 */
export function fromPolar(r: number, theta: number): Complex {
  return { re: r * Math.cos(theta), im: r * Math.sin(theta) };
}
