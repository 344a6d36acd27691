/**
 * The fallback ladder: what the pipeline does when the as-built circuit misses
 * the mask. At one order the steps run in this order, each on the attempt the
 * step before it left, until one meets the mask:
 *
 * 1. re-tune the preferred values against the mask itself (a wider value
 *    search, then coordinate descent over each stage's good value sets,
 *    maximising the worst margin);
 * 2. move the design inside the slack towards the failing band;
 * 3. (equiripple families) redesign the prototype with more dB margin.
 *
 * When none does, the order is raised (unless the spec fixes it), by up to
 * two. Every step taken is recorded as a {@link DesignAction}. When nothing
 * meets the mask, the attempt with the best worst margin is kept (common
 * practice, no source).
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import type { FamilyName } from "../approx/index.ts";
import { TWO_PI } from "../units/constants.ts";
import { MAX_SPEC_ORDER, type DesignSpec } from "./spec.ts";
import { AUTO_MAX_ORDER, choosePrototype, designPrototype, stricterLevels, type Prototype } from "./family.ts";
import { intervalWidth, prototypeInterval, upHelpsPassband } from "./placement.ts";
import type { GainBounds, StagePlan } from "./stages.ts";
import type { TunedStage, ValueSet } from "./components.ts";
import { checkMask, maskGrid, productMarginDb, stageMagnitudeSquared } from "./verify.ts";
import { boardStages, buildAttempt, meetsSpec, sturdierStagesOf, type Attempt, type PlacedPrototype } from "./attempt.ts";
import { significant } from "./text.ts";
import type { DesignAction } from "./types.ts";

const IDEAL: OpAmpModel = { kind: "ideal" };

/** The orders the pipeline may try. */
export interface OrderRange {
  /** Smallest order whose exact design meets the mask (the limit when none does). */
  readonly minimum: number;
  /** First order tried: the spec's fixed order, or the minimum. */
  readonly first: number;
  /** Last order tried: the spec's fixed order, or up to two above the minimum within the limit. */
  readonly last: number;
}

/**
 * The orders to try for a spec, from the family's minimum order.
 *
 * @param spec - canonical spec
 * @param minimumOrder - the family's minimum order, `null` when none up to the limit meets the mask
 * @returns the range
 */
export function orderRange(spec: DesignSpec, minimumOrder: number | null): OrderRange {
  const limit = spec.family === "auto" ? AUTO_MAX_ORDER : MAX_SPEC_ORDER;
  const minimum = minimumOrder ?? limit;
  return {
    minimum,
    first: spec.order ?? minimum,
    last: spec.order !== null ? spec.order : Math.min(limit, minimum + 2),
  };
}

/**
 * Re-tune against the mask: coordinate descent over each stage's good value
 * sets, maximising the worst margin. Candidates are ranked on the mask grid
 * with each stage's response computed once per candidate; the final choice is
 * checked with the full (refined) mask check and kept only if it is better.
 *
 * @param spec - canonical spec
 * @param a - the attempt
 * @returns the better of the re-tuned attempt and `a`
 */
export function retuneToMask(spec: DesignSpec, a: Attempt): Attempt {
  const grid = maskGrid(spec);
  const n = grid.freqHz.length;
  const cache = new Map<ValueSet, Float64Array>();
  const squaredOf = (i: number, v: ValueSet): Float64Array => {
    let r = cache.get(v);
    if (r === undefined) {
      r = stageMagnitudeSquared(spec, { topology: (a.plans[i] as StagePlan).topology, values: v.values }, spec.opamp, grid);
      cache.set(v, r);
    }
    return r;
  };
  // The margin of a set of stages: |H|^2 multiplied stage by stage in order from 1 at every grid point
  // (productMarginDb). Only stage i changes while its alternatives are tried, so the product of the
  // stages before it (the same running product, the same bits) is formed once per stage.
  const ones = new Float64Array(n).fill(1);
  const prefix = new Float64Array(n);
  const chosen = [...a.chosen];
  let bestGrid = productMarginDb(spec, grid, ones, chosen.map((v, i) => squaredOf(i, v)));
  for (let sweep = 0; sweep < 2; sweep++) {
    let improved = false;
    for (let i = 0; i < chosen.length; i++) {
      const t = a.tuned[i] as TunedStage;
      prefix.set(ones);
      for (let j = 0; j < i; j++) {
        const m2 = squaredOf(j, chosen[j] as ValueSet);
        for (let k = 0; k < n; k++) prefix[k] = (prefix[k] as number) * (m2[k] as number);
      }
      for (const alt of [t.best, ...t.alternatives]) {
        if (alt === chosen[i]) continue;
        const rest = [squaredOf(i, alt)];
        for (let j = i + 1; j < chosen.length; j++) rest.push(squaredOf(j, chosen[j] as ValueSet));
        const m = productMarginDb(spec, grid, prefix, rest);
        if (m > bestGrid + 1e-9) {
          bestGrid = m;
          chosen[i] = alt;
          improved = true;
        }
      }
    }
    if (!improved) break;
  }
  const mask = checkMask(spec, boardStages(a.plans, chosen), spec.opamp);
  return mask.marginDb > a.mask.marginDb ? { ...a, chosen, mask } : a;
}

/** The better of two attempts: a stable one over an unstable one, then by worst margin (`b` only when strictly better). */
function better(a: Attempt, b: Attempt): Attempt {
  const sa = a.mask.unstableStages.length === 0;
  const sb = b.mask.unstableStages.length === 0;
  if (sa !== sb) return sb ? b : a;
  return b.mask.marginDb > a.mask.marginDb ? b : a;
}

/**
 * A real op-amp far too slow is not cured by re-tuning or more order (higher
 * Q needs more GBW): the attempt misses by more than 1 dB while the same parts
 * with an ideal op-amp pass.
 */
function opampTooSlow(spec: DesignSpec, a: Attempt): boolean {
  return spec.opamp.kind !== "ideal" && a.mask.marginDb < -1 && checkMask(spec, boardStages(a.plans, a.chosen), IDEAL).marginDb >= 0;
}

/** What one rung of the ladder gave: the attempt to carry on from, and what it did. */
export interface StepOutcome {
  /** The attempt after the step. */
  readonly attempt: Attempt;
  /** What the step did, in order. */
  readonly actions: readonly DesignAction[];
}

/** One rung of the ladder at one order. */
export interface RecoveryStep {
  /** The action code the step records. */
  readonly code: DesignAction["code"];
  /**
   * Take the step from the attempt the step before left (the first step gets
   * the attempt as first placed).
   *
   * @returns the outcome, or `null` when the step does not apply
   */
  run(spec: DesignSpec, placed: PlacedPrototype, previous: Attempt): StepOutcome | null;
}

/** 1. Re-tune the parts against the mask itself, with a wider search. */
const retuneStep: RecoveryStep = {
  code: "re-tuned-to-mask",
  run(spec, placed, previous) {
    const wide = buildAttempt(spec, placed, { position: 0.5, wide: true, gainBounds: previous.gainBounds });
    const attempt = retuneToMask(spec, better(previous, wide));
    const message = `The rounded circuit missed the mask by ${significant(-previous.mask.marginDb, 3)} dB; re-tuned the preferred values against the mask itself (worst margin now ${significant(attempt.mask.marginDb, 3)} dB).`;
    return { attempt, actions: [{ code: "re-tuned-to-mask", message }] };
  },
};

/** 2. Move the design inside the slack towards the failing band. */
const moveStep: RecoveryStep = {
  code: "moved-placement",
  run(spec, placed, previous) {
    const passShort = previous.mask.passbandMarginDb < previous.mask.stopbandMarginDb;
    const position = passShort === upHelpsPassband(spec) ? 0.75 : 0.25;
    const attempt = retuneToMask(spec, buildAttempt(spec, placed, { position, wide: true, gainBounds: previous.gainBounds }));
    const message = `Moved the design to ${Math.round(position * 100)} % of the slack interval, shifting the transition band towards the ${passShort ? "stopband" : "passband"}, because the ${passShort ? "passband" : "stopband"} margin was the short one (worst margin now ${significant(attempt.mask.marginDb, 3)} dB).`;
    return { attempt, actions: [{ code: "moved-placement", message }] };
  },
};

function tightenedText(p: Prototype, marginDb: number): string {
  const ripple = p.rippleDb === undefined ? "" : `ripple ${significant(p.rippleDb, 3)} dB`;
  const attenuation = p.attenuationDb === undefined ? "" : `attenuation ${significant(p.attenuationDb, 4)} dB`;
  const both = ripple !== "" && attenuation !== "" ? ", " : "";
  return `Redesigned the prototype with more dB margin (${ripple}${both}${attenuation}); worst margin now ${significant(marginDb, 3)} dB.`;
}

/** 3. A prototype with more ripple/attenuation margin, each stricter level that still leaves frequency slack, least strict first. */
const tightenStep: RecoveryStep = {
  code: "tightened-prototype",
  run(spec, placed, previous) {
    const levels = stricterLevels(spec, placed.proto);
    if (levels.length === 0) return null;
    const actions: DesignAction[] = [];
    let attempt = previous;
    for (const level of levels) {
      const proto = designPrototype(spec, placed.proto.family, placed.proto.order, level);
      const interval = prototypeInterval(spec, proto.zpk);
      if (!(intervalWidth(interval) > 0)) continue;
      const t = retuneToMask(spec, buildAttempt(spec, { proto, interval }, { position: 0.5, wide: true, gainBounds: previous.gainBounds }));
      actions.push({ code: "tightened-prototype", message: tightenedText(proto, t.mask.marginDb) });
      attempt = better(attempt, t);
      if (meetsSpec(spec, attempt)) break;
    }
    return { attempt, actions };
  },
};

/** Ids of the topologies an attempt's stages use, for the action text. */
function namesOf(ids: ReadonlySet<string>): string {
  return [...ids].map((id) => `"${id}"`).join(", ");
}

/**
 * 4. Sturdier stages: the one-op-amp finite-zero, bandpass and high-Q stages
 * rebuilt as multi-amplifier stages (attempt.ts `sturdierStagesOf`), re-tuned
 * to the mask: more op-amps, but pole Q and notch depth that part rounding
 * and the op-amp move far less.
 */
const sturdierStep: RecoveryStep = {
  code: "sturdier-stages",
  run(spec, placed, previous) {
    const avoid = sturdierStagesOf(previous);
    if (avoid.size === 0) return null;
    const attempt = retuneToMask(spec, buildAttempt(spec, placed, { position: previous.position, wide: true, avoid, gainBounds: previous.gainBounds }));
    const message = `Rebuilt the stages that used ${namesOf(avoid)} with lower-sensitivity multi-amplifier stages (worst margin now ${significant(attempt.mask.marginDb, 3)} dB).`;
    return { attempt: better(previous, attempt), actions: [{ code: "sturdier-stages", message }] };
  },
};

/** The ladder at one order, in the order the steps are taken. */
export const RECOVERY_STEPS: readonly RecoveryStep[] = [retuneStep, moveStep, tightenStep, sturdierStep];

/** What designing at one order gave. */
export interface OrderOutcome {
  /** The attempt to keep for this order. */
  readonly attempt: Attempt;
  /** Whether it meets the spec. */
  readonly met: boolean;
  /** Whether the ladder ran (the first attempt missed a mask its order can meet). */
  readonly laddered: boolean;
  /** Whether more order cannot help: the op-amp is far too slow. */
  readonly opampTooSlow: boolean;
}

/** Run the ladder on an attempt that missed the mask; the best attempt of its steps is kept. */
function climbLadder(spec: DesignSpec, placed: PlacedPrototype, first: Attempt, actions: DesignAction[]): Attempt {
  let previous = first;
  let best: Attempt | null = null;
  for (const step of RECOVERY_STEPS) {
    const outcome = step.run(spec, placed, previous);
    if (outcome === null) continue;
    actions.push(...outcome.actions);
    if (meetsSpec(spec, outcome.attempt)) return outcome.attempt;
    best = best === null ? outcome.attempt : better(best, outcome.attempt);
    previous = outcome.attempt;
  }
  return best ?? first;
}

function placedText(order: number, placed: PlacedPrototype, spec: DesignSpec, feasible: boolean): string {
  const iv = placed.interval;
  const what = iv.parameter === "bandwidth" ? "bandwidth" : "natural frequency";
  const lo = `${significant(iv.low / TWO_PI)} Hz`;
  const hi = `${significant(iv.high / TWO_PI)} Hz`;
  if (feasible) {
    return `Placed the ${what} at the geometric middle of the interval where the exact design meets the mask (${lo} to ${hi}), so part rounding pushes towards neither edge first.`;
  }
  const why = upHelpsPassband(spec)
    ? `the passband needs a ${what} of at least ${lo}, the stopband at most ${hi}`
    : `the passband needs a ${what} of at most ${hi}, the stopband at least ${lo}`;
  return `Order ${order} cannot meet the mask even before rounding: ${why}; placed the design where the passband is met, so the stopband falls short.`;
}

/**
 * Design at one order: place, build, and when the mask is missed climb the
 * ladder. Too low an order cannot meet both bands: the design keeps the
 * passband (the end of the interval where it is met exactly) and lets the
 * stopband fall short, without the ladder.
 *
 * @param spec - canonical spec
 * @param family - the family
 * @param order - the prototype order
 * @param record - whether to record the placement, and where actions go
 * @returns the attempt kept at this order and how it went
 */
export function designAtOrder(spec: DesignSpec, family: FamilyName, order: number, record: { placement: boolean; actions: DesignAction[] }): OrderOutcome {
  const proto = choosePrototype(spec, family, order);
  const placed: PlacedPrototype = { proto, interval: prototypeInterval(spec, proto.zpk) };
  const feasible = intervalWidth(placed.interval) >= 0;
  const position = feasible ? 0.5 : upHelpsPassband(spec) ? 0 : 1;
  if (record.placement) record.actions.push({ code: "placed-in-slack", message: placedText(order, placed, spec, feasible) });
  const actions: DesignAction[] = [];
  const outcome = orderOutcome(spec, placed, feasible, position, "any", actions);
  // Stages at a bounded gain below their wish (stages.ts) save op-amps but can leave a design more
  // sensitive to rounding: when that one needed the ladder, the same order with every stage at its
  // wish, kept when it meets the mask and the other does not, or meets it with no more op-amps.
  if (outcome.laddered || !outcome.met) {
    const bounded = outcome.first.exactPlans.some((p) => p.bounded === true) || outcome.attempt.exactPlans.some((p) => p.bounded === true);
    if (bounded) {
      const plainActions: DesignAction[] = [];
      const plain = orderOutcome(spec, placed, feasible, position, "none", plainActions);
      const plainWins = plain.met ? !outcome.met || opampsOf(plain.attempt) <= opampsOf(outcome.attempt) : !outcome.met && plain.attempt.mask.marginDb > outcome.attempt.mask.marginDb;
      if (plainWins) {
        record.actions.push(...plainActions);
        return plain;
      }
    }
  }
  record.actions.push(...actions);
  return outcome;
}

function opampsOf(a: Attempt): number {
  return a.plans.reduce((k, p) => k + p.topology.opampCount, 0);
}

/** The first attempt at one order and, when it misses a mask the order can meet, the ladder. */
function orderOutcome(
  spec: DesignSpec,
  placed: PlacedPrototype,
  feasible: boolean,
  position: number,
  gainBounds: GainBounds,
  actions: DesignAction[],
): OrderOutcome & { readonly first: Attempt } {
  const first = buildAttempt(spec, placed, { position, wide: false, gainBounds });
  if (meetsSpec(spec, first)) return { attempt: first, first, met: true, laddered: false, opampTooSlow: false };
  if (!feasible || opampTooSlow(spec, first)) return { attempt: first, first, met: false, laddered: false, opampTooSlow: feasible };
  const attempt = climbLadder(spec, placed, first, actions);
  const met = meetsSpec(spec, attempt);
  return { attempt, first, met, laddered: true, opampTooSlow: !met && opampTooSlow(spec, attempt) };
}

/** The outcome of {@link searchDesign}. */
export interface SearchOutcome {
  /** The attempt the design is assembled from. */
  readonly attempt: Attempt;
  /** What the search did, in order. */
  readonly actions: readonly DesignAction[];
}

/**
 * Design at the first order, and when the mask is missed raise the order up
 * to the last one, recording every step it takes (an order is raised only
 * when a higher one is tried). When no order meets the mask, the attempt
 * with the best worst margin after the ladder is kept.
 *
 * @param spec - canonical spec
 * @param family - the family
 * @param orders - the orders to try
 * @returns the attempt to keep and the actions taken
 */
export function searchDesign(spec: DesignSpec, family: FamilyName, orders: OrderRange): SearchOutcome {
  const actions: DesignAction[] = [];
  let final: Attempt | null = null;
  let bestMiss: Attempt | null = null;
  for (let order = orders.first; order <= orders.last; order++) {
    const outcome = designAtOrder(spec, family, order, { placement: order === orders.first, actions });
    final = outcome.attempt;
    if (outcome.laddered && !outcome.met) bestMiss = bestMiss === null ? final : better(bestMiss, final);
    if (outcome.met || outcome.opampTooSlow || spec.order !== null || order === orders.last) break;
    const why = outcome.laddered ? "still missed the mask after re-tuning and moving the design" : "cannot meet the mask";
    actions.push({ code: "raised-order", message: `Order ${order} ${why}; raised the order to ${order + 1}.` });
  }
  let attempt = final as Attempt;
  if (!meetsSpec(spec, attempt) && bestMiss !== null && better(attempt, bestMiss) === bestMiss) {
    attempt = bestMiss;
    actions.push({
      code: "kept-best-attempt",
      message: `No order tried met the mask; kept order ${bestMiss.proto.order}, the attempt with the best worst margin (${significant(bestMiss.mask.marginDb, 3)} dB).`,
    });
  }
  return { attempt, actions };
}
