/**
 * Deliyannis-Friend bandpass: the multiple-feedback (MFB) bandpass with
 * equal capacitors whose Q is enhanced by a small positive feedback from the
 * output to the non-inverting input through a resistive divider, and an
 * input attenuator that sets the gain at f0 (T. Deliyannis, "High-Q factor
 * circuit with reduced sensitivity", Electronics Letters 4(26):577-579, 1968;
 * J. J. Friend, C. A. Harris & D. Hilberman, "STAR: an active biquadratic
 * filter section", IEEE Trans. Circuits Syst. CAS-22(2):115-121, 1975). One
 * op-amp, inverting. The equations below are derived here from the nodal
 * equations of this circuit (checked against nodal analysis, numpy and
 * ngspice in the tests).
 *
 * Parts: R1 in -> a, R2 a -> 0 (input attenuator), C1 a -> n, C2 a -> out,
 * R3 n -> out (feedback), R4 out -> p, R5 p -> 0 (positive-feedback
 * divider); U1 inverting input n, non-inverting input p, output out.
 *
 * With G1 = 1/R1, Ga = 1/R1 + 1/R2, G3 = 1/R3, k = R5/(R4 + R5) (the
 * fraction of the output fed back to p) and alpha = k/(1 - k) = R5/R4:
 *
 *   H(s) = -G1 s C1 / ( (1 - k) (s^2 C1 C2 + s G3 (C1 + C2) + G3 Ga) - k s C1 Ga )
 *   w0^2 = G3 Ga / (C1 C2)                       (independent of the divider)
 *   w0/Q = (G3 (C1 + C2) - alpha C1 Ga) / (C1 C2)
 *   gain at f0 = -G1 C1 (1 + alpha) / (G3 (C1 + C2) - alpha C1 Ga)
 *
 * The zero is at DC (and the response falls as 1/s far above f0); with
 * k = 0 it is the MFB bandpass with an input attenuator
 * ("mfb-bandpass-attenuated").
 *
 * Design (C1 = C2 = C). The passive part alone (k = 0) has
 * Q0 = sqrt(rho)/2 with rho = R3/(R1 || R2), the resistor ratio; the divider
 * raises Q to
 *
 *   Q = sqrt(rho) / (2 - alpha rho),  so  alpha = R5/R4 = (1 - Q0/Q) / (2 Q0^2).
 *
 * Then R3 = sqrt(rho)/(w0 C), R1 || R2 = R3/rho, R1 = Q (1 + alpha)/(|K| w0 C),
 * R4 = R3/sqrt(rho) (the geometric mean of R3 and R1 || R2, so the default
 * 10 kOhm level centres the resistor values; C = 1/(w0 R4)) and R5 = alpha R4.
 * `resistorRatio` sets rho; `capacitorRatio` is not read (equal capacitors);
 * `capacitor` sets C1 (= C2); `resistor` sets R4, 10 kOhm by default.
 * Default rho (a choice of this project, no source): rho = 4 Q, i.e.
 * Q0 = sqrt(Q) and the enhancement Q/Q0 = sqrt(Q) (rho 20 at Q = 5, 60 at
 * Q = 15, 200 at Q = 50, against 4 Q^2 = 100, 900 and 10,000 for the MFB
 * bandpass with equal capacitors). A fixed rho = 16 (Q0 = 2) would keep the
 * spread smaller but gives a Q spread of about 17 % (one standard deviation)
 * at Q = 15 with 5 % capacitors, against about 7 % with the default (Monte
 * Carlo below).
 *
 * Gain: free, with |K| up to 99 % of 2 Q Q0 (1 + alpha) (the gain without
 * attenuator, R2 infinite; the 1 % margin keeps R2 below about 100 (R1 || R2)).
 *
 * Limits: Q from 5 (below that the MFB bandpass with an input attenuator
 * reaches the Q with a resistor ratio 4 Q^2 <= 100, no positive feedback and
 * Q sensitivities of 1/2 at most, against E - 1/2 here: choose
 * "mfb-bandpass-attenuated"; our choice, no source) up to 50 (above, choose the
 * "state-variable-bandpass"); a chosen rho within [1, 400] with the
 * enhancement Q/Q0 within [1.25, 25] (below 1.25 the divider ratio R5/R4
 * becomes a negligible, absurdly small resistor; above 25 the passive Q
 * sensitivity exceeds 24).
 *
 * Sensitivities at the design point (equal capacitors; derived here,
 * first order; E = Q/Q0 the enhancement):
 *   S(Q; R3) = E - 1/2, S(Q; R1) = -(G1/Ga)(E - 1/2), S(Q; R2) = -(G2/Ga)(E - 1/2),
 *   S(Q; R5) = -S(Q; R4) = E - 1 (the divider; S(Q; k) = (E - 1)/(1 - k)),
 *   S(Q; C1) = -S(Q; C2) = E/2 - 1/2 (capacitor mismatch matters, unlike the
 *   plain MFB bandpass with equal capacitors, whose Q sensitivities are 1/2 at most);
 *   S(|K|; R1) = -1 - (G1/Ga)(E - 1), S(|K|; R2) = -(G2/Ga)(E - 1),
 *   S(|K|; R3) = E, S(|K|; R5) = -S(|K|; R4) = alpha/(1 + alpha) + E - 1,
 *   S(|K|; C1) = -S(|K|; C2) = E/2; f0 moves by -1/2 of each of R3, R1 || R2, C1, C2
 *   and not at all with the divider.
 * The op-amp: a finite gain A replaces k by k - 1/A (exact for the
 * single-pole model without output resistance). A real DC gain A lowers Q by
 * about 2 Q Q0 (1 + alpha)^2 / A (relative): E times the passive MFB's
 * 2 Q0^2 / A. With the single-pole model (1/A = s/(2 pi GBW)) the leading
 * effect is on f0 and Q together: both move by about
 * Q0 (1 + alpha)(1 + 1/(4 Q0^2)) f0/GBW (f0 down, Q up; within 3 % at
 * GBW = 1000 f0, while at 100 f0 the Q rise is about 30 % below it), the (1 + alpha)
 * being what the positive feedback adds over the passive part. So the
 * positive feedback raises the GBW demand over the passive MFB of the same
 * Q0 (by 1 + alpha, and makes the DC-gain error E times larger); it stays
 * below that of a plain MFB bandpass at the full Q (whose Q0 is Q).
 * `gbwDemandHz` is computed numerically from this stage's own finite-GBW
 * poles (f0 and Q within 1 %), so it includes the feedback's effect. At
 * Q = 15, |gain| = 10 (measured with the registry's `gbwDemandHz`, in units
 * of f0): 401 here (Q0 = 3.873; the formula above gives 403), 382 for the
 * passive part alone ("mfb-bandpass-attenuated" at Q = Q0), 1,478 for
 * "mfb-bandpass-attenuated" and "mfb-bandpass" at Q = 15, 7,059 for
 * "state-variable-bandpass" (gain +10). The scipy reference
 * (scripts/reference/topology_deliyannis_friend.py) agrees to 0.2 %.
 *
 * Monte Carlo (test/topologies/deliyannis-friend.test.ts, "MONTE CARLO
 * FIGURES"): Q = 15 at 10 kHz, 2,000 boards, every resistor uniform within
 * 1 %, every capacitor uniform within 5 %, figures from each topology's
 * `figures` (ideal op-amp), mulberry32 seed 20261202; relative standard
 * deviation and 0.5-99.5 % range:
 *
 *   topology (gain)                          Q sd    Q range            peak gain sd  peak gain range
 *   deliyannis-friend-bandpass (-10)         6.91 %  -13.9 % .. +21.0 %  8.79 %       -18.0 % .. +26.3 %
 *   same, resistorRatio 16 (Q0 = 2)          16.6 %  -26.5 % .. +60.8 %  18.6 %       -30.0 % .. +67.6 %
 *   mfb-bandpass (-450, equal capacitors)    0.41 %  -0.94 % .. +0.88 %  2.19 %       -4.61 % .. +5.46 %
 *   mfb-bandpass-attenuated (-10)            0.40 %  -0.89 % .. +0.87 %  2.18 %       -5.38 % .. +5.30 %
 *   state-variable-bandpass (+10)            2.24 %  -4.80 % .. +5.41 %  0.94 %       -2.29 % .. +2.11 %
 *
 * The Deliyannis-Friend spreads agree with the root sum of squares of the
 * sensitivities above to 15 %. So the stage buys a resistor spread of 60
 * instead of 900 and a quarter of the MFB's GBW demand with about 17 times
 * the MFB's Q spread (mostly the capacitor mismatch, S = E/2 - 1/2 = 1.4):
 * at Q 15 it wants 1 % (or matched) capacitors; the state-variable stage
 * remains the low-sensitivity choice at three op-amps.
 *
 * As-built polynomials (closed form, `polynomials`), with 1/A = g0 + g1 z,
 * z = s/w, k' = k - 1/A, multiplying through: c0 = G3 Ga, c1 = w G3 (C1 + C2),
 * c2 = w^2 C1 C2, e = w C1 Ga, kp = R5/(R4 + R5), km = R4/(R4 + R5):
 *
 *   N = -G1 w C1 z
 *   D = (km + g0) c0 + ((km + g0) c1 + g1 c0 - kp e + g0 e) z
 *       + ((km + g0) c2 + g1 (c1 + e)) z^2 + g1 c2 z^3
 *
 * Every coefficient is a sum of positive products except the z term's
 * `- kp e`, the circuit's own difference (the ideal w0/Q coefficient), whose
 * cancellation costs about E ulps. Degree 3 (2 with the ideal op-amp).
 *
 * @module
 */
import type { InvalidArgumentError } from "../errors.ts";
import type { Complex } from "../math/complex.ts";
import { cadd, cdiv, cmul, complex, cscale, csub } from "../math/complex.ts";
import { TWO_PI } from "../units/constants.ts";
import { requireInRange } from "../validate.ts";
import { defineTopology } from "./define.ts";
import type { PolynomialCore } from "./kernels.ts";
import { indexedFigures, partIndex, valueOf, conductanceOf, type PartSpec } from "./spec.ts";
import type { ComponentValues, StageChoices, StageTarget, Topology } from "./types.ts";

const REF =
  'T. Deliyannis, "High-Q factor circuit with reduced sensitivity", Electronics Letters 4(26):577-579, 1968; J. J. Friend, C. A. Harris & D. Hilberman, "STAR: an active biquadratic filter section", IEEE Trans. Circuits Syst. CAS-22(2):115-121, 1975 (equations derived here from the nodal equations)';

/** Lowest Q the Deliyannis-Friend bandpass accepts (below it the MFB bandpass with an input attenuator needs a resistor ratio of at most 100 and is less sensitive). */
export const DELIYANNIS_FRIEND_MIN_Q = 5;
/** Highest Q the Deliyannis-Friend bandpass accepts (above it use the state-variable bandpass). */
export const DELIYANNIS_FRIEND_MAX_Q = 50;
/** Smallest and largest resistor ratio R3/(R1 || R2) accepted as a choice. */
const RATIO_RANGE = [1, 400] as const;
/** Smallest and largest Q enhancement Q/Q0 accepted. */
const ENHANCEMENT_RANGE = [1.25, 25] as const;
/** Fraction of the largest gain (without attenuator) a target may ask for. */
const GAIN_MARGIN = 0.99;

const q = (t: StageTarget): number => t.q as number;

/**
 * The default resistor ratio R3/(R1 || R2) of a Deliyannis-Friend bandpass
 * for a pole Q: `4 Q` (passive Q0 = sqrt(Q)); a choice of this project (see
 * the module header).
 *
 * @param qv - pole Q (> 0)
 * @returns the ratio
 * @throws {@link InvalidArgumentError} when `qv` is not a positive number up to 1e6
 * @example
 * ```ts
 * deliyannisFriendDefaultRatio(15); //=> 60
 * ```
 */
export function deliyannisFriendDefaultRatio(qv: number): number {
  return defaultRatio(requireInRange("deliyannisFriendDefaultRatio", "qv", qv, { min: Number.MIN_VALUE, max: 1e6 }));
}

function defaultRatio(qv: number): number {
  return 4 * qv;
}

function ratioOf(t: StageTarget, c: StageChoices): number {
  return c.resistorRatio ?? defaultRatio(q(t));
}

/** The divider ratio alpha = R5/R4 that lifts the passive Q0 = sqrt(rho)/2 to Q. */
function alphaOf(qv: number, rho: number): number {
  const q0 = Math.sqrt(rho) / 2;
  return (1 - q0 / qv) / (2 * q0 * q0);
}

/** Largest gain magnitude (no attenuator): 2 Q Q0 (1 + alpha) = Q sqrt(rho) (1 + alpha). */
function maxGain(qv: number, rho: number): number {
  return qv * Math.sqrt(rho) * (1 + alphaOf(qv, rho));
}

function limits(t: StageTarget, c: StageChoices): string | null {
  const qv = q(t);
  if (qv < DELIYANNIS_FRIEND_MIN_Q * (1 - 1e-9)) {
    return `a Deliyannis-Friend bandpass is meant for Q of ${DELIYANNIS_FRIEND_MIN_Q} and above (got Q = ${qv}); below that the multiple-feedback bandpass reaches the Q without positive feedback, with a resistor ratio 4Q^2 of at most 100 and lower sensitivities: choose "mfb-bandpass-attenuated"`;
  }
  if (qv > DELIYANNIS_FRIEND_MAX_Q * (1 + 1e-9)) {
    return `a Deliyannis-Friend bandpass at Q = ${qv} is too sensitive to its parts and its op-amp (it accepts Q up to ${DELIYANNIS_FRIEND_MAX_Q}); use the state-variable stage ("state-variable-bandpass") for this Q`;
  }
  const rho = ratioOf(t, c);
  if (c.resistorRatio !== undefined && (rho < RATIO_RANGE[0] || rho > RATIO_RANGE[1])) {
    return `a Deliyannis-Friend bandpass takes a resistor ratio R3/(R1 || R2) from ${RATIO_RANGE[0]} to ${RATIO_RANGE[1]} (resistorRatio ${rho}); choose a ratio in that range or leave it to the default 4Q`;
  }
  const e = (2 * qv) / Math.sqrt(rho);
  if (e < ENHANCEMENT_RANGE[0] || e > ENHANCEMENT_RANGE[1]) {
    const lo = (2 * qv / ENHANCEMENT_RANGE[1]) ** 2;
    const hi = (2 * qv / ENHANCEMENT_RANGE[0]) ** 2;
    return `with resistorRatio ${rho} the passive part of a Deliyannis-Friend bandpass has Q0 = ${(Math.sqrt(rho) / 2).toPrecision(4)}, so the positive feedback would multiply Q by ${e.toPrecision(4)}; it may multiply it by ${ENHANCEMENT_RANGE[0]} to ${ENHANCEMENT_RANGE[1]}: choose resistorRatio between ${lo.toPrecision(4)} and ${hi.toPrecision(4)} for Q = ${qv}`;
  }
  const max = GAIN_MARGIN * maxGain(qv, rho);
  if (Math.abs(t.gain) > max) {
    return `a Deliyannis-Friend bandpass at Q = ${qv} with resistor ratio ${rho.toPrecision(4)} reaches a gain magnitude of at most ${max.toPrecision(4)} at f0 (got ${t.gain}); lower the gain, or raise resistorRatio (the gain limit grows as its square root)`;
  }
  return null;
}

function solve(t: StageTarget, c: StageChoices): Record<string, number> {
  const w0 = TWO_PI * t.f0Hz;
  const qv = q(t);
  const rho = ratioOf(t, c);
  const sr = Math.sqrt(rho);
  const alpha = alphaOf(qv, rho);
  // C1 = C2 = 1: G3 = w0/sqrt(rho), Ga = w0 sqrt(rho), G1 = |K| w0/(Q (1 + alpha))
  const ga = w0 * sr;
  const g1 = (Math.abs(t.gain) * w0) / (qv * (1 + alpha));
  const r4 = 1 / w0;
  return { R1: 1 / g1, R2: 1 / (ga - g1), C1: 1, C2: 1, R3: sr / w0, R4: r4, R5: alpha * r4 };
}

const parts: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "a" },
  { kind: "R", name: "R2", a: "a", b: "0" },
  { kind: "C", name: "C1", a: "a", b: "n" },
  { kind: "C", name: "C2", a: "a", b: "out" },
  { kind: "R", name: "R3", a: "n", b: "out" },
  { kind: "R", name: "R4", a: "out", b: "p" },
  { kind: "R", name: "R5", a: "p", b: "0" },
  { kind: "OA", name: "U1", inP: "p", inN: "n", out: "out" },
];

const figures = indexedFigures(parts, (at) => {
  const r1 = at("R1");
  const r2 = at("R2");
  const r3 = at("R3");
  const r4 = at("R4");
  const r5 = at("R5");
  const c1 = at("C1");
  const c2 = at("C2");
  const w0At = (x: Float64Array): number =>
    Math.sqrt((1 / (x[r1] as number) + 1 / (x[r2] as number)) / ((x[r3] as number) * (x[c1] as number) * (x[c2] as number)));
  return {
    figures: (x) => {
      const g1 = 1 / (x[r1] as number);
      const ga = g1 + 1 / (x[r2] as number);
      const alpha = (x[r5] as number) / (x[r4] as number);
      const ca = x[c1] as number;
      const cb = x[c2] as number;
      const w0 = w0At(x);
      const d = ((ca + cb) / (x[r3] as number)) - alpha * ca * ga;
      return { f0Hz: w0 / TWO_PI, q: (w0 * ca * cb) / d, gain: -(g1 * ca * (1 + alpha)) / d };
    },
    f0Hz: (x) => w0At(x) / TWO_PI,
  };
});

/** Closed-form response with open-loop gain `a` (null = ideal): k replaced by k - 1/a. */
function closedForm(v: ComponentValues, s: Complex, a: Complex | null): Complex {
  const g1 = conductanceOf(v, "R1");
  const ga = g1 + conductanceOf(v, "R2");
  const g3 = conductanceOf(v, "R3");
  const c1 = valueOf(v, "C1");
  const c2 = valueOf(v, "C2");
  const sum = valueOf(v, "R4") + valueOf(v, "R5");
  const inv = a === null ? complex(0) : cdiv(complex(1), a);
  const kp = csub(complex(valueOf(v, "R5") / sum), inv); // k - 1/A
  const km = cadd(complex(valueOf(v, "R4") / sum), inv); // 1 - (k - 1/A)
  const p = cadd(cadd(cscale(cmul(s, s), c1 * c2), cscale(s, g3 * (c1 + c2))), complex(g3 * ga));
  const den = csub(cmul(km, p), cmul(kp, cscale(s, c1 * ga)));
  return cdiv(cscale(s, -g1 * c1), den);
}

const index = partIndex(parts);
const [I1, I2, I3, I4, I5, IC1, IC2] = (["R1", "R2", "R3", "R4", "R5", "C1", "C2"] as const).map((n) => index[n] as number) as [
  number,
  number,
  number,
  number,
  number,
  number,
  number,
];

/** The polynomial core (see the module header). */
const polynomialCore: PolynomialCore = (x, g0, g1, w, num, den) => {
  const gin = 1 / (x[I1] as number);
  const ga = gin + 1 / (x[I2] as number);
  const g3 = 1 / (x[I3] as number);
  const r4 = x[I4] as number;
  const r5 = x[I5] as number;
  const kp = r5 / (r4 + r5);
  const km = r4 / (r4 + r5);
  const c1 = (x[IC1] as number) * w;
  const c2 = (x[IC2] as number) * w;
  const p0 = g3 * ga;
  const p1 = g3 * (c1 + c2);
  const p2 = c1 * c2;
  const e = c1 * ga;
  const m = km + g0;
  den[0] = m * p0;
  den[1] = m * p1 + g1 * p0 + g0 * e - kp * e;
  den[2] = m * p2 + g1 * (p1 + e);
  den[3] = g1 * p2;
  num[1] = -(gin * c1);
};

/** Deliyannis-Friend bandpass: MFB bandpass with equal capacitors, an input attenuator and Q enhanced by positive feedback. */
export const deliyannisFriendBandpass: Topology = defineTopology({
  id: "deliyannis-friend-bandpass",
  name: "Deliyannis-Friend bandpass (multiple feedback with positive feedback)",
  order: 2,
  kinds: ["bandpass"],
  inverting: true,
  reference: REF,
  levelCapacitor: "C1",
  levelResistor: "R4",
  parts,
  limits,
  solve,
  ...figures,
  closedForm,
  closedFormFinite: true,
  polynomials: { degree: 3, core: polynomialCore },
});

/** Every Deliyannis-Friend topology, in registry order. */
export const deliyannisFriendTopologies: readonly Topology[] = Object.freeze([deliyannisFriendBandpass]);
