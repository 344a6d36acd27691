/**
 * Chebyshev type II (inverse Chebyshev: flat passband, equiripple stopband)
 * lowpass prototype.
 *
 * Method: |H(jw)|^2 = 1 / (1 + 1 / (d^2 T_n(1/w)^2)), d = 1 / sqrt(10^(As/10) - 1).
 * With mu = asinh(1/d) / n and theta_k = (2k - 1) pi / (2n) the poles are
 * 1 / (-sinh(mu) sin(theta_k) + j cosh(mu) cos(theta_k)) and the zeros
 * +-j / cos(theta_k). The stopband starts at 1 rad/s (attenuation exactly As
 * there), as scipy.signal.cheb2ap. DC gain is 1. Accuracy: a few ulp.
 * Reference: R. Schaumann and M. E. Van Valkenburg, "Design of Analog
 * Filters", Oxford University Press, 2001, section on the inverse Chebyshev
 * approximation.
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";
import type { Zpk } from "../tf/types.ts";
import { requireInRange, requireInteger, requireOptions } from "../validate.ts";
import { freezeZpk, prodNeg, pushPair } from "./internal.ts";
import type { Chebyshev2Options } from "./types.ts";
import { MIN_RIPPLE_DB } from "./chebyshev1.ts";

/** Highest Chebyshev II order accepted. */
export const CHEBYSHEV2_MAX_ORDER = 64;

/** Largest stopband attenuation accepted, in dB. */
export const MAX_ATTENUATION_DB = 400;

/**
 * Chebyshev type II (inverse Chebyshev) lowpass prototype: maximally flat
 * passband and an equiripple stopband of at least `attenuationDb` dB from
 * 1 rad/s up (1 rad/s is the stopband edge, as scipy.signal.cheb2ap). DC gain 1.
 *
 * @param order - filter order, integer 1-64
 * @param options - `{ attenuationDb }`, the minimum stopband attenuation in dB (0 < attenuationDb <= 400)
 * @returns the prototype as zeros/poles/gain (rad/s), with 2*floor(order/2) zeros on the jw axis
 * @throws {@link InvalidArgumentError} when the order or the attenuation is out of range
 * @example
 * ```ts
 * chebyshev2(1, { attenuationDb: 20 });
 * //=> { zeros: [], poles: [{ re: -0.10050378152592121, im: 0 }], gain: 0.10050378152592121 }
 * ```
 */
export function chebyshev2(order: number, options: Chebyshev2Options): Zpk {
  const fn = "chebyshev2";
  requireInteger(fn, "order", order, { min: 1, max: CHEBYSHEV2_MAX_ORDER });
  const opts = requireOptions(fn, "options", options);
  const as = requireInRange(fn, "options.attenuationDb", opts["attenuationDb"], {
    min: MIN_RIPPLE_DB,
    max: MAX_ATTENUATION_DB,
  });
  const invDe = Math.sqrt(Math.expm1((as / 10) * Math.LN10));
  const mu = Math.asinh(invDe) / order;
  const sh = Math.sinh(mu);
  const ch = Math.cosh(mu);
  const zeros: Complex[] = [];
  const poles: Complex[] = [];
  for (let k = 1; 2 * k <= order; k++) {
    const theta = ((2 * k - 1) * Math.PI) / (2 * order);
    // Prototype pole before inversion: -sinh(mu) sin(theta) + j cosh(mu) cos(theta).
    const a = -sh * Math.sin(theta);
    const b = ch * Math.cos(theta);
    const d = a * a + b * b;
    pushPair(poles, { re: a / d, im: b / d });
    pushPair(zeros, { re: 0, im: 1 / Math.cos(theta) });
  }
  if (order % 2 === 1) poles.push({ re: -1 / sh, im: 0 });
  const gain = prodNeg(poles) / prodNeg(zeros);
  return freezeZpk(zeros, poles, gain);
}
