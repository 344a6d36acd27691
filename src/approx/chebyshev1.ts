/**
 * Chebyshev type I (equiripple passband) lowpass prototype.
 *
 * Method: |H(jw)|^2 = 1 / (1 + eps^2 T_n(w)^2), eps = sqrt(10^(Rp/10) - 1);
 * poles s_k = -sinh(mu) sin(theta_k) + j cosh(mu) cos(theta_k),
 * mu = asinh(1/eps) / n, theta_k = (2k - 1) pi / (2n). The ripple band ends
 * at 1 rad/s (loss exactly Rp there), as scipy.signal.cheb1ap. The gain
 * makes the peak passband gain 1 (DC gain 1 for odd n, 1/sqrt(1 + eps^2)
 * for even n). Accuracy: poles to a few ulp.
 * Reference: R. Schaumann and M. E. Van Valkenburg, "Design of Analog
 * Filters", Oxford University Press, 2001, section on the Chebyshev
 * approximation.
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";
import type { Zpk } from "../tf/types.ts";
import { requireInRange, requireInteger, requireOptions } from "../validate.ts";
import { freezeZpk, prodNeg, pushPair } from "./internal.ts";
import type { Chebyshev1Options } from "./types.ts";

/** Highest Chebyshev I order accepted. */
export const CHEBYSHEV1_MAX_ORDER = 64;

/** Largest passband ripple accepted, in dB. */
export const MAX_RIPPLE_DB = 100;

/**
 * Smallest passband ripple (and smallest Chebyshev II / elliptic stopband
 * attenuation) accepted, in dB: 1e-6 dB keeps the ripple factor
 * sqrt(10^(r/10) - 1) near 5e-4, so every prototype pole of every supported
 * order stays finite in double precision (below it the poles run to infinity).
 */
export const MIN_RIPPLE_DB = 1e-6;

/** Poles of the Chebyshev I prototype for ripple factor eps (pairs, then the real pole). */
export function chebyshev1Poles(order: number, eps: number): Complex[] {
  const mu = Math.asinh(1 / eps) / order;
  const sh = Math.sinh(mu);
  const ch = Math.cosh(mu);
  const poles: Complex[] = [];
  for (let k = 1; 2 * k <= order; k++) {
    const theta = ((2 * k - 1) * Math.PI) / (2 * order);
    pushPair(poles, { re: -sh * Math.sin(theta), im: ch * Math.cos(theta) });
  }
  if (order % 2 === 1) poles.push({ re: -sh, im: 0 });
  return poles;
}

/**
 * Chebyshev type I lowpass prototype: equiripple passband of `rippleDb` dB
 * from 0 to 1 rad/s (the ripple edge, as scipy.signal.cheb1ap), then
 * monotonic roll-off. Peak passband gain is 1.
 *
 * @param order - filter order, integer 1-64
 * @param options - `{ rippleDb }`, the passband ripple in dB (0 < rippleDb <= 100)
 * @returns the prototype as zeros/poles/gain (rad/s)
 * @throws {@link InvalidArgumentError} when the order or the ripple is out of range
 * @example
 * ```ts
 * chebyshev1(1, { rippleDb: 3 });
 * //=> { zeros: [], poles: [{ re: -1.0023772930076005, im: 0 }], gain: 1.0023772930076005 }
 * ```
 */
export function chebyshev1(order: number, options: Chebyshev1Options): Zpk {
  const fn = "chebyshev1";
  requireInteger(fn, "order", order, { min: 1, max: CHEBYSHEV1_MAX_ORDER });
  const opts = requireOptions(fn, "options", options);
  const rp = requireInRange(fn, "options.rippleDb", opts["rippleDb"], { min: MIN_RIPPLE_DB, max: MAX_RIPPLE_DB });
  const eps2 = Math.expm1((rp / 10) * Math.LN10);
  const eps = Math.sqrt(eps2);
  const poles = chebyshev1Poles(order, eps);
  let gain = prodNeg(poles);
  if (order % 2 === 0) gain /= Math.sqrt(1 + eps2);
  return freezeZpk([], poles, gain);
}
