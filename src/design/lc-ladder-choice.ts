/**
 * The choice of {@link designLcLadder}: which family, order and placement
 * its ladder is built at.
 *
 * Method. Each family's minimum order is the cascade's (family.ts
 * `familyMinimumOrder`: the order formula confirmed on the prototype), at
 * most {@link LC_LADDER_MAX_ORDER}; the spec's family (or, for
 * `"auto"`, every family, the monotonic ones only for the `"monotonic"`
 * priority; the other priorities, which weigh op-amps, stages and group
 * delay, are not read) and the spec's order (else that minimum) are the
 * candidates. An
 * even-order elliptic or Chebyshev II ladder realises the type b form, whose
 * slack is not the prototype's: while its interval in the mask is empty
 * (and the spec leaves the order free) the next order is taken. Each
 * candidate's ladder is placed at 11 log positions across the interval in
 * which its exact transfer meets the mask (placement.ts, the cascade's
 * interval; 0, 0.1, ..., 1), built from preferred lossy parts and checked;
 * the position with the best nominal margin is kept, since the inductors'
 * dissipation loss pulls the passband edge in and the middle of the
 * interval, the cascade's choice, is rarely the best for a ladder (common
 * practice, no source). When no candidate meets the mask as built and the
 * order is free, each family is tried once more one order up. Of the
 * candidates, those that meet the mask as built come first, then the lowest
 * order (the fewest parts), then the largest margin.
 *
 * @module
 */
import type { FamilyName } from "../approx/types.ts";
import { UnrealisableError } from "../errors.ts";
import { requireInteger } from "../validate.ts";
import { ALL_FAMILIES, AUTO_MAX_ORDER, familyMinimumOrder, MONOTONIC } from "./family.ts";
import { buildLadder, LC_FN, prototypeAt, reraised, type BuiltLadder, type LadderCandidate } from "./lc-ladder-build.ts";
import type { LcLadderPlan } from "./lc-ladder-options.ts";
import { intervalWidth, prototypeInterval, type FeasibleInterval } from "./placement.ts";
import type { DesignSpec } from "./spec.ts";

/** Highest prototype order {@link designLcLadder} builds. */
export const LC_LADDER_MAX_ORDER = AUTO_MAX_ORDER;

/** Log positions tried across a candidate's interval. */
export const LC_PLACEMENT_POSITIONS: readonly number[] = Object.freeze(Array.from({ length: 11 }, (_, i) => i / 10));

/** The chosen ladder and why. */
export interface LadderChoice {
  readonly built: BuiltLadder;
  readonly family: FamilyName;
  readonly order: number;
  readonly reason: string;
}

interface Located {
  readonly family: FamilyName;
  readonly order: number;
  readonly candidate: LadderCandidate;
  readonly interval: FeasibleInterval;
  readonly raisedFrom: number | null;
}

/** A family's ladder from `start` up, the first whose interval is not empty (or at the last order allowed). */
function locate(spec: DesignSpec, plan: LcLadderPlan, family: FamilyName, start: number, fixed: boolean, named: boolean): Located | null {
  for (let n = start; n <= LC_LADDER_MAX_ORDER; n++) {
    const last = fixed || n === LC_LADDER_MAX_ORDER;
    let candidate: LadderCandidate;
    try {
      candidate = prototypeAt(spec, family, n, plan);
    } catch (e) {
      // an automatic candidate that cannot be synthesised (or terminated as asked) is left out
      if (!named && e instanceof UnrealisableError) return null;
      if (last || !(e instanceof UnrealisableError) || e.path !== "order") reraised(e);
      continue;
    }
    const interval = prototypeInterval(spec, candidate.prototype.transfer);
    if (intervalWidth(interval) >= 0 || last) return { family, order: n, candidate, interval, raisedFrom: n > start ? start : null };
  }
  return null;
}

/** The best position of a located ladder. */
function bestPosition(spec: DesignSpec, plan: LcLadderPlan, l: Located): BuiltLadder {
  let best: BuiltLadder | null = null;
  for (const p of LC_PLACEMENT_POSITIONS) {
    const b = buildLadder(spec, plan, l.candidate, l.interval, p);
    if (best === null || b.marginDb > best.marginDb) best = b;
  }
  return best as BuiltLadder;
}

function better(a: { built: BuiltLadder; order: number }, b: { built: BuiltLadder; order: number }): boolean {
  const am = a.built.marginDb >= 0;
  const bm = b.built.marginDb >= 0;
  if (am !== bm) return am;
  if (am && a.order !== b.order) return a.order < b.order;
  return a.built.marginDb > b.built.marginDb;
}

/**
 * Choose and build the ladder (see the module header).
 *
 * @param spec - canonical spec
 * @param plan - checked options
 * @returns the built ladder, its family and order, and the reason
 * @throws {@link InvalidArgumentError} for a spec order above {@link LC_LADDER_MAX_ORDER}
 * @throws {@link UnrealisableError} when the spec's family cannot be built with these terminations or form
 */
export function chooseLadder(spec: DesignSpec, plan: LcLadderPlan): LadderChoice {
  const fixed = spec.order !== null;
  if (fixed) requireInteger(LC_FN, "spec.order", spec.order, { min: 1, max: LC_LADDER_MAX_ORDER });
  const named = spec.family !== "auto";
  const pool: readonly FamilyName[] =
    spec.family !== "auto" ? [spec.family] : spec.priority === "monotonic" ? ALL_FAMILIES.filter((f) => MONOTONIC.has(f)) : ALL_FAMILIES;
  const tried: { family: FamilyName; order: number; built: BuiltLadder; raisedFrom: number | null }[] = [];
  const starts = new Map<FamilyName, number>();
  for (const family of pool) {
    const min = familyMinimumOrder(spec, family, LC_LADDER_MAX_ORDER);
    if (!named && !fixed && min === null) continue;
    const l = locate(spec, plan, family, spec.order ?? min ?? LC_LADDER_MAX_ORDER, fixed, named);
    if (l === null) continue;
    tried.push({ family, order: l.order, built: bestPosition(spec, plan, l), raisedFrom: l.raisedFrom });
    starts.set(family, l.order);
  }
  // none meets the mask as built: one order more for each (more selectivity leaves the placement room for the loss)
  if (!fixed && !tried.some((t) => t.built.marginDb >= 0)) {
    for (const [family, n] of starts) {
      if (n >= LC_LADDER_MAX_ORDER) continue;
      const l = locate(spec, plan, family, n + 1, true, false);
      if (l !== null) tried.push({ family, order: l.order, built: bestPosition(spec, plan, l), raisedFrom: null });
    }
  }
  if (tried.length === 0) {
    throw new UnrealisableError({
      fn: LC_FN,
      path: "spec.family",
      received: spec.family,
      message: `no family's ladder up to order ${LC_LADDER_MAX_ORDER} can be built for this mask with these terminations and form; relax the mask, or name a family and order`,
    });
  }
  let best = tried[0] as (typeof tried)[number];
  for (const t of tried.slice(1)) if (better(t, best)) best = t;
  const list = tried.map((t) => `${t.family} ${t.order} (${t.built.marginDb.toFixed(2)} dB)`).join(", ");
  const head = named ? `The spec names the ${best.family} family.` : `Of the families' ladders, ${best.family} ${best.order} ${best.built.marginDb >= 0 ? "meets the mask as built with the fewest parts, then the largest margin" : "comes closest to the mask as built"}.`;
  const raised = best.raisedFrom === null ? "" : ` Order ${best.order}: at order ${best.raisedFrom} its type b form does not meet the mask.`;
  const margins = named ? "" : ` Nominal as-built margins: ${list}.`;
  return { built: best.built, family: best.family, order: best.order, reason: `${head}${fixed ? ` The spec fixes order ${best.order}.` : ""}${raised}${margins}` };
}
