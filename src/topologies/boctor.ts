/**
 * Single-amplifier lowpass-notch and highpass-notch biquads of the kind
 * S. A. Boctor published (one op-amp, two capacitors, the input applied both
 * to the RC network at one op-amp input and, through a divider, to the other,
 * so that the s term of the numerator cancels and the zeros sit on the jw
 * axis): S. A. Boctor, "Single amplifier functionally tunable low-pass notch
 * filter", IEEE Trans. Circuits Syst. CAS-22(11):875-881, 1975, and his
 * highpass-notch companion circuit (Electronics Letters, 1975, as the
 * project brief gives it; also S. A. Boctor, US patent 3,993,959,
 * "Second-order canonical active filter", 1976). The brief names the author
 * "P. E. Boctor"; the patent names Stalin A. Boctor (Northern Electric), so
 * the initials here follow the patent.
 *
 * Provenance, stated plainly: Boctor's published schematics and design
 * equations could not be consulted while this file was written. The circuits
 * below are ours: single-amplifier networks of that published kind, chosen
 * by a nodal-analysis search over two-capacitor networks around one op-amp
 * (every candidate's finite-gain denominator checked for stability, which
 * rules out the candidates whose ideal-op-amp "solution" needs net positive
 * feedback at DC), and every equation here was derived here by nodal
 * analysis (sympy; scripts/reference/topology_boctor.py repeats the
 * symbolic check and writes a numpy nodal-analysis fixture) and checked
 * against that fixture, the nodal analysis in `src/circuit/mna.ts` and
 * ngspice (test/topologies/boctor.test.ts).
 * The network is the multiple-feedback bandpass with an input attenuator
 * (the same core as `mfb-bandpass-attenuated`), with the non-inverting input
 * fed from the input through a divider (as in T. Deliyannis, Electronics
 * Letters 4(26):577-579, 1968 and J. J. Friend's notch forms of 1970) and
 * one extra resistor R6 that moves the zero off the pole: R6 to ground gives
 * the lowpass-notch, R6 to the input the highpass-notch. The ids keep
 * Boctor's name as the brief asks; whether the published circuits are
 * exactly these must be checked against the papers.
 *
 * Parts (both forms): R1 in -> a, R2 a -> 0, C1 a -> n, C2 a -> out,
 * R3 n -> out, R4 in -> p, R5 p -> 0, R6 n -> 0 (lowpass-notch) or
 * n -> in (highpass-notch); U1 non-inverting input p, inverting input n,
 * output out.
 *
 * With Gk = 1/Rk, Gt = G1 + G2, gamma = G4/(G4 + G5) (the divider at p) and
 * an ideal op-amp, H = N(s)/D(s) with
 *
 *   D  = C1 C2 s^2 + G3 (C1 + C2) s + G3 Gt
 *   N  = gamma C1 C2 s^2 + N1 s + N0
 *   lowpass-notch:  N1 = gamma (C1 (G2 + G3 + G6) + C2 (G3 + G6)) - (1 - gamma) C1 G1
 *                   N0 = gamma Gt (G3 + G6)
 *   highpass-notch: N1 = gamma (C1 (G2 + G3) + C2 G3) - (1 - gamma) (C1 G1 + (C1 + C2) G6)
 *                   N0 = Gt (gamma G3 - (1 - gamma) G6)
 *
 *   w0^2 = G3 Gt/(C1 C2),  Q = sqrt(G3 Gt C1 C2)/(G3 (C1 + C2)),  wz^2 = N0/(gamma C1 C2)
 *   lowpass-notch:  wz^2/w0^2 = 1 + G6/G3 (> 1),  DC gain gamma wz^2/w0^2,  HF gain gamma
 *   highpass-notch: wz^2/w0^2 = 1 - (G6/G3)(1 - gamma)/gamma (< 1),  HF gain gamma
 *
 * The zeros are on the jw axis when N1 = 0 (the nominal design); a part
 * error leaves a residual N1 that sets the notch depth
 * |H(j wz)|/|H(ref)| = |N1| wz D0/(N0 |D(j wz)|) for the lowpass-notch
 * (reference DC; the same with gamma C1 C2 for N0 and C1 C2 for D0 at HF for
 * the highpass-notch). The numerator does not involve the op-amp gain A (see
 * below), so a finite gain or GBW neither moves the zeros nor fills the notch
 * (for an op-amp without output resistance; with one, the input reaches the
 * output node through C2 and R3 and the zeros move a little).
 *
 * Design (derived here; C2 = C, C1 = m C, m the capacitor ratio, 1 by
 * default): Q = sqrt(Gt/G3) sqrt(m)/(1 + m) and w0^2 = G3 Gt/(m C^2) give
 * G3 = w0 C m/(Q (1 + m)), Gt = w0 C Q (1 + m); r = wz/w0;
 * gamma = K/r^2 (lowpass-notch, K the DC gain) or K (highpass-notch, K the
 * HF gain); N1 = 0 gives G1 = gamma (Gt + (1 + m) G3 r^2/m) in both forms
 * and G2 = Gt - G1; R6: G6 = G3 (r^2 - 1) (lowpass-notch) or
 * G6 = G3 (1 - r^2) gamma/(1 - gamma) (highpass-notch); the divider
 * G4 = gamma Gt, G5 = (1 - gamma) Gt (so R4 || R5 = R1 || R2). At
 * m = 1: G3 = w0 C/(2Q), Gt = 2 Q w0 C, G1 = gamma (Gt + 2 G3 r^2).
 *
 * Realisable range (enforced by `check`):
 * - gain: G2 > 0 needs gamma < Q^2 (1 + m)/(Q^2 (1 + m) + r^2). `check`
 *   accepts at most 99 % of that bound (R2 below 100 (R1 || R2)), with
 *   m <= 20, so the gain at the reference frequency is free in
 *   (0, 0.99 r^2 * 21 Q^2/(21 Q^2 + r^2)] for the lowpass-notch (DC) and
 *   (0, 0.99 * 21 Q^2/(21 Q^2 + r^2)] for the highpass-notch (HF, always
 *   below 1: at high frequency C1 and C2 tie the inverting input to the
 *   output, so the stage is a follower of the divider R4-R5). Without a
 *   chosen ratio the design takes m = 1 while the gain stays within 90 % of
 *   the bound there, else the smallest m (up to 20) that puts it at 90 %
 *   (R2 = 10 (R1 || R2)). A larger gain: lower the stage gain (make it up
 *   elsewhere) or use the Tow-Thomas form; the messages say which.
 * - zero: 1.01 <= fz/f0 for the lowpass-notch and fz/f0 <= 1/1.01 for the
 *   highpass-notch (closer to the pole R6 grows beyond about 50 R3:
 *   R6 = R3/(r^2 - 1)); no other bound (R6 shrinks as R3/(r^2 - 1) far from
 *   the pole, R6 -> R3 gamma/(1 - gamma) as fz -> 0). For a zero closer to
 *   the pole use the Tow-Thomas notch forms.
 * - Q: any, but the resistor spread is R3/(R1 || R2) = Q^2 (1 + m)^2/m
 *   (4 Q^2 at m = 1, 400 at Q = 10), as in the attenuated MFB bandpass;
 *   there is no Q enhancement.
 *
 * Choices: `capacitorRatio` m = C1/C2 (0 < m <= 20; a larger m allows a
 * larger gain at the cost of resistor spread); `capacitor` sets C2;
 * `resistor` sets R1; default R1 = 10 kOhm. No `resistorRatio` (refused).
 *
 * Finite op-amp (closed form, exact for the single-pole model without output
 * resistance, derived here): H = N / (D + Dp/A) with
 *   Dp = C1 C2 s^2 + (C1 (Gt + G3 + G6) + C2 (G3 + G6)) s + Gt (G3 + G6)
 * (the same for both forms; divided through by G4 + G5). As-built
 * polynomials (`polynomials`): z = s/w, 1/A = g0 + g1 z,
 * num = N(z), den = D(z) + (g0 + g1 z) Dp(z), degree 3 (2 ideal). Every
 * coefficient is a sum of positive terms except N1 (the cancellation that
 * makes the notch, a difference by design) and the highpass-notch N0.
 *
 * Sensitivities (S = d ln y/d ln x) at two typical designs, computed here
 * as central differences (+-1e-6 relative) of `figures`; notch depth with a
 * +1 % error in one part, ideal op-amp, |H(j wz)|/|H(ref)| at the built wz:
 *   lowpass-notch f0 = 1 kHz, Q = 2, fz = 2 kHz, DC gain 1 (m = 1; R1 10k,
 *   R2 6k, R3 60k, R4 15k, R5 5k, R6 20k, C1 = C2 = 10.6 nF):
 *     part  S(f0)   S(Q)    S(fz)   S(gain)  depth
 *     R1   -0.19   -0.19   -0.19    0        -43 dB
 *     R2   -0.31   -0.31   -0.31    0        -48 dB
 *     R3   -0.50   +0.50   -0.13   +0.75     -62 dB
 *     R4    0       0       0      -0.75     -43 dB
 *     R5    0       0       0      +0.75     -43 dB
 *     R6    0       0      -0.38   -0.75     -53 dB
 *     C1   -0.50    0      -0.50    0        -56 dB
 *     C2   -0.50    0      -0.50    0        -56 dB
 *   highpass-notch f0 = 1 kHz, Q = 2, fz = 500 Hz, HF gain 0.8 (m = 1;
 *   R1 10k, R2 47.1k, R3 132k, R4 10.3k, R5 41.3k, R6 44k, C 4.82 nF):
 *     R1   -0.41   -0.41   -0.41    0        -46 dB
 *     R2   -0.09   -0.09   -0.09    0        -47 dB
 *     R3   -0.50   +0.50   -2.00    0        -50 dB
 *     R4    0       0      -1.50   -0.20     -43 dB
 *     R5    0       0      +1.50   +0.20     -42 dB
 *     R6    0       0      +1.50    0        -52 dB
 *     C1   -0.50    0      -0.50    0        -68 dB
 *     C2   -0.50    0      -0.50    0        -68 dB
 *   f0 and Q sensitivities are at most 1/2 (no positive feedback); the
 *   highpass-notch fz is more sensitive (wz^2 is a difference, with
 *   S(R4), S(R5), S(R6) = +-(1 - r^2)/(2 r^2) = 1.5 here, growing as fz/f0
 *   falls). With 1 % parts the notch is about 40-50 dB deep (the
 *   notch-depth test checks the residual-N1 formula above). The op-amp
 *   does not enter N, so it neither moves the zeros nor limits the notch
 *   depth; it moves f0 and Q through D + Dp/A. The GBW demand is computed
 *   numerically from that response (f0 and Q within 1 %), like every stage
 *   here: 324 kHz at f0 = 1 kHz, Q = 2 (both forms; the Tow-Thomas forms ask
 *   832 kHz) and 0.99 MHz at Q = 10, fz = 1.2 kHz (Tow-Thomas: 4.0 MHz).
 *   At Q = 10 the default level (R1 = 10 kOhm) puts R3 near 2.8 MOhm; choose
 *   a lower `resistor` there.
 *
 * Preferred values: the zeros stay on the jw axis only while N1 = 0, a
 * balance between unequal parts, so rounding each part to a series on its
 * own (the four figures f0, Q, fz and gain do not see N1) leaves the notch
 * about 40-50 dB deep for 1 % steps, and a search that moves the parts
 * along the directions the four figures do not see (the capacitor ratio,
 * the R1:R2 split) can leave it far shallower. `figures` therefore also
 * reports `zeroDamping` = |N1|/(2 sqrt(N0 N2)) (0 nominal; about 1/(2 Qz)). The R1:R2 split at a fixed R1 || R2
 * moves N1 alone (f0, Q, fz and gain depend on R1 || R2 only), and the
 * R4:R5 ratio moves N1 and the gain only, so a value search that also
 * drives N1 to zero (or a trimmer in place of R2) restores the notch
 * without disturbing the other figures.
 *
 * @module
 */
import type { ComponentValues, StageChoices, StageFigures, StageKind, StageTarget, Topology } from "./types.ts";
import { cadd, cdiv, cmul, complex, cscale, type Complex } from "../math/complex.ts";
import { TWO_PI } from "../units/constants.ts";
import { defineTopology } from "./define.ts";
import { indexedFigures, partIndex, type PartSpec } from "./spec.ts";
import type { PolynomialCore } from "./kernels.ts";

const REF =
  'S. A. Boctor, "Single amplifier functionally tunable low-pass notch filter", IEEE Trans. Circuits Syst. CAS-22(11):875-881, 1975, and its highpass-notch companion (Electronics Letters, 1975): circuits of that kind; this circuit and its equations derived here by nodal analysis (see the file header)';

/** Smallest fz/f0 of the lowpass-notch (and 1 over the largest of the highpass-notch): R6 stays below about 50 R3. */
export const BOCTOR_MIN_ZERO_SEPARATION = 1.01;

/** Fraction of the gain bound `check` accepts (R2 stays below 100 (R1 || R2)). */
export const BOCTOR_GAIN_MARGIN = 0.99;

/** Largest capacitor ratio C1/C2 (chosen, or taken by the design to reach a gain): the resistor spread R3/(R1 || R2) is Q^2 (1 + m)^2/m, 22 Q^2 at 20. */
export const BOCTOR_MAX_RATIO = 20;

type Variant = "lowpass-notch" | "highpass-notch";

function partsOf(variant: Variant): PartSpec[] {
  return [
    { kind: "R", name: "R1", a: "in", b: "a" },
    { kind: "R", name: "R2", a: "a", b: "0" },
    { kind: "R", name: "R3", a: "n", b: "out" },
    { kind: "R", name: "R4", a: "in", b: "p" },
    { kind: "R", name: "R5", a: "p", b: "0" },
    { kind: "R", name: "R6", a: "n", b: variant === "lowpass-notch" ? "0" : "in" },
    { kind: "C", name: "C1", a: "a", b: "n" },
    { kind: "C", name: "C2", a: "a", b: "out" },
    { kind: "OA", name: "U1", inP: "p", inN: "n", out: "out" },
  ];
}

/** Both forms share the part order, so one index serves. */
const IX = partIndex(partsOf("lowpass-notch"));
const R1 = IX["R1"] as number;
const R2 = IX["R2"] as number;
const R3 = IX["R3"] as number;
const R4 = IX["R4"] as number;
const R5 = IX["R5"] as number;
const R6 = IX["R6"] as number;
const C1 = IX["C1"] as number;
const C2 = IX["C2"] as number;

/**
 * The coefficients of N, D and Dp (see the header), ascending, with the
 * capacitances given as c1, c2 (times the scale for the polynomial form,
 * plain for the closed form at s).
 */
function coefficients(low: boolean, x: Float64Array, c1: number, c2: number, n: Float64Array, d: Float64Array, dp: Float64Array): void {
  const g1 = 1 / (x[R1] as number);
  const g2 = 1 / (x[R2] as number);
  const g3 = 1 / (x[R3] as number);
  const g4 = 1 / (x[R4] as number);
  const g5 = 1 / (x[R5] as number);
  const g6 = 1 / (x[R6] as number);
  const gamma = g4 / (g4 + g5);
  const beta = g5 / (g4 + g5);
  const gt = g1 + g2;
  const cc = c1 * c2;
  n[2] = gamma * cc;
  if (low) {
    n[1] = gamma * (c1 * (g2 + g3 + g6) + c2 * (g3 + g6)) - beta * c1 * g1;
    n[0] = gamma * gt * (g3 + g6);
  } else {
    n[1] = gamma * (c1 * (g2 + g3) + c2 * g3) - beta * (c1 * g1 + (c1 + c2) * g6);
    n[0] = gt * (gamma * g3 - beta * g6);
  }
  d[2] = cc;
  d[1] = g3 * (c1 + c2);
  d[0] = g3 * gt;
  dp[2] = cc;
  dp[1] = c1 * (gt + g3 + g6) + c2 * (g3 + g6);
  dp[0] = gt * (g3 + g6);
}

const sn = new Float64Array(3);
const sd = new Float64Array(3);
const sdp = new Float64Array(3);

function polynomialCore(low: boolean): PolynomialCore {
  return (x, g0, g1, w, num, den) => {
    coefficients(low, x, (x[C1] as number) * w, (x[C2] as number) * w, sn, sd, sdp);
    num[0] = sn[0] as number;
    num[1] = sn[1] as number;
    num[2] = sn[2] as number;
    den[0] = (sd[0] as number) + g0 * (sdp[0] as number);
    den[1] = (sd[1] as number) + g0 * (sdp[1] as number) + g1 * (sdp[0] as number);
    den[2] = (sd[2] as number) + g0 * (sdp[2] as number) + g1 * (sdp[1] as number);
    den[3] = g1 * (sdp[2] as number);
  };
}

const packed = new Float64Array(8);

function closedForm(low: boolean) {
  return (v: ComponentValues, s: Complex, a: Complex | null): Complex => {
    packed[R1] = v["R1"] as number;
    packed[R2] = v["R2"] as number;
    packed[R3] = v["R3"] as number;
    packed[R4] = v["R4"] as number;
    packed[R5] = v["R5"] as number;
    packed[R6] = v["R6"] as number;
    coefficients(low, packed, v["C1"] as number, v["C2"] as number, sn, sd, sdp);
    const s2 = cmul(s, s);
    const at = (c: Float64Array): Complex => cadd(cadd(cscale(s2, c[2] as number), cscale(s, c[1] as number)), complex(c[0] as number));
    const n = at(sn);
    let d = at(sd);
    if (a !== null) d = cadd(d, cdiv(at(sdp), a));
    return cdiv(n, d);
  };
}

function figures(variant: Variant) {
  const low = variant === "lowpass-notch";
  return indexedFigures(partsOf(variant), () => {
    const f0 = (x: Float64Array): number => {
      const gt = 1 / (x[R1] as number) + 1 / (x[R2] as number);
      return Math.sqrt(gt / ((x[R3] as number) * (x[C1] as number) * (x[C2] as number))) / TWO_PI;
    };
    const figuresAt = (x: Float64Array): StageFigures => {
      const g3 = 1 / (x[R3] as number);
      const g4 = 1 / (x[R4] as number);
      const g5 = 1 / (x[R5] as number);
      const g6 = 1 / (x[R6] as number);
      const c1 = x[C1] as number;
      const c2 = x[C2] as number;
      const gt = 1 / (x[R1] as number) + 1 / (x[R2] as number);
      const gamma = g4 / (g4 + g5);
      const f0Hz = f0(x);
      const qv = Math.sqrt(g3 * gt * c1 * c2) / (g3 * (c1 + c2));
      const n0 = low ? gamma * gt * (g3 + g6) : gt * (gamma * g3 - (1 - gamma) * g6);
      const fzHz = Math.sqrt(Math.max(0, n0 / (gamma * c1 * c2))) / TWO_PI;
      const gain = low ? n0 / (g3 * gt) : gamma;
      const g1 = 1 / (x[R1] as number);
      const g2 = gt - g1;
      const n1 = low
        ? gamma * (c1 * (g2 + g3 + g6) + c2 * (g3 + g6)) - (1 - gamma) * c1 * g1
        : gamma * (c1 * (g2 + g3) + c2 * g3) - (1 - gamma) * (c1 * g1 + (c1 + c2) * g6);
      const zeroDamping = Math.abs(n1) / (2 * Math.sqrt(Math.abs(n0) * gamma * c1 * c2));
      return { f0Hz, q: qv, fzHz, gain, zeroDamping };
    };
    return { figures: figuresAt, f0Hz: f0 };
  });
}

/** The divider fraction gamma = R5/(R4 + R5) a target needs: the HF gain (DC gain over r^2 for the lowpass-notch). */
function gammaOf(variant: Variant, t: StageTarget): number {
  const r2 = ((t.fzHz as number) / t.f0Hz) ** 2;
  return variant === "lowpass-notch" ? t.gain / r2 : t.gain;
}

/** Largest gamma with capacitor ratio m = C1/C2 (R2 open): Q^2 (1 + m)/(Q^2 (1 + m) + r^2). */
function gammaMax(t: StageTarget, m: number): number {
  const qq = (t.q as number) ** 2;
  const r2 = ((t.fzHz as number) / t.f0Hz) ** 2;
  return (qq * (1 + m)) / (qq * (1 + m) + r2);
}

/**
 * The capacitor ratio m = C1/C2 a target uses: the choice, else 1 when the
 * divider fraction stays within 90 % of its bound there, else the ratio that
 * puts it at 90 % of the bound (R2 = 10 (R1 || R2); closer to the bound for
 * a gain above 81 % of it), at most {@link BOCTOR_MAX_RATIO}.
 */
function ratioOf(variant: Variant, t: StageTarget, c: StageChoices): number {
  if (c.capacitorRatio !== undefined) return c.capacitorRatio;
  const gamma = gammaOf(variant, t);
  if (gamma <= 0.9 * gammaMax(t, 1)) return 1;
  const fraction = gamma < 0.81 ? 0.9 : (gamma + BOCTOR_GAIN_MARGIN) / 2;
  const g = gamma / fraction;
  if (!(g < 1)) return BOCTOR_MAX_RATIO;
  const r2 = ((t.fzHz as number) / t.f0Hz) ** 2;
  const m = (g * r2) / ((t.q as number) ** 2 * (1 - g)) - 1;
  return Math.min(Math.max(m, 1), BOCTOR_MAX_RATIO);
}

function limits(variant: Variant, name: string) {
  return (t: StageTarget, c: StageChoices): string | null => {
    const ratio = (t.fzHz as number) / t.f0Hz;
    if (variant === "lowpass-notch" && ratio < BOCTOR_MIN_ZERO_SEPARATION) {
      return `the ${name} needs its zero at least ${BOCTOR_MIN_ZERO_SEPARATION} times its pole frequency (fzHz/f0Hz = ${ratio}; closer, R6 exceeds 50 R3); use the Tow-Thomas lowpass-notch or notch form for a zero this close to the pole`;
    }
    if (variant === "highpass-notch" && ratio > 1 / BOCTOR_MIN_ZERO_SEPARATION) {
      return `the ${name} needs its zero at most 1/${BOCTOR_MIN_ZERO_SEPARATION} of its pole frequency (fzHz/f0Hz = ${ratio}; closer, R6 exceeds 50 R3); use the Tow-Thomas highpass-notch or notch form for a zero this close to the pole`;
    }
    if (c.resistorRatio !== undefined) return `the ${name} takes no resistorRatio (its resistors follow from the target); drop it, or set capacitorRatio (C1/C2)`;
    if (c.capacitorRatio !== undefined && c.capacitorRatio > BOCTOR_MAX_RATIO * (1 + 1e-12)) {
      return `the ${name} takes capacitorRatio (C1/C2) up to ${BOCTOR_MAX_RATIO} (its resistor spread R3/(R1 || R2) is Q^2 (1 + m)^2/m); got ${c.capacitorRatio}: lower it`;
    }
    const where = variant === "lowpass-notch" ? "DC" : "high-frequency";
    const toGain = variant === "lowpass-notch" ? ratio * ratio : 1;
    const gamma = gammaOf(variant, t);
    const ceiling = BOCTOR_GAIN_MARGIN * gammaMax(t, BOCTOR_MAX_RATIO) * toGain;
    if (t.gain > ceiling * (1 + 1e-12)) {
      return `the ${name} reaches a ${where} gain of at most ${ceiling.toPrecision(6)} at Q = ${t.q} and fzHz/f0Hz = ${ratio.toPrecision(6)} (with C1/C2 up to ${BOCTOR_MAX_RATIO}; got ${t.gain}); lower the stage gain (make it up in another stage) or use the Tow-Thomas ${variant} form`;
    }
    const m = ratioOf(variant, t, c);
    const max = BOCTOR_GAIN_MARGIN * gammaMax(t, m) * toGain;
    if (t.gain > max * (1 + 1e-12)) {
      // the ratio at which the gain sits at the margin
      const g = gamma / BOCTOR_GAIN_MARGIN;
      const need = (g * ratio * ratio) / ((t.q as number) ** 2 * (1 - g)) - 1;
      return `the ${name} with C1/C2 = ${m.toPrecision(4)} reaches a ${where} gain of at most ${max.toPrecision(6)} at Q = ${t.q} and fzHz/f0Hz = ${ratio.toPrecision(6)} (got ${t.gain}); set capacitorRatio (C1/C2) to at least ${need.toPrecision(4)} (or leave it unset), lower the stage gain, or use the Tow-Thomas ${variant} form`;
    }
    return null;
  };
}

function solve(variant: Variant) {
  return (t: StageTarget, c: StageChoices): Record<string, number> => {
    const w0 = TWO_PI * t.f0Hz;
    const qv = t.q as number;
    const r2 = ((t.fzHz as number) / t.f0Hz) ** 2;
    const m = ratioOf(variant, t, c);
    const gamma = gammaOf(variant, t);
    // C2 = 1, C1 = m: Q = sqrt(Gt/G3) sqrt(m)/(1 + m), w0^2 = G3 Gt/m
    const g3 = (w0 * m) / (qv * (1 + m));
    const gt = w0 * qv * (1 + m);
    const g1 = gamma * (gt + ((1 + m) * g3 * r2) / m);
    const g2 = gt - g1;
    const g6 = variant === "lowpass-notch" ? g3 * (r2 - 1) : (g3 * (1 - r2) * gamma) / (1 - gamma);
    return { C1: m, C2: 1, R1: 1 / g1, R2: 1 / g2, R3: 1 / g3, R4: 1 / (gamma * gt), R5: 1 / ((1 - gamma) * gt), R6: 1 / g6 };
  };
}

function make(variant: Variant, id: string, name: string): Topology {
  const kinds: StageKind[] = [variant];
  const parts = partsOf(variant);
  const low = variant === "lowpass-notch";
  return defineTopology({
    id,
    name,
    order: 2,
    kinds,
    inverting: false,
    reference: REF,
    levelCapacitor: "C2",
    levelResistor: "R1",
    parts,
    limits: limits(variant, name),
    solve: solve(variant),
    ...figures(variant),
    closedForm: closedForm(low),
    closedFormFinite: true,
    polynomials: { degree: 3, core: polynomialCore(low) },
  });
}

/** Single-amplifier lowpass-notch (zero above the pole; R6 from the inverting input to ground; non-inverting, DC gain below 2Q^2 r^2/(2Q^2 + r^2)). */
export const boctorLowpassNotch: Topology = make("lowpass-notch", "boctor-lowpass-notch", "single-amplifier lowpass-notch (Boctor kind)");

/** Single-amplifier highpass-notch (zero below the pole; R6 from the inverting input to the input; non-inverting, HF gain below 1). */
export const boctorHighpassNotch: Topology = make("highpass-notch", "boctor-highpass-notch", "single-amplifier highpass-notch (Boctor kind)");

/** Both single-amplifier notch-section topologies, in registry order. */
export const boctorTopologies: readonly Topology[] = Object.freeze([boctorLowpassNotch, boctorHighpassNotch]);
