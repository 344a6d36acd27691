/**
 * SPICE netlist of a whole design.
 *
 * @module
 */
import { circuitToSpice, type OpampSubcircuit } from "../circuit/index.ts";
import { designCircuit, responseSpanHz, type DesignResult } from "../design/index.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import { requireDesignResult } from "../design/check.ts";
import { requireOptions } from "../validate.ts";
import { InvalidArgumentError } from "../errors.ts";
import { maskCheckCards } from "./spice-measure.ts";
import { ladderComments, realisationOption, type RealisationChoice } from "./realisation.ts";

/** Options of {@link toSpiceNetlist}. */
export interface SpiceNetlistOptions {
  /**
   * Points per decade of the `.ac` sweep.
   * @defaultValue 50
   */
  readonly pointsPerDecade?: number;
  /**
   * Sweep start, Hz.
   * @defaultValue a decade below the lowest edge of the spec
   */
  readonly startHz?: number;
  /**
   * Sweep stop, Hz.
   * @defaultValue a decade above the highest edge of the spec
   */
  readonly stopHz?: number;
  /**
   * Op-amp model written into the netlist.
   * @defaultValue the design's op-amp (ideal: a VCVS of gain 1e9)
   */
  readonly opamp?: OpAmpModel;
  /**
   * An op-amp subcircuit of your own (a vendor macromodel, say) that every
   * op-amp instantiates, with its pin order and, when it has supply pins, the
   * rails; replaces `opamp` in the netlist. The netlist's signals sit at 0 V,
   * so a model with supply pins needs split rails.
   * @defaultValue the built-in model of `opamp`
   */
  readonly opampSubcircuit?: OpampSubcircuit;
  /**
   * Write the mask check: a `.control` block (ngspice's control language) that
   * runs the sweep and prints the passband loss, the passband level and the
   * stopband attenuation beside the spec's limits. `false` leaves it out (for
   * other simulators, or to add your own analyses); the `.print ac vdb(out)
   * vp(out)` card is written either way.
   * @defaultValue true
   */
  readonly measure?: boolean;
  /**
   * A realisation from `compareRealisations(result)`: the netlist of its
   * circuit (an active ladder as built, with the op-amp model it was built
   * with; `opamp` does not apply) instead of the design's cascade. The mask
   * check then reads the ladder's output node.
   * @defaultValue the realisation the design chose (`result.realisation`, from a spec's
   *   `realisation: "auto"` or `"active-ladder"`), else the design's own cascade
   */
  readonly realisation?: RealisationChoice;
}

/**
 * The SPICE netlist of a design's whole cascade: `Vin` drives node `in` with
 * AC 1 V, the filter's output node is `out`, an `.ac` card sweeps the span
 * of the mask, a `.print` card lists the output's level and phase, and
 * (unless `measure: false`) a `.control` block measures the
 * mask figures, so `ngspice -b` on the file prints the passband loss, level
 * and stopband attenuation beside the spec's limits.
 *
 * @param result - a design from `designFilter`
 * @param options - sweep and op-amp model
 * @returns netlist text ending in `.end`
 * @throws {@link InvalidArgumentError} when the sweep options are invalid
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const text = toSpiceNetlist(designFilter(spec));
 * text.split("\n").includes("Vin in 0 DC 0 AC 1"); //=> true
 * ```
 */
export function toSpiceNetlist(result: DesignResult, options: SpiceNetlistOptions = {}): string {
  const fn = "toSpiceNetlist";
  requireDesignResult(fn, result);
  requireOptions(fn, "options", options);
  if (options.measure !== undefined && typeof options.measure !== "boolean") {
    throw new InvalidArgumentError({ fn, path: "options.measure", received: options.measure, message: "expected true (write the mask check) or false" });
  }
  const [lo, hi] = responseSpanHz(result.spec);
  const ac = { pointsPerDecade: options.pointsPerDecade ?? 50, startHz: options.startHz ?? lo, stopHz: options.stopHz ?? hi };
  const sub = options.opampSubcircuit === undefined ? {} : { opampSubcircuit: options.opampSubcircuit };
  const realisation = realisationOption(fn, options, result);
  if (realisation?.ladder !== undefined) {
    const l = realisation.ladder;
    return circuitToSpice(l.circuit, {
      ac,
      comments: ladderComments(result, realisation),
      ...sub,
      cards: [`.print ac vdb(${l.output}) vp(${l.output})`, ...(options.measure === false ? [] : maskCheckCards(result, [ac.startHz, ac.stopHz], l.output))],
    });
  }
  const circuit = designCircuit(result, options.opamp === undefined ? {} : { opamp: options.opamp });
  const v = result.verification;
  const comments = [
    `${result.family} ${result.spec.response}, ${result.filterOrder} poles, ${result.stages.length} stage(s); designed by filterwright`,
    `as built: passband loss ${v.passbandLossDb.toFixed(3)} dB, stopband attenuation ${v.stopbandAttenuationDb.toFixed(2)} dB, ${v.meetsSpec ? "meets" : "MISSES"} the mask (worst margin ${v.marginDb.toFixed(3)} dB)`,
    "input node: in (driven by Vin, AC 1 V); output node: out",
    ...result.stages.map((s) => `stage ${s.index}: ${s.topologyName} (${s.topology}), ${Object.keys(s.components).join(" ")} ${s.opamps.join(" ")}`),
  ];
  return circuitToSpice(circuit, {
    ac,
    comments,
    ...sub,
    cards: [".print ac vdb(out) vp(out)", ...(options.measure === false ? [] : maskCheckCards(result, [ac.startHz, ac.stopHz]))],
  });
}
