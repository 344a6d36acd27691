/**
 * Modified nodal analysis (MNA) of a linear circuit in the complex frequency
 * domain.
 *
 * Method: the circuit equations are written as `(G + s C) x = b`, where `x`
 * holds the node voltages (ground excluded) and one branch current per
 * voltage source, VCVS, inductor and op-amp (C.-W. Ho, A. E. Ruehli,
 * P. A. Brennan, "The modified nodal approach to network analysis",
 * IEEE Trans. Circuits Syst. 22(6):504-509, 1975). An ideal op-amp is a nullor:
 * its output current is an unknown and its row imposes `v(+) = v(-)`. The
 * single-pole op-amp `A(s) = a0 / (1 + s/wp)` is written as the row
 * `(1/a0 + s/(2 pi GBW)) (v(out) - rout i) - (v(+) - v(-)) = 0`, which is
 * linear in `s` and well scaled. At each frequency the complex system is
 * solved by LU with partial pivoting (Golub & Van Loan, Matrix Computations,
 * 2013, Alg. 3.4.1); accuracy is that of a backward-stable dense solve.
 *
 * Singular circuits are found first structurally (nodes with no path to
 * ground, loops of voltage-defined branches, and at 0 Hz nodes with no DC
 * path) and otherwise from a vanished pivot, mapped back to the node or
 * branch it stands for.
 *
 * @module
 */
import { InvalidArgumentError, SingularCircuitError } from "../errors.ts";
import type { Complex } from "../math/complex.ts";
import { luDeterminantInto, luFactorInPlace, luSolveInPlace } from "../math/linear.ts";
import { TWO_PI } from "../units/constants.ts";
import type { ComplexResponse } from "../tf/response.ts";
import type { Circuit } from "./types.ts";
import { checkCircuit } from "./validate.ts";
import { applyStamps, elementValues, nodesOf, stampProgram } from "./stamps.ts";


/** The assembled MNA equations `(G + s C) x = b` of a circuit. */
export interface MnaSystem {
  /** Number of unknowns. */
  readonly n: number;
  /** Conductance-like part, row-major `n * n`. */
  readonly g: Float64Array;
  /** Part multiplied by `s`, row-major `n * n`. */
  readonly c: Float64Array;
  /** Names of the unknowns: `"v(node)"` for node voltages, `"i(name)"` for branch currents. */
  readonly unknowns: readonly string[];
  /** Index of each non-ground node's voltage among the unknowns. */
  readonly nodeIndex: ReadonlyMap<string, number>;
  /** Index of each voltage source's branch-current row (where its AC value enters `b`). */
  readonly sourceRow: ReadonlyMap<string, number>;
  /** Non-ground node names, in order of first appearance. */
  readonly nodes: readonly string[];
  /** For each unknown, the non-ground nodes it touches (its node, or its element's terminals). */
  readonly unknownNodes: readonly (readonly string[])[];
}

/** Options of {@link acAnalysis}. */
export interface AcAnalysisOptions {
  /** Name of the voltage source (`V` element) that drives the circuit; its `ac` value is the reference. */
  readonly source: string;
  /** Node names whose transfer from the source is wanted. */
  readonly outputs: readonly string[];
  /** Frequencies in Hz (>= 0). */
  readonly freqHz: Float64Array;
}

/** Result of {@link acAnalysis}. */
export interface AcAnalysisResult {
  /** The frequencies analysed (Hz), as given. */
  readonly freqHz: Float64Array;
  /** For each requested node, `v(node) / ac(source)` at each frequency. */
  readonly outputs: Readonly<Record<string, ComplexResponse>>;
}

/** Options of {@link transfer}. */
export interface TransferOptions {
  /** Name of the driving voltage source. */
  readonly source: string;
  /** Output node name. */
  readonly output: string;
  /** Frequencies in Hz (>= 0). */
  readonly freqHz: Float64Array;
}

class UnionFind {
  private readonly parent = new Map<string, string>();
  find(x: string): string {
    let r = x;
    for (;;) {
      const p = this.parent.get(r);
      if (p === undefined || p === r) break;
      r = p;
    }
    this.parent.set(x, r);
    return r;
  }
  /** Join; false when already joined (a loop). */
  union(a: string, b: string): boolean {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra === rb) return false;
    this.parent.set(ra, rb);
    return true;
  }
}

/** Nodes not reachable from ground through the given edges. */
function unreachable(nodes: readonly string[], edges: readonly (readonly [string, string])[]): string[] {
  const adj = new Map<string, string[]>();
  for (const [a, b] of edges) {
    (adj.get(a) ?? adj.set(a, []).get(a))?.push(b);
    (adj.get(b) ?? adj.set(b, []).get(b))?.push(a);
  }
  const seen = new Set<string>(["0"]);
  const stack = ["0"];
  while (stack.length > 0) {
    const x = stack.pop() as string;
    for (const y of adj.get(x) ?? []) {
      if (!seen.has(y)) {
        seen.add(y);
        stack.push(y);
      }
    }
  }
  return nodes.filter((n) => !seen.has(n));
}

/**
 * Structural singularity checks (internal). Throws {@link SingularCircuitError}.
 *
 * @param fn - public function name
 * @param circuit - a validated circuit
 * @param dc - also check for DC paths (a 0 Hz point is analysed)
 * @returns nothing
 * @throws {@link SingularCircuitError} naming the culprit nodes or elements
 * @example
 * ```ts
 * checkStructure("acAnalysis", circuit, false); // throws when a node floats
 * ```
 */
export function checkStructure(fn: string, circuit: Circuit, dc: boolean): void {
  const nodes = nodesOf(circuit);
  const edges: [string, string][] = [];
  const dcEdges: [string, string][] = [];
  for (const e of circuit.elements) {
    if (e.kind === "OA") {
      edges.push([e.out, "0"]);
      dcEdges.push([e.out, "0"]);
    } else {
      edges.push([e.a, e.b]);
      if (e.kind !== "C") dcEdges.push([e.a, e.b]);
    }
  }
  const floating = unreachable(nodes, edges);
  if (floating.length > 0) {
    throw new SingularCircuitError(
      {
        fn,
        path: "elements",
        received: floating,
        message: `node${floating.length === 1 ? "" : "s"} ${floating.map((n) => `"${n}"`).join(", ")} ha${floating.length === 1 ? "s" : "ve"} no path to ground through any element (an op-amp input or a controlling input draws no current); connect ${floating.length === 1 ? "it" : "them"} or remove the elements that use ${floating.length === 1 ? "it" : "them"}`,
      },
      floating,
    );
  }
  // Loops of voltage-defined branches (sources, VCVS outputs, op-amp outputs; inductors too at DC).
  const uf = new UnionFind();
  for (const e of circuit.elements) {
    let pair: [string, string] | null = null;
    if (e.kind === "V" || e.kind === "E") pair = [e.a, e.b];
    else if (e.kind === "OA") pair = [e.out, "0"];
    else if (e.kind === "L" && dc) pair = [e.a, e.b];
    if (pair !== null && !uf.union(pair[0], pair[1])) {
      const culprits = [...new Set([e.name, ...pair.filter((n) => n !== "0")])];
      throw new SingularCircuitError(
        {
          fn,
          path: "elements",
          received: e.name,
          message: `"${e.name}" closes a loop of voltage sources${dc ? ", inductors" : ""} and op-amp or VCVS outputs between nodes "${pair[0]}" and "${pair[1]}"; the loop current is undetermined, so break the loop with a resistor`,
        },
        culprits,
      );
    }
  }
  if (dc) {
    const noDc = unreachable(nodes, dcEdges);
    if (noDc.length > 0) {
      throw new SingularCircuitError(
        {
          fn,
          path: "freqHz",
          received: 0,
          message: `at 0 Hz node${noDc.length === 1 ? "" : "s"} ${noDc.map((n) => `"${n}"`).join(", ")} connect${noDc.length === 1 ? "s" : ""} to the rest only through capacitors, so ${noDc.length === 1 ? "its" : "their"} DC voltage is undetermined; analyse above 0 Hz or add a DC path`,
        },
        noDc,
      );
    }
  }
}

/**
 * Assemble the MNA equations of a circuit, without validation (internal
 * kernel; {@link acAnalysis} validates first).
 *
 * @param circuit - a valid circuit
 * @returns the system `(G + s C) x = b` and the index maps
 * @throws never
 * @example
 * ```ts
 * assembleMna({ title: "rc", elements: [
 *   { kind: "V", name: "V1", a: "in", b: "0", ac: 1 },
 *   { kind: "R", name: "R1", a: "in", b: "out", value: 1e3 },
 *   { kind: "C", name: "C1", a: "out", b: "0", value: 1e-6 },
 * ] }).unknowns;
 * //=> ["v(in)", "v(out)", "i(V1)"]
 * ```
 */
export function assembleMna(circuit: Circuit): MnaSystem {
  checkCircuit("assembleMna", circuit);
  const p = stampProgram(circuit);
  const g = new Float64Array(p.n * p.n);
  const c = new Float64Array(p.n * p.n);
  applyStamps(p, elementValues(circuit), g, c);
  const { n, unknowns, nodeIndex, sourceRow, nodes, unknownNodes } = p;
  return { n, g, c, unknowns, nodeIndex, sourceRow, nodes, unknownNodes };
}

function singularError(fn: string, sys: MnaSystem, col: number, fHz: number): SingularCircuitError {
  const name = sys.unknowns[col] ?? "?";
  const culprit = name.slice(2, -1);
  const isNode = name.startsWith("v(");
  return new SingularCircuitError(
    {
      fn,
      path: "elements",
      received: fHz,
      message: `the nodal equations are singular at ${fHz} Hz; the ${isNode ? `voltage of node "${culprit}"` : `current of "${culprit}"`} is undetermined (an op-amp without feedback, a source loop, or a cut set of current sources); check the connections around ${isNode ? "it" : `nodes ${(sys.unknownNodes[col] ?? []).map((x) => `"${x}"`).join(", ")}`}`,
    },
    isNode ? [culprit] : [culprit, ...(sys.unknownNodes[col] ?? [])],
  );
}

function checkFrequencies(fn: string, freqHz: unknown): Float64Array {
  if (!(freqHz instanceof Float64Array)) {
    throw new InvalidArgumentError({ fn, path: "options.freqHz", received: freqHz, message: "expected a Float64Array of frequencies in Hz" });
  }
  for (let i = 0; i < freqHz.length; i++) {
    const f = freqHz[i] as number;
    if (!Number.isFinite(f) || f < 0) {
      throw new InvalidArgumentError({ fn, path: `options.freqHz[${i}]`, received: f, message: "expected a finite frequency of 0 Hz or more" });
    }
  }
  return freqHz;
}

/** Options of {@link solveMna}. */
export interface SolveMnaOptions {
  /** Row of the unit right-hand side (a voltage source's branch row; with `transpose`, the output's unknown). */
  readonly sourceRow: number;
  /** Unknown indices whose solution is wanted (-1 for ground, which reads as 0). */
  readonly outputs: readonly number[];
  /** Frequencies in Hz (>= 0). */
  readonly freqHz: Float64Array;
  /**
   * Solve the transposed (adjoint) system `(G + s C)^T y = e` instead: `y_j`
   * is then the transfer from an excitation of row `j` to the unknown `sourceRow`.
   * @defaultValue false
   */
  readonly transpose?: boolean;
  /**
   * The error to throw when the pivot of unknown `unknown` vanishes at `fHz`.
   * @defaultValue a {@link SingularCircuitError} naming the node or branch
   */
  readonly singular?: (unknown: number, fHz: number) => Error;
}

/**
 * Solve an assembled system (or its transpose) at the given frequencies
 * (internal kernel, no checks beyond the pivot test).
 *
 * @param fn - function name for errors
 * @param sys - assembled system
 * @param options - right-hand side row, wanted unknowns, frequencies, transposition
 * @returns one response per output index
 * @throws {@link SingularCircuitError} (or the error of `options.singular`) when a pivot vanishes
 * @example
 * ```ts
 * solveMna("acAnalysis", sys, { sourceRow: 2, outputs: [1], freqHz });
 * ```
 */
export function solveMna(fn: string, sys: MnaSystem, options: SolveMnaOptions): ComplexResponse[] {
  const { n, g, c } = sys;
  const { freqHz, outputs, sourceRow } = options;
  const transpose = options.transpose === true;
  const m = freqHz.length;
  const res = outputs.map(() => ({ re: new Float64Array(m), im: new Float64Array(m) }));
  const ar = new Float64Array(n * n);
  const ai = new Float64Array(n * n);
  const piv = new Int32Array(n);
  const b = { re: new Float64Array(n), im: new Float64Array(n) };
  b.re[sourceRow] = 1;
  const x = { re: new Float64Array(n), im: new Float64Array(n) };
  for (let f = 0; f < m; f++) {
    const fHz = freqHz[f] as number;
    const w = TWO_PI * fHz;
    if (transpose) {
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          ar[j * n + i] = g[i * n + j] as number;
          ai[j * n + i] = w * (c[i * n + j] as number);
        }
      }
    } else {
      ar.set(g);
      for (let i = 0; i < n * n; i++) ai[i] = w * (c[i] as number);
    }
    const bad = luFactorInPlace(n, ar, ai, piv);
    if (bad >= 0) throw options.singular === undefined ? singularError(fn, sys, bad, fHz) : options.singular(bad, fHz);
    luSolveInPlace(n, { re: ar, im: ai, pivots: piv }, b, x);
    for (let o = 0; o < outputs.length; o++) {
      const j = outputs[o] as number;
      const r = res[o] as { re: Float64Array; im: Float64Array };
      if (j >= 0) {
        r.re[f] = x.re[j] as number;
        r.im[f] = x.im[j] as number;
      }
    }
  }
  return res;
}

/**
 * AC analysis by modified nodal analysis: the transfer from a voltage source's
 * AC value to each output node, at each frequency.
 *
 * Other independent sources are set to zero (superposition), so each result
 * is `v(node) / ac(source)` with only `source` driving.
 *
 * @param circuit - the circuit (validated here)
 * @param options - driving source, output nodes and frequencies (Hz)
 * @returns the frequencies and, per output node, the complex transfer
 * @throws {@link InvalidArgumentError} for an invalid circuit (path such as `elements[3].value`),
 *   an unknown source or output node, or negative/non-finite frequencies
 * @throws {@link SingularCircuitError} for a floating node, a loop of voltage-defined branches,
 *   a node without DC path when 0 Hz is analysed, or a vanished pivot; `culprits` names the nodes/elements
 * @example
 * ```ts
 * const rc = { title: "rc", elements: [
 *   { kind: "V", name: "V1", a: "in", b: "0", ac: 1 },
 *   { kind: "R", name: "R1", a: "in", b: "out", value: 1000 },
 *   { kind: "C", name: "C1", a: "out", b: "0", value: 1 / (2000 * Math.PI) },
 * ] } as const;
 * acAnalysis(rc, { source: "V1", outputs: ["out"], freqHz: new Float64Array([1]) }).outputs["out"];
 * //=> { re: Float64Array [0.5], im: Float64Array [-0.5] }
 * ```
 */
export function acAnalysis(circuit: Circuit, options: AcAnalysisOptions): AcAnalysisResult {
  return analyse("acAnalysis", circuit, options);
}

function analyse(fn: string, circuit: Circuit, options: AcAnalysisOptions): AcAnalysisResult {
  checkCircuit(fn, circuit);
  if (options === null || typeof options !== "object") {
    throw new InvalidArgumentError({ fn, path: "options", received: options, message: "expected { source, outputs, freqHz }" });
  }
  const freqHz = checkFrequencies(fn, options.freqHz);
  const src = circuit.elements.find((e) => e.name === options.source);
  if (src === undefined || src.kind !== "V") {
    const vs = circuit.elements.filter((e) => e.kind === "V").map((e) => `"${e.name}"`);
    throw new InvalidArgumentError({
      fn,
      path: "options.source",
      received: options.source,
      message: `expected the name of a voltage source in the circuit (${vs.length > 0 ? vs.join(", ") : "there is none: add a V element"})`,
    });
  }
  if (!Array.isArray(options.outputs)) {
    throw new InvalidArgumentError({ fn, path: "options.outputs", received: options.outputs, message: "expected an array of node names" });
  }
  let dc = false;
  for (let i = 0; i < freqHz.length; i++) if (freqHz[i] === 0) dc = true;
  checkStructure(fn, circuit, dc);
  const sys = assembleMna(circuit);
  const outIdx = options.outputs.map((o, i) => {
    if (o === "0") return -1;
    const j = typeof o === "string" ? sys.nodeIndex.get(o) : undefined;
    if (j === undefined) {
      throw new InvalidArgumentError({
        fn,
        path: `options.outputs[${i}]`,
        received: o,
        message: "expected a node of the circuit (or \"0\" for ground)",
      });
    }
    return j;
  });
  const res = solveMna(fn, sys, { sourceRow: sys.sourceRow.get(src.name) as number, outputs: outIdx, freqHz });
  const outputs: Record<string, ComplexResponse> = {};
  options.outputs.forEach((o, i) => {
    outputs[o] = res[i] as ComplexResponse;
  });
  return { freqHz, outputs };
}

/**
 * Transfer function from a voltage source to one node (convenience over {@link acAnalysis}).
 *
 * @param circuit - the circuit
 * @param options - source, output node, frequencies (Hz)
 * @returns the complex transfer `v(output) / ac(source)` per frequency
 * @throws {@link InvalidArgumentError} as {@link acAnalysis}
 * @throws {@link SingularCircuitError} as {@link acAnalysis}
 * @example
 * ```ts
 * transfer(rc, { source: "V1", output: "out", freqHz: new Float64Array([0]) });
 * //=> { re: Float64Array [1], im: Float64Array [0] }
 * ```
 */
export function transfer(circuit: Circuit, options: TransferOptions): ComplexResponse {
  if (options === null || typeof options !== "object") {
    throw new InvalidArgumentError({ fn: "transfer", path: "options", received: options, message: "expected { source, output, freqHz }" });
  }
  const r = analyse("transfer", circuit, { source: options.source, outputs: [options.output], freqHz: options.freqHz });
  return r.outputs[options.output] as ComplexResponse;
}

/**
 * Determinant of `G + s C` at a complex `s` (for locating natural frequencies),
 * from the product of the LU pivots (kernel, no checks). Meant for stage-sized
 * circuits: for circuits of many dozen unknowns the product can underflow or
 * overflow, so compare it only with other values of the same circuit.
 *
 * @param sys - assembled system
 * @param s - complex frequency (rad/s)
 * @returns the determinant
 * @throws never
 * @example
 * ```ts
 * mnaDeterminant(assembleMna(rc), { re: -1000, im: 0 }); // zero at the RC pole
 * ```
 */
export function mnaDeterminant(sys: MnaSystem, s: Complex): Complex {
  const fn = "mnaDeterminant";
  const size = sys?.n;
  if (typeof size !== "number" || !Number.isInteger(size) || size < 1 || !(sys.g instanceof Float64Array) || !(sys.c instanceof Float64Array) || sys.g.length !== size * size || sys.c.length !== size * size) {
    throw new InvalidArgumentError({ fn, path: "sys", received: sys, message: "expected an MNA system from assembleMna" });
  }
  if (typeof s !== "object" || s === null || !Number.isFinite(s.re) || !Number.isFinite(s.im)) {
    throw new InvalidArgumentError({ fn, path: "s", received: s, message: "expected a complex frequency { re, im } with finite parts" });
  }
  const { n, g, c } = sys;
  const ar = new Float64Array(n * n);
  const ai = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) {
    const ci = c[i] as number;
    ar[i] = (g[i] as number) + s.re * ci;
    ai[i] = s.im * ci;
  }
  const piv = new Int32Array(n);
  const bad = luFactorInPlace(n, ar, ai, piv);
  if (bad >= 0) return { re: 0, im: 0 };
  const det = new Float64Array(2);
  luDeterminantInto(n, ar, ai, piv, det);
  return { re: det[0] as number, im: det[1] as number };
}
