/**
 * The conditions an active ladder's circuit is held to, shared by the
 * pre-distortion (./predistort.ts) and the re-tune after rounding
 * (./retune.ts): the circuit's transfer at a complex frequency from its
 * nodal equations (src/circuit/mna.ts, one complex LU per point), the
 * conditions `g / H = 0` at a pole and `H / g = 0` at a zero with their
 * slopes, Newton's method on them, and the reference points (the exact
 * ideal-op-amp circuit's poles and finite zeros).
 *
 * Accuracy: H(s) to the LU's rounding (about 1e-13 relative for these
 * circuits); the slopes by a complex forward difference of step 1e-6 |s|,
 * so a first-order shift `-c / c'` is good to about 1e-6 of itself.
 *
 * @module
 */
import { assembleMna, type MnaSystem } from "../../circuit/mna.ts";
import type { Complex } from "../../math/complex.ts";
import { luFactorInPlace, luSolveInPlace } from "../../math/linear.ts";
import type { ActiveLadder } from "./types.ts";

/** An active ladder as a builder returns it, before the pre-distortion and re-tune records are added. */
export type BuiltLadder = Omit<ActiveLadder, "predistortion" | "retune">;

/** The circuit's transfer at one complex frequency, by one complex LU of its nodal equations. */
export class TransferAt {
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

export const div = (a: Complex, b: Complex): Complex => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
export const abs = (a: Complex): number => Math.hypot(a.re, a.im);

export function transferOf(l: BuiltLadder): TransferAt {
  return new TransferAt(assembleMna(l.circuit), l.source, l.output);
}

/** A condition at a point: `g / H` at a pole, `H / g` at a zero. */
export function condition(t: TransferAt, s: Complex, pole: boolean, g: number): Complex {
  const h = t.at(s);
  return pole ? div({ re: g, im: 0 }, h) : { re: h.re / g, im: h.im / g };
}

/** d condition / d s at s, by a complex forward difference (the condition is analytic). */
export function slope(t: TransferAt, s: Complex, pole: boolean, g: number): Complex {
  const h = 1e-6 * abs(s);
  const a = condition(t, s, pole, g);
  const b = condition(t, { re: s.re + h, im: s.im }, pole, g);
  return { re: (b.re - a.re) / h, im: (b.im - a.im) / h };
}

/** Newton's method on the condition from a start point: the nearby pole (zero) of the circuit. */
export function refine(t: TransferAt, start: Complex, pole: boolean, g: number): Complex {
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
export interface Point {
  readonly s: Complex;
  readonly pole: boolean;
  readonly real: boolean;
}

/** The ideal circuit's poles and finite zeros, one per conjugate pair, near the target's. */
export function referencePoints(ideal: BuiltLadder, t: TransferAt, g: number): Point[] {
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

/**
 * The first-order distance from a reference zero to the circuit's zero,
 * `-H / H'` (complex). Only its imaginary part, the notch frequency, is a
 * condition: the op-amps' loss leaves the zero a little off the jw axis
 * (the notch's finite depth), which no element value moves back.
 */
export function zeroShift(t: TransferAt, s: Complex, g: number): Complex {
  return div(condition(t, s, false, g), slope(t, s, false, g));
}


/** Solve the small dense system `a x = b` (row-major, partial pivoting); null when singular. */
export function solveDense(n: number, a: number[], b: number[]): number[] | null {
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
