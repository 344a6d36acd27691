/**
 * Axis ticks a reader can count in their head: linear steps of 1, 2 or 5
 * times a power of ten, and logarithmic axes labelled at decades with minor
 * lines at 2..9 times each decade.
 *
 * Method: the "nice numbers" step rule (P. S. Heckbert, "Nice numbers for
 * graph labels", in A. S. Glassner (ed.), Graphics Gems, Academic Press,
 * 1990, pp. 61-63): the raw step (span / wanted intervals) rounded up to the
 * next of 1, 2, 5 or 10 times its power of ten, the range widened outward to
 * whole steps. Tick values are integer multiples of the step written with at
 * most 12 significant digits, so 0.1 + 0.2 noise never reaches a label.
 *
 * @module
 */
import { InvalidArgumentError } from "../../errors.ts";
import { requireFinite, requireInteger, requireOptions, requirePositive } from "../../validate.ts";

/** Options of {@link linearTicks}. */
export interface LinearTicksOptions {
  /**
   * About how many intervals between major ticks (2 to 20); the step is the
   * 1-2-5 value at or above `(max - min) / intervals`.
   * @defaultValue 6
   */
  readonly intervals?: number;
}

/** Ticks of a linear axis. */
export interface LinearTicks {
  /** The axis start: `min` rounded down to a whole step. */
  readonly min: number;
  /** The axis end: `max` rounded up to a whole step. */
  readonly max: number;
  /** Distance between major ticks: 1, 2 or 5 times a power of ten. */
  readonly step: number;
  /** Major tick values, from `min` to `max` inclusive. */
  readonly major: readonly number[];
  /** Minor tick values between the major ones (a fifth of a 1 or 5 step, a quarter of a 2 step). */
  readonly minor: readonly number[];
}

/** Ticks of a logarithmic axis. */
export interface LogTicks {
  /** The axis start: `min` rounded down to 1, 2 or 5 times a power of ten. */
  readonly min: number;
  /** The axis end: `max` rounded up to 1, 2 or 5 times a power of ten. */
  readonly max: number;
  /** The powers of ten inside the axis. */
  readonly major: readonly number[];
  /** 2..9 times each power of ten inside the axis (the minor grid). */
  readonly minor: readonly number[];
  /** The values worth a label: the decades, and over less than two decades also 2 and 5 times each (over less than half a decade every minor line). */
  readonly labelled: readonly number[];
}

/** `x` written with at most 12 significant digits (drops binary noise such as 0.30000000000000004). */
export const tidy = (x: number): number => (x === 0 ? 0 : Number(x.toPrecision(12)));

/** The 1-2-5 value at or above `raw` (> 0). */
export function niceStep(raw: number): number {
  const mag = 10 ** Math.floor(Math.log10(raw));
  const n = raw / mag;
  // the 1.0000001 guards a raw step that is already 1, 2 or 5 times mag up to rounding
  const m = n <= 1.0000001 ? 1 : n <= 2.0000001 ? 2 : n <= 5.0000001 ? 5 : 10;
  return tidy(m * mag);
}

/** The unchecked core of {@link linearTicks} (min < max, both finite). */
export function linearTicksCore(lo: number, hi: number, intervals: number): LinearTicks {
  const step = niceStep((hi - lo) / intervals);
  const k0 = Math.floor(lo / step + 1e-9);
  const k1 = Math.ceil(hi / step - 1e-9);
  const major: number[] = [];
  for (let k = k0; k <= k1; k++) major.push(tidy(k * step));
  const lead = Math.round(step / 10 ** Math.floor(Math.log10(step) + 1e-12));
  const parts = lead === 2 ? 4 : 5;
  const minor: number[] = [];
  for (let k = k0; k < k1; k++) for (let j = 1; j < parts; j++) minor.push(tidy((k + j / parts) * step));
  return { min: tidy(k0 * step), max: tidy(k1 * step), step, major, minor };
}

/**
 * Major and minor ticks of a linear axis in steps of 1, 2 or 5 times a power
 * of ten, the range widened to whole steps (see the module header).
 *
 * @param min - smallest value to show
 * @param max - largest value to show (above `min`)
 * @param options - about how many intervals
 * @returns the widened range, the step and the tick values
 * @throws {@link InvalidArgumentError} when a bound is not finite, `max` is not above `min`, or `intervals` is not an integer from 2 to 20
 * @example
 * ```ts
 * linearTicks(-87.3, 12.1).major; //=> [-100, -80, -60, -40, -20, 0, 20]
 * linearTicks(0, 2.6e-4).step; //=> 0.00005
 * ```
 */
export function linearTicks(min: number, max: number, options?: LinearTicksOptions): LinearTicks {
  const fn = "linearTicks";
  const lo = requireFinite(fn, "min", min);
  const hi = requireFinite(fn, "max", max);
  if (!(hi > lo)) throw new InvalidArgumentError({ fn, path: "max", received: hi, message: `expected a value above min (${lo})` });
  const o = requireOptions(fn, "options", options);
  const intervals = o["intervals"] === undefined ? 6 : requireInteger(fn, "options.intervals", o["intervals"], { min: 2, max: 20 });
  return linearTicksCore(lo, hi, intervals);
}

/** `x` (> 0) rounded down (`dir` -1) or up (+1) to 1, 2 or 5 times a power of ten. */
function round125(x: number, dir: -1 | 1): number {
  const d = Math.floor(Math.log10(x) + 1e-12);
  const m = x / 10 ** d;
  const steps = [1, 2, 5, 10];
  if (dir < 0) {
    let best = 1;
    for (const s of steps) if (s <= m * (1 + 1e-9)) best = s;
    return tidy(best * 10 ** d);
  }
  for (const s of steps) if (s >= m * (1 - 1e-9)) return tidy(s * 10 ** d);
  return tidy(10 ** (d + 1));
}

/** The unchecked core of {@link logTicks} (0 < min < max, finite). */
export function logTicksCore(lo: number, hi: number): LogTicks {
  const min = round125(lo, -1);
  const max = round125(hi, 1);
  const d0 = Math.floor(Math.log10(min) + 1e-12);
  const d1 = Math.ceil(Math.log10(max) - 1e-12);
  const inside = (v: number): boolean => v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9);
  const major: number[] = [];
  const minor: number[] = [];
  for (let d = d0; d <= d1; d++) {
    const p = tidy(10 ** d);
    if (inside(p)) major.push(p);
    if (d < d1) for (let m = 2; m <= 9; m++) if (inside(tidy(m * p))) minor.push(tidy(m * p));
  }
  const decades = Math.log10(max / min);
  const labelled =
    decades < 0.5 ? [...major, ...minor] : decades < 2 ? [...major, ...minor.filter((v) => [2, 5].includes(Math.round(v / 10 ** Math.floor(Math.log10(v) + 1e-12))))] : major;
  return { min, max, major, minor, labelled: labelled.sort((a, b) => a - b) };
}

/**
 * Ticks of a logarithmic axis: the decades, the minor lines at 2..9 times
 * each decade, and which of them to label; the range widened to 1, 2 or 5
 * times a power of ten.
 *
 * @param min - smallest value to show (> 0)
 * @param max - largest value to show (above `min`)
 * @returns the widened range and the tick values
 * @throws {@link InvalidArgumentError} when a bound is not a finite positive number or `max` is not above `min`
 * @example
 * ```ts
 * const t = logTicks(120, 48000);
 * [t.min, t.max];  //=> [100, 50000]
 * t.major;         //=> [100, 1000, 10000]
 * t.minor.length;  //=> 20 (200..900, 2k..9k, 20k..50k)
 * ```
 */
export function logTicks(min: number, max: number): LogTicks {
  const fn = "logTicks";
  const lo = requirePositive(fn, "min", min);
  const hi = requirePositive(fn, "max", max);
  if (!(hi > lo) || !Number.isFinite(hi)) throw new InvalidArgumentError({ fn, path: "max", received: hi, message: `expected a finite value above min (${lo})` });
  return logTicksCore(lo, hi);
}
