/**
 * Magnitude and frequency scaling of element values, and the constants that
 * move a normalised prototype to a target frequency and impedance level.
 *
 * @module
 */
export type { PassiveKind, ScalableElement } from "./elements.ts";
export { scaleValue, scaleElements } from "./scale.ts";
export type { ScalingOptions } from "./scale.ts";
export { scalingFor } from "./solve.ts";
export type { FixedPart, ScalingTarget, Scaling } from "./solve.ts";
