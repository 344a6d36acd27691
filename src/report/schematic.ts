/**
 * Schematics of a design's stages as SVG 1.1, drawn from each stage's own
 * element list (the topology's parts with the design's preferred values),
 * with the designators of the BOM and the values in engineering notation.
 * Sallen-Key, multiple-feedback and the three-amplifier state-variable and
 * Tow-Thomas stages are drawn as they usually are (per-topology templates,
 * src/report/schematic/templates/); every other topology by a generic
 * layout with one line per node (src/report/schematic/generic.ts). Whatever draws a
 * stage, the drawing is checked net by net against the element list before
 * it is used (src/report/schematic/connectivity.ts).
 *
 * @module
 */
import type { Element } from "./../circuit/types.ts";
import type { DesignResult } from "../design/index.ts";
import { requireDesignResult } from "../design/check.ts";
import { InvalidArgumentError } from "../errors.ts";
import { getTopology } from "../topologies/index.ts";
import { requireInteger, requireOptions } from "../validate.ts";
import { renderSheet } from "./schematic/render.ts";
import { joinedSheets, stageSheet } from "./schematic/layout.ts";

/** Options of {@link toSvgSchematic}. */
export interface SvgSchematicOptions {
  /**
   * The stage to draw, from 1; leave it out for the whole cascade, stages
   * side by side, each output wired to the next input.
   * @defaultValue every stage
   */
  readonly stage?: number;
}

/** A stage's elements with the design's designators, nodes named as in its topology. */
export function stageElementsOf(result: DesignResult, index: number): readonly Element[] {
  const st = result.stages[index] as DesignResult["stages"][number];
  const topology = getTopology(st.topology);
  const local: Record<string, number> = {};
  const toGlobal = new Map<string, string>();
  for (const [global, name] of Object.entries(st.localNames)) {
    local[name] = st.components[global] as number;
    toGlobal.set(name, global);
  }
  const spare = [...st.opamps];
  const rename = (name: string): string => {
    const g = toGlobal.get(name);
    if (g !== undefined) return g;
    const u = spare.shift() ?? name;
    toGlobal.set(name, u);
    return u;
  };
  return topology.elements(local, { input: "in", output: "out", nodePrefix: "", rename, opamp: { kind: "ideal" } });
}

/**
 * Draw the schematic of one stage of a design, or of the whole cascade (see
 * the module header).
 *
 * @param result - a design
 * @param options - which stage
 * @returns SVG text
 * @throws {@link InvalidArgumentError} when `result` is not a design result or `stage` is not a stage number
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const result = designFilter(spec);
 * const svg = toSvgSchematic(result, { stage: 1 });
 * svg.startsWith("<svg"); //=> true
 * svg.includes(">R1<"); //=> true (each part's designator, as in the BOM)
 * ```
 */
export function toSvgSchematic(result: DesignResult, options?: SvgSchematicOptions): string {
  const fn = "toSvgSchematic";
  requireDesignResult(fn, result);
  const o = requireOptions(fn, "options", options);
  const n = result.stages.length;
  if (o["stage"] !== undefined) {
    const k = requireInteger(fn, "options.stage", o["stage"], { min: 1, max: Math.max(1, n) });
    const st = result.stages[k - 1];
    if (st === undefined) throw new InvalidArgumentError({ fn, path: "options.stage", received: k, message: `expected a stage from 1 to ${n}` });
    const { sheet } = stageSheet(st.topology, stageElementsOf(result, k - 1));
    return renderSheet(sheet, `Stage ${k}: ${st.topologyName}`);
  }
  const sheets = result.stages.map((st, i) => ({ sheet: stageSheet(st.topology, stageElementsOf(result, i)).sheet, caption: `stage ${i + 1}: ${st.topologyName}` }));
  return renderSheet(joinedSheets(sheets), `${result.family} ${result.spec.response}, ${result.filterOrder} poles: ${n} stage${n === 1 ? "" : "s"}`);
}
