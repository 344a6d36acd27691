/**
 * Butterworth (maximally flat) lowpass prototype.
 *
 * Method: poles on the unit circle at s_k = -sin(theta_k) + j cos(theta_k),
 * theta_k = (2k - 1) pi / (2n), k = 1..n; |H(jw)|^2 = 1 / (1 + w^(2n)), so the
 * -3.0103 dB point is at 1 rad/s. Accuracy: each pole to ~1 ulp.
 * Reference: S. Butterworth, "On the theory of filter amplifiers",
 * Experimental Wireless and the Wireless Engineer 7, 1930, pp. 536-541.
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";
import type { Zpk } from "../tf/types.ts";
import { requireInteger } from "../validate.ts";
import { freezeZpk, pushPair } from "./internal.ts";

/** Highest Butterworth order accepted. */
export const BUTTERWORTH_MAX_ORDER = 64;

/** Poles of the unit Butterworth prototype (conjugate pairs, then the real pole). */
export function butterworthPoles(order: number): Complex[] {
  const poles: Complex[] = [];
  for (let k = 1; 2 * k <= order; k++) {
    const theta = ((2 * k - 1) * Math.PI) / (2 * order);
    pushPair(poles, { re: -Math.sin(theta), im: Math.cos(theta) });
  }
  if (order % 2 === 1) poles.push({ re: -1, im: 0 });
  return poles;
}

/**
 * Butterworth lowpass prototype of the given order, -3 dB at 1 rad/s (as
 * scipy.signal.buttap): no finite zeros, poles on the unit circle, unit DC gain.
 *
 * @param order - filter order, integer 1-64
 * @returns the prototype as zeros/poles/gain (rad/s)
 * @throws {@link InvalidArgumentError} when `order` is not an integer from 1 to 64
 * @example
 * ```ts
 * butterworth(2);
 * //=> { zeros: [], poles: [{ re: -0.7071067811865475, im: 0.7071067811865476 },
 * //                       { re: -0.7071067811865475, im: -0.7071067811865476 }], gain: 1 }
 * ```
 */
export function butterworth(order: number): Zpk {
  requireInteger("butterworth", "order", order, { min: 1, max: BUTTERWORTH_MAX_ORDER });
  return freezeZpk([], butterworthPoles(order), 1);
}
