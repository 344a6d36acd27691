/**
 * The modified nodal analysis of a circuit as a stamp program: the list of
 * matrix entries each element adds to `G + s C`, and how each entry depends
 * on the element's value. {@link assembleMna} applies the program once with
 * the circuit's own values; the evaluation layer applies it once per board
 * with drawn values, without building element objects, maps or strings.
 *
 * Method: the usual MNA stamps (C.-W. Ho, A. E. Ruehli, P. A. Brennan, "The
 * modified nodal approach to network analysis", IEEE Trans. Circuits Syst.
 * 22(6):504-509, 1975): a conductance 1/R or a capacitance C between two
 * nodes, one branch-current row per voltage source, inductor, VCVS and op-amp;
 * the single-pole op-amp row is `(1/a0 + s tau)(v_out - rout i) = v+ - v-`
 * with `tau = 1 / (2 pi GBW)`. Exact: the entries are the same sums, in the
 * same order, as a direct assembly.
 *
 * @module
 */
import type { Circuit } from "./types.ts";
import { TWO_PI } from "../units/constants.ts";

/** How a stamp's value follows its element's value `x`. */
export const STAMP_LAW = {
  /** The coefficient alone (topology constants, op-amp model terms). */
  constant: 0,
  /** `coefficient / x` (a resistor's conductance). */
  reciprocal: 1,
  /** `coefficient * x` (a capacitance, an inductance, a VCVS gain). */
  proportional: 2,
} as const;

/** The stamps of a circuit's MNA equations, in assembly order (flat arrays, one entry per stamp). */
export interface StampProgram {
  /** Number of unknowns (node voltages, then branch currents). */
  readonly n: number;
  /** Non-ground node names, in order of first appearance. */
  readonly nodes: readonly string[];
  /** Index of each non-ground node's voltage among the unknowns. */
  readonly nodeIndex: ReadonlyMap<string, number>;
  /** Names of the unknowns: `"v(node)"`, `"i(name)"`. */
  readonly unknowns: readonly string[];
  /** For each unknown, the non-ground nodes it touches. */
  readonly unknownNodes: readonly (readonly string[])[];
  /** Branch row of each voltage source. */
  readonly sourceRow: ReadonlyMap<string, number>;
  /** 0 when the stamp adds to `G`, 1 when it adds to `C`. */
  readonly matrix: Uint8Array;
  /** Row-major entry `row * n + col` the stamp adds to. */
  readonly entry: Int32Array;
  /** Index of the element (in `circuit.elements`) whose value the stamp follows; -1 for a constant. */
  readonly element: Int32Array;
  /** One of {@link STAMP_LAW}. */
  readonly law: Uint8Array;
  /** The stamp's coefficient. */
  readonly coefficient: Float64Array;
}

/**
 * The element values a stamp program reads, in element order: a resistor's,
 * capacitor's or inductor's `value`, a VCVS's `gain`, 0 otherwise.
 *
 * @param circuit - the circuit the program was made from
 * @returns one value per element
 */
export function elementValues(circuit: Circuit): Float64Array {
  const out = new Float64Array(circuit.elements.length);
  circuit.elements.forEach((e, i) => {
    if (e.kind === "R" || e.kind === "C" || e.kind === "L") out[i] = e.value;
    else if (e.kind === "E") out[i] = e.gain;
  });
  return out;
}

/**
 * The circuit's non-ground nodes in order of first appearance (op-amps list
 * their inputs before the output).
 *
 * @param circuit - the circuit
 * @returns node names
 */
export function nodesOf(circuit: Circuit): string[] {
  const seen = new Set<string>();
  const out: string[] = [];
  const add = (n: string): void => {
    if (n !== "0" && !seen.has(n)) {
      seen.add(n);
      out.push(n);
    }
  };
  for (const e of circuit.elements) {
    if (e.kind === "OA") {
      add(e.inP);
      add(e.inN);
      add(e.out);
    } else if (e.kind === "E") {
      add(e.a);
      add(e.b);
      add(e.cp);
      add(e.cn);
    } else {
      add(e.a);
      add(e.b);
    }
  }
  return out;
}

/** The unknowns after the node voltages: one branch current per V, L, E and op-amp, in element order. */
function branchUnknowns(circuit: Circuit, unknowns: string[], unknownNodes: string[][]): void {
  for (const e of circuit.elements) {
    if (e.kind === "V" || e.kind === "L") {
      unknowns.push(`i(${e.name})`);
      unknownNodes.push([e.a, e.b].filter((x) => x !== "0"));
    } else if (e.kind === "E") {
      unknowns.push(`i(${e.name})`);
      unknownNodes.push([...new Set([e.a, e.b, e.cp, e.cn])].filter((x) => x !== "0"));
    } else if (e.kind === "OA") {
      unknowns.push(`i(${e.name})`);
      unknownNodes.push([...new Set([e.out, e.inP, e.inN])].filter((x) => x !== "0"));
    }
  }
}

/**
 * The stamp program of a circuit (no checks: the caller has validated the
 * circuit, e.g. with `checkCircuit`).
 *
 * @param circuit - a valid circuit
 * @returns the program
 */
export function stampProgram(circuit: Circuit): StampProgram {
  const nodes = nodesOf(circuit);
  const nodeIndex = new Map<string, number>();
  nodes.forEach((node, i) => nodeIndex.set(node, i));
  const unknowns = nodes.map((v) => `v(${v})`);
  const unknownNodes: string[][] = nodes.map((v) => [v]);
  branchUnknowns(circuit, unknowns, unknownNodes);
  const n = unknowns.length;
  const matrix: number[] = [];
  const entry: number[] = [];
  const element: number[] = [];
  const law: number[] = [];
  const coefficient: number[] = [];
  const sourceRow = new Map<string, number>();
  const idx = (node: string): number => (node === "0" ? -1 : (nodeIndex.get(node) as number));
  const add = (m: 0 | 1, i: number, j: number, el: number, how: number, c: number): void => {
    if (i < 0 || j < 0) return;
    matrix.push(m);
    entry.push(i * n + j);
    element.push(el);
    law.push(how);
    coefficient.push(c);
  };
  const admittance = (m: 0 | 1, a: number, b: number, el: number, how: number): void => {
    add(m, a, a, el, how, 1);
    add(m, b, b, el, how, 1);
    add(m, a, b, el, how, -1);
    add(m, b, a, el, how, -1);
  };
  const { constant, reciprocal, proportional } = STAMP_LAW;
  let k = nodes.length;
  circuit.elements.forEach((e, el) => {
    switch (e.kind) {
      case "R":
        admittance(0, idx(e.a), idx(e.b), el, reciprocal);
        break;
      case "C":
        admittance(1, idx(e.a), idx(e.b), el, proportional);
        break;
      case "L":
      case "V":
      case "E": {
        const a = idx(e.a);
        const b = idx(e.b);
        // The branch current flows from a through the element to b.
        add(0, a, k, -1, constant, 1);
        add(0, b, k, -1, constant, -1);
        add(0, k, a, -1, constant, 1);
        add(0, k, b, -1, constant, -1);
        if (e.kind === "L") add(1, k, k, el, proportional, -1);
        if (e.kind === "V") sourceRow.set(e.name, k);
        if (e.kind === "E") {
          add(0, k, idx(e.cp), el, proportional, -1);
          add(0, k, idx(e.cn), el, proportional, 1);
        }
        k++;
        break;
      }
      case "OA": {
        const o = idx(e.out);
        // Current i_k flows from the output node into the op-amp.
        add(0, o, k, -1, constant, 1);
        add(0, k, idx(e.inP), -1, constant, 1);
        add(0, k, idx(e.inN), -1, constant, -1);
        const m = e.model;
        if (m.kind !== "ideal") {
          const rout = m.kind === "single-pole-rout" ? m.routOhm : 0;
          const tau = 1 / (TWO_PI * m.gbwHz);
          // (1/a0 + s tau)(v_out - rout i) - (v+ - v-) = 0, written with the sign of v+ - v- flipped.
          add(0, k, o, -1, constant, -1 / m.a0);
          add(1, k, o, -1, constant, -tau);
          add(0, k, k, -1, constant, rout / m.a0);
          add(1, k, k, -1, constant, rout * tau);
        }
        k++;
        break;
      }
      default:
        break;
    }
  });
  return {
    n,
    nodes,
    nodeIndex,
    unknowns,
    unknownNodes,
    sourceRow,
    matrix: Uint8Array.from(matrix),
    entry: Int32Array.from(entry),
    element: Int32Array.from(element),
    law: Uint8Array.from(law),
    coefficient: Float64Array.from(coefficient),
  };
}

/**
 * Fill `g` and `c` (row-major `n * n`, overwritten) from a stamp program and
 * one value per element (no checks; the hot path of per-board evaluation).
 *
 * @param p - the program
 * @param values - element values, as {@link elementValues} orders them
 * @param g - the conductance-like matrix, written
 * @param c - the matrix multiplied by `s`, written
 */
export function applyStamps(p: StampProgram, values: Float64Array, g: Float64Array, c: Float64Array): void {
  g.fill(0);
  c.fill(0);
  const { matrix, entry, element, law, coefficient } = p;
  for (let i = 0; i < entry.length; i++) {
    const l = law[i] as number;
    const k = coefficient[i] as number;
    const el = element[i] as number;
    // Written as the direct assembly writes it: +-(1/x), +-x, or the constant.
    const v = l === 0 ? k : l === 1 ? (k === 1 ? 1 / (values[el] as number) : -(1 / (values[el] as number))) : k === 1 ? (values[el] as number) : k === -1 ? -(values[el] as number) : k * (values[el] as number);
    const m = matrix[i] === 0 ? g : c;
    const at = entry[i] as number;
    m[at] = (m[at] as number) + v;
  }
}
