/**
 * Zeros/poles/gain transfer functions: a validated constructor, evaluation at
 * a complex frequency as a product of first-order factors (no polynomial
 * expansion, so no coefficient cancellation), and conversion to polynomials.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { Complex } from "../math/complex.ts";
import { requireComplex, requireComplexArray, requireConjugateClosed } from "../math/check.ts";
import { polyFromRoots } from "../math/polynomial.ts";
import { requireZpk } from "./check.ts";
import type { Zpk } from "./types.ts";

/**
 * Build a validated, frozen {@link Zpk}. Zeros and poles are copied; each
 * non-real value must have its conjugate in the same list (within 1e-9
 * relative) so that the transfer function is real.
 *
 * @param zeros - finite zeros (rad/s)
 * @param poles - poles (rad/s)
 * @param gain - real gain factor `k`, finite and non-zero
 * @returns `{ zeros, poles, gain }`, frozen
 * @throws {@link InvalidArgumentError} when a value is not finite, a complex value lacks its conjugate, or the gain is zero or not finite
 * @example
 * ```ts
 * const h = zpk([], [{ re: -1, im: 1 }, { re: -1, im: -1 }], 2);
 * h.poles.length; //=> 2
 * ```
 */
export function zpk(zeros: readonly Complex[], poles: readonly Complex[], gain: number): Zpk {
  const fn = "zpk";
  requireComplexArray(fn, "zeros", zeros);
  requireComplexArray(fn, "poles", poles);
  requireConjugateClosed(fn, "zeros", zeros);
  requireConjugateClosed(fn, "poles", poles);
  if (typeof gain !== "number" || !Number.isFinite(gain) || gain === 0) {
    throw new InvalidArgumentError({ fn, path: "gain", received: gain, message: "expected a finite, non-zero real gain" });
  }
  return Object.freeze({
    zeros: Object.freeze(zeros.map((z) => Object.freeze({ re: z.re, im: z.im }))),
    poles: Object.freeze(poles.map((p) => Object.freeze({ re: p.re, im: p.im }))),
    gain,
  });
}

/** Running product `[re, im]` of the factor-by-factor evaluation (no allocation per factor). */
const acc = new Float64Array(2);

/** acc *= (ar + j ai). */
function mulFactor(ar: number, ai: number): void {
  const re = acc[0] as number;
  const im = acc[1] as number;
  acc[0] = re * ar - im * ai;
  acc[1] = re * ai + im * ar;
}

/** acc /= (br + j bi), by Smith's division. */
function divFactor(br: number, bi: number): void {
  const re = acc[0] as number;
  const im = acc[1] as number;
  if (Math.abs(br) >= Math.abs(bi)) {
    const r = bi / br;
    const d = br + bi * r;
    acc[0] = (re + im * r) / d;
    acc[1] = (im - re * r) / d;
  } else {
    const r = br / bi;
    const d = br * r + bi;
    acc[0] = (re * r + im) / d;
    acc[1] = (im * r - re) / d;
  }
}

/**
 * H(s) of a zpk, no checks (internal core): the gain times each factor
 * `(s - z_i)`, divided by each `(s - p_j)` with Smith's division. With
 * `interleave` the zeros and poles alternate, so that no partial product
 * overflows (the slow, overflow-safe path of the frequency response);
 * otherwise all zeros come first, then all poles.
 */
export function evalZpkUnchecked(system: Zpk, sr: number, si: number, interleave = false): Complex {
  const { zeros, poles } = system;
  acc[0] = system.gain;
  acc[1] = 0;
  if (interleave) {
    const m = Math.max(zeros.length, poles.length);
    for (let i = 0; i < m; i++) {
      const z = zeros[i];
      if (z !== undefined) mulFactor(sr - z.re, si - z.im);
      const p = poles[i];
      if (p !== undefined) divFactor(sr - p.re, si - p.im);
    }
  } else {
    for (const z of zeros) mulFactor(sr - z.re, si - z.im);
    for (const p of poles) divFactor(sr - p.re, si - p.im);
  }
  return { re: acc[0] as number, im: acc[1] as number };
}

/**
 * Value of `H(s) = gain * prod(s - z_i) / prod(s - p_j)` at a complex
 * frequency, as a product of factors. At a pole the result is not finite, so
 * a pole exactly at `s` is rejected.
 *
 * @param system - the transfer function
 * @param s - complex frequency (rad/s); `{ re: 0, im: w }` for the frequency response at `w`
 * @returns `H(s)`
 * @throws {@link InvalidArgumentError} when `system` or `s` is malformed, or `s` is exactly a pole
 * @example
 * ```ts
 * evalZpk(zpk([], [{ re: -1, im: 0 }], 1), { re: 0, im: 1 }); //=> { re: 0.5, im: -0.5 }
 * ```
 */
export function evalZpk(system: Zpk, s: Complex): Complex {
  requireZpk("evalZpk", "system", system);
  requireComplex("evalZpk", "s", s);
  if (system.poles.some((p) => p.re === s.re && p.im === s.im)) {
    throw new InvalidArgumentError({ fn: "evalZpk", path: "s", received: s, message: "s is a pole of the system; H(s) is infinite there" });
  }
  return evalZpkUnchecked(system, s.re, s.im);
}

/** A transfer function as numerator and denominator polynomials in descending powers of s. */
export interface ZpkPolynomials {
  /** Numerator coefficients, descending powers, including the gain. */
  readonly num: number[];
  /** Denominator coefficients, descending powers, monic. */
  readonly den: number[];
}

/**
 * Expand a zpk into numerator and denominator polynomials in descending powers
 * of s: `H(s) = num(s) / den(s)` with `den` monic. Useful for display and for
 * comparing with other tools; the expansion loses accuracy for high orders
 * with widely spread roots, so the library itself evaluates the factored form.
 *
 * @param system - the transfer function
 * @returns `{ num, den }`, descending powers
 * @throws {@link InvalidArgumentError} when `system` is malformed
 * @example
 * ```ts
 * zpkToPolynomials(zpk([{ re: 0, im: 0 }], [{ re: -1, im: 1 }, { re: -1, im: -1 }], 3));
 * //=> { num: [3, 0], den: [1, 2, 2] }
 * ```
 */
export function zpkToPolynomials(system: Zpk): ZpkPolynomials {
  requireZpk("zpkToPolynomials", "system", system);
  const num = polyFromRoots(system.zeros).map((c) => c * system.gain);
  const den = polyFromRoots(system.poles);
  return { num, den };
}
