/**
 * Third-order single-amplifier lowpass and highpass stages: a real pole and
 * a pole pair from one unity-gain follower, the passive RC section in front
 * of a Sallen-Key stage with its loading designed in rather than buffered
 * away (a third-order extension of R. P. Sallen & E. L. Key, "A practical
 * method of designing RC active filters", IRE Trans. Circuit Theory
 * CT-2(1):74-85, 1955; third-order single-amplifier sections are tabulated
 * in G. S. Moschytz & P. Horn, "Active Filter Design Handbook", Wiley, 1981,
 * from memory). The transfer functions and design equations below are
 * derived here from the nodal equations (not from either source) and checked
 * against nodal analysis (MNA) and ngspice in the tests.
 *
 * Lowpass parts: R1 in -> a, C1 a -> 0, R2 a -> b, C2 b -> out (feedback),
 * R3 b -> c, C3 c -> 0, U1 follower with its + input at c.
 *
 *   H(s) = 1 / (1 + b1 s + b2 s^2 + b3 s^3)
 *   b1 = C1 R1 + C3 (R1 + R2 + R3)
 *   b2 = C1 C3 R1 (R2 + R3) + C2 C3 R3 (R1 + R2)
 *   b3 = C1 C2 C3 R1 R2 R3
 *
 * Highpass parts (the RC-CR dual): C1 in -> a, R1 a -> 0, C2 a -> b,
 * R2 b -> out (feedback), C3 b -> c, R3 c -> 0, the same follower.
 *
 *   H(s) = d3 s^3 / (1 + d1 s + d2 s^2 + d3 s^3)
 *   d1 = C1 R1 + C2 (R1 + R2) + C3 R2
 *   d2 = R1 R2 (C1 C2 + C1 C3 + C2 C3) + C2 C3 R2 R3
 *   d3 = C1 C2 C3 R1 R2 R3
 *
 * Both have gain 1 (DC for the lowpass, high frequency for the highpass;
 * `fixedGain`). A target gives the pole pair (f0, Q) and the real pole
 * (`realPoleHz`, wp); the wanted denominator is
 * `(1 + s/wp)(1 + s/(Q w0) + s^2/w0^2)`, i.e. a1 = 1/wp + 1/(Q w0),
 * a2 = 1/w0^2 + 1/(Q w0 wp), a3 = 1/(wp w0^2), and the design matches
 * b1..b3 (d1..d3) to them exactly.
 *
 * Lowpass design: C1 = C2 = C and C3 = C/m (`capacitorRatio` m = C1/C3), so
 * two of the three capacitors are the level capacitor itself and only C3
 * needs a second stock value. With R1 = p, the first and third equations
 * give R2 + R3 and R2 R3 as functions of p and the second gives R3; what is
 * left is one equation f(p) = (S - R3) R3 - P = 0 on 0 < p < a1/(C1 + C3),
 * solved by a scan (256 points, cubic spacing, no transcendental functions)
 * and bisection to the last bit; among the roots with R2, R3 > 0 the one
 * with the least resistor spread is taken. Like the second-order
 * unity-gain stage's 4Q^2, a solution exists only above a smallest ratio
 * m_min (found by bisection on that existence test), where the two roots
 * merge; the default is m = 1.25 m_min (resistor spread 1.4-3 for the
 * low-Q pairs this stage is chosen for: Butterworth, Bessel, low-ripple
 * Chebyshev), so that stock values of C3 around the exact one still have a
 * solution. `capacitor` sets C1 (= C2), `resistor` R1 (default 10 kOhm).
 *
 * Highpass design: C1 = C2 = C3 = C (every capacitor the level value), and
 * the resistors follow in closed form: d1 = 2 (R1 + R2), d2 = R2 (3 R1 + R3)
 * and d3 = R1 R2 R3 give the cubic `3 R1^3 - 1.5 a1 R1^2 + a2 R1 - a3 = 0`
 * (math/cubic.ts), R2 = a1/2 - R1, R3 = a3/(R1 R2); the root with the least
 * resistor spread is taken. No design exists for some higher-Q pairs (the
 * cubic has no root in range): then the stage is refused and a first-order
 * stage with a second-order one is the choice. `capacitor` sets C1,
 * `resistor` R1.
 *
 * Figures of any values (ideal op-amp): the denominator's real root (math/cubic.ts;
 * where three are real, the one leaving the pair with the highest Q) is
 * the real pole, the deflated quadratic gives f0 and Q.
 *
 * With the op-amp (`1/A = e`), the follower's input is (1 + e) out and
 * `H = N / (B + e E)` with B the ideal denominator above and
 * - lowpass: E = 1 + (C1 R1 + C2 (R1 + R2) + C3 (R1 + R2 + R3)) s
 *   + (C1 C2 R1 R2 + C1 C3 R1 (R2 + R3) + C2 C3 R3 (R1 + R2)) s^2 + b3 s^3
 * - highpass: E = 1 + (C1 R1 + C2 (R1 + R2) + C3 (R2 + R3)) s
 *   + (R1 R2 (C1 C2 + C1 C3 + C2 C3) + C1 C3 R1 R3 + C2 C3 R3 (R1 + R2)) s^2 + d3 s^3
 * (degree 3 + 1 with the single-pole model; every coefficient a sum of
 * positive terms, so the polynomials carry no cancellation; a few ulps per
 * coefficient).
 *
 * Sensitivity: the positive feedback through C2 (R2) raises the pair's Q
 * from the passive RC ladder's, as in the second-order stage; the planner
 * uses this stage for pairs up to about Q 1.3 (its score), where the yield
 * check judges it on toleranced boards like any other stage, and falls back
 * to a first-order stage plus a second-order one when it misses.
 *
 * @module
 */
import type { ComponentValues, StageChoices, StageFigures, StageTarget, Topology } from "./types.ts";
import { cadd, cdiv, cmul, complex, cscale, type Complex } from "../math/complex.ts";
import { cubicRealRoots } from "../math/cubic.ts";
import { TWO_PI } from "../units/constants.ts";
import { defineTopology } from "./define.ts";
import { atLeast, indexedFigures, type PartSpec } from "./spec.ts";
import type { PolynomialCore } from "./kernels.ts";
import { InvalidArgumentError } from "../errors.ts";
import { requirePositive } from "../validate.ts";

const REF =
  'R. P. Sallen & E. L. Key, IRE Trans. Circuit Theory CT-2(1):74-85, 1955 (third-order extension); G. S. Moschytz & P. Horn, "Active Filter Design Handbook", Wiley, 1981, third-order single-amplifier sections (from memory); equations derived here by nodal analysis';

/** Largest capacitor ratio C1/C3 the lowpass is designed with (a wider spread is refused). */
export const THIRD_ORDER_MAX_RATIO = 1000;
/** The lowpass's default ratio over its smallest one. */
const RATIO_MARGIN = 1.25;
/** Points of the lowpass's scan for R1. */
const SCAN_POINTS = 256;

const lowParts: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "a" },
  { kind: "C", name: "C1", a: "a", b: "0" },
  { kind: "R", name: "R2", a: "a", b: "b" },
  { kind: "C", name: "C2", a: "b", b: "out" },
  { kind: "R", name: "R3", a: "b", b: "c" },
  { kind: "C", name: "C3", a: "c", b: "0" },
  { kind: "OA", name: "U1", inP: "c", inN: "out", out: "out" },
];
const highParts: PartSpec[] = [
  { kind: "C", name: "C1", a: "in", b: "a" },
  { kind: "R", name: "R1", a: "a", b: "0" },
  { kind: "C", name: "C2", a: "a", b: "b" },
  { kind: "R", name: "R2", a: "b", b: "out" },
  { kind: "C", name: "C3", a: "b", b: "c" },
  { kind: "R", name: "R3", a: "c", b: "0" },
  { kind: "OA", name: "U1", inP: "c", inN: "out", out: "out" },
];
// component order: lowpass R1 C1 R2 C2 R3 C3, highpass C1 R1 C2 R2 C3 R3
const LOW = { r1: 0, c1: 1, r2: 2, c2: 3, r3: 4, c3: 5 } as const;
const HIGH = { c1: 0, r1: 1, c2: 2, r2: 3, c3: 4, r3: 5 } as const;

/** Ideal (B) and op-amp (E) coefficients of s, s^2, s^3 with s scaled by w, written to out[0..5]. */
function coefficientsInto(low: boolean, x: Float64Array, w: number, out: Float64Array): void {
  const ix = low ? LOW : HIGH;
  const r1 = x[ix.r1] as number;
  const r2 = x[ix.r2] as number;
  const r3 = x[ix.r3] as number;
  const c1 = (x[ix.c1] as number) * w;
  const c2 = (x[ix.c2] as number) * w;
  const c3 = (x[ix.c3] as number) * w;
  const p3 = c1 * c2 * c3 * r1 * r2 * r3;
  if (low) {
    out[0] = c1 * r1 + c3 * (r1 + r2 + r3);
    out[1] = c1 * c3 * r1 * (r2 + r3) + c2 * c3 * r3 * (r1 + r2);
    out[3] = c1 * r1 + c2 * (r1 + r2) + c3 * (r1 + r2 + r3);
    out[4] = c1 * c2 * r1 * r2 + c1 * c3 * r1 * (r2 + r3) + c2 * c3 * r3 * (r1 + r2);
  } else {
    out[0] = c1 * r1 + c2 * (r1 + r2) + c3 * r2;
    out[1] = r1 * r2 * (c1 * c2 + c1 * c3 + c2 * c3) + c2 * c3 * r2 * r3;
    out[3] = c1 * r1 + c2 * (r1 + r2) + c3 * (r2 + r3);
    out[4] = r1 * r2 * (c1 * c2 + c1 * c3 + c2 * c3) + c1 * c3 * r1 * r3 + c2 * c3 * r3 * (r1 + r2);
  }
  out[2] = p3;
  out[5] = p3;
}

/**
 * Real pole and pair of `1 + k1 u + k2 u^2 + k3 u^3` (u = s / unit), as
 * figures in Hz; where the cubic has three real roots, the real pole is the
 * one that leaves the pair with the highest Q.
 */
function splitCubic(k1: number, k2: number, k3: number, unit: number): { realPoleHz: number; f0Hz: number; q: number } {
  let best = { realPoleHz: NaN, f0Hz: NaN, q: -Infinity };
  for (const r of cubicRealRoots(k3, k2, k1, 1)) {
    // (u - r)(k3 u^2 + q1 u + q0): q1 = k2 + r k3, q0 = -1/r (from the constant term)
    const q1 = k2 + r * k3;
    const q0 = -1 / r;
    const qv = Math.sqrt(Math.abs(q0 * k3)) / q1;
    if (qv > best.q) best = { realPoleHz: (-r * unit) / TWO_PI, f0Hz: (Math.sqrt(Math.abs(q0 / k3)) * unit) / TWO_PI, q: qv };
  }
  return best;
}

const fig = new Float64Array(6);
function figuresKernel(low: boolean): (x: Float64Array) => StageFigures {
  const ix = low ? LOW : HIGH;
  return (x) => {
    const unit = 1 / ((x[ix.r1] as number) * (x[ix.c1] as number));
    coefficientsInto(low, x, unit, fig);
    const { realPoleHz, f0Hz, q } = splitCubic(fig[0] as number, fig[1] as number, fig[2] as number, unit);
    return { f0Hz, q, realPoleHz, gain: 1 };
  };
}

const xs = new Float64Array(6);
function closedForm(low: boolean, names: readonly string[]): (v: ComponentValues, s: Complex, a: Complex | null) => Complex {
  return (v, s, a) => {
    for (let i = 0; i < 6; i++) xs[i] = v[names[i] as string] as number;
    coefficientsInto(low, xs, 1, fig);
    const cubic = (k1: number, k2: number, k3: number): Complex => cadd(complex(1), cmul(s, cadd(complex(k1), cmul(s, cadd(complex(k2), cscale(s, k3))))));
    const b = cubic(fig[0] as number, fig[1] as number, fig[2] as number);
    const num = low ? complex(1) : cscale(cmul(s, cmul(s, s)), fig[2] as number);
    if (a === null) return cdiv(num, b);
    const e = cubic(fig[3] as number, fig[4] as number, fig[5] as number);
    return cdiv(num, cadd(b, cdiv(e, a)));
  };
}

const pc = new Float64Array(6);
/** As-built polynomials (ascending, z = s/w), `D = B + (g0 + g1 z) E` (header). */
function polynomialCore(low: boolean): PolynomialCore {
  return (x, g0, g1, w, num, den) => {
    coefficientsInto(low, x, w, pc);
    const b1 = pc[0] as number;
    const b2 = pc[1] as number;
    const b3 = pc[2] as number;
    const e1 = pc[3] as number;
    const e2 = pc[4] as number;
    const e3 = pc[5] as number;
    if (low) num[0] = 1;
    else num[3] = b3;
    den[0] = 1 + g0;
    den[1] = b1 + g0 * e1 + g1;
    den[2] = b2 + g0 * e2 + g1 * e1;
    den[3] = b3 + g0 * e3 + g1 * e2;
    den[4] = g1 * e3;
  };
}

/** The wanted denominator's coefficients with w0 = 1: a1, a2, a3. */
function wanted(t: StageTarget): [number, number, number] {
  const q = t.q as number;
  const rho = (t.realPoleHz as number) / t.f0Hz;
  return [1 / rho + 1 / q, 1 + 1 / (q * rho), 1 / rho];
}

/**
 * The lowpass's resistors for C1 = C2 = 1, C3 = c (w0 = 1), the root with
 * the least spread, or null when there is none.
 */
function lowResistors(a: readonly [number, number, number], c: number): [number, number, number] | null {
  const [a1, a2, a3] = a;
  const pmax = a1 / (1 + c);
  // R1 = p: R2 + R3 and R2 R3 from the first and third equations, R3 from the second
  const parts = (p: number): [number, number, number, number] => {
    const sum = (a1 - p * (1 + c)) / c;
    const prod = a3 / (c * p);
    const r3 = (a2 - c * p * sum - c * prod) / (c * p);
    return [p, sum - r3, r3, prod];
  };
  const f = (p: number): number => {
    const [, r2, r3, prod] = parts(p);
    return r2 * r3 - prod;
  };
  let best: [number, number, number] | null = null;
  let bestSpread = Infinity;
  let pPrev = 0;
  let fPrev = NaN;
  for (let k = 1; k < SCAN_POINTS; k++) {
    const u = k / SCAN_POINTS;
    const p = pmax * u * u * u;
    const fp = f(p);
    if (Number.isFinite(fPrev) && Number.isFinite(fp) && (fPrev < 0) !== (fp < 0)) {
      let lo = pPrev;
      let hi = p;
      const loNeg = fPrev < 0;
      for (let i = 0; i < 200; i++) {
        const mid = 0.5 * (lo + hi);
        if (mid <= lo || mid >= hi) break;
        if ((f(mid) < 0) === loNeg) lo = mid;
        else hi = mid;
      }
      const [r1, r2, r3] = parts(0.5 * (lo + hi));
      const r: [number, number, number] = [r1, r2, r3];
      if (r2 > 0 && r3 > 0 && Number.isFinite(r2) && Number.isFinite(r3)) {
        const spread = Math.max(...r) / Math.min(...r);
        if (spread < bestSpread) {
          bestSpread = spread;
          best = r;
        }
      }
    }
    pPrev = p;
    fPrev = fp;
  }
  return best;
}

/** Smallest capacitor ratio C1/C3 with a lowpass design (bisection on existence), or null above the largest ratio. */
const minRatioMemo = new Map<string, number | null>();
function lowMinRatio(a: readonly [number, number, number]): number | null {
  const key = `${a[0]} ${a[1]} ${a[2]}`;
  const memo = minRatioMemo.get(key);
  if (memo !== undefined) return memo;
  let out: number | null;
  if (lowResistors(a, 1 / THIRD_ORDER_MAX_RATIO) === null) out = null;
  else {
    let lo = 1e-3;
    let hi = THIRD_ORDER_MAX_RATIO;
    if (lowResistors(a, 1 / lo) !== null) out = lo;
    else {
      for (let i = 0; i < 60 && hi - lo > 1e-9 * hi; i++) {
        const mid = 0.5 * (lo + hi);
        if (lowResistors(a, 1 / mid) === null) lo = mid;
        else hi = mid;
      }
      out = hi;
    }
  }
  if (minRatioMemo.size > 4096) minRatioMemo.clear();
  minRatioMemo.set(key, out);
  return out;
}

/**
 * Smallest capacitor ratio C1/C3 (with C1 = C2) at which the third-order
 * lowpass reaches a real pole and pole pair, or null when no ratio up to
 * {@link THIRD_ORDER_MAX_RATIO} does.
 *
 * @param target - a third-order lowpass target (f0Hz, q, realPoleHz)
 * @returns the smallest ratio, or null
 * @throws `InvalidArgumentError` at `target`, `target.f0Hz`, `target.q` or `target.realPoleHz` when one is missing or not a positive number
 * @example
 * ```ts
 * thirdOrderLowpassMinRatio({ order: 3, kind: "lowpass", f0Hz: 1000, q: 1, realPoleHz: 1000, gain: 1 }); //=> about 8.1 (3rd-order Butterworth)
 * ```
 */
export function thirdOrderLowpassMinRatio(target: StageTarget): number | null {
  const fn = "thirdOrderLowpassMinRatio";
  if (target === null || typeof target !== "object") {
    throw new InvalidArgumentError({ fn, path: "target", received: target, message: "expected a stage target { order: 3, kind: \"lowpass\", f0Hz, q, realPoleHz, gain: 1 }" });
  }
  requirePositive(fn, "target.f0Hz", target.f0Hz);
  requirePositive(fn, "target.q", target.q);
  requirePositive(fn, "target.realPoleHz", target.realPoleHz);
  return lowMinRatio(wanted(target));
}

/**
 * The lowpass's ratio and resistors (w0 = 1): at the given ratio, or by
 * default at 1.25 times the smallest one (nearer it where existence is not
 * monotone in the ratio), or null when there is no design.
 */
function lowDesign(a: readonly [number, number, number], ratio: number | undefined): { m: number; r: [number, number, number] } | null {
  if (ratio !== undefined) {
    const r = lowResistors(a, 1 / ratio);
    return r === null ? null : { m: ratio, r };
  }
  const min = lowMinRatio(a);
  if (min === null) return null;
  for (const f of [RATIO_MARGIN, 1.1, 1.02, 1]) {
    const m = Math.min(THIRD_ORDER_MAX_RATIO, f * min);
    const r = lowResistors(a, 1 / m);
    if (r !== null) return { m, r };
  }
  return null;
}

/** The highpass's resistors for equal capacitors 1 (w0 = 1), the root with the least spread, or null. */
function highResistors(a: readonly [number, number, number]): [number, number, number] | null {
  const [a1, a2, a3] = a;
  let best: [number, number, number] | null = null;
  let bestSpread = Infinity;
  for (const r1 of cubicRealRoots(3, -1.5 * a1, a2, -a3)) {
    const r2 = a1 / 2 - r1;
    if (!(r1 > 0 && r2 > 0)) continue;
    const r3 = a3 / (r1 * r2);
    const spread = Math.max(r1, r2, r3) / Math.min(r1, r2, r3);
    if (Number.isFinite(spread) && spread < bestSpread) {
      bestSpread = spread;
      best = [r1, r2, r3];
    }
  }
  return best;
}

function pairLimit(t: StageTarget): string | null {
  const q = t.q as number;
  if (!(q > 0.5 * (1 + 1e-9))) {
    return `a third-order stage here realises a real pole with a complex pole pair (Q above 0.5), got Q = ${q}; build real poles as first-order stages`;
  }
  return null;
}

function lowLimits(t: StageTarget, c: StageChoices): string | null {
  const pair = pairLimit(t);
  if (pair !== null) return pair;
  if (c.resistorRatio !== undefined) return "the third-order lowpass takes capacitorRatio (C1/C3, with C2 = C1), not resistorRatio; drop resistorRatio";
  const min = lowMinRatio(wanted(t));
  if (min === null || (c.capacitorRatio === undefined && lowDesign(wanted(t), undefined) === null)) {
    return `a third-order single-amplifier lowpass at Q = ${t.q} with its real pole at ${t.realPoleHz} Hz needs a capacitor spread C1/C3 above ${THIRD_ORDER_MAX_RATIO}; build it as a first-order stage and a second-order stage`;
  }
  if (c.capacitorRatio !== undefined && (!atLeast(c.capacitorRatio, min) || lowResistors(wanted(t), 1 / c.capacitorRatio) === null)) {
    return `a third-order single-amplifier lowpass for this target needs C1/C3 of at least ${min.toPrecision(4)} (capacitorRatio ${c.capacitorRatio}); raise capacitorRatio or leave it unset for ${(RATIO_MARGIN * min).toPrecision(4)}`;
  }
  if (c.capacitorRatio !== undefined && c.capacitorRatio > THIRD_ORDER_MAX_RATIO) {
    return `the third-order lowpass's capacitorRatio may be at most ${THIRD_ORDER_MAX_RATIO} (got ${c.capacitorRatio}); lower it`;
  }
  return null;
}

function lowSolve(t: StageTarget, c: StageChoices): Record<string, number> {
  // `limits` has passed, so there is a design
  const { m, r } = lowDesign(wanted(t), c.capacitorRatio) ?? { m: NaN, r: [NaN, NaN, NaN] };
  const w0 = TWO_PI * t.f0Hz;
  return { R1: r[0] / w0, R2: r[1] / w0, R3: r[2] / w0, C1: 1, C2: 1, C3: 1 / m };
}

function highLimits(t: StageTarget, c: StageChoices): string | null {
  const pair = pairLimit(t);
  if (pair !== null) return pair;
  if (c.capacitorRatio !== undefined || c.resistorRatio !== undefined) {
    return "the third-order highpass uses three equal capacitors and takes no capacitorRatio or resistorRatio; drop them";
  }
  if (highResistors(wanted(t)) === null) {
    return `a third-order single-amplifier highpass with equal capacitors has no design at Q = ${t.q} with its real pole at ${t.realPoleHz} Hz; build it as a first-order stage and a second-order stage`;
  }
  return null;
}

function highSolve(t: StageTarget): Record<string, number> {
  const r = highResistors(wanted(t)) ?? [NaN, NaN, NaN];
  const w0 = TWO_PI * t.f0Hz;
  return { C1: 1, C2: 1, C3: 1, R1: r[0] / w0, R2: r[1] / w0, R3: r[2] / w0 };
}

function thirdOrder(kind: "lowpass" | "highpass"): Topology {
  const low = kind === "lowpass";
  const parts = low ? lowParts : highParts;
  const names = parts.filter((p) => p.kind !== "OA").map((p) => p.name);
  return defineTopology({
    id: `sallen-key-${kind}-third-order`,
    name: `Sallen-Key ${kind}, third order (unity gain)`,
    order: 3,
    kinds: [kind],
    inverting: false,
    reference: REF,
    levelCapacitor: "C1",
    levelResistor: "R1",
    parts,
    limits: low ? lowLimits : highLimits,
    solve: low ? lowSolve : highSolve,
    ...indexedFigures(parts, () => ({ figures: figuresKernel(low) })),
    closedForm: closedForm(low, names),
    closedFormFinite: true,
    fixedGain: () => 1,
    polynomials: { degree: 4, core: polynomialCore(low) },
  });
}

/** Third-order unity-gain lowpass (a real pole and a pole pair, one op-amp). */
export const sallenKeyLowpassThird: Topology = thirdOrder("lowpass");
/** Third-order unity-gain highpass (a real pole and a pole pair, one op-amp; equal capacitors). */
export const sallenKeyHighpassThird: Topology = thirdOrder("highpass");

/** Every third-order topology, in registry order. */
export const thirdOrderTopologies: readonly Topology[] = Object.freeze([sallenKeyLowpassThird, sallenKeyHighpassThird]);
