/**
 * First-order stages: a passive RC section followed by a unity-gain buffer or
 * a non-inverting gain stage, and the inverting first-order lowpass and
 * highpass.
 *
 * Ideal figures (w0 = 2 pi f0):
 * - RC + buffer lowpass: `H = 1 / (1 + s R1 C1)`; w0 = 1/(R1 C1), gain 1.
 *   Parts: R1 in -> a, C1 a -> 0, U1 follower (out = inverting input).
 * - RC + buffer highpass: `H = s R1 C1 / (1 + s R1 C1)`; C1 in -> a, R1 a -> 0.
 * - RC + non-inverting gain: as above times `K = 1 + R2/R3`
 *   (R2 out -> inverting input, R3 inverting input -> 0); needs K > 1.
 * - Inverting lowpass: R1 in -> n, R2 and C1 in parallel n -> out;
 *   `H = -(R2/R1) / (1 + s R2 C1)`, w0 = 1/(R2 C1), gain -R2/R1.
 * - Inverting highpass: C1 in -> m, R1 m -> n, R2 n -> out;
 *   `H = -(R2/R1) s R1 C1 / (1 + s R1 C1)`, w0 = 1/(R1 C1), HF gain -R2/R1.
 *
 * - First-order allpass (phase shifter): R1 in -> n, R2 n -> out, R3 in -> p,
 *   C1 p -> 0, U1 non-inverting input p, inverting input n; with R1 = R2,
 *   `H = (1 - s R3 C1) / (1 + s R3 C1)`, w0 = 1/(R3 C1), gain +1 at DC and
 *   -R2/R1 = -1 at high frequency. With finite gain
 *   `H = A (1/(1 + s R3 C1) - R2/(R1 + R2)) / (1 + A R1/(R1 + R2))`.
 *
 * Reference: L. P. Huelsman & P. E. Allen, "Introduction to the Theory and
 * Design of Active Filters", McGraw-Hill, 1980, first-order sections
 * (from memory).
 *
 * Finite-GBW response (closed form): with open-loop gain `A(s)` the follower
 * or gain stage gives `A / (1 + A beta)` (beta = R3/(R2+R3), 1 for the
 * follower) and the inverting stages `-Y1 / (Y2 + (Y1 + Y2)/A)`.
 * GBW demand: computed numerically from that response (1 % on f0); common
 * practice, no source, asks for GBW >= 100 |gain| f0.
 *
 * As-built polynomials (closed form, `polynomials`), in z = s/w with
 * T = R C w for the stage's time constant and `1/A = g0 + g1 z`, derived here
 * from the same nodal equations (every coefficient a sum of positive terms;
 * the allpass numerator's two terms have opposite signs, no sum):
 * - RC + buffer or gain stage: `N = 1` (lowpass) or `T z` (highpass),
 *   `D = (beta + g0 + g1 z)(1 + T z)`.
 * - Inverting lowpass (k = R2/R1, T = R2 C1 w):
 *   `N = -k`, `D = (1 + T z) + (1 + k + T z)(g0 + g1 z)`.
 * - Inverting highpass (T1 = R1 C1 w, T2 = R2 C1 w):
 *   `N = -T2 z`, `D = (1 + T1 z) + (1 + (T1 + T2) z)(g0 + g1 z)`.
 * - Allpass (k = R2/R1, T = R3 C1 w):
 *   `N = 1 - k T z`, `D = (1 + (1 + k)(g0 + g1 z))(1 + T z)`.
 * Degree 2 (1 with the ideal op-amp); accuracy a few ulps per coefficient.
 *
 * Choices: `capacitor` sets C1; `resistor` sets R1 (R3 for the allpass); by
 * default that resistor is 10 kOhm.
 * The gain resistor R3 of the non-inverting stages equals R1 before scaling.
 *
 * @module
 */
import type { ComponentValues, StageTarget, Topology } from "./types.ts";
import { cadd, cdiv, cmul, complex, cscale } from "../math/complex.ts";
import { TWO_PI } from "../units/constants.ts";
import { defineTopology } from "./define.ts";
import { partIndex, valueOf, conductanceOf, LIMIT_SLACK, type PartSpec } from "./spec.ts";
import { invertingGain, nonInvertingGain } from "./kernels.ts";

const REF =
  'L. P. Huelsman & P. E. Allen, "Introduction to the Theory and Design of Active Filters", McGraw-Hill, 1980, first-order sections (from memory)';

const w0Of = (t: StageTarget): number => TWO_PI * t.f0Hz;

const bufferLow: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "a" },
  { kind: "C", name: "C1", a: "a", b: "0" },
  { kind: "OA", name: "U1", inP: "a", inN: "out", out: "out" },
];
const bufferHigh: PartSpec[] = [
  { kind: "C", name: "C1", a: "in", b: "a" },
  { kind: "R", name: "R1", a: "a", b: "0" },
  { kind: "OA", name: "U1", inP: "a", inN: "out", out: "out" },
];
const gainNet: PartSpec[] = [
  { kind: "OA", name: "U1", inP: "a", inN: "fb", out: "out" },
  { kind: "R", name: "R2", a: "out", b: "fb" },
  { kind: "R", name: "R3", a: "fb", b: "0" },
];

const unityGain = (t: StageTarget): string | null =>
  Math.abs(t.gain - 1) > LIMIT_SLACK
    ? `a buffered RC stage has gain 1 (got ${t.gain}); for a gain above 1 choose the RC stage with a non-inverting gain stage, or an inverting stage`
    : null;
/**
 * Smallest gain step K - 1 of the non-inverting gain stage: its resistor
 * R2 = (K - 1) R3 is then at least a fiftieth of R3 (nearer 1 it would be a
 * near-short for a gain the buffer gives within 2 %; common practice, no source).
 */
const MIN_GAIN_STEP = 0.02;

const aboveOne = (t: StageTarget): string | null =>
  t.gain >= 1 + MIN_GAIN_STEP * (1 - 1e-9)
    ? null
    : `a non-inverting gain stage needs a gain of at least ${1 + MIN_GAIN_STEP} (got ${t.gain}): nearer 1 its resistor R2 = (K - 1) R3 is a near-short; for gain 1 choose the buffered RC stage`;

const beta = (v: ComponentValues): number => valueOf(v, "R3") / (valueOf(v, "R2") + valueOf(v, "R3"));

/** Passive RC lowpass or highpass followed by a unity-gain buffer or a non-inverting gain stage `1 + R2/R3`. */
function rcStage(kind: "lowpass" | "highpass", withGain: boolean): Topology {
  const passive = kind === "lowpass" ? bufferLow : bufferHigh;
  const parts = withGain ? [...passive.slice(0, 2), ...gainNet] : passive;
  const i = partIndex(parts);
  return defineTopology({
    id: `first-order-${kind}-${withGain ? "noninverting" : "buffer"}`,
    name: `RC ${kind} + ${withGain ? "non-inverting gain" : "buffer"}`,
    order: 1,
    kinds: [kind],
    inverting: false,
    reference: REF,
    levelCapacitor: "C1",
    levelResistor: "R1",
    parts,
    limits: withGain ? aboveOne : unityGain,
    solve: withGain
      ? (t) => {
          const r1 = 1 / w0Of(t);
          return { C1: 1, R1: r1, R3: r1, R2: (t.gain - 1) * r1 };
        }
      : (t) => ({ C1: 1, R1: 1 / w0Of(t) }),
    figures: (v) => ({ f0Hz: 1 / (TWO_PI * valueOf(v, "R1") * valueOf(v, "C1")), gain: withGain ? 1 + valueOf(v, "R2") / valueOf(v, "R3") : 1 }),
    closedForm: (v, s, a) => {
      const k = nonInvertingGain(a, withGain ? beta(v) : 1);
      if (kind === "lowpass") return cdiv(k, cadd(complex(1), cscale(s, valueOf(v, "R1") * valueOf(v, "C1"))));
      const st = cscale(s, valueOf(v, "R1") * valueOf(v, "C1"));
      return cmul(k, cdiv(st, cadd(complex(1), st)));
    },
    closedFormFinite: true,
    polynomials: {
      degree: 2,
      core: (x, g0, g1, w, num, den) => {
        const t = (x[i["R1"] as number] as number) * (x[i["C1"] as number] as number) * w;
        const r3 = withGain ? (x[i["R3"] as number] as number) : 0;
        const b = withGain ? r3 / ((x[i["R2"] as number] as number) + r3) : 1;
        den[0] = b + g0;
        den[1] = (b + g0) * t + g1;
        den[2] = g1 * t;
        if (kind === "lowpass") num[0] = 1;
        else num[1] = t;
      },
    },
  });
}

/** Passive RC lowpass followed by a unity-gain buffer. */
export const firstOrderLowpassBuffer: Topology = rcStage("lowpass", false);

/** Passive RC highpass followed by a unity-gain buffer. */
export const firstOrderHighpassBuffer: Topology = rcStage("highpass", false);

/** Passive RC lowpass followed by a non-inverting gain stage `1 + R2/R3`. */
export const firstOrderLowpassNoninverting: Topology = rcStage("lowpass", true);

/** Passive RC highpass followed by a non-inverting gain stage `1 + R2/R3`. */
export const firstOrderHighpassNoninverting: Topology = rcStage("highpass", true);

const invertingLowParts: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "n" },
  { kind: "R", name: "R2", a: "n", b: "out" },
  { kind: "C", name: "C1", a: "n", b: "out" },
  { kind: "OA", name: "U1", inP: "0", inN: "n", out: "out" },
];
const invertingLowAt = partIndex(invertingLowParts);

/** Inverting first-order lowpass: R1 in, R2 || C1 feedback. */
export const firstOrderLowpassInverting: Topology = defineTopology({
  id: "first-order-lowpass-inverting",
  name: "inverting first-order lowpass",
  order: 1,
  kinds: ["lowpass"],
  inverting: true,
  reference: REF,
  levelCapacitor: "C1",
  levelResistor: "R1",
  parts: invertingLowParts,
  limits: () => null,
  solve: (t) => {
    const r2 = 1 / w0Of(t);
    return { C1: 1, R2: r2, R1: r2 / Math.abs(t.gain) };
  },
  figures: (v) => ({ f0Hz: 1 / (TWO_PI * valueOf(v, "R2") * valueOf(v, "C1")), gain: -valueOf(v, "R2") / valueOf(v, "R1") }),
  closedForm: (v, s, a) => invertingGain(complex(conductanceOf(v, "R1")), cadd(complex(conductanceOf(v, "R2")), cscale(s, valueOf(v, "C1"))), a),
  closedFormFinite: true,
  polynomials: {
    degree: 2,
    core: (x, g0, g1, w, num, den) => {
      const r1 = x[invertingLowAt["R1"] as number] as number;
      const r2 = x[invertingLowAt["R2"] as number] as number;
      const k = r2 / r1;
      const t = r2 * (x[invertingLowAt["C1"] as number] as number) * w;
      num[0] = -k;
      den[0] = 1 + (1 + k) * g0;
      den[1] = t + t * g0 + (1 + k) * g1;
      den[2] = t * g1;
    },
  },
});

const invertingHighParts: PartSpec[] = [
  { kind: "C", name: "C1", a: "in", b: "m" },
  { kind: "R", name: "R1", a: "m", b: "n" },
  { kind: "R", name: "R2", a: "n", b: "out" },
  { kind: "OA", name: "U1", inP: "0", inN: "n", out: "out" },
];
const invertingHighAt = partIndex(invertingHighParts);

/** Inverting first-order highpass: C1 and R1 in series at the input, R2 feedback. */
export const firstOrderHighpassInverting: Topology = defineTopology({
  id: "first-order-highpass-inverting",
  name: "inverting first-order highpass",
  order: 1,
  kinds: ["highpass"],
  inverting: true,
  reference: REF,
  levelCapacitor: "C1",
  levelResistor: "R1",
  parts: invertingHighParts,
  limits: () => null,
  solve: (t) => {
    const r1 = 1 / w0Of(t);
    return { C1: 1, R1: r1, R2: r1 * Math.abs(t.gain) };
  },
  figures: (v) => ({ f0Hz: 1 / (TWO_PI * valueOf(v, "R1") * valueOf(v, "C1")), gain: -valueOf(v, "R2") / valueOf(v, "R1") }),
  closedForm: (v, s, a) => {
    const sc = cscale(s, valueOf(v, "C1"));
    const y1 = cdiv(sc, cadd(complex(1), cscale(s, valueOf(v, "R1") * valueOf(v, "C1"))));
    return invertingGain(y1, complex(conductanceOf(v, "R2")), a);
  },
  closedFormFinite: true,
  polynomials: {
    degree: 2,
    core: (x, g0, g1, w, num, den) => {
      const cw = (x[invertingHighAt["C1"] as number] as number) * w;
      const t1 = (x[invertingHighAt["R1"] as number] as number) * cw;
      const t2 = (x[invertingHighAt["R2"] as number] as number) * cw;
      num[1] = -t2;
      den[0] = 1 + g0;
      den[1] = t1 + g1 + (t1 + t2) * g0;
      den[2] = (t1 + t2) * g1;
    },
  },
});

const allpassParts: PartSpec[] = [
  { kind: "R", name: "R1", a: "in", b: "n" },
  { kind: "R", name: "R2", a: "n", b: "out" },
  { kind: "R", name: "R3", a: "in", b: "p" },
  { kind: "C", name: "C1", a: "p", b: "0" },
  { kind: "OA", name: "U1", inP: "p", inN: "n", out: "out" },
];
const allpassAt = partIndex(allpassParts);

/** First-order allpass (phase shifter): gain +1 at DC, -1 at high frequency. */
export const firstOrderAllpass: Topology = defineTopology({
  id: "first-order-allpass",
  name: "first-order allpass",
  order: 1,
  kinds: ["allpass"],
  inverting: false,
  reference: REF,
  levelCapacitor: "C1",
  levelResistor: "R3",
  parts: allpassParts,
  limits: () => null,
  solve: (t) => {
    const r = 1 / w0Of(t);
    return { C1: 1, R1: r, R2: r, R3: r };
  },
  figures: (v) => ({ f0Hz: 1 / (TWO_PI * valueOf(v, "R3") * valueOf(v, "C1")), gain: 1 }),
  closedForm: (v, s, a) => {
    const r1 = valueOf(v, "R1");
    const r2 = valueOf(v, "R2");
    const lag = cdiv(complex(1), cadd(complex(1), cscale(s, valueOf(v, "R3") * valueOf(v, "C1"))));
    const drive = cadd(lag, complex(-r2 / (r1 + r2)));
    const beta = r1 / (r1 + r2);
    if (a === null) return cscale(drive, 1 / beta);
    return cdiv(cmul(a, drive), cadd(complex(1), cscale(a, beta)));
  },
  closedFormFinite: true,
  polynomials: {
    degree: 2,
    core: (x, g0, g1, w, num, den) => {
      const k = (x[allpassAt["R2"] as number] as number) / (x[allpassAt["R1"] as number] as number);
      const t = (x[allpassAt["R3"] as number] as number) * (x[allpassAt["C1"] as number] as number) * w;
      const c0 = 1 + (1 + k) * g0;
      num[0] = 1;
      num[1] = -(k * t);
      den[0] = c0;
      den[1] = c0 * t + (1 + k) * g1;
      den[2] = (1 + k) * g1 * t;
    },
  },
  fixedGain: () => 1,
});

/** Every first-order topology, in registry order. */
export const firstOrderTopologies: readonly Topology[] = Object.freeze([
  firstOrderLowpassBuffer,
  firstOrderHighpassBuffer,
  firstOrderLowpassNoninverting,
  firstOrderHighpassNoninverting,
  firstOrderLowpassInverting,
  firstOrderHighpassInverting,
  firstOrderAllpass,
]);
