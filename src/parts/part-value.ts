/**
 * A preferred-value part: its value, series, tolerance and bounds, with labels.
 *
 * Bounds: value (1 - tolerance) and value (1 + tolerance), the usual reading
 * of a symmetric tolerance band (IEC 60062:2016, clause 5, tolerance letters;
 * typed in from memory).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireInRange, requireOneOf, requireOptions } from "../validate.ts";
import { formatRkm, formatValue } from "../units/index.ts";
import { seriesTable } from "./eseries.ts";
import type { SeriesName } from "./eseries.ts";
import { floorPos, memberValue, requirePartValue, snapToSeries } from "./snap.ts";

/** Kinds of part a {@link PartValue} can label. */
export type PartKind = "resistor" | "capacitor";

/** A part whose value is a member of a preferred-value series. */
export interface PartValue {
  /** Nominal value in ohms (resistor) or farads (capacitor). */
  readonly value: number;
  /** The part's kind, which sets the unit and RKM letters. */
  readonly kind: PartKind;
  /** The series the value belongs to. */
  readonly series: SeriesName;
  /** Tolerance as a fraction (0.01 for 1 %). */
  readonly tolerance: number;
  /** Lowest value within tolerance, value (1 - tolerance). */
  readonly min: number;
  /** Highest value within tolerance, value (1 + tolerance). */
  readonly max: number;
  /** Engineering notation with unit, e.g. `"4.7 kΩ"`, `"10 nF"`. */
  readonly label: string;
  /** RKM code (IEC 60062), e.g. `"4k7"`, `"10n"`. */
  readonly rkm: string;
}

/** Options of {@link partValue}. */
export interface PartValueOptions {
  /** The series the value must belong to. */
  readonly series: SeriesName;
  /**
   * Tolerance as a fraction, from 0 (exclusive) to 0.5.
   * @defaultValue the series' usual tolerance ({@link seriesTolerance})
   */
  readonly tolerance?: number;
  /**
   * Kind of part, for the unit and RKM letters.
   * @defaultValue "resistor"
   */
  readonly kind?: PartKind;
}

/**
 * Describe a preferred-value part: check the value is a member of the series
 * and attach tolerance bounds and labels.
 *
 * @param value - a member of the series (use {@link snapToSeries} first for an arbitrary value)
 * @param options - series, tolerance, kind
 * @returns the part description
 * @throws {@link InvalidArgumentError} when the value is not a member of the
 *   series (the message names the nearest member), or an option is invalid
 * @example
 * ```ts
 * partValue(4700, { series: "E24" });
 * //=> { value: 4700, kind: "resistor", series: "E24", tolerance: 0.05, min: 4465, max: 4935,
 * //     label: "4.7 kΩ", rkm: "4k7" }
 * partValue(1e-8, { series: "E6", kind: "capacitor" }).label; //=> "10 nF"
 * ```
 */
export function partValue(value: number, options: PartValueOptions): PartValue {
  const fn = "partValue";
  const opts = requireOptions(fn, "options", options);
  const t = seriesTable(fn, "options.series", opts["series"]);
  const tolerance =
    opts["tolerance"] === undefined
      ? t.tolerance
      : requireInRange(fn, "options.tolerance", opts["tolerance"], { min: 0, max: 0.5, exclusiveMin: true });
  const kind = opts["kind"] === undefined ? "resistor" : requireOneOf(fn, "options.kind", opts["kind"], ["resistor", "capacitor"] as const);
  const v = requirePartValue(fn, "value", value);
  const p = floorPos(t, v);
  if (memberValue(t.mantissas[p.j] as number, p.k) !== v) {
    const near = snapToSeries(v, { series: t.name }).value;
    throw new InvalidArgumentError({
      fn,
      path: "value",
      received: value,
      message: `expected a member of ${t.name}; the nearest is ${near} (use snapToSeries first)`,
    });
  }
  if (kind === "capacitor" && v >= 1000) {
    throw new InvalidArgumentError({ fn, path: "value", received: value, message: "expected a capacitance below 1000 F" });
  }
  if (kind === "resistor" && v >= 1e15) {
    throw new InvalidArgumentError({ fn, path: "value", received: value, message: "expected a resistance below 1e15 Ω" });
  }
  const unit = kind === "resistor" ? "\u03a9" : "F";
  return Object.freeze({
    value: v,
    kind,
    series: t.name,
    tolerance,
    min: v * (1 - tolerance),
    max: v * (1 + tolerance),
    label: formatValue(v, { unit, digits: 3 }),
    rkm: formatRkm(v, { kind, digits: 3 }),
  });
}
