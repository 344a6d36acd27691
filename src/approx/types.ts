/**
 * Types shared by the approximation families: family names, what 1 rad/s
 * means for each normalised prototype, and the per-family options.
 *
 * @module
 */

/** The approximation families this layer designs. */
export type FamilyName = "butterworth" | "chebyshev1" | "chebyshev2" | "elliptic" | "bessel" | "legendre";

/** Every family name, in a stable order (for menus, loops and validation). */
export const FAMILY_NAMES: readonly FamilyName[] = Object.freeze([
  "butterworth",
  "chebyshev1",
  "chebyshev2",
  "elliptic",
  "bessel",
  "legendre",
] as const);

/**
 * What the frequency 1 rad/s is on a normalised prototype.
 * - `"-3dB"`: the magnitude is 1/sqrt(2) (-3.0103 dB) there (Butterworth,
 *   Legendre, Bessel with `normalization: "magnitude"`).
 * - `"passband-edge"`: the end of the equiripple passband, where the loss equals
 *   the passband ripple (Chebyshev I, elliptic).
 * - `"stopband-edge"`: the start of the equiripple stopband, where the
 *   attenuation equals the requested stopband attenuation (Chebyshev II).
 * - `"unit-delay"`: the group delay at DC is 1 s (Bessel, `"delay"`).
 * - `"asymptote-intersection"`: the low-frequency (0 dB) and high-frequency
 *   (-20 n log10 w) magnitude asymptotes meet at 1 rad/s, as for Butterworth, so
 *   the phase is close to its midpoint -n pi/4 there (Bessel, `"phase"`).
 */
export type UnitFrequencyMeaning =
  | "-3dB"
  | "passband-edge"
  | "stopband-edge"
  | "unit-delay"
  | "asymptote-intersection";

/** Normalisation of the Bessel-Thomson prototype. */
export type BesselNormalization = "delay" | "magnitude" | "phase";

/** Options of {@link chebyshev1}. */
export interface Chebyshev1Options {
  /** Peak-to-peak passband ripple in dB, greater than 0 (and at most 40). */
  readonly rippleDb: number;
}

/** Options of {@link chebyshev2}. */
export interface Chebyshev2Options {
  /** Minimum stopband attenuation in dB, greater than 0 (and at most 400). */
  readonly attenuationDb: number;
}

/** Options of {@link elliptic}. */
export interface EllipticOptions {
  /** Peak-to-peak passband ripple in dB, greater than 0. */
  readonly rippleDb: number;
  /** Minimum stopband attenuation in dB, greater than `rippleDb`. */
  readonly attenuationDb: number;
}

/** Options of {@link bessel}. */
export interface BesselOptions {
  /**
   * Which frequency is 1 rad/s: `"delay"` (group delay 1 s at DC), `"magnitude"`
   * (-3 dB at 1 rad/s) or `"phase"` (Butterworth-matched asymptotes, scipy's default).
   * @defaultValue "phase"
   */
  readonly normalization?: BesselNormalization;
}
