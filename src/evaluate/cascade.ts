/**
 * A cascade of buffered stages, each a real rational function, evaluated on
 * a grid of angular frequencies in flat loops: the magnitude squared for
 * mask checks (no square root or logarithm per factor) and the complex
 * response for curves. No checks and no allocation but the outputs: this is
 * the hot path under the design loop and the Monte Carlo boards.
 *
 * Method: Horner's rule at `z = j w / scale` in real arithmetic (a real
 * polynomial at an imaginary point: `(p_r + j p_i) j x + c`), one quotient
 * per stage and point. Accuracy: a few ulps per coefficient times the
 * polynomial's condition number at the point (N. J. Higham, "Accuracy and
 * Stability of Numerical Algorithms", 2nd ed., SIAM 2002, section 5.1); with
 * scaled coefficients near unity this is about 1e-15 relative except close
 * to a transmission zero, where the absolute error stays at that level.
 *
 * @module
 */
import type { ScaledRational } from "./types.ts";

/** Scratch written by {@link atImaginary}: real and imaginary part. */
const value = new Float64Array(2);

/** A real polynomial (descending coefficients) at `z = j x`, written into {@link value}. */
function atImaginary(c: Float64Array, x: number): void {
  let pr = c[0] as number;
  let pi = 0;
  for (let i = 1; i < c.length; i++) {
    const t = -pi * x + (c[i] as number);
    pi = pr * x;
    pr = t;
  }
  value[0] = pr;
  value[1] = pi;
}

/** `|num(j x)|^2 / |den(j x)|^2` of one stage at `x = w / scale`. */
function stageMagnitudeSquared(num: Float64Array, den: Float64Array, x: number): number {
  atImaginary(num, x);
  const n2 = (value[0] as number) * (value[0] as number) + (value[1] as number) * (value[1] as number);
  atImaginary(den, x);
  return n2 / ((value[0] as number) * (value[0] as number) + (value[1] as number) * (value[1] as number));
}

/**
 * `|num(j x)|^2 / |den(j x)|^2` at `x = w / scale` for one stage, multiplied
 * into `out` (so a cascade is a loop over its stages on one buffer).
 *
 * @param num - numerator, descending powers of z
 * @param den - denominator, descending powers of z
 * @param scale - the stage's scale, rad/s
 * @param w - angular frequencies, rad/s
 * @param out - running product, one entry per frequency (updated)
 */
export function multiplyMagnitudeSquared(
  num: Float64Array,
  den: Float64Array,
  scale: number,
  w: Float64Array,
  out: Float64Array,
): void {
  const inv = 1 / scale;
  for (let k = 0; k < w.length; k++) out[k] = (out[k] as number) * stageMagnitudeSquared(num, den, (w[k] as number) * inv);
}

/**
 * `num(j x) / den(j x)` at `x = w / scale` for one stage, multiplied into
 * `(re, im)`.
 *
 * @param num - numerator, descending powers of z
 * @param den - denominator, descending powers of z
 * @param scale - the stage's scale, rad/s
 * @param w - angular frequencies, rad/s
 * @param re - running product, real parts (updated)
 * @param im - running product, imaginary parts (updated)
 */
export function multiplyResponse(
  num: Float64Array,
  den: Float64Array,
  scale: number,
  w: Float64Array,
  re: Float64Array,
  im: Float64Array,
): void {
  const inv = 1 / scale;
  for (let k = 0; k < w.length; k++) {
    const x = (w[k] as number) * inv;
    atImaginary(num, x);
    const pr = value[0] as number;
    const pi = value[1] as number;
    atImaginary(den, x);
    const qr = value[0] as number;
    const qi = value[1] as number;
    // h = p / q, then (re + j im) *= h
    const d = qr * qr + qi * qi;
    const hr = (pr * qr + pi * qi) / d;
    const hi = (pi * qr - pr * qi) / d;
    const a = re[k] as number;
    const b = im[k] as number;
    re[k] = a * hr - b * hi;
    im[k] = a * hi + b * hr;
  }
}

/**
 * Magnitude squared of a cascade of buffered stages on a grid.
 *
 * @param stages - the stages, in any order (the product commutes)
 * @param w - angular frequencies, rad/s
 * @param out - where to write (defaults to a new array)
 * @returns `|H(j w)|^2` per frequency
 */
export function cascadeMagnitudeSquared(
  stages: readonly ScaledRational[],
  w: Float64Array,
  out: Float64Array = new Float64Array(w.length),
): Float64Array {
  out.fill(1);
  for (const s of stages) multiplyMagnitudeSquared(s.num, s.den, s.scale, w, out);
  return out;
}

/**
 * Complex response of a cascade of buffered stages on a grid.
 *
 * @param stages - the stages
 * @param w - angular frequencies, rad/s
 * @returns `{ re, im }` of `H(j w)`
 */
export function cascadeResponse(stages: readonly ScaledRational[], w: Float64Array): { re: Float64Array; im: Float64Array } {
  const re = new Float64Array(w.length).fill(1);
  const im = new Float64Array(w.length);
  for (const s of stages) multiplyResponse(s.num, s.den, s.scale, w, re, im);
  return { re, im };
}

/**
 * `|H(j w)|^2` of a cascade at one angular frequency (no allocation).
 *
 * @param stages - the stages
 * @param w - angular frequency, rad/s
 * @returns the magnitude squared
 */
export function magnitudeSquaredAt(stages: readonly ScaledRational[], w: number): number {
  let out = 1;
  for (let s = 0; s < stages.length; s++) {
    const st = stages[s] as ScaledRational;
    out *= stageMagnitudeSquared(st.num, st.den, w / st.scale);
  }
  return out;
}
