/**
 * Pre-distortion of an active ladder for its op-amps' finite gain and
 * gain-bandwidth: the normalised ladder's element values, and one trim per
 * arm, are moved so that the exact circuit WITH the op-amp model has its
 * natural frequencies (and its notch frequencies) where the same circuit
 * has them with ideal op-amps; then the parts are rounded as usual.
 *
 * Method: pre-distortion of a design for the amplifiers' known
 * imperfection (R. Schaumann and M. E. Van Valkenburg, "Design of Analog
 * Filters", Oxford University Press, 2001, the sections on the op-amp's
 * finite gain-bandwidth and its pre-distortion; cited from memory), here on
 * the whole circuit: a damped Gauss-Newton (Levenberg-Marquardt) iteration,
 * the Jacobian by forward differences, on the logs of the element values
 * and the trims. The conditions come from the circuit's nodal equations
 * (src/circuit/mna.ts, one complex LU per point), so no polynomial is
 * recovered and no root matched: at each reference pole p (one per
 * conjugate pair) `g / H(p) = 0`, two real equations (one for a real pole),
 * g the ideal circuit's magnitude at the edge; at each reference zero the
 * notch frequency, the imaginary part of `-H / H'`; where the realisation
 * trims its gain, the level at the edge. The reference points are the poles
 * and zeros of the exact circuit with ideal op-amps, found by Newton's method
 * on `1 / H` and `H` from the target's (they differ from the target's only by
 * the DC path resistors of the FDNR and GIC methods).
 *
 * Why trims: a lossless ladder's element values cannot raise or lower its
 * transfer where it is at maximum power transfer (first-order
 * insensitivity, H. J. Orchard, "Inductorless filters", Electronics Letters
 * 2(6), 1966), while the op-amps' phase lag acts like negative loss there;
 * the values alone leave the equations singular. Each realisation adds a
 * loss it can build (see `ReadOptions.armTrim`): a resistor across an inner
 * leapfrog integrator's capacitor, a small capacitor across a GIC resistor.
 * Mirror arms of a symmetric ladder act alike, so the step is damped (mu
 * 1e-6 of the trace) and the iteration stops when a step lowers the
 * residual by less than 0.1 %.
 *
 * Accuracy: the relative pole error (first order, `|r| / |dr/ds|`) falls
 * below {@link PREDISTORT_POLE_TOLERANCE} for leapfrog and levels off where
 * the trims cannot follow, as (edge / GBW)^2 (8e-6 for the FDNR ladder of a
 * 7th-order Chebyshev I at 18 kHz with 10 MHz op-amps); above
 * {@link PREDISTORT_ACCEPT_POLE_ERROR} the op-amp is refused. The exact
 * circuit's passband is then the ideal-op-amp circuit's within 5e-4 dB for
 * those ladders (test/ladder/active/predistort.test.ts); what remains is
 * the op-amps' own poles near the GBW.
 *
 * @module
 */
import { UnrealisableError } from "../../errors.ts";
import { formatValue } from "../../units/format.ts";
import type { OpAmpModel } from "../../circuit/types.ts";
import { abs, condition, div, referencePoints, slope, solveDense, transferOf, zeroShift, type BuiltLadder, type Point } from "./conditions.ts";
import type { LadderElement, LadderPrototype } from "../types.ts";
import type { ReadOptions } from "./options.ts";
import type { ActiveLadder, ActiveLadderPredistortion } from "./types.ts";
import { retuneResistors, retuneTarget } from "./retune.ts";

/** Relative pole error (first order) at which the iteration stops. */
export const PREDISTORT_POLE_TOLERANCE = 1e-9;
/** Largest number of Gauss-Newton steps. */
export const PREDISTORT_MAX_STEPS = 12;
/**
 * A pre-distortion whose pole error stays above this after the last step
 * has failed (a relative pole error of 1e-4 moves the passband near a pole
 * of Q 7 by about 0.006 dB). What the trims cannot remove grows as
 * (edge / GBW)^2: for the FDNR ladder of the 7th-order Chebyshev I at
 * 18 kHz, 8e-6 with 10 MHz op-amps, 9e-5 with 3 MHz.
 */
export const PREDISTORT_ACCEPT_POLE_ERROR = 1e-4;
/** The iteration stops when a step lowers the residual by less than this fraction. */
const STALLED = 1e-3;
/** Relative step of the forward differences (on log values). */
const FD_STEP = 1e-7;

/** The trims a realisation takes besides the element values. */
export interface TrimPlan {
  /** Whether the last trim is the log of a gain factor (and the level at the edge a condition). */
  readonly gain: boolean;
  /** Whether the load termination is a parameter too. */
  readonly load: boolean;
  /** The start of arm i's trim, given the edge over the op-amps' gain-bandwidth. */
  readonly start: (arm: number, edgeOverGbw: number) => number;
}

/**
 * Builds a ladder from a (modified) prototype with the given op-amp and
 * exactness, each arm's trim (see `ReadOptions.armTrim`; undefined: none)
 * and, while probing, no part window.
 */
export type LadderBuild = (p: LadderPrototype, opamp: OpAmpModel, exact: boolean, armTrim: readonly number[] | undefined, probing: boolean) => BuiltLadder;

export type { BuiltLadder } from "./conditions.ts";

/** The values a prototype exposes to the iteration: each arm's value, then its extra element. */
function valuesOf(p: LadderPrototype, load: boolean): number[] {
  const v: number[] = [];
  for (const e of p.elements) {
    v.push(e.value);
    const extra = e.kind === "series-L" ? e.parallelC : e.seriesL;
    if (extra !== undefined) v.push(extra);
  }
  if (load) v.push(p.loadOhms);
  return v;
}

function withValues(p: LadderPrototype, v: readonly number[]): LadderPrototype {
  let k = 0;
  const elements = p.elements.map((e): LadderElement => {
    const value = v[k++] as number;
    if (e.kind === "series-L") return e.parallelC === undefined ? { ...e, value } : { ...e, value, parallelC: v[k++] as number };
    return e.seriesL === undefined ? { ...e, value } : { ...e, value, seriesL: v[k++] as number };
  });
  return k < v.length ? { ...p, elements, loadOhms: v[k] as number } : { ...p, elements };
}

/** Residual vector of a circuit at the reference points. */
function residual(l: BuiltLadder | null, pts: readonly Point[], g: number, level: boolean): number[] {
  if (l === null) return [NaN];
  const t = transferOf(l);
  // the level at the edge, where g is the ideal circuit's (a condition only where the gain is trimmed)
  const r: number[] = level ? [Math.log(abs(t.at({ re: 0, im: l.frequencyScale })) / g)] : [];
  for (const p of pts) {
    if (!p.pole) {
      r.push(zeroShift(t, p.s, g).im / abs(p.s));
      continue;
    }
    const c = condition(t, p.s, p.pole, g);
    r.push(c.re);
    if (!p.real) r.push(c.im);
  }
  return r;
}

/** Largest first-order relative error of a circuit's poles (and its zeros' frequencies) at the reference points. */
function pointError(l: BuiltLadder, pts: readonly Point[], g: number): number {
  const t = transferOf(l);
  let worst = 0;
  for (const p of pts) {
    const shift = p.pole ? abs(div(condition(t, p.s, true, g), slope(t, p.s, true, g))) : Math.abs(zeroShift(t, p.s, g).im);
    worst = Math.max(worst, shift / abs(p.s));
  }
  return worst;
}

const norm = (r: readonly number[]): number => Math.sqrt(r.reduce((a, x) => a + x * x, 0));

/**
 * One Gauss-Newton step: the new parameters, or null when the Jacobian is
 * singular. The parameters outnumber the equations (an arm's value and its
 * trim), so the step is the least-norm one, `d = -J^T (J J^T + mu I)^-1 r`,
 * with mu 1e-6 of the trace (the damping of Levenberg-Marquardt: where
 * two trims act alike, as a symmetric ladder's mirror arms do, the
 * equations are nearly dependent, and an undamped step runs off along
 * their difference).
 */
function gaussNewtonStep(make: (x: readonly number[]) => BuiltLadder | null, x: readonly number[], r0: readonly number[], pts: readonly Point[], g: number, level: boolean): number[] | null {
  const m = x.length;
  const rows = r0.length;
  const jac: number[][] = [];
  for (let k = 0; k < m; k++) {
    const w = x.slice();
    w[k] = (x[k] as number) + FD_STEP;
    const rk = residual(make(w), pts, g, level);
    if (rk.length !== rows || !rk.every(Number.isFinite)) return null;
    jac.push(rk.map((v, i) => (v - (r0[i] as number)) / FD_STEP));
  }
  const a: number[] = new Array(rows * rows).fill(0);
  for (let i = 0; i < rows; i++) {
    for (let j = 0; j < rows; j++) {
      let s = 0;
      for (let k = 0; k < m; k++) s += ((jac[k] as number[])[i] as number) * ((jac[k] as number[])[j] as number);
      a[i * rows + j] = s;
    }
  }
  let trace = 0;
  for (let i = 0; i < rows; i++) trace += a[i * rows + i] as number;
  for (let i = 0; i < rows; i++) a[i * rows + i] = (a[i * rows + i] as number) + 1e-6 * trace;
  const y = solveDense(rows, a, r0.map((v) => -v));
  if (y === null) return null;
  return x.map((v, k) => {
    let s = 0;
    for (let i = 0; i < rows; i++) s += ((jac[k] as number[])[i] as number) * (y[i] as number);
    return v + s;
  });
}

/** Outcome of {@link predistortValues}: the modified prototype and trims, or null when the iteration failed. */
interface Outcome {
  readonly prototype: LadderPrototype | null;
  readonly armTrim: readonly number[];
  readonly steps: number;
  readonly poleError: number;
  readonly gainErrorDb: number;
}

/** The iteration itself for one op-amp model (no error thrown: a failed build or no convergence is a failure). */
function predistortValues(p: LadderPrototype, opamp: OpAmpModel, build: LadderBuild, trims: TrimPlan): Outcome {
  const level = trims.gain;
  const ideal = build(p, { kind: "ideal" }, true, undefined, true);
  const t = transferOf(ideal);
  const g = abs(t.at({ re: 0, im: ideal.frequencyScale }));
  const pts = referencePoints(ideal, t, g);
  const values = valuesOf(p, trims.load);
  const nv = values.length;
  const arms = p.elements.length;
  // the parameters: the logs of the element values, then one trim per arm, then the log of the gain factor
  const ratio = opamp.kind === "ideal" ? 0 : ideal.frequencyScale / (2 * Math.PI * opamp.gbwHz);
  const split = (x: readonly number[]): { proto: LadderPrototype; trim: number[] } => ({ proto: withValues(p, x.slice(0, nv).map(Math.exp)), trim: x.slice(nv) });
  const make = (x: readonly number[]): BuiltLadder | null => {
    const { proto, trim } = split(x);
    try {
      const l = build(proto, opamp, true, trim, true);
      // a step too far asks for a part of no value or below it: not a circuit
      return l.circuit.elements.every((e) => (e.kind !== "R" && e.kind !== "C") || (e.value > 0 && Number.isFinite(e.value))) ? l : null;
    } catch {
      return null;
    }
  };
  let x = [...values.map(Math.log), ...p.elements.map((_, i) => trims.start(i, ratio)), 0];
  let steps = 0;
  let r = residual(make(x), pts, g, level);
  const errorOf = (y: readonly number[]): number => {
    const l = make(y);
    return l === null ? Infinity : pointError(l, pts, g);
  };
  let err = errorOf(x);
  while (err > PREDISTORT_POLE_TOLERANCE && steps < PREDISTORT_MAX_STEPS && r.every(Number.isFinite)) {
    const before = norm(r);
    const full = gaussNewtonStep(make, x, r, pts, g, level);
    if (full === null) break;
    steps++;
    let next: number[] | null = null;
    for (let half = 0, lambda = 1; half <= 6; half++, lambda /= 2) {
      const w = x.map((v, i) => v + lambda * ((full[i] as number) - v));
      const rw = residual(make(w), pts, g, level);
      if (rw.every(Number.isFinite) && norm(rw) < norm(r)) {
        next = w;
        r = rw;
        break;
      }
    }
    if (next === null) break;
    x = next;
    err = errorOf(x);
    if (norm(r) > (1 - STALLED) * before) break;
  }
  const { proto, trim } = split(x);
  return { prototype: err <= PREDISTORT_ACCEPT_POLE_ERROR ? proto : null, armTrim: trim, steps, poleError: err, gainErrorDb: gainErrorDb(make(x), g) };
}

/** The level at the edge over the ideal circuit's, dB. */
function gainErrorDb(l: BuiltLadder | null, g: number): number {
  return l === null ? NaN : 20 * Math.log10(abs(transferOf(l).at({ re: 0, im: l.frequencyScale })) / g);
}

/** Gain-bandwidth factors tried above a failed op-amp's, to say which would do. */
const GBW_STEPS = [1.5, 2, 3, 5, 10, 20, 50, 100];

/**
 * The realisation as asked: pre-distorted for the op-amp when the options
 * say so, else built as it is (no pre-distortion record); on preferred
 * values its resistors then re-tuned (./retune.ts) unless the options say not.
 *
 * @param fn - public function name (for errors)
 * @param p - the checked normalised prototype
 * @param o - the checked options
 * @param build - the realisation's builder
 * @param trims - which trims the builder takes
 * @returns the ladder
 * @throws {@link UnrealisableError} as {@link predistortedLadder}
 */
export function realiseLadder(fn: string, p: LadderPrototype, o: ReadOptions, build: LadderBuild, trims: TrimPlan): ActiveLadder {
  const built = o.predistort ? predistortedLadder(fn, p, o, build, trims) : { ...build(p, o.opamp, o.exact, undefined, false), predistortion: null };
  if (!o.retune) return Object.freeze({ ...built, retune: null });
  // the target: the exact circuit with ideal op-amps; the conditions with the op-amp the values were designed for
  const target = retuneTarget(build(p, { kind: "ideal" }, true, undefined, true), trims.gain, o.predistort ? o.opamp : { kind: "ideal" });
  const { ladder, record } = retuneResistors(built, target, o.resistorSeries);
  return Object.freeze({ ...ladder, predistortion: built.predistortion, retune: record });
}

/**
 * Pre-distort a ladder for its op-amp and build it with the options'
 * values (preferred or exact).
 *
 * @param fn - public function name (for errors)
 * @param p - the checked normalised prototype
 * @param o - the checked options (their op-amp is not ideal)
 * @param build - the realisation's builder
 * @param trims - which trims the builder takes
 * @returns the ladder built from the pre-distorted prototype, with its record
 * @throws {@link UnrealisableError} at `options.opamp.gbwHz` when the iteration does not converge (the op-amp is too slow),
 *   saying which gain-bandwidth would do
 */
export function predistortedLadder(fn: string, p: LadderPrototype, o: ReadOptions, build: LadderBuild, trims: TrimPlan): Omit<ActiveLadder, "retune"> {
  const opamp = o.opamp;
  const out = predistortValues(p, opamp, build, trims);
  if (out.prototype === null) {
    const gbw = opamp.kind === "ideal" ? 0 : opamp.gbwHz;
    const need = opamp.kind === "ideal" ? undefined : GBW_STEPS.find((f) => predistortValues(p, { ...opamp, gbwHz: f * gbw }, build, trims).prototype !== null);
    const advice = need === undefined ? "op-amps more than 100 times faster" : `op-amps of at least ${formatValue(need * gbw, { unit: "Hz" })} gain-bandwidth`;
    throw new UnrealisableError({
      fn,
      path: "options.opamp.gbwHz",
      received: gbw,
      message: `the op-amps' gain-bandwidth is too low to pre-distort this ladder at ${formatValue(o.edgeHz, { unit: "Hz" })} (pole error ${out.poleError.toPrecision(2)} after ${out.steps} steps): use ${advice}, or a lower edge`,
    });
  }
  // the prototype's transfer is kept as it was, so the target is the undistorted ladder's
  const built = build(out.prototype, opamp, o.exact, out.armTrim, false);
  const record: ActiveLadderPredistortion = Object.freeze({ steps: out.steps, poleError: out.poleError, prototype: out.prototype, armTrim: Object.freeze(out.armTrim.slice(0, p.elements.length)), gainErrorDb: out.gainErrorDb });
  return Object.freeze({ ...built, predistortion: record });
}
