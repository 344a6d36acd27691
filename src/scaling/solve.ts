/**
 * Choosing the scaling constants from what the designer fixes.
 *
 * Kf = w_target / w_normalised (w_target = 2 pi f for a target in hertz).
 * Km from one fixed part: a capacitor, Km = C_normalised / (Kf C_actual); a
 * resistor, Km = R_actual / R_normalised; or an impedance level, Km =
 * Z_actual / Z_normalised (the 1 Ω of the prototype becomes Z_actual).
 * Reference: M. E. Van Valkenburg, "Analog Filter Design", 1982, section 2.5,
 * equations (2.54)-(2.56), solved for the constants.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireOptions, requirePositive } from "../validate.ts";
import { TWO_PI } from "../units/index.ts";

/** A normalised value and the actual value it must become. */
export interface FixedPart {
  /** The value in the normalised prototype (ohms or farads, > 0). */
  readonly normalised: number;
  /** The value wanted in the real circuit (> 0). */
  readonly actual: number;
}

/**
 * What the designer fixes. Give exactly one of `targetHz` and `targetW`, and
 * at most one of `capacitor`, `resistor`, `impedance` (none keeps Km = 1).
 */
export interface ScalingTarget {
  /** Frequency, in hertz, that the prototype's reference frequency moves to. */
  readonly targetHz?: number;
  /** Angular frequency, in rad/s, that the prototype's reference frequency moves to. */
  readonly targetW?: number;
  /**
   * The prototype's reference angular frequency (rad/s).
   * @defaultValue 1
   */
  readonly normalisedW?: number;
  /** A capacitor whose actual value is fixed (the usual choice: capacitors come in fewer values). */
  readonly capacitor?: FixedPart;
  /** A resistor whose actual value is fixed. */
  readonly resistor?: FixedPart;
  /** Impedance level in ohms: what 1 Ω of the prototype becomes. */
  readonly impedance?: number;
}

/** The scaling constants (usable directly as the options of `scaleElements`). */
export interface Scaling {
  /** Magnitude (impedance) scaling factor. */
  readonly km: number;
  /** Frequency scaling factor. */
  readonly kf: number;
}

function readFixed(fn: string, path: string, value: unknown): FixedPart {
  const o = requireOptions(fn, path, value);
  if (value === undefined) {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected { normalised, actual }" });
  }
  return {
    normalised: requirePositive(fn, `${path}.normalised`, o["normalised"]),
    actual: requirePositive(fn, `${path}.actual`, o["actual"]),
  };
}

/**
 * Solve for the magnitude and frequency scaling constants.
 *
 * @param target - target frequency (Hz or rad/s), prototype reference
 *   frequency, and at most one fixed capacitor, resistor or impedance level
 * @returns `{ km, kf }`
 * @throws {@link InvalidArgumentError} when neither or both of
 *   `targetHz`/`targetW` are given, more than one of
 *   `capacitor`/`resistor`/`impedance` is given, a number is not positive and
 *   finite, or a constant comes out non-finite
 * @example
 * ```ts
 * // A 1 rad/s prototype moved to 25 kHz with its 1 F capacitors made 4.7 nF:
 * scalingFor({ targetHz: 25e3, capacitor: { normalised: 1, actual: 4.7e-9 } });
 * //=> { km: 1354.51..., kf: 157079.63... }
 * scalingFor({ targetW: 1000, impedance: 10e3 }); //=> { km: 10000, kf: 1000 }
 * ```
 */
export function scalingFor(target: ScalingTarget): Scaling {
  const fn = "scalingFor";
  const t = requireOptions(fn, "target", target);
  const hasHz = t["targetHz"] !== undefined;
  const hasW = t["targetW"] !== undefined;
  if (hasHz === hasW) {
    throw new InvalidArgumentError({
      fn,
      path: hasHz ? "targetW" : "targetHz",
      received: hasHz ? t["targetW"] : undefined,
      message: "give exactly one of targetHz (hertz) and targetW (rad/s)",
    });
  }
  const w = hasHz ? TWO_PI * requirePositive(fn, "targetHz", t["targetHz"]) : requirePositive(fn, "targetW", t["targetW"]);
  const w0 = t["normalisedW"] === undefined ? 1 : requirePositive(fn, "normalisedW", t["normalisedW"]);
  const kf = w / w0;
  const fixed = (["capacitor", "resistor", "impedance"] as const).filter((k) => t[k] !== undefined);
  if (fixed.length > 1) {
    throw new InvalidArgumentError({
      fn,
      path: fixed[1] as string,
      received: t[fixed[1] as string],
      message: `give at most one of capacitor, resistor and impedance (got ${fixed.join(" and ")})`,
    });
  }
  let km = 1;
  if (fixed[0] === "capacitor") {
    const c = readFixed(fn, "capacitor", t["capacitor"]);
    km = c.normalised / (kf * c.actual);
  } else if (fixed[0] === "resistor") {
    const r = readFixed(fn, "resistor", t["resistor"]);
    km = r.actual / r.normalised;
  } else if (fixed[0] === "impedance") {
    km = requirePositive(fn, "impedance", t["impedance"]);
  }
  if (!(km > 0 && Number.isFinite(km) && kf > 0 && Number.isFinite(kf))) {
    throw new InvalidArgumentError({
      fn,
      path: fixed[0] ?? "target",
      received: target,
      message: `the scaling constants come out as km = ${km}, kf = ${kf}; bring the values closer to practical ranges`,
    });
  }
  return Object.freeze({ km, kf });
}
