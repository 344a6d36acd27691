/**
 * Kerwin-Huelsman-Newcomb (KHN) state-variable biquad with a fourth op-amp
 * summing its highpass, lowpass (and for the allpass, bandpass) outputs:
 * lowpass-notch, highpass-notch and symmetric notch from one circuit, and an
 * allpass section (W. J. Kerwin, L. P. Huelsman & R. W. Newcomb,
 * "State-variable synthesis for insensitive integrated circuit transfer
 * functions", IEEE J. Solid-State Circuits SC-2(3):87-92, 1967; summing
 * stage as in L. P. Huelsman & P. E. Allen, "Introduction to the Theory and
 * Design of Active Filters", 1980, state-variable realisations, from memory).
 *
 * Parts: U1 summing/difference amplifier (output hp): R1 in -> n1,
 * R2 hp -> n1, R3 lp -> n1 at the inverting input; R4 bp -> p1, R5 p1 -> 0 at
 * the non-inverting input. U2 integrator: R6 hp -> n2, C1 n2 -> bp.
 * U3 integrator: R7 bp -> n3, C2 n3 -> lp. U4 output summer: R8 hp -> n4,
 * R9 lp -> n4, R10 n4 -> out (feedback), and for the allpass R11 bp -> n4.
 *
 * With beta = R5/(R4 + R5), G = 1/R1 + 1/R2 + 1/R3, tau1 = R6 C1, tau2 = R7 C2,
 * H0 = R2/R1:
 *
 *   D(s) = s^2 + s beta G R2/tau1 + R2/(R3 tau1 tau2)
 *   hp = -H0 s^2/D,  bp = H0 (s/tau1)/D,  lp = -H0/(tau1 tau2 D)
 *   w0^2 = R2/(R3 tau1 tau2),  Q = w0 tau1/(beta G R2)
 *   H = -R10 (hp/R8 + lp/R9 + bp/R11) = H0 R10 (s^2/R8 - s/(R11 tau1) + 1/(R9 tau1 tau2))/D
 *   wz^2 = R8/(R9 tau1 tau2); HF gain H0 R10/R8; DC gain H0 R10/(R9 tau1 tau2 w0^2).
 *
 * The sections are non-inverting. Allpass: R11 = Q R8/(w0 tau1) and
 * R9 = R8/(w0^2 tau1 tau2), i.e. R11 = Q R8 and R9 = R8 in the design below
 * (tau1 = tau2 = 1/w0).
 *
 * Design: C1 = C2 = C, R1 = R2 = R3 = R6 = R7 = R10 = 1/(w0 C),
 * R4 = (3Q - 1) R5 with R5 = 1/(w0 C) (so beta = 1/(3Q); needs Q > 1/3).
 * Notch: the gain at the reference frequency sets R9 (lowpass-notch, DC) or
 * R8 (highpass-notch and notch, high frequency) and R8/R9 = wz^2/w0^2.
 * `capacitor` sets C1 (= C2); `resistor` sets R1 (the level of every
 * resistor); default R1 = 10 kOhm.
 *
 * Internal level (notch and allpass forms): `resistorRatio` h = H0 = R2/R1,
 * default 1, is the input summer's gain. The three integrator-loop outputs
 * scale with it (each peaks near H0 Q times the stage input for Q above
 * about 0.7, so at H0 = 1 they run Q above the passband), and the output
 * summer takes the gain back: R1 = R/h, R4 = (Q (2 + h) - 1) R5 (beta =
 * 1/(Q G R), G R = 2 + h), and R8, R9 (and R11) times h, so the transfer
 * function is unchanged. Lowering h below 1 trades headroom at the internal
 * nodes for noise: the output summer's noise gain rises as 1/h (dynamic-range
 * scaling of the loop's nodes: R. Schaumann & M. E. Van Valkenburg, "Design
 * of Analog Filters", Oxford University Press 2001, the chapter on dynamic
 * range, from memory). Needs Q (2 + h) > 1.
 *
 * Without the output summer (U4, R8-R11) the three taps are themselves
 * sections (the stage output is then that node): highpass at hp (gain -R2/R1),
 * bandpass at bp (gain at f0 H0/(tau1 w0/Q), non-inverting) and lowpass at lp
 * (DC gain -R3/R1). Design as above with R1 = R/|K| (lowpass, highpass) or
 * R1 = Q R/K (bandpass) and beta = 1/(Q G R), i.e. R4 = (Q G R - 1) R5;
 * `resistor` then sets R2.
 *
 * Finite-GBW response (closed form, exact for the single-pole model without
 * output resistance): the integrators are `-Y1/(Y2 + (Y1 + Y2)/A)`; U1, with
 * its inverting input at beta bp - hp/A, gives
 * `hp = -G1 vin / (G2 + G3 T1 T2 - G beta T1 + G/A)` (T1 = bp/hp, T2 = lp/bp);
 * the output summer is `-sum(Gk vk)/(G10 + (sum(Gk) + G10)/A)`.
 * The same as real polynomials (derived here from those equations), with
 * `1/A = g0 + g1 z`, `z = s / w`, `c1 = C1 w`, `c2 = C2 w`, ascending
 * coefficients:
 *
 *   I1 = G6 g0 + (c1 (1 + g0) + G6 g1) z + c1 g1 z^2   (T1 = -G6/I1)
 *   I2 = G7 g0 + (c2 (1 + g0) + G7 g1) z + c2 g1 z^2   (T2 = -G7/I2)
 *   P  = (G2 + G g0 + G g1 z) I1 I2 + G3 G6 G7 + G beta G6 I2
 *   hp = -G1 I1 I2 / P,  bp = G1 G6 I2 / P,  lp = -G1 G6 G7 / P
 *   out = G1 (G8 I1 I2 + G9 G6 G7 - G11 G6 I2) / (P S),
 *   S = G10 + (G8 + G9 + G11 + G10)(g0 + g1 z)
 *
 * Every coefficient of I1, I2, P and S is a sum of positive terms (a few
 * ulps of relative error); the only subtraction is the allpass numerator's
 * bandpass term, which the allpass needs. Degrees: 5 for the three taps
 * (2 + one per op-amp), 6 with the output summer.
 * GBW demand: computed numerically (f0 and Q within 1 %); common practice,
 * no source, asks for GBW >= 100 Q f0 for state-variable stages.
 *
 * @module
 */
import type { ComponentValues, StageChoices, StageFigures, StageTarget, Topology } from "./types.ts";
import { cadd, cdiv, cmul, complex, cscale, csub, type Complex } from "../math/complex.ts";
import { TWO_PI } from "../units/constants.ts";
import { defineTopology } from "./define.ts";
import { indexedFigures, loopIndex, partIndex, withOutputAt, valueOf, conductanceOf, type PartSpec } from "./spec.ts";
import { invertingGain, summer, type PolynomialCore } from "./kernels.ts";

const REF =
  'W. J. Kerwin, L. P. Huelsman & R. W. Newcomb, IEEE J. Solid-State Circuits SC-2(3):87-92, 1967; L. P. Huelsman & P. E. Allen, "Introduction to the Theory and Design of Active Filters", 1980, state-variable realisations (from memory)';


const core: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "n1" },
  { kind: "R", name: "R2", a: "hp", b: "n1" },
  { kind: "R", name: "R3", a: "lp", b: "n1" },
  { kind: "R", name: "R4", a: "bp", b: "p1" },
  { kind: "R", name: "R5", a: "p1", b: "0" },
  { kind: "OA", name: "U1", inP: "p1", inN: "n1", out: "hp" },
  { kind: "R", name: "R6", a: "hp", b: "n2" },
  { kind: "C", name: "C1", a: "n2", b: "bp" },
  { kind: "OA", name: "U2", inP: "0", inN: "n2", out: "bp" },
  { kind: "R", name: "R7", a: "bp", b: "n3" },
  { kind: "C", name: "C2", a: "n3", b: "lp" },
  { kind: "OA", name: "U3", inP: "0", inN: "n3", out: "lp" },
  { kind: "R", name: "R8", a: "hp", b: "n4" },
  { kind: "R", name: "R9", a: "lp", b: "n4" },
  { kind: "R", name: "R10", a: "n4", b: "out" },
  { kind: "OA", name: "U4", inP: "0", inN: "n4", out: "out" },
];

interface Core {
  readonly w0: number;
  readonly q: number;
  readonly tau1: number;
  readonly tau2: number;
  readonly h0: number;
  readonly damp: number;
}

/** Where R1-R7, C1 and C2 sit in every state-variable stage's values (their parts lists all start with the loop's twelve). */
const LOOP = loopIndex(core.slice(0, 12), ["R1", "R2", "R3", "R4", "R5", "R6", "R7", "C1", "C2"]);
const { R1, R2, R3, R4, R5, R6, R7, C1, C2 } = LOOP.at;

/** The pole frequency (rad/s) from the values in component order. */
function w0At(x: Float64Array): number {
  return Math.sqrt((x[R2] as number) / ((x[R3] as number) * ((x[R6] as number) * (x[C1] as number)) * ((x[R7] as number) * (x[C2] as number))));
}

/** The pole frequency in Hz, the bits of every state-variable figures kernel's `f0Hz`. */
const f0Hz = (x: Float64Array): number => w0At(x) / TWO_PI;

/** The loop's figures from the values in component order. */
function coreAt(x: Float64Array): Core {
  const r2 = x[R2] as number;
  const r5 = x[R5] as number;
  const beta = r5 / ((x[R4] as number) + r5);
  const gsum = 1 / (x[R1] as number) + 1 / r2 + 1 / (x[R3] as number);
  const tau1 = (x[R6] as number) * (x[C1] as number);
  const tau2 = (x[R7] as number) * (x[C2] as number);
  const w0 = w0At(x);
  const damp = (beta * gsum * r2) / tau1;
  return { w0, q: w0 / damp, tau1, tau2, h0: r2 / (x[R1] as number), damp };
}

/** {@link coreAt} of named values. */
function coreOf(v: ComponentValues): Core {
  return coreAt(LOOP.pack(v));
}

/**
 * The three taps per unit input with finite open-loop gain A: integrators by
 * `invertingGain`; U1 with its non-inverting input at beta bp and inverting
 * input at beta bp - hp/A gives
 * `hp = -G1 / (G2 + G3 T1 T2 - G beta T1 + G/A)` with T1 = bp/hp, T2 = lp/bp.
 */
function finiteTaps(v: ComponentValues, s: Complex, a: Complex): { hp: Complex; bp: Complex; lp: Complex } {
  const g1 = conductanceOf(v, "R1");
  const g2 = conductanceOf(v, "R2");
  const g3 = conductanceOf(v, "R3");
  const gs = g1 + g2 + g3;
  const beta = valueOf(v, "R5") / (valueOf(v, "R4") + valueOf(v, "R5"));
  const t1 = invertingGain(complex(conductanceOf(v, "R6")), cscale(s, valueOf(v, "C1")), a);
  const t2 = invertingGain(complex(conductanceOf(v, "R7")), cscale(s, valueOf(v, "C2")), a);
  const den = cadd(cadd(complex(g2), cscale(cmul(t1, t2), g3)), csub(cdiv(complex(gs), a), cscale(t1, gs * beta)));
  const hp = cdiv(complex(-g1), den);
  const bp = cmul(t1, hp);
  return { hp, bp, lp: cmul(t2, bp) };
}

/** `out = a * b` for ascending coefficient arrays (`out` has length a.length + b.length - 1). */
function multiplyInto(a: Float64Array, b: Float64Array, out: Float64Array): void {
  out.fill(0);
  for (let i = 0; i < a.length; i++) for (let j = 0; j < b.length; j++) out[i + j] = (out[i + j] as number) + (a[i] as number) * (b[j] as number);
}

const i1 = new Float64Array(3);
const i2 = new Float64Array(3);
const i12 = new Float64Array(5);
const a1 = new Float64Array(2);
const loopP = new Float64Array(6);
const sum = new Float64Array(2);

/** The loop polynomial P and I1 I2, I2 into the module scratch (see the module notes). */
function loopInto(x: Float64Array, g0: number, g1: number, w: number): void {
  const G2 = 1 / (x[R2] as number);
  const G3 = 1 / (x[R3] as number);
  const G6 = 1 / (x[R6] as number);
  const G7 = 1 / (x[R7] as number);
  const gs = 1 / (x[R1] as number) + G2 + G3;
  const r5 = x[R5] as number;
  const beta = r5 / ((x[R4] as number) + r5);
  const c1 = (x[C1] as number) * w;
  const c2 = (x[C2] as number) * w;
  i1[0] = G6 * g0;
  i1[1] = c1 * (1 + g0) + G6 * g1;
  i1[2] = c1 * g1;
  i2[0] = G7 * g0;
  i2[1] = c2 * (1 + g0) + G7 * g1;
  i2[2] = c2 * g1;
  multiplyInto(i1, i2, i12);
  a1[0] = G2 + gs * g0;
  a1[1] = gs * g1;
  multiplyInto(a1, i12, loopP);
  const b = gs * beta * G6;
  loopP[0] = (loopP[0] as number) + G3 * G6 * G7 + b * (i2[0] as number);
  loopP[1] = (loopP[1] as number) + b * (i2[1] as number);
  loopP[2] = (loopP[2] as number) + b * (i2[2] as number);
}

/** Polynomials of one tap (degree 5). */
function tapPolynomials(node: "hp" | "bp" | "lp"): PolynomialCore {
  return (x, g0, g1, w, num, den) => {
    loopInto(x, g0, g1, w);
    den.set(loopP);
    const G1 = 1 / (x[R1] as number);
    const G6 = 1 / (x[R6] as number);
    if (node === "hp") for (let k = 0; k < 5; k++) num[k] = -G1 * (i12[k] as number);
    else if (node === "bp") for (let k = 0; k < 3; k++) num[k] = G1 * G6 * (i2[k] as number);
    else num[0] = -G1 * G6 * (1 / (x[R7] as number));
  };
}

/** Polynomials of the summed output (degree 6); `r11` is -1 without the allpass's bandpass term. */
function summedPolynomials(r8: number, r9: number, r10: number, r11: number): PolynomialCore {
  return (x, g0, g1, w, num, den) => {
    loopInto(x, g0, g1, w);
    const G1 = 1 / (x[R1] as number);
    const G6 = 1 / (x[R6] as number);
    const G7 = 1 / (x[R7] as number);
    const G8 = 1 / (x[r8] as number);
    const G9 = 1 / (x[r9] as number);
    const G10 = 1 / (x[r10] as number);
    const G11 = r11 < 0 ? 0 : 1 / (x[r11] as number);
    const all = G8 + G9 + G11 + G10;
    sum[0] = G10 + all * g0;
    sum[1] = all * g1;
    multiplyInto(loopP, sum, den);
    for (let k = 0; k < 5; k++) num[k] = G1 * G8 * (i12[k] as number);
    num[0] = (num[0] as number) + G1 * G9 * G6 * G7;
    if (r11 >= 0) for (let k = 0; k < 3; k++) num[k] = (num[k] as number) - G1 * G11 * G6 * (i2[k] as number);
  };
}

/** The summed output's polynomial form for a parts list. */
function summedForm(parts: readonly PartSpec[], allpass: boolean): { readonly degree: number; readonly core: PolynomialCore } {
  const at = partIndex(parts);
  const idx = (n: string): number => at[n] as number;
  return { degree: 6, core: summedPolynomials(idx("R8"), idx("R9"), idx("R10"), allpass ? idx("R11") : -1) };
}

function closedForm(allpass: boolean) {
  return (v: ComponentValues, s: Complex, a: Complex | null): Complex => {
    if (a !== null) {
      const t = finiteTaps(v, s, a);
      const terms: [number, Complex][] = [
        [conductanceOf(v, "R8"), t.hp],
        [conductanceOf(v, "R9"), t.lp],
      ];
      if (allpass) terms.push([conductanceOf(v, "R11"), t.bp]);
      return summer(terms, conductanceOf(v, "R10"), a);
    }
    const c = coreOf(v);
    const s2 = cmul(s, s);
    const d = cadd(cadd(s2, cscale(s, c.damp)), complex(c.w0 * c.w0));
    let num = cadd(cscale(s2, conductanceOf(v, "R8")), complex(1 / (valueOf(v, "R9") * c.tau1 * c.tau2)));
    if (allpass) num = cadd(num, cscale(s, -1 / (valueOf(v, "R11") * c.tau1)));
    return cscale(cdiv(num, d), c.h0 * valueOf(v, "R10"));
  };
}

function figures(parts: readonly PartSpec[], allpass: boolean) {
  return indexedFigures(parts, (at) => {
    const r8 = at("R8");
    const r9 = at("R9");
    const r10 = at("R10");
    const figuresAt = (x: Float64Array): StageFigures => {
      const c = coreAt(x);
      const dc = (c.h0 * (x[r10] as number)) / ((x[r9] as number) * c.tau1 * c.tau2 * c.w0 * c.w0);
      const hf = (c.h0 * (x[r10] as number)) / (x[r8] as number);
      if (allpass) return { f0Hz: c.w0 / TWO_PI, q: c.q, gain: dc };
      const wz = Math.sqrt((x[r8] as number) / ((x[r9] as number) * c.tau1 * c.tau2));
      return { f0Hz: c.w0 / TWO_PI, q: c.q, fzHz: wz / TWO_PI, gain: wz > c.w0 ? dc : hf };
    };
    return { figures: figuresAt, f0Hz };
  });
}

function baseValues(t: StageTarget): Record<string, number> {
  const w0 = TWO_PI * t.f0Hz;
  const r = 1 / w0;
  const qv = t.q as number;
  return { C1: 1, C2: 1, R1: r, R2: r, R3: r, R5: r, R4: (3 * qv - 1) * r, R6: r, R7: r, R10: r };
}

const qLimit = (t: StageTarget): string | null =>
  (t.q as number) > 1 / 3 + 1e-9
    ? null
    : `this state-variable stage sets Q with a divider of ratio 1/(3Q), so it needs Q above 1/3 (got ${t.q}); choose a Sallen-Key or multiple-feedback stage for such a low Q`;

/**
 * The notch and allpass forms' input summer at gain `h` = R2/R1 (see the
 * module header): R1 = R/h, and R4 keeps Q, R4 = (Q (2 + h) - 1) R5.
 */
function scaledInput(v: Record<string, number>, t: StageTarget, h: number): Record<string, number> {
  if (h === 1) return v;
  const r = v["R2"] as number;
  v["R1"] = r / h;
  v["R4"] = ((t.q as number) * (2 + h) - 1) * (v["R5"] as number);
  return v;
}

/** The notch and allpass forms' limits: Q above 1/3 and, with an internal level `resistorRatio` h, Q (2 + h) > 1. */
function summedLimits(t: StageTarget, c: StageChoices): string | null {
  const why = qLimit(t);
  if (why !== null) return why;
  const h = c.resistorRatio;
  if (h !== undefined && !((t.q as number) * (2 + h) > 1 + 1e-9)) {
    return `the input summer's gain resistorRatio (R2/R1) = ${h} leaves no divider for Q = ${t.q} (it needs Q (2 + ratio) > 1); raise resistorRatio`;
  }
  return null;
}

/** KHN state-variable notch section: lowpass-notch, highpass-notch or symmetric notch, from the zero frequency. */
export const stateVariableNotch: Topology = defineTopology({
  id: "state-variable-notch",
  name: "state-variable (KHN) notch",
  order: 2,
  kinds: ["lowpass-notch", "highpass-notch", "notch"],
  inverting: false,
  reference: REF,
  levelCapacitor: "C1",
  levelResistor: "R1",
  parts: core,
  limits: summedLimits,
  solve: (t, c) => {
    const h = c.resistorRatio ?? 1;
    const v = scaledInput(baseValues(t), t, h);
    const w0 = TWO_PI * t.f0Hz;
    const wz = TWO_PI * (t.fzHz ?? t.f0Hz);
    const r10 = (v["R10"] as number) * h;
    const ratio = (wz * wz) / (w0 * w0); // R8 / R9
    if (t.kind === "lowpass-notch") {
      v["R9"] = r10 / t.gain;
      v["R8"] = (v["R9"] as number) * ratio;
    } else {
      v["R8"] = r10 / t.gain;
      v["R9"] = (v["R8"] as number) / ratio;
    }
    return v;
  },
  ...figures(core, false),
  closedForm: closedForm(false),
  closedFormFinite: true,
  polynomials: summedForm(core, false),
});

const allpassParts: PartSpec[] = [...core, { kind: "R", name: "R11", a: "bp", b: "n4" }];

/** KHN state-variable allpass section. */
export const stateVariableAllpass: Topology = defineTopology({
  id: "state-variable-allpass",
  name: "state-variable (KHN) allpass",
  order: 2,
  kinds: ["allpass"],
  inverting: false,
  reference: REF,
  levelCapacitor: "C1",
  levelResistor: "R1",
  parts: allpassParts,
  limits: summedLimits,
  solve: (t, c) => {
    const h = c.resistorRatio ?? 1;
    const v = scaledInput(baseValues(t), t, h);
    const r8 = ((v["R10"] as number) * h) / t.gain;
    v["R8"] = r8;
    v["R9"] = r8;
    v["R11"] = (t.q as number) * r8;
    return v;
  },
  ...figures(allpassParts, true),
  closedForm: closedForm(true),
  closedFormFinite: true,
  polynomials: summedForm(allpassParts, true),
});

type Tap = "lowpass" | "highpass" | "bandpass";

function tapResponse(tap: Tap, v: ComponentValues, s: Complex): Complex {
  const c = coreOf(v);
  const d = cadd(cadd(cmul(s, s), cscale(s, c.damp)), complex(c.w0 * c.w0));
  if (tap === "highpass") return cscale(cdiv(cmul(s, s), d), -c.h0);
  if (tap === "bandpass") return cscale(cdiv(s, d), c.h0 / c.tau1);
  return cscale(cdiv(complex(1), d), -c.h0 / (c.tau1 * c.tau2));
}

function tapGain(tap: Tap, c: Core): number {
  if (tap === "highpass") return -c.h0;
  if (tap === "bandpass") return c.h0 / (c.tau1 * c.damp);
  return -c.h0 / (c.tau1 * c.tau2 * c.w0 * c.w0);
}

function makeTap(tap: Tap): Topology {
  const node = tap === "lowpass" ? "lp" : tap === "highpass" ? "hp" : "bp";
  // G R (sum of the three input conductances times R) for the chosen gain
  const gr = (t: StageTarget): number => (tap === "bandpass" ? Math.abs(t.gain) / (t.q as number) + 2 : Math.abs(t.gain) + 2);
  const parts = withOutputAt(core.slice(0, 12), node);
  return defineTopology({
    id: `state-variable-${tap}`,
    name: `state-variable (KHN) ${tap}`,
    order: 2,
    kinds: [tap],
    inverting: tap !== "bandpass",
    reference: REF,
    levelCapacitor: "C1",
    levelResistor: "R2",
    parts,
    limits: (t) =>
      (t.q as number) * gr(t) > 1 + 1e-9
        ? null
        : `this state-variable ${tap} sets Q with a divider of ratio 1/(Q G R) = ${(1 / ((t.q as number) * gr(t))).toPrecision(4)}, which must stay below 1; raise Q or the gain, or choose a Sallen-Key or multiple-feedback stage`,
    solve: (t) => {
      const v = baseValues(t);
      const r = v["R2"] as number;
      const k = Math.abs(t.gain);
      const qv = t.q as number;
      v["R1"] = tap === "bandpass" ? (r * qv) / k : r / k;
      v["R4"] = r * (qv * gr(t) - 1);
      delete v["R10"];
      return v;
    },
    ...indexedFigures(parts, () => ({
      figures: (x) => {
        const c = coreAt(x);
        return { f0Hz: c.w0 / TWO_PI, q: c.q, gain: tapGain(tap, c) };
      },
      f0Hz,
    })),
    closedForm: (v, s, a) => (a === null ? tapResponse(tap, v, s) : finiteTaps(v, s, a)[node === "lp" ? "lp" : node === "hp" ? "hp" : "bp"]),
    closedFormFinite: true,
    polynomials: { degree: 5, core: tapPolynomials(node) },
  });
}

/** KHN state-variable lowpass (output of the second integrator, inverting; three op-amps). */
export const stateVariableLowpass: Topology = makeTap("lowpass");
/** KHN state-variable highpass (output of the summing amplifier, inverting; three op-amps). */
export const stateVariableHighpass: Topology = makeTap("highpass");
/** KHN state-variable bandpass (output of the first integrator, non-inverting; three op-amps). */
export const stateVariableBandpass: Topology = makeTap("bandpass");

/** Every state-variable topology, in registry order. */
export const stateVariableTopologies: readonly Topology[] = Object.freeze([
  stateVariableLowpass,
  stateVariableHighpass,
  stateVariableBandpass,
  stateVariableNotch,
  stateVariableAllpass,
]);
