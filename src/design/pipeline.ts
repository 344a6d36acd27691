/**
 * The design pipeline: from a spec to a verified circuit of preferred-value
 * parts, in one page.
 *
 * validate the spec (spec.ts) -> family, minimum order and prototype
 * (family.ts) -> the interval where the exact design meets the mask
 * (placement.ts) -> an attempt: sections, a topology and gain per stage
 * (stages.ts), pre-distortion for a real op-amp (predistort.ts), preferred
 * values (components.ts), the as-built check (verify.ts), all in attempt.ts ->
 * when the mask is missed, the fallback ladder and the order search
 * (recovery.ts) -> the boards' yield at the parts' tolerances, and the
 * robustness ladder when it misses the target (yield.ts) -> the result as
 * plain readonly data (result.ts).
 *
 * @module
 */
import { validateSpec, type DesignSpec } from "./spec.ts";
import { chooseFamily } from "./family.ts";
import { orderRange, searchDesign } from "./recovery.ts";
import { assembleResult } from "./result.ts";
import { designForYieldAcrossFamilies } from "./yield.ts";
import { withTunedStages } from "./components.ts";
import { feasibility } from "./relax.ts";
import type { DesignResult } from "./types.ts";
import type { FilterSpec } from "./spec-types.ts";
import { checkpoint, checkRunControl, watched, type RunControl } from "../evaluate/progress.ts";

export { LARGE_CAPACITOR_RATIO, CURVE_POINTS } from "./result.ts";

/**
 * Design an active filter from a specification: family, order, sections,
 * topologies, preferred component values, and the as-built check against the
 * mask.
 *
 * A spec that the (forced) order cannot meet is not an error: the result says
 * `verification.meetsSpec: false` and gives the margins; when no order up to
 * the limit meets the mask, `familyChoice.feasibility` says the order each
 * family would need and the nearest relaxations that make the mask feasible.
 *
 * A long design (a high-order bandstop whose yield ladder builds thousands of
 * boards) can be watched and stopped: `control.onProgress` is told each step
 * (family, component search, each yield candidate, each batch of boards), and
 * the design stops with a {@link CancelledError} when the callback returns
 * `false`, `control.signal` is aborted or `control.timeLimitMs` has passed.
 *
 * @param spec - the specification (validated here; see {@link FilterSpec})
 * @param control - progress callback, abort signal and time limit (all optional)
 * @returns the design as plain readonly data
 * @throws {@link SpecError} listing every problem of a malformed spec
 * @throws {@link CancelledError} when `control` stops the run (its `path` names the option)
 * @throws {@link UnrealisableError} when no topology or capacitor window can build a stage
 * @example
 * ```ts
 * const r = designFilter({
 *   response: "lowpass",
 *   passband: { edgeHz: "1k", maxLossDb: 1 },
 *   stopband: { edgeHz: "4k", minAttenuationDb: 40 },
 * });
 * r.verification.meetsSpec; //=> true
 * r.stages.length; //=> 2
 * ```
 */
export function designFilter(spec: FilterSpec, control?: RunControl): DesignResult {
  const canonical: DesignSpec = validateSpec(spec);
  return watched("designFilter", "control", checkRunControl("designFilter", "control", control), () => withTunedStages(() => {
    checkpoint("family", "family and order");
    const chosen = chooseFamily(canonical);
    const { family, order } = chosen;
    const orders = orderRange(canonical, order);
    const choice = order === null ? { ...chosen.choice, feasibility: feasibility(canonical, family, orders.last) } : chosen.choice;
    checkpoint("search", `component search: ${family} from order ${orders.first}`);
    const nominal = searchDesign(canonical, family, orders);
    const robust = designForYieldAcrossFamilies(canonical, { family, orders, nominal }, choice);
    const actions = robust.family === family ? [...nominal.actions, ...robust.actions] : [...robust.actions];
    checkpoint("result", `result: ${robust.family}`);
    return assembleResult(canonical, { family: robust.family, choice, minimumOrder: orders.minimum, actions }, robust);
  }));
}
