/**
 * The pole a built stage really has with a finite-gain op-amp model.
 *
 * Method: the stage's own elements (from `Topology.elements`) are analysed by
 * modified nodal analysis and the natural frequency nearest the ideal pole is
 * found as a zero of `det(G + s C)` by Muller's method (D. E. Muller, "A
 * method for solving algebraic equations using an automatic computer", MTAC
 * 10:208-215, 1956), to about 1e-13 relative.
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import { checkCircuit } from "../circuit/validate.ts";
import { ConvergenceError, InvalidArgumentError } from "../errors.ts";
import { circuitPole, checkValues } from "./common.ts";
import type { ComponentValues, Topology } from "./types.ts";

/** The pole of a built stage: frequency and, for a second-order stage, Q. */
export interface AsBuiltPole {
  /** Pole frequency `|p| / 2 pi` in Hz. */
  readonly f0Hz: number;
  /** Pole Q `|p| / (-2 Re p)` (second-order stages only; negative means unstable). */
  readonly q?: number;
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
  checkValues(fn, topology.componentNames, values);
  const circuit = checkCircuit(fn, {
    title: topology.name,
    elements: [
      { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
      ...topology.elements(values, { input: "in", output: "out", nodePrefix: "x_", opamp }),
    ],
  });
  const ideal = topology.figures(values);
  const p = circuitPole(circuit, topology.order, ideal);
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
