/**
 * Design for yield: after the nominal design meets the mask, the boards
 * built from it with parts drawn within their tolerances must meet it too,
 * at the spec's `yieldTarget`.
 *
 * The robustness ladder, at each order from the nominal design's up (while
 * the spec leaves the order free), cheapest change first, until the yield's
 * 95 % interval clears the target (src/evaluate/yield.ts, Wilson interval):
 *
 * 1. the nominal design at the default tolerances, then at tighter tolerance
 *    classes where the spec leaves them free (capacitors and resistors a
 *    class at a time, capacitors first: a filter's response is usually most
 *    sensitive to them, common practice, no source);
 * 2. where a stage took a bounded topology's largest gain below its wish
 *    (stages.ts, bounded-gain.ts), the same order with only the last stage
 *    at a bounded gain and with every stage at its equal-peak gain, again
 *    from the default classes up;
 * 3. design centring: the candidate placements inside the slack interval
 *    and the prototypes designed with part of the ripple and attenuation
 *    held back (family.ts `MARGIN_LEVELS`), each re-tuned to the mask, of the
 *    nominal design and of the designs of step 2, are screened and the one
 *    with the highest predicted yield is confirmed (a sampled form of design
 *    centring: S. W. Director & G. D. Hachtel, "The simplicial approximation
 *    approach to design centering", IEEE Trans. Circuits Syst.
 *    24(7):363-372, 1977, centre the nominal point in the acceptable region;
 *    here the candidates are discrete, as the parts are), again from the
 *    default classes up; it costs no op-amp, so it comes before step 4;
 * 4. where the design traded sensitivity for op-amps (one-op-amp
 *    finite-zero, bandpass or high-Q stages, attempt.ts `sturdierStagesOf`),
 *    the same order with multi-amplifier stages in place of all of them, and
 *    of each one alone, again from the default classes up (among the
 *    candidates predicted to clear the target, the fewest op-amps), so
 *    tighter parts and centring are preferred to more op-amps;
 * 5. one order more (up to the order range's last), and again from 1.
 *    Centring is tried at an order only when its tightest classes come
 *    within half the target, so hopeless orders cost a screen, not a search.
 *
 * Candidates are screened by the first-order tolerance model
 * (src/evaluate/spread.ts: the mask on the linearised response of 2000
 * sampled boards, a few milliseconds) and only those it predicts within
 * reach of the target are confirmed by boards.
 *
 * Every candidate confirmed is recorded as an alternative with its family,
 * order, op-amp count, tolerances and yield. When none reaches the target
 * the candidate with the highest lower interval end is kept, and the result
 * says so.
 *
 * @module
 */
import { THIRD_ORDER_IDS } from "./third-order.ts";
import type { FamilyName } from "../approx/index.ts";
import { BATCH, type BoardStage } from "../evaluate/boards.ts";
import { compileStage } from "../evaluate/stage-polynomials.ts";
import { sequentialYield, type YieldEstimate } from "../evaluate/yield.ts";
import { checkpoint } from "../evaluate/progress.ts";
import { linearModel, predictYield, type LinearModel } from "../evaluate/spread.ts";
import { allocateTolerances, CAPACITOR_CLASSES, RESISTOR_CLASSES, type ToleranceClass } from "../evaluate/allocate.ts";
import { TWO_PI } from "../units/constants.ts";
import type { DesignSpec } from "./spec.ts";
import { designPrototype, stricterLevels } from "./family.ts";
import { intervalWidth, prototypeInterval, upHelpsPassband } from "./placement.ts";
import { buildAttempt, meetsSpec, sturdierStagesOf, type Attempt, type PlacedPrototype } from "./attempt.ts";
import { maskPlan, spanRadS } from "./verify.ts";
import { designAtOrder, retuneToMask, type OrderRange, type SearchOutcome } from "./recovery.ts";
import { significant } from "./text.ts";
import { keptYield } from "./yield-memo.ts";
import type { DesignAction } from "./types.ts";

/** Resistor tolerance classes stocked, loosest first (fractions). */
const RESISTOR_TOLERANCES: readonly number[] = RESISTOR_CLASSES.map((c) => c.tolerance);
/** Capacitor tolerance classes of C0G/NP0 ceramic and film capacitors, loosest first (fractions). */
const CAPACITOR_TOLERANCES: readonly number[] = CAPACITOR_CLASSES.map((c) => c.tolerance);

/** Boards of a screening run (one block). */
const SCREEN_BOARDS = 256;

/** One tolerance per part of each stage, in the topology's component order. */
export type PartTolerances = readonly Float64Array[];

/** A tolerance class for every resistor and every capacitor. */
export interface ToleranceClasses {
  /** Resistor tolerance. */
  readonly resistor: number;
  /** Capacitor tolerance. */
  readonly capacitor: number;
}

/** A design candidate whose boards were built. */
export interface YieldCandidate {
  /** The attempt. */
  readonly attempt: Attempt;
  /** The tolerance of every part. */
  readonly tolerances: PartTolerances;
  /** The classes the tolerances come from. */
  readonly classes: ToleranceClasses;
  /** The boards' yield. */
  readonly estimate: YieldEstimate;
  /** What the candidate changed, for the alternatives list. */
  readonly change: string;
}

/** What designing for yield gave. */
export interface YieldOutcome {
  /** The candidate kept. */
  readonly chosen: YieldCandidate;
  /** Every candidate confirmed, in the order tried. */
  readonly candidates: readonly YieldCandidate[];
  /** What the ladder did. */
  readonly actions: readonly DesignAction[];
}

/** The component names of each stage of an attempt, in compiled order. */
function names(a: Attempt, i: number): readonly string[] {
  return (a.plans[i] as Attempt["plans"][number]).topology.componentNames;
}

/**
 * Every part at its class's tolerance.
 *
 * @param a - the attempt
 * @param classes - resistor and capacitor classes
 * @returns per-stage tolerances in component order
 */
export function classTolerances(a: Attempt, classes: ToleranceClasses): PartTolerances {
  return a.plans.map((_, i) => Float64Array.from(names(a, i), (n) => (n.startsWith("C") ? classes.capacitor : classes.resistor)));
}

/**
 * The attempt's stages as Monte Carlo board stages.
 *
 * @param spec - canonical spec
 * @param a - the attempt
 * @param tolerances - per-part tolerances
 * @returns the board stages
 */
export function boardStagesOf(spec: DesignSpec, a: Attempt, tolerances: PartTolerances): BoardStage[] {
  const span = spanRadS(maskPlan(spec).bands);
  return a.plans.map((p, i) => {
    const values = (a.chosen[i] as Attempt["chosen"][number]).values;
    const compiled = compileStage(p.topology, values, spec.opamp, span);
    return {
      compiled,
      nominal: Float64Array.from(compiled.componentNames, (n) => values[n] as number),
      tolerance: tolerances[i] as Float64Array,
      radius: TWO_PI * p.topology.figures(values).f0Hz,
    };
  });
}

/**
 * The yield of an attempt's boards, sequentially to the spec's cap.
 *
 * @param spec - canonical spec
 * @param a - the attempt
 * @param tolerances - per-part tolerances
 * @param maxBoards - cap (the spec's by default)
 * @param seed - seed of the boards (the spec's by default)
 * @param target - the yield the run decides against (the spec's by default)
 * @returns the estimate (kept per attempt and arguments: yield-memo.ts)
 */
export function attemptYield(
  spec: DesignSpec,
  a: Attempt,
  tolerances: PartTolerances,
  maxBoards = spec.yieldMaxBoards,
  seed = spec.yieldSeed,
  target = spec.yieldTarget,
): YieldEstimate {
  return keptYield(spec, a, tolerances, maxBoards, seed, target, () =>
    sequentialYield(boardStagesOf(spec, a, tolerances), maskPlan(spec), { target, seed, distribution: spec.partDistribution, maxBoards, minBoards: BATCH }),
  );
}

/** The class ladder: each step one class tighter for capacitors or resistors (capacitors first), only where the spec leaves them free. */
export function classLadder(spec: DesignSpec): ToleranceClasses[] {
  const r = spec.resistorToleranceFixed ? [spec.resistorTolerance] : [spec.resistorTolerance, ...RESISTOR_TOLERANCES.filter((t) => t < spec.resistorTolerance - 1e-12)];
  const c = spec.capacitorToleranceFixed ? [spec.capacitorTolerance] : [spec.capacitorTolerance, ...CAPACITOR_TOLERANCES.filter((t) => t < spec.capacitorTolerance - 1e-12)];
  // stop tightening resistors at 0.1 % and capacitors at 1 %: beyond that a filter is trimmed, not bought
  const out: ToleranceClasses[] = [{ resistor: r[0] as number, capacitor: c[0] as number }];
  let ri = 0;
  let ci = 0;
  while (ri < r.length - 1 || ci < c.length - 1) {
    if (ci < c.length - 1 && (ci <= ri || ri >= r.length - 1)) ci++;
    else ri++;
    out.push({ resistor: r[ri] as number, capacitor: c[ci] as number });
  }
  return out;
}

/** Text of a tolerance pair: "1 % R / 5 % C". */
export function classText(c: ToleranceClasses): string {
  return `${significant(c.resistor * 100, 3)} % R / ${significant(c.capacitor * 100, 3)} % C`;
}

/** Text of a yield estimate: "97.4 % of boards [96.2, 98.3]". */
export function yieldText(y: YieldEstimate): string {
  const pc = (x: number): string => significant(x * 100, 3);
  return `${pc(y.fraction)} % of ${y.boards} boards [${pc(y.lower95)}, ${pc(y.upper95)}]`;
}

/** The first-order model of each attempt screened (null: the model could not be formed). */
const models = new WeakMap<Attempt, LinearModel | null>();

/** Boards of the linear model's screening run. */
const SCREEN_SAMPLES = 2000;

/**
 * The yield the first-order model predicts for an attempt (src/evaluate/spread.ts),
 * with the constraint that binds: a cheap screen, confirmed by boards only
 * for the candidate kept. A stage the model cannot linearise is screened by
 * one block of boards instead.
 */
export function screenYield(spec: DesignSpec, a: Attempt, tolerances: PartTolerances): { fraction: number; short: "passband" | "stopband" | "gain" | null } {
  const plan = maskPlan(spec);
  let model = models.get(a);
  if (model === undefined) {
    try {
      model = linearModel(boardStagesOf(spec, a, tolerances), plan);
    } catch {
      model = null;
    }
    models.set(a, model);
  }
  if (model === null) return { fraction: attemptYield(spec, a, tolerances, SCREEN_BOARDS).fraction, short: null };
  const flat = new Float64Array(model.parts.length);
  let k = 0;
  for (const t of tolerances) for (const x of t) flat[k++] = x;
  const y = predictYield(model, plan, flat, spec.partDistribution, { samples: SCREEN_SAMPLES, seed: spec.yieldSeed });
  let short: "passband" | "stopband" | "gain" | null = null;
  let beta = Infinity;
  for (const c of y.constraints) {
    if (c.beta < beta) {
      beta = c.beta;
      short = c.constraint;
    }
  }
  return { fraction: y.fraction, short };
}

/** Centring candidates: placements towards the side the binding constraint needs, and prototypes with margin held back, each meeting the mask nominally. */
function centringCandidates(spec: DesignSpec, base: Attempt, short: "passband" | "stopband" | "gain" | null): { attempt: Attempt; change: string }[] {
  const out: { attempt: Attempt; change: string }[] = [];
  const placed: PlacedPrototype = { proto: base.proto, interval: base.interval };
  const build = (p: PlacedPrototype, position: number): Attempt | null => {
    const a = buildAttempt(spec, p, { position, wide: false, gainBounds: base.gainBounds });
    return meetsSpec(spec, a) ? a : null;
  };
  // moving up the interval helps the passband when upHelpsPassband
  const towardsPass = upHelpsPassband(spec) ? [0.7, 0.9] : [0.3, 0.1];
  const towardsStop = upHelpsPassband(spec) ? [0.3] : [0.7];
  const positions = short === "stopband" ? towardsStop : short === "passband" ? towardsPass : [0.35, 0.65];
  for (const position of positions) {
    const a = build(placed, position);
    if (a !== null) out.push({ attempt: a, change: `placed at ${Math.round(position * 100)} % of the slack interval` });
  }
  const levels = stricterLevels(spec, base.proto);
  levels.forEach((level, k) => {
    const proto = designPrototype(spec, base.proto.family, base.proto.order, level);
    const interval = prototypeInterval(spec, proto.zpk);
    if (!(intervalWidth(interval) > 0)) return;
    const held = [
      proto.rippleDb === undefined ? "" : `ripple ${significant(proto.rippleDb, 3)} dB of ${significant(spec.maxLossDb, 3)}`,
      proto.attenuationDb === undefined ? "" : `attenuation ${significant(proto.attenuationDb, 4)} dB for ${significant(spec.minAttenuationDb, 4)}`,
    ].filter((x) => x !== "");
    // the most held-back prototype is also tried moved towards the binding band
    const at = k === levels.length - 1 && short !== null ? [0.5, (short === "passband" ? towardsPass : towardsStop)[0] as number] : [0.5];
    for (const position of at) {
      const a = build({ proto, interval }, position);
      if (a === null) continue;
      const where = position === 0.5 ? "" : `, placed at ${Math.round(position * 100)} % of its slack`;
      out.push({ attempt: a, change: `held margin back (${held.join(", ")}${where})` });
    }
  });
  return out;
}

/** The op-amps of an attempt. */
export function opampCount(a: Attempt): number {
  return a.plans.reduce((k, p) => k + p.topology.opampCount, 0);
}

/** A predicted yield that is worth confirming with boards: within a third of the allowed failures of the target. */
function worthConfirming(spec: DesignSpec, predicted: number): boolean {
  return predicted >= 1 - (1 - spec.yieldTarget) * 1.3;
}

/**
 * Run the robustness ladder from the nominal search's outcome.
 *
 * @param spec - canonical spec
 * @param family - the family
 * @param orders - the orders the nominal search could use
 * @param nominal - the nominal search's outcome
 * @returns the candidate kept, every candidate tried and the actions
 */
export function designForYield(spec: DesignSpec, family: FamilyName, orders: OrderRange, nominal: SearchOutcome): YieldOutcome {
  const ladder = classLadder(spec);
  const defaults = ladder[0] as ToleranceClasses;
  const candidates: YieldCandidate[] = [];
  const actions: DesignAction[] = [];
  const confirm = (attempt: Attempt, classes: ToleranceClasses, change: string): YieldCandidate => {
    checkpoint("yield", `yield: ${family} order ${attempt.proto.order}, ${change} at ${classText(classes)}`);
    const tolerances = classTolerances(attempt, classes);
    const isFirst = candidates.length === 0;
    const estimate = isFirst
      ? attemptYield(spec, attempt, tolerances)
      : attemptYield(spec, attempt, tolerances, spec.yieldMaxBoards, selectionSeed(spec), selectionTarget(spec));
    const c: YieldCandidate = { attempt, tolerances, classes, estimate, change };
    candidates.push(c);
    return c;
  };
  const better = (x: YieldCandidate, y: YieldCandidate): YieldCandidate =>
    y.estimate.lower95 > x.estimate.lower95 || (y.estimate.lower95 === x.estimate.lower95 && y.estimate.fraction > x.estimate.fraction) ? y : x;
  const first = confirm(nominal.attempt, defaults, "the nominal design");
  if (first.estimate.met || !meetsSpec(spec, nominal.attempt)) return { chosen: first, candidates, actions };
  let best = first;
  const startOrder = nominal.attempt.proto.order;
  const lastOrder = spec.order !== null ? startOrder : Math.max(startOrder, orders.last);
  for (let order = startOrder; order <= lastOrder; order++) {
    let base: Attempt;
    if (order === startOrder) base = nominal.attempt;
    else {
      const outcome = designAtOrder(spec, family, order, { placement: false, actions: [] });
      if (!outcome.met) continue;
      base = outcome.attempt;
    }
    const baseScreen = screenYield(spec, base, classTolerances(base, defaults));
    const baseDesign = { attempt: base, change: order === startOrder ? "the nominal design" : `order ${order}` };
    // first the design as it is at each class; then, where a stage took a bounded gain below its
    // wish, the same order with fewer such stages; then (where the tightest classes come within reach
    // of the target) the centring candidates at each class, which cost no op-amp; then, where it traded
    // sensitivity for op-amps, the same order with multi-amplifier stages at each class
    let bestPredicted = 0;
    let plainPool: { attempt: Attempt; change: string }[] = [];
    for (const phase of [0, 1, 2, 3]) {
      let pool: { attempt: Attempt; change: string }[];
      if (phase === 0) pool = [baseDesign];
      else if (phase === 1) {
        // stages that took a bounded topology's largest gain: the same order with only the last stage
        // at a bounded gain, and with every stage at its wish
        plainPool = plainGainsVariants(spec, base);
        pool = plainPool;
        if (pool.length === 0) continue;
      } else if (phase === 2) {
        // centring is worth its cost only where the tightest classes come within reach of the target
        if (bestPredicted < spec.yieldTarget / 2) continue;
        pool = [
          ...centringCandidates(spec, base, baseScreen.short),
          ...plainPool.flatMap((d) => centringCandidates(spec, d.attempt, baseScreen.short).map((c) => ({ ...c, change: `${d.change}, ${c.change}` }))),
        ];
      } else {
        pool = sturdierVariants(spec, base);
        if (pool.length === 0) continue;
      }
      for (const classes of ladder) {
        let pick: { attempt: Attempt; change: string; fraction: number } | null = null;
        for (const d of pool) {
          const f = d.attempt === base && classes === defaults ? baseScreen.fraction : screenYield(spec, d.attempt, classTolerances(d.attempt, classes)).fraction;
          if (pick === null || preferable(spec, { ...d, fraction: f }, pick)) pick = { ...d, fraction: f };
        }
        if (pick === null) continue;
        bestPredicted = Math.max(bestPredicted, pick.fraction);
        if (!worthConfirming(spec, pick.fraction)) continue;
        if (pick.attempt === nominal.attempt && classes === defaults) continue; // confirmed already
        const change = classes === defaults ? pick.change : `${pick.change}, ${classText(classes)}`;
        const c = confirm(pick.attempt, classes, pick.attempt === base || order === startOrder ? change : `${change}, order ${order}`);
        best = better(best, c);
        if (!clearsTarget(spec, c.estimate)) continue;
        const chosen = classes === defaults ? c : (allocatePerPart(spec, c) ?? c);
        // the yield is reported on the spec's own boards (apart from the ones that chose it): a candidate
        // that clears the selection boards but not those goes on up the ladder
        if (chosen !== candidates[0] && !attemptYield(spec, chosen.attempt, chosen.tolerances).met) continue;
        if (order !== startOrder) actions.push({ code: "raised-order", message: `Raised the order to ${order} for the yield target.` });
        if (phase === 1 || phase === 3) actions.push({ code: "sturdier-stages", message: `Built the design with ${pick.change} for the yield target (lower sensitivity to the parts, more op-amps).` });
        else if (pick.attempt !== base) {
          actions.push({
            code: "centred-for-yield",
            message: `Centred the design for yield: ${pick.change} (the first-order tolerance model put the ${baseScreen.short ?? "binding"} constraint closest to failing).`,
          });
        }
        if (classes !== defaults) actions.push({ code: "tightened-tolerances", message: `Tightened the part tolerances to ${classText(classes)} for the yield target (the spec leaves them free).` });
        if (chosen !== c) {
          candidates.push(chosen);
          actions.push({ code: "tightened-tolerances", message: `Allocated the tolerances part by part (${chosen.change}): only the parts the response is sensitive to keep the tighter classes.` });
        }
        actions.push({ code: "confirmed-yield", message: `The boards reach the yield target: ${yieldText(chosen.estimate)}.` });
        return { chosen, candidates, actions };
      }
    }
  }
  actions.push({
    code: "kept-best-attempt",
    message: `No candidate reached the yield target of ${significant(spec.yieldTarget * 100, 3)} %; kept the one with the best interval (${best.change}: ${yieldText(best.estimate)} at ${classText(best.classes)}).`,
  });
  return { chosen: best, candidates, actions };
}

/**
 * The attempt rebuilt with fewer stages at a bounded gain below their wish
 * (attempt.ts `gainBounds`): only the last stage (`"last"`, the stages
 * before it at their wish) and none (`"none"`, every stage at the gain the
 * equal-peak rule asks of it, so a multi-amplifier stage takes it), each
 * re-tuned to the mask; those that meet it and differ from the base.
 */
function plainGainsVariants(spec: DesignSpec, base: Attempt): { attempt: Attempt; change: string }[] {
  if (!base.exactPlans.some((p) => p.bounded === true)) return [];
  const placed: PlacedPrototype = { proto: base.proto, interval: base.interval };
  const out: { attempt: Attempt; change: string }[] = [];
  const ids = (a: Attempt): string => a.exactPlans.map((p) => `${p.topology.id} ${p.target.gain}`).join();
  const seen = new Set([ids(base)]);
  for (const gainBounds of ["last", "none"] as const) {
    const a = retuneToMask(spec, buildAttempt(spec, placed, { position: base.position, wide: false, gainBounds }));
    if (!meetsSpec(spec, a) || seen.has(ids(a))) continue;
    seen.add(ids(a));
    out.push({
      attempt: a,
      change: gainBounds === "none" ? "every stage at the gain the equal-peak rule gives it (no stage below its level)" : "only the last stage below the gain the equal-peak rule gives it",
    });
  }
  return out;
}

/**
 * The attempt rebuilt with multi-amplifier stages where it used one-op-amp
 * finite-zero, bandpass or high-Q stages (attempt.ts `sturdierStagesOf`):
 * all of them, and (where it used several such topologies) each one alone,
 * each re-tuned to the mask; those that meet it (none when there is nothing
 * to trade).
 */
/** What a sturdier variant changed, for the action's message. */
function sturdierChange(avoid: ReadonlySet<string>): string {
  const third = [...avoid].filter((id) => THIRD_ORDER_IDS.includes(id));
  const rest = [...avoid].filter((id) => !THIRD_ORDER_IDS.includes(id));
  const parts = [
    ...(rest.length > 0 ? [`multi-amplifier stages instead of ${rest.map((id) => `"${id}"`).join(", ")}`] : []),
    ...(third.length > 0 ? [`a first-order and a second-order stage instead of ${third.map((id) => `"${id}"`).join(", ")}`] : []),
  ];
  return parts.join(" and ");
}

function sturdierVariants(spec: DesignSpec, base: Attempt): { attempt: Attempt; change: string }[] {
  const all = sturdierStagesOf(base);
  if (all.size === 0) return [];
  const placed: PlacedPrototype = { proto: base.proto, interval: base.interval };
  // every traded topology left out, then (where there are several) each one on its own: the pool's
  // preference (fewest op-amps among the candidates predicted to clear the target) picks among them
  const sets: ReadonlySet<string>[] = [all, ...(all.size > 1 ? [...all].map((id) => new Set([id])) : [])];
  const out: { attempt: Attempt; change: string }[] = [];
  for (const avoid of sets) {
    const a = retuneToMask(spec, buildAttempt(spec, placed, { position: base.position, wide: false, avoid, gainBounds: base.gainBounds }));
    if (!meetsSpec(spec, a)) continue;
    out.push({ attempt: a, change: sturdierChange(avoid) });
  }
  return out;
}

/**
 * Whether candidate `x` is to be preferred to `y` at one tolerance class: when
 * both are predicted to clear the yield target, the one with fewer op-amps
 * (then the higher prediction); otherwise the higher prediction.
 */
function preferable(spec: DesignSpec, x: { attempt: Attempt; fraction: number }, y: { attempt: Attempt; fraction: number }): boolean {
  const likely = (f: number): boolean => f >= selectionTarget(spec);
  if (likely(x.fraction) && likely(y.fraction)) {
    const ox = opampCount(x.attempt);
    const oy = opampCount(y.attempt);
    if (ox !== oy) return ox < oy;
  }
  return x.fraction > y.fraction;
}

/** Relative cost of a tolerance under a class table (the class with that tolerance, or the nearest tighter one). */
function classCost(table: readonly ToleranceClass[], t: number): number {
  const c = table.filter((x) => x.tolerance <= t + 1e-12).sort((a, b) => b.tolerance - a.tolerance)[0];
  return (c ?? (table[table.length - 1] as ToleranceClass)).cost;
}

/**
 * Per-part tolerance allocation from a class-wide candidate that meets the
 * target (src/evaluate/allocate.ts, after B. J. Karafin, "The optimum
 * assignment of component tolerances for electrical networks", Bell Syst.
 * Tech. J. 50(4):1225-1242, 1971): each part may take any class from the
 * default down to the candidate's (only the default when the spec fixes
 * it); the allocation is kept when it is cheaper under the default cost
 * table and its boards, confirmed like any candidate, still meet the target.
 *
 * @returns the allocated candidate, or null when it does not pay or does not hold
 */
function allocatePerPart(spec: DesignSpec, c: YieldCandidate): YieldCandidate | null {
  const model = models.get(c.attempt);
  if (model === undefined || model === null) return null;
  const allowed = (table: readonly ToleranceClass[], loosest: number, tightest: number): ToleranceClass[] =>
    table.filter((x) => x.tolerance <= loosest + 1e-12 && x.tolerance >= tightest - 1e-12);
  const classes = model.parts.map((p) =>
    p.kind === "capacitor"
      ? allowed(CAPACITOR_CLASSES, spec.capacitorTolerance, c.classes.capacitor)
      : allowed(RESISTOR_CLASSES, spec.resistorTolerance, c.classes.resistor),
  );
  if (classes.some((x) => x.length === 0)) return null;
  const plan = maskPlan(spec);
  let allocation;
  try {
    allocation = allocateTolerances(model, plan, { target: selectionTarget(spec), distribution: spec.partDistribution, classes, seed: spec.yieldSeed });
  } catch {
    return null;
  }
  if (!allocation.met) return null;
  const wide = model.parts.reduce((k, p) => k + (p.kind === "capacitor" ? classCost(CAPACITOR_CLASSES, c.classes.capacitor) : classCost(RESISTOR_CLASSES, c.classes.resistor)), 0);
  if (!(allocation.cost < wide - 1e-9)) return null;
  let k = 0;
  const tolerances = c.tolerances.map((t) => Float64Array.from(t, () => allocation.tolerance[k++] as number));
  const estimate = attemptYield(spec, c.attempt, tolerances, spec.yieldMaxBoards, selectionSeed(spec), selectionTarget(spec));
  if (!clearsTarget(spec, estimate)) return null;
  const tightened = [...allocation.tolerance].filter((t, j) => t < (model.parts[j]?.kind === "capacitor" ? spec.capacitorTolerance : spec.resistorTolerance) - 1e-12).length;
  const change = `${c.change}, per part: ${tightened} of ${model.parts.length} parts tightened, cost ${significant(allocation.cost, 3)} against ${significant(wide, 3)}`;
  return { attempt: c.attempt, tolerances, classes: c.classes, estimate, change };
}

/**
 * Whether a candidate's selection boards clear the target with room to
 * spare: the lower end of their interval a fifth of the allowed failures
 * above it (0.96 for a 0.95 target), so the independent boards it is then
 * reported on meet the target too (common practice, no source).
 */
function clearsTarget(spec: DesignSpec, y: YieldEstimate): boolean {
  return y.lower95 >= selectionTarget(spec);
}

/** The target the selection boards decide against: a fifth of the allowed failures above the spec's. */
function selectionTarget(spec: DesignSpec): number {
  return spec.yieldTarget + (1 - spec.yieldTarget) / 5;
}

/**
 * Seed of the boards that choose between candidates: a stream apart from the
 * spec's own (the golden-ratio constant mixed in), so the yield reported for
 * a chosen candidate comes from boards that took no part in choosing it
 * (choosing the best of several on the boards it is reported on biases the
 * report upwards).
 */
function selectionSeed(spec: DesignSpec): number {
  return (spec.yieldSeed ^ 0x9e3779b9) >>> 0;
}

/**
 * The candidate as reported: when it was chosen among others, its yield
 * again on the spec's own boards, independent of the ones that chose it.
 */
export function reported(spec: DesignSpec, outcome: YieldOutcome): YieldOutcome {
  const c = outcome.chosen;
  if (c === outcome.candidates[0]) return outcome;
  const chosen: YieldCandidate = { ...c, estimate: attemptYield(spec, c.attempt, c.tolerances) };
  const y = chosen.estimate;
  const message = `${y.met ? "The boards reach" : "On fresh boards the design misses"} the yield target: ${yieldText(y)}, on boards apart from the ${yieldText(c.estimate)} that chose it.`;
  const actions = outcome.actions.map((a) => (a.code === "confirmed-yield" ? { code: a.code, message } : a));
  return { ...outcome, chosen, actions, candidates: outcome.candidates.map((x) => (x === c ? chosen : x)) };
}
