/**
 * The search for preferred resistor values around a stage's exact design:
 * each resistor's neighbouring preferred values (`neighbours`), every
 * combination of them for small stages, else a pairwise descent, ranked by
 * the stage cost (stage-cost.ts) with exact pruning (a trial whose f0 error
 * alone bounds its cost above the worst kept set is not costed further).
 *
 * @module
 */
import { isInSeries, nextInSeries, snapToSeries } from "../parts/index.ts";
import { membersAround } from "../parts/snap.ts";
import { topologyCore } from "../topologies/define.ts";
import type { ComponentValues, StageFigures, StageTarget, Topology } from "../topologies/types.ts";
import type { DesignSpec } from "./spec.ts";
import { partLimits, type PartLimits } from "./impedance-level.ts";
import { figuresCost, figuresOf, isRes, rel, stageErrors, type ValueSet } from "./stage-cost.ts";

/**
 * The preferred values around `x`: the two that bracket it (one when it is
 * a preferred value) and `spread - 1` more on each side, ascending.
 *
 * @param x - a part value
 * @param series - the preferred-value series
 * @param spread - values on each side
 * @returns the values
 * @throws never
 * @example
 * ```ts
 * neighbours(4800, E24, 2); //=> [4300, 4700, 5100, 5600]
 * ```
 * @internal
 */
export function neighbours(x: number, series: DesignSpec["resistorSeries"], spread: number): number[] {
  // the same values from the series positions directly (parts/snap.ts), else the checked calls below
  if (spread >= 1) {
    const fast = membersAround(x, series, spread);
    if (fast !== null) return fast;
  }
  const down1 = isInSeries(x, series) ? x : snapToSeries(x, { series, mode: "down" }).value;
  const up1 = isInSeries(x, series) ? x : snapToSeries(x, { series, mode: "up" }).value;
  const set = new Set<number>([down1, up1]);
  let d = down1;
  let u = up1;
  for (let i = 1; i < spread; i++) {
    d = nextInSeries(d, { series, direction: "down" });
    u = nextInSeries(u, { series, direction: "up" });
    set.add(d);
    set.add(u);
  }
  return [...set].sort((a, b) => a - b);
}

/**
 * The working set of a search: every part's value in one array, in the order
 * of the exact design's keys, and the figures of whatever the array holds
 * (the topology's indexed kernel where the keys are its components in
 * order, else its figures of a record filled from the array).
 */
interface Workspace {
  readonly keys: readonly string[];
  readonly x: Float64Array;
  readonly figures: () => StageFigures;
  /** The pole frequency alone (the bits of `figures().f0Hz`), where the topology has a cheaper way to it. */
  readonly f0Hz?: () => number;
}

function workspace(t: Topology, exact: ComponentValues): Workspace {
  const keys = Object.keys(exact);
  const x = Float64Array.from(keys, (k) => exact[k] as number);
  const core = topologyCore(t);
  if (core !== undefined && keys.length === t.componentNames.length && keys.every((k, i) => k === t.componentNames[i])) {
    const kernel = core.figuresAt;
    const f0At = core.f0At;
    return { keys, x, figures: () => kernel(x), ...(f0At === undefined ? {} : { f0Hz: () => f0At(x) }) };
  }
  const named = figuresOf(t);
  const record: Record<string, number> = { ...exact };
  return {
    keys,
    x,
    figures: () => {
      for (let i = 0; i < keys.length; i++) record[keys[i] as string] = x[i] as number;
      return named(record);
    },
  };
}

/** A set the search keeps for now: its values in workspace order, figures and cost (made a {@link ValueSet} only when returned). */
interface Kept {
  readonly x: Float64Array;
  figures: StageFigures;
  cost: number;
}

/** The kept sets as value sets: values as records keyed like the exact design, errors against the target. */
function valueSets(w: Workspace, kept: readonly Kept[], target: StageTarget): ValueSet[] {
  return kept.map((k) => {
    const values: Record<string, number> = {};
    for (let i = 0; i < w.keys.length; i++) values[w.keys[i] as string] = k.x[i] as number;
    return { values, figures: k.figures, errors: stageErrors(k.figures, target), cost: k.cost };
  });
}

/**
 * What the earlier searches of one stage returned, for the exact pruning of
 * the later ones (several capacitor bases and exact designs per stage): the
 * ascending costs of the best `depth` sets among all they returned, and how
 * far above the best a set still matters to the caller (the re-ranking by
 * shared capacitors looks 1e-3 above the best; `-Infinity` when nothing
 * does). A later trial whose f0 bound reaches both is refused: it could not
 * rank among the first `depth` of the combined, sorted list, nor come within
 * `near` of its best, so the caller's choice is exactly that of costing it.
 *
 * @internal
 */
export interface SearchBound {
  /** How many of the best sets of the combined list the caller reads. */
  readonly depth: number;
  /** How far above the best cost a set still matters. */
  readonly near: number;
  /** Ascending costs of the best `depth` sets returned so far (updated by {@link addToBound}). */
  readonly costs: number[];
}

/**
 * Merge the sets one search returned into a {@link SearchBound}.
 *
 * @param bound - the bound (its costs updated in place)
 * @param sets - what the search returned
 * @internal
 */
export function addToBound(bound: SearchBound, sets: readonly ValueSet[]): void {
  const c = bound.costs;
  for (const v of sets) if (Number.isFinite(v.cost)) c.push(v.cost);
  c.sort((a, b) => a - b);
  if (c.length > bound.depth) c.length = bound.depth;
}

/**
 * The best `keep` value sets met so far, in ascending cost (ties in the order
 * they were met), and the trial that costs the values the workspace holds.
 *
 * Pruning (branch and bound on the f0 error; exact): every error term is
 * non-negative, so a set's cost is at least `e + 0.1 e` with `e` its relative
 * f0 error, in floating point too (rounded addition, multiplication and max
 * are monotone). Once `keep` sets are held, a trial whose bound already
 * reaches the worst of them is refused without computing its other figures:
 * it could neither enter the list nor (the list holding the best set met)
 * beat the best, so the search goes on exactly as if it had been costed. A
 * refused trial reports Infinity.
 *
 * The bound of the earlier searches (`earlier`) refuses a trial only when its
 * f0 bound also reaches `floor`: the cost the caller must know exactly
 * whether a trial beats (the descent's current best; -Infinity for the
 * exhaustive walk, which steers by nothing). A trial it refuses costs at
 * least `floor`, so the descent takes the path it would have taken, and the
 * set could not rank where the caller looks (see {@link SearchBound}).
 */
function finalists(w: Workspace, target: StageTarget, keep: number, earlier: SearchBound | undefined): { found: Kept[]; trial: (floor: number, seen?: SeenTrial) => number } {
  const found: Kept[] = [];
  const f0Hz = w.f0Hz;
  // A set whose bound reaches the `depth`-th best cost the earlier searches returned, and lies more
  // than `near` above their best, cannot rank where the caller looks: refused like the others.
  const costs = earlier?.costs ?? [];
  const rankBound = earlier !== undefined && earlier.depth > 0 && costs.length >= earlier.depth ? (costs[earlier.depth - 1] as number) : Infinity;
  const nearBound = rankBound < Infinity ? (costs[0] as number) + (earlier as SearchBound).near : Infinity;
  /**
   * Cost the values in the workspace (NaN or Infinity when unusable or refused) and keep them when they rank among the best `keep`.
   * With `seen`, the values' f0 bound, figures and cost are read from it where an earlier trial of the same values stored them (and stored there when formed).
   */
  const trial = (floor: number, seen?: SeenTrial): number => {
    if (f0Hz !== undefined && (found.length >= keep || rankBound < Infinity)) {
      let b: number;
      if (seen !== undefined && seen.bounded) b = seen.bound;
      else {
        const e = rel(f0Hz(), target.f0Hz);
        b = e + 0.1 * e;
        if (seen !== undefined) {
          seen.bound = b;
          seen.bounded = true;
        }
      }
      if (b >= rankBound && b > nearBound && b >= floor) return Infinity;
      if (found.length >= keep && b >= (found[found.length - 1] as Kept).cost) return Infinity;
    }
    let fig: StageFigures | null;
    let cost: number;
    if (seen !== undefined && seen.costed) {
      fig = seen.figures;
      cost = seen.cost;
    } else {
      try {
        fig = w.figures();
      } catch {
        fig = null;
      }
      cost = fig === null ? NaN : figuresCost(fig, target);
      if (seen !== undefined) {
        seen.figures = fig;
        seen.cost = cost;
        seen.costed = true;
      }
    }
    if (fig === null) return NaN;
    if (!(cost < (found.length < keep ? Infinity : (found[found.length - 1] as Kept).cost))) return cost;
    // a full list drops its worst (dearer than this set) first, and its array takes this set's values
    let vs: Kept;
    if (found.length >= keep && found.length > 0) {
      vs = found.pop() as Kept;
      vs.x.set(w.x);
      vs.figures = fig;
      vs.cost = cost;
    } else vs = { x: w.x.slice(), figures: fig, cost };
    let i = found.length;
    while (i > 0 && (found[i - 1] as Kept).cost > cost) i--;
    found.splice(i, 0, vs);
    return cost;
  };
  return { found, trial };
}

/**
 * What a trial of one set of values found, for a later trial of the same
 * values (see {@link finalists}): its f0 bound and its figures and cost, each
 * once formed. Both are pure functions of the values.
 */
interface SeenTrial {
  /** Whether {@link SeenTrial.bound} holds the values' f0 bound. */
  bounded: boolean;
  bound: number;
  /** Whether {@link SeenTrial.cost} holds the values' cost (and `figures` their figures; null when they threw). */
  costed: boolean;
  figures: StageFigures | null;
  cost: number;
}

/**
 * Scratch of the pairwise descent, kept between searches so that each does
 * not allocate its own (searches never nest): the trial log (every entry
 * read is written earlier in the same search: the first sweep writes them
 * all) and the single-move trials (an entry is read only when tagged with
 * the current epoch, which no earlier search used). Neither carries
 * anything from one search to the next.
 */
let logScratch = new Float64Array(0);
const seenPool: SeenTrial[] = [];
let seenAtPool = new Float64Array(0);
let seenEpoch = 0;

/**
 * Jointly search preferred resistor values around an exact design: every
 * combination of each resistor's {@link neighbours} when there are at most
 * 1024, else pairwise coordinate descent from the nearest values. One working
 * array of values is updated in place, part by part; a set is copied out only
 * when it ranks among the best `keep`; trials are pruned by the f0 bound of
 * `finalists` (exactly: the result is that of costing every trial).
 *
 * @param t - topology
 * @param target - what the figures are scored against
 * @param exact - the exact design (resistors off-series, capacitors as they are)
 * @param spec - canonical spec (the resistor series)
 * @param spread - preferred values tried on each side of every resistor
 * @param keep - sets returned
 * @param limits - hard part limits no resistor passes (default `partLimits(spec)`, impedance-level.ts)
 * @param earlier - what earlier searches of the same stage returned (exact pruning across searches; see {@link SearchBound})
 * @returns the best `keep` sets met, ascending cost (ties in the order met); with `earlier`, less those refused by its bound
 * @throws never
 * @example
 * ```ts
 * searchResistors(mfb, target, mfb.design(target, { capacitor: 1e-8 }), spec, 2, 6)[0].cost; //=> 0.0021...
 * ```
 * @internal
 */
export function searchResistors(
  t: Topology,
  target: StageTarget,
  exact: ComponentValues,
  spec: DesignSpec,
  spread: number,
  keep: number,
  limits: PartLimits = partLimits(spec),
  earlier?: SearchBound,
): ValueSet[] {
  const w = workspace(t, exact);
  const x = w.x;
  const slots = w.keys.flatMap((k, i) => (isRes(k) ? [i] : []));
  // Only preferred values inside the hard limits (impedance-level.ts `partLimits`): a stage with no such value for some resistor has no set.
  const lim = limits.resistor;
  const options = slots.map((i) => neighbours(x[i] as number, spec.resistorSeries, spread).filter((v) => v >= lim.min * (1 - 1e-9) && v <= lim.max * (1 + 1e-9)));
  if (options.some((o) => o.length === 0)) return [];
  const total = options.reduce((p, o) => p * o.length, 1);
  const { found, trial } = finalists(w, target, keep, earlier);
  const idx = slots.map(() => 0);
  if (total <= 1024) {
    // Every combination, the first resistor's choice changing fastest.
    slots.forEach((s, i) => (x[s] = (options[i] as number[])[0] as number));
    for (let count = 0; count < total; count++) {
      trial(-Infinity);
      for (let i = 0; i < idx.length; i++) {
        const o = options[i] as number[];
        idx[i] = (idx[i] as number) + 1;
        if ((idx[i] as number) < o.length) {
          x[slots[i] as number] = o[idx[i] as number] as number;
          break;
        }
        idx[i] = 0;
        x[slots[i] as number] = o[0] as number;
      }
    }
    return valueSets(w, found, target);
  }
  // Pairwise coordinate descent from the nearest values: every pair of
  // resistors tries all its combinations with the others held, until a
  // sweep improves nothing (single-part descent stalls where f0 and Q
  // depend on ratios of two parts).
  //
  // Replay: a pair's trials see the same values as in the sweep before when
  // nothing has changed since (the pair lies after the last pair that
  // changed a value in that sweep, and nothing has changed yet in this one).
  // Their results are then read from that sweep's log instead of being
  // costed again: none beats the current best (they did not then, against
  // the same best), and one is costed again only where it could enter the
  // kept sets now (a trial enters them only below their worst, which has
  // not risen since), so the descent, its kept sets and their order are
  // those of costing every trial. The first sweep that changes nothing is
  // the last, so about the tail of each search after its last change is
  // not costed twice.
  slots.forEach((s, i) => {
    const o = options[i] as number[];
    const v0 = exact[w.keys[s] as string] as number;
    let bi = 0;
    o.forEach((v, j) => {
      if (Math.abs(Math.log(v / v0)) < Math.abs(Math.log((o[bi] as number) / v0))) bi = j;
    });
    idx[i] = bi;
    x[s] = o[bi] as number;
  });
  let cur = trial(Infinity);
  if (!Number.isFinite(cur)) cur = Infinity;
  let size = 0;
  for (let i = 0; i < idx.length; i++) for (let k = i + 1; k < idx.length; k++) size += (options[i] as number[]).length * (options[k] as number[]).length - 1;
  if (logScratch.length < size) logScratch = new Float64Array(size);
  const log = logScratch;
  // the ordinal of the last pair that changed a value in the previous sweep (none before the first)
  let lastChange = Infinity;
  // Trials that move one resistor (the pair's other at its current value) recur in every pair holding
  // that resistor: what the first found is kept per (resistor, option) until a value changes (`epoch`).
  const first: number[] = [];
  let options1 = 0;
  for (const o of options) {
    first.push(options1);
    options1 += o.length;
  }
  while (seenPool.length < options1) seenPool.push({ bounded: false, bound: 0, costed: false, figures: null, cost: 0 });
  if (seenAtPool.length < options1) seenAtPool = new Float64Array(options1);
  const seen = seenPool;
  const seenAt = seenAtPool;
  let epoch = ++seenEpoch;
  const moved = (i: number, a: number): SeenTrial => {
    const j = (first[i] as number) + a;
    const e = seen[j] as SeenTrial;
    if (seenAt[j] !== epoch) {
      seenAt[j] = epoch;
      e.bounded = false;
      e.costed = false;
      e.figures = null;
    }
    return e;
  };
  for (let sweep = 0; sweep < 4; sweep++) {
    let improved = false;
    let changedAt = -1;
    let pair = 0;
    let at = 0;
    for (let i = 0; i < idx.length; i++) {
      for (let k = i + 1; k < idx.length; k++, pair++) {
        const si = slots[i] as number;
        const sk = slots[k] as number;
        const oi = options[i] as number[];
        const ok = options[k] as number[];
        let bestI = idx[i] as number;
        let bestK = idx[k] as number;
        const replay = !improved && pair > lastChange;
        for (let a = 0; a < oi.length; a++) {
          x[si] = oi[a] as number;
          for (let b = 0; b < ok.length; b++) {
            if (a === idx[i] && b === idx[k]) continue;
            x[sk] = ok[b] as number;
            const one = a === idx[i] ? moved(k, b) : b === idx[k] ? moved(i, a) : undefined;
            let cost: number;
            if (replay) {
              const was = log[at] as number;
              const worst = found.length < keep ? Infinity : (found[found.length - 1] as Kept).cost;
              cost = was < worst ? trial(cur, one) : was;
            } else {
              cost = trial(cur, one);
              log[at] = cost;
            }
            at++;
            if (cost < cur) {
              cur = cost;
              bestI = a;
              bestK = b;
              improved = true;
            }
          }
        }
        if (bestI !== idx[i] || bestK !== idx[k]) {
          changedAt = pair;
          epoch = ++seenEpoch;
        }
        idx[i] = bestI;
        idx[k] = bestK;
        x[si] = oi[bestI] as number;
        x[sk] = ok[bestK] as number;
      }
    }
    if (!improved) break;
    lastChange = changedAt;
  }
  return valueSets(w, found, target);
}

/**
 * Whether every resistor of an exact design can be rounded to a preferred
 * value inside the hard limits: each lies within the limits or less than 5 %
 * outside them, where the search's neighbours still reach inside.
 *
 * @param values - an exact design
 * @param limits - the hard limits (impedance-level.ts `partLimits`)
 * @returns true when the value search can keep every resistor inside
 * @example
 * ```ts
 * resistorsWithin({ R1: 50, C1: 1e-9 }, { resistor: { min: 100, max: 1e7 }, capacitor: { min: 1e-11, max: 1e-5 } }); //=> false
 * ```
 */
export function resistorsWithin(values: ComponentValues, limits: PartLimits): boolean {
  for (const [k, v] of Object.entries(values)) {
    if (isRes(k) && (v < limits.resistor.min / 1.05 || v > limits.resistor.max * 1.05)) return false;
  }
  return true;
}
