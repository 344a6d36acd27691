/**
 * Bootstrapped twin-T notch: one op-amp, a follower, whose output drives the
 * twin-T's common node through a resistive divider (positive feedback), so
 * the notch's Q rises from the passive twin-T's 1/4 to `1/(4(1 - k))` for a
 * divider fraction k (the classic circuit as in A. B. Williams & F. J.
 * Taylor, "Electronic Filter Design Handbook", McGraw-Hill, section on
 * band-reject filters, and L. P. Huelsman & P. E. Allen, "Introduction to the
 * Theory and Design of Active Filters", McGraw-Hill, 1980, both from memory).
 * The exact design with the divider's loading below is derived here by nodal
 * analysis (not from either book) and checked against nodal analysis (MNA)
 * and ngspice in the tests.
 *
 * Parts (node `t` is the follower's input, `g` the common node):
 *   R1 in -> a, R2 a -> t, C3 a -> g      (resistive T, shunt capacitor)
 *   C1 in -> b, C2 b -> t, R3 b -> g      (capacitive T, shunt resistor)
 *   R4 out -> g, R5 g -> 0                (divider)
 *   U1 follower: + at t, - and output at out.
 * The divider's open-circuit fraction is `k = G4 / (G4 + G5)` (G = 1/R) and
 * its source conductance `Gt = G4 + G5`.
 *
 * Transfer function (ideal follower, exact for every value of the eight
 * parts; derived here from the nodal equations at a, b, g and t):
 *
 *   N(s) = n3 s^3 + n2 s^2 + n1 s + n0,
 *     n3 = C1 C2 C3 (R1 R2 + R1 R3 + R2 R3 + Gt R1 R2 R3)
 *     n2 = C1 C2 (R1 + R2)(1 + Gt R3) + C1 C3 (R1 + R3) + C2 C3 (R2 + R3)
 *     n1 = (C1 + C2)(1 + Gt R3) + C3,   n0 = Gt
 *   M(s) = m1 s + m0,  m1 = C3 (C1 R1 R3 + C2 R1 (R2 + R3)),  m0 = C2 (R1 + R2) + C3 R1
 *   H(s) = N(s) / (N(s) + G5 s M(s))
 *
 * N is the twin-T's own (grounded through the divider's source resistance)
 * transmission; the network is third order. With the op-amp's finite gain,
 * `1/A = e`, the follower's input is `(1 + e) out` and
 * `H = N / ((1 + e) N + (G5 + e Gt) s M)` (degree 3 + 1).
 *
 * Design (derived here): keep the series arms equal, R1 = R2 = R and
 * C1 = C2 = C, and let the divider's source resistance be `R / g`
 * (`resistorRatio` g, default 12). Two conditions fix the shunt parts
 * R3 = y R and C3 = x C: (1) a transmission zero on the j-axis, n1 n2 = n0 n3;
 * (2) N and the denominator share the real root p = -m0/m1 (the root of M),
 * so the response is exactly second order. With R = C = 1 these are
 *
 *   2 g y^2 + (2 - g) y + 1 = 0  (the larger root),   x = 4 g y^2 / (g y - (2y + 1)^2),
 *
 * real for g >= 6 + 4 sqrt(2) = 11.66 (at g = 12: y = 1/4, x = 4; as g grows,
 * y -> 1/2, x -> 2, the textbook R/2 and 2C). Then
 * `H = (s^2 + wz^2) / (s^2 + s G5 m1 / n3 + wz^2)`: the pole frequency equals
 * the zero frequency, wz^2 = n1/n3, and `Q = n3 wz / (G5 m1)`. For a target Q
 * the divider gives `k = 1 - Q0/Q` with `Q0 = n3 wz / (g m1)` the Q of the
 * divider alone (k = 0; 0.204 at g = 12, 0.241 at g = 20, 1/4 as g grows), so
 * R4 = R / (g k), R5 = R / (g (1 - k)); the capacitors are scaled to put wz at
 * the target f0. Gain 1 at DC and at high frequency (fixed, `fixedGain`).
 * `resistor` sets R1 (default 10 kOhm), `capacitor` sets C1.
 * The default g = 12 gives the simple ratios R3 = R/4 and C3 = 4 C (four
 * equal parts in parallel, which match as well as the series arms do; the
 * classic R/2 and 2C need a stiff divider, g above about 1000). Its part
 * spreads: R4 = R/(12 k) (0.085 R to 4.2 R) and R5 = R/(g (1 - k)) =
 * Q R/(g Q0) (0.085 R to 4.1 R); Q0 = 0.204.
 *
 * Figures of any values (ideal op-amp): the numerator's and the
 * denominator's real roots nearest to -m0/m1 are removed (math/cubic.ts:
 * trigonometric / Cardano formulas, polished by Newton steps);
 * f0 and Q are those of the remaining quadratic of the denominator and fz is
 * the modulus of the remaining zero pair. For unbalanced parts the notch is
 * no longer infinitely deep (the zero pair leaves the j-axis) and the removed
 * pole and zero no longer coincide; the polynomials below carry the full
 * third-order network.
 *
 * Limits: Q between Q0/(1 - 0.02) (k >= 0.02; below that R4 exceeds 50 R/g)
 * and {@link TWIN_T_MAX_Q} = 10. Q = Q0/(1 - k) is steep in the divider
 * fraction (S_k^Q = k/(1 - k) = Q/Q0 - 1, 48 at Q = 10 and g = 12), but
 * 1 - k = G5/(G4 + G5), so Q's sensitivity to R4 and R5 themselves is
 * about k (below 1) and to the twin-T parts of order 1 (the tests measure
 * R5). What limits Q is the divider spread R5/R4 = k/(1 - k) (48 at Q = 10),
 * the notch filling about 20 log10(Q) dB faster with part mismatch (below)
 * and the op-amp's phase at f0 (the GBW demand rises with Q). The notch
 * depth depends on the match of the six twin-T
 * parts and of the divider. Notch depth with ideal parts is infinite (exact
 * zero). Measured in the tests (nodal analysis, deepest point of the
 * response) with one part 1 % high and the others exact, at Q = 1, g = 12:
 * -52 dB (R1, R2), -62 dB (R3), -71 dB (C1, C2), -66 dB (C3), -50 dB (R4),
 * -62 dB (R5) (at g = 20: -51 to -66 dB). The divider's source
 * resistance enters N (so R4 and R5 matter for the depth), its fraction k
 * does not: a change of k at constant
 * R4 R5/(R4 + R5) moves Q only. The depth scales as 20 log10 of the part
 * error (0.1 % gives about 20 dB more) and is about 20 log10(Q) dB
 * shallower at higher Q (the denominator at f0 is proportional to 1/Q).
 * The op-amp's finite gain does not fill the notch: it enters only the
 * denominator ((1 + e) N + (G5 + e Gt) s M), so N keeps its j-axis zero and a
 * single-pole op-amp moves f0 and Q only (GBW demand computed numerically).
 * `resistorRatio` outside [6 + 4 sqrt(2), 1000] is refused.
 *
 * @module
 */
import type { ComponentValues, StageChoices, StageFigures, StageTarget, Topology } from "./types.ts";
import { cadd, cdiv, cmul, complex, cscale, type Complex } from "../math/complex.ts";
import { TWO_PI } from "../units/constants.ts";
import { defineTopology } from "./define.ts";
import { atLeast, indexedFigures, LIMIT_SLACK, type PartSpec } from "./spec.ts";
import type { PolynomialCore } from "./kernels.ts";
import { requireInRange } from "../validate.ts";
import { nearestRealRoot } from "../math/cubic.ts";

const REF =
  'bootstrapped twin-T: A. B. Williams & F. J. Taylor, "Electronic Filter Design Handbook", McGraw-Hill, band-reject filters; L. P. Huelsman & P. E. Allen, "Introduction to the Theory and Design of Active Filters", McGraw-Hill, 1980 (both from memory); exact loaded-divider design derived here by nodal analysis';

/** Highest Q the bootstrapped twin-T is designed for (Q sensitivity to the divider 4Q - 1 = 39). */
export const TWIN_T_MAX_Q = 10;
/** Smallest divider fraction k (R4 at most R/(g k) = 50 R/g). */
const K_MIN = 0.02;
/** Default ratio g = R1 / (source resistance of the divider). */
const DEFAULT_G = 12;
/** Smallest g with a real design, 6 + 4 sqrt(2). */
export const TWIN_T_MIN_RATIO = 6 + 4 * Math.SQRT2;
/** Largest g accepted (the divider's resistors become a heavy load on the op-amp). */
const MAX_G = 1000;

const parts: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "a" },
  { kind: "R", name: "R2", a: "a", b: "t" },
  { kind: "C", name: "C3", a: "a", b: "g" },
  { kind: "C", name: "C1", a: "in", b: "b" },
  { kind: "C", name: "C2", a: "b", b: "t" },
  { kind: "R", name: "R3", a: "b", b: "g" },
  { kind: "R", name: "R4", a: "out", b: "g" },
  { kind: "R", name: "R5", a: "g", b: "0" },
  { kind: "OA", name: "U1", inP: "t", inN: "out", out: "out" },
];

// component order: R1, R2, C3, C1, C2, R3, R4, R5
const iR1 = 0;
const iR2 = 1;
const iC3 = 2;
const iC1 = 3;
const iC2 = 4;
const iR3 = 5;
const iR4 = 6;
const iR5 = 7;

/** Scratch for the network coefficients: n3..n0 at 0..3, m1, m0 at 4, 5, Gt at 6, G5 at 7. */
const net = new Float64Array(8);

/** The network's coefficients (see the header) with s scaled by `w`: N(z) = sum n_k w^k z^k. */
function networkInto(x: Float64Array, w: number, out: Float64Array): void {
  const r1 = x[iR1] as number;
  const r2 = x[iR2] as number;
  const r3 = x[iR3] as number;
  const c1 = (x[iC1] as number) * w;
  const c2 = (x[iC2] as number) * w;
  const c3 = (x[iC3] as number) * w;
  const g5 = 1 / (x[iR5] as number);
  const gt = 1 / (x[iR4] as number) + g5;
  const a = 1 + gt * r3;
  out[0] = c1 * c2 * c3 * (r1 * r2 + r1 * r3 + r2 * r3 + gt * r1 * r2 * r3);
  out[1] = c1 * c2 * (r1 + r2) * a + c1 * c3 * (r1 + r3) + c2 * c3 * (r2 + r3);
  out[2] = (c1 + c2) * a + c3;
  out[3] = gt;
  out[4] = c3 * (c1 * r1 * r3 + c2 * r1 * (r2 + r3));
  out[5] = c2 * (r1 + r2) + c3 * r1;
  out[6] = gt;
  out[7] = g5;
}

/** Figures from the network's coefficients in `net` (s scaled by 1/(R1 C1)). */
function figuresOfNet(unit: number): StageFigures {
  const n3 = net[0] as number;
  const n2 = net[1] as number;
  const n1 = net[2] as number;
  const n0 = net[3] as number;
  const m1 = net[4] as number;
  const m0 = net[5] as number;
  const g5 = net[7] as number;
  // D = N + G5 u M
  const d3 = n3;
  const d2 = n2 + g5 * m1;
  const d1 = n1 + g5 * m0;
  const d0 = n0;
  const near = -m0 / m1;
  const rn = nearestRealRoot(n3, n2, n1, n0, near);
  const rd = nearestRealRoot(d3, d2, d1, d0, near);
  // deflate: quadratic q2 u^2 + q1 u + q0 (constant term from the product of the roots, -c0/r)
  const zq0 = -n0 / rn;
  const pq1 = d2 + rd * d3;
  const pq0 = -d0 / rd;
  const w0 = Math.sqrt(Math.abs(pq0 / d3));
  const wz = Math.sqrt(Math.abs(zq0 / n3));
  return { f0Hz: (w0 * unit) / TWO_PI, q: Math.sqrt(Math.abs(pq0 * d3)) / pq1, fzHz: (wz * unit) / TWO_PI, gain: n0 / d0 };
}

const figures = indexedFigures(parts, () => ({
  figures: (x: Float64Array): StageFigures => {
    const unit = 1 / ((x[iR1] as number) * (x[iC1] as number));
    networkInto(x, unit, net);
    return figuresOfNet(unit);
  },
}));

/** Closed form with the op-amp's gain `a` (null: ideal), the header's H = N / ((1 + e) N + (G5 + e Gt) s M). */
const xs = new Float64Array(8);
function closedForm(v: ComponentValues, s: Complex, a: Complex | null): Complex {
  const names = ["R1", "R2", "C3", "C1", "C2", "R3", "R4", "R5"];
  for (let i = 0; i < 8; i++) xs[i] = v[names[i] as string] as number;
  networkInto(xs, 1, net);
  const nS = cadd(cmul(cadd(cmul(cadd(cscale(s, net[0] as number), complex(net[1] as number)), s), complex(net[2] as number)), s), complex(net[3] as number));
  const sM = cmul(s, cadd(cscale(s, net[4] as number), complex(net[5] as number)));
  if (a === null) return cdiv(nS, cadd(nS, cscale(sM, net[7] as number)));
  const e = cdiv(complex(1), a);
  const den = cadd(cmul(cadd(complex(1), e), nS), cmul(cadd(complex(net[7] as number), cscale(e, net[6] as number)), sM));
  return cdiv(nS, den);
}

const pnet = new Float64Array(8);
/**
 * As-built polynomials (ascending, z = s/w), with `1/A = g0 + g1 z`:
 * `N` as in the header and `D = (1 + g0 + g1 z) N + (G5 + Gt g0 + Gt g1 z) S`,
 * S = m1 w^2 z^2 + m0 w z. Every coefficient is a sum of positive terms.
 */
const polynomialCore: PolynomialCore = (x, g0, g1, w, num, den) => {
  networkInto(x, w, pnet);
  const p0 = pnet[3] as number;
  const p1 = pnet[2] as number;
  const p2 = pnet[1] as number;
  const p3 = pnet[0] as number;
  const s1 = pnet[5] as number;
  const s2 = pnet[4] as number;
  const gt = pnet[6] as number;
  const h0 = (pnet[7] as number) + gt * g0;
  const h1 = gt * g1;
  const f = 1 + g0;
  num[0] = p0;
  num[1] = p1;
  num[2] = p2;
  num[3] = p3;
  den[0] = f * p0;
  den[1] = f * p1 + g1 * p0 + h0 * s1;
  den[2] = f * p2 + g1 * p1 + h0 * s2 + h1 * s1;
  den[3] = f * p3 + g1 * p2 + h1 * s2;
  den[4] = g1 * p3;
};

/** The normalised shunt parts (R = C = 1) for a divider ratio g: R3 = y, C3 = x. */
function shuntParts(g: number): { y: number; x: number } {
  const disc = Math.max(0, g * g - 12 * g + 4);
  const y = (g - 2 + Math.sqrt(disc)) / (4 * g);
  const x = (4 * g * y * y) / (g * y - (2 * y + 1) * (2 * y + 1));
  return { y, x };
}

/** The normalised zero frequency and the Q of the divider alone (k = 0) for ratio g. */
function normalised(g: number): { y: number; x: number; wz: number; q0: number } {
  const { y, x } = shuntParts(g);
  const n3 = x * (1 + 2 * y + g * y);
  const n1 = 2 + x + 2 * g * y;
  const wz = Math.sqrt(n1 / n3);
  return { y, x, wz, q0: (n3 * wz) / (g * x * (1 + 2 * y)) };
}

/**
 * Smallest Q the bootstrapped twin-T notch is designed for at a divider
 * ratio g = R1 / (the divider's source resistance): the Q of the twin-T with
 * the divider alone, divided by 1 - 0.02 (divider fraction k of at least 0.02).
 *
 * @param resistorRatio - g, from 6 + 4 sqrt(2) to 1000 (default 12)
 * @returns the smallest Q
 * @throws `InvalidArgumentError` at `resistorRatio` when it is not a number from 6 + 4 sqrt(2) to 1000
 * @example
 * ```ts
 * twinTMinQ(12); //=> 0.2083...
 * ```
 */
export function twinTMinQ(resistorRatio: number = DEFAULT_G): number {
  const g = requireInRange("twinTMinQ", "resistorRatio", resistorRatio, { min: TWIN_T_MIN_RATIO, max: MAX_G });
  return normalised(g).q0 / (1 - K_MIN);
}

function limits(t: StageTarget, c: StageChoices): string | null {
  if (t.fzHz !== undefined && Math.abs(t.fzHz / t.f0Hz - 1) > 1e-9) {
    return `the twin-T notch puts its zero at f0 (fzHz = ${t.fzHz}, f0Hz = ${t.f0Hz}); choose a lowpass-notch or highpass-notch topology for a zero away from the pole`;
  }
  const g = c.resistorRatio ?? DEFAULT_G;
  if (!atLeast(g, TWIN_T_MIN_RATIO) || g > MAX_G * (1 + LIMIT_SLACK)) {
    return `the twin-T's resistorRatio (R1 over the divider's source resistance R4 R5/(R4 + R5)) must lie between ${TWIN_T_MIN_RATIO.toPrecision(5)} and ${MAX_G} (got ${g}); below that no balanced design exists, above it the divider loads the op-amp; leave it unset for 12`;
  }
  const qv = t.q as number;
  if (qv > TWIN_T_MAX_Q * (1 + LIMIT_SLACK)) {
    return `a bootstrapped twin-T at Q = ${qv} needs a divider spread R5/R4 of about ${(qv / normalised(g).q0 - 1).toFixed(0)} and its notch fills with part mismatch about ${(20 * Math.log10(qv)).toFixed(0)} dB more than at Q = 1; keep Q <= ${TWIN_T_MAX_Q} or choose a Fliege-type, state-variable or Tow-Thomas notch`;
  }
  const qMin = twinTMinQ(g);
  if (!atLeast(qv, qMin)) {
    return `a bootstrapped twin-T reaches Q down to ${qMin.toPrecision(4)} (divider fraction 0.02) at resistorRatio ${g}; got Q = ${qv}: raise Q or choose another notch topology`;
  }
  return null;
}

function solve(t: StageTarget, c: StageChoices): Record<string, number> {
  const g = Math.max(c.resistorRatio ?? DEFAULT_G, TWIN_T_MIN_RATIO);
  const { y, x, wz, q0 } = normalised(g);
  const k = 1 - q0 / (t.q as number);
  const cs = wz / (TWO_PI * t.f0Hz); // capacitor scale so that wz lands on the target
  return { R1: 1, R2: 1, R3: y, C1: cs, C2: cs, C3: x * cs, R4: 1 / (g * k), R5: 1 / (g * (1 - k)) };
}

/** Bootstrapped twin-T notch (one op-amp, gain 1, zero at the pole frequency). */
export const twinTNotch: Topology = defineTopology({
  id: "twin-t-notch",
  name: "bootstrapped twin-T notch",
  order: 2,
  kinds: ["notch"],
  inverting: false,
  reference: REF,
  levelCapacitor: "C1",
  levelResistor: "R1",
  parts,
  limits,
  solve,
  ...figures,
  closedForm,
  closedFormFinite: true,
  fixedGain: () => 1,
  polynomials: { degree: 4, core: polynomialCore },
});

/** Every twin-T topology, in registry order. */
export const twinTTopologies: readonly Topology[] = Object.freeze([twinTNotch]);
