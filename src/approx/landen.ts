/**
 * Complete elliptic integrals and Jacobi elliptic functions for elliptic
 * filter design, by the arithmetic-geometric mean and Landen transformations.
 *
 * Method: K(k) = pi / (2 AGM(1, k')) (A&S 17.6); the descending Landen
 * sequence k_{n+1} = k_n^2 / (1 + k'_n)^2, k'_{n+1} = 2 sqrt(k'_n) / (1 + k'_n)
 * is carried with both the modulus and its complement so that nothing
 * cancels when k is near 1; sn and cd at u*K(k) (u complex) by ascending
 * Landen recursion w <- (1 + k_n) w / (1 + k_n w^2) from sin/cos(u pi/2); the
 * inverse sn of an imaginary argument by the descending recursion; the degree
 * equation from the nome q = exp(-pi K'/(n K)) by theta-function series.
 * Accuracy: a few ulp for moduli whose complement is representable.
 * References: H. J. Orchard and A. N. Willson Jr., "Elliptic functions for
 * filter design", IEEE Trans. Circuits Syst. I 44(4):273-287, 1997 (Landen
 * transformations for sn, cd and their inverses in filter design);
 * M. Abramowitz and I. A. Stegun, "Handbook of
 * Mathematical Functions", NBS, 1964, 16.12 (descending Landen
 * transformation), 16.38 (theta functions: the degree equation by nomes) and
 * 17.6 (arithmetic-geometric mean).
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";

/** A modulus with its complement k' = sqrt(1 - k^2), each held to full precision. */
export interface Modulus {
  /** Modulus k, 0 <= k < 1. */
  readonly k: number;
  /** Complementary modulus k' = sqrt(1 - k^2). */
  readonly kp: number;
}

/** Build a modulus from k alone (adequate when k is not extremely close to 1). */
export function modulusOf(k: number): Modulus {
  return { k, kp: Math.sqrt((1 - k) * (1 + k)) };
}

/** Arithmetic-geometric mean of two positive numbers (quadratic convergence). */
export function agm(a0: number, b0: number): number {
  let a = a0;
  let b = b0;
  for (let i = 0; i < 64; i++) {
    const an = 0.5 * (a + b);
    const bn = Math.sqrt(a * b);
    if (Math.abs(an - bn) <= 2 * Number.EPSILON * an) return 0.5 * (an + bn);
    a = an;
    b = bn;
  }
  return 0.5 * (a + b);
}

/** Complete elliptic integral of the first kind K(k) = pi / (2 AGM(1, k')). */
export function ellipticK(m: Modulus): number {
  return Math.PI / (2 * agm(1, m.kp));
}

/** Complementary complete integral K'(k) = K(k') = pi / (2 AGM(1, k)). */
export function ellipticKp(m: Modulus): number {
  return Math.PI / (2 * agm(1, m.k));
}

/** Descending Landen moduli k_1, k_2, ... of k (stops once they no longer matter). */
export function landenSequence(m: Modulus): number[] {
  const seq: number[] = [];
  let k = m.k;
  let kp = m.kp;
  while (k > 1e-18 && seq.length < 40) {
    const k1 = (k / (1 + kp)) ** 2;
    kp = (2 * Math.sqrt(kp)) / (1 + kp);
    k = k1;
    seq.push(k);
  }
  return seq;
}

function ascend(w0: Complex, seq: readonly number[]): Complex {
  let wr = w0.re;
  let wi = w0.im;
  for (let n = seq.length - 1; n >= 0; n--) {
    const kn = seq[n] as number;
    // w <- (1 + kn) w / (1 + kn w^2)
    const dr = 1 + kn * (wr * wr - wi * wi);
    const di = kn * 2 * wr * wi;
    const nr = (1 + kn) * wr;
    const ni = (1 + kn) * wi;
    const den = dr * dr + di * di;
    wr = (nr * dr + ni * di) / den;
    wi = (ni * dr - nr * di) / den;
  }
  return { re: wr, im: wi };
}

/** cd(u K, k) for complex u (u in units of the quarter period K). */
export function cdUnit(u: Complex, seq: readonly number[]): Complex {
  const x = (u.re * Math.PI) / 2;
  const y = (u.im * Math.PI) / 2;
  return ascend({ re: Math.cos(x) * Math.cosh(y), im: -Math.sin(x) * Math.sinh(y) }, seq);
}

/** sn(u K, k) for complex u (u in units of the quarter period K). */
export function snUnit(u: Complex, seq: readonly number[]): Complex {
  const x = (u.re * Math.PI) / 2;
  const y = (u.im * Math.PI) / 2;
  return ascend({ re: Math.sin(x) * Math.cosh(y), im: Math.cos(x) * Math.sinh(y) }, seq);
}

/**
 * Inverse sn of a purely imaginary argument: returns real v with
 * sn(j v K, k) = j y (v in units of K), by descending Landen recursion.
 */
export function asnImagUnit(y: number, m: Modulus, seq: readonly number[]): number {
  let t = y;
  let kPrev = m.k;
  for (const kn of seq) {
    t = (2 * t) / ((1 + Math.sqrt(1 + (kPrev * t) ** 2)) * (1 + kn));
    kPrev = kn;
  }
  return (2 / Math.PI) * Math.asinh(t);
}

/**
 * Solve the degree equation n K'(k)/K(k) = K'(k1)/K(k1) for the modulus k,
 * given the order n and the discrimination modulus k1, through the nome
 * q = exp(-pi K'(k1) / (n K(k1))):
 * k = 4 sqrt(q) [sum q^(m(m+1))]^2 / [1 + 2 sum q^(m^2)]^2,
 * k' = [1 + 2 sum (-1)^m q^(m^2)]^2 / [1 + 2 sum q^(m^2)]^2.
 */
export function degreeModulus(order: number, k1: Modulus): Modulus {
  const q = Math.exp((-Math.PI * ellipticKp(k1)) / (order * ellipticK(k1)));
  let num = 0;
  let th3 = 1;
  let th4 = 1;
  for (let m = 0; m < 200; m++) {
    const a = q ** (m * (m + 1));
    num += a;
    if (m >= 1) {
      const b = q ** (m * m);
      th3 += 2 * b;
      th4 += (m % 2 === 1 ? -2 : 2) * b;
      if (b < 1e-18 * th3 && a < 1e-18 * num) break;
    }
  }
  return { k: 4 * Math.sqrt(q) * (num / th3) ** 2, kp: (th4 / th3) ** 2 };
}
