/**
 * Best two-part combinations (series or parallel) for a target value, and
 * best pairs of preferred values for a ratio.
 *
 * Method: exhaustive over one part, binary search for the other. For a
 * series pair a + b = T every member x of one series in [T / 1000, T) is
 * tried and T - x is snapped to its two neighbours in the other series; for a
 * parallel pair a b / (a + b) = T every x in (T, 1000 T] is tried with the
 * other part's ideal x T / (x - T). For a fixed x the error is monotonic in
 * the other part, so its best choice is one of the two neighbours; and the
 * larger part of a series pair (>= T / 2) and the smaller part of a parallel
 * pair (<= 2 T) always fall in the enumerated window, so the search finds the
 * best of all pairs (series pairs with both parts below T and parallel pairs
 * with both above T, which excludes the degenerate "one part alone plus a
 * speck or a near-open"; with mixed series both roles are enumerated). Cost:
 * O(N log N) per kind for an EN series (about 600 snaps for E192). The pair
 * with the smallest |relative error| wins; ties keep the first found (kinds
 * in the order given, the enumerated part ascending).
 *
 * Ratios: every member a of one decade of the first series is tried and
 * b = a / ratio is snapped in the second series (both neighbours, or the one
 * that keeps the ratio on the requested side). Series and parallel formulas:
 * Ohm's and Kirchhoff's laws; the search is plain enumeration (no published
 * method needed).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireOneOf, requireOptions, requirePositive } from "../validate.ts";
import { seriesTable } from "./eseries.ts";
import type { SeriesName, SeriesTable } from "./eseries.ts";
import { floorPos, memberValue, PART_VALUE_MAX, PART_VALUE_MIN, requirePartValue } from "./snap.ts";

/** How two parts are joined. */
export type CombinationKind = "series" | "parallel";

/** Options of {@link bestCombination}. */
export interface CombinationOptions {
  /** Series of the first part. */
  readonly series: SeriesName;
  /**
   * Series of the second part.
   * @defaultValue the same as `series`
   */
  readonly otherSeries?: SeriesName;
  /**
   * Ways of joining the two parts to try.
   * @defaultValue ["series", "parallel"]
   */
  readonly kinds?: readonly CombinationKind[];
  /**
   * Largest acceptable |relative error| (fraction).
   * @defaultValue 0.001 (0.1 %)
   */
  readonly maxError?: number;
}

/** Two parts and the value they make together. */
export interface Combination {
  /** How the parts are joined. */
  readonly kind: CombinationKind;
  /** The first part (from `series`) and the second (from `otherSeries`). */
  readonly parts: readonly [number, number];
  /** Series of the two parts, in the same order. */
  readonly series: readonly [SeriesName, SeriesName];
  /** The combined value: a + b in series, a b / (a + b) in parallel. */
  readonly value: number;
  /** `(value - target) / target`. */
  readonly relativeError: number;
}

/** Outcome of {@link bestCombination}: the best pair found, and whether it is within `maxError`. */
export interface CombinationResult {
  /** The value asked for. */
  readonly target: number;
  /** Whether |best.relativeError| <= maxError. */
  readonly achievable: boolean;
  /** The error bound used. */
  readonly maxError: number;
  /** The best pair found (reported even when not achievable). */
  readonly best: Combination;
}

/** Up to two members around x in table t (largest <= x and smallest > x). */
function around(t: SeriesTable, x: number): [number, number] {
  const p = floorPos(t, x);
  const lo = memberValue(t.mantissas[p.j] as number, p.k);
  const q = p.j + 1 < t.mantissas.length ? { j: p.j + 1, k: p.k } : { j: 0, k: p.k + 1 };
  return [lo, memberValue(t.mantissas[q.j] as number, q.k)];
}

/** Members of t in [lo, hi], ascending. */
function membersIn(t: SeriesTable, lo: number, hi: number): number[] {
  const out: number[] = [];
  let p = floorPos(t, lo);
  const n = t.mantissas.length;
  for (;;) {
    const v = memberValue(t.mantissas[p.j] as number, p.k);
    if (v > hi) break;
    if (v >= lo) out.push(v);
    p = p.j + 1 < n ? { j: p.j + 1, k: p.k } : { j: 0, k: p.k + 1 };
  }
  return out;
}

const SPAN = 1000;

/**
 * Find the two preferred-value parts, in series or in parallel, whose
 * combined value is closest to a target.
 *
 * Not reaching `maxError` is a normal outcome, returned as data
 * (`achievable: false`, with the best pair found).
 *
 * @param target - the value wanted (ohms, farads, ...), from 1e-27 to 1e27
 * @param options - series of each part, kinds of joining, error bound
 * @returns the best pair, its error and whether it is within `maxError`
 * @throws {@link InvalidArgumentError} when the target is out of range, a
 *   series or kind is unknown, `kinds` is empty, or `maxError` is not positive
 * @example
 * ```ts
 * const r = bestCombination(12_740, { series: "E24" });
 * r.best;
 * //=> { kind: "parallel", parts: [13000, 620000], series: ["E24", "E24"],
 * //     value: 12733.017..., relativeError: -0.000548... }
 * r.achievable; //=> true
 * ```
 */
export function bestCombination(target: number, options: CombinationOptions): CombinationResult {
  const fn = "bestCombination";
  const opts = requireOptions(fn, "options", options);
  const ta = seriesTable(fn, "options.series", opts["series"]);
  const tb = opts["otherSeries"] === undefined ? ta : seriesTable(fn, "options.otherSeries", opts["otherSeries"]);
  let kinds: readonly CombinationKind[] = ["series", "parallel"];
  if (opts["kinds"] !== undefined) {
    const k = opts["kinds"];
    if (!Array.isArray(k) || k.length === 0) {
      throw new InvalidArgumentError({ fn, path: "options.kinds", received: k, message: 'expected a non-empty array of "series" and/or "parallel"' });
    }
    kinds = k.map((x, i) => requireOneOf(fn, `options.kinds[${i}]`, x, ["series", "parallel"] as const));
  }
  const maxError = opts["maxError"] === undefined ? 0.001 : requirePositive(fn, "options.maxError", opts["maxError"]);
  const t = requirePartValue(fn, "target", target);
  if (t < 1e-27 || t > 1e27) {
    throw new InvalidArgumentError({ fn, path: "target", received: target, message: "expected a target from 1e-27 to 1e27" });
  }

  let best: { kind: CombinationKind; a: number; b: number; value: number; err: number } | undefined;
  const consider = (kind: CombinationKind, a: number, b: number): void => {
    const value = kind === "series" ? a + b : (a * b) / (a + b);
    const err = (value - t) / t;
    if (best === undefined || Math.abs(err) < Math.abs(best.err)) best = { kind, a, b, value, err };
  };
  // Enumerate one part from each series in turn (once when both are the same).
  const roles: [SeriesTable, SeriesTable, boolean][] = ta === tb ? [[ta, tb, false]] : [[ta, tb, false], [tb, ta, true]];
  for (const kind of kinds) {
    for (const [enumerated, other, swapped] of roles) {
      const add = (x: number, y: number): void => (swapped ? consider(kind, y, x) : consider(kind, x, y));
      if (kind === "series") {
        for (const x of membersIn(enumerated, t / SPAN, t)) {
          const rest = t - x;
          if (!(rest >= PART_VALUE_MIN)) continue;
          for (const y of around(other, rest)) add(x, y);
        }
      } else {
        for (const x of membersIn(enumerated, t, t * SPAN)) {
          if (x <= t) continue;
          const ideal = (x * t) / (x - t);
          if (!(ideal <= PART_VALUE_MAX)) continue;
          for (const y of around(other, ideal)) add(x, y);
        }
      }
    }
  }
  // Both searches are non-empty for any target in range (E3 has a member in every [T/1000, T)).
  const b = best as { kind: CombinationKind; a: number; b: number; value: number; err: number };
  return Object.freeze({
    target: t,
    achievable: Math.abs(b.err) <= maxError,
    maxError,
    best: Object.freeze({
      kind: b.kind,
      parts: Object.freeze([b.a, b.b]) as readonly [number, number],
      series: Object.freeze([ta.name, tb.name]) as readonly [SeriesName, SeriesName],
      value: b.value,
      relativeError: b.err,
    }),
  });
}

/** Which side of the ratio the pair may land on. */
export type RatioMode = "nearest" | "atLeast" | "atMost";

/** Options of {@link bestRatio}. */
export interface RatioOptions {
  /** Series of the numerator part `a`. */
  readonly series: SeriesName;
  /**
   * Series of the denominator part `b`.
   * @defaultValue the same as `series`
   */
  readonly otherSeries?: SeriesName;
  /**
   * `"nearest"` (smallest |log error|), `"atLeast"` (a / b >= ratio, as close
   * as possible) or `"atMost"` (a / b <= ratio).
   * @defaultValue "nearest"
   */
  readonly mode?: RatioMode;
  /**
   * Largest acceptable |relative error| of the ratio (fraction).
   * @defaultValue the tolerance of `series`
   */
  readonly maxError?: number;
}

/** Outcome of {@link bestRatio}. */
export interface RatioResult {
  /** Numerator part, a member of `series` in [1, 10); scale both parts by the same power of ten as needed. */
  readonly a: number;
  /** Denominator part, a member of `otherSeries` (any decade). */
  readonly b: number;
  /** The ratio asked for. */
  readonly target: number;
  /** The ratio achieved, a / b. */
  readonly ratio: number;
  /** `(ratio - target) / target`. */
  readonly relativeError: number;
  /** Whether |relativeError| <= maxError. */
  readonly achievable: boolean;
  /** The error bound used. */
  readonly maxError: number;
}

/**
 * Find the pair of preferred values whose ratio a / b is closest to a target
 * (a gain set by two resistors, or the capacitor ratio of a unity-gain
 * Sallen-Key stage, at least 4 Q^2).
 *
 * @param ratio - the ratio wanted, from 1e-12 to 1e12
 * @param options - series of each part, which side of the ratio is allowed, error bound
 * @returns `a` in [1, 10), `b`, the achieved ratio and its error
 * @throws {@link InvalidArgumentError} when the ratio is out of range, or a series or mode is unknown
 * @example
 * ```ts
 * bestRatio(4 * 0.7071 ** 2, { series: "E12", mode: "atLeast" });
 * //=> { a: 6.8, b: 3.3, target: 1.99996..., ratio: 2.0606..., relativeError: 0.0303...,
 * //     achievable: true, maxError: 0.1 }
 * bestRatio(10, { series: "E24" }).relativeError; //=> 0
 * ```
 */
export function bestRatio(ratio: number, options: RatioOptions): RatioResult {
  const fn = "bestRatio";
  const opts = requireOptions(fn, "options", options);
  const ta = seriesTable(fn, "options.series", opts["series"]);
  const tb = opts["otherSeries"] === undefined ? ta : seriesTable(fn, "options.otherSeries", opts["otherSeries"]);
  const mode =
    opts["mode"] === undefined ? "nearest" : requireOneOf(fn, "options.mode", opts["mode"], ["nearest", "atLeast", "atMost"] as const);
  const maxError = opts["maxError"] === undefined ? ta.tolerance : requirePositive(fn, "options.maxError", opts["maxError"]);
  const r = requirePositive(fn, "ratio", ratio);
  if (r < 1e-12 || r > 1e12) {
    throw new InvalidArgumentError({ fn, path: "ratio", received: ratio, message: "expected a ratio from 1e-12 to 1e12" });
  }
  let best: { a: number; b: number; q: number; score: number } | undefined;
  for (let i = 0; i < ta.mantissas.length; i++) {
    const a = memberValue(ta.mantissas[i] as number, -2);
    const ideal = a / r;
    for (const b of around(tb, ideal)) {
      const q = a / b;
      if (mode === "atLeast" && q < r) continue;
      if (mode === "atMost" && q > r) continue;
      const score = Math.abs(Math.log(q / r));
      if (best === undefined || score < best.score) best = { a, b, q, score };
    }
  }
  // around() brackets a / r, so each mode always finds a candidate.
  const b = best as { a: number; b: number; q: number; score: number };
  const relativeError = (b.q - r) / r;
  return Object.freeze({
    a: b.a,
    b: b.b,
    target: r,
    ratio: b.q,
    relativeError,
    achievable: Math.abs(relativeError) <= maxError,
    maxError,
  });
}
