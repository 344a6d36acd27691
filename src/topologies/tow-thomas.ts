/**
 * Tow-Thomas biquad (damped integrator, integrator, inverter) with a fourth
 * op-amp summing the input, the bandpass output and the lowpass output (or
 * its inverse), giving lowpass-notch, highpass-notch, symmetric notch and
 * allpass sections (J. Tow, "Active RC filters - a state-space realization",
 * Proc. IEEE 56(6):1137-1139, 1968; L. C. Thomas, "The biquad: part I - some
 * practical design considerations", IEEE Trans. Circuit Theory
 * CT-18(3):350-357, 1971; summing stage as in R. Schaumann & M. E. Van
 * Valkenburg, "Design of Analog Filters", 2001, chapter on two-integrator-loop
 * biquads, from memory).
 *
 * Parts: U1 damped integrator: R1 in -> n1, R2 and C1 n1 -> v1, R3 v3 -> n1.
 * U2 integrator: R4 v1 -> n2, C2 n2 -> v2. U3 inverter: R5 v2 -> n3,
 * R6 n3 -> v3. U4 summer: R7 in -> n4, R8 v1 -> n4, R9 n4 -> out (feedback),
 * and R10 from v2 (lowpass-notch) or v3 (highpass-notch) to n4.
 *
 *   D(s) = s^2 + s/(R2 C1) + w0^2,   w0^2 = R6/(R3 R4 R5 C1 C2),   Q = w0 R2 C1
 *   v1/vin = -(s/(R1 C1))/D,   v2/vin = 1/(R1 R4 C1 C2 D),   v3 = -(R6/R5) v2
 *   H = -R9 (vin/R7 + v1/R8 + vx/R10) / vin
 *
 * With R8 = R7 R2/R1 the s-term of the numerator cancels and
 * `H = -(R9/R7)(s^2 + wz^2)/D`, wz^2 = w0^2 +- R7/(R10 R1 R4 C1 C2) (plus with
 * v2, minus with v3, times R6/R5). With R8 = R7 R2/(2 R1) and no R10 the
 * section is the allpass `-(R9/R7)(s^2 - s w0/Q + w0^2)/D`. All variants are
 * inverting: HF gain -R9/R7, DC gain -(R9/R7) wz^2/w0^2.
 *
 * Without the summer (U4, R7-R10) the loop alone gives a lowpass at v2
 * (non-inverting, DC gain R3 R5/(R1 R6); R1 = R3/K in the design) and a
 * bandpass at v1 (inverting, gain at f0 -R2/R1; R1 = R2/|K|): the stage
 * output is then that node.
 *
 * Design: C1 = C2, R3 = R4 = R5 = R6 = 1/(w0 C), R1 = R2 = Q/(w0 C) (unity
 * bandpass gain at v1), R9 = 1/(w0 C). `capacitor` sets C1 (= C2),
 * `resistor` sets R3 (and with it the level of every resistor); default
 * R3 = 10 kOhm. No ratio choices.
 *
 * Finite-GBW response (closed form, exact for the single-pole model without
 * output resistance): each op-amp is an inverting stage whose inverting
 * input sits at -v_out/A; the inverter and integrator are
 * `-Y1/(Y2 + (Y1 + Y2)/A)`, the loop is solved for v1, and the summer gives
 * `-sum(Gk vk)/(G9 + (sum(Gk) + G9)/A)`.
 *
 * As-built polynomials (closed form, derived here from those same nodal
 * equations; `1/A = g0 + g1 z`, `z = s/w0`, Gk = 1/Rk):
 *
 *   D1 = G2 + s C1 + (G1 + G2 + G3 + s C1)/A,  D2 = s C2 + (G4 + s C2)/A,
 *   D3 = G6 + (G5 + G6)/A,  P = D1 D2 D3 + G3 G4 G5   (degree 5)
 *   v1 = -G1 D2 D3 / P,  v2 = G1 G4 D3 / P,  v3 = -G1 G4 G5 / P   (per volt in)
 *   S = G9 + (G7 + G8 + G10 + G9)/A,  E = G7 D1 - G1 G8
 *   H = -(E D2 D3 + G3 G4 G5 G7 + X) / (P S)   (degree 6)
 *
 * with X = G1 G4 G10 D3 (lowpass-notch), -G1 G4 G5 G10 (highpass-notch) or
 * 0 (notch, allpass); the loop alone gives the lowpass v2 and bandpass v1.
 * Every denominator coefficient is a sum of positive terms (a few ulps); the
 * numerators subtract only where the circuit does (E's constant
 * `G7 G2 - G1 G8 + G7 (G1 + G2 + G3) g0`, the s-term the notch cancels, and
 * the highpass-notch's `G4 G5 (G3 G7 - G1 G10)`), each a single difference
 * of products, so a numerator coefficient is within a few ulps of the sum
 * of its terms' magnitudes. Checked symbolically against the full nodal
 * equations by scripts/reference/topology_tow_thomas_polynomials.py and
 * numerically (test/topologies/polynomials.test.ts, within 1e-9 dB and
 * 1e-7 degree of nodal analysis).
 * GBW demand: computed numerically (f0 and Q within 1 %); common practice,
 * no source, asks for GBW >= 100 f0 for the integrators, with the damped
 * integrator's Q-enhancement the limiting effect at high Q.
 *
 * @module
 */
import type { ComponentValues, StageFigures, StageKind, StageTarget, Topology } from "./types.ts";
import { cadd, cdiv, cmul, complex, cscale, type Complex } from "../math/complex.ts";
import { TWO_PI } from "../units/constants.ts";
import { defineTopology } from "./define.ts";
import { indexedFigures, loopIndex, withOutputAt, valueOf, conductanceOf, type PartSpec } from "./spec.ts";
import { invertingGain, summer, type PolynomialCore } from "./kernels.ts";

const REF =
  'J. Tow, Proc. IEEE 56(6):1137-1139, 1968; L. C. Thomas, IEEE Trans. Circuit Theory CT-18(3):350-357, 1971; R. Schaumann & M. E. Van Valkenburg, "Design of Analog Filters", 2001, two-integrator-loop biquads (from memory)';


type Variant = "lowpass-notch" | "highpass-notch" | "notch" | "allpass" | "lowpass" | "bandpass";

const core: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "n1" },
  { kind: "R", name: "R2", a: "n1", b: "v1" },
  { kind: "C", name: "C1", a: "n1", b: "v1" },
  { kind: "R", name: "R3", a: "v3", b: "n1" },
  { kind: "OA", name: "U1", inP: "0", inN: "n1", out: "v1" },
  { kind: "R", name: "R4", a: "v1", b: "n2" },
  { kind: "C", name: "C2", a: "n2", b: "v2" },
  { kind: "OA", name: "U2", inP: "0", inN: "n2", out: "v2" },
  { kind: "R", name: "R5", a: "v2", b: "n3" },
  { kind: "R", name: "R6", a: "n3", b: "v3" },
  { kind: "OA", name: "U3", inP: "0", inN: "n3", out: "v3" },
  { kind: "R", name: "R7", a: "in", b: "n4" },
  { kind: "R", name: "R8", a: "v1", b: "n4" },
  { kind: "R", name: "R9", a: "n4", b: "out" },
  { kind: "OA", name: "U4", inP: "0", inN: "n4", out: "out" },
];

function parts(variant: Variant): PartSpec[] {
  if (variant === "lowpass") return withOutputAt(core.slice(0, 11), "v2");
  if (variant === "bandpass") return withOutputAt(core.slice(0, 11), "v1");
  if (variant === "lowpass-notch") return [...core, { kind: "R", name: "R10", a: "v2", b: "n4" }];
  if (variant === "highpass-notch") return [...core, { kind: "R", name: "R10", a: "v3", b: "n4" }];
  return core;
}

/** Where the loop's parts (R1-R6, C1, C2) sit in every Tow-Thomas stage's values (their parts lists all start with the loop's eleven). */
const LOOP = loopIndex(core.slice(0, 11), ["R1", "R2", "R3", "R4", "R5", "R6", "C1", "C2"]);
const { R1, R2, R3, R4, R5, R6, C1, C2 } = LOOP.at;

/** The pole frequency squared, w0^2 = R6 / (R3 R4 R5 C1 C2), from the values in component order. */
function w0SqAt(x: Float64Array): number {
  return (x[R6] as number) / ((x[R3] as number) * (x[R4] as number) * (x[R5] as number) * (x[C1] as number) * (x[C2] as number));
}

/** {@link w0SqAt} of named values. */
function w0Sq(v: ComponentValues): number {
  return w0SqAt(LOOP.pack(v));
}

/** `1 / (R1 R4 C1 C2)` from the values in component order. */
function kAt(x: Float64Array): number {
  return 1 / ((x[R1] as number) * (x[R4] as number) * (x[C1] as number) * (x[C2] as number));
}

function closedForm(variant: Variant) {
  return (v: ComponentValues, s: Complex, a: Complex | null): Complex => {
    if (a !== null) return finiteForm(variant, v, s, a);
    const d = cadd(cadd(cmul(s, s), cscale(s, 1 / (valueOf(v, "R2") * valueOf(v, "C1")))), complex(w0Sq(v)));
    const h1 = cdiv(cscale(s, -1 / (valueOf(v, "R1") * valueOf(v, "C1"))), d);
    const h2 = cdiv(complex(1 / (valueOf(v, "R1") * valueOf(v, "R4") * valueOf(v, "C1") * valueOf(v, "C2"))), d);
    if (variant === "lowpass") return h2;
    if (variant === "bandpass") return h1;
    let sum = cadd(complex(conductanceOf(v, "R7")), cscale(h1, conductanceOf(v, "R8")));
    if (variant === "lowpass-notch") sum = cadd(sum, cscale(h2, conductanceOf(v, "R10")));
    if (variant === "highpass-notch") sum = cadd(sum, cscale(h2, -valueOf(v, "R6") / (valueOf(v, "R5") * valueOf(v, "R10"))));
    return cscale(sum, -valueOf(v, "R9"));
  };
}

/**
 * Finite open-loop gain A (every op-amp an inverting stage, output an ideal
 * source, inverting input at -v_out/A): inverter and integrator by
 * `invertingGain`, the damped integrator solved for v1 around the loop, the
 * summer as `out = -sum(Gk vk) / (G9 + (sum(Gk) + G9)/A)`.
 */
function finiteForm(variant: Variant, v: ComponentValues, s: Complex, a: Complex): Complex {
  const g1 = conductanceOf(v, "R1");
  const g3 = conductanceOf(v, "R3");
  const yf = cadd(complex(conductanceOf(v, "R2")), cscale(s, valueOf(v, "C1")));
  const t2 = invertingGain(complex(conductanceOf(v, "R4")), cscale(s, valueOf(v, "C2")), a); // v2 / v1
  const t3 = invertingGain(complex(conductanceOf(v, "R5")), complex(conductanceOf(v, "R6")), a); // v3 / v2
  // v1 [Yf + (G1 + G3 + Yf)/A + G3 T3 T2] = -G1 vin
  const den = cadd(cadd(yf, cdiv(cadd(complex(g1 + g3), yf), a)), cscale(cmul(t3, t2), g3));
  const v1 = cdiv(complex(-g1), den);
  const v2 = cmul(t2, v1);
  if (variant === "bandpass") return v1;
  if (variant === "lowpass") return v2;
  const terms: [number, Complex][] = [
    [conductanceOf(v, "R7"), complex(1)],
    [conductanceOf(v, "R8"), v1],
  ];
  if (variant === "lowpass-notch") terms.push([conductanceOf(v, "R10"), v2]);
  if (variant === "highpass-notch") terms.push([conductanceOf(v, "R10"), cmul(t3, v2)]);
  return summer(terms, conductanceOf(v, "R9"), a);
}

/** `out = a * b` for ascending coefficient arrays (`out` of length a.length + b.length - 1, overwritten). */
function multiplyInto(a: Float64Array, b: Float64Array, out: Float64Array): void {
  out.fill(0);
  for (let i = 0; i < a.length; i++) for (let j = 0; j < b.length; j++) out[i + j] = (out[i + j] as number) + (a[i] as number) * (b[j] as number);
}

const d1 = new Float64Array(3);
const d2 = new Float64Array(3);
const d3 = new Float64Array(2);
const d23 = new Float64Array(4);
const loop = new Float64Array(6);
const eq = new Float64Array(3);
const sq = new Float64Array(2);
const ed23 = new Float64Array(6);

/**
 * The loop's factors into the module scratch: `d1`, `d2`, `d3` (D1, D2, D3
 * below), `d23` = D2 D3 and `loop` = P = D1 D2 D3 + G3 G4 G5, ascending in
 * z = s / w, for `1/A = g0 + g1 z`.
 */
function loopInto(x: Float64Array, g0: number, g1: number, w: number): void {
  const G1 = 1 / (x[R1] as number);
  const G2 = 1 / (x[R2] as number);
  const G3 = 1 / (x[R3] as number);
  const G4 = 1 / (x[R4] as number);
  const G5 = 1 / (x[R5] as number);
  const G6 = 1 / (x[R6] as number);
  const c1 = (x[C1] as number) * w;
  const c2 = (x[C2] as number) * w;
  const s1 = G1 + G2 + G3;
  d1[0] = G2 + s1 * g0;
  d1[1] = c1 * (1 + g0) + s1 * g1;
  d1[2] = c1 * g1;
  d2[0] = G4 * g0;
  d2[1] = c2 * (1 + g0) + G4 * g1;
  d2[2] = c2 * g1;
  d3[0] = G6 + (G5 + G6) * g0;
  d3[1] = (G5 + G6) * g1;
  multiplyInto(d2, d3, d23);
  multiplyInto(d1, d23, loop);
  loop[0] = (loop[0] as number) + G3 * G4 * G5;
}

/**
 * As-built polynomials of the loop alone (lowpass at v2, bandpass at v1),
 * derived here from the same nodal equations as {@link finiteForm}, with
 * `1/A = g0 + g1 z` and `z = s / w`:
 *
 *   D1 = Yf + (G1 + G3 + Yf)/A   (damped integrator, Yf = G2 + s C1)
 *   D2 = s C2 + (G4 + s C2)/A    (integrator)
 *   D3 = G6 + (G5 + G6)/A        (inverter)
 *   P = D1 D2 D3 + G3 G4 G5,  v1/vin = -G1 D2 D3 / P,  v2/vin = G1 G4 D3 / P
 *
 * Every coefficient of D1, D2, D3 and P is a sum of positive terms.
 */
function loopPolynomials(variant: "lowpass" | "bandpass"): PolynomialCore {
  return (x, g0, g1, w, num, den) => {
    loopInto(x, g0, g1, w);
    den.set(loop);
    const G1 = 1 / (x[R1] as number);
    if (variant === "lowpass") {
      const G4 = 1 / (x[R4] as number);
      num[0] = G1 * G4 * (d3[0] as number);
      num[1] = G1 * G4 * (d3[1] as number);
    } else {
      for (let k = 0; k < d23.length; k++) num[k] = -G1 * (d23[k] as number);
    }
  };
}

/**
 * As-built polynomials of the summed stages (lowpass-notch, highpass-notch,
 * notch, allpass), derived here from the same nodal equations as
 * {@link finiteForm} (and checked symbolically against the stage's full
 * nodal equations by scripts/reference/topology_tow_thomas_polynomials.py).
 * With the loop's D1, D2, D3 and P ({@link loopPolynomials}),
 * `v1 = -G1 D2 D3 / P`, `v2 = G1 G4 D3 / P` and `v3 = -G1 G4 G5 / P` (per
 * volt in), and the summer `out = -(G7 + G8 v1 + G10 vx) / S` with
 *
 *   S = G9 + (G7 + G8 + G10 + G9)/A      (G10 = 0 without R10)
 *   E = G7 D1 - G1 G8 = (G7 G2 - G1 G8) + G7 s C1 + G7 (G1 + G2 + G3 + s C1)/A
 *   N = -(E D2 D3 + G3 G4 G5 G7 + X),  H = out/vin = N / (P S)
 *
 * where X = G1 G4 G10 D3 (lowpass-notch, vx = v2), X = -G1 G4 G5 G10
 * (highpass-notch, vx = v3; folded into the constant as
 * `G4 G5 (G3 G7 - G1 G10)`) and X = 0 (notch, allpass). The denominator
 * P S (degree 2 + one per op-amp = 6) is a product of sums of positive
 * terms, so every coefficient carries a few ulps of relative error. The
 * numerator subtracts only where the circuit itself does: the constant of E,
 * `G7 (G2 + (G1 + G2 + G3) g0) - G1 G8` (zero for the ideal notch forms, whose
 * s-term cancels; `-G7 G2` for the ideal allpass), and the highpass-notch's
 * `G3 G7 - G1 G10` (w0^2 - wz^2); each is one difference of products
 * rounded to a few ulps, so a numerator coefficient's error is a few ulps of
 * the sum of its terms' magnitudes.
 */
function summedPolynomials(variant: "lowpass-notch" | "highpass-notch" | "notch" | "allpass"): PolynomialCore {
  const withR10 = variant === "lowpass-notch" || variant === "highpass-notch";
  const at = loopIndex(parts(variant), withR10 ? ["R7", "R8", "R9", "R10"] : ["R7", "R8", "R9"]).at as Readonly<Record<string, number>>;
  const r7 = at["R7"] as number;
  const r8 = at["R8"] as number;
  const r9 = at["R9"] as number;
  const r10 = withR10 ? (at["R10"] as number) : -1;
  return (x, g0, g1, w, num, den) => {
    loopInto(x, g0, g1, w);
    const G1 = 1 / (x[R1] as number);
    const G3 = 1 / (x[R3] as number);
    const G4 = 1 / (x[R4] as number);
    const G5 = 1 / (x[R5] as number);
    const G7 = 1 / (x[r7] as number);
    const G8 = 1 / (x[r8] as number);
    const G9 = 1 / (x[r9] as number);
    const G10 = withR10 ? 1 / (x[r10] as number) : 0;
    const gs = G7 + G8 + G10 + G9;
    sq[0] = G9 + gs * g0;
    sq[1] = gs * g1;
    multiplyInto(loop, sq, den);
    eq[0] = G7 * (d1[0] as number) - G1 * G8;
    eq[1] = G7 * (d1[1] as number);
    eq[2] = G7 * (d1[2] as number);
    multiplyInto(eq, d23, ed23);
    let c0 = G3 * G4 * G5 * G7;
    if (variant === "lowpass-notch") {
      const k = G1 * G4 * G10;
      c0 += k * (d3[0] as number);
      ed23[1] = (ed23[1] as number) + k * (d3[1] as number);
    } else if (variant === "highpass-notch") {
      c0 = G4 * G5 * (G3 * G7 - G1 * G10);
    }
    ed23[0] = (ed23[0] as number) + c0;
    for (let k = 0; k < ed23.length; k++) num[k] = -(ed23[k] as number);
  };
}

function figures(variant: Variant) {
  return indexedFigures(parts(variant), (at) => {
    const summed = variant !== "lowpass" && variant !== "bandpass";
    const r7 = summed ? at("R7") : -1;
    const r9 = summed ? at("R9") : -1;
    const r10 = variant === "lowpass-notch" || variant === "highpass-notch" ? at("R10") : -1;
    /** Constant numerator coefficient (times 1/R7-normalised) of the summed output. */
    const n0 = (x: Float64Array): number => {
      const base = w0SqAt(x) / (x[r7] as number);
      if (variant === "lowpass-notch") return base + kAt(x) / (x[r10] as number);
      if (variant === "highpass-notch") return base - (kAt(x) * (x[R6] as number)) / ((x[R5] as number) * (x[r10] as number));
      return base;
    };
    const figuresAt = (x: Float64Array): StageFigures => {
      const w2 = w0SqAt(x);
      const w0 = Math.sqrt(w2);
      const qv = w0 * (x[R2] as number) * (x[C1] as number);
      if (variant === "lowpass") {
        return { f0Hz: w0 / TWO_PI, q: qv, gain: 1 / ((x[R1] as number) * (x[R4] as number) * (x[C1] as number) * (x[C2] as number) * w2) };
      }
      if (variant === "bandpass") return { f0Hz: w0 / TWO_PI, q: qv, gain: -(x[R2] as number) / (x[R1] as number) };
      const hf = -(x[r9] as number) / (x[r7] as number);
      if (variant === "allpass") return { f0Hz: w0 / TWO_PI, q: qv, gain: hf };
      const c0 = n0(x);
      const wz = Math.sqrt(Math.max(0, c0 * (x[r7] as number)));
      const dc = (-(x[r9] as number) * c0) / w2;
      return { f0Hz: w0 / TWO_PI, q: qv, fzHz: wz / TWO_PI, gain: variant === "highpass-notch" ? hf : dc };
    };
    return { figures: figuresAt, f0Hz: (x: Float64Array): number => Math.sqrt(w0SqAt(x)) / TWO_PI };
  });
}

function solve(variant: Variant) {
  return (t: StageTarget): Record<string, number> => {
    const w0 = TWO_PI * t.f0Hz;
    const qv = t.q as number;
    const k = Math.abs(t.gain);
    const r = 1 / w0;
    const out: Record<string, number> = { C1: 1, C2: 1, R1: qv * r, R2: qv * r, R3: r, R4: r, R5: r, R6: r, R9: r };
    if (variant === "lowpass") return { ...out, R1: r / k };
    if (variant === "bandpass") return { ...out, R1: (qv * r) / k };
    const kk = (w0 * w0) / qv; // 1/(R1 R4 C1 C2)
    if (variant === "allpass") {
      out["R7"] = r / k;
      out["R8"] = r / k / 2;
      return out;
    }
    const wz = TWO_PI * (t.fzHz ?? t.f0Hz);
    if (variant === "lowpass-notch") {
      out["R7"] = (r * wz * wz) / (k * w0 * w0);
      out["R10"] = ((out["R7"] as number) * kk) / (wz * wz - w0 * w0);
    } else {
      out["R7"] = r / k;
      if (variant === "highpass-notch") out["R10"] = ((out["R7"] as number) * kk) / (w0 * w0 - wz * wz);
    }
    out["R8"] = out["R7"] as number;
    return out;
  };
}

function make(variant: Variant, id: string, name: string): Topology {
  const kinds: StageKind[] = [variant];
  return defineTopology({
    id,
    name,
    order: 2,
    kinds,
    inverting: variant !== "lowpass",
    reference: REF,
    levelCapacitor: "C1",
    levelResistor: "R3",
    parts: parts(variant),
    limits: (t) => {
      if (variant === "notch" && t.fzHz !== undefined && Math.abs(t.fzHz / t.f0Hz - 1) > 1e-9) {
        return `the symmetric Tow-Thomas notch puts its zero at f0 (fzHz = ${t.fzHz}, f0Hz = ${t.f0Hz}); choose the lowpass-notch or highpass-notch form`;
      }
      return null;
    },
    solve: solve(variant),
    ...figures(variant),
    closedForm: closedForm(variant),
    closedFormFinite: true,
    // degree 2 + one per op-amp: 5 for the loop alone, 6 with the summer
    polynomials: variant === "lowpass" || variant === "bandpass" ? { degree: 5, core: loopPolynomials(variant) } : { degree: 6, core: summedPolynomials(variant) },
  });
}

/** Tow-Thomas lowpass-notch section (zero above the pole; summer takes the lowpass output). */
export const towThomasLowpassNotch: Topology = make("lowpass-notch", "tow-thomas-lowpass-notch", "Tow-Thomas lowpass-notch");
/** Tow-Thomas highpass-notch section (zero below the pole; summer takes the inverted lowpass output). */
export const towThomasHighpassNotch: Topology = make("highpass-notch", "tow-thomas-highpass-notch", "Tow-Thomas highpass-notch");
/** Tow-Thomas symmetric notch (zero at the pole frequency). */
export const towThomasNotch: Topology = make("notch", "tow-thomas-notch", "Tow-Thomas notch");
/** Tow-Thomas allpass section. */
export const towThomasAllpass: Topology = make("allpass", "tow-thomas-allpass", "Tow-Thomas allpass");
/** Tow-Thomas lowpass (output of the second integrator, non-inverting; three op-amps). */
export const towThomasLowpass: Topology = make("lowpass", "tow-thomas-lowpass", "Tow-Thomas lowpass");
/** Tow-Thomas bandpass (output of the damped integrator, inverting; three op-amps). */
export const towThomasBandpass: Topology = make("bandpass", "tow-thomas-bandpass", "Tow-Thomas bandpass");

/** Every Tow-Thomas topology, in registry order. */
export const towThomasTopologies: readonly Topology[] = Object.freeze([
  towThomasLowpass,
  towThomasBandpass,
  towThomasLowpassNotch,
  towThomasHighpassNotch,
  towThomasNotch,
  towThomasAllpass,
]);
