/**
 * Plot axes: a linear or logarithmic scale from data values to pixels, its
 * major and minor ticks (src/report/plot/ticks.ts) and their labels, and the
 * axis title with its unit. A linear axis in a unit with SI prefixes takes
 * one prefix for the whole axis, named in the title ("Group delay (µs)"), so
 * its labels stay short; a logarithmic axis writes the prefix on each label
 * ("100", "1k", "10k") and the bare unit in the title.
 *
 * @module
 */
import { PREFIX_FOR_EXPONENT } from "../../units/prefixes.ts";
import { formatValue } from "../../units/index.ts";
import { linearTicksCore, logTicksCore, niceStep, tidy, type LinearTicks } from "./ticks.ts";
import { textWidth } from "./text.ts";

/** What an axis shows. */
export interface AxisSpec {
  /** Linear or logarithmic. */
  readonly scale: "linear" | "log";
  /** Smallest value to show (> 0 on a log axis). */
  readonly min: number;
  /** Largest value to show. */
  readonly max: number;
  /** The quantity, e.g. `"Frequency"`. */
  readonly title: string;
  /** Its unit, e.g. `"Hz"`, `"dB"`, `"°"`, `"s"`, `"V/√Hz"` (empty for none). */
  readonly unit: string;
  /** Whether the unit takes an SI prefix chosen for the whole axis (`"s"` to `"µs"`); linear axes only. */
  readonly prefixed?: boolean;
  /** Steps of 15, 30, 45, 90, 180 or 360 (times 1, 2, 5, ...) rather than 1-2-5: for degrees. */
  readonly angular?: boolean;
  /** Keep `min` and `max` as given rather than widening them to whole steps. */
  readonly exact?: boolean;
}

/** One tick of an axis. */
export interface AxisTick {
  /** Its value, in data units. */
  readonly value: number;
  /** Its label, or null for an unlabelled (minor) line. */
  readonly label: string | null;
}

/** An axis laid out on a length of pixels. */
export interface Axis {
  /** Linear or logarithmic. */
  readonly scale: "linear" | "log";
  /** The axis start, data units. */
  readonly min: number;
  /** The axis end, data units. */
  readonly max: number;
  /** The title with its unit, e.g. `"Group delay (µs)"`. */
  readonly title: string;
  /** Major ticks (grid lines), labelled or not. */
  readonly major: readonly AxisTick[];
  /** Minor grid lines. */
  readonly minor: readonly number[];
  /** Position of a value as a fraction of the axis length, 0 at `min` and 1 at `max` (beyond for values outside). */
  readonly fraction: (v: number) => number;
}

/** The power of ten (a multiple of 3) whose SI prefix writes values up to `largest` with 1 to 3 integer digits. */
function engineeringExponent(largest: number): number {
  if (!(largest > 0) || !Number.isFinite(largest)) return 0;
  const e = Math.floor(Math.floor(Math.log10(largest) + 1e-9) / 3) * 3;
  return Math.min(12, Math.max(-15, e));
}

/** The step of an angular axis: 15, 30, 45, 90, 180, 360 degrees, then 360 times 1-2-5 (and 1-2-5 below 15). */
function angularStep(raw: number): number {
  if (raw <= 10) return niceStep(raw);
  for (const s of [15, 30, 45, 90, 180, 360]) if (s >= raw * (1 - 1e-9)) return s;
  return 360 * niceStep(raw / 360);
}

/** A number with as many decimals as its step needs (none for a whole step). */
function decimalLabel(v: number, step: number): string {
  const decimals = Math.max(0, Math.min(12, -Math.floor(Math.log10(step) + 1e-9)));
  const text = v.toFixed(decimals);
  if (/^-0(\.0*)?$/.test(text)) return text.slice(1);
  return text.startsWith("-") ? `\u2212${text.slice(1)}` : text;
}

/**
 * Of the 1-2-5 tick sets for `intervals - 1` to `intervals + 3` intervals, the
 * one that wastes the least of the axis beyond the data (a step of 20 would
 * put the top of a curve peaking at +1 dB at +20 dB), with a small penalty
 * per interval away from the wanted count (our own rule, after the
 * "loose labelling" of Heckbert, Graphics Gems, 1990).
 */
function tightestTicks(lo: number, hi: number, intervals: number): LinearTicks {
  let best = linearTicksCore(lo, hi, intervals);
  let bestScore = Infinity;
  for (let n = Math.max(2, intervals - 1); n <= intervals + 3; n++) {
    const t = linearTicksCore(lo, hi, n);
    const count = t.major.length - 1;
    const score = 1 - (hi - lo) / (t.max - t.min) + 0.02 * Math.abs(count - intervals) + (count > 12 ? 1 : 0);
    if (score < bestScore - 1e-12) {
      best = t;
      bestScore = score;
    }
  }
  return best;
}

/** A linear axis's ticks over [lo, hi] with about `intervals` steps. */
function linearAxis(spec: AxisSpec, intervals: number): Axis {
  const span = spec.max - spec.min;
  const lo = spec.min;
  const hi = span > 0 ? spec.max : spec.min + (Math.abs(spec.min) || 1);
  let ticks = tightestTicks(lo, hi, intervals);
  if (spec.angular === true) {
    const step = angularStep((hi - lo) / intervals);
    const k0 = Math.floor(lo / step + 1e-9);
    const k1 = Math.ceil(hi / step - 1e-9);
    const major = Array.from({ length: k1 - k0 + 1 }, (_, k) => tidy((k0 + k) * step));
    const parts = step % 45 === 0 && step >= 45 ? 3 : step % 15 === 0 ? 3 : 5;
    const minor: number[] = [];
    for (let k = k0; k < k1; k++) for (let j = 1; j < parts; j++) minor.push(tidy((k + j / parts) * step));
    ticks = { min: tidy(k0 * step), max: tidy(k1 * step), step, major, minor };
  }
  const min = spec.exact === true ? lo : ticks.min;
  const max = spec.exact === true ? hi : ticks.max;
  const inside = (v: number): boolean => v >= min - 1e-9 * (max - min) && v <= max + 1e-9 * (max - min);
  const e = spec.prefixed === true ? engineeringExponent(Math.max(Math.abs(min), Math.abs(max))) : 0;
  const factor = 10 ** e;
  const unit = spec.prefixed === true ? `${PREFIX_FOR_EXPONENT.get(e) ?? ""}${spec.unit}` : spec.unit;
  return {
    scale: "linear",
    min,
    max,
    title: unit === "" ? spec.title : `${spec.title} (${unit})`,
    major: ticks.major.filter(inside).map((v) => ({ value: v, label: decimalLabel(tidy(v / factor), ticks.step / factor) })),
    minor: ticks.minor.filter(inside),
    fraction: (v) => (v - min) / (max - min),
  };
}

/** A log axis's ticks, labelling every `every`-th decade. */
function logAxis(spec: AxisSpec, lengthPx: number, fontSize: number): Axis {
  const hi = spec.max > spec.min ? spec.max : spec.min * 10;
  const t = logTicksCore(spec.min, hi);
  const min = spec.exact === true ? spec.min : t.min;
  const max = spec.exact === true ? hi : t.max;
  const label = (v: number): string => formatValue(v, { digits: 3 });
  const decades = Math.log10(max / min);
  const widest = Math.max(...t.labelled.map((v) => textWidth(label(v), fontSize)), fontSize);
  // label every decade when they fit with room to spare, else every 2nd, 3rd, ...
  const perDecade = lengthPx / Math.max(decades, 1e-9);
  const every = t.labelled.length > t.major.length ? 1 : Math.max(1, Math.ceil((1.6 * widest) / perDecade));
  const labelled = new Set(t.labelled.filter((v) => t.major.includes(v) ? (((Math.round(Math.log10(v)) % every) + every) % every === 0) : every === 1));
  const inside = (v: number): boolean => v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9);
  const majorValues = [...new Set([...t.major, ...t.labelled])].filter(inside).sort((a, b) => a - b);
  const lmin = Math.log10(min);
  const lspan = Math.log10(max) - lmin;
  return {
    scale: "log",
    min,
    max,
    title: spec.unit === "" ? spec.title : `${spec.title} (${spec.unit})`,
    major: majorValues.map((v) => ({ value: v, label: labelled.has(v) ? label(v) : null })),
    minor: t.minor.filter((v) => inside(v) && !majorValues.includes(v)),
    fraction: (v) => (Math.log10(v) - lmin) / lspan,
  };
}

/**
 * Lay an axis out on `lengthPx` pixels: its ticks, about one labelled tick
 * per `spacingPx`, and the labels.
 *
 * @param spec - what the axis shows
 * @param lengthPx - its length, pixels
 * @param fontSize - label font size, pixels (for the spacing of log labels)
 * @param spacingPx - wanted distance between labelled linear ticks, pixels
 * @returns the axis
 */
export function buildAxis(spec: AxisSpec, lengthPx: number, fontSize: number, spacingPx: number): Axis {
  if (spec.scale === "log") return logAxis(spec, lengthPx, fontSize);
  const intervals = Math.max(2, Math.min(10, Math.round(lengthPx / spacingPx)));
  return linearAxis(spec, intervals);
}

/**
 * The widest label of an axis, pixels (by the conservative estimate of
 * src/report/plot/text.ts).
 *
 * @param axis - the axis
 * @param fontSize - label font size, pixels
 * @returns the width, pixels (0 when no tick is labelled)
 */
export function widestLabel(axis: Axis, fontSize: number): number {
  let w = 0;
  for (const t of axis.major) if (t.label !== null) w = Math.max(w, textWidth(t.label, fontSize));
  return w;
}
