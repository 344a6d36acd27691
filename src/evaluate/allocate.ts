/**
 * Per-part tolerance allocation: the tolerance class of every part, at the
 * least cost for a yield target, so that only the parts the response is
 * sensitive to get the tighter, dearer class.
 *
 * Problem: that of B. J. Karafin, "Statistical circuit design: the optimum
 * assignment of component tolerances for electrical networks", Bell System
 * Technical Journal 50(4):1225-1242, 1971 (the issue, title and first page
 * checked; the method there is recalled from memory and not reproduced
 * here): minimise the total relative cost of the parts subject to the yield
 * reaching its target.
 *
 * Method: marginal analysis on the linear model of spread.ts with common
 * random numbers (one fixed set of sampled boards, so every comparison of
 * two allocations sees the same boards). Every part starts at its cheapest
 * class; at each step the part whose next tighter class gains the most
 * passing boards per unit of added cost is tightened, until the linear
 * yield reaches the target plus a safety margin; when no single tightening
 * passes another board (far from the target, all boards fail) the part with
 * the largest drop of `sum_c (sigma_c / margin_c)^2` (the constraints'
 * first-order spreads against their nominal margins) per unit cost is
 * tightened instead. Then parts are loosened back one class at a time, the
 * largest saving first, while the target still holds. A candidate is
 * evaluated on the boards whose margin its change could turn over only: a
 * part's change moves a level by at most `|dt d_k| max_i |g_ij|`, a margin
 * by twice that.
 *
 * Limits: a greedy search on a discrete lattice; the loosening pass removes
 * tightenings a later step made redundant, but the result is a local
 * optimum, not a proven least cost (the problem is a non-convex integer
 * programme), and it is that of the linear model on one sample set: its
 * sampling error (about sqrt(p (1 - p) / samples)) and the model's own
 * error (spread.ts) are what the safety margin covers. Confirm the result
 * with {@link runBoards}.
 *
 * Cost: O(samples x points) per candidate evaluation at most, steps about
 * the number of class changes; a 16-part design takes a few milliseconds
 * (test/evaluate/allocate.test.ts times it).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { PartDistribution } from "./boards.ts";
import type { MaskPlan } from "./mask.ts";
import { constraintSpreads, linearLevels, PASS_POINT, pointMargin, sharedDeviations, sigmaPerTolerance, type ConstraintSpread, type LinearModel, type ModelPart } from "./spread.ts";

/** A tolerance class a part may be bought in. */
export interface ToleranceClass {
  /** Name shown in reports and the BOM, e.g. "1 %". */
  readonly label: string;
  /** Tolerance as a fraction (0.01 for 1 %). */
  readonly tolerance: number;
  /** Relative cost (any unit, the same for all parts). */
  readonly cost: number;
}

/**
 * Resistor classes (thin or thick film) and their default relative costs,
 * 1 % = 1: common practice, no source; override them with the real prices.
 */
export const RESISTOR_CLASSES: readonly ToleranceClass[] = Object.freeze([
  { label: "5 %", tolerance: 0.05, cost: 0.9 },
  { label: "2 %", tolerance: 0.02, cost: 0.95 },
  { label: "1 %", tolerance: 0.01, cost: 1 },
  { label: "0.5 %", tolerance: 0.005, cost: 1.5 },
  { label: "0.25 %", tolerance: 0.0025, cost: 2.5 },
  { label: "0.1 %", tolerance: 0.001, cost: 4 },
]);

/**
 * Capacitor classes (C0G/NP0 ceramic or film, the dielectrics a filter
 * uses) and their default relative costs, 5 % = 1: common practice, no
 * source; override them with the real prices.
 */
export const CAPACITOR_CLASSES: readonly ToleranceClass[] = Object.freeze([
  { label: "10 %", tolerance: 0.1, cost: 0.9 },
  { label: "5 %", tolerance: 0.05, cost: 1 },
  { label: "2 %", tolerance: 0.02, cost: 1.6 },
  { label: "1 %", tolerance: 0.01, cost: 2.5 },
]);

/** Options of {@link allocateTolerances}. */
export interface AllocationOptions {
  /** Yield target, a fraction in (0, 1). */
  readonly target: number;
  /**
   * Part spread.
   * @defaultValue "uniform"
   */
  readonly distribution?: PartDistribution;
  /**
   * The classes each part may take, one list per part in board order.
   * @defaultValue {@link RESISTOR_CLASSES} for a resistor, {@link CAPACITOR_CLASSES} for a capacitor
   */
  readonly classes?: readonly (readonly ToleranceClass[])[];
  /**
   * Boards sampled (common to every comparison).
   * @defaultValue 2000
   */
  readonly samples?: number;
  /**
   * Seed of the sampled boards.
   * @defaultValue 1
   */
  readonly seed?: number;
  /**
   * How far above the target the linear yield must stand (a fraction; the
   * requirement is capped at halfway between the target and 1). The default
   * covers about two standard errors of 2000 samples at a 95 % target.
   * @defaultValue 0.01
   */
  readonly safety?: number;
}

/** A per-part tolerance allocation. */
export interface ToleranceAllocation {
  /** Tolerance of each part, board order (fractions). */
  readonly tolerance: Float64Array;
  /** Label of each part's class. */
  readonly classes: readonly string[];
  /** Total relative cost. */
  readonly cost: number;
  /** Linear-model yield of the allocation on the sampled boards. */
  readonly predicted: number;
  /** The linear yield the allocation had to reach (target plus safety). */
  readonly required: number;
  /** Whether `predicted >= required`. */
  readonly met: boolean;
  /** Class changes made (tightenings and loosenings). */
  readonly steps: number;
  /** The constraints' first-order spreads at the allocation. */
  readonly constraints: readonly ConstraintSpread[];
}

/**
 * A part's classes, loosest first, without the dominated ones (a class no
 * tighter than a cheaper one): along the list the tolerance falls and the
 * cost rises strictly.
 */
function ladder(classes: readonly ToleranceClass[]): ToleranceClass[] {
  const byTolerance = [...classes].sort((a, b) => b.tolerance - a.tolerance || a.cost - b.cost);
  const out: ToleranceClass[] = [];
  let cheapestTighter = Infinity;
  for (let i = byTolerance.length - 1; i >= 0; i--) {
    const c = byTolerance[i] as ToleranceClass;
    if (c.cost < cheapestTighter) {
      out.unshift(c);
      cheapestTighter = c.cost;
    }
  }
  return out;
}

/** Check the options the allocation cannot run without. */
function checkOptions(fn: string, parts: readonly ModelPart[], o: AllocationOptions): void {
  if (!(o.target > 0 && o.target < 1)) {
    throw new InvalidArgumentError({ fn, path: "options.target", received: o.target, message: "expected a yield target between 0 and 1 (exclusive)" });
  }
  if (o.classes !== undefined && o.classes.length !== parts.length) {
    throw new InvalidArgumentError({ fn, path: "options.classes", received: o.classes.length, message: `expected one list of classes per part (${parts.length})` });
  }
  (o.classes ?? []).forEach((list, j) => {
    if (list.length === 0 || list.some((c) => !(c.tolerance >= 0 && c.tolerance < 1) || !(c.cost >= 0) || !Number.isFinite(c.cost))) {
      throw new InvalidArgumentError({
        fn,
        path: `options.classes[${j}]`,
        received: list,
        message: "expected at least one class, each with a tolerance in [0, 1) and a finite cost >= 0",
      });
    }
  });
}

/** The search's state: each part's class, the sampled boards' levels and margins. */
interface State {
  readonly model: LinearModel;
  readonly plan: MaskPlan;
  readonly ladders: readonly ToleranceClass[][];
  readonly index: Int32Array;
  readonly tolerance: Float64Array;
  readonly draws: Float64Array;
  readonly samples: number;
  /** Levels, board-major. */
  readonly level: Float64Array;
  readonly margin: Float64Array;
  /** Gradient columns: entry `j * points + i`. */
  readonly column: Float64Array;
  /** max_i |g_ij| per part. */
  readonly reach: Float64Array;
  readonly targetDb: number;
  passed: number;
}

/**
 * The smallest margin of board `k`'s levels with part `j`'s column added
 * `c` times (the mask check of {@link pointMargin} on shifted levels,
 * without writing them).
 */
function shiftedMargin(s: State, k: number, j: number, c: number): number {
  const { level, column } = s;
  const band = s.model.band;
  const n = band.length;
  let peak = -Infinity;
  let low = Infinity;
  let stop = -Infinity;
  for (let i = 0, a = k * n, b = j * n; i < n; i++, a++, b++) {
    const x = (level[a] as number) + (column[b] as number) * c;
    if (band[i] === PASS_POINT) {
      if (x > peak) peak = x;
      if (x < low) low = x;
    } else if (x > stop) stop = x;
  }
  const { limits } = s.plan;
  const loss = limits.maxLossDb - (peak - low);
  const stopband = peak - stop - limits.minAttenuationDb;
  const gain = limits.gainToleranceDb - Math.abs(peak - s.targetDb);
  return loss < stopband ? (loss < gain ? loss : gain) : stopband < gain ? stopband : gain;
}

/** Boards that pass when part `j` takes tolerance `t` (only the boards whose verdict could turn are re-evaluated). */
function passedWith(s: State, j: number, t: number): number {
  const { samples, margin, draws } = s;
  const p = s.model.parts.length;
  const dt = t - (s.tolerance[j] as number);
  const reach = 2 * Math.abs(dt) * (s.reach[j] as number);
  let passed = s.passed;
  for (let k = 0; k < samples; k++) {
    const d = draws[k * p + j] as number;
    const m = margin[k] as number;
    if (Math.abs(m) > reach * Math.abs(d)) continue;
    const after = shiftedMargin(s, k, j, dt * d);
    if (m >= 0 && after < 0) passed--;
    else if (m < 0 && after >= 0) passed++;
  }
  return passed;
}

/** Move part `j` to class `to` and update every board's levels and margin. */
function apply(s: State, j: number, to: number): void {
  const { model, samples, level, margin, column } = s;
  const n = model.levelDb.length;
  const p = model.parts.length;
  const t = (s.ladders[j] as ToleranceClass[])[to]?.tolerance as number;
  const dt = t - (s.tolerance[j] as number);
  s.index[j] = to;
  s.tolerance[j] = t;
  let passed = 0;
  for (let k = 0; k < samples; k++) {
    const c = dt * (s.draws[k * p + j] as number);
    for (let i = 0; i < n; i++) level[k * n + i] = (level[k * n + i] as number) + (column[j * n + i] as number) * c;
    const m = pointMargin(level, k * n, model.band, s.plan.limits, s.targetDb);
    margin[k] = m;
    if (m >= 0) passed++;
  }
  s.passed = passed;
}

/** The search's starting state: every part at its cheapest class. */
function initialState(model: LinearModel, plan: MaskPlan, ladders: ToleranceClass[][], o: AllocationOptions): State {
  const p = model.parts.length;
  const n = model.levelDb.length;
  const samples = o.samples ?? 2000;
  const tolerance = Float64Array.from(ladders, (l) => (l[0] as ToleranceClass).tolerance);
  const draws = sharedDeviations(p, samples, o.distribution ?? "uniform", o.seed ?? 1);
  const column = new Float64Array(p * n);
  const reach = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    for (let i = 0; i < n; i++) {
      const g = model.gradient[i * p + j] as number;
      column[j * n + i] = g;
      reach[j] = Math.max(reach[j] as number, Math.abs(g));
    }
  }
  const s: State = {
    model,
    plan,
    ladders,
    index: new Int32Array(p),
    tolerance,
    draws,
    samples,
    level: linearLevels(model, tolerance, draws, samples),
    margin: new Float64Array(samples),
    column,
    reach,
    targetDb: 20 * Math.log10(plan.limits.gain),
    passed: 0,
  };
  for (let k = 0; k < samples; k++) {
    s.margin[k] = pointMargin(s.level, k * n, model.band, plan.limits, s.targetDb);
    if ((s.margin[k] as number) >= 0) s.passed++;
  }
  return s;
}

/** Drop of `sum_c (sigma_c / margin_c)^2` when part `j` goes from tolerance `t0` to `t1`. */
function spreadDrop(spreads: readonly ConstraintSpread[], unit: number, j: number, t0: number, t1: number): number {
  let drop = 0;
  for (const c of spreads) {
    const m = Math.max(c.marginDb, 1e-3);
    drop += (((c.gradient[j] as number) * unit) ** 2 * (t0 * t0 - t1 * t1)) / (m * m);
  }
  return drop;
}

/** The next tighter class of part `j` and its added cost, or null at its tightest. */
function nextTighter(s: State, j: number): { readonly from: ToleranceClass; readonly to: ToleranceClass; readonly cost: number } | null {
  const ladder = s.ladders[j] as ToleranceClass[];
  const at = s.index[j] as number;
  if (at + 1 >= ladder.length) return null;
  const from = ladder[at] as ToleranceClass;
  const to = ladder[at + 1] as ToleranceClass;
  return { from, to, cost: to.cost - from.cost };
}

/** The tightening with the largest drop of the constraints' spread per unit cost; -1 when none helps. */
function spreadTightening(s: State, spreads: readonly ConstraintSpread[], unit: number): number {
  let best = -1;
  let bestDrop = 0;
  for (let j = 0; j < s.index.length; j++) {
    const step = nextTighter(s, j);
    if (step === null) continue;
    const drop = spreadDrop(spreads, unit, j, step.from.tolerance, step.to.tolerance) / step.cost;
    if (drop > bestDrop) [best, bestDrop] = [j, drop];
  }
  return best;
}

/**
 * The tightening with the most boards gained per unit cost, by lazy
 * evaluation (M. Minoux, "Accelerated greedy algorithms for maximizing
 * submodular set functions", Optimization Techniques, LNCIS 7:234-243,
 * 1978): `bound[j]` holds each part's last measured gain, taken as an upper
 * bound of its gain now (returns diminish as parts tighten; where they do
 * not, the choice is near-best, not best), and only the part on top is
 * measured again until it stays on top. Returns -1 when no tightening gains a
 * board.
 */
function lazyTightening(s: State, bound: Float64Array): number {
  for (;;) {
    let top = -1;
    let second = -Infinity;
    for (let j = 0; j < bound.length; j++) {
      const b = bound[j] as number;
      if (top < 0 || b > (bound[top] as number)) {
        if (top >= 0) second = Math.max(second, bound[top] as number);
        top = j;
      } else second = Math.max(second, b);
    }
    if (top < 0 || !((bound[top] as number) > 0)) return -1;
    const step = nextTighter(s, top);
    if (step === null) {
      bound[top] = -Infinity;
      continue;
    }
    const gain = (passedWith(s, top, step.to.tolerance) - s.passed) / step.cost;
    bound[top] = gain;
    if (gain > 0 && gain >= second) return top;
  }
}

/**
 * Tighten parts until `needed` boards pass: by the constraints' spreads while
 * fewer than half of them pass (single boards say little there), then by
 * boards gained per cost, by the spreads again when no single tightening
 * gains a board. Returns the changes made.
 */
function tighten(s: State, needed: number, spreads: readonly ConstraintSpread[], unit: number): number {
  let steps = 0;
  const bound = new Float64Array(s.index.length).fill(Infinity);
  while (s.passed < needed) {
    let j = s.passed < needed / 2 ? -1 : lazyTightening(s, bound);
    if (j < 0) {
      j = spreadTightening(s, spreads, unit);
      if (j < 0) break;
      bound.fill(Infinity);
    }
    apply(s, j, (s.index[j] as number) + 1);
    bound[j] = Infinity;
    steps++;
  }
  return steps;
}

/** Loosen parts back one class at a time, the largest saving first, while `needed` boards still pass; returns the changes made. */
function loosen(s: State, needed: number): number {
  let steps = 0;
  for (let changed = true; changed; ) {
    changed = false;
    const order = [...s.index.keys()]
      .filter((j) => (s.index[j] as number) > 0)
      .map((j) => {
        const l = s.ladders[j] as ToleranceClass[];
        const at = s.index[j] as number;
        return { j, saving: (l[at] as ToleranceClass).cost - (l[at - 1] as ToleranceClass).cost };
      })
      .sort((a, b) => b.saving - a.saving);
    for (const { j } of order) {
      const to = (s.index[j] as number) - 1;
      if (passedWith(s, j, (s.ladders[j] as ToleranceClass[])[to]?.tolerance as number) >= needed) {
        apply(s, j, to);
        steps++;
        changed = true;
      }
    }
  }
  return steps;
}

/**
 * Per-part tolerance classes at the least cost (by marginal analysis, see
 * the module header) for the linear model's yield to reach the target plus
 * a safety margin. Returns data that says when the target is out of reach
 * with the classes given (`met: false`, every part then at its tightest
 * class where that helped).
 *
 * @param model - the linear model (spread.ts)
 * @param plan - the mask
 * @param options - target, distribution, classes per part, samples, seed, safety
 * @returns each part's tolerance and class, the total cost and the predicted yield
 * @throws {@link InvalidArgumentError} when the target is not in (0, 1) or the classes do not give one non-empty list per part
 * @example
 * ```ts
 * const a = allocateTolerances(model, plan, { target: 0.95 });
 * a.met && a.predicted >= a.required; //=> true
 * ```
 */
export function allocateTolerances(model: LinearModel, plan: MaskPlan, options: AllocationOptions): ToleranceAllocation {
  const fn = "allocateTolerances";
  checkOptions(fn, model.parts, options);
  const ladders = model.parts.map((part, j) => ladder(options.classes?.[j] ?? (part.kind === "capacitor" ? CAPACITOR_CLASSES : RESISTOR_CLASSES)));
  const distribution = options.distribution ?? "uniform";
  const s = initialState(model, plan, ladders, options);
  const target = options.target;
  const required = Math.min(target + (options.safety ?? 0.01), (1 + target) / 2);
  const needed = Math.ceil(required * s.samples - 1e-9);
  // the constraints' gradients do not depend on the tolerances: one evaluation serves every step
  const spreads = constraintSpreads(model, plan, s.tolerance, distribution);
  const unit = sigmaPerTolerance(distribution);
  let steps = tighten(s, needed, spreads, unit);
  const met = s.passed >= needed;
  if (met) steps += loosen(s, needed);
  const chosen = ladders.map((l, j) => l[s.index[j] as number] as ToleranceClass);
  return {
    tolerance: s.tolerance.slice(),
    classes: chosen.map((c) => c.label),
    cost: chosen.reduce((a, c) => a + c.cost, 0),
    predicted: s.passed / s.samples,
    required,
    met,
    steps,
    constraints: constraintSpreads(model, plan, s.tolerance, distribution),
  };
}
