/**
 * A scaled or as-built LC ladder as a circuit for the nodal analysis and the
 * SPICE netlist: a unit AC source `VS` from node `src` to ground, the source
 * resistance `RS` from `src` to the ladder's input node, every inductor and
 * capacitor between its own nodes (an as-built part with a loss resistance
 * gets it in series, `R_<designator>`, through the node `<designator>_r`),
 * and the load `RL` from the output node to ground. So
 * `v(outputNode) / ac(VS)` is the ladder's transfer V(load) / V(source emf).
 *
 * A lossless bandstop ladder has, exactly at its centre frequency, parallel
 * resonators in series with series resonators and nothing to damp them, so
 * its nodal equations are singular there (`acAnalysis` throws
 * `SingularCircuitError`); analyse beside the centre, or the as-built
 * ladder, whose loss resistances remove the singularity.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireLadderNetwork } from "../ladder/check-ladder.ts";
import type { AsBuiltLadder } from "../ladder/as-built-types.ts";
import type { ScaledLadder } from "../ladder/scaled-types.ts";
import { requireOptions } from "../validate.ts";
import type { Circuit, Element } from "./types.ts";

/** Name of the driving source in a ladder's circuit. */
export const LADDER_SOURCE = "VS";

/** Options of {@link ladderCircuit}. */
export interface LadderCircuitOptions {
  /**
   * Title line of the circuit (and of its SPICE netlist).
   * @defaultValue "LC ladder" with the family, response and order
   */
  readonly title?: string;
}

function defaultTitle(ladder: ScaledLadder | AsBuiltLadder): string {
  const p = (ladder as Partial<ScaledLadder>).placement;
  const response = p !== null && typeof p === "object" && typeof p.response === "string" ? ` ${p.response}` : "";
  const family = typeof ladder.family === "string" ? ` ${ladder.family}` : "";
  const order = typeof ladder.order === "number" && Number.isInteger(ladder.order) ? `, order ${ladder.order}` : "";
  return `LC ladder:${family}${response}${order}`;
}

/**
 * The circuit of a scaled or as-built LC ladder between its terminations,
 * driven by a unit AC source, with named nodes, for {@link acAnalysis} and
 * {@link circuitToSpice}.
 *
 * @param ladder - from `scaleLadder` or `asBuiltLadder` (filterwright/ladder)
 * @param options - title
 * @returns the circuit: `VS`, `RS`, the ladder's parts (and their loss resistances), `RL`
 * @throws {@link InvalidArgumentError} when the ladder is malformed (the path
 *   names the field, e.g. `ladder.components[2].value`) or the title is not a string
 * @example
 * ```ts
 * // prototype: the third-order Butterworth ladder of scaleLadder's example
 * const prototype = { family: "butterworth", order: 3, form: "shunt-first", // g = 1, 2, 1
 *   elements: [{ kind: "shunt-C", value: 1 }, { kind: "series-L", value: 2 }, { kind: "shunt-C", value: 1 }],
 *   sourceOhms: 1, loadOhms: 1, transfer: { ...butterworth(3), gain: 0.5 } } as const;
 * const ladder = scaleLadder(prototype, { edgeHz: 10e6, sourceOhms: 50 });
 * const c = ladderCircuit(ladder);
 * c.elements.map((e) => e.name); //=> ["VS", "RS", "C1", "L1", "C2", "RL"]
 * acAnalysis(c, { source: "VS", outputs: [ladder.outputNode], freqHz }); // the ladder's transfer
 * ```
 */
export function ladderCircuit(ladder: ScaledLadder | AsBuiltLadder, options: LadderCircuitOptions = {}): Circuit {
  const fn = "ladderCircuit";
  const l = requireLadderNetwork(fn, "ladder", ladder);
  const opts = requireOptions(fn, "options", options);
  const title = opts["title"];
  if (title !== undefined && typeof title !== "string") {
    throw new InvalidArgumentError({ fn, path: "options.title", received: title, message: "expected a title string" });
  }
  const elements: Element[] = [
    { kind: "V", name: LADDER_SOURCE, a: "src", b: "0", ac: 1 },
    { kind: "R", name: "RS", a: "src", b: l.inputNode, value: l.sourceOhms },
  ];
  for (const c of l.components) {
    const loss = c.seriesOhms ?? 0;
    if (loss > 0) {
      const mid = `${c.designator}_r`;
      elements.push({ kind: c.kind, name: c.designator, a: c.a, b: mid, value: c.value });
      elements.push({ kind: "R", name: `R_${c.designator}`, a: mid, b: c.b, value: loss });
    } else {
      elements.push({ kind: c.kind, name: c.designator, a: c.a, b: c.b, value: c.value });
    }
  }
  elements.push({ kind: "R", name: "RL", a: l.outputNode, b: "0", value: l.loadOhms });
  return Object.freeze({ title: title ?? defaultTitle(ladder), elements: Object.freeze(elements) });
}
