/**
 * Phase and group delay of an analog transfer function on the jw axis, from
 * the factored form.
 *
 * - `phase` sums the continuous arguments of the factors, so it is unwrapped
 *   analytically rather than by detecting jumps: `arg(jw - r) = atan2(w - Im r, -Re r)`
 *   on a branch continuous in `w >= 0`. Zeros on the jw axis add the jump of
 *   +pi that `H` has when it passes through zero (the limit from Re s > 0).
 *   The whole curve is shifted by a multiple of 2 pi so that its limit at
 *   `w -> 0+` lies in (-pi, pi]; it therefore does not depend on the grid.
 * - `groupDelay` is the exact derivative `tau(w) = -d phase/dw
 *   = sum_poles -Re p / ((w - Im p)^2 + Re p^2) - sum_zeros -Re z / ((w - Im z)^2 + Re z^2)`
 *   (each term is the derivative of `atan2(w - Im r, -Re r)`; the
 *   continuous-time counterpart of the pole/zero group-delay sum in
 *   A. V. Oppenheim and R. W. Schafer, "Discrete-Time Signal Processing",
 *   3rd ed., Pearson 2010, chapter 5; zeros on the jw axis contribute 0
 *   away from the zero itself).
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";
import { isCascade, requireGrid, requireSystem } from "./check.ts";
import { checkNoAxisPole } from "./packed.ts";
import { fromSectionsUnchecked } from "./sections.ts";
import type { SectionCascade, Zpk } from "./types.ts";

/** Continuous argument of (jw - r) on w >= 0, before the global 2 pi shift. */
function factorArg(r: Complex, w: number): number {
  const c = r.re === 0 ? 0 : -r.re;
  const d = w - r.im;
  if (c >= 0) return Math.atan2(d, c); // LHP or axis: (-pi/2, pi/2], continuous (axis: +pi jump)
  // RHP root: atan2 jumps by +2 pi as d crosses 0 upwards; take the branch continuous in w.
  return d >= 0 ? Math.atan2(d, c) - 2 * Math.PI : Math.atan2(d, c);
}

/** Limit of factorArg as w -> 0+ (an origin root gives +pi/2). */
function factorArgAtZero(r: Complex): number {
  if (r.re === 0 && r.im === 0) return Math.PI / 2;
  return factorArg(r, 0);
}

/** Phase core for a zpk (no checks). */
export function zpkPhaseUnchecked(system: Zpk, w: Float64Array): Float64Array {
  const base = system.gain < 0 ? Math.PI : 0;
  let at0 = base;
  for (const z of system.zeros) at0 += factorArgAtZero(z);
  for (const p of system.poles) at0 -= factorArgAtZero(p);
  // shift so that the w -> 0+ value lies in (-pi, pi]
  const shift = -2 * Math.PI * Math.ceil((at0 - Math.PI) / (2 * Math.PI));
  const out = new Float64Array(w.length).fill(base + shift);
  for (const z of system.zeros) for (let k = 0; k < w.length; k++) out[k] = (out[k] as number) + factorArg(z, w[k] as number);
  for (const p of system.poles) for (let k = 0; k < w.length; k++) out[k] = (out[k] as number) - factorArg(p, w[k] as number);
  return out;
}

/**
 * Unwrapped phase of `H(jw)` in radians on a grid of non-negative angular
 * frequencies, as the sum of the continuous arguments of the factors (see
 * the module header): continuous in `w` except for a jump of +pi at each
 * jw-axis zero, and with its `w -> 0+` limit in (-pi, pi].
 *
 * @param system - a zpk transfer function or a section cascade
 * @param w - angular frequencies (rad/s), finite and >= 0, in any order
 * @returns phase in radians per grid point
 * @throws {@link InvalidArgumentError} when the system or grid is malformed, a frequency is negative, or a grid point is exactly a jw-axis pole
 * @example
 * ```ts
 * // three poles at -1: phase -3 atan(w)
 * phase(zpk([], Array(3).fill({ re: -1, im: 0 }), 1), Float64Array.of(1, 1e6)); //=> Float64Array [-2.356194490192345, -4.71238598038469]
 * ```
 */
export function phase(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  const fn = "phase";
  requireSystem(fn, "system", system);
  const grid = requireGrid(fn, "w", w, { nonNegative: true });
  const z = isCascade(system) ? fromSectionsUnchecked(system) : system;
  checkNoAxisPole(fn, z.poles, grid);
  return zpkPhaseUnchecked(z, grid);
}

/** Group delay core for a zpk (no checks). */
export function zpkGroupDelayUnchecked(system: Zpk, w: Float64Array): Float64Array {
  const out = new Float64Array(w.length);
  for (const [roots, sign] of [
    [system.poles, 1],
    [system.zeros, -1],
  ] as const) {
    for (const r of roots) {
      if (r.re === 0) continue; // jw-axis roots: zero delay away from the root itself
      const a = -r.re;
      for (let k = 0; k < w.length; k++) {
        // a / (d^2 + a^2) as (a / h) / h with h = hypot(d, a): no overflow or underflow
        const h = Math.hypot((w[k] as number) - r.im, a);
        out[k] = (out[k] as number) + (sign * (a / h)) / h;
      }
    }
  }
  return out;
}

/**
 * Group delay `tau(w) = -d phase / dw` in seconds (for `w` in rad/s), computed
 * exactly from the poles and zeros (see the module header). Zeros and poles on
 * the jw axis contribute 0 (their phase is piecewise constant).
 *
 * @param system - a zpk transfer function or a section cascade
 * @param w - angular frequencies (rad/s), finite
 * @returns group delay in seconds per grid point
 * @throws {@link InvalidArgumentError} when the system or grid is malformed
 * @example
 * ```ts
 * // one pole at -2: tau = 2 / (w^2 + 4)
 * groupDelay(zpk([], [{ re: -2, im: 0 }], 2), Float64Array.of(0, 2)); //=> Float64Array [0.5, 0.25]
 * ```
 */
export function groupDelay(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  const fn = "groupDelay";
  requireSystem(fn, "system", system);
  const grid = requireGrid(fn, "w", w);
  const z = isCascade(system) ? fromSectionsUnchecked(system) : system;
  return zpkGroupDelayUnchecked(z, grid);
}
