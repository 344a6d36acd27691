/**
 * Multiple-feedback (MFB, infinite-gain) stages: lowpass, highpass, bandpass,
 * and the bandpass with an input attenuator resistor to ground that sets the
 * gain independently of Q. The last is the bandpass this project was asked to
 * call the Deliyannis-Friend form; strictly, T. Deliyannis ("High-Q factor
 * circuit with reduced sensitivity", Electronics Letters 4(26):577-579, 1968)
 * and J. J. Friend (1970) add positive feedback for Q enhancement, which this
 * stage does not have; the stage with it is "deliyannis-friend-bandpass"
 * (deliyannis-friend.ts).
 *
 * General MFB structure: Y1 in -> a, Y2 a -> 0, Y3 a -> n, Y4 a -> out,
 * Y5 n -> out; U1 inverting input n, non-inverting input grounded.
 *   H = -Y1 Y3 / (Y5 (Y1 + Y2 + Y3 + Y4) + Y3 Y4)
 * and with open-loop gain A (closed form, exact for the single-pole model):
 *   H = -Y1 / ( ((Y3 + Y5)/A + Y5) (Y1 + Y2 + Y3 + Y4) / Y3 + Y4 - Y3/A )
 * (L. P. Huelsman & P. E. Allen, "Introduction to the Theory and Design of
 * Active Filters", McGraw-Hill, 1980, infinite-gain multiple-feedback
 * realisations, from memory.)
 *
 * Lowpass (Y1 = 1/R1, Y2 = s C1, Y3 = 1/R3, Y4 = 1/R2, Y5 = s C2):
 *   gain -R2/R1, w0^2 = 1/(R2 R3 C1 C2), w0/Q = (1/R1 + 1/R2 + 1/R3)/C1.
 *   `capacitorRatio` m = C1/C2 (C1 grounded) must be >= 4 Q^2 (1 + |K|);
 *   default the minimum (then R2 = R3). R2 is the smaller root otherwise.
 *   `capacitor` sets C2.
 * Highpass (Y1 = s C1, Y2 = 1/R1, Y3 = s C2, Y4 = s C3, Y5 = 1/R2):
 *   gain -C1/C3, w0^2 = 1/(R1 R2 C2 C3), w0/Q = (C1 + C2 + C3)/(R2 C2 C3).
 *   `capacitorRatio` r = C2/C3, default 1; any Q. `capacitor` sets C2.
 * Bandpass (Y1 = 1/R1, Y2 = 0, Y3 = s C1, Y4 = s C2, Y5 = 1/R2):
 *   w0^2 = 1/(R1 R2 C1 C2), Q = w0 R2 C1 C2/(C1 + C2), gain at f0
 *   -R2 C1/(R1 (C1 + C2)) = -Q^2 (1 + r)/r with r = C2/C1, so the gain fixes
 *   the capacitor ratio: r = Q^2/(|K| - Q^2), which needs |K| > Q^2.
 *   `capacitor` sets C1.
 * Bandpass with attenuator (Y1 = 1/R1, Y2 = 1/R2, Y3 = s C1, Y4 = s C2,
 *   Y5 = 1/R3), C1 = C2: w0^2 = (1/R1 + 1/R2)/(R3 C1 C2), Q = w0 R3 C/2,
 *   gain at f0 -R3/(2 R1); needs |K| < 2 Q^2. `capacitor` sets C1.
 * For all: `resistor` sets R1; default R1 = 10 kOhm.
 *
 * As-built polynomials (closed form, `polynomials`): the kernel above
 * multiplied through by A, with each admittance linear in z = s/w and
 * `1/A = g0 + g1 z`: `N = -Y1 Y3`,
 * `D = Y5 Y + Y3 Y4 + (1/A)(Y3 (Y1 + Y2 + Y4) + Y5 Y)`, Y = Y1 + Y2 + Y3 + Y4
 * (derived here from the nodal equations; `mfbPolynomials` in kernels.ts).
 * Every coefficient is a sum of positive products: a few ulps each.
 * Degree 3 (2 with the ideal op-amp).
 *
 * GBW demand: computed numerically from the finite-gain response (f0 and Q
 * within 1 %); common practice, no source, asks for GBW >= 100 (1 + |K|) f0
 * for the lowpass and GBW >= 100 * 2 Q^2 f0 for the bandpass.
 *
 * @module
 */
import { requirePositive } from "../validate.ts";
import type { ComponentValues, StageFigures, StageTarget, Topology } from "./types.ts";
import { complex, cscale, type Complex } from "../math/complex.ts";
import { TWO_PI } from "../units/constants.ts";
import { defineTopology } from "./define.ts";
import { atLeast, partIndex, valueOf, conductanceOf, type PartSpec } from "./spec.ts";
import { mfbKernel, mfbPolynomials, type PolynomialCore } from "./kernels.ts";

const REF =
  'L. P. Huelsman & P. E. Allen, "Introduction to the Theory and Design of Active Filters", McGraw-Hill, 1980, infinite-gain multiple-feedback realisations (from memory)';

const q = (t: StageTarget): number => t.q as number;
const w0Of = (t: StageTarget): number => TWO_PI * t.f0Hz;
const amp = { kind: "OA", name: "U1", inP: "0", inN: "n", out: "out" } as const;
const ZERO: Complex = { re: 0, im: 0 };

/** Scratch of the five admittances for {@link mfbPolynomials}. */
const admittances = new Float64Array(10);

/**
 * The polynomial core of a multiple-feedback stage with these parts: `y`
 * names the part of each admittance Y1..Y5 (a resistor gives its
 * conductance, a capacitor its capacitance times the scale), `null` for an
 * absent one.
 */
function mfbPolynomialCore(parts: readonly PartSpec[], y: readonly (string | null)[]): PolynomialCore {
  const i = partIndex(parts);
  const at = Int32Array.from(y, (n) => (n === null ? -1 : (i[n] as number)));
  const resistor = Uint8Array.from(y, (n) => (n !== null && n.startsWith("R") ? 1 : 0));
  return (x, g0, g1, w, num, den) => {
    admittances.fill(0);
    for (let k = 0; k < 5; k++) {
      const j = at[k] as number;
      if (j < 0) continue;
      if (resistor[k] === 1) admittances[2 * k] = 1 / (x[j] as number);
      else admittances[2 * k + 1] = (x[j] as number) * w;
    }
    mfbPolynomials(admittances, g0, g1, num, den);
  };
}

/**
 * Smallest capacitor ratio C1/C2 (grounded over feedback capacitor) with
 * which a multiple-feedback lowpass of gain magnitude |K| reaches a pole Q:
 * `4 Q^2 (1 + |K|)`. At that ratio R2 = R3.
 *
 * @param qv - pole Q (> 0)
 * @param gainMagnitude - |K| (> 0)
 * @returns the minimum ratio
 * @throws never (no checks: a helper for the design layer's choices)
 * @example
 * ```ts
 * mfbLowpassMinRatio(0.5, 1); //=> 2
 * ```
 */
export function mfbLowpassMinRatio(qv: number, gainMagnitude: number): number {
  const fn = "mfbLowpassMinRatio";
  return mfbMinRatio(requirePositive(fn, "q", qv), requirePositive(fn, "gainMagnitude", gainMagnitude));
}

function mfbMinRatio(qv: number, gainMagnitude: number): number {
  return 4 * qv * qv * (1 + gainMagnitude);
}

const lowpassParts: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "a" },
  { kind: "R", name: "R2", a: "a", b: "out" },
  { kind: "R", name: "R3", a: "a", b: "n" },
  { kind: "C", name: "C1", a: "a", b: "0" },
  { kind: "C", name: "C2", a: "n", b: "out" },
  amp,
];

/** Multiple-feedback lowpass. */
export const mfbLowpass: Topology = defineTopology({
  id: "mfb-lowpass",
  name: "multiple-feedback lowpass",
  order: 2,
  kinds: ["lowpass"],
  inverting: true,
  reference: REF,
  levelCapacitor: "C2",
  levelResistor: "R1",
  parts: lowpassParts,
  limits: (t, c) => {
    if (c.capacitorRatio === undefined) return null;
    const min = mfbMinRatio(q(t), Math.abs(t.gain));
    return atLeast(c.capacitorRatio, min)
      ? null
      : `a multiple-feedback lowpass of gain ${t.gain} at Q = ${q(t)} needs its grounded capacitor C1 at least 4Q^2 (1 + |K|) = ${min.toPrecision(4)} times C2 (capacitorRatio ${c.capacitorRatio}); raise capacitorRatio or lower the gain`;
  },
  solve: (t, c) => {
    const w0 = w0Of(t);
    const k = Math.abs(t.gain);
    const m = c.capacitorRatio ?? mfbMinRatio(q(t), k);
    // C2 = 1, C1 = m: w0^2 m R2^2 - (m w0/Q) R2 + (1 + K) = 0
    const a = w0 * w0 * m;
    const b = (m * w0) / q(t);
    const cc = 1 + k;
    let disc = b * b - 4 * a * cc;
    if (disc < 0 && disc > -1e-9 * b * b) disc = 0;
    const r2 = (2 * cc) / (b + Math.sqrt(disc));
    return { C1: m, C2: 1, R2: r2, R1: r2 / k, R3: 1 / (w0 * w0 * r2 * m) };
  },
  figures: (v) => {
    const w0 = 1 / Math.sqrt(valueOf(v, "R2") * valueOf(v, "R3") * valueOf(v, "C1") * valueOf(v, "C2"));
    const damp = (conductanceOf(v, "R1") + conductanceOf(v, "R2") + conductanceOf(v, "R3")) / valueOf(v, "C1");
    return { f0Hz: w0 / TWO_PI, q: w0 / damp, gain: -valueOf(v, "R2") / valueOf(v, "R1") };
  },
  closedForm: (v, s, a) =>
    mfbKernel([complex(conductanceOf(v, "R1")), cscale(s, valueOf(v, "C1")), complex(conductanceOf(v, "R3")), complex(conductanceOf(v, "R2")), cscale(s, valueOf(v, "C2"))], a),
  closedFormFinite: true,
  polynomials: { degree: 3, core: mfbPolynomialCore(lowpassParts, ["R1", "C1", "R3", "R2", "C2"]) },
});

const highpassParts: PartSpec[] = [
  { kind: "C", name: "C1", a: "in", b: "a" },
  { kind: "R", name: "R1", a: "a", b: "0" },
  { kind: "C", name: "C2", a: "a", b: "n" },
  { kind: "C", name: "C3", a: "a", b: "out" },
  { kind: "R", name: "R2", a: "n", b: "out" },
  amp,
];

/** Multiple-feedback highpass. */
export const mfbHighpass: Topology = defineTopology({
  id: "mfb-highpass",
  name: "multiple-feedback highpass",
  order: 2,
  kinds: ["highpass"],
  inverting: true,
  reference: REF,
  levelCapacitor: "C2",
  levelResistor: "R1",
  parts: highpassParts,
  limits: () => null,
  solve: (t, c) => {
    const w0 = w0Of(t);
    const k = Math.abs(t.gain);
    const r = c.capacitorRatio ?? 1;
    // C3 = 1, C2 = r, C1 = K
    const r2 = (q(t) * (k + r + 1)) / (w0 * r);
    return { C1: k, C2: r, C3: 1, R2: r2, R1: 1 / (w0 * w0 * r2 * r) };
  },
  figures: (v) => {
    const c2c3 = valueOf(v, "C2") * valueOf(v, "C3");
    const w0 = 1 / Math.sqrt(valueOf(v, "R1") * valueOf(v, "R2") * c2c3);
    const damp = (valueOf(v, "C1") + valueOf(v, "C2") + valueOf(v, "C3")) / (valueOf(v, "R2") * c2c3);
    return { f0Hz: w0 / TWO_PI, q: w0 / damp, gain: -valueOf(v, "C1") / valueOf(v, "C3") };
  },
  closedForm: (v, s, a) =>
    mfbKernel([cscale(s, valueOf(v, "C1")), complex(conductanceOf(v, "R1")), cscale(s, valueOf(v, "C2")), cscale(s, valueOf(v, "C3")), complex(conductanceOf(v, "R2"))], a),
  closedFormFinite: true,
  polynomials: { degree: 3, core: mfbPolynomialCore(highpassParts, ["C1", "R1", "C2", "C3", "R2"]) },
});

/** f0, Q and centre gain of a multiple-feedback bandpass with pole frequency `w0` and feedback resistor `rf` (input resistor R1, capacitors C1, C2). */
function bandpassFigures(v: ComponentValues, w0: number, rf: "R2" | "R3"): StageFigures {
  const c1 = valueOf(v, "C1");
  const c2 = valueOf(v, "C2");
  return { f0Hz: w0 / TWO_PI, q: (w0 * valueOf(v, rf) * c1 * c2) / (c1 + c2), gain: -(valueOf(v, rf) * c1) / (valueOf(v, "R1") * (c1 + c2)) };
}

const bandpassParts: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "a" },
  { kind: "C", name: "C1", a: "a", b: "n" },
  { kind: "C", name: "C2", a: "a", b: "out" },
  { kind: "R", name: "R2", a: "n", b: "out" },
  amp,
];

/** Multiple-feedback bandpass (two resistors; gain tied to Q through the capacitor ratio). */
export const mfbBandpass: Topology = defineTopology({
  id: "mfb-bandpass",
  name: "multiple-feedback bandpass",
  order: 2,
  kinds: ["bandpass"],
  inverting: true,
  reference: REF,
  levelCapacitor: "C1",
  levelResistor: "R1",
  parts: bandpassParts,
  limits: (t) => {
    const k = Math.abs(t.gain);
    const min = q(t) * q(t);
    return k > min * (1 + 1e-6)
      ? null
      : `a two-resistor multiple-feedback bandpass at Q = ${q(t)} needs a gain magnitude above Q^2 = ${min.toPrecision(4)} (got ${t.gain}); raise the gain or choose the bandpass with an input attenuator`;
  },
  solve: (t) => {
    const w0 = w0Of(t);
    const k = Math.abs(t.gain);
    const q2 = q(t) * q(t);
    const r = q2 / (k - q2);
    const r2 = (q(t) * (1 + r)) / (w0 * r);
    return { C1: 1, C2: r, R2: r2, R1: 1 / (w0 * w0 * r2 * r) };
  },
  figures: (v) => bandpassFigures(v, 1 / Math.sqrt(valueOf(v, "R1") * valueOf(v, "R2") * valueOf(v, "C1") * valueOf(v, "C2")), "R2"),
  closedForm: (v, s, a) => mfbKernel([complex(conductanceOf(v, "R1")), ZERO, cscale(s, valueOf(v, "C1")), cscale(s, valueOf(v, "C2")), complex(conductanceOf(v, "R2"))], a),
  closedFormFinite: true,
  polynomials: { degree: 3, core: mfbPolynomialCore(bandpassParts, ["R1", null, "C1", "C2", "R2"]) },
});

const attenuatedParts: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "a" },
  { kind: "R", name: "R2", a: "a", b: "0" },
  { kind: "C", name: "C1", a: "a", b: "n" },
  { kind: "C", name: "C2", a: "a", b: "out" },
  { kind: "R", name: "R3", a: "n", b: "out" },
  amp,
];

/** Multiple-feedback bandpass with an input attenuator (R2 to ground) setting the gain independently of Q. */
export const mfbBandpassAttenuated: Topology = defineTopology({
  id: "mfb-bandpass-attenuated",
  name: "multiple-feedback bandpass with input attenuator",
  order: 2,
  kinds: ["bandpass"],
  inverting: true,
  reference: `${REF}; T. Deliyannis, Electronics Letters 4(26):577-579, 1968`,
  levelCapacitor: "C1",
  levelResistor: "R1",
  parts: attenuatedParts,
  limits: (t) => {
    const k = Math.abs(t.gain);
    const max = 2 * q(t) * q(t);
    return k < max * (1 - 1e-6)
      ? null
      : `a multiple-feedback bandpass with equal capacitors at Q = ${q(t)} reaches a gain magnitude of at most 2Q^2 = ${max.toPrecision(4)} (got ${t.gain}); lower the gain or choose the two-resistor bandpass`;
  },
  solve: (t) => {
    const w0 = w0Of(t);
    const k = Math.abs(t.gain);
    const qv = q(t);
    return { C1: 1, C2: 1, R3: (2 * qv) / w0, R1: qv / (k * w0), R2: 1 / (w0 * (2 * qv - k / qv)) };
  },
  figures: (v) => bandpassFigures(v, Math.sqrt((conductanceOf(v, "R1") + conductanceOf(v, "R2")) / (valueOf(v, "R3") * valueOf(v, "C1") * valueOf(v, "C2"))), "R3"),
  closedForm: (v, s, a) =>
    mfbKernel([complex(conductanceOf(v, "R1")), complex(conductanceOf(v, "R2")), cscale(s, valueOf(v, "C1")), cscale(s, valueOf(v, "C2")), complex(conductanceOf(v, "R3"))], a),
  closedFormFinite: true,
  polynomials: { degree: 3, core: mfbPolynomialCore(attenuatedParts, ["R1", "R2", "C1", "C2", "R3"]) },
});

/** Every multiple-feedback topology, in registry order. */
export const multipleFeedbackTopologies: readonly Topology[] = Object.freeze([
  mfbLowpass,
  mfbHighpass,
  mfbBandpass,
  mfbBandpassAttenuated,
]);
