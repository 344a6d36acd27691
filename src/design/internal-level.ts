/**
 * Internal levels of the state-variable notch and allpass stages, set for
 * the spec's signal levels: the gain distribution inside a stage, as the
 * stage gains distribute it across the cascade.
 *
 * In a KHN notch or allpass (topologies/state-variable.ts) the integrator
 * loop's three op-amp outputs peak about Q times above the stage input at
 * the input summer's gain H0 = 1, while the output summer brings the stage
 * back to its passband level: a 400 Hz notch at Q 8 runs its loop 18 dB above
 * its output. Lowering H0 (`resistorRatio`) scales the loop's nodes down
 * and the output summer's gain up by the same factor, leaving the transfer
 * function as it is; it costs noise (the output summer's noise gain rises as
 * 1/H0), so H0 is lowered only as far as the headroom needs: with the spec's
 * `levels`, to the H0 that leaves every loop node HEADROOM_RESERVE_DB inside
 * the op-amp swing at the largest input, but never below the H0 that puts
 * the loop nodes at the stage output's own peak (below that the output
 * summer would only add noise: that output clips first). Dynamic-range
 * scaling of this kind: R. Schaumann & M. E. Van Valkenburg, "Design of
 * Analog Filters", Oxford University Press 2001, the chapter on dynamic
 * range (from memory).
 *
 * The peaks are the found maxima of the built cascade to every op-amp
 * output (headroom.ts, `stagePeakGains`), taken at the level the stages
 * were built at; the loop nodes scale exactly with H0, so one evaluation
 * gives the H0 each stage needs, and one more after the cascade is tuned
 * again (its rounding and the stages before it move the peaks a little).
 *
 * @module
 */
import { TWO_PI } from "../units/constants.ts";
import type { ComponentValues, StageChoices } from "../topologies/types.ts";
import type { DesignSpec } from "./spec.ts";
import { stagePeakGains } from "./headroom.ts";
import type { StagePlan } from "./stages.ts";

/** Topologies whose loop nodes scale with the input summer's gain (`resistorRatio` = R2/R1). */
const SCALABLE: ReadonlySet<string> = new Set(["state-variable-notch", "state-variable-allpass"]);

/** How far inside the op-amp swing a loop node is put, dB (common practice, no source). */
export const HEADROOM_RESERVE_DB = 1;

/**
 * Each stage's internal level for the spec's signal levels: `{ resistorRatio: h }`
 * for a scalable stage whose loop nodes would come within
 * {@link HEADROOM_RESERVE_DB} of the swing, undefined for the others; null
 * when no stage needs it (or the spec gives no levels).
 *
 * @param spec - canonical spec
 * @param plans - the stages' plans
 * @param chosen - the stages' values as built
 * @param gridRadS - the design's section grid (the peaks' fallback)
 * @param current - the choices the stages were built with (none: the default level)
 * @returns the choices per stage, or null when none changes
 */
export function internalLevels(
  spec: DesignSpec,
  plans: readonly StagePlan[],
  chosen: readonly { readonly values: ComponentValues }[],
  gridRadS: Float64Array,
  current?: readonly (StageChoices | undefined)[],
): (StageChoices | undefined)[] | null {
  const levels = spec.levels;
  if (levels === null || !plans.some((p) => SCALABLE.has(p.topology.id))) return null;
  const stages = plans.map((p, i) => ({ topology: p.topology, values: (chosen[i] as { values: ComponentValues }).values }));
  const peaks = stagePeakGains(spec, stages, spec.opamp, gridRadS.map((w) => w / TWO_PI));
  const allowed = (levels.outputSwingV * 10 ** (-HEADROOM_RESERVE_DB / 20)) / levels.inputPeakV;
  let any = false;
  const out = plans.map((p, i): StageChoices | undefined => {
    const now = current?.[i];
    if (!SCALABLE.has(p.topology.id)) return now;
    const stage = peaks[i];
    if (stage === undefined) return now;
    let loop = 0;
    for (const o of stage.opamps) if (o.node !== "out") loop = Math.max(loop, o.gain);
    if (!(loop > allowed)) return now;
    // the loop's nodes scale with the level: from the one the stage was built at
    const h0 = now?.resistorRatio ?? 1;
    const h = Math.min(1, h0 * Math.max(allowed / loop, stage.output.gain / loop));
    if (!(h < h0 * (1 - 1e-3))) return now;
    any = true;
    return { resistorRatio: h };
  });
  return any ? out : null;
}
