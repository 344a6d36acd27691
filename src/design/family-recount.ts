/**
 * The family choice checked against the op-amps the designs really take.
 *
 * The automatic choice (family.ts) ranks the families by an estimate: the
 * op-amps of the simplest topologies that realise each family's sections at
 * its minimum order. The design built for the chosen family can take more:
 * when its first rounding misses the mask, the fallback ladder re-plans with
 * sturdier (multi-amplifier) stages, or raises the order. Then the estimate
 * that won the choice is wrong, and a family estimated at fewer op-amps than
 * the design took may in fact be cheaper. Here, when the priority is
 * `fewest-op-amps`, each such family is built too, and the family whose
 * design meets the mask with the fewest op-amps is kept; every family built
 * records its design's count (`FamilyCandidate.built`), which the choice then
 * ranks by in place of the estimate. The final design's count is recorded on
 * its family at the end of the pipeline (`recordBuilt`), so the count a
 * result's choice shows for its family is always the count on the board.
 *
 * @module
 */
import type { FamilyName } from "../approx/index.ts";
import { meetsSpec, type Attempt } from "./attempt.ts";
import { orderRange, searchDesign, type OrderRange, type SearchOutcome } from "./recovery.ts";
import { opampCount } from "./yield.ts";
import type { DesignSpec } from "./spec.ts";
import type { DesignAction, FamilyCandidate, FamilyChoice } from "./types.ts";

/** The choice with `family`'s candidate recording what its design took. */
export function recordBuilt(choice: FamilyChoice, family: FamilyName, attempt: Attempt, meets: boolean): FamilyChoice {
  if (!choice.automatic) return choice;
  const built = { opamps: opampCount(attempt), order: attempt.proto.order, meetsSpec: meets };
  return { ...choice, candidates: choice.candidates.map((c): FamilyCandidate => (c.family === family ? { ...c, built } : c)) };
}

/** The count the choice ranks a candidate by: its design's where it was built (and met the mask), else the estimate. */
export function rankedOpamps(c: FamilyCandidate): number {
  if (c.built !== undefined && c.built.meetsSpec) return c.built.opamps;
  return c.opamps ?? Infinity;
}

/** What {@link recountFamilies} keeps. */
export interface Recounted {
  /** The family kept. */
  readonly family: FamilyName;
  /** Its order range. */
  readonly orders: OrderRange;
  /** Its nominal search. */
  readonly nominal: SearchOutcome;
  /** The choice with every built family's count. */
  readonly choice: FamilyChoice;
  /** What the recount did (a change of family), for the result's actions. */
  readonly actions: readonly DesignAction[];
  /**
   * The other families built here whose designs meet the mask, fewest
   * op-amps first (the family first chosen among them when the recount left
   * it): the yield step tries them, searches reused, before any family not
   * built, so a cheaper family whose boards miss the target falls back to
   * the one the estimate chose.
   */
  readonly alsoBuilt: readonly FamilySearch[];
}

/** A family, its order range and its nominal search. */
export interface FamilySearch {
  /** The family. */
  readonly family: FamilyName;
  /** Its order range. */
  readonly orders: OrderRange;
  /** Its nominal search. */
  readonly nominal: SearchOutcome;
}

/**
 * Build the families the estimate may have ranked wrongly and keep the one
 * whose design meets the mask with the fewest op-amps (see the module
 * header; internal: the spec is canonical).
 *
 * @param spec - canonical spec
 * @param first - the family chosen, its order range and nominal search
 * @param choice - the family choice
 * @returns the family kept, its search, the choice with the built counts, and the actions
 */
export function recountFamilies(
  spec: DesignSpec,
  first: FamilySearch,
  choice: FamilyChoice,
): Recounted {
  const meets = meetsSpec(spec, first.nominal.attempt);
  let kept: Recounted = { ...first, choice: recordBuilt(choice, first.family, first.nominal.attempt, meets), actions: [], alsoBuilt: [] };
  const met: { search: FamilySearch; opamps: number }[] = [];
  if (!choice.automatic || spec.priority !== "fewest-op-amps") return kept;
  const built = opampCount(first.nominal.attempt);
  const estimate = choice.candidates.find((c) => c.family === first.family)?.opamps ?? null;
  if (estimate === null || built <= estimate) return kept;
  const others = choice.candidates
    .filter((c) => c.family !== first.family && c.order !== null && (c.opamps ?? Infinity) < built)
    .sort((a, b) => (a.opamps ?? Infinity) - (b.opamps ?? Infinity) || (a.stages ?? Infinity) - (b.stages ?? Infinity));
  const raised = first.nominal.attempt.proto.order > (choice.candidates.find((c) => c.family === first.family)?.order ?? Infinity);
  const why = raised ? `order ${first.nominal.attempt.proto.order}: the minimum order missed the mask once rounded` : "multi-amplifier stages: the first rounding missed the mask";
  const note = (text: string): FamilyChoice => ({ ...kept.choice, reason: `${choice.reason} ${text}` });
  let best = meets ? built : Infinity;
  if (meets) met.push({ search: first, opamps: built });
  for (const c of others) {
    const orders = orderRange(spec, c.order);
    const nominal = searchDesign(spec, c.family, orders);
    const ok = meetsSpec(spec, nominal.attempt);
    const next = recordBuilt(kept.choice, c.family, nominal.attempt, ok);
    const count = opampCount(nominal.attempt);
    if (ok) met.push({ search: { family: c.family, orders, nominal }, opamps: count });
    if (ok && count < best) {
      best = count;
      const action: DesignAction = {
        code: "changed-family-for-op-amps",
        message: `${first.family} was estimated at ${estimate} op-amps but its design took ${built} (${why}); ${c.family}, estimated at ${c.opamps}, meets the mask with ${count}.`,
      };
      kept = { family: c.family, orders, nominal, choice: next, actions: [action], alsoBuilt: [] };
    } else {
      kept = { ...kept, choice: next };
    }
  }
  const change = kept.actions[0];
  const keptFamily = kept.family;
  return {
    ...kept,
    alsoBuilt: met
      .filter((m) => m.search.family !== keptFamily)
      .sort((a, b) => a.opamps - b.opamps)
      .map((m) => m.search),
    choice: note(
      change !== undefined
        ? change.message
        : `Its design took ${built} op-amps (estimated at ${estimate}; ${why}); ${others.length === 0 ? "no other family is estimated below that" : `no family estimated below that (${others.map((c) => c.family).join(", ")}) meets the mask with fewer`}.`,
    ),
  };
}
