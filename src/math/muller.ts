/**
 * A root of an analytic complex function near a starting point.
 *
 * Method: Muller's method (D. E. Muller, "A method for solving algebraic
 * equations using an automatic computer", Mathematical Tables and Other Aids
 * to Computation 10(56):208-215, 1956): the quadratic through the last three
 * iterates is solved for its root nearest the latest one, in the rewritten
 * form `x - 2 f / (b +- sqrt(b^2 - 4 a f))` with the sign that gives the
 * denominator of larger magnitude. It needs no derivative and can leave
 * the real axis, so it finds complex roots from a real start; its order of
 * convergence on a simple root is about 1.84.
 *
 * Accuracy: the iteration stops when a step is smaller than `1e-13 * scale`
 * or `f` vanishes exactly, so a simple root is found to about 1e-13 of the
 * neighbourhood size; it gives up after 100 steps or on a non-finite iterate.
 *
 * @module
 */
import { cadd, cdiv, cmul, csqrt, csub, type Complex } from "./complex.ts";

/**
 * A root of `f` near `start` by Muller's method (see the module header). The
 * first two extra points lie `0.01 * scale` to either side of `start`.
 *
 * @param f - analytic function
 * @param start - starting point
 * @param scale - size of the neighbourhood (sets the first step and the stopping test)
 * @returns the root, or `null` when the iteration fails or does not settle in 100 steps
 * @throws never (a numeric core: no argument checks)
 * @example
 * ```ts
 * mullerRoot((z) => ({ re: z.re * z.re - z.im * z.im + 1, im: 2 * z.re * z.im }), { re: 0.1, im: 0.9 }, 1);
 * //=> { re: 0, im: 1 } (to about 1e-16)
 * ```
 */
export function mullerRoot(f: (s: Complex) => Complex, start: Complex, scale: number): Complex | null {
  let x0: Complex = { re: start.re - 0.01 * scale, im: start.im };
  let x1: Complex = { re: start.re + 0.01 * scale, im: start.im + 0.005 * scale };
  let x2: Complex = start;
  let f0 = f(x0);
  let f1 = f(x1);
  let f2 = f(x2);
  for (let it = 0; it < 100; it++) {
    const h1 = csub(x1, x0);
    const h2 = csub(x2, x1);
    const d1 = cdiv(csub(f1, f0), h1);
    const d2 = cdiv(csub(f2, f1), h2);
    const a = cdiv(csub(d2, d1), cadd(h2, h1));
    const b = cadd(cmul(a, h2), d2);
    const disc = csqrt(csub(cmul(b, b), cmul({ re: 4 * f2.re, im: 4 * f2.im }, a)));
    const e1 = cadd(b, disc);
    const e2 = csub(b, disc);
    const den = Math.hypot(e1.re, e1.im) >= Math.hypot(e2.re, e2.im) ? e1 : e2;
    if (den.re === 0 && den.im === 0) return null;
    const dx = cdiv({ re: -2 * f2.re, im: -2 * f2.im }, den);
    x0 = x1;
    f0 = f1;
    x1 = x2;
    f1 = f2;
    x2 = cadd(x2, dx);
    if (!Number.isFinite(x2.re) || !Number.isFinite(x2.im)) return null;
    f2 = f(x2);
    if (Math.hypot(dx.re, dx.im) <= 1e-13 * scale || (f2.re === 0 && f2.im === 0)) return x2;
  }
  return null;
}
