/**
 * The reflection and transmission polynomials of a doubly terminated
 * lossless ladder from a transfer function: the Feldtkeller equation
 * E(s)E(-s) = F(s)F(-s) + N(s)N(-s) (S21 = N/E, S11 = F/E), solved for F in
 * double-double arithmetic, then E recomputed from F and N so that the three
 * agree to double-double precision.
 *
 * Method (V. Belevitch, "Classical Network Theory", Holden-Day, 1968, ch. 9;
 * G. C. Temes and S. K. Mitra (eds.), "Modern Filter Theory and Design",
 * Wiley, 1973, ch. 3 (the characteristic function K = F/N)):
 * 1. In x = w^2 the matched characteristic polynomial P1(x) = |E(jw)|^2 - |N(jw)|^2
 *    of a prototype whose peak gain is 1 is >= 0 on x >= 0; its roots there are
 *    the reflection zeros, double. The prototype's poles are doubles, which
 *    splits those double roots by about sqrt(1e-16) and, for selective
 *    filters, by far more (the coefficients of |E|^2 cancel near high-Q poles),
 *    so the exact structure is restored rather than found from the
 *    coefficients: coefficients of P1 at x^0, x^1, ... below 1e-11 of the sum
 *    of the moduli of their terms are rounding of an exact zero (a reflection
 *    zero of that multiplicity at DC); the reflection zeros on the axis are
 *    the maxima of |H(jw)| equal to the peak, found from the factored form
 *    (see {@link axisReflectionZeros}); only what remains (the off-axis roots
 *    of Bessel and Legendre responses) is left to Aberth's iteration on the
 *    coefficients, divided by the known roots, and refined by Newton's
 *    iteration in double-double.
 * 2. For a power gain K = 1 - rho2 < 1 (unequal terminations),
 *    P(x) = P1(x) + rho2 |N(jw)|^2 has only simple roots.
 * 3. F takes, from each root x of P, the left-half-plane root of s^2 = -x
 *    (minimum-phase reflection zeros), and for a root on the positive axis
 *    (necessarily double) the pair s = +-j sqrt(x) once; F is monic.
 * 4. E is the Hurwitz factor of F(s)F(-s) + K N(s)N(-s): its roots in x by
 *    Aberth's iteration on double-double coefficients (polyRoots with lowParts),
 *    refined by Newton's iteration in complex double-double, then the
 *    left-half-plane square roots. E differs from the prototype's own pole
 *    polynomial by the prototype's rounding (about 1e-15 relative per pole),
 *    and agrees with F and N to about 1e-28 relative.
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";
import {
  cdd,
  cddSqrt,
  dd,
  ddAdd,
  ddMul,
  ddMulNum,
  ddNeg,
  ddSqrt,
  ddToNumber,
  DD_ONE,
  DD_ZERO,
  type CDD,
  type DD,
} from "../math/double-double.ts";
import {
  ddNewtonRealRoot,
  ddNewtonRoot,
  ddPolyAdd,
  ddPolyMirrorSquare,
  ddPolyMul,
  ddPolyScale,
  type DDPoly,
} from "../math/dd-polynomial.ts";
import { polyRoots } from "../math/roots.ts";
import { bracketRoot } from "../math/bracket.ts";
import type { Zpk } from "../tf/types.ts";

/** Relative size below which a low-order coefficient of P1 is taken as an exact zero. */
export const EXACT_ZERO_THRESHOLD = 1e-11;
/** A root of P1 left after the reflection zeros on the axis are divided out, this close (relative) to the positive axis, means the gain exceeds its peak. */
export const AXIS_THRESHOLD = 1e-5;

/** Real roots and the upper members of conjugate pairs of a real polynomial, in double-double. */
export interface XRoots {
  /** Real roots. */
  readonly real: readonly DD[];
  /** Members with positive imaginary part of the complex conjugate pairs. */
  readonly upper: readonly CDD[];
}

/** The reflection zeros found from P1, in x = w^2. */
export interface MatchedReflection {
  /** Multiplicity of the reflection zero at x = 0 (F has the factor s^m). */
  readonly atDc: number;
  /** Double roots on the positive axis (reflection zeros at w = sqrt(x)), ascending. */
  readonly onAxis: readonly DD[];
  /** The other (simple) roots. */
  readonly other: XRoots;
  /** Leading coefficient of P1. */
  readonly lead: DD;
}

/**
 * Polynomial with double-double coefficients from roots given as doubles
 * (conjugate-symmetric list), monic, times `scale`.
 *
 * @param roots - roots (conjugate pairs with exact conjugates)
 * @param scale - leading coefficient
 * @returns the polynomial, descending powers
 * @throws never (unchecked)
 * @example
 * ```ts
 * ddFromRoots([{ re: -1, im: 0 }], 2).map((c) => c.hi); //=> [2, 2]
 * ```
 */
export function ddFromRoots(roots: readonly Complex[], scale: number): DD[] {
  let p: DD[] = [dd(scale)];
  for (const r of roots) {
    if (r.im === 0) p = ddPolyMul(p, [DD_ONE, dd(-r.re)]);
    else if (r.im > 0) {
      const m2 = ddAdd(ddMul(dd(r.re), dd(r.re)), ddMul(dd(r.im), dd(r.im)));
      p = ddPolyMul(p, [DD_ONE, dd(-2 * r.re), m2]);
    }
  }
  return p;
}

/** Sum over a + b = 2j of |p_a p_b|: the size of the terms of coefficient j of p(s)p(-s) in x. */
function grossMirror(p: DDPoly): number[] {
  const n = p.length - 1;
  const a = p.map((c) => Math.abs(ddToNumber(c)));
  const out: number[] = [];
  for (let k = n; k >= 0; k--) {
    let acc = 0;
    // coefficient of s^(2k): indices i + j = 2n - 2k in descending layout
    for (let i = 0; i <= n; i++) {
      const j = 2 * n - 2 * k - i;
      if (j >= 0 && j <= n) acc += (a[i] as number) * (a[j] as number);
    }
    out.push(acc);
  }
  return out;
}

/** Aberth's iteration on double-double coefficients, each root refined by Newton in double-double. */
export function polishedRoots(q: DDPoly): XRoots {
  if (q.length <= 1) return { real: [], upper: [] };
  const raw = polyRoots(
    q.map((c) => c.hi),
    { lowParts: q.map((c) => c.lo) },
  );
  const real: DD[] = [];
  const upper: CDD[] = [];
  for (const r of raw) {
    if (r.im === 0) real.push(ddNewtonRealRoot(q, dd(r.re), 12));
    else if (r.im > 0) {
      const z = ddNewtonRoot(q, cdd(r.re, r.im), 12);
      upper.push(z.im.hi > 0 ? z : { re: z.re, im: ddNeg(z.im) });
    }
  }
  return { real, upper };
}

/** d/dw of ln |H(jw)|^2, in factored form (accurate near high-Q poles, unlike the coefficients). */
function logGainSlope(h: Zpk, w: number): number {
  let d = 0;
  for (const z of h.zeros) {
    const t = w - z.im;
    d += (2 * t) / (z.re * z.re + t * t);
  }
  for (const p of h.poles) {
    const t = w - p.im;
    d -= (2 * t) / (p.re * p.re + t * t);
  }
  return d;
}

/** Sum of the moduli of the terms of {@link logGainSlope}: the scale of its rounding. */
function logGainSlopeScale(h: Zpk, w: number): number {
  let d = 0;
  for (const r of [...h.zeros, ...h.poles]) {
    const t = w - r.im;
    d += Math.abs(2 * t) / (r.re * r.re + t * t);
  }
  return d;
}

/** Rounding level of the slope: sign changes smaller than this times its scale are noise (a flat response). */
const SLOPE_NOISE = 1e-12;

/** |H(jw)|^2 in factored form. */
function gainSquared(h: Zpk, w: number): number {
  let g = h.gain * h.gain;
  for (const z of h.zeros) g *= z.re * z.re + (w - z.im) * (w - z.im);
  for (const p of h.poles) g /= p.re * p.re + (w - p.im) * (w - p.im);
  return g;
}

const PEAK_SEARCH = Object.freeze({
  maxIterations: 200,
  bisectEvery: 5,
  relWidth: 2 * Number.EPSILON,
  result: "smaller-residual" as const,
});

/**
 * The frequencies w > 0 where |H(jw)| has a local maximum equal to the
 * peak gain 1 (the reflection zeros on the axis of a matched design): the
 * sign changes of d ln|H|^2 / dw on a grid of 4000 points up to the lowest
 * finite transmission zero (or twice the largest pole modulus), densified
 * around each pole (its frequency +- multiples of a quarter of its real
 * part), each refined by a bracketing root finder to a few ulp. Sign changes
 * within 1e-12 of the slope's own rounding scale are ignored (a maximally
 * flat response has none that are real).
 *
 * @param h - prototype with peak gain 1
 * @returns the reflection-zero frequencies ascending, or null when a maximum exceeds the peak by more than 1e-9
 * @throws never (unchecked)
 * @example
 * ```ts
 * axisReflectionZeros(chebyshev1(2, { rippleDb: 1 })); //=> [0.7071067811865477]
 * ```
 */
export function axisReflectionZeros(h: Zpk): number[] | null {
  let top = 0;
  for (const p of h.poles) top = Math.max(top, Math.hypot(p.re, p.im));
  let hi = 2 * top;
  for (const z of h.zeros) if (z.im > 0) hi = Math.min(hi, z.im);
  const grid: number[] = [];
  const count = 4000;
  for (let i = 1; i < count; i++) grid.push((hi * i) / count);
  for (const p of h.poles) {
    if (!(p.im > 0)) continue;
    for (let k = -12; k <= 12; k++) {
      const w = p.im + (k * Math.abs(p.re)) / 4;
      if (w > 0 && w < hi) grid.push(w);
    }
  }
  grid.sort((a, b) => a - b);
  const out: number[] = [];
  let prevW = grid[0] as number;
  let prevD = logGainSlope(h, prevW);
  for (let i = 1; i < grid.length; i++) {
    const w = grid[i] as number;
    if (w === prevW) continue;
    const d = logGainSlope(h, w);
    const noise = SLOPE_NOISE * logGainSlopeScale(h, w);
    if (prevD > noise && d < -noise) {
      const peak = bracketRoot((x) => logGainSlope(h, x), prevW, w, PEAK_SEARCH);
      const g2 = gainSquared(h, peak);
      if (g2 > 1 + 1e-9) return null;
      if (g2 >= 1 - 1e-9) out.push(peak);
    }
    prevW = w;
    prevD = d;
  }
  return out;
}

/**
 * Restore the exact structure of the matched characteristic polynomial
 * P1(x) = |E|^2 - |N|^2 (see the module header, step 1).
 *
 * @param h - the prototype (peak gain 1), for the reflection zeros on the axis
 * @param e - pole polynomial (monic), double-double
 * @param n - numerator polynomial with the prototype's gain, double-double
 * @returns the reflection zeros, or null when the gain exceeds 1 somewhere
 *   (a maximum above the peak, or a root of P1 left on the positive axis)
 * @throws never (unchecked)
 * @example
 * ```ts
 * const h = butterworth(3);
 * matchedReflection(h, ddFromRoots(h.poles, 1), [dd(h.gain)])?.atDc; //=> 3
 * ```
 */
export function matchedReflection(h: Zpk, e: DDPoly, n: DDPoly): MatchedReflection | null {
  const ee = ddPolyMirrorSquare(e);
  const nn = ddPolyMirrorSquare(n);
  const p1 = ddPolyAdd(ee, nn.map(ddNeg));
  const gross = ddPolyAdd(
    grossMirror(e).map((v) => dd(v)),
    grossMirror(n).map((v) => dd(v)),
  ).map((v) => v.hi);
  const deg = p1.length - 1;
  let atDc = 0;
  while (atDc < deg && Math.abs(ddToNumber(p1[deg - atDc] as DD)) <= EXACT_ZERO_THRESHOLD * (gross[deg - atDc] as number)) {
    atDc++;
  }
  // every reflection zero at DC (maximally flat): nothing on the axis to look for
  const peaks = atDc === deg ? [] : axisReflectionZeros(h);
  if (peaks === null) return null;
  const onAxis = peaks.map((w) => ddMul(dd(w), dd(w)));
  const lead = p1[0] as DD;
  const rest = deg - atDc - 2 * onAxis.length;
  if (rest < 0) return null;
  if (rest === 0) return { atDc, onAxis, other: { real: [], upper: [] }, lead };
  // the remaining roots are off the axis: divide out the known ones (remainders are rounding of zero)
  let q: DD[] = p1.slice(0, deg + 1 - atDc);
  for (const x of onAxis) {
    for (let k = 0; k < 2; k++) q = dividedByLinear(q, x);
  }
  const other = polishedRoots(q);
  for (const x of other.real) if (!(x.hi < 0)) return null;
  for (const z of other.upper) if (z.re.hi > 0 && Math.abs(z.im.hi) <= AXIS_THRESHOLD * z.re.hi) return null;
  return { atDc, onAxis, other, lead };
}

/** Quotient of p(x) by (x - r), synthetic division, remainder dropped. */
function dividedByLinear(p: DDPoly, r: DD): DD[] {
  const out: DD[] = [];
  let acc = DD_ZERO;
  for (let i = 0; i < p.length - 1; i++) {
    acc = ddAdd(ddMul(acc, r), p[i] as DD);
    out.push(acc);
  }
  return out;
}

/**
 * P1 rebuilt from its restored roots: lead x^atDc prod (x - x_d)^2 prod (x - x_i).
 *
 * @param m - the restored reflection zeros
 * @returns P1 in x, double-double, descending
 * @throws never (unchecked)
 * @example
 * ```ts
 * matchedPolynomial({ atDc: 2, onAxis: [], other: { real: [], upper: [] }, lead: dd(1) }).length; //=> 3
 * ```
 */
export function matchedPolynomial(m: MatchedReflection): DD[] {
  let p: DD[] = [m.lead];
  for (let i = 0; i < m.atDc; i++) p.push(dd(0));
  for (const x of m.onAxis) {
    const f: DD[] = [DD_ONE, ddNeg(x)];
    p = ddPolyMul(ddPolyMul(p, f), f);
  }
  for (const x of m.other.real) p = ddPolyMul(p, [DD_ONE, ddNeg(x)]);
  for (const z of m.other.upper) {
    const m2 = ddAdd(ddMul(z.re, z.re), ddMul(z.im, z.im));
    p = ddPolyMul(p, [DD_ONE, ddMulNum(z.re, -2), m2]);
  }
  return p;
}

/**
 * Monic product of (s - sigma) over sigma = the left-half-plane root of
 * s^2 = -x, for the given roots x (none on the non-negative real axis).
 *
 * @param roots - roots in x
 * @returns the polynomial in s, double-double
 * @throws never (unchecked)
 * @example
 * ```ts
 * leftFactor({ real: [dd(-1)], upper: [] }).map((c) => c.hi); //=> [1, 1]
 * ```
 */
export function leftFactor(roots: XRoots): DD[] {
  let p: DD[] = [DD_ONE];
  for (const x of roots.real) {
    // x < 0: sigma = -sqrt(-x)
    p = ddPolyMul(p, [DD_ONE, ddSqrt(ddNeg(x))]);
  }
  for (const z of roots.upper) {
    let sigma = cddSqrt({ re: ddNeg(z.re), im: ddNeg(z.im) });
    if (sigma.re.hi > 0) sigma = { re: ddNeg(sigma.re), im: ddNeg(sigma.im) };
    // the conjugate root of x gives the conjugate sigma
    const m2 = ddAdd(ddMul(sigma.re, sigma.re), ddMul(sigma.im, sigma.im));
    p = ddPolyMul(p, [DD_ONE, ddMulNum(sigma.re, -2), m2]);
  }
  return p;
}

/**
 * The monic reflection polynomial F for power gain 1 - rho2 at the peaks
 * (steps 2 and 3 of the module header).
 *
 * @param m - restored reflection zeros of the matched case
 * @param n - numerator polynomial (with the prototype's gain)
 * @param rho2 - |S11|^2 at the transmission peaks, 0 for matched terminations
 * @returns F in s, double-double, monic
 * @throws never (unchecked)
 * @example
 * ```ts
 * reflectionPolynomial(m, n, 0); // s^3 for a third-order Butterworth
 * ```
 */
export function reflectionPolynomial(m: MatchedReflection, n: DDPoly, rho2: number): DD[] {
  if (rho2 === 0) {
    let f: DD[] = [DD_ONE];
    for (let i = 0; i < m.atDc; i++) f.push(dd(0));
    for (const x of m.onAxis) f = ddPolyMul(f, [DD_ONE, dd(0), x]);
    return ddPolyMul(f, leftFactor(m.other));
  }
  const p = ddPolyAdd(matchedPolynomial(m), ddPolyScale(ddPolyMirrorSquare(n), dd(rho2)));
  const lead = p[0] as DD;
  const monic = p.map((c) => ddMul(c, ddDivOne(lead)));
  return leftFactor(polishedRoots(monic));
}

function ddDivOne(a: DD): DD {
  // 1 / a in double-double, one Newton step on the double reciprocal
  const x = 1 / a.hi;
  const r = ddAdd(DD_ONE, ddNeg(ddMulNum(a, x)));
  return ddAdd(dd(x), ddMulNum(r, x));
}

/**
 * The Hurwitz factor E of F(s)F(-s) + K N(s)N(-s), with the leading
 * coefficient of F (step 4 of the module header).
 *
 * @param f - reflection polynomial, monic
 * @param n - numerator polynomial
 * @param k - power gain at the peaks, 1 - rho2
 * @returns E in s, double-double, monic; null when a root falls on the axis
 * @throws never (unchecked)
 * @example
 * ```ts
 * hurwitzFactor([dd(1), dd(0)], [dd(1)], 1)?.map((c) => c.hi); //=> [1, 1]
 * ```
 */
export function hurwitzFactor(f: DDPoly, n: DDPoly, k: number): DD[] | null {
  const q = ddPolyAdd(ddPolyMirrorSquare(f), ddPolyScale(ddPolyMirrorSquare(n), dd(k)));
  const roots = polishedRoots(q);
  for (const x of roots.real) if (!(x.hi < 0)) return null;
  return leftFactor(roots);
}
