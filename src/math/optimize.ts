/**
 * One-dimensional searches: the maximum of a unimodal function, and the
 * threshold of a monotone predicate on a positive axis.
 *
 * Golden-section search (J. Kiefer, "Sequential minimax search for a
 * maximum", Proceedings of the American Mathematical Society 4(3):502-506,
 * 1953): two interior points at the golden ratio `(sqrt 5 - 1)/2` of the
 * interval; each step drops the part beyond the worse point and reuses the
 * other, so one new evaluation shrinks the interval by 0.618. Accuracy: after
 * k steps the maximum of a unimodal function lies within `0.618^k` of the
 * starting width (a flat top is located only to about sqrt(eps) of the
 * interval, the limit of comparing function values).
 *
 * Geometric bisection: bisection (the intermediate value theorem's classical
 * construction; e.g. R. L. Burden & J. D. Faires, "Numerical Analysis", 9th
 * ed., 2011, section 2.1) at the geometric mean `sqrt(lo hi)`, which halves
 * the interval in log scale, for a threshold on a positive axis spanning
 * decades. Accuracy: the returned `lo` and `hi` still bracket the threshold
 * and `hi / lo - 1` is at most `relWidth` unless `maxIterations` ran out.
 *
 * @module
 */

/** A real function of one real variable, for {@link goldenMax}. */
export type RealFunction = (x: number) => number;

/** Stopping rules of {@link goldenMax}. */
export interface GoldenStop {
  /** Most iterations. */
  readonly iterations: number;
  /** Stop when the interval is narrower than this (in the units of `x`). */
  readonly width: number;
}

const PHI = (Math.sqrt(5) - 1) / 2;

/**
 * Golden-section search for the maximum of a unimodal function on `[lo, hi]`
 * (see the module header).
 *
 * @param g - function to maximise
 * @param interval - `[lo, hi]`
 * @param stop - at most `iterations` steps, or until the interval is narrower than `width`
 * @returns the better of the two final interior points
 * @throws never (a numeric core: no argument checks)
 * @example
 * ```ts
 * goldenMax((x) => -((x - 1) ** 2), [0, 3], { iterations: 100, width: 1e-9 }); //=> 1.0000000000... (within 1e-8)
 * ```
 */
export function goldenMax(g: RealFunction, interval: readonly [number, number], stop: GoldenStop): number {
  let [lo, hi] = interval;
  let x1 = hi - PHI * (hi - lo);
  let x2 = lo + PHI * (hi - lo);
  let g1 = g(x1);
  let g2 = g(x2);
  for (let k = 0; k < stop.iterations && hi - lo > stop.width; k++) {
    if (g1 < g2) {
      lo = x1;
      x1 = x2;
      g1 = g2;
      x2 = lo + PHI * (hi - lo);
      g2 = g(x2);
    } else {
      hi = x2;
      x2 = x1;
      g2 = g1;
      x1 = hi - PHI * (hi - lo);
      g1 = g(x1);
    }
  }
  return g1 > g2 ? x1 : x2;
}

/** Stopping rules of {@link geometricBisect}. */
export interface GeometricBisectStop {
  /** Stop when `hi / lo - 1` is at most this. */
  readonly relWidth: number;
  /** Most halvings (`Infinity` for no cap). */
  readonly maxIterations: number;
}

/**
 * Narrow `[lo, hi]` (both > 0) around the threshold of a monotone predicate
 * by bisection at the geometric mean: `isHigh(x)` is false below the
 * threshold and true above it, `isHigh(lo)` false and `isHigh(hi)` true on
 * entry (see the module header).
 *
 * @param isHigh - the predicate; the new point becomes `hi` where it holds, `lo` otherwise
 * @param lo - lower end (> 0), below the threshold
 * @param hi - upper end (> lo), above the threshold
 * @param stop - relative width and iteration cap
 * @returns the final bracket `{ lo, hi }`
 * @throws never (a numeric core: no argument checks)
 * @example
 * ```ts
 * geometricBisect((x) => x * x > 2, 1, 2, { relWidth: 1e-12, maxIterations: 100 }).hi; //=> 1.414213562373... (within 1e-12)
 * ```
 */
export function geometricBisect(
  isHigh: (x: number) => boolean,
  lo: number,
  hi: number,
  stop: GeometricBisectStop,
): { lo: number; hi: number } {
  let a = lo;
  let b = hi;
  for (let k = 0; k < stop.maxIterations && b / a - 1 > stop.relWidth; k++) {
    const mid = Math.sqrt(a * b);
    if (isHigh(mid)) b = mid;
    else a = mid;
  }
  return { lo: a, hi: b };
}
