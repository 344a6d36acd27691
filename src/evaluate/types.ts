/**
 * The evaluation layer's own input types: stages as real rational functions,
 * mask bands, part spreads. Nothing here imports the design or analysis
 * layers; those convert their data into these.
 *
 * @module
 */

/**
 * A real rational function of s stored in the scaled variable `z = s / scale`:
 * `H(s) = num(z) / den(z)`, coefficients in descending powers (numpy's
 * convention). The scale keeps the coefficients near unity.
 */
export interface ScaledRational {
  /** Numerator coefficients, descending powers of z. */
  readonly num: Float64Array;
  /** Denominator coefficients, descending powers of z. */
  readonly den: Float64Array;
  /** The scale (rad/s): z = s / scale. */
  readonly scale: number;
}
