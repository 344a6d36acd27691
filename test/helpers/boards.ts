/**
 * A design's stages as the evaluation layer's boards, built the way
 * src/analysis/tolerance.ts builds them (compiled with the spec's op-amp
 * over the mask's span, resistors at `rt`, capacitors at `ct`).
 */
import type { DesignResult } from "../../src/design/index.ts";
import { builtStages } from "../../src/design/response.ts";
import { maskPlan, spanRadS } from "../../src/design/verify.ts";
import type { BoardStage } from "../../src/evaluate/boards.ts";
import { compileStage } from "../../src/evaluate/stage-polynomials.ts";

/**
 * The design's board stages with one tolerance per part kind.
 *
 * @param design - a design
 * @param rt - resistor tolerance (fraction)
 * @param ct - capacitor tolerance (fraction)
 * @returns the stages, in cascade order
 */
export function boardStagesOf(design: DesignResult, rt: number, ct: number): BoardStage[] {
  const span = spanRadS(maskPlan(design.spec).bands);
  return builtStages(design).map((s) => {
    const compiled = compileStage(s.topology, s.values, design.spec.opamp, span);
    return {
      compiled,
      nominal: Float64Array.from(compiled.componentNames, (n) => s.values[n] as number),
      tolerance: Float64Array.from(compiled.componentNames, (n) => (n.startsWith("C") ? ct : rt)),
      radius: 2 * Math.PI * s.topology.figures(s.values).f0Hz,
    };
  });
}
