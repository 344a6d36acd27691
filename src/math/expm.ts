/**
 * Exponential of a small dense real matrix by scaling and squaring with a
 * diagonal Pade approximant.
 *
 * Method: scale `X = A / 2^j` so that `||X||_inf <= 1/2`, form the [8/8] Pade
 * approximant `D(X)^-1 N(X)` with `N(X) = sum c_k X^k`, `D(X) = sum c_k (-X)^k`,
 * `c_k = (2q-k)! q! / ((2q)! k! (q-k)!)`, solve by Gaussian elimination with
 * partial pivoting, and square `j` times (G. H. Golub and C. F. Van Loan,
 * "Matrix Computations", 4th ed., Johns Hopkins 2013, Algorithm 9.3.1; C. Moler
 * and C. Van Loan, "Nineteen dubious ways to compute the exponential of a
 * matrix, twenty-five years later", SIAM Review 45(1):3-49, 2003, method 3).
 * Accuracy: the Pade truncation error is below `2^(3-2q) (q!)^2 / ((2q)! (2q+1)!)`
 * ~ 3e-23 relative to `||A||` for q = 8, so the result is limited by rounding
 * in the squarings (a few ulps times `j` for well-conditioned problems).
 * Cost about `(11 + j) n^3` flops.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";

/** A dense square real matrix, row-major. */
export interface RealMatrix {
  /** Dimension `n` (the matrix is `n x n`). */
  readonly n: number;
  /** Entries, `n * n`, row-major: entry `(i, j)` at `i * n + j`. */
  readonly data: Float64Array;
}

const Q = 8;
const PADE: readonly number[] = (() => {
  const c = [1];
  for (let k = 1; k <= Q; k++) c.push(((c[k - 1] as number) * (Q - k + 1)) / (k * (2 * Q - k + 1)));
  return c;
})();

function matmul(n: number, a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < n; k++) {
      const aik = a[i * n + k] as number;
      if (aik === 0) continue;
      for (let j = 0; j < n; j++) out[i * n + j] = (out[i * n + j] as number) + aik * (b[k * n + j] as number);
    }
  }
  return out;
}

/** Solve D X = N (n x n right-hand sides) by LU with partial pivoting; D and N are overwritten. */
function solveInPlace(n: number, d: Float64Array, rhs: Float64Array): void {
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(d[k * n + k] as number);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(d[i * n + k] as number);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = d[k * n + j] as number;
        d[k * n + j] = d[p * n + j] as number;
        d[p * n + j] = t;
        const u = rhs[k * n + j] as number;
        rhs[k * n + j] = rhs[p * n + j] as number;
        rhs[p * n + j] = u;
      }
    }
    const piv = d[k * n + k] as number;
    for (let i = k + 1; i < n; i++) {
      const f = (d[i * n + k] as number) / piv;
      if (f === 0) continue;
      for (let j = k; j < n; j++) d[i * n + j] = (d[i * n + j] as number) - f * (d[k * n + j] as number);
      for (let j = 0; j < n; j++) rhs[i * n + j] = (rhs[i * n + j] as number) - f * (rhs[k * n + j] as number);
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const piv = d[k * n + k] as number;
    for (let j = 0; j < n; j++) {
      let s = rhs[k * n + j] as number;
      for (let i = k + 1; i < n; i++) s -= (d[k * n + i] as number) * (rhs[i * n + j] as number);
      rhs[k * n + j] = s / piv;
    }
  }
}

/** exp(A t) for row-major A (no argument checks; the numeric core). */
export function expmUnchecked(n: number, a: Float64Array, t = 1): Float64Array {
  let norm = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += Math.abs(a[i * n + j] as number);
    norm = Math.max(norm, s);
  }
  norm *= Math.abs(t);
  const j = norm > 0.5 ? Math.max(0, Math.ceil(Math.log2(norm / 0.5))) : 0;
  const scale = t / 2 ** j;
  const x = Float64Array.from(a, (v) => v * scale);
  const num = new Float64Array(n * n);
  const den = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    num[i * n + i] = 1;
    den[i * n + i] = 1;
  }
  let power: Float64Array = x;
  for (let k = 1; k <= Q; k++) {
    if (k > 1) power = matmul(n, power, x);
    const c = PADE[k] as number;
    const sign = k % 2 === 0 ? 1 : -1;
    for (let i = 0; i < n * n; i++) {
      num[i] = (num[i] as number) + c * (power[i] as number);
      den[i] = (den[i] as number) + sign * c * (power[i] as number);
    }
  }
  solveInPlace(n, den, num);
  let e: Float64Array = num;
  for (let s = 0; s < j; s++) e = matmul(n, e, e);
  return e;
}

/**
 * Matrix exponential `exp(A)` of a small dense real matrix (see the module
 * header for the method and its accuracy).
 *
 * @param matrix - the square matrix, row-major
 * @returns `exp(A)` in the same layout
 * @throws {@link InvalidArgumentError} when the matrix is malformed or has non-finite entries
 * @example
 * ```ts
 * expm({ n: 2, data: Float64Array.of(0, 1, 0, 0) }).data; //=> Float64Array [1, 1, 0, 1]
 * ```
 */
export function expm(matrix: RealMatrix): RealMatrix {
  const fn = "expm";
  if (typeof matrix !== "object" || matrix === null) {
    throw new InvalidArgumentError({ fn, path: "matrix", received: matrix, message: "expected { n, data }" });
  }
  const { n, data } = matrix;
  if (!Number.isInteger(n) || n < 1 || n > 500) {
    throw new InvalidArgumentError({ fn, path: "matrix.n", received: n, message: "expected an integer from 1 to 500" });
  }
  if (!(data instanceof Float64Array) || data.length !== n * n) {
    throw new InvalidArgumentError({ fn, path: "matrix.data", received: data, message: `expected a Float64Array of n * n = ${n * n} entries` });
  }
  for (let i = 0; i < data.length; i++) {
    if (!Number.isFinite(data[i] as number)) {
      throw new InvalidArgumentError({ fn, path: `matrix.data[${i}]`, received: data[i], message: "expected a finite number" });
    }
  }
  const out = expmUnchecked(n, data);
  for (let i = 0; i < out.length; i++) {
    if (!Number.isFinite(out[i] as number)) {
      throw new InvalidArgumentError({ fn, path: "matrix", received: undefined, message: "exp(A) overflows; the matrix norm is too large" });
    }
  }
  return { n, data: out };
}
