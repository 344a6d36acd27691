/**
 * Two-amplifier notch of the kind N. Fliege published ("A new class of
 * second-order RC-active filters with two operational amplifiers",
 * Nachrichtentech. Z. 26(6), 1973): two op-amps in a generalised-impedance
 * (GIC) loop, f0 and Q set by the RC parts, the notch depth by the match of
 * resistors, gain fixed at 1. The exact circuit of the paper is not
 * reproduced from memory: the circuit below is derived here by nodal
 * analysis, of that structure, and checked against nodal analysis (MNA) and
 * ngspice in the tests. It differs from the usual description of Fliege's
 * notch in one respect: the notch depth depends on two resistor ratios,
 * R2/R1 and R5/R6 (both 1 in the design), not on one matched pair.
 *
 * Parts (node n1 is U1's non-inverting input, n3 the node both op-amps
 * share, n5 U2's inverting input):
 *   R1 in -> n1, C1 in -> n1, R2 n1 -> 0        (input network of n1)
 *   R3 n1 -> v2, C2 v2 -> n3, R4 n3 -> out,
 *   R5 out -> n5, R6 n5 -> in                   (the GIC loop, its last
 *                                                resistor returned to the input)
 *   U1: + n1, - n3, output v2;  U2: + n3, - n5, output out.
 * The op-amps hold n1, n3 and n5 at one voltage, so the loop presents at n1
 * the admittance `G3 G4 G6 / (s C2 G5)` towards the input voltage (a
 * simulated inductor whose far end is the input, not ground), and
 * `out = (1 + R5/R6) v(n1) - (R5/R6) vin`. With G = 1/R (derived here):
 *
 *   H(s) = (C1 C2 G5 s^2 + C2 (G1 G5 - G2 G6) s + G3 G4 G6)
 *        / (C1 C2 G5 s^2 + C2 G5 (G1 + G2) s + G3 G4 G6)
 *   w0^2 = wz^2 = G3 G4 G6 / (C1 C2 G5),  Q = w0 C1 / (G1 + G2),  gain 1 at DC and HF
 *
 * The zero is on the j-axis when G1 G5 = G2 G6 (R2/R1 = R6/R5); its
 * modulus equals w0 and the gain is 1 at DC and at high frequency for every
 * part value, so a mismatch only fills the notch: with R2/R1 off by a
 * fraction d the depth is |H(j w0)| = |G1 G5 - G2 G6| / (G5 (G1 + G2)),
 * about d/2 (-46 dB for 1 %, -66 dB for 0.1 %), the same for R5/R6;
 * independent of Q. R3, R4, C1, C2 move f0 (sensitivity -1/2 each; R5
 * +1/2, R6 -1/2) and leave the notch depth alone. Q sensitivities, from
 * Q = w0 C1 / (G1 + G2): +1/2 to R1, R2, C1 and R5, -1/2 to C2, R3, R4, R6.
 *
 * Design: C1 = C2 = C, R3 = R4 = R5 = R6 = R = 1/(w0 C), R1 = R2 = 2 Q R.
 * `resistor` sets R3 (default 10 kOhm), `capacitor` sets C1. No ratio
 * choices. Limits: Q up to {@link FLIEGE_MAX_Q} = 50 (R1/R3 = 100).
 *
 * Op-amp polarity: U1 + at n1 / - at n3 and U2 + at n3 / - at n5 is the
 * stable assignment with single-pole op-amps (the other three put a pole in
 * the right half-plane; checked with sympy while deriving).
 * Finite gain (closed form, exact for two single-pole op-amps without output
 * resistance, e = 1/A(s) for each, derived here with sympy from the same
 * nodal equations): with S = C1 G4 + C2 (G1 + G2 + G3), T = G1 + G2 + G3,
 *
 *   N = C1 C2 G5 s^2 + C2 (G1 G5 - G2 G6) s + G3 G4 G6
 *       - e G6 (C1 C2 s^2 + S s + G4 T)
 *   D = C1 C2 G5 s^2 + C2 G5 (G1 + G2) s + G3 G4 G6
 *       + e (C1 C2 (2 G5 + G6) s^2 + (C2 (G1 + G2)(2 G5 + G6) + C2 G3 G5 - C1 G4 G6) s
 *            - G4 (G6 (G1 + G2 + 2 G3) + G3 G5))
 *       + e^2 (G5 + G6) (C1 C2 s^2 + S s + G4 T)
 *
 * so the polynomials in z = s/w with e = g0 + g1 z have degree 4 (2 + 2);
 * a few coefficients carry the circuit's own subtractions. The finite gain
 * fills the notch: the e term of N does not vanish at j w0. Measured in the
 * tests at Q = 4 with single-pole op-amps (a0 = 2e5, GBW = 1 MHz), deepest
 * point of the response: -61 dB at f0 = 100 Hz, -59 dB at 1 kHz, -38 dB at
 * 10 kHz (the depth falls as f0/GBW grows). GBW demand computed numerically.
 *
 * @module
 */
import type { ComponentValues, StageFigures, StageTarget, Topology } from "./types.ts";
import { cadd, cdiv, cmul, complex, cscale, type Complex } from "../math/complex.ts";
import { TWO_PI } from "../units/constants.ts";
import { defineTopology } from "./define.ts";
import { indexedFigures, LIMIT_SLACK, type PartSpec } from "./spec.ts";
import type { PolynomialCore } from "./kernels.ts";

const REF =
  'N. Fliege, "A new class of second-order RC-active filters with two operational amplifiers", Nachrichtentech. Z. 26(6), 1973 (structure; this circuit derived here by nodal analysis, not copied from the paper)';

/** Highest Q designed (R1/R3 = 2Q = 100). */
export const FLIEGE_MAX_Q = 50;

const parts: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "n1" },
  { kind: "C", name: "C1", a: "in", b: "n1" },
  { kind: "R", name: "R2", a: "n1", b: "0" },
  { kind: "R", name: "R3", a: "n1", b: "v2" },
  { kind: "C", name: "C2", a: "v2", b: "n3" },
  { kind: "R", name: "R4", a: "n3", b: "out" },
  { kind: "R", name: "R5", a: "out", b: "n5" },
  { kind: "R", name: "R6", a: "n5", b: "in" },
  { kind: "OA", name: "U1", inP: "n1", inN: "n3", out: "v2" },
  { kind: "OA", name: "U2", inP: "n3", inN: "n5", out: "out" },
];

// component order: R1, C1, R2, R3, C2, R4, R5, R6
const iR1 = 0;
const iC1 = 1;
const iR2 = 2;
const iR3 = 3;
const iC2 = 4;
const iR4 = 5;
const iR5 = 6;
const iR6 = 7;

/**
 * Coefficients of N and D as polynomials in s (index 0..2) for e^0, e^1, e^2,
 * with capacitances already multiplied by `w` (so s -> z): out[0..8] = N
 * (e^0: 0..2, e^1: 3..5), out[9..17] = D (e^0: 9..11, e^1: 12..14, e^2: 15..17).
 */
function coefficientsInto(x: Float64Array, w: number, out: Float64Array): void {
  const g1 = 1 / (x[iR1] as number);
  const g2 = 1 / (x[iR2] as number);
  const g3 = 1 / (x[iR3] as number);
  const g4 = 1 / (x[iR4] as number);
  const g5 = 1 / (x[iR5] as number);
  const g6 = 1 / (x[iR6] as number);
  const c1 = (x[iC1] as number) * w;
  const c2 = (x[iC2] as number) * w;
  const cc = c1 * c2;
  const sS = c1 * g4 + c2 * (g1 + g2 + g3);
  const t = g1 + g2 + g3;
  const n0 = g3 * g4 * g6;
  // N, e^0 and e^1
  out[0] = n0;
  out[1] = c2 * (g1 * g5 - g2 * g6);
  out[2] = cc * g5;
  out[3] = -g6 * g4 * t;
  out[4] = -g6 * sS;
  out[5] = -g6 * cc;
  // D, e^0, e^1, e^2
  out[9] = n0;
  out[10] = c2 * g5 * (g1 + g2);
  out[11] = cc * g5;
  out[12] = -g4 * (g6 * (g1 + g2 + 2 * g3) + g3 * g5);
  out[13] = c2 * (g1 + g2) * (2 * g5 + g6) + c2 * g3 * g5 - c1 * g4 * g6;
  out[14] = cc * (2 * g5 + g6);
  const h = g5 + g6;
  out[15] = h * g4 * t;
  out[16] = h * sS;
  out[17] = h * cc;
}

const co = new Float64Array(18);

const figures = indexedFigures(parts, () => ({
  figures: (x: Float64Array): StageFigures => {
    coefficientsInto(x, 1, co);
    const d0 = co[9] as number;
    const d1 = co[10] as number;
    const d2 = co[11] as number;
    const w0 = Math.sqrt(d0 / d2);
    return { f0Hz: w0 / TWO_PI, q: Math.sqrt(d0 * d2) / d1, fzHz: Math.sqrt((co[0] as number) / (co[2] as number)) / TWO_PI, gain: (co[0] as number) / d0 };
  },
}));

const xs = new Float64Array(8);
const NAMES = ["R1", "C1", "R2", "R3", "C2", "R4", "R5", "R6"];

/** `c0 + c1 s + c2 s^2` at complex s. */
function quad(c0: number, c1: number, c2: number, s: Complex): Complex {
  return cadd(complex(c0), cmul(s, cadd(complex(c1), cscale(s, c2))));
}

function closedForm(v: ComponentValues, s: Complex, a: Complex | null): Complex {
  for (let i = 0; i < 8; i++) xs[i] = v[NAMES[i] as string] as number;
  coefficientsInto(xs, 1, co);
  const n = quad(co[0] as number, co[1] as number, co[2] as number, s);
  const d = quad(co[9] as number, co[10] as number, co[11] as number, s);
  if (a === null) return cdiv(n, d);
  const e = cdiv(complex(1), a);
  const nn = cadd(n, cmul(e, quad(co[3] as number, co[4] as number, co[5] as number, s)));
  const e1 = quad(co[12] as number, co[13] as number, co[14] as number, s);
  const e2 = quad(co[15] as number, co[16] as number, co[17] as number, s);
  const dd = cadd(d, cmul(e, cadd(e1, cmul(e, e2))));
  return cdiv(nn, dd);
}

const pc = new Float64Array(18);
/**
 * As-built polynomials in z = s/w (ascending) with e = g0 + g1 z for both
 * op-amps: `sum_j P_j(z) e^j` expanded (the header's N and D).
 */
const polynomialCore: PolynomialCore = (x, g0, g1, w, num, den) => {
  coefficientsInto(x, w, pc);
  // e = g0 + g1 z, e^2 = g0^2 + 2 g0 g1 z + g1^2 z^2
  const a0 = g0 * g0;
  const a1 = 2 * g0 * g1;
  const a2 = g1 * g1;
  for (let k = 0; k < 3; k++) {
    const p0 = pc[k] as number;
    const p1 = pc[3 + k] as number;
    num[k] = (num[k] as number) + p0 + g0 * p1;
    num[k + 1] = (num[k + 1] as number) + g1 * p1;
    const q0 = pc[9 + k] as number;
    const q1 = pc[12 + k] as number;
    const q2 = pc[15 + k] as number;
    den[k] = (den[k] as number) + q0 + g0 * q1 + a0 * q2;
    den[k + 1] = (den[k + 1] as number) + g1 * q1 + a1 * q2;
    den[k + 2] = (den[k + 2] as number) + a2 * q2;
  }
};

function solve(t: StageTarget): Record<string, number> {
  const r = 1 / (TWO_PI * t.f0Hz);
  const rq = 2 * (t.q as number) * r;
  return { R1: rq, C1: 1, R2: rq, R3: r, C2: 1, R4: r, R5: r, R6: r };
}

/** Two-amplifier GIC-type notch of Fliege's kind (gain 1, zero at the pole frequency). */
export const fliegeNotch: Topology = defineTopology({
  id: "fliege-notch",
  name: "two-amplifier notch (Fliege type)",
  order: 2,
  kinds: ["notch"],
  inverting: false,
  reference: REF,
  levelCapacitor: "C1",
  levelResistor: "R3",
  parts,
  limits: (t) => {
    if (t.fzHz !== undefined && Math.abs(t.fzHz / t.f0Hz - 1) > 1e-9) {
      return `the Fliege-type notch puts its zero at f0 (fzHz = ${t.fzHz}, f0Hz = ${t.f0Hz}); choose a lowpass-notch or highpass-notch topology for a zero away from the pole`;
    }
    const qv = t.q as number;
    if (qv > FLIEGE_MAX_Q * (1 + LIMIT_SLACK)) {
      return `a Fliege-type notch at Q = ${qv} needs R1 = R2 = 2Q R3 (a resistor spread of ${(2 * qv).toFixed(0)}); keep Q <= ${FLIEGE_MAX_Q} or split the notch`;
    }
    return null;
  },
  solve,
  ...figures,
  closedForm,
  closedFormFinite: true,
  fixedGain: () => 1,
  polynomials: { degree: 4, core: polynomialCore },
});

/** Every Fliege-type topology, in registry order. */
export const fliegeTopologies: readonly Topology[] = Object.freeze([fliegeNotch]);
