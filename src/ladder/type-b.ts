/**
 * The modified ("type b") even-order elliptic and Chebyshev II lowpass: an
 * even-order prototype of these families has a non-zero gain at infinity and
 * (elliptic) a reflection maximum of 1/(1 + eps^2) at DC, so no lowpass LC
 * ladder between resistors realises it. The frequency transformation of the
 * squared frequency
 *   X = (alpha x + beta) / (x + gamma),   x = w^2 (new), X = W^2 (prototype),
 *   alpha = X_zmax, gamma = (X_zmax - 1) / (1 - X_r1), beta = X_r1 gamma,
 * maps DC to the lowest reflection zero X_r1 (0 for Chebyshev II), 1 rad/s
 * to 1 rad/s, and infinity to the highest transmission zero X_zmax, so the
 * new function |H(j sqrt(X(w^2)))| keeps the passband ripple (elliptic) or
 * the attenuation at 1 rad/s (Chebyshev II) and the minimum stopband
 * attenuation, has two transmission zeros at infinity instead of the highest
 * finite pair, full transmission at DC (equal terminations) and the same
 * order. Poles: s^2 = (gamma P^2 + beta) / (alpha + P^2) for each prototype
 * pole P, the left-half-plane root; zeros: w'^2 = (gamma w_z^2 - beta) /
 * (alpha - w_z^2); gain for |H(0)| = 1. The stopband edge moves up
 * slightly (the price of realisability).
 * Reference: R. Saal and E. Ulbrich, "On the design of filters by
 * synthesis", IRE Trans. Circuit Theory 5(4):284-327, 1958 (the modified
 * even-degree Cauer characteristics); G. C. Temes and S. K. Mitra (eds.),
 * "Modern Filter Theory and Design", Wiley, 1973, ch. 2.
 * Accuracy: a few ulp per pole and zero on top of the prototype's own.
 *
 * @module
 */
import { cadd, cdiv, cmul, csqrt, type Complex } from "../math/complex.ts";
import { freezeZpk, prodNeg, pushPair } from "../approx/internal.ts";
import type { Zpk } from "../tf/types.ts";
import { axisReflectionZeros } from "./characteristic.ts";

/** The transformation constants and the transformed prototype. */
export interface TypeBTransform {
  /** The transformed prototype (peak gain 1 at DC). */
  readonly zpk: Zpk;
  /** Square of the highest transmission zero of the prototype (rad^2/s^2), moved to infinity. */
  readonly movedZeroSquared: number;
  /** Square of the lowest reflection zero of the prototype, moved to DC (0 for Chebyshev II). */
  readonly movedReflectionSquared: number;
}

/**
 * Transform an even-order elliptic or Chebyshev II prototype into its type b
 * form (unchecked core).
 *
 * @param h - the even-order prototype (peak gain 1, zeros on the jw axis)
 * @param flatAtDc - true for Chebyshev II (every reflection zero at DC)
 * @returns the transformed prototype and the constants, or null when the
 *   reflection zeros cannot be found
 * @throws never (unchecked)
 * @example
 * ```ts
 * typeB(elliptic(4, { rippleDb: 0.5, attenuationDb: 40 }), false)?.zpk.zeros.length; //=> 2
 * ```
 */
export function typeB(h: Zpk, flatAtDc: boolean): TypeBTransform | null {
  let xz = 0;
  for (const z of h.zeros) xz = Math.max(xz, z.im * z.im);
  let xr = 0;
  if (!flatAtDc) {
    const peaks = axisReflectionZeros(h);
    if (peaks === null || peaks.length === 0) return null;
    xr = (peaks[0] as number) ** 2;
  }
  const alpha = xz;
  const gamma = (xz - 1) / (1 - xr);
  const beta = xr * gamma;
  const poles: Complex[] = [];
  for (const p of h.poles) {
    if (p.im < 0) continue;
    const p2 = cmul(p, p);
    let s = csqrt(cdiv(cadd({ re: gamma * p2.re, im: gamma * p2.im }, { re: beta, im: 0 }), { re: alpha + p2.re, im: p2.im }));
    if (s.re > 0) s = { re: -s.re, im: -s.im };
    if (p.im === 0) poles.push({ re: s.re, im: 0 });
    else pushPair(poles, s);
  }
  const zeros: Complex[] = [];
  let moved = false;
  for (const z of h.zeros) {
    if (!(z.im > 0)) continue;
    const x = z.im * z.im;
    if (!moved && x === xz) {
      moved = true;
      continue;
    }
    pushPair(zeros, { re: 0, im: Math.sqrt((gamma * x - beta) / (alpha - x)) });
  }
  const gain = prodNeg(poles) / prodNeg(zeros);
  return { zpk: freezeZpk(zeros, poles, gain), movedZeroSquared: xz, movedReflectionSquared: xr };
}
