/**
 * Plain-data types for analog transfer functions: zeros/poles/gain and
 * first- and second-order sections. Frequencies are angular (rad/s).
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";

/**
 * An analog transfer function in zeros/poles/gain form,
 * `H(s) = gain * prod(s - zeros[i]) / prod(s - poles[j])`, in rad/s.
 * Complex zeros and poles appear in conjugate pairs; `gain` is real.
 */
export interface Zpk {
  /** Finite zeros (rad/s). */
  readonly zeros: readonly Complex[];
  /** Poles (rad/s), all in the open left half-plane for a stable filter. */
  readonly poles: readonly Complex[];
  /** Real gain factor `k`. */
  readonly gain: number;
}

/**
 * What a section does on its own.
 * - `lowpass`: numerator constant.
 * - `highpass`: numerator `s^n`.
 * - `bandpass`: numerator `b1 s` (second order only).
 * - `notch`: numerator `s^2 + wz^2` (zeros on the jw axis); see {@link NotchType}.
 * - `allpass`: numerator is the denominator mirrored (`s^2 - (w0/Q) s + w0^2`, or `s - w0`).
 * - `general`: any other numerator.
 */
export type SectionKind = "lowpass" | "highpass" | "bandpass" | "notch" | "allpass" | "general";

/**
 * Where a notch section's zero lies relative to its pole frequency:
 * `lowpass-notch` (wz > w0, used by inverse Chebyshev and elliptic lowpass
 * cascades), `highpass-notch` (wz < w0), or `symmetric` (wz = w0 within 1e-9).
 */
export type NotchType = "lowpass-notch" | "highpass-notch" | "symmetric";

/**
 * A first-order section `(b1 s + b0) / (s + w0)`.
 * Coefficients are stored as length-3 arrays in descending powers of s with a
 * leading zero, so first- and second-order sections share one layout.
 */
export interface FirstOrderSection {
  /** Section order. */
  readonly order: 1;
  /** Numerator `[0, b1, b0]`, descending powers of s. */
  readonly num: readonly [number, number, number];
  /** Denominator `[0, 1, w0]`, descending powers of s. */
  readonly den: readonly [number, number, number];
  /** Pole frequency (rad/s): the pole is at `-w0`. */
  readonly w0: number;
  /** What the section does. */
  readonly kind: "lowpass" | "highpass" | "allpass" | "general";
}

/**
 * A second-order section `(b2 s^2 + b1 s + b0) / (s^2 + (w0/Q) s + w0^2)`.
 */
export interface SecondOrderSection {
  /** Section order. */
  readonly order: 2;
  /** Numerator `[b2, b1, b0]`, descending powers of s. */
  readonly num: readonly [number, number, number];
  /** Denominator `[1, w0/Q, w0^2]`, descending powers of s. */
  readonly den: readonly [number, number, number];
  /** Pole frequency (rad/s). */
  readonly w0: number;
  /** Pole quality factor Q. */
  readonly q: number;
  /** What the section does. */
  readonly kind: SectionKind;
  /** Zero frequency (rad/s) of a `notch` section's jw-axis zero pair. */
  readonly wz?: number;
  /** For a `notch` section, where the zero lies relative to w0. */
  readonly notchType?: NotchType;
}

/** A first- or second-order section. */
export type Section = FirstOrderSection | SecondOrderSection;

/**
 * A cascade of sections with an overall real gain:
 * `H(s) = gain * prod(section_i(s))`.
 */
export interface SectionCascade {
  /** The sections, in cascade order. */
  readonly sections: readonly Section[];
  /** Overall real gain factor applied to the product of the sections. */
  readonly gain: number;
}
