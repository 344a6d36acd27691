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
import { recordBuilt, recountFamilies } from "./family-recount.ts";
import { meetsSpec } from "./attempt.ts";
import { designForYieldAcrossFamilies } from "./yield-families.ts";
import { withTunedStages } from "./components.ts";
import { feasibility } from "./relax.ts";
import type { DesignResult } from "./types.ts";
import type { FilterSpec, LcLadderFilterSpec } from "./spec-types.ts";
import { designLcLadder, type LcLadderDesign } from "./lc-ladder.ts";
import { chooseRealisation } from "./realisation.ts";
import { registerDesignResult, deepFreeze } from "./check.ts";
import { withDisplay } from "../display.ts";
import { designBundle } from "./display.ts";
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
 * Realisation (the spec's `realisation`): `"cascade"` (the default) builds
 * the biquad cascade alone. `"auto"` and `"active-ladder"` build it, then the
 * active simulations of the LC ladder of the same prototype (leapfrog and
 * FDNR for a lowpass, GIC inductors for a highpass), and compare them all on
 * the same seeded boards at the spec's part tolerances, each candidate's
 * built in blocks until its 95 % interval decides against the yield target
 * (src/design/realisation.ts): `auto` keeps the one that meets the yield
 * target with the fewest op-amps, `active-ladder` the best ladder; the
 * result's `realisation` lists every candidate and says why, and the
 * netlist, BOM and report functions export the chosen one. `"lc-ladder"`
 * (an {@link LcLadderFilterSpec}) returns the passive ladder
 * `designLcLadder(spec, spec.lcLadder)` makes.
 *
 * A long design (a high-order bandstop whose yield ladder builds thousands of
 * boards) can be watched and stopped: `control.onProgress` is told each step
 * (family, component search, each yield candidate, each batch of boards), and
 * the design stops with a {@link CancelledError} when the callback returns
 * `false`, `control.signal` is aborted or `control.timeLimitMs` has passed.
 *
 * @param spec - the specification (validated here; see {@link FilterSpec})
 * @param control - progress callback, abort signal and time limit (all optional)
 * @returns the design as plain readonly data (an `LcLadderDesign` for `realisation: "lc-ladder"`)
 * @throws {@link SpecError} listing every problem of a malformed spec
 * @throws {@link UnrealisableError} (path `realisation`) when an active ladder is asked for a response none is built for
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
 *
 * // a sharp anti-alias lowpass on 1 % resistors and 2 % capacitors, realisations compared
 * const a = designFilter({ response: "lowpass", passband: { edgeHz: 18000, maxLossDb: 0.25 },
 *   stopband: { edgeHz: 26000, minAttenuationDb: 33 }, family: "chebyshev1", order: 7,
 *   parts: { resistorTolerance: 0.01, capacitorTolerance: 0.02 }, yieldTarget: 0.5, realisation: "auto" });
 * a.realisation?.candidates.map((k) => k.method); //=> ["biquad-cascade", "leapfrog", "fdnr"]
 * a.realisation?.reason; //=> "the fdnr active ladder: the fewest op-amps (7) of the 2 realisations that meet the 50 % yield target, ..."
 * ```
 */
export function designFilter(spec: FilterSpec, control?: RunControl): DesignResult;
/**
 * Design a passive doubly terminated LC ladder from a spec of `realisation: "lc-ladder"`
 * (the same as `designLcLadder(spec, spec.lcLadder)`).
 *
 * @param spec - the specification, its LC ladder options in `lcLadder`
 * @param control - progress callback, abort signal and time limit (checked; the ladder's design is not watched)
 * @returns the ladder design
 */
export function designFilter(spec: LcLadderFilterSpec, control?: RunControl): LcLadderDesign;
/**
 * Design from a spec whose realisation is known only at run time (a spec read from a file).
 *
 * @param spec - the specification
 * @param control - progress callback, abort signal and time limit
 * @returns the cascade design, or an `LcLadderDesign` for `realisation: "lc-ladder"`
 */
export function designFilter(spec: FilterSpec | LcLadderFilterSpec, control?: RunControl): DesignResult | LcLadderDesign;
export function designFilter(spec: FilterSpec | LcLadderFilterSpec, control?: RunControl): DesignResult | LcLadderDesign {
  const canonical: DesignSpec = validateSpec(spec);
  if (canonical.realisation === "lc-ladder") {
    checkRunControl("designFilter", "control", control);
    return designLcLadder(spec, (spec as LcLadderFilterSpec).lcLadder ?? {});
  }
  const cascade = designCascade(canonical, control);
  return canonical.realisation === "cascade" ? cascade : withRealisation(cascade, canonical.realisation);
}

/** The biquad cascade of a canonical spec (the pipeline of this module's header). */
function designCascade(canonical: DesignSpec, control: RunControl | undefined): DesignResult {
  return watched("designFilter", "control", checkRunControl("designFilter", "control", control), () => withTunedStages(() => {
    checkpoint("family", "family and order");
    const chosen = chooseFamily(canonical);
    const { family, order } = chosen;
    const orders = orderRange(canonical, order);
    const choice = order === null ? { ...chosen.choice, feasibility: feasibility(canonical, family, orders.last) } : chosen.choice;
    checkpoint("search", `component search: ${family} from order ${orders.first}`);
    const first = recountFamilies(canonical, { family, orders, nominal: searchDesign(canonical, family, orders) }, choice);
    const { nominal } = first;
    const robust = designForYieldAcrossFamilies(canonical, first, first.choice);
    const actions = robust.family === first.family ? [...first.actions, ...nominal.actions, ...robust.actions] : [...robust.actions];
    checkpoint("result", `result: ${robust.family}`);
    const a = robust.chosen.attempt;
    const recorded = recordBuilt(first.choice, robust.family, a, meetsSpec(canonical, a));
    return assembleResult(canonical, { family: robust.family, choice: recorded, minimumOrder: first.orders.minimum, actions }, robust);
  }));
}

/** The cascade with the realisation chosen for it (src/design/realisation.ts) recorded on the result. */
function withRealisation(cascade: DesignResult, requested: "active-ladder" | "auto"): DesignResult {
  checkpoint("realisation", `realisations compared on ${cascade.spec.yieldMaxBoards} boards`);
  const realisation = chooseRealisation(cascade, requested);
  return registerDesignResult(deepFreeze(withDisplay({ ...cascade, realisation }, designBundle)));
}
