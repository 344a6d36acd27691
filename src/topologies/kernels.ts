/**
 * Closed-form building blocks of the stage responses: the single-pole
 * op-amp's open-loop gain and the transfers of the non-inverting amplifier,
 * the inverting amplifier, the inverting summer and the multiple-feedback
 * network, each with a finite open-loop gain `a` (or `null` for the ideal
 * op-amp). They are exact for an op-amp modelled as a voltage-controlled
 * voltage source of gain `a(s)` without output resistance (nodal analysis of
 * the virtual-earth node; e.g. L. P. Huelsman & P. E. Allen, "Introduction to
 * the Theory and Design of Active Filters", McGraw-Hill, 1980, chapter on
 * op-amp non-idealities, from memory), to the rounding of a few complex
 * operations (about 1e-15 relative).
 *
 * The same transfers as real polynomials ({@link PolynomialCore}): with
 * `1/A(s) = g0 + g1 z` (z = s/scale; `g0 = 1/a0`, `g1 = scale/(2 pi GBW)`,
 * both 0 for the ideal op-amp) every coefficient is a sum of products of
 * positive part terms wherever the circuit allows (derived here from the
 * same nodal equations), so it carries a few ulps of relative error.
 *
 * Numeric cores: no argument checks; the topology framework (`define.ts`)
 * checks values and frequencies before it calls them.
 *
 * @module
 */
import { TWO_PI } from "../units/constants.ts";
import { cadd, cdiv, cmul, cneg, complex, csub, type Complex } from "../math/complex.ts";
import type { ComponentValues } from "./types.ts";

/** Closed-form response of a stage: `H(s)` given its values and the op-amp open-loop gain `a` (`null` = ideal). */
export type ClosedForm = (v: ComponentValues, s: Complex, a: Complex | null) => Complex;

/**
 * Closed-form as-built polynomials of a stage: writes `N(z)` and `D(z)`,
 * `H(s) = N(z)/D(z)` with `z = s / scale`, in ascending powers (`num[k]`
 * multiplies z^k) into zeroed arrays of length degree + 1, for an op-amp
 * whose inverse open-loop gain is `1/A = g0 + g1 z` (`g0 = g1 = 0`: ideal).
 * `x` holds the component values in the topology's component order.
 */
export type PolynomialCore = (x: Float64Array, g0: number, g1: number, scale: number, num: Float64Array, den: Float64Array) => void;

/**
 * Open-loop gain of the single-pole model at `s`: `a0 / (1 + s a0 / (2 pi GBW))`.
 *
 * @param m - DC gain and gain-bandwidth product
 * @param s - complex frequency (rad/s)
 * @returns `A(s)`
 * @throws never
 * @example
 * ```ts
 * openLoopGain({ a0: 1e5, gbwHz: 1e6 }, { re: 0, im: 0 }); //=> { re: 100000, im: 0 }
 * ```
 */
export function openLoopGain(m: { readonly a0: number; readonly gbwHz: number }, s: Complex): Complex {
  // a0 / (1 + s a0 / (2 pi GBW)) = 1 / (1/a0 + s / (2 pi GBW))
  const tau = 1 / (TWO_PI * m.gbwHz);
  return cdiv(complex(1), { re: 1 / m.a0 + s.re * tau, im: s.im * tau });
}

/**
 * Effective gain of a non-inverting amplifier with feedback fraction beta:
 * `a / (1 + a beta)`, or `1/beta` when ideal.
 *
 * @param a - open-loop gain, or `null` for the ideal op-amp
 * @param beta - feedback fraction (0, 1]
 * @returns the closed-loop gain
 * @throws never
 * @example
 * ```ts
 * nonInvertingGain(null, 0.5); //=> { re: 2, im: 0 }
 * ```
 */
export function nonInvertingGain(a: Complex | null, beta: number): Complex {
  if (a === null) return complex(1 / beta);
  return cdiv(a, { re: 1 + a.re * beta, im: a.im * beta });
}

/**
 * Inverting amplifier with a virtual-earth node: input admittance `y1` from
 * the source, feedback admittance `y2` to the output:
 * `H = -y1 / (y2 + (y1 + y2) / a)`.
 *
 * @param y1 - input admittance
 * @param y2 - feedback admittance
 * @param a - open-loop gain, or `null` for the ideal op-amp
 * @returns the transfer
 * @throws never
 * @example
 * ```ts
 * invertingGain({ re: 1e-3, im: 0 }, { re: 5e-4, im: 0 }, null); //=> { re: -2, im: 0 }
 * ```
 */
export function invertingGain(y1: Complex, y2: Complex, a: Complex | null): Complex {
  const den = a === null ? y2 : cadd(y2, cdiv(cadd(y1, y2), a));
  return cdiv(cneg(y1), den);
}

/**
 * Inverting summer with finite gain: inputs `vk` through conductances `Gk`,
 * feedback conductance `gf`: `out = -sum(Gk vk) / (gf + (sum(Gk) + gf)/a)`.
 *
 * @param terms - `[Gk, vk]` pairs (conductance in S, input voltage)
 * @param gf - feedback conductance, S
 * @param a - open-loop gain, or `null` for the ideal op-amp
 * @returns the output
 * @throws never
 * @example
 * ```ts
 * summer([[1e-4, { re: 1, im: 0 }]], 1e-4, null); //=> { re: -1, im: 0 }
 * ```
 */
export function summer(terms: readonly (readonly [number, Complex])[], gf: number, a: Complex | null): Complex {
  let num: Complex = complex(0);
  let conductanceSum = gf;
  for (const [gk, vk] of terms) {
    num = cadd(num, { re: gk * vk.re, im: gk * vk.im });
    conductanceSum += gk;
  }
  const den = a === null ? complex(gf) : cadd(complex(gf), cdiv(complex(conductanceSum), a));
  return cdiv(cneg(num), den);
}

/**
 * Multiple-feedback kernel: `y1` input to node a, `y2` a to ground, `y3` a to
 * the inverting input n, `y4` a to output, `y5` n to output; non-inverting
 * input grounded; open-loop gain `a` (`null` = ideal):
 * `H = -y1 y3 / ( ((y3 + y5)/a + y5) (y1+y2+y3+y4) + y3 y4 - y3^2/a )`
 * (written without dividing by `y3`, which vanishes at 0 Hz in some stages).
 *
 * @param y - the five admittances `[y1, y2, y3, y4, y5]`
 * @param a - open-loop gain, or `null` for the ideal op-amp
 * @returns the transfer
 * @throws never
 * @example
 * ```ts
 * const g = { re: 1e-4, im: 0 }, z = { re: 0, im: 0 };
 * mfbKernel([g, z, g, g, g], null); //=> { re: -0.25, im: 0 }
 * ```
 */
export function mfbKernel(y: readonly [Complex, Complex, Complex, Complex, Complex], a: Complex | null): Complex {
  const [y1, y2, y3, y4, y5] = y;
  const ya = cadd(cadd(y1, y2), cadd(y3, y4));
  const t = a === null ? y5 : cadd(cdiv(cadd(y3, y5), a), y5);
  let den = cadd(cmul(t, ya), cmul(y3, y4));
  if (a !== null) den = csub(den, cdiv(cmul(y3, y3), a));
  return cdiv(cneg(cmul(y1, y3)), den);
}

/**
 * The multiple-feedback kernel ({@link mfbKernel}) as polynomials: each
 * admittance is linear in z, `y_i = y[2i] + y[2i+1] z` (a conductance, or a
 * capacitance times the scale), and `1/A = g0 + g1 z`. Multiplying the
 * kernel through by `a` gives, with `Y = y1+y2+y3+y4`,
 * `N = -y1 y3` and `D = y5 Y + y3 y4 + (1/A) (y3 (y1+y2+y4) + y5 Y)`
 * (the `-y3^2/a` term absorbed, so every coefficient is a sum of positive
 * products; derived here from the kernel's nodal equations).
 *
 * @param y - the five admittances as ten numbers (constant, z coefficient)
 * @param g0 - constant part of 1/A
 * @param g1 - z coefficient of 1/A
 * @param num - numerator, ascending, 3 entries (written)
 * @param den - denominator, ascending, 4 entries (written)
 * @returns nothing
 * @throws never
 * @example
 * ```ts
 * const num = new Float64Array(3), den = new Float64Array(4);
 * mfbPolynomials(Float64Array.of(1e-4, 0, 0, 0, 1e-4, 0, 1e-4, 0, 1e-4, 0), 0, 0, num, den);
 * num[0] / den[0]; //=> -0.25
 * ```
 */
export function mfbPolynomials(y: Float64Array, g0: number, g1: number, num: Float64Array, den: Float64Array): void {
  const p1 = y[0] as number;
  const q1 = y[1] as number;
  const p3 = y[4] as number;
  const q3 = y[5] as number;
  const p4 = y[6] as number;
  const q4 = y[7] as number;
  const p5 = y[8] as number;
  const q5 = y[9] as number;
  const xp = p1 + (y[2] as number) + p4; // y1 + y2 + y4
  const xq = q1 + (y[3] as number) + q4;
  const yp = xp + p3; // Y
  const yq = xq + q3;
  // y5 Y + y3 y4
  const d0 = p5 * yp + p3 * p4;
  const d1 = p5 * yq + q5 * yp + p3 * q4 + q3 * p4;
  const d2 = q5 * yq + q3 * q4;
  // y3 (y1 + y2 + y4) + y5 Y
  const b0 = p3 * xp + p5 * yp;
  const b1 = p3 * xq + q3 * xp + p5 * yq + q5 * yp;
  const b2 = q3 * xq + q5 * yq;
  den[0] = d0 + g0 * b0;
  den[1] = d1 + g0 * b1 + g1 * b0;
  den[2] = d2 + g0 * b2 + g1 * b1;
  den[3] = g1 * b2;
  num[0] = -(p1 * p3);
  num[1] = -(p1 * q3 + q1 * p3);
  num[2] = -(q1 * q3);
}
