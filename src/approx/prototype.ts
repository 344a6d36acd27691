/**
 * One entry point for every family, what 1 rad/s means on each prototype,
 * and moving a prototype so that it is a chosen number of dB down at 1 rad/s
 * (to compare families on equal terms, e.g. all at their -3 dB point).
 *
 * @module
 */
import type { Zpk } from "../tf/types.ts";
import { InvalidArgumentError } from "../errors.ts";
import { requireInRange, requireInteger, requireOneOf, requireOptions, requirePositive } from "../validate.ts";
import { requireZpk } from "../tf/check.ts";
import { BESSEL_MAX_ORDER, BESSEL_NORMALIZATIONS, besselUnchecked } from "./bessel.ts";
import { butterworth, BUTTERWORTH_MAX_ORDER } from "./butterworth.ts";
import { chebyshev1, CHEBYSHEV1_MAX_ORDER, MAX_RIPPLE_DB, MIN_RIPPLE_DB } from "./chebyshev1.ts";
import { chebyshev2, CHEBYSHEV2_MAX_ORDER, MAX_ATTENUATION_DB } from "./chebyshev2.ts";
import { elliptic, ELLIPTIC_MAX_ORDER } from "./elliptic.ts";
import { EDGE_SEARCH, requireAttenuationAboveRipple, scaleZpk, zpkMagnitude } from "./internal.ts";
import { bracketRoot } from "../math/bracket.ts";
import { legendre, LEGENDRE_MAX_ORDER } from "./legendre.ts";
import { FAMILY_NAMES, type BesselNormalization, type FamilyName, type UnitFrequencyMeaning } from "./types.ts";

/** Arguments of {@link prototype}. Fields a family does not use are ignored. */
export interface PrototypeSpec {
  /** Approximation family. */
  readonly family: FamilyName;
  /** Filter order, from 1 to {@link familyMaxOrder} of the family. */
  readonly order: number;
  /** Passband ripple in dB; required by `chebyshev1` and `elliptic`. */
  readonly rippleDb?: number;
  /** Stopband attenuation in dB; required by `chebyshev2` and `elliptic`. */
  readonly attenuationDb?: number;
  /**
   * Bessel normalisation (ignored by other families).
   * @defaultValue "phase"
   */
  readonly normalization?: BesselNormalization;
}

const MAX_ORDERS: Readonly<Record<FamilyName, number>> = Object.freeze({
  butterworth: BUTTERWORTH_MAX_ORDER,
  chebyshev1: CHEBYSHEV1_MAX_ORDER,
  chebyshev2: CHEBYSHEV2_MAX_ORDER,
  elliptic: ELLIPTIC_MAX_ORDER,
  bessel: BESSEL_MAX_ORDER,
  legendre: LEGENDRE_MAX_ORDER,
});

/**
 * Highest order this layer builds for a family (64 for Butterworth and
 * Chebyshev, 24 elliptic, 30 Bessel, 20 Legendre).
 *
 * @param family - family name
 * @returns the highest supported order
 * @throws {@link InvalidArgumentError} when `family` is not a known family
 * @example
 * ```ts
 * familyMaxOrder("elliptic"); //=> 24
 * ```
 */
export function familyMaxOrder(family: FamilyName): number {
  return MAX_ORDERS[requireOneOf("familyMaxOrder", "family", family, FAMILY_NAMES)];
}

/**
 * Normalised lowpass prototype of any family, by name.
 *
 * @param spec - family, order and the family's parameters
 * @returns the prototype as zeros/poles/gain (rad/s), 1 rad/s placed as {@link unitFrequencyMeaning} says
 * @throws {@link InvalidArgumentError} when the family is unknown, the order out of the family's range,
 *   or a parameter the family needs is missing or out of range (the path names the field)
 * @example
 * ```ts
 * prototype({ family: "chebyshev1", order: 1, rippleDb: 3 }).poles; //=> [{ re: -1.0023772930076005, im: 0 }]
 * ```
 */
export function prototype(spec: PrototypeSpec): Zpk {
  return checkedPrototype("prototype", spec);
}

/**
 * {@link prototype} with the validation errors naming another public
 * function `fn` (for callers that take the same family fields, such as the
 * ladder synthesis). Not exported from the layer index.
 *
 * @param fn - public function name for the errors
 * @param spec - family, order and the family's parameters (unknown input)
 * @returns the prototype
 * @throws {@link InvalidArgumentError} as {@link prototype}, naming `fn`
 * @example
 * ```ts
 * checkedPrototype("ladderPrototype", { family: "butterworth", order: 2 }).poles.length; //=> 2
 * ```
 */
export function checkedPrototype(fn: string, spec: unknown): Zpk {
  const s = requireOptions(fn, "", spec);
  const family = requireOneOf(fn, "family", s["family"], FAMILY_NAMES);
  const order = requireInteger(fn, "order", s["order"], { min: 1, max: MAX_ORDERS[family] });
  const ripple = (): number =>
    requireInRange(fn, "rippleDb", s["rippleDb"], { min: MIN_RIPPLE_DB, max: MAX_RIPPLE_DB });
  const atten = (): number =>
    requireInRange(fn, "attenuationDb", s["attenuationDb"], { min: MIN_RIPPLE_DB, max: MAX_ATTENUATION_DB });
  switch (family) {
    case "butterworth":
      return butterworth(order);
    case "chebyshev1":
      return chebyshev1(order, { rippleDb: ripple() });
    case "chebyshev2":
      return chebyshev2(order, { attenuationDb: atten() });
    case "elliptic": {
      const rippleDb = ripple();
      const attenuationDb = atten();
      requireAttenuationAboveRipple(fn, "attenuationDb", { rippleDb, attenuationDb });
      return elliptic(order, { rippleDb, attenuationDb });
    }
    case "bessel": {
      const norm =
        s["normalization"] === undefined ? "phase" : requireOneOf(fn, "normalization", s["normalization"], BESSEL_NORMALIZATIONS);
      return besselUnchecked(order, norm);
    }
    case "legendre":
      return legendre(order);
  }
}

/**
 * What 1 rad/s is on a family's normalised prototype: `"-3dB"` (Butterworth,
 * Legendre, Bessel "magnitude"), `"passband-edge"` (Chebyshev I and elliptic:
 * the loss equals the ripple there), `"stopband-edge"` (Chebyshev II: the
 * attenuation equals the requested value there), `"unit-delay"` (Bessel
 * "delay": group delay 1 s at DC) or `"asymptote-intersection"` (Bessel
 * "phase", the default: magnitude asymptotes meet at 1 rad/s as for Butterworth).
 *
 * @param family - family name
 * @param normalization - Bessel normalisation (ignored for other families)
 * @returns the meaning of 1 rad/s
 * @throws {@link InvalidArgumentError} when the family or normalisation is unknown
 * @example
 * ```ts
 * unitFrequencyMeaning("chebyshev2"); //=> "stopband-edge"
 * unitFrequencyMeaning("bessel", "delay"); //=> "unit-delay"
 * ```
 */
export function unitFrequencyMeaning(family: FamilyName, normalization?: BesselNormalization): UnitFrequencyMeaning {
  const fn = "unitFrequencyMeaning";
  const f = requireOneOf(fn, "family", family, FAMILY_NAMES);
  switch (f) {
    case "butterworth":
    case "legendre":
      return "-3dB";
    case "chebyshev1":
    case "elliptic":
      return "passband-edge";
    case "chebyshev2":
      return "stopband-edge";
    case "bessel": {
      const n = normalization === undefined ? "phase" : requireOneOf(fn, "normalization", normalization, BESSEL_NORMALIZATIONS);
      return n === "delay" ? "unit-delay" : n === "magnitude" ? "-3dB" : "asymptote-intersection";
    }
  }
}

/** Options of {@link attenuationFrequency} and {@link rescaleToAttenuation}. */
export interface AttenuationPointOptions {
  /** Loss in dB below 0 dB (unit gain) that should fall at the frequency sought; greater than 0. */
  readonly attenuationDb: number;
}

const GRID_PER_DECADE = 200;
const GRID_LOW = 1e-6;
const GRID_DECADES = 12;

/**
 * The first frequency, rising from DC, at which a response is `attenuationDb`
 * dB below unit gain (0 dB). Every prototype of this layer peaks at exactly
 * 0 dB in its passband, so this is the usual "X dB frequency". The crossing is
 * located on a grid of 200 points per decade from 1e-6 to 1e6 rad/s and then
 * refined to full precision by a bracketing root finder.
 *
 * @param zpk - any stable zeros/poles/gain
 * @param options - `{ attenuationDb }`
 * @returns the frequency in rad/s
 * @throws {@link InvalidArgumentError} when the loss at DC already reaches the level, or
 *   the response never falls that far between 1e-6 and 1e6 rad/s
 * @example
 * ```ts
 * attenuationFrequency(butterworth(4), { attenuationDb: 10 * Math.log10(2) }); //=> 1
 * ```
 */
export function attenuationFrequency(zpk: Zpk, options: AttenuationPointOptions): number {
  return attenuationFrequencyImpl("attenuationFrequency", zpk, options);
}

function attenuationFrequencyImpl(fn: string, zpk: Zpk, options: AttenuationPointOptions): number {
  const h = requireZpk(fn, "zpk", zpk);
  const opts = requireOptions(fn, "options", options);
  const a = requirePositive(fn, "options.attenuationDb", opts["attenuationDb"]);
  const target = 10 ** (-a / 20);
  const f = (w: number): number => Math.log(zpkMagnitude(h, w) / target);
  if (!(f(0) > 0)) {
    throw new InvalidArgumentError({
      fn,
      path: "options.attenuationDb",
      received: a,
      message: "the response is already that far down at DC; choose a smaller attenuation",
    });
  }
  let prev = 0;
  for (let i = 0; i <= GRID_PER_DECADE * GRID_DECADES; i++) {
    const w = GRID_LOW * 10 ** (i / GRID_PER_DECADE);
    if (!(f(w) > 0)) return bracketRoot(f, prev, w, EDGE_SEARCH);
    prev = w;
  }
  throw new InvalidArgumentError({
    fn,
    path: "options.attenuationDb",
    received: a,
    message: "the response never falls that far below 0 dB between 1e-6 and 1e6 rad/s",
  });
}

/**
 * Rescale a prototype in frequency so that it is exactly `attenuationDb` dB
 * down at 1 rad/s (first crossing from DC; see {@link attenuationFrequency}).
 * Use `attenuationDb: 10 * Math.log10(2)` to put every family at its -3 dB
 * point, e.g. a Chebyshev I prototype from its ripple edge to its -3 dB point.
 *
 * @param zpk - prototype to move
 * @param options - `{ attenuationDb }`
 * @returns a new zpk with the same shape, scaled in frequency
 * @throws {@link InvalidArgumentError} as {@link attenuationFrequency}
 * @example
 * ```ts
 * const h = rescaleToAttenuation(chebyshev1(4, { rippleDb: 1 }), { attenuationDb: 10 * Math.log10(2) });
 * attenuationFrequency(h, { attenuationDb: 10 * Math.log10(2) }); //=> 1
 * ```
 */
export function rescaleToAttenuation(zpk: Zpk, options: AttenuationPointOptions): Zpk {
  const wa = attenuationFrequencyImpl("rescaleToAttenuation", zpk, options);
  return scaleZpk(zpk, 1 / wa);
}
