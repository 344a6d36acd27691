/**
 * Snapping values to an IEC 60063 series, neighbours and ranges across decades.
 *
 * Method: the decade is found from log10 and corrected by exact comparison;
 * the position inside the decade by binary search over the integer mantissas;
 * the final choice compares exact member values, so it does not depend on
 * rounding in log10. "Nearest" means nearest in logarithmic distance: below
 * the geometric mean sqrt(a b) of two neighbours a < b the lower one wins,
 * above it the upper one (compared as x / a against b / x). An exact tie goes
 * to the LOWER value. Members are built as one correctly rounded decimal
 * (mantissa x 10^k), so results are decade-invariant: the member chosen for
 * 10 x is the same mantissa one decade up.
 *
 * Reference for the series: IEC 60063:2015, Tables 1 and 2 (typed in from
 * memory, see eseries.ts). Geometric-mean decision points: C. Renard's
 * preferred numbers as in ISO 3:1973 "Preferred numbers - Series of preferred
 * numbers" (log-uniform spacing).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireOneOf, requireOptions } from "../validate.ts";
import { seriesTable } from "./eseries.ts";
import type { SeriesName, SeriesTable } from "./eseries.ts";

/** Smallest value the parts functions accept. */
export const PART_VALUE_MIN = 1e-30;
/** Largest value the parts functions accept. */
export const PART_VALUE_MAX = 1e30;

/** How to choose a member of the series. */
export type SnapMode = "nearest" | "up" | "down";

/** Options of {@link snapToSeries} and {@link snapValues}. */
export interface SnapOptions {
  /** The series to snap to. */
  readonly series: SeriesName;
  /**
   * `"nearest"` (logarithmic distance, ties to the lower value), `"up"`
   * (smallest member >= value) or `"down"` (largest member <= value).
   * @defaultValue "nearest"
   */
  readonly mode?: SnapMode;
}

/** The member chosen for one value, with its neighbours and error. */
export interface SnapResult {
  /** The chosen series member. */
  readonly value: number;
  /** The value asked for. */
  readonly ideal: number;
  /** `(value - ideal) / ideal`. */
  readonly relativeError: number;
  /** The series snapped to. */
  readonly series: SeriesName;
  /** Usual tolerance of the series (fraction). */
  readonly tolerance: number;
  /** The mode used. */
  readonly mode: SnapMode;
  /** Largest member <= ideal. */
  readonly down: number;
  /** Smallest member >= ideal (equal to `down` when ideal is a member). */
  readonly up: number;
}

// Exact powers of ten 1e0..1e22 (all exactly representable in binary64).
const POW10: Float64Array = Float64Array.from({ length: 23 }, (_, i) => Number(`1e${i}`));

/** The member with integer mantissa m (100..1000) times 10^k, as a correctly rounded double. */
export function memberValue(m: number, k: number): number {
  if (k >= 0 && k <= 22) return m * (POW10[k] as number);
  if (k < 0 && k >= -22) return m / (POW10[-k] as number);
  return Number(`${m}e${k}`);
}

// Reading the binary exponent of a double directly is cheaper than Math.log10.
const F64 = new Float64Array(1);
const U32 = new Uint32Array(F64.buffer);
const HIGH_WORD = new Uint8Array(Float64Array.of(1).buffer)[7] === 0x3f ? 1 : 0; // little-endian: 1
const LOG10_2 = 0.3010299956639812;

/**
 * floor(log10(x)) or one less, for a normal positive double x: from the
 * binary exponent b, log10(x) lies in [b log10 2, (b + 1) log10 2).
 */
function decadeEstimate(x: number): number {
  F64[0] = x;
  const b = (((U32[HIGH_WORD] as number) >>> 20) & 0x7ff) - 1023;
  return Math.floor(b * LOG10_2);
}

/** A position in the series: index into the mantissas and decade exponent k (value = m[j] 10^k). */
interface Pos {
  j: number;
  k: number;
}

function valueAt(t: SeriesTable, p: Pos): number {
  return memberValue(t.mantissas[p.j] as number, p.k);
}

function stepUp(t: SeriesTable, p: Pos): Pos {
  return p.j + 1 < t.mantissas.length ? { j: p.j + 1, k: p.k } : { j: 0, k: p.k + 1 };
}

function stepDown(t: SeriesTable, p: Pos): Pos {
  return p.j > 0 ? { j: p.j - 1, k: p.k } : { j: t.mantissas.length - 1, k: p.k - 1 };
}

// Scratch registers for the allocation-free core, written by floorCore:
// [j, k] position of the largest member <= x, [2] the value of the next member up.
// (A typed array rather than module-level `let`s: cheaper to write in the batch loop.)
const reg = new Float64Array(3);

/** Find the largest member <= x (x > 0, finite, valid); sets `reg` and returns its value. */
function floorCore(t: SeriesTable, x: number): number {
  const m = t.mantissas;
  let k = decadeEstimate(x) - 2;
  let scaled = k >= 0 && k <= 22 ? x / (POW10[k] as number) : k < 0 && k >= -22 ? x * (POW10[-k] as number) : x / memberValue(1, k);
  if (scaled >= 1000) {
    k += 1;
    scaled /= 10;
  } else if (scaled < 100) {
    k -= 1;
    scaled *= 10;
  }
  // Mantissas are integers, so m[j] <= scaled iff m[j] <= floor(scaled).
  const n = Math.floor(scaled);
  let j = t.floorIndex[n < 100 ? 100 : n > 999 ? 999 : n] as number;
  // Exact correction against the correctly rounded member values (rarely needed).
  let v = memberValue(m[j] as number, k);
  while (v > x) {
    if (j > 0) j--;
    else {
      j = m.length - 1;
      k--;
    }
    v = memberValue(m[j] as number, k);
  }
  for (;;) {
    const j2 = j + 1 < m.length ? j + 1 : 0;
    const k2 = j2 === 0 ? k + 1 : k;
    const v2 = memberValue(m[j2] as number, k2);
    if (v2 > x) {
      reg[2] = v2;
      break;
    }
    j = j2;
    k = k2;
    v = v2;
  }
  reg[0] = j;
  reg[1] = k;
  return v;
}

/** Value of the member just above the one found by the last {@link floorCore}. */
function aboveCore(): number {
  return reg[2] as number;
}

/** Position of the largest member <= x (x > 0, finite, valid). */
export function floorPos(t: SeriesTable, x: number): Pos {
  floorCore(t, x);
  return { j: reg[0] as number, k: reg[1] as number };
}

/** Snap a valid value; returns [chosen, down, up]. */
function snapCore(t: SeriesTable, x: number, mode: SnapMode): [number, number, number] {
  const down = floorCore(t, x);
  const up = down === x ? down : aboveCore();
  if (mode === "down") return [down, down, up];
  if (mode === "up") return [up, down, up];
  // Nearest in log distance: compare x/down with up/x; tie -> lower.
  return [x / down > up / x ? up : down, down, up];
}

/**
 * Snap a valid value, returning only the chosen member (no allocation), for
 * the batch path of {@link snapValues}.
 */
function snapOne(t: SeriesTable, x: number, mode: SnapMode): number {
  const down = floorCore(t, x);
  if (down === x || mode === "down") return down;
  const up = reg[2] as number;
  if (mode === "up") return up;
  return x / down > up / x ? up : down;
}

/** Check a value is a positive finite number in [PART_VALUE_MIN, PART_VALUE_MAX]. */
export function requirePartValue(fn: string, path: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value) || value < PART_VALUE_MIN || value > PART_VALUE_MAX) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: value,
      message: `expected a finite number from ${PART_VALUE_MIN} to ${PART_VALUE_MAX} (part values are positive)`,
    });
  }
  return value;
}

function readSnapOptions(fn: string, options: unknown): { t: SeriesTable; mode: SnapMode } {
  const opts = requireOptions(fn, "options", options);
  const t = seriesTable(fn, "options.series", opts["series"]);
  const mode =
    opts["mode"] === undefined ? "nearest" : requireOneOf(fn, "options.mode", opts["mode"], ["nearest", "up", "down"] as const);
  return { t, mode };
}

/**
 * Snap a value to a member of an IEC 60063 series.
 *
 * @param value - the ideal value (ohms, farads, ...), from 1e-30 to 1e30
 * @param options - series and mode (nearest in log distance, up or down)
 * @returns the chosen member with the ideal value, its relative error, the
 *   series tolerance and the members just below and above
 * @throws {@link InvalidArgumentError} when `value` is not a positive finite
 *   number in range, or the series or mode is unknown
 * @example
 * ```ts
 * snapToSeries(4400, { series: "E24" }).value; //=> 4300
 * snapToSeries(4400, { series: "E24", mode: "up" }).value; //=> 4700
 * snapToSeries(12.7e-9, { series: "E12" });
 * //=> { value: 1.2e-8, ideal: 1.27e-8, relativeError: -0.0551..., series: "E12",
 * //     tolerance: 0.1, mode: "nearest", down: 1.2e-8, up: 1.5e-8 }
 * ```
 */
export function snapToSeries(value: number, options: SnapOptions): SnapResult {
  const fn = "snapToSeries";
  const { t, mode } = readSnapOptions(fn, options);
  const x = requirePartValue(fn, "value", value);
  const [chosen, down, up] = snapCore(t, x, mode);
  return Object.freeze({
    value: chosen,
    ideal: x,
    relativeError: (chosen - x) / x,
    series: t.name,
    tolerance: t.tolerance,
    mode,
    down,
    up,
  });
}

/**
 * Snap many values at once (no per-value result objects; for large batches).
 *
 * @param values - ideal values, each from 1e-30 to 1e30
 * @param options - series and mode
 * @returns the chosen members, in order
 * @throws {@link InvalidArgumentError} naming `values[i]` for the first bad value,
 *   or when the series or mode is unknown
 * @example
 * ```ts
 * snapValues([4400, 1.27e-8], { series: "E12" }); //=> Float64Array [4700, 1.2e-8]
 * ```
 */
export function snapValues(values: ArrayLike<number>, options: SnapOptions): Float64Array {
  const fn = "snapValues";
  const { t, mode } = readSnapOptions(fn, options);
  if (values === null || typeof values !== "object" || typeof values.length !== "number") {
    throw new InvalidArgumentError({ fn, path: "values", received: values, message: "expected an array of numbers" });
  }
  const n = values.length;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = values[i];
    if (typeof x !== "number" || !(x >= PART_VALUE_MIN && x <= PART_VALUE_MAX)) requirePartValue(fn, `values[${i}]`, x);
    out[i] = snapOne(t, x as number, mode);
  }
  return out;
}

/** Options of {@link nextInSeries}. */
export interface NextOptions {
  /** The series to step through. */
  readonly series: SeriesName;
  /**
   * `"up"` for the smallest member strictly above the value, `"down"` for the largest strictly below.
   * @defaultValue "up"
   */
  readonly direction?: "up" | "down";
}

/**
 * The next member of a series strictly above (or below) a value, which need
 * not itself be a member.
 *
 * @param value - a positive value from 1e-30 to 1e30
 * @param options - series and direction
 * @returns the neighbouring member
 * @throws {@link InvalidArgumentError} when `value` is out of range or the series/direction is unknown
 * @example
 * ```ts
 * nextInSeries(4700, { series: "E12" }); //=> 5600
 * nextInSeries(4700, { series: "E12", direction: "down" }); //=> 3900
 * nextInSeries(1e-9, { series: "E6", direction: "down" }); //=> 6.8e-10
 * ```
 */
export function nextInSeries(value: number, options: NextOptions): number {
  const fn = "nextInSeries";
  const opts = requireOptions(fn, "options", options);
  const t = seriesTable(fn, "options.series", opts["series"]);
  const dir = opts["direction"] === undefined ? "up" : requireOneOf(fn, "options.direction", opts["direction"], ["up", "down"] as const);
  const x = requirePartValue(fn, "value", value);
  const p = floorPos(t, x);
  if (dir === "up") return valueAt(t, stepUp(t, p));
  const v = valueAt(t, p);
  return v < x ? v : valueAt(t, stepDown(t, p));
}

/**
 * `snapToSeries(x, { series, mode: "nearest" }).value` without the checks and
 * the result record (the same core, so the same member), for the design
 * loop's many snaps. Internal.
 *
 * @param x - a part value
 * @param series - the series (a valid name)
 * @returns the nearest member, or null when `x` lies outside [PART_VALUE_MIN, PART_VALUE_MAX] (the checked call then decides)
 * @internal
 */
export function nearestMember(x: number, series: SeriesName): number | null {
  if (!(x >= PART_VALUE_MIN && x <= PART_VALUE_MAX)) return null;
  return snapOne(seriesTable("snapToSeries", "options.series", series), x, "nearest");
}

/**
 * The members around `x` that the value search tries (design/resistor-search.ts
 * `neighbours`), without the checked calls' validation: the member `x` is, or
 * the two that bracket it, and `spread - 1` more on each side, ascending. Each
 * value is the one {@link snapToSeries} and repeated {@link nextInSeries} give
 * (the same positions, the same correctly rounded member values). Internal.
 *
 * @param x - a part value
 * @param series - the series (a valid name)
 * @param spread - members on each side, at least 1
 * @returns the members, or null when `x` or any member reached lies outside [PART_VALUE_MIN, PART_VALUE_MAX] (the checked calls then decide)
 * @internal
 */
export function membersAround(x: number, series: SeriesName, spread: number): number[] | null {
  if (!(x >= PART_VALUE_MIN && x <= PART_VALUE_MAX)) return null;
  const t = seriesTable("isInSeries", "series", series);
  const p = floorPos(t, x);
  const v = valueAt(t, p);
  const below: number[] = [v];
  const above: number[] = v === x ? [] : [valueAt(t, stepUp(t, p))];
  let d = p;
  let u = v === x ? p : stepUp(t, p);
  for (let i = 1; i < spread; i++) {
    d = stepDown(t, d);
    u = stepUp(t, u);
    below.push(valueAt(t, d));
    above.push(valueAt(t, u));
  }
  const out = below.reverse().concat(above);
  for (const m of out) if (!(m >= PART_VALUE_MIN && m <= PART_VALUE_MAX)) return null;
  return out;
}

/** Inclusive bounds for {@link seriesValuesInRange}. */
export interface ValueRange {
  /** Lower bound (inclusive), > 0. */
  readonly min: number;
  /** Upper bound (inclusive), >= min. */
  readonly max: number;
}

/** Most values {@link seriesValuesInRange} returns (E192 over 30 decades). */
const MAX_RANGE_DECADES = 30;

/**
 * Every member of a series within an inclusive range, across decades, ascending.
 *
 * @param series - the series
 * @param range - inclusive bounds, 1e-30 <= min <= max <= 1e30, spanning at most 30 decades
 * @returns the members in [min, max] (at least one)
 * @throws {@link InvalidArgumentError} when a bound is out of range, min > max,
 *   the range spans more than 30 decades, or no member lies inside it (the
 *   message names the nearest members)
 * @example
 * ```ts
 * seriesValuesInRange("E6", { min: 10, max: 100 }); //=> [10, 15, 22, 33, 47, 68, 100]
 * seriesValuesInRange("E3", { min: 1e-11, max: 1e-10 }); //=> [1e-11, 2.2e-11, 4.7e-11, 1e-10]
 * ```
 */
export function seriesValuesInRange(series: SeriesName, range: ValueRange): number[] {
  const fn = "seriesValuesInRange";
  const t = seriesTable(fn, "series", series);
  const r = requireOptions(fn, "range", range);
  if (range === undefined) {
    throw new InvalidArgumentError({ fn, path: "range", received: range, message: "expected { min, max }" });
  }
  const min = requirePartValue(fn, "range.min", r["min"]);
  const max = requirePartValue(fn, "range.max", r["max"]);
  if (min > max) {
    throw new InvalidArgumentError({
      fn,
      path: "range",
      received: range,
      message: "the range is empty: min must not exceed max",
    });
  }
  if (max / min > 10 ** MAX_RANGE_DECADES) {
    throw new InvalidArgumentError({
      fn,
      path: "range",
      received: range,
      message: `the range spans more than ${MAX_RANGE_DECADES} decades; narrow it`,
    });
  }
  const out: number[] = [];
  let p = floorPos(t, min);
  if (valueAt(t, p) < min) p = stepUp(t, p);
  for (let v = valueAt(t, p); v <= max; p = stepUp(t, p), v = valueAt(t, p)) out.push(v);
  if (out.length === 0) {
    const below = nextInSeries(min, { series: t.name, direction: "down" });
    const above = nextInSeries(max, { series: t.name, direction: "up" });
    throw new InvalidArgumentError({
      fn,
      path: "range",
      received: range,
      message: `no ${t.name} value lies in [${min}, ${max}]; widen it to include ${below} or ${above}`,
    });
  }
  return out;
}

/**
 * Whether a value is a member of a series (exactly, as the double built from the table).
 *
 * @param value - any number
 * @param series - the series
 * @returns true when `value` equals a member of the series in some decade
 * @throws {@link InvalidArgumentError} when the series is unknown
 * @example
 * ```ts
 * isInSeries(4700, "E12"); //=> true
 * isInSeries(4300, "E12"); //=> false
 * isInSeries(-4700, "E12"); //=> false
 * ```
 */
export function isInSeries(value: number, series: SeriesName): boolean {
  const t = seriesTable("isInSeries", "series", series);
  if (typeof value !== "number" || !(value >= PART_VALUE_MIN && value <= PART_VALUE_MAX)) return false;
  return valueAt(t, floorPos(t, value)) === value;
}
