/**
 * Shared pieces of the stage-polynomial property tests: the nodal-analysis
 * reference of a stage, a design's values spread part by part, the check
 * that the result is a buildable board, and the op-amp model of a case.
 */
import fc from "fast-check";
import { acAnalysis } from "../../src/circuit/mna.ts";
import type { Element, OpAmpModel } from "../../src/circuit/types.ts";
import type { ComponentValues, Topology } from "../../src/topologies/types.ts";
import { realisableArb } from "../topologies/arbitraries.ts";

/** MNA of the topology's own elements, driven by Vin at "in", output "out": the reference. */
export function mnaOf(topo: Topology, v: ComponentValues, freqHz: Float64Array, opamp: OpAmpModel) {
  const elements: Element[] = [
    { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
    ...topo.elements(v, { input: "in", output: "out", nodePrefix: "k_", opamp }),
  ];
  return acAnalysis({ title: topo.id, elements }, { source: "Vin", outputs: ["out"], freqHz }).outputs["out"]!;
}

/** The design's values, each part multiplied by its entry of `spread` (cyclically). */
export function spreadValues(topo: Topology, v0: ComponentValues, spread: readonly number[]): Record<string, number> {
  const v: Record<string, number> = {};
  topo.componentNames.forEach((n, i) => {
    v[n] = (v0[n] as number) * (spread[i % spread.length] as number);
  });
  return v;
}

/**
 * Boards only: a resistor below 1 ohm (a gain resistor for K = 1 + 1e-9) is a wire, not a part,
 * and its 1e11 conductance spread is beyond what any double-precision nodal solution resolves.
 */
export function isBoard(topo: Topology, v: ComponentValues): boolean {
  return topo.componentNames.every((n) => !n.startsWith("R") || (v[n]! >= 1 && v[n]! <= 1e9));
}

/** The op-amp model of a case: DC gain 10^a0Log, GBW f0 10^gbwLog, output resistance `rout` for the third kind. */
export function opampOf(model: "ideal" | "single-pole" | "single-pole-rout", f0Hz: number, a0Log: number, gbwLog: number, rout: number): OpAmpModel {
  if (model === "ideal") return { kind: "ideal" };
  const a0 = 10 ** a0Log;
  const gbwHz = f0Hz * 10 ** gbwLog;
  return model === "single-pole" ? { kind: "single-pole", a0, gbwHz } : { kind: "single-pole-rout", a0, gbwHz, routOhm: rout };
}

/**
 * A random case of a topology's stage: a realisable design, a part-by-part
 * spread of its values, test frequencies (decades about f0) and an op-amp
 * model (see {@link opampOf}).
 */
export const stageCaseArb = (topo: Topology) =>
  fc.record({
    design: realisableArb(topo),
    spread: fc.array(fc.double({ min: 0.7, max: 1.4, noNaN: true }), { minLength: 12, maxLength: 12 }),
    freqs: fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { minLength: 1, maxLength: 8 }),
    model: fc.constantFrom("ideal", "single-pole", "single-pole-rout"),
    a0Log: fc.double({ min: 3, max: 7, noNaN: true }),
    gbwLog: fc.double({ min: 0.5, max: 4, noNaN: true }),
    rout: fc.double({ min: 1, max: 200, noNaN: true }),
  });

/** A case's board: its spread values, op-amp and test frequencies (Hz), or null when the values are no buildable board. */
export function boardOfCase(topo: Topology, c: StageCase): { v: Record<string, number>; opamp: OpAmpModel; freqHz: Float64Array } | null {
  const v = spreadValues(topo, topo.design(c.design.target, c.design.choices), c.spread);
  if (!isBoard(topo, v)) return null;
  const f0 = c.design.target.f0Hz;
  return { v, opamp: opampOf(c.model, f0, c.a0Log, c.gbwLog, c.rout), freqHz: Float64Array.from(c.freqs.map((x) => f0 * 10 ** x)) };
}

/** One value of {@link stageCaseArb}. */
export type StageCase = ReturnType<typeof stageCaseArb> extends fc.Arbitrary<infer T> ? T : never;
