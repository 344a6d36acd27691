/**
 * Choosing the approximation family and its order, and designing the
 * prototype with a little of the mask's slack kept back for part rounding.
 *
 * The minimum order comes from the approximation layer's order formulas and is
 * then confirmed (or raised) by checking the actual prototype against the mask:
 * the prototype meets it when placement.ts finds a non-empty interval for it.
 * This module returns the family, the order and the prototype; placing the
 * prototype (its interval) is the next step's business.
 *
 * For the equiripple families the prototype is designed
 * with a smaller ripple and/or a larger stopband attenuation than the spec
 * allows whenever the minimum order has room for it, so the ripple valleys and
 * stopband peaks keep a dB margin that part rounding can use (common practice,
 * no source).
 *
 * @module
 */
import type { Zpk } from "../tf/types.ts";
import { groupDelay, logGrid } from "../tf/index.ts";
import { minimumOrder, prototype, type FamilyName } from "../approx/index.ts";
import type { DesignSpec } from "./spec.ts";
import { TWO_PI } from "../units/constants.ts";
import { intervalWidth, placeInInterval, prototypeInterval, transformPrototype } from "./placement.ts";
import type { FamilyCandidate, FamilyChoice } from "./types.ts";
import { planPrototype } from "./attempt.ts";

/** Highest prototype order the automatic choices consider. */
export const AUTO_MAX_ORDER = 12;

/** The families whose passband is monotonic. */
export const MONOTONIC: ReadonlySet<FamilyName> = new Set(["butterworth", "legendre", "bessel", "chebyshev2"]);
/** Every family, in the order the automatic choice compares them. */
export const ALL_FAMILIES: readonly FamilyName[] = ["butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel", "legendre"];

/** How much of the spec's ripple/attenuation the prototype uses (tightening levels). */
export interface MarginLevel {
  /** Design ripple as a fraction of the spec's passband loss. */
  readonly rippleFraction: number;
  /** Extra stopband attenuation designed in, dB. */
  readonly extraAttenuationDb: number;
}

/** Tightening levels, most generous margin first; the last one uses the spec's limits exactly. */
export const MARGIN_LEVELS: readonly MarginLevel[] = [
  { rippleFraction: 0.5, extraAttenuationDb: 3 },
  { rippleFraction: 0.6, extraAttenuationDb: 2.5 },
  { rippleFraction: 0.7, extraAttenuationDb: 2 },
  { rippleFraction: 0.8, extraAttenuationDb: 1.5 },
  { rippleFraction: 0.85, extraAttenuationDb: 1 },
  { rippleFraction: 0.9, extraAttenuationDb: 0.75 },
  { rippleFraction: 0.93, extraAttenuationDb: 0.5 },
  { rippleFraction: 0.96, extraAttenuationDb: 0.25 },
  { rippleFraction: 1, extraAttenuationDb: 0 },
];

/**
 * Typical errors left after joint re-tuning, used to weigh frequency slack
 * against dB margin when choosing a margin level (common practice, no source;
 * the re-tuning benchmark's median worst-stage f0 error is about 0.3 %).
 */
const TYPICAL_FREQUENCY_ERROR = 0.003;
const TYPICAL_PASSBAND_DB_ERROR = 0.05;
const TYPICAL_STOPBAND_DB_ERROR = 0.5;

/** A normalised lowpass prototype of a family and order, with the margins it was designed with. */
export interface Prototype {
  /** Family. */
  readonly family: FamilyName;
  /** Prototype order. */
  readonly order: number;
  /** Normalised lowpass prototype. */
  readonly zpk: Zpk;
  /** Design ripple, dB (Chebyshev I, elliptic). */
  readonly rippleDb?: number;
  /** Design attenuation, dB (Chebyshev II, elliptic). */
  readonly attenuationDb?: number;
}

/**
 * Design a prototype of the given family and order at one margin level.
 *
 * @param spec - canonical spec
 * @param family - family
 * @param order - prototype order
 * @param level - how much ripple/attenuation margin to design in
 * @returns the prototype
 */
export function designPrototype(
  spec: DesignSpec,
  family: FamilyName,
  order: number,
  level: MarginLevel,
): Prototype {
  const rippleDb = spec.maxLossDb * level.rippleFraction;
  const attenuationDb = spec.minAttenuationDb + level.extraAttenuationDb;
  let zpk: Zpk;
  switch (family) {
    case "chebyshev1":
      zpk = prototype({ family, order, rippleDb });
      break;
    case "chebyshev2":
      zpk = prototype({ family, order, attenuationDb });
      break;
    case "elliptic":
      zpk = prototype({ family, order, rippleDb, attenuationDb });
      break;
    case "bessel":
      zpk = prototype({ family, order, normalization: "magnitude" });
      break;
    default:
      zpk = prototype({ family, order });
  }
  return {
    family,
    order,
    zpk,
    ...(family === "chebyshev1" || family === "elliptic" ? { rippleDb } : {}),
    ...(family === "chebyshev2" || family === "elliptic" ? { attenuationDb } : {}),
  };
}

const EXACT: MarginLevel = MARGIN_LEVELS[MARGIN_LEVELS.length - 1] as MarginLevel;

/** Log-width of the interval in which the prototype's exact design meets the mask (negative: it cannot). */
function slackOf(spec: DesignSpec, p: Prototype): number {
  return intervalWidth(prototypeInterval(spec, p.zpk));
}

/** Whether a family is equiripple (its prototype can hold back part of the ripple or attenuation). */
export function isEquiripple(family: FamilyName): boolean {
  return family === "chebyshev1" || family === "chebyshev2" || family === "elliptic";
}

/**
 * The approximation layer's order formula for a spec's mask (band edges in
 * rad/s), before any prototype is checked.
 *
 * @param spec - canonical spec
 * @param family - the family
 * @returns the formula's result
 * @throws whatever `minimumOrder` throws for a mask beyond its ranges
 */
export function orderFormula(spec: DesignSpec, family: FamilyName): ReturnType<typeof minimumOrder> {
  return minimumOrder({
    family,
    response: spec.response,
    passbandW: spec.passbandHz.map((f) => TWO_PI * f),
    stopbandW: spec.stopbandHz.map((f) => TWO_PI * f),
    passbandLossDb: spec.maxLossDb,
    stopbandAttenuationDb: spec.minAttenuationDb,
  } as Parameters<typeof minimumOrder>[0]);
}

/**
 * Smallest order of a family whose exact prototype meets the mask, starting
 * from the approximation layer's order formula and confirmed on the prototype.
 *
 * @returns the order, or `null` when none up to `maxOrder` does
 */
export function familyMinimumOrder(spec: DesignSpec, family: FamilyName, maxOrder: number): number | null {
  let start = 1;
  try {
    const est = orderFormula(spec, family);
    if (est.beyondRange && est.order > maxOrder) return null;
    start = Math.max(1, Math.min(est.order, maxOrder) - 1);
  } catch {
    start = 1;
  }
  for (let n = start; n <= maxOrder; n++) {
    if (slackOf(spec, designPrototype(spec, family, n, EXACT)) >= 0) {
      // The formula may overestimate by one; check the order below as well.
      if (n === start && n > 1 && slackOf(spec, designPrototype(spec, family, n - 1, EXACT)) >= 0) return n - 1;
      return n;
    }
  }
  return null;
}

/**
 * The prototype to build at a given order. For the equiripple families the
 * margin level is chosen to balance the two kinds of room rounding needs: the
 * frequency slack left on each side of the placement (in units of the typical
 * re-tuned frequency error) and the dB margin of the ripple valleys and
 * stopband peaks (in units of typical dB errors); the level with the largest
 * smaller-of-the-two wins (common practice, no source). The exact level is
 * used when the order is too low to meet the mask at all.
 */
export function choosePrototype(spec: DesignSpec, family: FamilyName, order: number): Prototype {
  const exact = designPrototype(spec, family, order, EXACT);
  const full = slackOf(spec, exact);
  if (!isEquiripple(family) || !(full > 0)) return exact;
  let best = exact;
  let bestScore = 0;
  for (const level of MARGIN_LEVELS.slice(0, -1)) {
    const p = designPrototype(spec, family, order, level);
    const width = slackOf(spec, p);
    if (!(width > 0)) continue;
    const freq = width / 2 / TYPICAL_FREQUENCY_ERROR;
    const passDb = (spec.maxLossDb * (1 - level.rippleFraction)) / TYPICAL_PASSBAND_DB_ERROR;
    const stopDb = level.extraAttenuationDb / TYPICAL_STOPBAND_DB_ERROR;
    const db = family === "chebyshev1" ? passDb : family === "chebyshev2" ? stopDb : Math.min(passDb, stopDb);
    const score = Math.min(freq, db);
    if (score > bestScore) {
      best = p;
      bestScore = score;
    }
  }
  return best;
}

/**
 * The margin levels stricter than the prototype's own, for redesigning an
 * equiripple prototype with more dB margin: at most three of them (the
 * nearest, a middle one and the strictest), least strict first. Empty for the
 * other families.
 *
 * @param spec - canonical spec
 * @param proto - the prototype as designed
 * @returns the levels to try, in order
 */
export function stricterLevels(spec: DesignSpec, proto: Prototype): MarginLevel[] {
  if (!isEquiripple(proto.family)) return [];
  const current = proto.rippleDb !== undefined ? proto.rippleDb / spec.maxLossDb : 1;
  const extra = proto.attenuationDb !== undefined ? proto.attenuationDb - spec.minAttenuationDb : 0;
  const stricter = MARGIN_LEVELS.filter(
    (l) => l.rippleFraction < current - 1e-12 || l.extraAttenuationDb > extra + 1e-12,
  ).reverse();
  if (stricter.length <= 3) return stricter;
  return [stricter[0], stricter[Math.floor(stricter.length / 2)], stricter[stricter.length - 1]] as MarginLevel[];
}

/** Number of stages a prototype order needs for the spec's response. */
export function stageCount(spec: DesignSpec, order: number): number {
  return spec.response === "lowpass" || spec.response === "highpass" ? Math.ceil(order / 2) : order;
}

/**
 * The op-amps a family at an order is built with: the stages planned for the
 * prototype the pipeline builds first (attempt.ts `planPrototype`: the same
 * sections, gains and topology choice), summed. A spec whose stages cannot
 * be planned (the design itself will say why) falls back to one op-amp per
 * stage.
 */
function opampEstimate(spec: DesignSpec, family: FamilyName, order: number): number {
  try {
    return planPrototype(spec, choosePrototype(spec, family, order)).reduce((n, p) => n + p.topology.opampCount, 0);
  } catch {
    return stageCount(spec, order);
  }
}

function delayVariation(spec: DesignSpec, p: Prototype): number {
  const interval = prototypeInterval(spec, p.zpk);
  const zpk = transformPrototype(spec, p.zpk, interval, placeInInterval(interval, 0.5));
  const pb = spec.passbandHz.map((f) => TWO_PI * f);
  let w: Float64Array;
  if (spec.response === "lowpass") w = logGrid((pb[0] as number) / 100, pb[0] as number, 200);
  else if (spec.response === "highpass") w = logGrid(pb[0] as number, (pb[0] as number) * 100, 200);
  else if (spec.response === "bandpass") w = logGrid(pb[0] as number, pb[1] as number, 200);
  else {
    const a = logGrid((pb[0] as number) / 100, pb[0] as number, 100);
    const b = logGrid(pb[1] as number, (pb[1] as number) * 100, 100);
    w = new Float64Array([...a, ...b]);
  }
  const gd = groupDelay(zpk, w);
  let lo = Infinity;
  let hi = -Infinity;
  for (const x of gd) {
    lo = Math.min(lo, x);
    hi = Math.max(hi, x);
  }
  return lo > 0 ? hi / lo - 1 : Infinity;
}

/** The family, its minimum order and the record of the choice. */
export interface FamilyOutcome {
  /** The family. */
  readonly family: FamilyName;
  /** Its minimum order, `null` when none up to the limit meets the mask. */
  readonly order: number | null;
  /** How it was chosen. */
  readonly choice: FamilyChoice;
}

/** A family that meets the mask, with what the automatic choice compares. */
interface Scored {
  readonly family: FamilyName;
  readonly order: number;
  readonly stages: number;
  readonly opamps: number;
  readonly slack: number;
  readonly delay: number;
}

/** The family the spec names, with its minimum order up to 16. */
function namedFamily(spec: DesignSpec, family: FamilyName): FamilyOutcome {
  const order = familyMinimumOrder(spec, family, 16);
  return {
    family,
    order,
    choice: {
      automatic: false,
      priority: null,
      candidates: [],
      reason:
        order === null
          ? `The spec names the ${family} family; no ${family} order up to 16 meets the mask, so the design uses order 16 (or the spec's fixed order) and reports its margins.`
          : `The spec names the ${family} family.`,
    },
  };
}

/** Every family's minimum order and figures (the candidates), and those of the pool that meet the mask (scored). */
function compareFamilies(spec: DesignSpec, pool: readonly FamilyName[]): { candidates: FamilyCandidate[]; scored: Scored[] } {
  const candidates: FamilyCandidate[] = [];
  const scored: Scored[] = [];
  for (const family of ALL_FAMILIES) {
    const order = familyMinimumOrder(spec, family, AUTO_MAX_ORDER);
    const stages = order === null ? null : stageCount(spec, order);
    let delay: number | undefined;
    if (order !== null && spec.priority === "flattest-delay") {
      delay = delayVariation(spec, choosePrototype(spec, family, order));
    }
    candidates.push({
      family,
      order,
      stages,
      opamps: order === null ? null : opampEstimate(spec, family, order),
      monotonic: MONOTONIC.has(family),
      ...(delay === undefined ? {} : { delayVariation: delay }),
    });
    if (order !== null && pool.includes(family)) {
      scored.push({
        family,
        order,
        stages: stages as number,
        opamps: opampEstimate(spec, family, order),
        slack: slackOf(spec, designPrototype(spec, family, order, EXACT)),
        delay: delay ?? 0,
      });
    }
  }
  return { candidates, scored };
}

/** The best of the scored families under the spec's priority (ties: more slack). */
function bestFamily(spec: DesignSpec, scored: readonly Scored[]): Scored {
  let best = scored[0] as Scored;
  for (const c of scored.slice(1)) {
    if (spec.priority === "flattest-delay") {
      if (c.delay < best.delay - 1e-12) best = c;
      continue;
    }
    const [first, second] =
      spec.priority === "fewest-op-amps" ? (["opamps", "stages"] as const) : (["stages", "opamps"] as const);
    const better =
      c[first] < best[first] ||
      (c[first] === best[first] && c[second] < best[second]) ||
      (c[first] === best[first] && c[second] === best[second] && c.slack > best.slack);
    if (better) best = c;
  }
  return best;
}

/** Why the best family won, with every scored family's minimum order. */
function choiceReason(spec: DesignSpec, best: Scored, scored: readonly Scored[]): string {
  const list = scored
    .map((c) =>
      spec.priority === "flattest-delay"
        ? `${c.family} ${c.order} (delay varies ${(c.delay * 100).toFixed(1)} %)`
        : `${c.family} ${c.order} (${c.stages} stage${c.stages === 1 ? "" : "s"}, about ${c.opamps} op-amp${c.opamps === 1 ? "" : "s"})`,
    )
    .join(", ");
  const why =
    spec.priority === "flattest-delay"
      ? `${best.family} has the flattest passband group delay of the families meeting the mask`
      : spec.priority === "monotonic"
        ? `${best.family} needs the fewest stages among the families with a monotonic passband, then the fewest op-amps, then leaves the most room for part rounding`
        : spec.priority === "fewest-op-amps"
          ? `${best.family} needs the fewest op-amps, then the fewest stages, then leaves the most room for part rounding`
          : `${best.family} needs the fewest stages, then the fewest op-amps, then leaves the most room for part rounding`;
  return `Priority ${spec.priority}: ${why}. Minimum orders: ${list}.`;
}

/**
 * Choose the family (or take the named one) and its minimum order.
 *
 * @param spec - canonical spec
 * @returns the family, the minimum order (null when the named family cannot meet the mask within the order limit) and the choice record
 */
export function chooseFamily(spec: DesignSpec): FamilyOutcome {
  if (spec.family !== "auto") return namedFamily(spec, spec.family);
  const pool = spec.priority === "monotonic" ? ALL_FAMILIES.filter((f) => MONOTONIC.has(f)) : ALL_FAMILIES;
  const { candidates, scored } = compareFamilies(spec, pool);
  if (scored.length === 0) {
    // Nothing meets the mask within the limit: fall back to the most selective family at the limit.
    const family: FamilyName = spec.priority === "monotonic" ? "chebyshev2" : "elliptic";
    return {
      family,
      order: null,
      choice: {
        automatic: true,
        priority: spec.priority,
        candidates,
        reason: `No ${spec.priority === "monotonic" ? "monotonic " : ""}family meets the mask with a prototype order up to ${AUTO_MAX_ORDER}; ${family} is the most selective candidate and is used at that limit.`,
      },
    };
  }
  const best = bestFamily(spec, scored);
  return {
    family: best.family,
    order: best.order,
    choice: { automatic: true, priority: spec.priority, candidates, reason: choiceReason(spec, best, scored) },
  };
}
