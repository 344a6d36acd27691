/**
 * Small dense complex linear systems: LU factorisation with partial (row)
 * pivoting and forward/back substitution, on split real/imaginary
 * `Float64Array` storage (row-major, `n * n`).
 *
 * Method: Gaussian elimination with partial pivoting, `P A = L U` with unit
 * lower-triangular `L` (G. H. Golub & C. F. Van Loan, "Matrix Computations",
 * 4th ed., 2013, Algorithm 3.4.1), pivots chosen by the cheap modulus
 * `|re| + |im|`. Backward stable in practice: the computed solution solves
 * `(A + E) x = b` with `|E|` of order `n * eps * growth * |A|` (ibid., Thm 3.4.2).
 * Cost `(8/3) n^3` real flops per factorisation; meant for circuits of a few
 * dozen unknowns.
 *
 * A column is declared singular when its pivot falls to `64 * eps` times the
 * largest modulus in that column of the original matrix, so the caller can map
 * the failing column back to the unknown it stands for (a node voltage or a
 * branch current).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";

/** A dense square complex matrix, row-major, split into real and imaginary parts. */
export interface ComplexMatrix {
  /** Dimension `n` (the matrix is `n x n`). */
  readonly n: number;
  /** Real parts, `n * n` entries, row-major: entry `(i, j)` at `i * n + j`. */
  readonly re: Float64Array;
  /** Imaginary parts, same layout as `re`. */
  readonly im: Float64Array;
}

/** A complex vector split into real and imaginary parts. */
export interface ComplexVector {
  /** Real parts. */
  readonly re: Float64Array;
  /** Imaginary parts. */
  readonly im: Float64Array;
}

/** The LU factors of a complex matrix, `P A = L U`, stored in one array pair. */
export interface ComplexLu {
  /** Dimension. */
  readonly n: number;
  /** Real parts of `L` (strictly below the diagonal, unit diagonal implied) and `U` (on and above). */
  readonly re: Float64Array;
  /** Imaginary parts, same layout. */
  readonly im: Float64Array;
  /** Row permutation: row `k` of `P A` is row `pivots[k]` of `A`. */
  readonly pivots: Int32Array;
  /** Index of the first column whose pivot vanished, or `-1` when the matrix is regular. */
  readonly singularColumn: number;
}

const EPS64 = 64 * Number.EPSILON;

/**
 * LU-factorise in place (no argument checks: the numeric kernel under
 * {@link complexLuFactor} and the nodal analysis). Overwrites `re`/`im` with
 * the factors and `pivots` with the row permutation.
 *
 * @param n - dimension
 * @param re - real parts, row-major `n * n`, overwritten with the factors
 * @param im - imaginary parts, overwritten with the factors
 * @param pivots - receives the permutation (length `n`)
 * @returns the first singular column, or `-1` when every pivot is usable
 * @throws never
 * @example
 * ```ts
 * const re = new Float64Array([0, 1, 1, 0]), im = new Float64Array(4);
 * luFactorInPlace(2, re, im, new Int32Array(2)); //=> -1
 * ```
 */
export function luFactorInPlace(n: number, re: Float64Array, im: Float64Array, pivots: Int32Array): number {
  // Column scales of the original matrix, for the relative singularity test.
  const colMax = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const row = i * n;
    for (let j = 0; j < n; j++) {
      const m = Math.abs(re[row + j] as number) + Math.abs(im[row + j] as number);
      if (m > (colMax[j] as number)) colMax[j] = m;
    }
  }
  let singular = -1;
  for (let i = 0; i < n; i++) pivots[i] = i;
  for (let k = 0; k < n; k++) {
    // Choose the pivot row.
    let p = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const m = Math.abs(re[i * n + k] as number) + Math.abs(im[i * n + k] as number);
      if (m > best) {
        best = m;
        p = i;
      }
    }
    if (!(best > EPS64 * (colMax[k] as number)) || best === 0) {
      if (singular < 0) singular = k;
      continue;
    }
    if (p !== k) {
      const rk = k * n;
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        const tr = re[rk + j] as number;
        re[rk + j] = re[rp + j] as number;
        re[rp + j] = tr;
        const ti = im[rk + j] as number;
        im[rk + j] = im[rp + j] as number;
        im[rp + j] = ti;
      }
      const t = pivots[k] as number;
      pivots[k] = pivots[p] as number;
      pivots[p] = t;
    }
    const rk = k * n;
    const pr = re[rk + k] as number;
    const pi = im[rk + k] as number;
    const d = pr * pr + pi * pi;
    const ir = pr / d;
    const ii = -pi / d;
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const ar = re[ri + k] as number;
      const ai = im[ri + k] as number;
      if (ar === 0 && ai === 0) continue;
      const lr = ar * ir - ai * ii;
      const li = ar * ii + ai * ir;
      re[ri + k] = lr;
      im[ri + k] = li;
      for (let j = k + 1; j < n; j++) {
        const ur = re[rk + j] as number;
        const ui = im[rk + j] as number;
        re[ri + j] = (re[ri + j] as number) - (lr * ur - li * ui);
        im[ri + j] = (im[ri + j] as number) - (lr * ui + li * ur);
      }
    }
  }
  return singular;
}

/**
 * Determinant of a matrix from its factors by {@link luFactorInPlace}: the
 * product of U's diagonal times the sign of the row permutation (its cycle
 * decomposition). No checks; exact apart from the product's rounding.
 *
 * @param n - dimension
 * @param re - real parts of the factors
 * @param im - imaginary parts of the factors
 * @param pivots - the permutation
 * @param out - receives `[re, im]` of the determinant
 * @param seen - scratch of length `n` (allocated when omitted)
 * @returns nothing; `out` holds the determinant
 * @throws never
 * @example
 * ```ts
 * const re = new Float64Array([0, 1, 1, 0]), im = new Float64Array(4), p = new Int32Array(2), d = new Float64Array(2);
 * luFactorInPlace(2, re, im, p);
 * luDeterminantInto(2, re, im, p, d); // d = [-1, 0]
 * ```
 */
export function luDeterminantInto(
  n: number,
  re: Float64Array,
  im: Float64Array,
  pivots: Int32Array,
  out: Float64Array,
  seen: Uint8Array = new Uint8Array(n),
): void {
  seen.fill(0);
  let sign = 1;
  for (let i = 0; i < n; i++) {
    if (seen[i] === 1) continue;
    let len = 0;
    let j = i;
    while (seen[j] === 0) {
      seen[j] = 1;
      j = pivots[j] as number;
      len++;
    }
    if (len % 2 === 0) sign = -sign;
  }
  let dr = 1;
  let di = 0;
  for (let i = 0; i < n; i++) {
    const pr = re[i * n + i] as number;
    const pi = im[i * n + i] as number;
    const t = dr * pr - di * pi;
    di = dr * pi + di * pr;
    dr = t;
  }
  out[0] = sign * dr;
  out[1] = sign * di;
}

/**
 * Solve with factors from {@link luFactorInPlace} (no checks). Writes the
 * solution into `xr`/`xi`.
 *
 * @param n - dimension
 * @param lu - factors and pivots
 * @param b - right-hand side (not modified)
 * @param x - receives the solution (length `n`)
 * @returns nothing; `x` holds the solution
 * @throws never
 * @example
 * ```ts
 * // see complexLuSolve for the checked version
 * ```
 */
export function luSolveInPlace(
  n: number,
  lu: { readonly re: Float64Array; readonly im: Float64Array; readonly pivots: Int32Array },
  b: ComplexVector,
  x: ComplexVector,
): void {
  const { re, im, pivots } = lu;
  const xr = x.re;
  const xi = x.im;
  for (let i = 0; i < n; i++) {
    const p = pivots[i] as number;
    xr[i] = b.re[p] as number;
    xi[i] = b.im[p] as number;
  }
  // Forward substitution with unit lower L.
  for (let i = 1; i < n; i++) {
    const ri = i * n;
    let sr = xr[i] as number;
    let si = xi[i] as number;
    for (let j = 0; j < i; j++) {
      const lr = re[ri + j] as number;
      const li = im[ri + j] as number;
      const yr = xr[j] as number;
      const yi = xi[j] as number;
      sr -= lr * yr - li * yi;
      si -= lr * yi + li * yr;
    }
    xr[i] = sr;
    xi[i] = si;
  }
  // Back substitution with U.
  for (let i = n - 1; i >= 0; i--) {
    const ri = i * n;
    let sr = xr[i] as number;
    let si = xi[i] as number;
    for (let j = i + 1; j < n; j++) {
      const ur = re[ri + j] as number;
      const ui = im[ri + j] as number;
      const yr = xr[j] as number;
      const yi = xi[j] as number;
      sr -= ur * yr - ui * yi;
      si -= ur * yi + ui * yr;
    }
    const dr = re[ri + i] as number;
    const di = im[ri + i] as number;
    const d = dr * dr + di * di;
    xr[i] = (sr * dr + si * di) / d;
    xi[i] = (si * dr - sr * di) / d;
  }
}

function checkMatrix(fn: string, a: ComplexMatrix): void {
  if (a === null || typeof a !== "object") {
    throw new InvalidArgumentError({ fn, path: "a", received: a, message: "expected { n, re, im }" });
  }
  if (!Number.isInteger(a.n) || a.n < 1) {
    throw new InvalidArgumentError({ fn, path: "a.n", received: a.n, message: "expected an integer dimension >= 1" });
  }
  for (const part of ["re", "im"] as const) {
    const v = a[part];
    if (!(v instanceof Float64Array) || v.length !== a.n * a.n) {
      throw new InvalidArgumentError({
        fn,
        path: `a.${part}`,
        received: v instanceof Float64Array ? `Float64Array(${v.length})` : v,
        message: `expected a Float64Array of length n * n = ${a.n * a.n}`,
      });
    }
    for (let i = 0; i < v.length; i++) {
      if (!Number.isFinite(v[i])) {
        throw new InvalidArgumentError({ fn, path: `a.${part}[${i}]`, received: v[i], message: "expected a finite number" });
      }
    }
  }
}

/**
 * LU-factorise a dense complex matrix with partial pivoting
 * (Golub & Van Loan, Matrix Computations, 2013, Alg. 3.4.1). The input is not modified.
 *
 * @param a - the matrix
 * @returns the factors; `singularColumn >= 0` flags a (numerically) singular matrix
 * @throws {@link InvalidArgumentError} when `a` is malformed or holds non-finite entries
 * @example
 * ```ts
 * const lu = complexLuFactor({ n: 2, re: new Float64Array([0, 2, 1, 0]), im: new Float64Array(4) });
 * lu.pivots; //=> Int32Array [1, 0]
 * lu.singularColumn; //=> -1
 * ```
 */
export function complexLuFactor(a: ComplexMatrix): ComplexLu {
  checkMatrix("complexLuFactor", a);
  const re = Float64Array.from(a.re);
  const im = Float64Array.from(a.im);
  const pivots = new Int32Array(a.n);
  const singularColumn = luFactorInPlace(a.n, re, im, pivots);
  return { n: a.n, re, im, pivots, singularColumn };
}

/**
 * Solve `A x = b` with factors from {@link complexLuFactor}.
 *
 * @param lu - the factors of `A`
 * @param b - right-hand side, length `n`
 * @returns a fresh solution vector
 * @throws {@link InvalidArgumentError} when `b` has the wrong length or the factors flag a singular matrix
 * @example
 * ```ts
 * const lu = complexLuFactor({ n: 1, re: new Float64Array([0]), im: new Float64Array([2]) });
 * complexLuSolve(lu, { re: new Float64Array([2]), im: new Float64Array([0]) });
 * //=> { re: Float64Array [0], im: Float64Array [-1] }
 * ```
 */
export function complexLuSolve(lu: ComplexLu, b: ComplexVector): ComplexVector {
  const fn = "complexLuSolve";
  const n = lu?.n;
  if (
    typeof n !== "number" || !Number.isInteger(n) || n < 1 ||
    !(lu.re instanceof Float64Array) || !(lu.im instanceof Float64Array) || !(lu.pivots instanceof Int32Array) ||
    lu.re.length !== n * n || lu.im.length !== n * n || lu.pivots.length !== n || typeof lu.singularColumn !== "number"
  ) {
    throw new InvalidArgumentError({ fn, path: "lu", received: lu, message: "expected the factors returned by complexLuFactor" });
  }
  if (typeof b !== "object" || b === null) {
    throw new InvalidArgumentError({ fn, path: "b", received: b, message: `expected { re, im } Float64Arrays of length ${n}` });
  }
  if (lu.singularColumn >= 0) {
    throw new InvalidArgumentError({
      fn,
      path: "lu.singularColumn",
      received: lu.singularColumn,
      message: "the matrix is singular; no unique solution exists",
    });
  }
  for (const part of ["re", "im"] as const) {
    const v = b[part];
    if (!(v instanceof Float64Array) || v.length !== lu.n) {
      throw new InvalidArgumentError({ fn, path: `b.${part}`, received: v, message: `expected a Float64Array of length ${lu.n}` });
    }
  }
  const x = { re: new Float64Array(lu.n), im: new Float64Array(lu.n) };
  luSolveInPlace(lu.n, lu, b, x);
  return x;
}
