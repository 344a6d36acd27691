/**
 * The reader of a spec's signal levels (`levels`): the largest input
 * amplitude and the op-amps' output swing, both in volts peak, for the
 * clipping check of every op-amp output, and the op-amps' noise densities
 * for the dynamic range.
 *
 * Defaults that are rules of thumb rather than published values are marked
 * "common practice, no source".
 *
 * @module
 */
import { isObject, Reader } from "./spec-readers.ts";
import type { SignalLevels } from "./spec-types.ts";

/** Input amplitude assumed when `levels` omits it, volts peak (the 1 V convention of the op-amp requirements). */
export const DEFAULT_INPUT_PEAK_V = 1;
/** Output swing assumed when `levels` omits it, volts peak (common practice, no source: +-15 V supplies keep about +-10 V of clean swing). */
export const DEFAULT_OUTPUT_SWING_V = 10;
/** Largest level accepted, volts peak (op-amp filters beyond a hundred volts are not this library's business). */
export const MAX_LEVEL_V = 100;

const LEVEL_KEYS = ["inputPeakV", "outputSwingV", "opampVoltageNoise", "opampCurrentNoise"] as const;

/** Largest op-amp noise densities accepted: 1 mV/sqrt(Hz) and 1 uA/sqrt(Hz) (the ranges `noiseAnalysis` takes). */
export const MAX_OPAMP_NOISE = { voltage: 1e-3, current: 1e-6 } as const;

/** An op-amp noise density (0 when absent); undefined on error. */
function density(r: Reader, path: string, raw: unknown, unit: string, max: number): number | undefined {
  if (raw === undefined) return 0;
  const v = r.quantity(path, raw, unit);
  if (v === undefined) return undefined;
  if (!(v >= 0 && v <= max)) {
    r.add(path, `expected a noise density from 0 to ${max} ${unit}/sqrt(Hz)`, raw);
    return undefined;
  }
  return v;
}

/** A level in volts peak: finite, above zero and at most {@link MAX_LEVEL_V}; undefined on error. */
function level(r: Reader, path: string, value: number | undefined, raw: unknown): number | undefined {
  if (value === undefined) return undefined;
  if (!(value <= MAX_LEVEL_V)) {
    r.add(path, `expected a level in volts peak greater than 0 and at most ${MAX_LEVEL_V} V`, raw);
    return undefined;
  }
  return value;
}

/**
 * The signal levels (`levels`): `null` when absent; each field checked, the
 * missing ones given their defaults.
 *
 * @param r - the issue collector
 * @param raw - the value of the spec's `levels` field
 * @returns the canonical levels, or null
 */
export function readLevels(r: Reader, raw: unknown): SignalLevels | null {
  if (raw === undefined) return null;
  if (!isObject(raw)) {
    r.add("levels", "expected an object { inputPeakV, outputSwingV } (volts peak), optionally with opampVoltageNoise / opampCurrentNoise", raw);
    return null;
  }
  r.unknownKeys(raw, LEVEL_KEYS, "levels.");
  const input = raw["inputPeakV"];
  const swing = raw["outputSwingV"];
  const inputPeakV =
    input === undefined ? DEFAULT_INPUT_PEAK_V : level(r, "levels.inputPeakV", r.quantity("levels.inputPeakV", input, "V"), input);
  const outputSwingV =
    swing === undefined
      ? DEFAULT_OUTPUT_SWING_V
      : level(r, "levels.outputSwingV", r.number("levels.outputSwingV", swing, { min: 0, max: MAX_LEVEL_V, exclusiveMin: true }, "an output swing in volts peak"), swing);
  const opampVoltageNoise = density(r, "levels.opampVoltageNoise", raw["opampVoltageNoise"], "V", MAX_OPAMP_NOISE.voltage);
  const opampCurrentNoise = density(r, "levels.opampCurrentNoise", raw["opampCurrentNoise"], "A", MAX_OPAMP_NOISE.current);
  if (inputPeakV === undefined || outputSwingV === undefined || opampVoltageNoise === undefined || opampCurrentNoise === undefined) return null;
  return Object.freeze({ inputPeakV, outputSwingV, opampVoltageNoise, opampCurrentNoise });
}
