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
import { assembleMna, type MnaSystem } from "../../circuit/mna.ts";
import type { OpAmpModel } from "../../circuit/types.ts";
import type { Complex } from "../../math/complex.ts";
import { luFactorInPlace, luSolveInPlace } from "../../math/linear.ts";
import type { LadderElement, LadderPrototype } from "../types.ts";
import type { ReadOptions } from "./options.ts";
import type { ActiveLadder, ActiveLadderPredistortion } from "./types.ts";

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

/** An active ladder as a builder returns it, before the pre-distortion record is added. */
export type BuiltLadder = Omit<ActiveLadder, "predistortion">;

/**
 * Builds a ladder from a (modified) prototype with the given op-amp and
 * exactness, each arm's trim (see `ReadOptions.armTrim`; undefined: none)
 * and, while probing, no part window.
 */
export type LadderBuild = (p: LadderPrototype, opamp: OpAmpModel, exact: boolean, armTrim: readonly number[] | undefined, probing: boolean) => BuiltLadder;

/** The circuit's transfer at one complex frequency, by one complex LU of its nodal equations. */
class TransferAt {
  private readonly ar: Float64Array;
  private readonly ai: Float64Array;
  private readonly piv: Int32Array;
  private readonly b: { re: Float64Array; im: Float64Array };
  private readonly x: { re: Float64Array; im: Float64Array };
  private readonly out: number;
  constructor(private readonly sys: MnaSystem, source: string, output: string) {
    const n = sys.n;
    this.ar = new Float64Array(n * n);
    this.ai = new Float64Array(n * n);
    this.piv = new Int32Array(n);
    this.b = { re: new Float64Array(n), im: new Float64Array(n) };
    this.x = { re: new Float64Array(n), im: new Float64Array(n) };
    this.b.re[sys.sourceRow.get(source) as number] = 1;
    this.out = sys.nodeIndex.get(output) as number;
  }
  /** H(s), or NaN when the equations are singular there. */
  at(s: Complex): Complex {
    const { n, g, c } = this.sys;
    const { ar, ai } = this;
    for (let i = 0; i < n * n; i++) {
      const ci = c[i] as number;
      ar[i] = (g[i] as number) + s.re * ci;
      ai[i] = s.im * ci;
    }
    if (luFactorInPlace(n, ar, ai, this.piv) >= 0) return { re: NaN, im: NaN };
    luSolveInPlace(n, { re: ar, im: ai, pivots: this.piv }, this.b, this.x);
    return { re: this.x.re[this.out] as number, im: this.x.im[this.out] as number };
  }
}

const div = (a: Complex, b: Complex): Complex => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
const abs = (a: Complex): number => Math.hypot(a.re, a.im);

function transferOf(l: BuiltLadder): TransferAt {
  return new TransferAt(assembleMna(l.circuit), l.source, l.output);
}

/** A condition at a point: `g / H` at a pole, `H / g` at a zero. */
function condition(t: TransferAt, s: Complex, pole: boolean, g: number): Complex {
  const h = t.at(s);
  return pole ? div({ re: g, im: 0 }, h) : { re: h.re / g, im: h.im / g };
}

/** d condition / d s at s, by a complex forward difference (the condition is analytic). */
function slope(t: TransferAt, s: Complex, pole: boolean, g: number): Complex {
  const h = 1e-6 * abs(s);
  const a = condition(t, s, pole, g);
  const b = condition(t, { re: s.re + h, im: s.im }, pole, g);
  return { re: (b.re - a.re) / h, im: (b.im - a.im) / h };
}

/** Newton's method on the condition from a start point: the nearby pole (zero) of the circuit. */
function refine(t: TransferAt, start: Complex, pole: boolean, g: number): Complex {
  let s = start;
  for (let k = 0; k < 8; k++) {
    const step = div(condition(t, s, pole, g), slope(t, s, pole, g));
    if (!Number.isFinite(step.re) || !Number.isFinite(step.im)) break;
    s = { re: s.re - step.re, im: s.im - step.im };
    if (abs(step) <= 1e-14 * abs(s)) break;
  }
  return s;
}

/** A reference point: where, whether a pole, whether real (one equation). */
interface Point {
  readonly s: Complex;
  readonly pole: boolean;
  readonly real: boolean;
}

/** The ideal circuit's poles and finite zeros, one per conjugate pair, near the target's. */
function referencePoints(ideal: BuiltLadder, t: TransferAt, g: number): Point[] {
  const pts: Point[] = [];
  const add = (roots: readonly Complex[], pole: boolean): void => {
    for (const r of roots) {
      if (r.im < -1e-12 * abs(r)) continue;
      const real = Math.abs(r.im) <= 1e-12 * abs(r);
      // a zero at the origin (highpass) is structural: nothing to match
      if (!pole && abs(r) === 0) continue;
      // move a jw-axis zero slightly off the axis and a real point onto it for the condition's sake
      const s = refine(t, real ? { re: r.re, im: 0 } : r, pole, g);
      pts.push({ s: real ? { re: s.re, im: 0 } : s, pole, real });
    }
  };
  add(ideal.target.poles, true);
  add(ideal.target.zeros, false);
  return pts;
}

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

/**
 * The first-order distance from a reference zero to the circuit's zero,
 * `-H / H'` (complex). Only its imaginary part, the notch frequency, is a
 * condition: the op-amps' loss leaves the zero a little off the jw axis
 * (the notch's finite depth), which no element value moves back.
 */
function zeroShift(t: TransferAt, s: Complex, g: number): Complex {
  return div(condition(t, s, false, g), slope(t, s, false, g));
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

/** Solve the small dense system `a x = b` (row-major, partial pivoting); null when singular. */
function solveDense(n: number, a: number[], b: number[]): number[] | null {
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(a[r * n + col] as number) > Math.abs(a[piv * n + col] as number)) piv = r;
    if (!(Math.abs(a[piv * n + col] as number) > 0)) return null;
    if (piv !== col) {
      for (let j = 0; j < n; j++) [a[col * n + j], a[piv * n + j]] = [a[piv * n + j] as number, a[col * n + j] as number];
      [b[col], b[piv]] = [b[piv] as number, b[col] as number];
    }
    for (let r = col + 1; r < n; r++) {
      const f = (a[r * n + col] as number) / (a[col * n + col] as number);
      for (let j = col; j < n; j++) a[r * n + j] = (a[r * n + j] as number) - f * (a[col * n + j] as number);
      b[r] = (b[r] as number) - f * (b[col] as number);
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i] as number;
    for (let j = i + 1; j < n; j++) s -= (a[i * n + j] as number) * (x[j] as number);
    x[i] = s / (a[i * n + i] as number);
  }
  return x.every(Number.isFinite) ? x : null;
}

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
 * say so, else built as it is (no pre-distortion record).
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
  if (o.predistort) return predistortedLadder(fn, p, o, build, trims);
  return Object.freeze({ ...build(p, o.opamp, o.exact, undefined, false), predistortion: null });
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
export function predistortedLadder(fn: string, p: LadderPrototype, o: ReadOptions, build: LadderBuild, trims: TrimPlan): ActiveLadder {
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
