/**
 * A stage's as-built transfer function as real polynomials in s, from its
 * own elements and the op-amp model, for any topology and any model degree.
 *
 * Method: the stage's nodal equations `(G + s C) x = b` (its stamp program,
 * compiled once per topology and op-amp model) give, by Cramer's rule,
 * `H(s) = N(s) / D(s)` with `D(s) = det(G + s C)` and `N(s) = D(s) x_out(s)`.
 * Both are polynomials of degree at most the number of rows of `C` that hold
 * a stamp. They are sampled at `M` points `s_k = r exp(j pi (2k + 1) / M)` on
 * a circle of radius r (the stage's natural frequency, so the scaled
 * coefficients stay near unity), one complex LU factorisation per conjugate
 * pair of points, and their coefficients recovered by the inverse discrete
 * Fourier transform (the interpolation of polynomials at roots of unity:
 * J. W. Cooley & J. W. Tukey, "An algorithm for the machine calculation of
 * complex Fourier series", Math. Comp. 19:297-301, 1965, used here as a
 * plain O(M^2) sum since M <= 16). Coefficients below
 * {@link COEFFICIENT_FLOOR} of the largest are the transform's rounding
 * noise (the degree bound exceeds the true degree) and are set to zero.
 *
 * Fast path: where the topology derives its polynomials in closed form
 * (`Topology.polynomialsInto`, for the ideal and single-pole op-amp models)
 * {@link stagePolynomialsInto} takes them instead (about a hundred times
 * cheaper, same layout); {@link genericStagePolynomialsInto} is the path
 * above, kept as the reference and the fallback.
 *
 * Accuracy: each scaled coefficient carries an absolute error of a few ulps
 * of the largest one; against the closed forms and the nodal analysis the
 * response agrees to better than 1e-10 relative over four decades about the
 * stage's f0 (test/evaluate/stage-polynomials.test.ts).
 *
 * @module
 */
import { elementValues, stampProgram, applyStamps, type StampProgram } from "../circuit/stamps.ts";
import type { Circuit, Element, OpAmpModel } from "../circuit/types.ts";
import { equilibrate, powerOfTwo } from "../math/equilibrate.ts";
import { luDeterminantInto, luFactorInPlace, luSolveInPlace } from "../math/linear.ts";
import type { ComponentValues, PolynomialsInto, Topology } from "../topologies/types.ts";
import type { ScaledRational } from "./types.ts";

/** Smallest rounding noise assumed on a circle, relative to its largest coefficient (about 20 ulps). */
export const COEFFICIENT_FLOOR = 4e-15;

/** How far above a circle's noise a coefficient must stand to be kept. */
export const SIGNAL_TO_NOISE = 8;

/** Ratio of neighbouring sample circles. */
const CIRCLE_RATIO = 10;

/** Most circles sampled (fifteen decades). */
const MAX_CIRCLES = 16;

/** A stage's stamp program with the scratch its per-board evaluation needs. */
export interface CompiledStage {
  /** The topology's component names, the order per-board values come in. */
  readonly componentNames: readonly string[];
  /** The stamp program of the stage driven by a unit source. */
  readonly program: StampProgram;
  /** For each element, the index of its component in `componentNames`, or -1 (source, op-amp). */
  readonly componentOfElement: Int32Array;
  /** Unknown index of the output node voltage. */
  readonly output: number;
  /** Row of the driving source. */
  readonly sourceRow: number;
  /** Number of sample points M (even, greater than the degree bound). */
  readonly points: number;
  /** Upper bound on the degree of numerator and denominator. */
  readonly degreeBound: number;
  /** Angular frequencies (rad/s) where the polynomials will be evaluated: the sample circles cover them. */
  readonly spanRadS: readonly [number, number];
  /** Highest op-amp gain-bandwidth product in rad/s (0 for ideal op-amps): where the top sample circle goes. */
  readonly bandwidthRadS: number;
  /** `cos(m theta_k)` at `k * M + m`, for the inverse transform. */
  readonly cosTable: Float64Array;
  /** `sin(m theta_k)` at `k * M + m`. */
  readonly sinTable: Float64Array;
  /** The topology's closed-form polynomials and the op-amp model, where the topology has them and the model allows; else null. */
  readonly closedForm: { readonly into: PolynomialsInto; readonly opamp: OpAmpModel } | null;
  /** Scratch: element values, matrices, pivots, right-hand side, solution, samples. */
  readonly scratch: {
    readonly values: Float64Array;
    readonly g: Float64Array;
    readonly c: Float64Array;
    readonly ar: Float64Array;
    readonly ai: Float64Array;
    readonly piv: Int32Array;
    readonly b: { readonly re: Float64Array; readonly im: Float64Array };
    readonly x: { readonly re: Float64Array; readonly im: Float64Array };
    readonly nRe: Float64Array;
    readonly nIm: Float64Array;
    readonly dRe: Float64Array;
    readonly dIm: Float64Array;
    readonly radii: Float64Array;
    readonly rowScale: Float64Array;
    readonly colScale: Float64Array;
    readonly exponent: Float64Array;
    readonly det: Float64Array;
    readonly seen: Uint8Array;
    readonly noise: Float64Array;
    readonly numSets: Float64Array;
    readonly denSets: Float64Array;
    /** The circle each numerator / denominator coefficient came from at the last full evaluation (-1: zero). */
    readonly numChoice: Int8Array;
    readonly denChoice: Int8Array;
    /** Which circles supplied a coefficient then. */
    readonly used: Uint8Array;
    /** Their radii, in order. */
    readonly plannedRadii: Float64Array;
    /** A board's coefficient choices (not kept). */
    readonly boardChoice: Int8Array;
    /** That evaluation's radius used, radius asked (NaN before the first) and number of planned circles. */
    readonly plan: Float64Array;
  };
}

/** Prefix of the stage's internal node names in its compiled circuit. */
export const INTERNAL_NODE_PREFIX = "x_";

/** The stage as a circuit driven at "in" by a unit source, output at "out", internal nodes prefixed by {@link INTERNAL_NODE_PREFIX}. */
export function stageElements(topology: Topology, nominal: ComponentValues, opamp: OpAmpModel): Element[] {
  return [
    { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
    ...topology.elements(nominal, { input: "in", output: "out", nodePrefix: INTERNAL_NODE_PREFIX, opamp }),
  ];
}

/** Two decades either side of the stage's ideal f0, rad/s. */
function defaultSpan(topology: Topology, nominal: ComponentValues): readonly [number, number] {
  const w0 = 2 * Math.PI * topology.figures(nominal).f0Hz;
  return [w0 / 100, w0 * 100];
}

/** Rows of `C` that hold a stamp: an upper bound on the degree of `det(G + s C)`. */
function degreeBound(p: StampProgram): number {
  const rows = new Set<number>();
  for (let i = 0; i < p.entry.length; i++) if (p.matrix[i] === 1) rows.add(Math.floor((p.entry[i] as number) / p.n));
  return rows.size;
}

/**
 * Compile a stage: its stamp program with the given op-amp model, and the
 * scratch for {@link stagePolynomialsInto}. No checks (internal: the
 * topology and values come from the design layer or a checked caller).
 *
 * @param topology - the stage's topology
 * @param nominal - component values (any valid set; only the structure is kept)
 * @param opamp - op-amp model for every op-amp of the stage
 * @param spanRadS - angular frequencies where the result will be evaluated (the
 *   sample circles reach a decade beyond); by default two decades about the stage's f0
 * @param outputNode - the topology's local node whose voltage is the output
 *   (`"out"`, the stage output, by default; any other node is an internal one,
 *   such as an op-amp output of a multi-amplifier stage, and takes the generic path)
 * @returns the compiled stage
 */
export function compileStage(
  topology: Topology,
  nominal: ComponentValues,
  opamp: OpAmpModel,
  spanRadS: readonly [number, number] = [0, 0],
  outputNode = "out",
): CompiledStage {
  const into = topology.polynomialsInto;
  const atOutput = outputNode === "out";
  // the closed form's degree with this model: the ideal op-amp adds none (its top coefficients are 0)
  const closedDegree = (topology.polynomialDegree as number) - (opamp.kind === "ideal" ? topology.opampCount : 0);
  const closed = atOutput && into !== undefined && (opamp.kind !== "single-pole-rout" || opamp.routOhm === 0);
  return compileElements({ title: topology.id, elements: stageElements(topology, nominal, opamp) }, topology.componentNames, {
    source: "Vin",
    output: atOutput ? "out" : `${INTERNAL_NODE_PREFIX}${outputNode}`,
    spanRadS: spanRadS[1] > 0 ? spanRadS : defaultSpan(topology, nominal),
    bandwidthRadS: opamp.kind === "ideal" ? 0 : 2 * Math.PI * opamp.gbwHz,
    closedForm: closed ? { into, opamp, degree: closedDegree } : null,
  });
}

/** How {@link compileElements} compiles a circuit. */
export interface CompileElementsOptions {
  /** The driving voltage source. */
  readonly source: string;
  /** The output node. */
  readonly output: string;
  /** Angular frequencies (rad/s) where the result will be evaluated: the sample circles cover them. */
  readonly spanRadS: readonly [number, number];
  /** Highest op-amp gain-bandwidth product, rad/s (0 for ideal op-amps). */
  readonly bandwidthRadS: number;
  /** A topology's closed-form polynomials, the model and their degree with it; null for none. */
  readonly closedForm: { readonly into: PolynomialsInto | undefined; readonly opamp: OpAmpModel; readonly degree: number } | null;
}

/**
 * A circuit's stamp program, transform tables and scratch (for {@link compileStage} and ./circuit-boards.ts). No checks.
 *
 * @param circuit - a valid circuit
 * @param names - the elements (by name) whose values a board's values replace, in board order
 * @param o - source, output, span, bandwidth, closed form
 * @returns the compiled circuit
 */
export function compileElements(circuit: Circuit, names: readonly string[], o: CompileElementsOptions): CompiledStage {
  const program = stampProgram(circuit);
  const componentOfElement = Int32Array.from(circuit.elements, (e) => names.indexOf(e.name));
  const n = program.n;
  const bound = degreeBound(program);
  // at least one spare power above the bound, to measure each circle's noise
  const points = 2 * Math.ceil((bound + 2) / 2);
  const cosTable = new Float64Array(points * points);
  const sinTable = new Float64Array(points * points);
  for (let k = 0; k < points; k++) {
    const theta = (Math.PI * (2 * k + 1)) / points;
    for (let m = 0; m < points; m++) {
      cosTable[k * points + m] = Math.cos(m * theta);
      sinTable[k * points + m] = Math.sin(m * theta);
    }
  }
  const values = elementValues(circuit);
  const half = points / 2;
  const cf = o.closedForm;
  return {
    componentNames: names,
    program,
    componentOfElement,
    output: program.nodeIndex.get(o.output) as number,
    sourceRow: program.sourceRow.get(o.source) as number,
    points,
    degreeBound: bound,
    spanRadS: o.spanRadS,
    bandwidthRadS: o.bandwidthRadS,
    cosTable,
    sinTable,
    closedForm: cf !== null && cf.into !== undefined && cf.degree < points ? { into: cf.into, opamp: cf.opamp } : null,
    scratch: {
      values,
      g: new Float64Array(n * n),
      c: new Float64Array(n * n),
      ar: new Float64Array(n * n),
      ai: new Float64Array(n * n),
      piv: new Int32Array(n),
      b: { re: new Float64Array(n), im: new Float64Array(n) },
      x: { re: new Float64Array(n), im: new Float64Array(n) },
      nRe: new Float64Array(half),
      nIm: new Float64Array(half),
      dRe: new Float64Array(half),
      dIm: new Float64Array(half),
      radii: new Float64Array(MAX_CIRCLES),
      rowScale: new Float64Array(n),
      colScale: new Float64Array(n),
      exponent: new Float64Array(1),
      det: new Float64Array(2),
      seen: new Uint8Array(n),
      noise: new Float64Array(MAX_CIRCLES),
      numSets: new Float64Array(MAX_CIRCLES * points),
      denSets: new Float64Array(MAX_CIRCLES * points),
      numChoice: new Int8Array(points),
      denChoice: new Int8Array(points),
      used: new Uint8Array(MAX_CIRCLES),
      plannedRadii: new Float64Array(MAX_CIRCLES),
      boardChoice: new Int8Array(points),
      plan: Float64Array.of(NaN, NaN, 0),
    },
  };
}

/** Sample `D` and `N` at the upper-half sample points; false when a point is singular. */
function sample(cs: CompiledStage, radius: number, first: boolean): boolean {
  const { program, scratch: sc, points, sourceRow, output } = cs;
  const n = program.n;
  const nn = n * n;
  for (let k = 0; k < points / 2; k++) {
    // s_k = r e^{j theta_k}: the m = 1 column of the tables holds cos and sin of theta_k.
    const sr = radius * (cs.cosTable[k * points + 1] as number);
    const si = radius * (cs.sinTable[k * points + 1] as number);
    for (let i = 0; i < nn; i++) {
      const ci = sc.c[i] as number;
      sc.ar[i] = (sc.g[i] as number) + sr * ci;
      sc.ai[i] = si * ci;
    }
    const exponent = equilibrate(n, sc.ar, sc.ai, sc.rowScale, sc.colScale);
    if (Number.isNaN(exponent) || luFactorInPlace(n, sc.ar, sc.ai, sc.piv) >= 0) return false;
    luDeterminantInto(n, sc.ar, sc.ai, sc.piv, sc.det, sc.seen);
    let dr = sc.det[0] as number;
    let di = sc.det[1] as number;
    // det(A) = det(R A C) 2^exponent, taken relative to the first sample's exponent.
    if (k === 0 && first) sc.exponent[0] = exponent;
    const unit = powerOfTwo(exponent - (sc.exponent[0] as number));
    dr *= unit;
    di *= unit;
    // A x = b with b the unit source: (R A C) y = R b, x = C y.
    sc.b.re.fill(0);
    sc.b.im.fill(0);
    sc.b.re[sourceRow] = sc.rowScale[sourceRow] as number;
    luSolveInPlace(n, { re: sc.ar, im: sc.ai, pivots: sc.piv }, sc.b, sc.x);
    const xr = (sc.x.re[output] as number) * (sc.colScale[output] as number);
    const xi = (sc.x.im[output] as number) * (sc.colScale[output] as number);
    sc.dRe[k] = dr;
    sc.dIm[k] = di;
    sc.nRe[k] = dr * xr - di * xi;
    sc.nIm[k] = dr * xi + di * xr;
  }
  return true;
}

/**
 * Inverse transform of conjugate-symmetric samples into `points` real
 * coefficients, descending (`out[at]` multiplies z^(M-1), `out[at + M - 1]` is
 * the constant term), in units of the circle's radius.
 */
function coefficients(cs: CompiledStage, re: Float64Array, im: Float64Array, out: Float64Array, at: number): void {
  const { points, cosTable, sinTable } = cs;
  const half = points / 2;
  for (let m = 0; m < points; m++) {
    // c_m = (1/M) sum_k P_k e^{-j m theta_k}; the conjugate points double the real part.
    let sum = 0;
    for (let k = 0; k < half; k++) {
      const t = k * points + m;
      sum += (re[k] as number) * (cosTable[t] as number) + (im[k] as number) * (sinTable[t] as number);
    }
    out[at + points - 1 - m] = (2 * sum) / points;
  }
}

/**
 * Merge the coefficient sets of several circles into one set in units of the
 * base radius. Each circle's rounding noise is measured on its spare
 * coefficients (the powers above the degree bound, exactly zero in truth),
 * with a floor of a few ulps of its largest coefficient; each coefficient is
 * taken from the circle where it stands highest above that noise, and set to
 * zero when it stands less than {@link SIGNAL_TO_NOISE} above it on every
 * circle.
 */
function merge(cs: CompiledStage, sets: Float64Array, base: number, circles: number, out: Float64Array, choice: Int8Array): void {
  const { radii, noise } = cs.scratch;
  const M = cs.points;
  const spare = M - 1 - cs.degreeBound;
  for (let i = 0; i < circles; i++) {
    let big = 0;
    let zero = 0;
    for (let m = 0; m < M; m++) {
      const x = Math.abs(sets[i * M + m] as number);
      big = Math.max(big, x);
      if (m < spare) zero = Math.max(zero, x);
    }
    noise[i] = 2 * Math.max(zero, COEFFICIENT_FLOOR * big);
  }
  for (let m = 0; m < M; m++) {
    const power = M - 1 - m;
    let best = -1;
    let bestRatio = SIGNAL_TO_NOISE;
    for (let i = 0; m >= spare && i < circles; i++) {
      const r = Math.abs(sets[i * M + m] as number) / (noise[i] as number);
      if (r >= bestRatio) {
        bestRatio = r;
        best = i;
      }
    }
    choice[m] = best;
    out[m] = best < 0 ? 0 : (sets[best * M + m] as number) * Math.pow(base / (radii[best] as number), power);
  }
}

/** Scale numerator and denominator so the largest denominator coefficient is 1; false when the denominator vanished. */
function normalise(cs: CompiledStage, num: Float64Array, den: Float64Array): boolean {
  let big = 0;
  for (let m = 0; m < cs.points; m++) big = Math.max(big, Math.abs(den[m] as number));
  if (!(big > 0) || !Number.isFinite(big)) return false;
  for (let m = 0; m < cs.points; m++) {
    den[m] = (den[m] as number) / big;
    num[m] = (num[m] as number) / big;
  }
  return true;
}

/**
 * The stage's transfer function with the given component values, written as
 * coefficients in `z = s / radius`, descending, into `num` and `den` (each of
 * length `cs.points`, leading zeros where the degree is lower; the hot path
 * of per-board evaluation, no checks). The
 * common scale of numerator and denominator is fixed so that the largest
 * denominator coefficient is 1. Takes the topology's closed form where the
 * stage has one ({@link CompiledStage.closedForm}), else, or when that
 * declines, {@link genericStagePolynomialsInto}.
 *
 * @param cs - the compiled stage
 * @param values - component values in `cs.componentNames` order
 * @param radius - the scale (rad/s), about the stage's natural frequency
 * @param num - numerator coefficients, written
 * @param den - denominator coefficients, written
 * @returns the radius actually used, or 0 when the stage is singular
 */
export function stagePolynomialsInto(
  cs: CompiledStage,
  values: Float64Array,
  radius: number,
  num: Float64Array,
  den: Float64Array,
): number {
  const r = closedFormInto(cs, values, radius, num, den);
  return r > 0 ? r : genericStagePolynomialsInto(cs, values, radius, num, den);
}

/** The topology's closed-form polynomials where the compiled stage has them; 0 where it has none or declines. */
function closedFormInto(cs: CompiledStage, values: Float64Array, radius: number, num: Float64Array, den: Float64Array): number {
  const closed = cs.closedForm;
  return closed === null ? 0 : closed.into(values, closed.opamp, radius, num, den);
}

/** Put a board's component values on the stage's elements and fill `G` and `C`. */
function loadValues(cs: CompiledStage, values: Float64Array): void {
  const sc = cs.scratch;
  const map = cs.componentOfElement;
  for (let e = 0; e < map.length; e++) {
    const j = map[e] as number;
    if (j >= 0) sc.values[e] = values[j] as number;
  }
  applyStamps(cs.program, sc.values, sc.g, sc.c);
}

/**
 * {@link stagePolynomialsInto} by the generic path only: the stage's nodal
 * equations sampled on circles (the method in the module header), whatever
 * the topology; the reference the closed forms are tested against.
 *
 * @param cs - the compiled stage
 * @param values - component values in `cs.componentNames` order
 * @param radius - the scale (rad/s), about the stage's natural frequency
 * @param num - numerator coefficients, written
 * @param den - denominator coefficients, written
 * @returns the radius actually used (it is nudged when a sample point lands on a pole), or 0 when the stage is singular
 */
export function genericStagePolynomialsInto(
  cs: CompiledStage,
  values: Float64Array,
  radius: number,
  num: Float64Array,
  den: Float64Array,
): number {
  const sc = cs.scratch;
  loadValues(cs, values);
  let r = radius;
  let ok = sampleCircles(cs, r);
  for (let tries = 0; !ok && tries < 4; tries++) {
    r *= 1.0905077326652577; // 2^(1/8): away from a pole that sits on a sample point
    ok = sampleCircles(cs, r);
  }
  if (ok === 0) return 0;
  merge(cs, sc.denSets, r, ok, den, sc.denChoice);
  merge(cs, sc.numSets, r, ok, num, sc.numChoice);
  // the plan a board reuses: the radius and which circles supplied a coefficient
  sc.plan[0] = r;
  sc.plan[1] = radius;
  sc.used.fill(0);
  for (let m = 0; m < cs.points; m++) {
    if ((sc.denChoice[m] as number) >= 0) sc.used[sc.denChoice[m] as number] = 1;
    if ((sc.numChoice[m] as number) >= 0) sc.used[sc.numChoice[m] as number] = 1;
  }
  let count = 0;
  for (let i = 0; i < ok; i++) if (sc.used[i] === 1) sc.plannedRadii[count++] = sc.radii[i] as number;
  sc.plan[2] = count;
  if (!normalise(cs, num, den)) return 0;
  return r;
}

/**
 * A Monte Carlo board's polynomials: the topology's closed form where it has
 * one, else the generic path on only the circles that supplied a coefficient
 * at the last full evaluation with the same radius (a board's parts move a
 * few per cent, so the circles that resolve the coefficients stay the same;
 * each coefficient is still taken from the best of them by the same noise
 * test), else the full generic path, which makes that plan. No checks.
 *
 * @param cs - the compiled stage
 * @param values - component values in `cs.componentNames` order
 * @param radius - the scale (rad/s): the same for every board of a stage
 * @param num - numerator coefficients, written
 * @param den - denominator coefficients, written
 * @returns the radius used, or 0 when the stage is singular
 */
export function boardPolynomialsInto(
  cs: CompiledStage,
  values: Float64Array,
  radius: number,
  num: Float64Array,
  den: Float64Array,
): number {
  const closed = closedFormInto(cs, values, radius, num, den);
  if (closed > 0) return closed;
  const sc = cs.scratch;
  if (sc.plan[1] !== radius) return genericStagePolynomialsInto(cs, values, radius, num, den);
  loadValues(cs, values);
  const count = sc.plan[2] as number;
  for (let j = 0; j < count; j++) {
    const rj = sc.plannedRadii[j] as number;
    sc.radii[j] = rj;
    if (!sample(cs, rj, j === 0)) return genericStagePolynomialsInto(cs, values, radius, num, den);
    coefficients(cs, sc.dRe, sc.dIm, sc.denSets, j * cs.points);
    coefficients(cs, sc.nRe, sc.nIm, sc.numSets, j * cs.points);
  }
  // the same noise-aware choice as the full path, over the planned circles: a coefficient that was
  // noise at nominal (a notch's odd term) is still found when a board's mismatch makes it real
  const r = sc.plan[0] as number;
  merge(cs, sc.denSets, r, count, den, sc.boardChoice);
  merge(cs, sc.numSets, r, count, num, sc.boardChoice);
  return normalise(cs, num, den) ? r : 0;
}

/**
 * Sample every circle, from `radius` up by {@link CIRCLE_RATIO} to past the
 * op-amps' bandwidth, and transform each; returns the number of circles, or
 * 0 when a sample point is singular.
 */
function sampleCircles(cs: CompiledStage, radius: number): number {
  const sc = cs.scratch;
  const top = Math.max(cs.bandwidthRadS * 4, cs.spanRadS[1], radius * CIRCLE_RATIO);
  // Circles stand a whole number of ratios from the base radius, from below the span (or a ratio below the radius) up.
  const below = Math.max(1, Math.ceil(Math.log(radius / Math.min(cs.spanRadS[0], radius)) / Math.log(CIRCLE_RATIO) - 1e-9));
  let circles = 0;
  for (let r = radius / Math.pow(CIRCLE_RATIO, below); circles < MAX_CIRCLES; r *= CIRCLE_RATIO) {
    sc.radii[circles] = r;
    if (!sample(cs, r, circles === 0)) return 0;
    coefficients(cs, sc.dRe, sc.dIm, sc.denSets, circles * cs.points);
    coefficients(cs, sc.nRe, sc.nIm, sc.numSets, circles * cs.points);
    circles++;
    if (r >= top) break;
  }
  return circles;
}

/** Options of {@link stagePolynomials}. */
export interface StagePolynomialOptions {
  /**
   * Angular frequencies (rad/s) where the result will be evaluated (the
   * generic path's sample circles cover them).
   *
   * @defaultValue two decades either side of the stage's f0
   */
  readonly spanRadS?: readonly [number, number];
  /**
   * Whether to take the topology's closed-form polynomials where it has them.
   *
   * @defaultValue true
   */
  readonly closedForm?: boolean;
}

/** Copy without the leading zeros. */
function trimmed(a: Float64Array): Float64Array {
  let first = 0;
  while (first < a.length - 1 && a[first] === 0) first++;
  return a.slice(first);
}

/** Compiled stages kept per topology. */
const COMPILED_PER_TOPOLOGY = 32;

/** Compiled stages by topology, then by op-amp model and span (a stage's structure does not depend on its values). */
const compiled = new WeakMap<Topology, Map<string, CompiledStage>>();

/** The compiled stage for a topology, op-amp model and span, made once. */
function compiledFor(topology: Topology, values: ComponentValues, opamp: OpAmpModel, spanRadS: readonly [number, number]): CompiledStage {
  let byKey = compiled.get(topology);
  if (byKey === undefined) {
    byKey = new Map();
    compiled.set(topology, byKey);
  }
  const key = `${JSON.stringify(opamp)} ${spanRadS[0]} ${spanRadS[1]}`;
  let cs = byKey.get(key);
  if (cs === undefined) {
    if (byKey.size >= COMPILED_PER_TOPOLOGY) byKey.clear(); // a long-running process designs many specs: keep the cache small
    cs = compileStage(topology, values, opamp, spanRadS);
    byKey.set(key, cs);
  }
  return cs;
}

/**
 * A stage's as-built transfer function as polynomials in the scaled variable
 * `z = s / scale`, numerator and denominator in descending powers (numpy's
 * convention), with every degree the op-amp model adds. Internal: no checks.
 *
 * @param topology - the stage's topology
 * @param values - its component values
 * @param opamp - op-amp model for every op-amp of the stage
 * @param options - where it will be evaluated, and whether to take the topology's closed form
 * @returns the rational function, or null when the stage's equations are singular
 */
export function stagePolynomials(
  topology: Topology,
  values: ComponentValues,
  opamp: OpAmpModel,
  options: StagePolynomialOptions = {},
): ScaledRational | null {
  const span = options.spanRadS;
  const cs = span === undefined ? compileStage(topology, values, opamp) : compiledFor(topology, values, opamp, span);
  const v = Float64Array.from(cs.componentNames, (name) => values[name] as number);
  const num = new Float64Array(cs.points);
  const den = new Float64Array(cs.points);
  const radius = 2 * Math.PI * topology.figures(values).f0Hz;
  const r = options.closedForm === false ? genericStagePolynomialsInto(cs, v, radius, num, den) : stagePolynomialsInto(cs, v, radius, num, den);
  if (r === 0) return null;
  return { num: trimmed(num), den: trimmed(den), scale: r };
}
