/**
 * The as-built response of a finished design, from its stages' own
 * (closed-form or nodal) responses multiplied along the cascade.
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import type { ComplexResponse } from "../tf/index.ts";
import { InvalidArgumentError } from "../errors.ts";
import { getTopology } from "../topologies/index.ts";
import type { DesignResult } from "./types.ts";
import { cascadeResponse, type BuiltStage } from "./verify.ts";
import { requireDesignResult } from "./check.ts";

/** Options of {@link designResponse}. */
export interface DesignResponseOptions {
  /**
   * Op-amp model.
   * @defaultValue the model in the design's spec
   */
  readonly opamp?: OpAmpModel;
}

/** The stages of a result as topology + local values. */
export function builtStages(result: DesignResult): BuiltStage[] {
  return result.stages.map((s) => {
    const values: Record<string, number> = {};
    for (const [global, local] of Object.entries(s.localNames)) values[local] = s.components[global] as number;
    return { topology: getTopology(s.topology), values };
  });
}

/**
 * The complex as-built response `H(j 2 pi f)` of a design (input `in` to
 * output `out`) at the given frequencies.
 *
 * @param result - a design
 * @param freqHz - frequencies in Hz (>= 0)
 * @param options - op-amp model
 * @returns real and imaginary parts, one per frequency
 * @throws {@link InvalidArgumentError} when `freqHz` is not a Float64Array of finite non-negative numbers
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const h = designResponse(designFilter(spec), Float64Array.of(0));
 * Math.abs(h.re[0]); //=> 1 (the as-built DC gain; this design inverts, so h.re[0] is -1)
 * ```
 */
export function designResponse(
  result: DesignResult,
  freqHz: Float64Array,
  options: DesignResponseOptions = {},
): ComplexResponse {
  requireDesignResult("designResponse", result);
  if (!(freqHz instanceof Float64Array) || freqHz.some((f) => !(f >= 0) || !Number.isFinite(f))) {
    throw new InvalidArgumentError({
      fn: "designResponse",
      path: "freqHz",
      received: freqHz,
      message: "expected a Float64Array of finite frequencies >= 0 Hz",
    });
  }
  return cascadeResponse(builtStages(result), freqHz, options.opamp ?? result.spec.opamp);
}
