/**
 * Exact power-of-two equilibration of a complex matrix before its LU
 * factorisation, and the exact binary exponent and power of two it works
 * with (read and written through the IEEE 754 binary64 exponent field, so no
 * scale introduces a rounding).
 *
 * @module
 */

/**
 * Scale the rows, then the columns, of `A` by powers of two so that each has
 * its largest entry in [1, 2) (exact: no rounding). This removes the spread
 * of conductances, capacitances and op-amp terms that would otherwise enter
 * the LU factorisation's error (A. van der Sluis, "Condition numbers and
 * equilibration of matrices", Numer. Math. 14:14-23, 1969).
 *
 * No checks (the numeric core under the stage polynomials).
 *
 * @param n - dimension
 * @param ar - real parts, row-major `n * n`, scaled in place
 * @param ai - imaginary parts, scaled in place
 * @param rows - receives the row scales
 * @param cols - receives the column scales
 * @returns the base-2 exponent e with det(A) = det(R A C) 2^e, or NaN for a zero row or column
 */
export function equilibrate(n: number, ar: Float64Array, ai: Float64Array, rows: Float64Array, cols: Float64Array): number {
  const r = scaleLines(n, ar, ai, rows, n, 1);
  return Number.isNaN(r) ? r : r + scaleLines(n, ar, ai, cols, 1, n);
}

/**
 * Scale each line (row when `line` = n and `step` = 1, column when `line` =
 * 1 and `step` = n) by the power of two that brings its largest entry into
 * [1, 2); returns the sum of the exponents taken out, or NaN for a zero line.
 */
function scaleLines(n: number, ar: Float64Array, ai: Float64Array, scales: Float64Array, line: number, step: number): number {
  let exponent = 0;
  for (let i = 0; i < n; i++) {
    let m = 0;
    for (let j = 0; j < n; j++) {
      const at = i * line + j * step;
      m = Math.max(m, Math.abs(ar[at] as number) + Math.abs(ai[at] as number));
    }
    if (!(m > 0)) return NaN;
    const e = binaryExponent(m);
    const f = powerOfTwo(-e);
    scales[i] = f;
    exponent += e;
    for (let j = 0; j < n; j++) {
      const at = i * line + j * step;
      ar[at] = (ar[at] as number) * f;
      ai[at] = (ai[at] as number) * f;
    }
  }
  return exponent;
}

// The exponent field of a double, read and written through a shared buffer
// (IEEE 754 binary64; the word order is found once, at load).
const bits = new Float64Array(1);
const words = new Uint32Array(bits.buffer);
bits[0] = 1;
const HIGH = words[1] === 0x3ff00000 ? 1 : 0;
const LOW = 1 - HIGH;

/** floor(log2 x) for a positive finite x, exactly. */
function binaryExponent(x: number): number {
  bits[0] = x;
  const field = ((words[HIGH] as number) >>> 20) & 0x7ff;
  return field === 0 ? Math.floor(Math.log2(x)) : field - 1023;
}

/**
 * 2^e exactly: built from the exponent field for -1022 <= e <= 1023, by
 * `Math.pow` outside that range.
 *
 * @param e - an integer exponent
 * @returns 2^e
 */
export function powerOfTwo(e: number): number {
  if (e < -1022 || e > 1023) return Math.pow(2, e);
  words[LOW] = 0;
  words[HIGH] = (e + 1023) << 20;
  return bits[0] as number;
}
