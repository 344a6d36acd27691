/**
 * Design for yield across families: when the boards of the family the
 * choice made cannot reach the yield target and the spec leaves the family
 * to the pipeline, the families the op-amp recount already built
 * (src/design/family-recount.ts; their searches reused, fewest op-amps
 * first), then the next candidates of the choice (fewest op-amps first), are
 * designed for yield in turn: the first that reaches the target is kept,
 * else the closest.
 *
 * @module
 */
import type { FamilyName } from "../approx/index.ts";
import { meetsSpec } from "./attempt.ts";
import { rankedOpamps, type FamilySearch } from "./family-recount.ts";
import { orderRange, searchDesign } from "./recovery.ts";
import type { DesignSpec } from "./spec.ts";
import type { DesignAction, FamilyChoice } from "./types.ts";
import { classText, designForYield, reported, yieldText, type YieldOutcome } from "./yield.ts";

/** Most other families tried when the chosen one cannot reach the yield target. */
const OTHER_FAMILIES = 2;

/**
 * Design for yield in the family the automatic choice made and, when its
 * boards cannot reach the target and the spec leaves the family to the
 * pipeline, in the next candidates of that choice (fewest op-amps first):
 * a family with lower pole Q often tolerates its parts better than one
 * more order of the first (common practice, no source).
 *
 * @param spec - canonical spec
 * @param first - the family chosen, its order range and its nominal search, and the families the op-amp recount built (tried first)
 * @param choice - the family choice (its candidates)
 * @returns the outcome kept, with every candidate of every family tried
 */
export function designForYieldAcrossFamilies(
  spec: DesignSpec,
  first: FamilySearch & { readonly alsoBuilt?: readonly FamilySearch[] },
  choice: FamilyChoice,
): YieldOutcome & { readonly family: FamilyName } {
  const outcome = designForYield(spec, first.family, first.orders, first.nominal);
  if (outcome.chosen.estimate.met || !choice.automatic) return { ...reported(spec, outcome), family: first.family };
  const built = first.alsoBuilt ?? [];
  const others = choice.candidates
    .filter((c) => c.family !== first.family && c.order !== null && !built.some((b) => b.family === c.family))
    .sort((a, b) => rankedOpamps(a) - rankedOpamps(b) || (a.stages ?? Infinity) - (b.stages ?? Infinity))
    .slice(0, OTHER_FAMILIES);
  const candidates = [...outcome.candidates];
  let kept: YieldOutcome & { readonly family: FamilyName } = { ...outcome, family: first.family };
  // the families already built (searches reused, fewest op-amps first), then the best ranked of the rest;
  // the first to meet the target is kept (trying every one for the fewest op-amps cost 14 % more design time
  // on the corpus for designs whose nominal op-amp order held)
  for (const c of [...built, ...others]) {
    const reused = "nominal" in c;
    const orders = reused ? c.orders : orderRange(spec, c.order);
    const nominal = reused ? c.nominal : searchDesign(spec, c.family, orders);
    if (!meetsSpec(spec, nominal.attempt)) continue;
    const o = designForYield(spec, c.family, orders, nominal);
    candidates.push(...o.candidates);
    if (o.chosen.estimate.met || o.chosen.estimate.lower95 > kept.chosen.estimate.lower95) {
      const action: DesignAction = {
        code: "changed-family-for-yield",
        message: `${first.family} boards could not reach the yield target (best ${yieldText(outcome.chosen.estimate)}); ${c.family} ${o.chosen.estimate.met ? "does" : "comes closer"}: ${yieldText(o.chosen.estimate)} at ${classText(o.chosen.classes)}.`,
      };
      kept = { chosen: o.chosen, candidates, actions: [...nominal.actions, ...o.actions, action], family: c.family };
      if (o.chosen.estimate.met) break;
    }
  }
  return { ...reported(spec, { ...kept, candidates }), family: kept.family };
}
