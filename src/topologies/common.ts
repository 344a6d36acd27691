/**
 * Shared machinery behind every topology file: argument checks, impedance
 * level, element placement, response evaluation (closed form or nodal
 * analysis) and the numerical GBW demand.
 *
 * GBW demand method: the stage is designed for the target, its op-amps are
 * replaced by the single-pole model (a0 = 1e12, so the gain-bandwidth product
 * alone matters), and the dominant natural frequency is found as a zero of
 * the nodal determinant `det(G + s C)` by Muller's method (D. E. Muller,
 * "A method for solving algebraic equations using an automatic computer",
 * MTAC 10:208-215, 1956), started from the ideal pole. The smallest GBW for
 * which the pole's f0 and Q both stay within 1 % of target is found by
 * doubling and then bisection in log(GBW) to 0.1 %. A first-order stage has
 * no Q, and its op-amp adds a pole rather than moving the stage's own, so
 * there the criterion is on the response at f0: `|H(j w0)/H_ideal(j w0) - 1|`
 * may not exceed what a 1 % shift of f0 would cause (about 0.70 %).
 *
 * @module
 */
import type { Circuit, Element, OpAmpModel } from "../circuit/types.ts";
import { assembleMna, checkStructure, mnaDeterminant, solveMna } from "../circuit/mna.ts";
import { checkCircuit } from "../circuit/validate.ts";
import { InvalidArgumentError, UnrealisableError } from "../errors.ts";
import { cadd, cdiv, cmul, csub, type Complex } from "../math/complex.ts";
import type {
  ComponentValues,
  StageChoices,
  StageFigures,
  StageKind,
  StagePlacement,
  StageTarget,
  Topology,
} from "./types.ts";

/** 2 pi. */
export const TWO_PI = 2 * Math.PI;

/** Impedance level used when neither a capacitor nor a resistor is chosen: the level resistor is 10 kOhm. */
export const DEFAULT_LEVEL_OHMS = 10_000;

/** Relative slack used when comparing a target with an exact limit (rounding of the caller's arithmetic). */
export const LIMIT_SLACK = 1e-9;

/**
 * Largest `|H(j w0) / H_ideal(j w0) - 1|` accepted for a first-order stage:
 * the change a 1 % shift of f0 makes, `|(1 + j) / (1 + j / 1.01) - 1|`.
 */
export const FIRST_ORDER_DEVIATION: number = (() => {
  const c = 1 / 1.01;
  const d = 1 + c * c;
  return Math.hypot((1 + c) / d - 1, (1 - c) / d);
})();

/** DC gain of the op-amp model used to compute the GBW demand. */
export const GBW_DEMAND_A0 = 1e12;

/** A part of a stage in local terms: nodes `in`, `out`, `0` are external; any other node is internal. */
export type PartSpec =
  | { readonly kind: "R" | "C"; readonly name: string; readonly a: string; readonly b: string }
  | { readonly kind: "OA"; readonly name: string; readonly inP: string; readonly inN: string; readonly out: string };

/** Closed-form response kernel: `H(s)` given values and the op-amp open-loop gain `a` (`null` = ideal). */
export type ClosedForm = (v: ComponentValues, s: Complex, a: Complex | null) => Complex;

/** Everything a topology file specifies; {@link defineTopology} adds the checks and shared behaviour. */
export interface TopologySpec {
  /** See {@link Topology.id}. */
  readonly id: string;
  /** See {@link Topology.name}. */
  readonly name: string;
  /** See {@link Topology.order}. */
  readonly order: 1 | 2;
  /** See {@link Topology.kinds}. */
  readonly kinds: readonly StageKind[];
  /** See {@link Topology.inverting}. */
  readonly inverting: boolean;
  /** See {@link Topology.reference}. */
  readonly reference: string;
  /** The capacitor whose value the `capacitor` choice sets. */
  readonly levelCapacitor: string;
  /** The resistor whose value the `resistor` choice sets (and which is 10 kOhm by default). */
  readonly levelResistor: string;
  /** The stage's parts, in BOM order (their names are the component names). */
  readonly parts: readonly PartSpec[];
  /** Topology-specific reason the (well-formed) target cannot be built, or null. */
  readonly limits: (t: StageTarget, c: StageChoices) => string | null;
  /** Values for a well-formed, realisable target at any impedance level (scaled afterwards). */
  readonly solve: (t: StageTarget, c: StageChoices) => Record<string, number>;
  /** Ideal figures from values. */
  readonly figures: (v: ComponentValues) => StageFigures;
  /** Closed-form response. */
  readonly closedForm: ClosedForm;
  /** Whether `closedForm` handles a finite op-amp gain (else only `a = null`; MNA is used otherwise). */
  readonly closedFormFinite: boolean;
  /** Gain fixed by the other figures, if any. */
  readonly fixedGain?: (t: Omit<StageTarget, "gain">) => number;
}

/** A topology built by this module's `defineTopology` (the same shape as {@link Topology}). */
export type DefinedTopology = Topology;

function bad(fn: string, path: string, received: unknown, message: string): never {
  throw new InvalidArgumentError({ fn, path, received, message });
}

function positive(fn: string, path: string, v: unknown): void {
  if (typeof v !== "number" || !Number.isFinite(v) || v <= 0) bad(fn, path, v, "expected a finite number greater than zero");
}

/**
 * Check the shape of a target and choices against a topology (finite,
 * positive, right order and kind, zero frequency present for notch kinds).
 *
 * @param fn - public function name
 * @param spec - the topology
 * @param t - target
 * @param c - choices
 * @returns nothing
 * @throws {@link InvalidArgumentError} with the path of the first problem
 * @example
 * ```ts
 * checkShape("sallen-key-lowpass-unity.design", spec, { order: 2, kind: "lowpass", f0Hz: -1, q: 1, gain: 1 }, {});
 * //=> throws InvalidArgumentError at "target.f0Hz"
 * ```
 */
export function checkShape(fn: string, spec: TopologySpec, t: StageTarget, c: StageChoices): void {
  if (t === null || typeof t !== "object") bad(fn, "target", t, "expected a stage target { order, kind, f0Hz, q, gain }");
  if (t.order !== spec.order) {
    bad(fn, "target.order", t.order, `${spec.name} builds order-${spec.order} stages; choose a topology of order ${t.order}`);
  }
  if (!spec.kinds.includes(t.kind)) {
    bad(fn, "target.kind", t.kind, `${spec.name} realises ${spec.kinds.map((k) => `"${k}"`).join(", ")}; choose a topology for "${t.kind}"`);
  }
  positive(fn, "target.f0Hz", t.f0Hz);
  if (spec.order === 2) positive(fn, "target.q", t.q);
  if (typeof t.gain !== "number" || !Number.isFinite(t.gain) || t.gain === 0) {
    bad(fn, "target.gain", t.gain, "expected a finite, non-zero gain (V/V, sign included)");
  }
  if (t.kind === "lowpass-notch" || t.kind === "highpass-notch") positive(fn, "target.fzHz", t.fzHz);
  if (t.kind === "notch" && t.fzHz !== undefined) positive(fn, "target.fzHz", t.fzHz);
  if (c === null || typeof c !== "object") bad(fn, "choices", c, "expected a choices object (it may be empty)");
  for (const k of ["capacitor", "resistor", "capacitorRatio", "resistorRatio"] as const) {
    if (c[k] !== undefined) positive(fn, `choices.${k}`, c[k]);
  }
}

/** Reason the target's kind-specific relations fail (notch side, gain sign), or null. */
function commonLimits(spec: TopologySpec, t: StageTarget): string | null {
  if (spec.inverting && t.gain > 0) {
    return `${spec.name} is inverting, so its gain is negative; give the stage a negative gain (invert elsewhere) or choose a non-inverting topology`;
  }
  if (!spec.inverting && t.gain < 0) {
    return `${spec.name} is non-inverting, so its gain is positive; give the stage a positive gain or choose an inverting topology`;
  }
  const fz = t.fzHz;
  if (t.kind === "lowpass-notch" && fz !== undefined && !(fz > t.f0Hz)) {
    return `a lowpass-notch section has its zero above its pole (fzHz > f0Hz); got fzHz = ${fz} and f0Hz = ${t.f0Hz}: use kind "highpass-notch" or "notch"`;
  }
  if (t.kind === "highpass-notch" && fz !== undefined && !(fz < t.f0Hz)) {
    return `a highpass-notch section has its zero below its pole (fzHz < f0Hz); got fzHz = ${fz} and f0Hz = ${t.f0Hz}: use kind "lowpass-notch" or "notch"`;
  }
  return null;
}

/** Reason the target's gain differs from a gain the topology fixes, or null. */
function fixedGainLimit(spec: TopologySpec, t: StageTarget): string | null {
  if (spec.fixedGain === undefined) return null;
  const g = spec.fixedGain(t);
  if (Math.abs(t.gain - g) > LIMIT_SLACK * Math.abs(g)) {
    return `${spec.name} has its gain fixed by its other figures at ${g} for this target; set the stage gain to ${g} or choose a topology with a free gain`;
  }
  return null;
}

function scaleToLevel(spec: TopologySpec, v: Record<string, number>, c: StageChoices): ComponentValues {
  let k: number;
  if (c.capacitor !== undefined) k = (v[spec.levelCapacitor] as number) / c.capacitor;
  else if (c.resistor !== undefined) k = c.resistor / (v[spec.levelResistor] as number);
  else k = DEFAULT_LEVEL_OHMS / (v[spec.levelResistor] as number);
  const out: Record<string, number> = {};
  for (const p of spec.parts) {
    if (p.kind === "OA") continue;
    const x = v[p.name] as number;
    out[p.name] = p.kind === "R" ? x * k : x / k;
  }
  // Exact values for the chosen part (no rounding through k).
  if (c.capacitor !== undefined) out[spec.levelCapacitor] = c.capacitor;
  else if (c.resistor !== undefined) out[spec.levelResistor] = c.resistor;
  return Object.freeze(out);
}

/**
 * Check component values: every named part present, finite and positive.
 *
 * @param fn - public function name
 * @param names - component names expected
 * @param v - values
 * @returns nothing
 * @throws {@link InvalidArgumentError} at `values.<name>`
 * @example
 * ```ts
 * checkValues("x.figures", ["R1"], { R1: -1 }); //=> throws at "values.R1"
 * ```
 */
export function checkValues(fn: string, names: readonly string[], v: ComponentValues): void {
  if (v === null || typeof v !== "object") bad(fn, "values", v, "expected component values keyed by designator");
  for (const n of names) positive(fn, `values.${n}`, v[n]);
}

function checkFreqs(fn: string, f: Float64Array): void {
  if (!(f instanceof Float64Array)) bad(fn, "freqHz", f, "expected a Float64Array of frequencies in Hz");
  for (let i = 0; i < f.length; i++) {
    const x = f[i] as number;
    if (!Number.isFinite(x) || x < 0) bad(fn, `freqHz[${i}]`, x, "expected a finite frequency of 0 Hz or more");
  }
}

/**
 * Place a stage's parts in a circuit: external nodes mapped, internal nodes
 * prefixed, designators renamed, op-amps given the placement's model.
 *
 * @param parts - local parts
 * @param v - values
 * @param p - placement
 * @returns the elements
 * @throws never (inputs checked by the caller)
 * @example
 * ```ts
 * placeParts([{ kind: "R", name: "R1", a: "in", b: "x" }], { R1: 1e3 }, { input: "a", output: "b", nodePrefix: "s1_", opamp: { kind: "ideal" } });
 * //=> [{ kind: "R", name: "R1", a: "a", b: "s1_x", value: 1000 }]
 * ```
 */
export function placeParts(parts: readonly PartSpec[], v: ComponentValues, p: StagePlacement): Element[] {
  const node = (n: string): string => (n === "in" ? p.input : n === "out" ? p.output : n === "0" ? "0" : `${p.nodePrefix}${n}`);
  const name = (n: string): string => (p.rename === undefined ? n : p.rename(n));
  return parts.map((q): Element => {
    if (q.kind === "OA") {
      return { kind: "OA", name: name(q.name), inP: node(q.inP), inN: node(q.inN), out: node(q.out), model: p.opamp };
    }
    return { kind: q.kind, name: name(q.name), a: node(q.a), b: node(q.b), value: v[q.name] as number };
  });
}

/**
 * The parts with one local node renamed to the stage output `out` (for the
 * variants of a multi-amplifier stage that take their output from an
 * internal node and drop the output amplifier).
 *
 * @param parts - the parts in local terms
 * @param node - the local node that becomes `out`
 * @returns new part specs; the input is not changed
 * @throws never
 * @example
 * ```ts
 * withOutputAt([{ kind: "R", name: "R1", a: "in", b: "lp" }], "lp");
 * //=> [{ kind: "R", name: "R1", a: "in", b: "out" }]
 * ```
 */
export function withOutputAt(parts: readonly PartSpec[], node: string): PartSpec[] {
  const m = (n: string): string => (n === node ? "out" : n);
  return parts.map((p) => (p.kind === "OA" ? { ...p, inP: m(p.inP), inN: m(p.inN), out: m(p.out) } : { ...p, a: m(p.a), b: m(p.b) }));
}

/**
 * The stage alone, driven by `Vin` at node `in`, output at node `out` (for nodal analysis).
 *
 * @param spec - topology
 * @param v - component values
 * @param opamp - op-amp model for every op-amp
 * @returns the circuit
 * @throws never
 * @example
 * ```ts
 * stageCircuit(spec, values, { kind: "ideal" }).elements[0]; //=> { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }
 * ```
 */
export function stageCircuit(spec: TopologySpec, v: ComponentValues, opamp: OpAmpModel): Circuit {
  const elements: Element[] = [
    { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
    ...placeParts(spec.parts, v, { input: "in", output: "out", nodePrefix: "x_", opamp }),
  ];
  return { title: spec.name, elements };
}

/**
 * Open-loop gain of the single-pole model at `s`: `a0 / (1 + s a0 / (2 pi GBW))`.
 *
 * @param m - DC gain and gain-bandwidth product
 * @param s - complex frequency (rad/s)
 * @returns `A(s)`
 * @throws never
 * @example
 * ```ts
 * openLoopGain({ a0: 1e5, gbwHz: 1e6 }, { re: 0, im: 0 }); //=> { re: 100000, im: 0 }
 * ```
 */
export function openLoopGain(m: { readonly a0: number; readonly gbwHz: number }, s: Complex): Complex {
  // a0 / (1 + s a0 / (2 pi GBW)) = 1 / (1/a0 + s / (2 pi GBW))
  const tau = 1 / (TWO_PI * m.gbwHz);
  return cdiv({ re: 1, im: 0 }, { re: 1 / m.a0 + s.re * tau, im: s.im * tau });
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
 * A root of `f` near `start` by Muller's method (D. E. Muller, MTAC 10:208-215,
 * 1956): quadratic interpolation through the last three iterates.
 *
 * @param f - analytic function
 * @param start - starting point
 * @param scale - size of the neighbourhood (sets the first step and the stopping test)
 * @returns the root, or `null` when the iteration fails or does not settle in 100 steps
 * @throws never
 * @example
 * ```ts
 * mullerRoot((z) => ({ re: z.re * z.re - z.im * z.im + 1, im: 2 * z.re * z.im }), { re: 0.1, im: 0.9 }, 1);
 * //=> about { re: 0, im: 1 }
 * ```
 */
export function mullerRoot(f: (s: Complex) => Complex, start: Complex, scale: number): Complex | null {
  let x0: Complex = { re: start.re - 0.01 * scale, im: start.im };
  let x1: Complex = { re: start.re + 0.01 * scale, im: start.im + 0.005 * scale };
  let x2: Complex = start;
  let f0 = f(x0);
  let f1 = f(x1);
  let f2 = f(x2);
  for (let it = 0; it < 100; it++) {
    const h1 = csub(x1, x0);
    const h2 = csub(x2, x1);
    const d1 = cdiv(csub(f1, f0), h1);
    const d2 = cdiv(csub(f2, f1), h2);
    const a = cdiv(csub(d2, d1), cadd(h2, h1));
    const b = cadd(cmul(a, h2), d2);
    const disc = csqrtLocal(csub(cmul(b, b), cmul({ re: 4 * f2.re, im: 4 * f2.im }, a)));
    const e1 = cadd(b, disc);
    const e2 = csub(b, disc);
    const den = Math.hypot(e1.re, e1.im) >= Math.hypot(e2.re, e2.im) ? e1 : e2;
    if (den.re === 0 && den.im === 0) return null;
    const dx = cdiv({ re: -2 * f2.re, im: -2 * f2.im }, den);
    x0 = x1;
    f0 = f1;
    x1 = x2;
    f1 = f2;
    x2 = cadd(x2, dx);
    if (!Number.isFinite(x2.re) || !Number.isFinite(x2.im)) return null;
    f2 = f(x2);
    if (Math.hypot(dx.re, dx.im) <= 1e-13 * scale || (f2.re === 0 && f2.im === 0)) return x2;
  }
  return null;
}

function csqrtLocal(z: Complex): Complex {
  const r = Math.hypot(z.re, z.im);
  if (r === 0) return { re: 0, im: 0 };
  const re = Math.sqrt((r + Math.abs(z.re)) / 2);
  if (z.re >= 0) return { re, im: z.im / (2 * re) };
  return { re: Math.abs(z.im) / (2 * re), im: z.im >= 0 ? re : -re };
}

/**
 * The dominant natural frequency of a stage built with single-pole op-amps,
 * as `{ f0Hz, q }` (q absent for first order), or null if not found.
 *
 * @param spec - topology
 * @param v - component values
 * @param model - op-amp model
 * @param start - ideal figures to start from
 * @returns the moved pole's f0 and Q
 * @throws never
 * @example
 * ```ts
 * stagePole(spec, values, { kind: "single-pole", a0: 1e12, gbwHz: 1e6 }, { f0Hz: 1e3, q: 0.707 });
 * ```
 */
export function stagePole(
  spec: TopologySpec,
  v: ComponentValues,
  model: OpAmpModel,
  start: { readonly f0Hz: number; readonly q?: number },
): { f0Hz: number; q?: number } | null {
  return circuitPole(stageCircuit(spec, v, model), spec.order, start);
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
export function circuitPole(
  circuit: Circuit,
  order: 1 | 2,
  start: { readonly f0Hz: number; readonly q?: number },
): { f0Hz: number; q?: number } | null {
  const sys = assembleMna(circuit);
  const w0 = TWO_PI * start.f0Hz;
  // Scale the determinant so Muller's divided differences stay in range.
  const ref = mnaDeterminant(sys, { re: 0, im: w0 * 3 });
  const refMag = Math.hypot(ref.re, ref.im) || 1;
  const f = (s: Complex): Complex => {
    const d = mnaDeterminant(sys, s);
    return { re: d.re / refMag, im: d.im / refMag };
  };
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

/**
 * Smallest GBW (Hz) with which the stage's pole f0 and Q stay within 1 % of
 * the ideal design, found numerically (see the module header).
 *
 * @param spec - topology
 * @param design - its design function
 * @param t - target (valid)
 * @returns the demand in Hz
 * @throws {@link UnrealisableError} when no GBW up to 1e12 times f0 suffices
 * @example
 * ```ts
 * gbwDemand(spec, design, { order: 2, kind: "lowpass", f0Hz: 1000, q: 0.707, gain: 1 }); //=> about 3e4
 * ```
 */
export function gbwDemand(
  spec: TopologySpec,
  design: (t: StageTarget, c: StageChoices) => ComponentValues,
  t: StageTarget,
): number {
  const v = design(t, {});
  const ideal = spec.figures(v);
  const ok = (gbwHz: number): boolean => {
    if (spec.order === 1) {
      // First order: the response at f0 must stay as close to ideal as a 1 % shift of f0 would leave it.
      const s = { re: 0, im: TWO_PI * ideal.f0Hz };
      const h = spec.closedForm(v, s, openLoopGain({ a0: GBW_DEMAND_A0, gbwHz }, s));
      const h0 = spec.closedForm(v, s, null);
      const r = cdiv(h, h0);
      return Math.hypot(r.re - 1, r.im) <= FIRST_ORDER_DEVIATION;
    }
    const p = stagePole(spec, v, { kind: "single-pole", a0: GBW_DEMAND_A0, gbwHz }, ideal);
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
        fn: `${spec.id}.gbwDemandHz`,
        path: "target",
        received: t,
        message: "no op-amp gain-bandwidth product up to 1e12 times f0 keeps f0 and Q within 1 %; lower Q or choose another topology",
      });
    }
  }
  while (hi / lo > 1.001) {
    const mid = Math.sqrt(lo * hi);
    if (ok(mid)) hi = mid;
    else lo = mid;
  }
  return hi;
}

/**
 * Build a {@link Topology} from a specification: adds argument checks, the
 * realisable-range check, impedance-level scaling, element placement,
 * response evaluation and the GBW demand.
 *
 * @param spec - the topology's own equations and parts
 * @returns the topology
 * @throws never
 * @example
 * ```ts
 * const t = defineTopology(spec); t.id; //=> spec.id
 * ```
 */
export function defineTopology(spec: TopologySpec): DefinedTopology {
  const componentNames = Object.freeze(spec.parts.filter((p) => p.kind !== "OA").map((p) => p.name));
  const opampCount = spec.parts.filter((p) => p.kind === "OA").length;
  const reason = (fn: string, t: StageTarget, c: StageChoices): string | null => {
    checkShape(fn, spec, t, c);
    return commonLimits(spec, t) ?? spec.limits(t, c) ?? fixedGainLimit(spec, t);
  };
  const check = (t: StageTarget, c: StageChoices): string | null => {
    try {
      return reason(`${spec.id}.check`, t, c ?? {});
    } catch (e) {
      if (e instanceof InvalidArgumentError) return e.message;
      throw e;
    }
  };
  const designFn = (t: StageTarget, c: StageChoices = {}): ComponentValues => {
    const fn = `${spec.id}.design`;
    const why = reason(fn, t, c);
    if (why !== null) throw new UnrealisableError({ fn, path: "target", received: t, message: why });
    const v = scaleToLevel(spec, spec.solve(t, c), c);
    for (const n of componentNames) {
      const x = v[n];
      if (x === undefined || !Number.isFinite(x) || x <= 0) {
        throw new UnrealisableError({
          fn,
          path: `values.${n}`,
          received: x,
          message: "the design equations gave no usable value for this part (the target lies at the edge of the range); move Q, gain or the ratios slightly",
        });
      }
    }
    return v;
  };
  const figures = (v: ComponentValues): StageFigures => {
    checkValues(`${spec.id}.figures`, componentNames, v);
    return spec.figures(v);
  };
  const response = (v: ComponentValues, freqHz: Float64Array, opamp: OpAmpModel) => {
    const fn = `${spec.id}.response`;
    checkValues(fn, componentNames, v);
    checkFreqs(fn, freqHz);
    const m = freqHz.length;
    if (opamp?.kind === "ideal" || (opamp?.kind === "single-pole" && spec.closedFormFinite)) {
      const re = new Float64Array(m);
      const im = new Float64Array(m);
      for (let i = 0; i < m; i++) {
        const s = { re: 0, im: TWO_PI * (freqHz[i] as number) };
        const h = spec.closedForm(v, s, opamp.kind === "ideal" ? null : openLoopGain(opamp, s));
        re[i] = h.re;
        im[i] = h.im;
      }
      return { re, im };
    }
    const circuit = checkCircuit(fn, stageCircuit(spec, v, opamp));
    let dc = false;
    for (let i = 0; i < m; i++) if (freqHz[i] === 0) dc = true;
    checkStructure(fn, circuit, dc);
    const sys = assembleMna(circuit);
    const [r] = solveMna(fn, sys, {
      sourceRow: sys.sourceRow.get("Vin") as number,
      outputs: [sys.nodeIndex.get("out") as number],
      freqHz,
    });
    return r as { re: Float64Array; im: Float64Array };
  };
  const elements = (v: ComponentValues, p: StagePlacement): readonly Element[] => {
    const fn = `${spec.id}.elements`;
    checkValues(fn, componentNames, v);
    if (p === null || typeof p !== "object") bad(fn, "placement", p, "expected { input, output, nodePrefix, opamp }");
    const out = placeParts(spec.parts, v, p);
    checkCircuit(fn, { title: spec.name, elements: out });
    return out;
  };
  const gbwDemandHz = (t: StageTarget): number => {
    const why = reason(`${spec.id}.gbwDemandHz`, t, {});
    if (why !== null) throw new UnrealisableError({ fn: `${spec.id}.gbwDemandHz`, path: "target", received: t, message: why });
    return gbwDemand(spec, designFn, t);
  };
  const topo: DefinedTopology = {
    id: spec.id,
    name: spec.name,
    order: spec.order,
    kinds: Object.freeze([...spec.kinds]),
    inverting: spec.inverting,
    opampCount,
    componentNames,
    reference: spec.reference,
    check,
    design: designFn,
    figures,
    response,
    elements,
    gbwDemandHz,
    ...(spec.fixedGain === undefined ? {} : { fixedGain: spec.fixedGain }),
  };
  return Object.freeze(topo);
}

// ---- small complex helpers for closed forms ----

/** Real number as complex (closed-form helper). */
export const re = (x: number): Complex => ({ re: x, im: 0 });
/** `s * x` for real x (closed-form helper). */
export const sx = (s: Complex, x: number): Complex => ({ re: s.re * x, im: s.im * x });
export { cadd, cdiv, cmul, csub };

/**
 * Effective gain of a non-inverting amplifier with feedback fraction beta:
 * `a / (1 + a beta)`, or `1/beta` when ideal.
 *
 * @param a - open-loop gain, or `null` for the ideal op-amp
 * @param beta - feedback fraction (0, 1]
 * @returns the closed-loop gain
 * @throws never
 * @example
 * ```ts
 * nonInvertingGain(null, 0.5); //=> { re: 2, im: 0 }
 * ```
 */
export function nonInvertingGain(a: Complex | null, beta: number): Complex {
  if (a === null) return re(1 / beta);
  return cdiv(a, { re: 1 + a.re * beta, im: a.im * beta });
}

/**
 * Inverting-amplifier family with a virtual-earth node `n`: input admittance
 * `y1` from the source, feedback admittance `y2` to the output:
 * `H = -y1 / (y2 + (y1 + y2) / a)`.
 *
 * @param y1 - input admittance
 * @param y2 - feedback admittance
 * @param a - open-loop gain, or `null` for the ideal op-amp
 * @returns the transfer
 * @throws never
 * @example
 * ```ts
 * invertingGain({ re: 1e-3, im: 0 }, { re: 5e-4, im: 0 }, null); //=> { re: -2, im: 0 }
 * ```
 */
export function invertingGain(y1: Complex, y2: Complex, a: Complex | null): Complex {
  const den = a === null ? y2 : cadd(y2, cdiv(cadd(y1, y2), a));
  return cdiv({ re: -y1.re, im: -y1.im }, den);
}

/**
 * Inverting summer with finite gain: inputs `vk` through conductances `Gk`,
 * feedback conductance `gf`: `out = -sum(Gk vk) / (gf + (sum(Gk) + gf)/a)`.
 *
 * @param terms - `[Gk, vk]` pairs
 * @param gf - feedback conductance
 * @param a - open-loop gain, or `null` for the ideal op-amp
 * @returns the output
 * @throws never
 * @example
 * ```ts
 * summer([[1e-4, { re: 1, im: 0 }]], 1e-4, null); //=> { re: -1, im: 0 }
 * ```
 */
export function summer(terms: readonly (readonly [number, Complex])[], gf: number, a: Complex | null): Complex {
  let num: Complex = { re: 0, im: 0 };
  let gsum = gf;
  for (const [gk, vk] of terms) {
    num = cadd(num, { re: gk * vk.re, im: gk * vk.im });
    gsum += gk;
  }
  const den = a === null ? re(gf) : cadd(re(gf), cdiv(re(gsum), a));
  return cdiv({ re: -num.re, im: -num.im }, den);
}

/**
 * Multiple-feedback kernel: `y1` input to node a, `y2` a to ground, `y3` a to
 * the inverting input n, `y4` a to output, `y5` n to output; non-inverting
 * input grounded; open-loop gain `a` (`null` = ideal):
 * `H = -y1 y3 / ( ((y3 + y5)/a + y5) (y1+y2+y3+y4) + y3 y4 - y3^2/a )`
 * (written without dividing by `y3`, which vanishes at 0 Hz in some stages).
 *
 * @param y - the five admittances `[y1, y2, y3, y4, y5]`
 * @param a - open-loop gain, or `null` for the ideal op-amp
 * @returns the transfer
 * @throws never
 * @example
 * ```ts
 * const g = { re: 1e-4, im: 0 }, z = { re: 0, im: 0 };
 * mfbKernel([g, z, g, g, g], null); //=> { re: -0.25, im: 0 }
 * ```
 */
export function mfbKernel(
  y: readonly [Complex, Complex, Complex, Complex, Complex],
  a: Complex | null,
): Complex {
  const [y1, y2, y3, y4, y5] = y;
  const ya = cadd(cadd(y1, y2), cadd(y3, y4));
  const t = a === null ? y5 : cadd(cdiv(cadd(y3, y5), a), y5);
  let den = cadd(cmul(t, ya), cmul(y3, y4));
  if (a !== null) den = csub(den, cdiv(cmul(y3, y3), a));
  const num = cmul(y1, y3);
  return cdiv({ re: -num.re, im: -num.im }, den);
}

/**
 * `x >= limit` with a relative slack of {@link LIMIT_SLACK}.
 *
 * @param x - value
 * @param limit - lower limit
 * @returns whether x reaches the limit
 * @throws never
 * @example
 * ```ts
 * atLeast(7.8399999999, 7.84); //=> true
 * ```
 */
export function atLeast(x: number, limit: number): boolean {
  return x >= limit * (1 - LIMIT_SLACK);
}
