/**
 * Real roots of a real cubic, in closed form.
 *
 * Method: the trigonometric form for three real roots and Cardano's formula
 * for one (W. H. Press et al., "Numerical Recipes", 2nd ed., 1992, sec. 5.6,
 * eqs. 5.6.10-5.6.12, from memory), each root then polished by Newton steps
 * on the cubic itself. Accuracy: a few ulps relative for a simple root; a
 * double root is found to about the square root of the rounding error
 * (1e-8 relative), as for any method working on the coefficients.
 *
 * No checks (a numeric core): callers pass finite coefficients with `c3 != 0`.
 *
 * @module
 */

const TWO_PI = 2 * Math.PI;

/** Newton steps on the monic cubic `u^3 + a u^2 + b u + c` from `root`. */
function polish(root: number, a: number, b: number, c: number): number {
  let r = root;
  for (let k = 0; k < 4; k++) {
    const f = ((r + a) * r + b) * r + c;
    const df = (3 * r + 2 * a) * r + b;
    if (df === 0 || f === 0) break;
    const step = f / df;
    r -= step;
    if (Math.abs(step) <= 1e-16 * Math.abs(r)) break;
  }
  return r;
}

/**
 * The real roots of `c3 u^3 + c2 u^2 + c1 u + c0` (`c3 != 0`): three (ascending) when
 * the discriminant says so, else one.
 *
 * @param c3 - cubic coefficient (not 0)
 * @param c2 - quadratic coefficient
 * @param c1 - linear coefficient
 * @param c0 - constant
 * @returns the real roots, ascending
 * @throws never
 * @example
 * ```ts
 * cubicRealRoots(1, -6, 11, -6); //=> [1, 2, 3] (to a few ulps)
 * ```
 */
export function cubicRealRoots(c3: number, c2: number, c1: number, c0: number): number[] {
  const a = c2 / c3;
  const b = c1 / c3;
  const c = c0 / c3;
  const q = (a * a - 3 * b) / 9;
  const r = (2 * a * a * a - 9 * a * b + 27 * c) / 54;
  if (q > 0 && r * r < q * q * q) {
    const theta = Math.acos(Math.max(-1, Math.min(1, r / Math.sqrt(q * q * q))));
    const m = -2 * Math.sqrt(q);
    const out = [theta, theta + TWO_PI, theta - TWO_PI].map((t) => polish(m * Math.cos(t / 3) - a / 3, a, b, c));
    return out.sort((x, y) => x - y);
  }
  const big = -Math.sign(r) * Math.cbrt(Math.abs(r) + Math.sqrt(r * r - q * q * q));
  return [polish(big + (big === 0 ? 0 : q / big) - a / 3, a, b, c)];
}

/**
 * The real root of `c3 u^3 + c2 u^2 + c1 u + c0` (`c3 > 0`) nearest to `near`.
 *
 * @param c3 - cubic coefficient (positive)
 * @param c2 - quadratic coefficient
 * @param c1 - linear coefficient
 * @param c0 - constant
 * @param near - the value the wanted root is closest to
 * @returns that root
 * @throws never
 * @example
 * ```ts
 * nearestRealRoot(1, -6, 11, -6, 2.2); //=> 2
 * ```
 */
export function nearestRealRoot(c3: number, c2: number, c1: number, c0: number, near: number): number {
  let best = NaN;
  for (const r of cubicRealRoots(c3, c2, c1, c0)) if (!(Math.abs(r - near) >= Math.abs(best - near))) best = r;
  return best;
}
