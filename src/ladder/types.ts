/**
 * Plain-data types of doubly terminated LC ladders: the normalised lowpass
 * prototype (1 rad/s, source resistance 1 ohm unless given) as a list of
 * elements in order from the source end.
 *
 * @module
 */
import type { Zpk } from "../tf/types.ts";
import type { FamilyName } from "../approx/types.ts";

/** Which arm comes first from the source end. */
export type LadderForm = "series-first" | "shunt-first";

/** Every ladder form, in a stable order. */
export const LADDER_FORMS: readonly LadderForm[] = Object.freeze(["series-first", "shunt-first"] as const);

/**
 * One arm of a normalised lowpass ladder.
 * - `"series-L"`: an inductor in the series path (henries); with `parallelC`, a
 *   capacitor across it (a parallel tank in the series arm: a transmission zero
 *   at 1/sqrt(value * parallelC) rad/s).
 * - `"shunt-C"`: a capacitor to ground (farads); with `seriesL`, an inductor in
 *   series with it (a series resonator in the shunt arm: a transmission zero at
 *   1/sqrt(value * seriesL) rad/s).
 */
export type LadderElementKind = "series-L" | "shunt-C";

/** One arm of a normalised lowpass ladder; see {@link LadderElementKind}. */
export interface LadderElement {
  /** Arm kind. */
  readonly kind: LadderElementKind;
  /** Inductance (H) of a `"series-L"` arm or capacitance (F) of a `"shunt-C"` arm, > 0. */
  readonly value: number;
  /** Capacitance (F) across a `"series-L"` arm; absent when the arm has no transmission zero. */
  readonly parallelC?: number;
  /** Inductance (H) in series with a `"shunt-C"` arm; absent when the arm has no transmission zero. */
  readonly seriesL?: number;
}

/** A doubly terminated lowpass ladder, normalised to 1 rad/s. */
export interface LadderPrototype {
  /** Approximation family the ladder realises. */
  readonly family: FamilyName;
  /** Order (number of reactive arms counted as the degree of the transfer function). */
  readonly order: number;
  /** Which arm comes first from the source end. */
  readonly form: LadderForm;
  /** The arms in order from the source end. */
  readonly elements: readonly LadderElement[];
  /** Source resistance in ohms. */
  readonly sourceOhms: number;
  /** Load resistance in ohms. */
  readonly loadOhms: number;
  /**
   * The voltage transfer function V(load) / V(source emf) the ladder realises,
   * exactly (at DC an all-pole ladder gives loadOhms / (sourceOhms + loadOhms)).
   */
  readonly transfer: Zpk;
  /**
   * `"type-b"` when the ladder realises the modified even-order form of an
   * elliptic or Chebyshev II prototype (the highest transmission zero moved
   * to infinity and the lowest reflection zero to DC by a frequency
   * transformation; `transfer` is that form's); absent otherwise.
   */
  readonly variant?: "type-b";
}
