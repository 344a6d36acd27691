/**
 * The whole cascade of a design as one circuit: a 1 V AC source drives node
 * `in`, the stages follow with unique designators, and the last stage drives
 * node `out`.
 *
 * @module
 */
import type { Circuit, Element, OpAmpModel } from "../circuit/types.ts";
import { getTopology } from "../topologies/index.ts";
import type { DesignResult, DesignStage } from "./types.ts";
import { requireDesignResult } from "./check.ts";

/** Options of {@link designCircuit}. */
export interface DesignCircuitOptions {
  /**
   * Op-amp model for every op-amp.
   * @defaultValue the model in the design's spec
   */
  readonly opamp?: OpAmpModel;
  /**
   * Name of the driving source.
   * @defaultValue `"Vin"`
   */
  readonly sourceName?: string;
}

/**
 * Build the circuit of a design: source `Vin` (AC 1 V) from `in` to ground,
 * then every stage, the last one driving `out`. Internal nodes are named
 * `n1`, `n2`, ... between stages and `s<k>_...` inside stage k.
 *
 * @param result - a design
 * @param options - op-amp model and source name
 * @returns the circuit
 * @throws {@link InvalidArgumentError} when a stage names an unknown topology
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const c = designCircuit(designFilter(spec));
 * c.elements[0]; //=> { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }
 * ```
 */
export function designCircuit(result: DesignResult, options: DesignCircuitOptions = {}): Circuit {
  requireDesignResult("designCircuit", result);
  const elements = stagesElements(result.stages, options.opamp ?? result.spec.opamp, options.sourceName ?? "Vin");
  return { title: `filterwright ${result.family} ${result.spec.response}, order ${result.filterOrder}`, elements };
}

/**
 * The element list of a cascade of designed stages (internal: the stages are
 * checked): the source into node `in`, stage i from `n{i-1}` to `n{i}`, the
 * last into `out`, each stage's parts and op-amps under their designators.
 *
 * @param stages - the stages, in cascade order
 * @param opamp - the op-amp model of every op-amp
 * @param source - the name of the driving source
 * @returns the elements
 */
export function stagesElements(stages: readonly DesignStage[], opamp: OpAmpModel, source: string): Element[] {
  const elements: Element[] = [{ kind: "V", name: source, a: "in", b: "0", ac: 1 }];
  const n = stages.length;
  stages.forEach((stage, i) => {
    const topology = getTopology(stage.topology);
    const local: Record<string, number> = {};
    const toGlobal = new Map<string, string>();
    for (const [global, name] of Object.entries(stage.localNames)) {
      local[name] = stage.components[global] as number;
      toGlobal.set(name, global);
    }
    const spare = [...stage.opamps];
    const rename = (name: string): string => {
      const g = toGlobal.get(name);
      if (g !== undefined) return g;
      const u = spare.shift() ?? `${name}_S${i + 1}`;
      toGlobal.set(name, u);
      return u;
    };
    const input = i === 0 ? "in" : `n${i}`;
    const output = i === n - 1 ? "out" : `n${i + 1}`;
    elements.push(...topology.elements(local, { input, output, nodePrefix: `s${i + 1}_`, rename, opamp }));
  });
  return elements;
}
