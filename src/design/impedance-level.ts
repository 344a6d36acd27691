/**
 * The impedance level a filter's parts are chosen at when the spec gives no
 * resistor window, and the limits no part of a design may pass unless the
 * spec widens its windows.
 *
 * Rule (common practice, no source): the resistors' geometric centre is
 * 10 kΩ at 1.59 kHz (where 10 kΩ and 10 nF set the frequency: the centre of
 * the old fixed window 1 kΩ-100 kΩ) and moves half a decade per decade of
 * frequency, `10 kΩ · sqrt(1.59 kHz / f)`, so resistors and capacitors share
 * the scaling; it is held between 2 kΩ and 316 kΩ, and the window spans a
 * decade either side of it. The reasoning:
 * - at low frequency a low impedance needs large capacitors (microfarads at
 *   a few hertz), which are big, leaky and only available in wide-tolerance
 *   dielectrics, so the resistors go up (to about a megohm, where op-amp
 *   bias current and resistor noise start to matter);
 * - at high frequency a high impedance leaves capacitors of a few picofarads,
 *   comparable with board and op-amp input capacitance, so the resistors go
 *   down (to a few hundred ohms, where op-amp output drive starts to matter);
 * - resistor noise grows with the level, op-amp current noise and bias
 *   current matter more above a megohm, so neither end is pushed further.
 * Capacitors default to 10 pF-10 µF, the values film and C0G/NP0 ceramic
 * parts come in; values above 1 µF are avoided where the window allows.
 *
 * @module
 */
import type { ValueWindow } from "./spec-types.ts";

/**
 * The resistor limits no BOM passes unless the spec's own window is wider (common practice, no source).
 *
 * @example
 * ```ts
 * RESISTOR_LIMITS; //=> { min: 100, max: 10000000 }
 * ```
 */
export const RESISTOR_LIMITS: ValueWindow = Object.freeze({ min: 100, max: 10e6 });

/**
 * The capacitor limits no BOM passes unless the spec's own window is wider (film and C0G parts; common practice, no source).
 *
 * @example
 * ```ts
 * CAPACITOR_LIMITS; //=> { min: 1e-11, max: 0.00001 }
 * ```
 */
export const CAPACITOR_LIMITS: ValueWindow = Object.freeze({ min: 10e-12, max: 10e-6 });

/** The capacitor above which a design is avoided when another impedance level does without it (common practice, no source). */
export const PREFERRED_CAPACITOR_MAX = 1e-6;

/** The frequency at which the default window's centre is 10 kΩ: 1 / (2π · 10 kΩ · 10 nF), Hz. */
const LEVEL_REFERENCE_HZ = 1 / (2 * Math.PI * 1e4 * 10e-9);
/** Lowest and highest centre of the default resistor window, ohms. */
const CENTRE_RANGE = [2e3, 316e3] as const;

/**
 * The default resistor window for a filter at `frequencyHz`: a decade either
 * side of `10 kΩ · sqrt(1.59 kHz / f)` held between 2 kΩ and 316 kΩ, inside
 * {@link RESISTOR_LIMITS}.
 *
 * @param frequencyHz - the filter's characteristic frequency (geometric mean of its band edges), Hz
 * @returns the window, ohms
 * @example
 * ```ts
 * defaultResistorWindow(1); //=> { min: 31600, max: 3160000 }
 * defaultResistorWindow(1000); //=> { min: 1261.6..., max: 126156.6... }
 * defaultResistorWindow(200_000); //=> { min: 200, max: 20000 }
 * ```
 */
export function defaultResistorWindow(frequencyHz: number): ValueWindow {
  const raw = Number.isFinite(frequencyHz) && frequencyHz > 0 ? 1e4 * Math.sqrt(LEVEL_REFERENCE_HZ / frequencyHz) : 1e4;
  const centre = Math.min(CENTRE_RANGE[1], Math.max(CENTRE_RANGE[0], raw));
  return Object.freeze({ min: Math.max(RESISTOR_LIMITS.min, centre / 10), max: Math.min(RESISTOR_LIMITS.max, centre * 10) });
}

/**
 * The filter's characteristic frequency for the impedance level: the
 * geometric mean of its band edges.
 *
 * @param edgesHz - every passband and stopband edge, Hz
 * @returns the geometric mean, or NaN when there is no valid edge
 * @example
 * ```ts
 * characteristicFrequencyHz([1000, 4000]); //=> 2000
 * ```
 */
export function characteristicFrequencyHz(edgesHz: readonly number[]): number {
  const ok = edgesHz.filter((f) => Number.isFinite(f) && f > 0);
  if (ok.length === 0) return NaN;
  return Math.exp(ok.reduce((s, f) => s + Math.log(f), 0) / ok.length);
}

/** The hard limits of a design's parts: the library's limits, widened to the spec's windows. */
export interface PartLimits {
  /** Resistors, ohms. */
  readonly resistor: ValueWindow;
  /** Capacitors, farads. */
  readonly capacitor: ValueWindow;
}

/**
 * The limits no part of a design passes: {@link RESISTOR_LIMITS} and
 * {@link CAPACITOR_LIMITS}, widened to the spec's windows where those are
 * wider (a window the user widened is theirs to use).
 *
 * @param spec - the windows of a canonical spec
 * @returns the limits
 * @example
 * ```ts
 * partLimits({ resistorRange: { min: 1e3, max: 1e5 }, capacitorRange: { min: 1e-12, max: 1e-6 } });
 * //=> { resistor: { min: 100, max: 10000000 }, capacitor: { min: 1e-12, max: 0.00001 } }
 * ```
 */
export function partLimits(spec: { readonly resistorRange: ValueWindow; readonly capacitorRange: ValueWindow }): PartLimits {
  return {
    resistor: { min: Math.min(RESISTOR_LIMITS.min, spec.resistorRange.min), max: Math.max(RESISTOR_LIMITS.max, spec.resistorRange.max) },
    capacitor: { min: Math.min(CAPACITOR_LIMITS.min, spec.capacitorRange.min), max: Math.max(CAPACITOR_LIMITS.max, spec.capacitorRange.max) },
  };
}
