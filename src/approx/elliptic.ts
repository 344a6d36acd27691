/**
 * Elliptic (Cauer) lowpass prototype: equiripple passband and stopband.
 *
 * Method (H. J. Orchard and A. N. Willson Jr., "Elliptic functions for filter
 * design", IEEE Trans. Circuits Syst. I 44(4):273-287, 1997; R. W. Daniels,
 * "Approximation Methods for Electronic Filter Design", McGraw-Hill, 1974,
 * ch. 5): eps_p = sqrt(10^(Rp/10) - 1),
 * eps_s = sqrt(10^(As/10) - 1), discrimination modulus k1 = eps_p / eps_s;
 * the selectivity modulus k solves the degree equation n K'/K = K1'/K1
 * exactly (by nomes), so the passband edge is 1 rad/s with loss exactly Rp and
 * the stopband edge is 1/k with attenuation exactly As, as scipy.signal.ellipap.
 * Zeros j / (k cd(u_i K)), poles j cd((u_i - j v0) K), u_i = (2i - 1)/n,
 * real pole j sn(j v0 K) for odd n, v0 = asn(j / eps_p, k1) / (j n).
 * Elliptic functions by Landen transformations (see landen.ts).
 * Accuracy: poles and zeros to ~1e-14 relative for orders 1-24.
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";
import type { Zpk } from "../tf/types.ts";
import type { InvalidArgumentError } from "../errors.ts";
import { requireInRange, requireInteger, requireOptions } from "../validate.ts";
import { freezeZpk, prodNeg, pushPair, requireAttenuationAboveRipple } from "./internal.ts";
import { asnImagUnit, cdUnit, degreeModulus, landenSequence, modulusOf, snUnit } from "./landen.ts";
import type { EllipticOptions } from "./types.ts";
import { MAX_RIPPLE_DB, MIN_RIPPLE_DB } from "./chebyshev1.ts";
import { MAX_ATTENUATION_DB } from "./chebyshev2.ts";

/** Highest elliptic order accepted. */
export const ELLIPTIC_MAX_ORDER = 24;

interface EllipticCore {
  readonly zpk: Zpk;
  readonly k: number;
}

function checkEllipticArgs(fn: string, order: number, options: EllipticOptions): { rp: number; as: number } {
  requireInteger(fn, "order", order, { min: 1, max: ELLIPTIC_MAX_ORDER });
  const opts = requireOptions(fn, "options", options);
  const rp = requireInRange(fn, "options.rippleDb", opts["rippleDb"], { min: MIN_RIPPLE_DB, max: MAX_RIPPLE_DB });
  const as = requireInRange(fn, "options.attenuationDb", opts["attenuationDb"], {
    min: MIN_RIPPLE_DB,
    max: MAX_ATTENUATION_DB,
  });
  requireAttenuationAboveRipple(fn, "options.attenuationDb", { rippleDb: rp, attenuationDb: as });
  return { rp, as };
}

function ellipticCore(order: number, rp: number, as: number): EllipticCore {
  const eps2 = Math.expm1((rp / 10) * Math.LN10);
  const eps = Math.sqrt(eps2);
  const k1 = Math.sqrt(eps2 / Math.expm1((as / 10) * Math.LN10));
  const mod1 = modulusOf(k1);
  const mod = degreeModulus(order, mod1);
  const seq = landenSequence(mod);
  const seq1 = landenSequence(mod1);
  const v0 = asnImagUnit(1 / eps, mod1, seq1) / order;
  const zeros: Complex[] = [];
  const poles: Complex[] = [];
  for (let i = 1; 2 * i <= order; i++) {
    const u = (2 * i - 1) / order;
    const zeta = cdUnit({ re: u, im: 0 }, seq).re;
    pushPair(zeros, { re: 0, im: 1 / (mod.k * zeta) });
    const c = cdUnit({ re: u, im: -v0 }, seq);
    // p = j * cd = -Im(cd) + j Re(cd)
    pushPair(poles, { re: -c.im, im: c.re });
  }
  if (order % 2 === 1) {
    const s = snUnit({ re: 0, im: v0 }, seq);
    poles.push({ re: -s.im, im: 0 });
  }
  let gain = prodNeg(poles) / prodNeg(zeros);
  if (order % 2 === 0) gain /= Math.sqrt(1 + eps2);
  return { zpk: freezeZpk(zeros, poles, gain), k: mod.k };
}

/**
 * Elliptic (Cauer) lowpass prototype: equiripple passband of `rippleDb` dB
 * up to 1 rad/s (the passband edge, as scipy.signal.ellipap), equiripple
 * stopband of exactly `attenuationDb` dB from the stopband edge
 * (see {@link ellipticStopbandEdge}). Peak passband gain is 1.
 *
 * @param order - filter order, integer 1-24
 * @param options - `{ rippleDb, attenuationDb }` in dB, with 0 < rippleDb < attenuationDb
 * @returns the prototype as zeros/poles/gain (rad/s)
 * @throws {@link InvalidArgumentError} when the order is out of range, a level is
 *   not positive, or the attenuation does not exceed the ripple
 * @example
 * ```ts
 * const h = elliptic(3, { rippleDb: 1, attenuationDb: 40 });
 * h.zeros.length; //=> 2
 * h.poles.length; //=> 3
 * ```
 */
export function elliptic(order: number, options: EllipticOptions): Zpk {
  const { rp, as } = checkEllipticArgs("elliptic", order, options);
  return ellipticCore(order, rp, as).zpk;
}

/**
 * Stopband edge (rad/s) of the elliptic prototype returned by {@link elliptic}
 * for the same arguments: the frequency 1/k from which the attenuation is at
 * least `attenuationDb` (k is the selectivity modulus).
 *
 * @param order - filter order, integer 1-24
 * @param options - `{ rippleDb, attenuationDb }` in dB, with 0 < rippleDb < attenuationDb
 * @returns the stopband edge in rad/s (greater than 1)
 * @throws {@link InvalidArgumentError} as {@link elliptic}
 * @example
 * ```ts
 * ellipticStopbandEdge(4, { rippleDb: 0.5, attenuationDb: 40 }); //=> 1.6284199287715448
 * ```
 */
export function ellipticStopbandEdge(order: number, options: EllipticOptions): number {
  const { rp, as } = checkEllipticArgs("ellipticStopbandEdge", order, options);
  return 1 / ellipticCore(order, rp, as).k;
}
