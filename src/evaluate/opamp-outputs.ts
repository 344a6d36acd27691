/**
 * A stage's as-built transfer functions from its input to EVERY op-amp
 * output, the internal nodes of multi-amplifier stages (state-variable,
 * Tow-Thomas, the summed forms) included, as real rational functions.
 *
 * Method: the stage's nodal equations `(G + s C) x = b` share one
 * determinant `D(s) = det(G + s C)`; by Cramer's rule the voltage of any node
 * is `N_k(s) / D(s)` with `N_k = D x_k` a polynomial of degree at most the
 * number of rows of `C` that hold a stamp (C.-W. Ho, A. E. Ruehli,
 * P. A. Brennan, "The modified nodal approach to network analysis", IEEE
 * Trans. Circuits Syst. 22(6):504-509, 1975). Each op-amp output node is
 * compiled as the output of the stage's stamp program and its polynomials
 * recovered by the sampling on circles of src/evaluate/stage-polynomials.ts
 * (interpolation at roots of unity, J. W. Cooley & J. W. Tukey, Math. Comp.
 * 19:297-301, 1965). The op-amp that drives the stage output takes the
 * stage's own polynomials (the topology's closed form where it has one), so
 * its figures are the very ones the mask check uses. An internal node always
 * takes the default circles (two decades about the stage's f0, up to past the
 * op-amps' bandwidth), whatever span is asked: far below f0 its voltage is a
 * small difference of larger ones (an integrator loop's highpass node goes as
 * s^2), the samples there carry rounding noise far above that circle's
 * measured floor, and coefficients taken from them are wrong by many orders
 * (seen on wide bandstop designs before this rule).
 *
 * Accuracy: that of the generic path, better than 1e-10 relative over four
 * decades about the stage's f0 against the nodal analysis of the same
 * elements (test/evaluate/opamp-outputs.test.ts checks 1e-9 dB). Beyond
 * them (a wide bandstop's mask reaching three decades past a low f0, with a
 * slow op-amp) an internal node's coefficients can be wrong by tens of dB, so
 * when a span is asked every internal transfer is spot-checked against the
 * nodal analysis at seven log-spaced frequencies across it, and the stage
 * gives null (its caller samples by nodal analysis instead) when any differs
 * by more than 1e-6 relative.
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import type { ComponentValues, Topology } from "../topologies/types.ts";
import {
  compileStage,
  genericStagePolynomialsInto,
  INTERNAL_NODE_PREFIX,
  stageElements,
  stagePolynomials,
} from "./stage-polynomials.ts";
import type { ScaledRational } from "./types.ts";
import { acAnalysis } from "../circuit/mna.ts";
import { magnitudeSquaredAt } from "./cascade.ts";

/** One op-amp output of a stage and the transfer function to it. */
export interface OpampOutput {
  /** The op-amp's local designator in the topology (`U1`, `U2`, ...). */
  readonly opamp: string;
  /** Its position among the stage's op-amps, in the order of the stage's elements (from 0). */
  readonly index: number;
  /** The topology's local name of the node it drives (`"out"` for the stage output). */
  readonly node: string;
  /** The transfer function from the stage input to that node. */
  readonly transfer: ScaledRational;
}

/** The op-amps of a stage in element order, with the local node each drives. */
export function opampNodes(topology: Topology, values: ComponentValues, opamp: OpAmpModel): { readonly opamp: string; readonly node: string }[] {
  const out: { opamp: string; node: string }[] = [];
  for (const e of stageElements(topology, values, opamp)) {
    if (e.kind !== "OA") continue;
    out.push({ opamp: e.name, node: e.out === "out" ? "out" : e.out.slice(INTERNAL_NODE_PREFIX.length) });
  }
  return out;
}

/** Copy without the leading zeros (the constant term stays). */
function trimmed(a: Float64Array): Float64Array {
  let first = 0;
  while (first < a.length - 1 && a[first] === 0) first++;
  return a.slice(first);
}

/** The transfer function from the stage input to one internal node, by the generic path; null when singular. */
function internalTransfer(
  topology: Topology,
  values: ComponentValues,
  opamp: OpAmpModel,
  node: string,
): ScaledRational | null {
  const cs = compileStage(topology, values, opamp, [0, 0], node);
  const v = Float64Array.from(cs.componentNames, (name) => values[name] as number);
  const num = new Float64Array(cs.points);
  const den = new Float64Array(cs.points);
  const r = genericStagePolynomialsInto(cs, v, 2 * Math.PI * topology.figures(values).f0Hz, num, den);
  return r === 0 ? null : { num: properNumerator(trimmed(num), trimmed(den).length), den: trimmed(den), scale: r };
}

/**
 * The numerator without the sampled interpolation's noise above the
 * denominator's degree: a node of an RC network with op-amps stays bounded at
 * infinite frequency (capacitors become shorts), so its transfer function is
 * proper, and numerator coefficients above the denominator's degree are
 * interpolation noise; they are dropped when below 1e-6 of the largest
 * coefficient (kept otherwise, so a genuine term is never lost). Left in, such
 * noise made an internal node of a state-variable stage read 142 dB at the top
 * of the peak span.
 */
function properNumerator(num: Float64Array, denLength: number): Float64Array {
  if (num.length <= denLength) return num;
  let big = 0;
  for (const x of num) big = Math.max(big, Math.abs(x));
  let first = 0;
  while (num.length - first > denLength && Math.abs(num[first] as number) <= 1e-6 * big) first++;
  return first === 0 ? num : num.slice(first);
}

/**
 * The as-built transfer function from a stage's input to each of its op-amp
 * outputs (see the module header). Internal: no checks (the topology and
 * values come from the design layer or a checked caller).
 *
 * @param topology - the stage's topology
 * @param values - its component values
 * @param opamp - op-amp model for every op-amp of the stage
 * @param spanRadS - angular frequencies where the stage output's polynomials
 *   will be evaluated (as for `stagePolynomials`); by default two decades about
 *   the stage's f0 (internal nodes always take that default, see the module header)
 * @returns one entry per op-amp, in element order; null when the stage's equations are singular
 */
export function opampOutputTransfers(
  topology: Topology,
  values: ComponentValues,
  opamp: OpAmpModel,
  spanRadS?: readonly [number, number],
): OpampOutput[] | null {
  const out: OpampOutput[] = [];
  let index = 0;
  for (const { opamp: name, node } of opampNodes(topology, values, opamp)) {
    const transfer =
      node === "out"
        ? stagePolynomials(topology, values, opamp, spanRadS === undefined ? {} : { spanRadS })
        : internalTransfer(topology, values, opamp, node);
    if (transfer === null) return null;
    out.push({ opamp: name, index: index++, node, transfer });
  }
  if (spanRadS !== undefined && spanRadS[1] > 0 && out.some((o) => o.node !== "out") && !internalTransfersHold(topology, values, opamp, spanRadS, out)) return null;
  return out;
}

/** Whether every internal transfer agrees with the stage's nodal analysis at seven frequencies across the span (1e-6 relative). */
function internalTransfersHold(topology: Topology, values: ComponentValues, opamp: OpAmpModel, span: readonly [number, number], outs: readonly OpampOutput[]): boolean {
  const internal = outs.filter((o) => o.node !== "out");
  const lo = Math.max(span[0], span[1] * 1e-9);
  const freqHz = Float64Array.from({ length: 7 }, (_, i) => (lo * (span[1] / lo) ** (i / 6)) / (2 * Math.PI));
  let r;
  try {
    r = acAnalysis({ title: "stage", elements: stageElements(topology, values, opamp) }, { freqHz, source: "Vin", outputs: internal.map((o) => INTERNAL_NODE_PREFIX + o.node) });
  } catch {
    return false;
  }
  for (const o of internal) {
    const v = r.outputs[INTERNAL_NODE_PREFIX + o.node];
    if (v === undefined) return false;
    for (let i = 0; i < freqHz.length; i++) {
      const m = Math.hypot(v.re[i] as number, v.im[i] as number);
      const p = Math.sqrt(magnitudeSquaredAt([o.transfer], 2 * Math.PI * (freqHz[i] as number)));
      if (!(Math.abs(p - m) <= 1e-6 * Math.max(m, 1e-12))) return false;
    }
  }
  return true;
}
