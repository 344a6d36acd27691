/**
 * A built stage with a finite-gain op-amp: the pole it really has, and the
 * smallest op-amp gain-bandwidth product that keeps it at the ideal one.
 *
 * Pole method: the stage's elements are analysed by modified nodal analysis
 * and the natural frequency nearest the ideal pole is found as a zero of the
 * nodal determinant `det(G + s C)` by Muller's method (D. E. Muller, "A
 * method for solving algebraic equations using an automatic computer", MTAC
 * 10:208-215, 1956; `math/muller.ts`), started from the ideal pole, to about
 * 1e-13 relative. Two real poles (Q <= 1/2) are found one after the other,
 * the second with the first divided out. Where the topology has closed-form
 * as-built polynomials (every one in the registry, for the ideal and
 * single-pole models), the same iteration runs on their denominator, the
 * nodal determinant up to a constant factor (a Horner evaluation per step
 * instead of a complex LU; the same root to 1e-9); the nodal determinant
 * stays for the models the polynomials do not cover (an output resistance).
 *
 * GBW demand method: the stage is designed for the target, its op-amps are
 * replaced by the single-pole model (a0 = 1e12, so the gain-bandwidth product
 * alone matters), and the smallest GBW for which the pole's f0 and Q both stay
 * within 1 % of target is found by quadrupling and then bisection in log(GBW)
 * to 0.1 %. Each step's pole comes from the stage's closed-form as-built
 * polynomials where the topology has them (the same Muller iteration on
 * their denominator, which is the nodal determinant up to a constant: a
 * Horner evaluation per step instead of a complex LU; the two agree to 1e-9,
 * test/topologies/gbw-demand.test.ts), else from the nodal determinant; each
 * topology keeps the demands it has found per target (define.ts), since the
 * design loop asks for the same targets again. A first-order stage has no Q, and its op-amp adds a pole rather
 * than moving the stage's own, so there the criterion is on the response at
 * f0: `|H(j w0)/H_ideal(j w0) - 1|` may not exceed what a 1 % shift of f0
 * would cause (about 0.70 %). A third-order stage is judged by its pole pair
 * (f0 and Q within 1 %), the pole the op-amp moves most.
 *
 * @module
 */
import type { Circuit, OpAmpModel } from "../circuit/types.ts";
import { assembleMna, mnaDeterminant } from "../circuit/mna.ts";
import { checkCircuit } from "../circuit/validate.ts";
import { ConvergenceError, InvalidArgumentError, UnrealisableError } from "../errors.ts";
import { cdiv, cmul, csub, type Complex } from "../math/complex.ts";
import { mullerRoot } from "../math/muller.ts";
import { geometricBisect } from "../math/optimize.ts";
import { TWO_PI } from "../units/constants.ts";
import { requirePositive } from "../validate.ts";
import { openLoopGain, type ClosedForm } from "./kernels.ts";
import type { ComponentValues, PolynomialsInto, StageChoices, StageFigures, StageTarget, Topology } from "./types.ts";

/**
 * DC gain of the op-amp model used to compute the GBW demand.
 *
 * @internal
 */
export const GBW_DEMAND_A0 = 1e12;

/**
 * Largest `|H(j w0) / H_ideal(j w0) - 1|` accepted for a first-order stage:
 * the change a 1 % shift of f0 makes, `|(1 + j) / (1 + j / 1.01) - 1|`.
 *
 * @internal
 */
export const FIRST_ORDER_DEVIATION: number = (() => {
  const c = 1 / 1.01;
  const d = 1 + c * c;
  return Math.hypot((1 + c) / d - 1, (1 - c) / d);
})();

/** The pole of a built stage: frequency and, for a second-order stage, Q. */
export interface AsBuiltPole {
  /** Pole frequency `|p| / 2 pi` in Hz. */
  readonly f0Hz: number;
  /** Pole Q `|p| / (-2 Re p)` (second-order stages only; negative means unstable). */
  readonly q?: number;
}

/**
 * The pole order the pole searches look for in a stage of this order: a
 * third-order stage's pole pair (its real pole moves less with the op-amp and
 * is not reported), else the stage's own.
 *
 * @internal
 */
export function poleOrderOf(order: 1 | 2 | 3): 1 | 2 {
  return order === 1 ? 1 : 2;
}

/** Ideal poles of a target: one real pole (first order), the upper-half-plane pole of a complex pair, or two real poles (Q <= 1/2). */
function idealPoles(order: 1 | 2, f0Hz: number, q: number): Complex[] {
  const w0 = TWO_PI * f0Hz;
  if (order === 1) return [{ re: -w0, im: 0 }];
  const d = 1 - 1 / (4 * q * q);
  if (d > 0) return [{ re: -w0 / (2 * q), im: w0 * Math.sqrt(d) }];
  const r = w0 * Math.sqrt(-d);
  return [
    { re: -w0 / (2 * q) + r, im: 0 },
    { re: -w0 / (2 * q) - r, im: 0 },
  ];
}

/**
 * The natural frequency of a circuit nearest to an ideal first- or
 * second-order pole, as `{ f0Hz, q }` (q absent for first order), or null
 * when Muller's iteration on `det(G + s C)` fails.
 *
 * @param circuit - a valid circuit (its sources shorted by the MNA rows)
 * @param order - 1 (real pole near -w0) or 2 (pole pair near the ideal one)
 * @param start - ideal f0 (and Q) to start from
 * @returns the pole's f0 and Q
 * @throws never
 * @example
 * ```ts
 * circuitPole(circuit, 2, { f0Hz: 1000, q: 2 }); //=> { f0Hz: 980.49..., q: 2.038... } (unity-gain Sallen-Key, GBW 100 kHz)
 * ```
 */
export function circuitPole(circuit: Circuit, order: 1 | 2, start: AsBuiltPole): AsBuiltPole | null {
  const sys = assembleMna(circuit);
  const w0 = TWO_PI * start.f0Hz;
  // Scale the determinant so Muller's divided differences stay in range.
  const ref = mnaDeterminant(sys, { re: 0, im: w0 * 3 });
  const refMag = Math.hypot(ref.re, ref.im) || 1;
  return poleNear((s) => {
    const d = mnaDeterminant(sys, s);
    return { re: d.re / refMag, im: d.im / refMag };
  }, order, start);
}

/**
 * The root of a stage's characteristic polynomial nearest an ideal first- or
 * second-order pole, as {@link circuitPole} finds it on the nodal
 * determinant: the same Muller iteration on `den(s / scale)` of the stage's
 * closed-form as-built polynomials (the determinant up to a constant factor,
 * since those are derived from the same nodal equations without
 * cancelling), so each step costs a Horner evaluation instead of a complex
 * LU. Null when the polynomials overflow or the iteration fails.
 *
 * @param into - the topology's unchecked polynomial core
 * @param degree - its degree
 * @param x - component values in the topology's component order
 * @param opamp - op-amp model
 * @param order - 1 or 2
 * @param start - ideal f0 (and Q)
 * @returns the pole's f0 and Q
 * @throws never
 * @internal
 */
export function polynomialPole(
  into: PolynomialsInto,
  degree: number,
  x: Float64Array,
  opamp: OpAmpModel,
  order: 1 | 2,
  start: AsBuiltPole,
): AsBuiltPole | null {
  const scale = TWO_PI * start.f0Hz;
  const num = new Float64Array(degree + 1);
  const den = new Float64Array(degree + 1);
  if (into(x, opamp, scale, num, den) === 0) return null;
  const inv = 1 / scale;
  return poleNear((s) => {
    // den at z = s / scale by Horner's rule (descending coefficients)
    const zr = s.re * inv;
    const zi = s.im * inv;
    let pr = den[0] as number;
    let pi = 0;
    for (let k = 1; k < den.length; k++) {
      const t = pr * zr - pi * zi + (den[k] as number);
      pi = pr * zi + pi * zr;
      pr = t;
    }
    return { re: pr, im: pi };
  }, order, start);
}

/** The zero of `f` (s in rad/s) nearest the ideal pole of `start`, as `{ f0Hz, q }`; the two real poles of a Q <= 1/2 target one after the other. */
function poleNear(f: (s: Complex) => Complex, order: 1 | 2, start: AsBuiltPole): AsBuiltPole | null {
  const w0 = TWO_PI * start.f0Hz;
  const ideal = idealPoles(order, start.f0Hz, start.q ?? 0.5);
  const p = mullerRoot(f, ideal[0] as Complex, w0);
  if (p === null) return null;
  const mag = Math.hypot(p.re, p.im);
  if (order === 1) return { f0Hz: mag / TWO_PI };
  if (ideal.length === 1 && Math.abs(p.im) > 1e-9 * mag) return { f0Hz: mag / TWO_PI, q: mag / (-2 * p.re) };
  // Two real poles (or a pair that became real): find the second one with the first deflated out.
  const deflated = (s: Complex): Complex => cdiv(f(s), csub(s, p));
  const second = ideal[1] ?? { re: p.re * 1.01, im: 0 };
  const p2 = mullerRoot(deflated, second, w0);
  if (p2 === null) return null;
  const prod = cmul(p, p2).re;
  const sum = -(p.re + p2.re);
  if (!(prod > 0) || !(sum !== 0)) return null;
  const w = Math.sqrt(prod);
  return { f0Hz: w / TWO_PI, q: w / sum };
}

/** What the GBW-demand search needs of a stage (the topology framework supplies it). */
export interface GbwDemandStage {
  /** Topology id (names the function in errors). */
  readonly id: string;
  /** Stage order. */
  readonly order: 1 | 2 | 3;
  /** Ideal figures from values. */
  readonly figures: (v: ComponentValues) => StageFigures;
  /** Closed-form response (used for first-order stages). */
  readonly closedForm: ClosedForm;
  /** The stage alone, driven by `Vin` at `in`, output at `out`, every op-amp given `opamp`. */
  readonly circuit: (v: ComponentValues, opamp: OpAmpModel) => Circuit;
  /**
   * The pole with the op-amp from the stage's closed-form polynomials
   * ({@link polynomialPole}), where it has them; the nodal determinant's
   * otherwise.
   */
  readonly pole?: (v: ComponentValues, opamp: OpAmpModel, order: 1 | 2, start: AsBuiltPole) => AsBuiltPole | null;
}

/**
 * Smallest GBW (Hz) with which the stage's pole f0 and Q stay within 1 % of
 * the ideal design, found numerically (see the module header).
 *
 * @param stage - the stage's figures, closed form and circuit
 * @param design - its design function
 * @param t - target (valid)
 * @returns the demand in Hz
 * @throws {@link UnrealisableError} when no GBW up to 1e12 times f0 suffices
 * @example
 * ```ts
 * gbwDemand(stage, design, { order: 2, kind: "lowpass", f0Hz: 1000, q: 0.707, gain: 1 }); //=> about 3e4
 * ```
 */
export function gbwDemand(
  stage: GbwDemandStage,
  design: (t: StageTarget, c: StageChoices) => ComponentValues,
  t: StageTarget,
): number {
  const v = design(t, {});
  const ideal = stage.figures(v);
  const ok = (gbwHz: number): boolean => {
    if (stage.order === 1) {
      // First order: the response at f0 must stay as close to ideal as a 1 % shift of f0 would leave it.
      const s = { re: 0, im: TWO_PI * ideal.f0Hz };
      const h = stage.closedForm(v, s, openLoopGain({ a0: GBW_DEMAND_A0, gbwHz }, s));
      const h0 = stage.closedForm(v, s, null);
      const r = cdiv(h, h0);
      return Math.hypot(r.re - 1, r.im) <= FIRST_ORDER_DEVIATION;
    }
    const model: OpAmpModel = { kind: "single-pole", a0: GBW_DEMAND_A0, gbwHz };
    const order = poleOrderOf(stage.order);
    const p = stage.pole !== undefined ? stage.pole(v, model, order, ideal) : circuitPole(stage.circuit(v, model), order, ideal);
    if (p === null) return false;
    if (Math.abs(p.f0Hz / ideal.f0Hz - 1) > 0.01) return false;
    if (ideal.q !== undefined && (p.q === undefined || Math.abs(p.q / ideal.q - 1) > 0.01)) return false;
    return true;
  };
  let lo = t.f0Hz;
  let hi = t.f0Hz * 4;
  while (!ok(hi)) {
    lo = hi;
    hi *= 4;
    if (hi > t.f0Hz * 1e12) {
      throw new UnrealisableError({
        fn: `${stage.id}.gbwDemandHz`,
        path: "target",
        received: t,
        message: "no op-amp gain-bandwidth product up to 1e12 times f0 keeps f0 and Q within 1 %; lower Q or choose another topology",
      });
    }
  }
  // hi / lo > 1.001 as `hi / lo - 1 > 0.001`: the same test on doubles near 1.
  return geometricBisect(ok, lo, hi, { relWidth: 0.001, maxIterations: Infinity }).hi;
}

/**
 * The pole of a built stage with a given op-amp model: the natural frequency
 * nearest the ideal pole from `figures(values)`. With an ideal op-amp it
 * equals the ideal figures; with the single-pole models it shows how far f0
 * and Q move.
 *
 * @param topology - the stage's topology
 * @param values - component values (as built)
 * @param opamp - op-amp model for every op-amp in the stage
 * @returns the pole's f0 (Hz) and Q
 * @throws {@link InvalidArgumentError} for missing or non-positive values or a bad model
 * @throws {@link ConvergenceError} when no natural frequency is found near the ideal pole
 * @example
 * ```ts
 * const v = sallenKeyLowpassUnity.design({ order: 2, kind: "lowpass", f0Hz: 1000, q: 2, gain: 1 }, {});
 * asBuiltPole(sallenKeyLowpassUnity, v, { kind: "single-pole", a0: 1e5, gbwHz: 1e5 });
 * //=> { f0Hz: 980.49..., q: 2.038... }
 * ```
 */
export function asBuiltPole(topology: Topology, values: ComponentValues, opamp: OpAmpModel): AsBuiltPole {
  const fn = "asBuiltPole";
  if (typeof topology !== "object" || topology === null || !Array.isArray(topology.componentNames) || typeof topology.elements !== "function") {
    throw new InvalidArgumentError({ fn, path: "topology", received: topology, message: "expected a topology from the registry (see getTopology)" });
  }
  if (values === null || typeof values !== "object") {
    throw new InvalidArgumentError({ fn, path: "values", received: values, message: "expected component values keyed by designator" });
  }
  for (const n of topology.componentNames) requirePositive(fn, `values.${n}`, values[n]);
  // Validates the model and the values the way the circuit path needs them (throws the typed errors).
  const circuit = checkCircuit(fn, { title: topology.name, elements: stageElements(topology, values, opamp) });
  const ideal = topology.figures(values);
  const p = polynomialStagePole(topology, values, opamp, ideal) ?? circuitPole(circuit, poleOrderOf(topology.order), ideal);
  if (p === null || !Number.isFinite(p.f0Hz) || (p.q !== undefined && !Number.isFinite(p.q))) {
    throw new ConvergenceError({
      fn,
      path: "values",
      received: values,
      message: "no natural frequency was found near the ideal pole; the op-amp model may move the pole too far (raise its GBW)",
    });
  }
  return p;
}

/** The stage driven by `Vin` at `in`, output at `out`. */
function stageElements(topology: Topology, values: ComponentValues, opamp: OpAmpModel): Circuit["elements"] {
  return [{ kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }, ...topology.elements(values, { input: "in", output: "out", nodePrefix: "x_", opamp })];
}

/** The pole from the topology's closed-form polynomials ({@link polynomialPole}); null without them, for a model they do not cover, or when the iteration fails. */
function polynomialStagePole(topology: Topology, values: ComponentValues, opamp: OpAmpModel, ideal: AsBuiltPole): AsBuiltPole | null {
  const into = topology.polynomialsInto;
  const degree = topology.polynomialDegree;
  if (into === undefined || degree === undefined) return null;
  const x = new Float64Array(topology.componentNames.length);
  for (let i = 0; i < x.length; i++) x[i] = values[topology.componentNames[i] as string] as number;
  return polynomialPole(into, degree, x, opamp, poleOrderOf(topology.order), ideal);
}

/**
 * {@link asBuiltPole} without the argument checks, for the design loop's
 * candidates (values the topology designed): the pole from the closed-form
 * polynomials where the topology has them (a Horner evaluation per Muller
 * step; the same root as the nodal determinant's to 1e-9,
 * test/topologies/gbw-demand.test.ts), else from the nodal determinant.
 * Null when no pole is found near the ideal one.
 *
 * @param topology - the stage's topology
 * @param values - valid component values
 * @param opamp - a valid op-amp model
 * @returns the pole, or null
 * @throws never for valid arguments
 * @internal
 */
export function stagePole(topology: Topology, values: ComponentValues, opamp: OpAmpModel): AsBuiltPole | null {
  const ideal = topology.figures(values);
  const p = polynomialStagePole(topology, values, opamp, ideal);
  if (p !== null) return p;
  return circuitPole({ title: topology.name, elements: stageElements(topology, values, opamp) }, poleOrderOf(topology.order), ideal);
}
