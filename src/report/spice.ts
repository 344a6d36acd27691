/**
 * SPICE netlist of a whole design.
 *
 * @module
 */
import { circuitToSpice } from "../circuit/index.ts";
import { designCircuit, responseSpanHz, type DesignResult } from "../design/index.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import { requireDesignResult } from "../design/check.ts";

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
}

/**
 * The SPICE netlist of a design's whole cascade: `Vin` drives node `in` with
 * AC 1 V, the filter's output node is `out`, and an `.ac` card sweeps the span
 * of the mask, so ngspice (or any SPICE) runs it unchanged.
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
  requireDesignResult("toSpiceNetlist", result);
  const [lo, hi] = responseSpanHz(result.spec);
  const circuit = designCircuit(result, options.opamp === undefined ? {} : { opamp: options.opamp });
  const v = result.verification;
  const comments = [
    `${result.family} ${result.spec.response}, ${result.filterOrder} poles, ${result.stages.length} stage(s); designed by filterwright`,
    `as built: passband loss ${v.passbandLossDb.toFixed(3)} dB, stopband attenuation ${v.stopbandAttenuationDb.toFixed(2)} dB, ${v.meetsSpec ? "meets" : "MISSES"} the mask (worst margin ${v.marginDb.toFixed(3)} dB)`,
    "input node: in (driven by Vin, AC 1 V); output node: out",
    ...result.stages.map((s) => `stage ${s.index}: ${s.topologyName} (${s.topology}), ${Object.keys(s.components).join(" ")} ${s.opamps.join(" ")}`),
  ];
  return circuitToSpice(circuit, {
    ac: { pointsPerDecade: options.pointsPerDecade ?? 50, startHz: options.startHz ?? lo, stopHz: options.stopHz ?? hi },
    comments,
  });
}
