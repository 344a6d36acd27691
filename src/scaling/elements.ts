/**
 * The minimal element shape that magnitude and frequency scaling act on.
 * The circuit model (`src/circuit/`) extends it with nodes; scaling only needs
 * to know an element's kind and value.
 *
 * @module
 */

/** Kinds of passive element that scaling changes. */
export type PassiveKind = "R" | "C" | "L";

/**
 * A passive element as scaling sees it: a reference designator, a kind and a
 * value in SI units (ohms, farads, henries). Other element kinds (sources,
 * op-amps) carry a different `kind` and pass through scaling unchanged.
 */
export interface ScalableElement {
  /** Reference designator, e.g. `"R1"`. */
  readonly name: string;
  /** Element kind; only `R`, `C` and `L` are scaled. */
  readonly kind: string;
  /** Value in SI units; present on R, C and L. */
  readonly value?: number;
}
