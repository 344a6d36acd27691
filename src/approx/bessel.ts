/**
 * Bessel-Thomson (maximally flat group delay) lowpass prototype.
 *
 * Method: H(s) = theta_n(0) / theta_n(s), theta_n the reverse Bessel
 * polynomial (W. E. Thomson, "Delay networks having maximally flat frequency
 * characteristics", Proc. IEE 96(3), 1949, pp. 487-490). Poles are the roots of
 * theta_n from {@link reverseBesselRoots} (Aberth iteration on exact
 * double-double coefficients, ~1e-15 relative up to order 30). Three
 * normalisations, as scipy.signal.besselap: "delay" (group delay 1 s at DC),
 * "phase" (poles scaled by theta_n(0)^(-1/n): the high-frequency asymptote
 * equals Butterworth's and the phase is -n pi/4 near 1 rad/s) and "magnitude"
 * (-3 dB at 1 rad/s; the -3 dB frequency found by a bracketing Illinois root
 * finder on the magnitude, which is monotonic).
 * Magnitude and group delay without roots (for order searches) use the
 * three-term recurrence theta_n = (2n - 1) theta_{n-1} + s^2 theta_{n-2}
 * (H. L. Krall and O. Frink, "A new class of orthogonal polynomials: the
 * Bessel polynomials", Trans. AMS 65, 1949, pp. 100-115), scaled by
 * theta_n(0) = (2n - 1)!! so that no term overflows.
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";
import { reverseBesselRoots } from "../math/bessel.ts";
import type { Zpk } from "../tf/types.ts";
import { requireInteger, requireOneOf, requireOptions } from "../validate.ts";
import { EDGE_SEARCH, freezeZpk } from "./internal.ts";
import { bracketRoot } from "../math/bracket.ts";
import type { BesselNormalization, BesselOptions } from "./types.ts";

/**
 * Highest order of the Bessel-Thomson filter prototype: the order limit of
 * {@link bessel}, of `prototype` for the Bessel family and so of every Bessel
 * design. Up to this order the poles are accurate to about 1e-15 relative
 * (checked against mpmath at 50 digits); the reverse Bessel polynomial
 * helpers underneath go further, to `REVERSE_BESSEL_MAX_ORDER` in
 * `math/bessel.ts`, at lower accuracy (a few times 1e-12 at order 40), which
 * this prototype does not accept.
 */
export const BESSEL_MAX_ORDER = 30;

/** Accepted Bessel normalisations. */
export const BESSEL_NORMALIZATIONS: readonly BesselNormalization[] = Object.freeze(["delay", "magnitude", "phase"] as const);

/** ln theta_n(0) = ln (2n - 1)!! */
export function besselLogA0(order: number): number {
  let s = 0;
  for (let k = 1; k <= order; k++) s += Math.log(2 * k - 1);
  return s;
}

/** theta_n(0) = (2n - 1)!! rounded once to double (exact BigInt product). */
function besselA0(order: number): number {
  let a = 1n;
  for (let k = 1n; k <= BigInt(order); k++) a *= 2n * k - 1n;
  return Number(a);
}

/**
 * T_n(jw) = theta_n(jw) / theta_n(0) for the delay-normalised prototype, and
 * its derivative with respect to s, by the scaled recurrence
 * T_n = T_{n-1} + s^2 T_{n-2} / ((2n - 1)(2n - 3)).
 */
function besselT(order: number, w: number): { t: Complex; dt: Complex } {
  // s = jw, s^2 = -w^2 (real)
  const s2 = -w * w;
  // T_0 = 1, T_1 = 1 + s
  let pr = 1;
  let pi = 0;
  let dpr = 0;
  let dpi = 0;
  let cr = 1;
  let ci = w;
  let dcr = 1;
  let dci = 0;
  for (let n = 2; n <= order; n++) {
    const f = 1 / ((2 * n - 1) * (2 * n - 3));
    const nr = cr + s2 * pr * f;
    const ni = ci + s2 * pi * f;
    // d/ds (s^2 T) = 2 s T + s^2 T'; 2 s T = 2 j w (pr + j pi) = -2 w pi + j 2 w pr
    const ndr = dcr + f * (-2 * w * pi + s2 * dpr);
    const ndi = dci + f * (2 * w * pr + s2 * dpi);
    pr = cr;
    pi = ci;
    dpr = dcr;
    dpi = dci;
    cr = nr;
    ci = ni;
    dcr = ndr;
    dci = ndi;
  }
  return { t: { re: cr, im: ci }, dt: { re: dcr, im: dci } };
}

/** |H(jw)| of the delay-normalised Bessel prototype, without computing roots. */
export function besselDelayMagnitude(order: number, w: number): number {
  const { t } = besselT(order, w);
  return 1 / Math.hypot(t.re, t.im);
}

/** Group delay (s) of the delay-normalised Bessel prototype at w, without computing roots. */
export function besselDelayGroupDelay(order: number, w: number): number {
  const { t, dt } = besselT(order, w);
  // tau = Re(T'(jw) / T(jw))
  return (dt.re * t.re + dt.im * t.im) / (t.re * t.re + t.im * t.im);
}

/** -3 dB frequency of the delay-normalised prototype (rad/s). */
export function besselDelay3dB(order: number): number {
  const target = Math.SQRT1_2;
  const f = (w: number): number => Math.log(besselDelayMagnitude(order, w) / target);
  let hi = 2 + Math.sqrt(order);
  while (f(hi) > 0) hi *= 2;
  return bracketRoot(f, 1e-3, hi, EDGE_SEARCH);
}

/**
 * Frequency scale from the delay normalisation to `norm`: the prototype in
 * normalisation `norm` is H_delay(s * factor), i.e. its poles are the delay
 * poles divided by `factor`.
 */
export function besselScale(order: number, norm: BesselNormalization): number {
  if (norm === "delay") return 1;
  if (norm === "phase") return Math.exp(besselLogA0(order) / order);
  let w = w3Cache.get(order);
  if (w === undefined) {
    w = besselDelay3dB(order);
    w3Cache.set(order, w);
  }
  return w;
}

const w3Cache = new Map<number, number>();

/**
 * Bessel-Thomson lowpass prototype (maximally flat group delay), with 1 rad/s
 * placed by the chosen normalisation as scipy.signal.besselap: `"phase"`
 * (default; Butterworth-matched asymptotes), `"delay"` (group delay 1 s at DC)
 * or `"magnitude"` (-3 dB at 1 rad/s). DC gain is 1 in every normalisation.
 *
 * @param order - filter order, integer from 1 to {@link BESSEL_MAX_ORDER} (30)
 * @param options - `{ normalization }`
 * @returns the prototype as zeros/poles/gain (rad/s)
 * @throws {@link InvalidArgumentError} when the order is out of range or the normalisation unknown
 * @example
 * ```ts
 * bessel(2, { normalization: "delay" });
 * //=> { zeros: [], poles: [{ re: -1.5, im: 0.8660254037844386 }, { re: -1.5, im: -0.8660254037844386 }], gain: 3 }
 * ```
 */
export function bessel(order: number, options?: BesselOptions): Zpk {
  const fn = "bessel";
  requireInteger(fn, "order", order, { min: 1, max: BESSEL_MAX_ORDER });
  const opts = requireOptions(fn, "options", options);
  const norm =
    opts["normalization"] === undefined
      ? "phase"
      : requireOneOf(fn, "options.normalization", opts["normalization"], BESSEL_NORMALIZATIONS);
  return besselUnchecked(order, norm);
}

const rootCache = new Map<number, readonly Complex[]>();

/** Delay-normalised poles, computed once per order (the cached values are never handed out). */
function delayPoles(order: number): readonly Complex[] {
  let r = rootCache.get(order);
  if (r === undefined) {
    r = Object.freeze(reverseBesselRoots(order).map((p) => Object.freeze({ re: p.re, im: p.im })));
    rootCache.set(order, r);
  }
  return r;
}

/** {@link bessel} without argument checks. */
export function besselUnchecked(order: number, norm: BesselNormalization): Zpk {
  const roots = delayPoles(order);
  if (norm === "delay") return freezeZpk([], roots, besselA0(order));
  const factor = besselScale(order, norm);
  const poles = roots.map((p) => ({ re: p.re / factor, im: p.im / factor }));
  // H(0) = 1: gain = prod(-p) = theta_n(0) / factor^n (exactly 1 for "phase").
  const gain = norm === "phase" ? 1 : Math.exp(besselLogA0(order) - order * Math.log(factor));
  return freezeZpk([], poles, gain);
}
