/**
 * Sallen-Key lowpass and highpass stages: unity gain, equal component, and
 * general gain (R. P. Sallen & E. L. Key, "A practical method of designing RC
 * active filters", IRE Trans. Circuit Theory CT-2(1):74-85, 1955; design
 * equations as in R. Schaumann & M. E. Van Valkenburg, "Design of Analog
 * Filters", Oxford University Press, 2001, chapter on single-amplifier
 * biquads, from memory).
 *
 * Lowpass parts: R1 in -> a, R2 a -> b, C1 a -> out (feedback capacitor),
 * C2 b -> 0 (grounded capacitor), U1 non-inverting input at b. Gain
 * `K = 1 + R3/R4` with R3 out -> inverting input, R4 inverting input -> 0
 * (unity form: inverting input tied to out, no R3/R4).
 *
 *   H(s) = K / (1 + s (R1 C2 + R2 C2 + (1 - K) R1 C1) + s^2 R1 R2 C1 C2)
 *   w0 = 1 / sqrt(R1 R2 C1 C2),  Q = sqrt(R1 R2 C1 C2) / (R1 C2 + R2 C2 + (1 - K) R1 C1)
 *
 * Highpass parts: C1 in -> a, C2 a -> b, R1 a -> out (feedback resistor),
 * R2 b -> 0, same amplifier.
 *
 *   H(s) = K s^2 R1 R2 C1 C2 / (1 + s (R1 (C1 + C2) + (1 - K) R2 C2) + s^2 R1 R2 C1 C2)
 *   w0 = 1 / sqrt(R1 R2 C1 C2),  Q = sqrt(R1 R2 C1 C2) / (R1 (C1 + C2) + (1 - K) R2 C2)
 *
 * Design choices:
 * - Lowpass, unity and general gain: `capacitorRatio` m = C1/C2. With the
 *   capacitors fixed, R1 and R2 are the roots of a quadratic that has real
 *   roots only when m >= 4 Q^2 / (1 + 4 Q^2 (K - 1)) (= 4 Q^2 at unity gain);
 *   R1 is the smaller root (at the minimum ratio, R2 = (1 + m (1 - K)) R1).
 *   Alternatively `resistorRatio` n = R2/R1 fixes the resistors instead and
 *   the capacitors follow; every Q is then realisable (at unity gain
 *   C1/C2 = Q^2 (1 + n)^2 / n). Giving both ratios is refused. Defaults: the
 *   unity-gain form takes the minimum capacitor ratio 4 Q^2, which gives equal
 *   resistors; the general-gain form takes equal resistors (n = 1), which is
 *   realisable for every Q and avoids the extreme resistor spread of the
 *   minimum ratio at high gain.
 * - Highpass, unity and general gain: `capacitorRatio` r = C1/C2, default 1
 *   (equal capacitors); any Q is realisable; at unity gain with equal
 *   capacitors R2/R1 = 4 Q^2.
 * - Equal component (R1 = R2, C1 = C2, lowpass and highpass): the gain is
 *   fixed at K = 3 - 1/Q, so Q must exceed 1/2; the Q sensitivity to K is
 *   3Q - 1, so the form is refused above Q = 10 (sensitivity 29).
 * - `capacitor` sets C2 (lowpass) or C1 (highpass); `resistor` sets R1;
 *   default R1 = 10 kOhm. The gain resistor R4 equals R1 before scaling.
 *
 * Finite-GBW response (closed form): the amplifier is a VCVS of gain
 * `Ke = A / (1 + A beta)` (beta = R4/(R3+R4), 1 at unity), exact for the
 * single-pole model without output resistance, substituted for K above.
 * As-built polynomials (closed form, `polynomials`), derived here from the
 * same nodal equations with `Ke = 1/(beta + 1/A)`, `1/A = g0 + g1 z`,
 * z = s/w, alpha = 1 - beta = R3/(R3 + R4) (0 at unity), multiplying through
 * by `beta + 1/A`. Lowpass, with t11 = R1 C1 w, t12 = R1 C2 w, t22 = R2 C2 w,
 * p = t11 t22, b = t11 + t12 + t22:
 *
 *   N = 1
 *   D = (beta + g0) + (beta (t12 + t22) + g0 b + g1 - alpha t11) z
 *       + ((beta + g0) p + g1 b) z^2 + g1 p z^3
 *
 * Highpass, with t11 = R1 C1 w, t12 = R1 C2 w, t22 = R2 C2 w, p = t11 t22:
 * `N = p z^2` and D as above with `beta (t11 + t12) - alpha t22` in the z
 * term. Every coefficient is a sum of positive terms except the z term of D
 * at gain above 1, whose single subtraction is the circuit's own (the ideal
 * `w0/Q` coefficient is that difference). Degree 3 (2 with the ideal
 * op-amp); accuracy a few ulps per coefficient plus that difference's
 * cancellation, the same as the closed form's.
 *
 * GBW demand: computed numerically from that response (f0 and Q within 1 %);
 * common practice, no source, asks for GBW >= 100 K f0 (more for high Q).
 *
 * @module
 */
import { requireInRange, requirePositive } from "../validate.ts";
import type { ComponentValues, StageChoices, StageTarget, Topology } from "./types.ts";
import { cadd, cdiv, cmul, complex, cscale, csub, type Complex } from "../math/complex.ts";
import { TWO_PI } from "../units/constants.ts";
import { defineTopology } from "./define.ts";
import { atLeast, partIndex, valueOf, type PartSpec, type TopologySpec } from "./spec.ts";
import { nonInvertingGain, type PolynomialCore } from "./kernels.ts";

const REF =
  'R. P. Sallen & E. L. Key, IRE Trans. Circuit Theory CT-2(1):74-85, 1955; R. Schaumann & M. E. Van Valkenburg, "Design of Analog Filters", 2001, single-amplifier biquads (from memory)';

/**
 * Smallest K - 1 the gain forms take: the gain resistor R3 = (K - 1) R4 is
 * then at least a fiftieth of R4. Nearer unity the pair would be a near-short
 * beside a normal resistor (down to micro-ohms as K approaches 1) for a gain
 * the unity form gives within 2 %, so the unity form is the stage to use
 * (common practice, no source).
 */
export const SK_MIN_GAIN_STEP = 0.02;

/** Q above which the equal-component form is refused (Q sensitivity to gain 3Q - 1 = 29). */
export const EQUAL_COMPONENT_MAX_Q = 10;

const q = (t: StageTarget): number => t.q as number;
const w0Of = (t: StageTarget): number => TWO_PI * t.f0Hz;

const lowPassive: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "a" },
  { kind: "R", name: "R2", a: "a", b: "b" },
  { kind: "C", name: "C1", a: "a", b: "out" },
  { kind: "C", name: "C2", a: "b", b: "0" },
];
const highPassive: PartSpec[] = [
  { kind: "C", name: "C1", a: "in", b: "a" },
  { kind: "C", name: "C2", a: "a", b: "b" },
  { kind: "R", name: "R1", a: "a", b: "out" },
  { kind: "R", name: "R2", a: "b", b: "0" },
];
const follower: PartSpec[] = [{ kind: "OA", name: "U1", inP: "b", inN: "out", out: "out" }];
const gainAmp: PartSpec[] = [
  { kind: "OA", name: "U1", inP: "b", inN: "fb", out: "out" },
  { kind: "R", name: "R3", a: "out", b: "fb" },
  { kind: "R", name: "R4", a: "fb", b: "0" },
];

const kOf = (v: ComponentValues): number => (v["R3"] === undefined ? 1 : 1 + valueOf(v, "R3") / valueOf(v, "R4"));
const betaOf = (v: ComponentValues): number => (v["R3"] === undefined ? 1 : valueOf(v, "R4") / (valueOf(v, "R3") + valueOf(v, "R4")));

function lowFigures(v: ComponentValues): { f0Hz: number; q: number; gain: number } {
  const k = kOf(v);
  const p = valueOf(v, "R1") * valueOf(v, "R2") * valueOf(v, "C1") * valueOf(v, "C2");
  const b1 = valueOf(v, "R1") * valueOf(v, "C2") + valueOf(v, "R2") * valueOf(v, "C2") + (1 - k) * valueOf(v, "R1") * valueOf(v, "C1");
  return { f0Hz: 1 / (TWO_PI * Math.sqrt(p)), q: Math.sqrt(p) / b1, gain: k };
}

function highFigures(v: ComponentValues): { f0Hz: number; q: number; gain: number } {
  const k = kOf(v);
  const p = valueOf(v, "R1") * valueOf(v, "R2") * valueOf(v, "C1") * valueOf(v, "C2");
  const b1 = valueOf(v, "R1") * (valueOf(v, "C1") + valueOf(v, "C2")) + (1 - k) * valueOf(v, "R2") * valueOf(v, "C2");
  return { f0Hz: 1 / (TWO_PI * Math.sqrt(p)), q: Math.sqrt(p) / b1, gain: k };
}

function lowClosed(v: ComponentValues, s: Complex, a: Complex | null): Complex {
  const ke = nonInvertingGain(a, betaOf(v));
  const r1 = valueOf(v, "R1");
  const r2 = valueOf(v, "R2");
  const c1 = valueOf(v, "C1");
  const c2 = valueOf(v, "C2");
  // 1 + s (R1 C2 + R2 C2) + s (1 - Ke) R1 C1 + s^2 R1 R2 C1 C2
  const s2 = cmul(s, s);
  let den = cadd(complex(1), cscale(s, r1 * c2 + r2 * c2));
  den = cadd(den, cmul(cscale(s, r1 * c1), csub(complex(1), ke)));
  den = cadd(den, cscale(s2, r1 * r2 * c1 * c2));
  return cdiv(ke, den);
}

function highClosed(v: ComponentValues, s: Complex, a: Complex | null): Complex {
  const ke = nonInvertingGain(a, betaOf(v));
  const r1 = valueOf(v, "R1");
  const r2 = valueOf(v, "R2");
  const c1 = valueOf(v, "C1");
  const c2 = valueOf(v, "C2");
  const s2p = cscale(cmul(s, s), r1 * r2 * c1 * c2);
  let den = cadd(complex(1), cscale(s, r1 * (c1 + c2)));
  den = cadd(den, cmul(cscale(s, r2 * c2), csub(complex(1), ke)));
  den = cadd(den, s2p);
  return cdiv(cmul(ke, s2p), den);
}

/**
 * The polynomial core of a Sallen-Key stage with the given parts (see the
 * header): `low` selects the lowpass network, `gain` the gain resistors.
 */
function skPolynomials(parts: readonly PartSpec[], low: boolean, gain: boolean): PolynomialCore {
  const i = partIndex(parts);
  const [r1, r2, c1, c2] = (["R1", "R2", "C1", "C2"] as const).map((n) => i[n] as number) as [number, number, number, number];
  const r3 = gain ? (i["R3"] as number) : 0;
  const r4 = gain ? (i["R4"] as number) : 0;
  return (x, g0, g1, w, num, den) => {
    let beta = 1;
    let alpha = 0;
    if (gain) {
      const sum = (x[r3] as number) + (x[r4] as number);
      beta = (x[r4] as number) / sum;
      alpha = (x[r3] as number) / sum;
    }
    const t11 = (x[r1] as number) * (x[c1] as number) * w;
    const t12 = (x[r1] as number) * (x[c2] as number) * w;
    const t22 = (x[r2] as number) * (x[c2] as number) * w;
    const p = t11 * t22;
    const b = t11 + t12 + t22;
    den[0] = beta + g0;
    den[1] = (low ? beta * (t12 + t22) : beta * (t11 + t12)) + g0 * b + g1 - alpha * (low ? t11 : t22);
    den[2] = (beta + g0) * p + g1 * b;
    den[3] = g1 * p;
    if (low) num[0] = 1;
    else num[2] = p;
  };
}

/**
 * Smallest capacitor ratio C1/C2 (feedback over grounded capacitor) with
 * which a Sallen-Key lowpass of gain K >= 1 reaches a pole Q:
 * `4 Q^2 / (1 + 4 Q^2 (K - 1))`. At that ratio the two resistors are equal.
 *
 * @param qv - pole Q (> 0)
 * @param k - gain K (>= 1)
 * @returns the minimum ratio
 * @throws never (no checks: a helper for the design layer's choices)
 * @example
 * ```ts
 * sallenKeyLowpassMinRatio(1.4, 1); //=> 7.839999999999999 (4Q^2)
 * ```
 */
export function sallenKeyLowpassMinRatio(qv: number, k: number): number {
  const fn = "sallenKeyLowpassMinRatio";
  return skMinRatio(requirePositive(fn, "q", qv), requireInRange(fn, "k", k, { min: 1, max: 1e6 }));
}

function skMinRatio(qv: number, k: number): number {
  return (4 * qv * qv) / (1 + 4 * qv * qv * (k - 1));
}

function lowRatio(t: StageTarget, c: StageChoices): number {
  return c.capacitorRatio ?? skMinRatio(q(t), t.gain);
}

/** Add the gain resistors R4 = R1 and R3 = (K - 1) R1 when K is not 1 (the follower has none). */
function withGainResistors(out: Record<string, number>, k: number, r1: number): Record<string, number> {
  if (k !== 1) {
    out["R4"] = r1;
    out["R3"] = (k - 1) * r1;
  }
  return out;
}

function lowSolve(t: StageTarget, c: StageChoices, defaultEqualResistors: boolean): Record<string, number> {
  const w0 = w0Of(t);
  const k = t.gain;
  if (c.capacitorRatio === undefined && (c.resistorRatio !== undefined || defaultEqualResistors)) {
    // R2 = n R1, C2 = 1: (1 + n) R1^2 - R1/(w0 Q) + (1 - K)/(w0^2 n) = 0, one positive root for K >= 1
    const n = c.resistorRatio ?? 1;
    const b = 1 / (w0 * q(t));
    const cc = (1 - k) / (w0 * w0 * n);
    const r1 = (b + Math.sqrt(b * b - 4 * (1 + n) * cc)) / (2 * (1 + n));
    const out: Record<string, number> = { C2: 1, C1: 1 / (w0 * w0 * n * r1 * r1), R1: r1, R2: n * r1 };
    return withGainResistors(out, k, r1);
  }
  const m = lowRatio(t, c);
  // C2 = 1, C1 = m; a R1^2 - b R1 + cc = 0
  const a = 1 + m * (1 - k);
  const b = 1 / (w0 * q(t));
  const cc = 1 / (w0 * w0 * m);
  let disc = b * b - 4 * a * cc;
  if (disc < 0 && disc > -1e-9 * b * b) disc = 0;
  const r1 = (2 * cc) / (b + Math.sqrt(disc));
  const r2 = cc / r1;
  const out: Record<string, number> = { C1: m, C2: 1, R1: r1, R2: r2 };
  return withGainResistors(out, k, r1);
}

function highSolve(t: StageTarget, c: StageChoices): Record<string, number> {
  const w0 = w0Of(t);
  const k = t.gain;
  const r = c.capacitorRatio ?? 1;
  // C2 = 1, C1 = r; (r + 1) R1^2 - b R1 - (K - 1) P = 0, P = R1 R2 = 1/(w0^2 r)
  const p = 1 / (w0 * w0 * r);
  const b = 1 / (w0 * q(t));
  const r1 = (b + Math.sqrt(b * b + 4 * (r + 1) * (k - 1) * p)) / (2 * (r + 1));
  const out: Record<string, number> = { C1: r, C2: 1, R1: r1, R2: p / r1 };
  return withGainResistors(out, k, r1);
}

function equalSolve(t: StageTarget): Record<string, number> {
  const r = 1 / w0Of(t);
  return { C1: 1, C2: 1, R1: r, R2: r, R4: r, R3: (2 - 1 / q(t)) * r };
}

function equalLimits(t: StageTarget): string | null {
  const qv = q(t);
  if (!(qv > 0.5)) {
    return `an equal-component Sallen-Key stage needs Q above 0.5 (its gain 3 - 1/Q must exceed 1), got Q = ${qv}; choose the unity-gain or general-gain form`;
  }
  if (!(2 - 1 / qv >= SK_MIN_GAIN_STEP * (1 - 1e-9))) {
    return `an equal-component Sallen-Key stage at Q = ${qv} has gain 3 - 1/Q within ${SK_MIN_GAIN_STEP * 100} % of 1, so its gain resistor R3 would be a near-short; choose the unity-gain form`;
  }
  if (qv > EQUAL_COMPONENT_MAX_Q) {
    return `an equal-component Sallen-Key stage at Q = ${qv} is impractically sensitive to its gain (Q changes ${(3 * qv - 1).toFixed(1)} times faster than the gain); keep Q <= ${EQUAL_COMPONENT_MAX_Q} or choose a multiple-feedback or state-variable stage`;
  }
  return null;
}

const unityOnly = (t: StageTarget): string | null =>
  Math.abs(t.gain - 1) > 1e-9
    ? `a unity-gain Sallen-Key stage has gain 1 (got ${t.gain}); choose the general-gain or equal-component form for other gains`
    : null;
const aboveOne = (t: StageTarget): string | null =>
  t.gain >= 1 + SK_MIN_GAIN_STEP * (1 - 1e-9)
    ? null
    : `the general-gain Sallen-Key form needs a gain of at least ${1 + SK_MIN_GAIN_STEP} (got ${t.gain}): nearer 1 its gain resistor R3 = (K - 1) R4 is a near-short; for gain 1 choose the unity-gain form`;

function lowRatioLimit(t: StageTarget, c: StageChoices, unity: boolean): string | null {
  if (c.capacitorRatio !== undefined && c.resistorRatio !== undefined) {
    return "a Sallen-Key lowpass takes either capacitorRatio (C1/C2) or resistorRatio (R2/R1), not both; drop one";
  }
  if (c.capacitorRatio === undefined) return null;
  const min = skMinRatio(q(t), t.gain);
  if (atLeast(c.capacitorRatio, min)) return null;
  return unity
    ? `a unity-gain Sallen-Key lowpass needs its feedback capacitor C1 at least 4Q^2 = ${min.toPrecision(4)} times its grounded capacitor C2 (capacitorRatio ${c.capacitorRatio}); raise capacitorRatio or choose an equal-component or multiple-feedback stage`
    : `a Sallen-Key lowpass of gain ${t.gain} at Q = ${q(t)} needs C1/C2 at least 4Q^2/(1 + 4Q^2 (K - 1)) = ${min.toPrecision(4)} (capacitorRatio ${c.capacitorRatio}); raise capacitorRatio or the gain`;
}

type Form = "unity" | "equal" | "gain";

const FORM_NAME: Readonly<Record<Form, string>> = { unity: "unity gain", equal: "equal components", gain: "gain K" };

/** One Sallen-Key stage: the lowpass or highpass passive network with the follower (unity) or the gain amplifier. */
function skStage(
  kind: "lowpass" | "highpass",
  form: Form,
  rules: Pick<TopologySpec, "limits" | "solve">,
): Topology {
  const low = kind === "lowpass";
  const parts = [...(low ? lowPassive : highPassive), ...(form === "unity" ? follower : gainAmp)];
  return defineTopology({
    id: `sallen-key-${kind}-${form}`,
    name: `Sallen-Key ${kind}, ${FORM_NAME[form]}`,
    order: 2,
    kinds: [kind],
    inverting: false,
    reference: REF,
    levelCapacitor: low ? "C2" : "C1",
    levelResistor: "R1",
    parts,
    limits: rules.limits,
    solve: rules.solve,
    figures: low ? lowFigures : highFigures,
    closedForm: low ? lowClosed : highClosed,
    closedFormFinite: true,
    polynomials: { degree: 3, core: skPolynomials(parts, low, form !== "unity") },
    ...(form === "equal" ? { fixedGain: (t: Omit<StageTarget, "gain">) => 3 - 1 / (t.q as number) } : {}),
  });
}

/** Unity-gain Sallen-Key lowpass (equal resistors by default). */
export const sallenKeyLowpassUnity: Topology = skStage("lowpass", "unity", {
  limits: (t, c) => unityOnly(t) ?? lowRatioLimit(t, c, true),
  solve: (t, c) => lowSolve({ ...t, gain: 1 }, c, false),
});

/** Equal-component Sallen-Key lowpass (gain fixed at 3 - 1/Q). */
export const sallenKeyLowpassEqual: Topology = skStage("lowpass", "equal", { limits: equalLimits, solve: equalSolve });

/** General-gain Sallen-Key lowpass (chosen capacitor ratio). */
export const sallenKeyLowpassGain: Topology = skStage("lowpass", "gain", {
  limits: (t, c) => aboveOne(t) ?? lowRatioLimit(t, c, false),
  solve: (t, c) => lowSolve(t, c, true),
});

/** Unity-gain Sallen-Key highpass (equal capacitors by default). */
export const sallenKeyHighpassUnity: Topology = skStage("highpass", "unity", {
  limits: unityOnly,
  solve: (t, c) => highSolve({ ...t, gain: 1 }, c),
});

/** Equal-component Sallen-Key highpass (gain fixed at 3 - 1/Q). */
export const sallenKeyHighpassEqual: Topology = skStage("highpass", "equal", { limits: equalLimits, solve: equalSolve });

/** General-gain Sallen-Key highpass (chosen capacitor ratio, default equal). */
export const sallenKeyHighpassGain: Topology = skStage("highpass", "gain", { limits: aboveOne, solve: highSolve });

/** Every Sallen-Key topology, in registry order. */
export const sallenKeyTopologies: readonly Topology[] = Object.freeze([
  sallenKeyLowpassUnity,
  sallenKeyLowpassEqual,
  sallenKeyLowpassGain,
  sallenKeyHighpassUnity,
  sallenKeyHighpassEqual,
  sallenKeyHighpassGain,
]);
