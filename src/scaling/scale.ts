/**
 * Magnitude and frequency scaling of passive element values.
 *
 * Method: impedance scaling by Km and frequency scaling by Kf applied
 * together, R' = Km R, L' = Km L / Kf, C' = C / (Km Kf). Every impedance is
 * multiplied by Km and every frequency by Kf, so a network's voltage
 * transfer function satisfies H'(j Kf w) = H(j w) exactly (dimensionless
 * ratios are unchanged). Exact up to one rounding per value (<= 1 ulp).
 * Reference: M. E. Van Valkenburg, "Analog Filter Design", Holt, Rinehart and
 * Winston, 1982, section 2.5 (magnitude and frequency normalization),
 * equations (2.54)-(2.56).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireOneOf, requireOptions, requirePositive } from "../validate.ts";
import type { PassiveKind, ScalableElement } from "./elements.ts";

/** Scaling constants. */
export interface ScalingOptions {
  /**
   * Magnitude (impedance) scaling factor Km: R and L are multiplied by it, C divided.
   * @defaultValue 1
   */
  readonly km?: number;
  /**
   * Frequency scaling factor Kf: L and C are divided by it; R is unchanged.
   * @defaultValue 1
   */
  readonly kf?: number;
}

function readScaling(fn: string, options: unknown): { km: number; kf: number } {
  const opts = requireOptions(fn, "options", options);
  const km = opts["km"] === undefined ? 1 : requirePositive(fn, "options.km", opts["km"]);
  const kf = opts["kf"] === undefined ? 1 : requirePositive(fn, "options.kf", opts["kf"]);
  return { km, kf };
}

/** The scaled value; undefined when it leaves the finite positive doubles. */
function scaleCore(kind: PassiveKind, value: number, km: number, kf: number): number {
  if (kind === "R") return km * value;
  if (kind === "L") return (km * value) / kf;
  return value / km / kf;
}

function checkResult(fn: string, path: string, before: number, after: number): number {
  if (!(after > 0) || !Number.isFinite(after)) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: before,
      message: `scaling this value gives ${after}, outside the positive finite numbers; use smaller scaling constants`,
    });
  }
  return after;
}

/**
 * Scale one passive value: R' = Km R, L' = Km L / Kf, C' = C / (Km Kf).
 *
 * @param kind - `"R"`, `"C"` or `"L"`
 * @param value - the value in ohms, farads or henries (> 0)
 * @param options - the constants Km and Kf
 * @returns the scaled value
 * @throws {@link InvalidArgumentError} when the kind is unknown, the value or a
 *   constant is not a positive finite number, or the result over/underflows
 * @example
 * ```ts
 * scaleValue("C", 1, { km: 1000, kf: 2 * Math.PI * 1000 }); //=> 1.5915494309189535e-7
 * scaleValue("R", 1, { km: 1000 }); //=> 1000
 * scaleValue("L", 2, { km: 50, kf: 1e4 }); //=> 0.01
 * ```
 */
export function scaleValue(kind: PassiveKind, value: number, options: ScalingOptions): number {
  const fn = "scaleValue";
  const k = requireOneOf(fn, "kind", kind, ["R", "C", "L"] as const);
  const v = requirePositive(fn, "value", value);
  const { km, kf } = readScaling(fn, options);
  return checkResult(fn, "value", v, scaleCore(k, v, km, kf));
}

/**
 * Scale every resistor, capacitor and inductor of an element list. Elements
 * of any other kind (sources, op-amps, controlled sources) are passed through
 * unchanged, as the same objects. The input is not modified.
 *
 * @param elements - elements with a `kind` and, for R/C/L, a positive `value`
 * @param options - the constants Km and Kf
 * @returns a new list, in the same order, with R/C/L values scaled
 * @throws {@link InvalidArgumentError} naming `elements[i].value` when an R/C/L
 *   has no positive finite value or its scaled value over/underflows, or when a
 *   constant is not a positive finite number
 * @example
 * ```ts
 * scaleElements(
 *   [{ name: "R1", kind: "R", value: 1 }, { name: "C1", kind: "C", value: 1 }, { name: "U1", kind: "OA" }],
 *   { km: 1e4, kf: 1e3 },
 * );
 * //=> [{ name: "R1", kind: "R", value: 10000 }, { name: "C1", kind: "C", value: 1e-7 }, { name: "U1", kind: "OA" }]
 * ```
 */
export function scaleElements<T extends ScalableElement>(elements: readonly T[], options: ScalingOptions): T[] {
  const fn = "scaleElements";
  const { km, kf } = readScaling(fn, options);
  if (!Array.isArray(elements)) {
    throw new InvalidArgumentError({ fn, path: "elements", received: elements, message: "expected an array of elements" });
  }
  return elements.map((el, i) => {
    if (el === null || typeof el !== "object") {
      throw new InvalidArgumentError({ fn, path: `elements[${i}]`, received: el, message: "expected an element object" });
    }
    const kind = el.kind;
    if (kind !== "R" && kind !== "C" && kind !== "L") return el;
    const v = requirePositive(fn, `elements[${i}].value`, el.value);
    const scaled = checkResult(fn, `elements[${i}].value`, v, scaleCore(kind, v, km, kf));
    return { ...el, value: scaled };
  });
}
