/**
 * A cascade of buffered stages, each a real rational function, evaluated on
 * a grid of angular frequencies in flat loops: the magnitude squared for
 * mask checks (no square root or logarithm per factor) and the complex
 * response for curves. No checks and no allocation but the outputs: this is
 * the hot path under the design loop and the Monte Carlo boards.
 *
 * Method: Horner's rule at `z = j w / scale` in real arithmetic. A real
 * polynomial at an imaginary point splits into its even and odd parts,
 * `p(j x) = E(-x^2) + j x O(-x^2)` with `E` and `O` of half the degree, so
 * each stage's coefficients are split once per call into scratch and every
 * grid point costs two real Horner evaluations of half the length per
 * polynomial (biquads, the common case, and stages up to degree six run
 * unrolled loops), one quotient,
 * and no square root or logarithm. Accuracy: Horner's rule errs by a few
 * ulps per coefficient times the polynomial's condition number at the point
 * (N. J. Higham, "Accuracy and Stability of Numerical Algorithms", 2nd ed.,
 * SIAM 2002, section 5.1); the split evaluates the same real and imaginary
 * parts as complex Horner would, so with scaled coefficients near unity this
 * is about 1e-15 relative except close to a transmission zero, where the
 * absolute error stays at that level (the magnitude squared is formed from
 * the parts, never expanded into a polynomial in `x^2`, whose cancellation
 * near a zero or a high-Q resonance would cost digits).
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
 * The even and odd parts of a real polynomial (descending coefficients in
 * `c`) in `t = -x^2`, ascending: `p(j x) = E(t) + j x O(t)`. Writes `E` into
 * `out` from `even` and `O` from `odd`; returns the polynomial's degree
 * (leading zero coefficients skipped).
 */
export function splitEvenOdd(c: Float64Array, out: Float64Array, even: number, odd: number): number {
  let lead = 0;
  while (lead < c.length - 1 && c[lead] === 0) lead++;
  const top = c.length - 1;
  const deg = top - lead;
  for (let k = 0; k <= deg; k++) out[((k & 1) === 0 ? even : odd) + (k >> 1)] = c[top - k] as number;
  return deg;
}

/** Scratch for one stage's even and odd parts (grown when a stage needs more). */
let scratchParts = new Float64Array(64);

/** `E(t)` (ascending coefficients `e[0..n-1]` at offset `o`) by Horner's rule. */
function horner(e: Float64Array, o: number, n: number, t: number): number {
  let p = e[o + n - 1] as number;
  for (let i = n - 2; i >= 0; i--) p = p * t + (e[o + i] as number);
  return p;
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
  // at least four entries a part, so the unrolled loops below read zeros past a short polynomial
  const size = Math.max(num.length, den.length, 4);
  if (scratchParts.length < 4 * size) scratchParts = new Float64Array(4 * size);
  const q = scratchParts;
  q.fill(0, 0, 4 * size);
  // layout: numerator even, numerator odd, denominator even, denominator odd; `size` entries each
  const dn = splitEvenOdd(num, q, 0, size);
  const dd = splitEvenOdd(den, q, 2 * size, 3 * size);
  const inv = 1 / scale;
  const n = w.length;
  if (dn <= 2 && dd <= 2) {
    const ne0 = q[0] as number;
    const ne1 = q[1] as number;
    const no0 = q[size] as number;
    const de0 = q[2 * size] as number;
    const de1 = q[2 * size + 1] as number;
    const do0 = q[3 * size] as number;
    for (let k = 0; k < n; k++) {
      const x = (w[k] as number) * inv;
      const y = x * x;
      const nr = ne0 - ne1 * y;
      const ni = no0 * x;
      const dr = de0 - de1 * y;
      const di = do0 * x;
      out[k] = ((out[k] as number) * (nr * nr + ni * ni)) / (dr * dr + di * di);
    }
    return;
  }
  if (dn <= 6 && dd <= 6) {
    // degree six and below (a biquad with up to four op-amp poles): E of four terms, O of three
    const [ne0, ne1, ne2, ne3] = [q[0] as number, q[1] as number, q[2] as number, q[3] as number];
    const [no0, no1, no2] = [q[size] as number, q[size + 1] as number, q[size + 2] as number];
    const o = 2 * size;
    const [de0, de1, de2, de3] = [q[o] as number, q[o + 1] as number, q[o + 2] as number, q[o + 3] as number];
    const [do0, do1, do2] = [q[o + size] as number, q[o + size + 1] as number, q[o + size + 2] as number];
    for (let k = 0; k < n; k++) {
      const x = (w[k] as number) * inv;
      const t = -x * x;
      const nr = ((ne3 * t + ne2) * t + ne1) * t + ne0;
      const ni = ((no2 * t + no1) * t + no0) * x;
      const dr = ((de3 * t + de2) * t + de1) * t + de0;
      const di = ((do2 * t + do1) * t + do0) * x;
      out[k] = ((out[k] as number) * (nr * nr + ni * ni)) / (dr * dr + di * di);
    }
    return;
  }
  const ne = (dn >> 1) + 1;
  const no = (dn + 1) >> 1;
  const de = (dd >> 1) + 1;
  const dO = (dd + 1) >> 1;
  for (let k = 0; k < n; k++) {
    const x = (w[k] as number) * inv;
    const t = -x * x;
    const nr = horner(q, 0, ne, t);
    const ni = no > 0 ? x * horner(q, size, no, t) : 0;
    const dr = horner(q, 2 * size, de, t);
    const di = dO > 0 ? x * horner(q, 3 * size, dO, t) : 0;
    out[k] = ((out[k] as number) * (nr * nr + ni * ni)) / (dr * dr + di * di);
  }
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
  let i = 0;
  for (; i + 1 < stages.length; i += 2) multiplyTwoMagnitudesSquared(stages[i] as ScaledRational, stages[i + 1] as ScaledRational, w, out);
  if (i < stages.length) {
    const s = stages[i] as ScaledRational;
    multiplyMagnitudeSquared(s.num, s.den, s.scale, w, out);
  }
  return out;
}

/** Scratch for two stages' even and odd parts (grown when a stage needs more). */
let pairParts = new Float64Array(32);

/**
 * {@link multiplyMagnitudeSquared} of stage `a`, then of stage `b`, in one
 * pass over the grid where both take the same unrolled loop (biquads, or
 * both of degree six and below): each point's product is formed exactly as
 * the two passes form it (the same operations in the same order, the
 * intermediate a double either way), so the same bits; only the store and
 * reload of the running product between the passes is saved. Other pairs
 * (a biquad beside a higher stage, or a stage above degree six) take the
 * two passes.
 */
function multiplyTwoMagnitudesSquared(a: ScaledRational, b: ScaledRational, w: Float64Array, out: Float64Array): void {
  const size = Math.max(a.num.length, a.den.length, b.num.length, b.den.length, 4);
  if (pairParts.length < 8 * size) pairParts = new Float64Array(8 * size);
  const q = pairParts;
  q.fill(0, 0, 8 * size);
  // layout as in multiplyMagnitudeSquared, stage a's four parts then stage b's
  const an = splitEvenOdd(a.num, q, 0, size);
  const ad = splitEvenOdd(a.den, q, 2 * size, 3 * size);
  const o = 4 * size;
  const bn = splitEvenOdd(b.num, q, o, o + size);
  const bd = splitEvenOdd(b.den, q, o + 2 * size, o + 3 * size);
  const ia = 1 / a.scale;
  const ib = 1 / b.scale;
  const n = w.length;
  const aLow = an <= 2 && ad <= 2;
  const bLow = bn <= 2 && bd <= 2;
  if (aLow && bLow) {
    const [ane0, ane1, ano0] = [q[0] as number, q[1] as number, q[size] as number];
    const [ade0, ade1, ado0] = [q[2 * size] as number, q[2 * size + 1] as number, q[3 * size] as number];
    const [bne0, bne1, bno0] = [q[o] as number, q[o + 1] as number, q[o + size] as number];
    const [bde0, bde1, bdo0] = [q[o + 2 * size] as number, q[o + 2 * size + 1] as number, q[o + 3 * size] as number];
    for (let k = 0; k < n; k++) {
      const wk = w[k] as number;
      const x = wk * ia;
      const y = x * x;
      const nr = ane0 - ane1 * y;
      const ni = ano0 * x;
      const dr = ade0 - ade1 * y;
      const di = ado0 * x;
      const u = ((out[k] as number) * (nr * nr + ni * ni)) / (dr * dr + di * di);
      const x2 = wk * ib;
      const y2 = x2 * x2;
      const nr2 = bne0 - bne1 * y2;
      const ni2 = bno0 * x2;
      const dr2 = bde0 - bde1 * y2;
      const di2 = bdo0 * x2;
      out[k] = (u * (nr2 * nr2 + ni2 * ni2)) / (dr2 * dr2 + di2 * di2);
    }
    return;
  }
  // (a biquad beside a higher stage takes the two passes: its own loop is not this one's arithmetic)
  if (!aLow && !bLow && an <= 6 && ad <= 6 && bn <= 6 && bd <= 6) {
    const [ane0, ane1, ane2, ane3] = [q[0] as number, q[1] as number, q[2] as number, q[3] as number];
    const [ano0, ano1, ano2] = [q[size] as number, q[size + 1] as number, q[size + 2] as number];
    const e = 2 * size;
    const [ade0, ade1, ade2, ade3] = [q[e] as number, q[e + 1] as number, q[e + 2] as number, q[e + 3] as number];
    const [ado0, ado1, ado2] = [q[e + size] as number, q[e + size + 1] as number, q[e + size + 2] as number];
    const [bne0, bne1, bne2, bne3] = [q[o] as number, q[o + 1] as number, q[o + 2] as number, q[o + 3] as number];
    const [bno0, bno1, bno2] = [q[o + size] as number, q[o + size + 1] as number, q[o + size + 2] as number];
    const f = o + 2 * size;
    const [bde0, bde1, bde2, bde3] = [q[f] as number, q[f + 1] as number, q[f + 2] as number, q[f + 3] as number];
    const [bdo0, bdo1, bdo2] = [q[f + size] as number, q[f + size + 1] as number, q[f + size + 2] as number];
    for (let k = 0; k < n; k++) {
      const wk = w[k] as number;
      const x = wk * ia;
      const t = -x * x;
      const nr = ((ane3 * t + ane2) * t + ane1) * t + ane0;
      const ni = ((ano2 * t + ano1) * t + ano0) * x;
      const dr = ((ade3 * t + ade2) * t + ade1) * t + ade0;
      const di = ((ado2 * t + ado1) * t + ado0) * x;
      const u = ((out[k] as number) * (nr * nr + ni * ni)) / (dr * dr + di * di);
      const x2 = wk * ib;
      const t2 = -x2 * x2;
      const nr2 = ((bne3 * t2 + bne2) * t2 + bne1) * t2 + bne0;
      const ni2 = ((bno2 * t2 + bno1) * t2 + bno0) * x2;
      const dr2 = ((bde3 * t2 + bde2) * t2 + bde1) * t2 + bde0;
      const di2 = ((bdo2 * t2 + bdo1) * t2 + bdo0) * x2;
      out[k] = (u * (nr2 * nr2 + ni2 * ni2)) / (dr2 * dr2 + di2 * di2);
    }
    return;
  }
  multiplyMagnitudeSquared(a.num, a.den, a.scale, w, out);
  multiplyMagnitudeSquared(b.num, b.den, b.scale, w, out);
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
