/**
 * A root of a continuous real function inside a sign-change bracket.
 *
 * Method: the Illinois variant of regula falsi (M. Dowell & P. Jarratt, "A
 * modified regula falsi method for computing the root of an equation", BIT
 * 11(2):168-174, 1971): the secant through the two bracket ends, and when the
 * same end is kept twice its function value is halved, which gives
 * superlinear convergence (order about 1.44) on a simple root. As a
 * safeguard every `bisectEvery`-th step, and any step that falls outside the
 * bracket, is a bisection step, so the bracket at least halves every
 * `bisectEvery` steps whatever the function.
 *
 * Signs are compared directly, not through the product `f(a) f(b)`, which
 * underflows to zero when both values are below about 1e-162 (a NaN value
 * counts as no sign change).
 *
 * Accuracy: the iteration stops when the bracket is narrower than
 * `relWidth * max(|a|, |b|)` (a few ulp for `relWidth = 2 * Number.EPSILON`),
 * on an exact zero, or after `maxIterations` steps.
 *
 * @module
 */

/** Stopping rules of {@link bracketRoot}; the caller states them, they have no defaults. */
export interface BracketRootOptions {
  /** Most iterations. */
  readonly maxIterations: number;
  /** Every this-many-th step is a bisection step (1 = plain bisection). */
  readonly bisectEvery: number;
  /** Stop when the bracket is narrower than this times the larger end's magnitude (e.g. `2 * Number.EPSILON`). */
  readonly relWidth: number;
  /**
   * Which end to return when the iteration stops without an exact zero:
   * the latest iterate, or the end with the smaller `|f|`.
   */
  readonly result: "latest" | "smaller-residual";
}

/**
 * A root of `f` in the bracket `[a, b]` (`f(a)` and `f(b)` of opposite signs)
 * by the Illinois method with a bisection safeguard (see the module header).
 * When `f(a)` and `f(b)` have the same sign there is no bracket and the end
 * with the smaller `|f|` is returned at once.
 *
 * @param f - continuous function of one real variable
 * @param a - one end of the bracket
 * @param b - the other end
 * @param options - iteration cap, bisection period, stopping width and which end to return
 * @returns the root (an exact zero when one is met)
 * @throws never (a numeric core: no argument checks)
 * @example
 * ```ts
 * bracketRoot((x) => x * x - 2, 0, 2, { maxIterations: 400, bisectEvery: 5, relWidth: 2 * Number.EPSILON, result: "smaller-residual" });
 * //=> 1.4142135623730951
 * ```
 */
export function bracketRoot(f: (x: number) => number, a: number, b: number, options: BracketRootOptions): number {
  const { maxIterations, bisectEvery, relWidth } = options;
  let x0 = a;
  let x1 = b;
  let f0 = f(x0);
  let f1 = f(x1);
  if (f0 === 0) return x0;
  if (f1 === 0) return x1;
  if ((f0 > 0 && f1 > 0) || (f0 < 0 && f1 < 0)) return Math.abs(f0) < Math.abs(f1) ? x0 : x1;
  for (let i = 0; i < maxIterations; i++) {
    let x2 = x1 - (f1 * (x1 - x0)) / (f1 - f0);
    const lo = Math.min(x0, x1);
    const hi = Math.max(x0, x1);
    if (!(x2 > lo && x2 < hi) || i % bisectEvery === bisectEvery - 1) x2 = 0.5 * (lo + hi);
    const f2 = f(x2);
    if (f2 === 0) return x2;
    if ((f2 < 0 && f1 > 0) || (f2 > 0 && f1 < 0)) {
      x0 = x1;
      f0 = f1;
    } else {
      f0 /= 2; // Illinois step: keep x0, halve its value
    }
    x1 = x2;
    f1 = f2;
    if (Math.abs(x1 - x0) <= relWidth * Math.max(Math.abs(x0), Math.abs(x1))) break;
  }
  return options.result === "latest" || !(Math.abs(f0) < Math.abs(f1)) ? x1 : x0;
}
