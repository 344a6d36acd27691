/**
 * Component values for one stage: impedance level, preferred values and joint
 * re-tuning.
 *
 * 1. Impedance level (magnitude scaling; W. Heinlein and W. H. Holmes, "Active
 *    Filters for Integrated Circuits", 1974, ch. 5, and any text on frequency
 *    and impedance scaling): every capacitor value of the capacitor series in
 *    the allowed window is tried as the stage's capacitor; the topology's
 *    design equations give the resistors, and the capacitors whose resistors
 *    sit most centrally (on a log scale) inside the resistor window are kept,
 *    levels needing a capacitor above 1 µF only when no other level keeps
 *    the resistors inside the window, and none with a part beyond the hard
 *    limits (impedance-level.ts).
 * 2. Capacitor pairs: where the topology sets a capacitor ratio, the second
 *    capacitor is also taken from the series (the preferred values around the
 *    design's own choice) and the ratio follows from the pair, so both
 *    capacitors are stock values and the resistors absorb the difference.
 * 2b. Across the cascade, among the sets whose error is within 0.1 % of the
 *    stage's best, the one reusing the most capacitor values of earlier stages
 *    is taken, so the bill of materials stays short (0.1 % is a tenth of an
 *    E96 resistor's tolerance; common practice, no source).
 * 3. Joint re-tuning: rather than rounding each resistor to its nearest
 *    preferred value on its own, the search tries the two preferred values
 *    that bracket each resistor and the next ones out, in every combination
 *    (pairwise coordinate descent when there are more than 1024 combinations), and
 *    keeps the set whose as-built f0, Q, zero frequency and gain (from the
 *    topology's own figures) are closest to the target. Error measure: the
 *    largest of the relative f0, Q and fz errors and half the relative gain
 *    error, plus a tenth of their sum to break ties (common practice, no
 *    source).
 * 4. With a real op-amp (pre-distorted stages), step 3 scores the ideal
 *    figures of each exact design's neighbours against the wanted f0 and Q
 *    divided by the shift the op-amp gives that exact design (one
 *    `stagePole` per exact design; to first order the error of the pole with
 *    the op-amp), and the best few dozen candidates are then ranked again by
 *    the pole they really have WITH that op-amp (`stagePole`).
 *
 * @module
 */
import { isInSeries, seriesValuesInRange, snapToSeries } from "../parts/index.ts";
import { nearestMember } from "../parts/snap.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import { stagePole } from "../topologies/as-built.ts";
import { topologyCore } from "../topologies/define.ts";
import type { AsBuiltPole } from "../topologies/as-built.ts";
import type { ComponentValues, StageChoices, StageTarget, Topology } from "../topologies/types.ts";
import type { DesignSpec } from "./spec.ts";
import { addToBound, neighbours, resistorsWithin, searchResistors, type SearchBound } from "./resistor-search.ts";
import { PREFERRED_CAPACITOR_MAX, partLimits, type PartLimits } from "./impedance-level.ts";
import { costOf, evaluate, isCap, isRes, stageErrors, type ValueSet } from "./stage-cost.ts";

export type { ValueSet } from "./stage-cost.ts";

/** Result of tuning one stage. */
export interface TunedStage {
  /** Best set after joint re-tuning. */
  readonly best: ValueSet;
  /** Other good sets (ascending cost), for re-tuning against the mask. */
  readonly alternatives: readonly ValueSet[];
  /** The set obtained by rounding every part independently to its nearest preferred value. */
  readonly plain: ValueSet;
  /** The exact (unrounded) design the plain set was rounded from. */
  readonly exact: ComponentValues;
  /** Set when no value set fitted the hard part limits and the stage was built beyond them (attempt.ts, the last resort; the result warns about each such part). */
  readonly beyondLimits?: true;
}

function tryDesign(
  t: Topology,
  target: StageTarget,
  choices: StageChoices,
  series?: DesignSpec["capacitorSeries"],
): ComponentValues | null {
  try {
    // the search's targets and choices are well formed: the unchecked core's reason is the public `check`'s
    const core = topologyCore(t);
    if ((core === undefined ? t.check(target, choices) : core.check(target, choices)) !== null) return null;
    // `check` has passed: the unchecked core gives what the public `design` would.
    const v = core === undefined ? t.design(target, choices) : core.design(target, choices);
    if (v === null) return null;
    for (const x of Object.values(v)) if (!(x > 0) || !Number.isFinite(x)) return null;
    if (series === undefined) return v;
    // Capacitors derived through a ratio carry floating-point dust (1.2000000000000002e-8):
    // put them back on the exact series value when they are within 1e-6 of it.
    const out: Record<string, number> = { ...v };
    for (const [k, x] of Object.entries(v)) {
      if (!isCap(k)) continue;
      const snapped = nearestMember(x, series) ?? snapToSeries(x, { series, mode: "nearest" }).value;
      if (Math.abs(snapped / x - 1) < 1e-6) out[k] = snapped;
    }
    return out;
  } catch {
    return null;
  }
}

/**
 * How well a design's resistors sit in the window, as one sortable number.
 * Inside the window it is the worst log distance from the centre (1 = at an
 * edge). When the resistors spread wider than the window allows (a notch
 * stage whose zero lies far above its pole needs R8/R9 = (fz/f0)^2), keeping
 * most parts inside beats spreading the excess symmetrically over all of
 * them: then the score is 2 + the number of resistors outside, plus a small
 * term for how far the worst one strays.
 */
function centring(values: ComponentValues, range: { min: number; max: number }): number {
  const mid = Math.sqrt(range.min * range.max);
  const half = Math.log(range.max / mid);
  let worst = 0;
  let outside = 0;
  for (const [k, v] of Object.entries(values)) {
    if (!isRes(k)) continue;
    const d = Math.abs(Math.log(v / mid)) / half;
    if (d > 1 + 1e-12) outside++;
    worst = Math.max(worst, d);
  }
  return outside === 0 ? worst : 2 + outside + Math.min(worst, 1e3) / 1e4;
}

/** Whether every part of a design lies inside the hard limits (capacitors; resistors are held there by the value search). */
function capacitorsWithin(values: ComponentValues, limits: PartLimits): boolean {
  for (const [k, v] of Object.entries(values)) {
    if (isCap(k) && (v < limits.capacitor.min * (1 - 1e-9) || v > limits.capacitor.max * (1 + 1e-9))) return false;
  }
  return true;
}

/**
 * A small penalty for a capacitor above 1 µF (impedance-level.ts
 * `PREFERRED_CAPACITOR_MAX`), so that among impedance levels that keep the
 * resistors inside the window the one without large capacitors wins.
 */
function largeCapacitorPenalty(values: ComponentValues): number {
  let n = 0;
  for (const [k, v] of Object.entries(values)) if (isCap(k) && v > PREFERRED_CAPACITOR_MAX * (1 + 1e-9)) n++;
  return 0.25 * n;
}

/** Capacitors of the series inside the window, best-centred first (at most `keep`). */
function capacitorCandidates(
  t: Topology,
  target: StageTarget,
  spec: DesignSpec,
  search: { keep: number; limits: PartLimits; choices: StageChoices },
): { c: number; values: ComponentValues; centring: number }[] {
  const { keep, limits, choices } = search;
  const caps = seriesValuesInRange(spec.capacitorSeries, spec.capacitorRange);
  const out: { c: number; values: ComponentValues; centring: number }[] = [];
  for (const c of caps) {
    const v = tryDesign(t, target, { ...choices, capacitor: c }, spec.capacitorSeries);
    if (v === null || !capacitorsWithin(v, limits) || !resistorsWithin(v, limits)) continue;
    out.push({ c, values: v, centring: centring(v, spec.resistorRange) + largeCapacitorPenalty(v) });
  }
  out.sort((a, b) => a.centring - b.centring);
  // Levels with a capacitor above 1 µF are dropped when a level without one keeps the resistors inside the window.
  const small = (x: (typeof out)[number]): boolean => largeCapacitorPenalty(x.values) === 0;
  if (out.some((x) => small(x) && x.centring <= 1)) {
    const kept = out.filter(small);
    out.length = 0;
    out.push(...kept);
  }
  // Every capacitor that keeps the resistors inside the window (up to `keep`), and at least the best three.
  const inside = out.filter((x) => x.centring <= 1).length;
  return out.slice(0, Math.min(keep, Math.max(inside === 0 ? 8 : 3, inside)));
}

/**
 * Designs whose capacitors are all stock values: for a topology with a
 * capacitor ratio, the non-stock capacitor is replaced by nearby stock values
 * and the ratio re-derived from each pair.
 */
function stockCapacitorDesigns(
  t: Topology,
  target: StageTarget,
  spec: DesignSpec,
  base: { c: number; values: ComponentValues; limits: PartLimits; choices: StageChoices },
): ComponentValues[] {
  const limits = base.limits;
  const capNames = Object.keys(base.values).filter(isCap);
  const offSeries = capNames.filter((n) => !isInSeries(base.values[n] as number, spec.capacitorSeries));
  const out: ComponentValues[] = offSeries.length === 0 ? [base.values] : [];
  // Learn which capacitor the ratio sets and how: double its ratio and see
  // whether that capacitor doubles (ratio = it / level) or halves (ratio = level / it).
  const names = offSeries.length === 1 ? offSeries : offSeries.length === 0 ? capNames : [];
  let found: { name: string; direct: boolean } | null = null;
  for (const name of names) {
    const other = base.values[name] as number;
    const trials: [number, number, boolean][] = [
      [(2 * other) / base.c, 2, true],
      [(2 * base.c) / other, 0.5, false],
    ];
    for (const [ratio, want, direct] of trials) {
      const probe = tryDesign(t, target, { ...base.choices, capacitor: base.c, capacitorRatio: ratio });
      if (probe !== null && Math.abs((probe[name] as number) / other - want) < 1e-6) {
        found = { name, direct };
        break;
      }
    }
    if (found !== null) break;
  }
  if (found !== null) {
    const ideal = base.values[found.name] as number;
    for (const c2 of neighbours(ideal, spec.capacitorSeries, 3)) {
      if (c2 < spec.capacitorRange.min || c2 > spec.capacitorRange.max) continue;
      if (c2 === ideal && offSeries.length === 0) continue;
      const ratio = found.direct ? c2 / base.c : base.c / c2;
      const v = tryDesign(t, target, { ...base.choices, capacitor: base.c, capacitorRatio: ratio }, spec.capacitorSeries);
      if (v !== null && capacitorsWithin(v, limits) && resistorsWithin(v, limits)) out.push(v);
    }
  }
  // Fallback (or in addition): the design with its capacitors rounded, resistors kept.
  const rounded: Record<string, number> = { ...base.values };
  for (const n of offSeries) {
    rounded[n] = snapToSeries(base.values[n] as number, { series: spec.capacitorSeries, mode: "nearest" }).value;
  }
  if (out.length === 0 && offSeries.length > 0 && capacitorsWithin(rounded, limits)) out.push(rounded);
  return out;
}

/** How a topology's parts fit the windows for one stage target (see {@link levelFit}). */
export type LevelFit = "inside" | "within-limits" | "none";

/**
 * Whether some impedance level puts a stage's parts inside the spec's
 * resistor window (`"inside"`), only inside the hard limits
 * (impedance-level.ts `partLimits`; `"within-limits"`), or nowhere
 * (`"none"`). The levels probed are the capacitors 1, 2.2 and 4.7 of every
 * decade of the capacitor window (the topology's own default ratios), a
 * cheap stand-in for the full search of {@link tuneStage}, used by the
 * stage planner to choose a topology that fits.
 *
 * @param t - topology
 * @param target - stage target
 * @param spec - canonical spec (windows)
 * @returns the fit
 * @example
 * ```ts
 * levelFit(getTopology("sallen-key-lowpass-unity"), { order: 2, kind: "lowpass", f0Hz: 1000, q: 0.7071, gain: 1 }, spec); //=> "inside"
 * ```
 */
export function levelFit(t: Topology, target: StageTarget, spec: DesignSpec): LevelFit {
  const limits = partLimits(spec);
  const cache = levelFits;
  if (cache === null) return levelFitUncached(t, target, spec, limits);
  const key = `${t.id} ${JSON.stringify([target, spec.capacitorRange, spec.resistorRange, limits], finiteKey)}`;
  const hit = cache.get(key);
  if (hit !== undefined && hit.topology === t) return hit.fit;
  if (cache.size >= LEVEL_FIT_CACHE_SIZE) cache.clear();
  const fit = levelFitUncached(t, target, spec, limits);
  cache.set(key, { topology: t, fit });
  return fit;
}

/**
 * The fits found during one design (see {@link withTunedStages}): the stage
 * planner asks again for the same topology and target as each attempt and
 * yield candidate plans its cascade (about half the calls on the corpus),
 * and the fit is a pure function of the key. At most this many, then
 * cleared; null outside a design.
 */
const LEVEL_FIT_CACHE_SIZE = 1024;
let levelFits: Map<string, { readonly topology: Topology; readonly fit: LevelFit }> | null = null;

/** JSON of a cache key with non-finite numbers spelt out (JSON writes them as null). */
function finiteKey(_k: string, v: unknown): unknown {
  return typeof v === "number" && !Number.isFinite(v) ? String(v) : v;
}

function levelFitUncached(t: Topology, target: StageTarget, spec: DesignSpec, limits: PartLimits): LevelFit {
  let fit: LevelFit = "none";
  const lo = Math.floor(Math.log10(spec.capacitorRange.min));
  const hi = Math.ceil(Math.log10(spec.capacitorRange.max));
  for (let d = lo; d <= hi; d++) {
    for (const m of [1, 2.2, 4.7]) {
      const c = m * 10 ** d;
      if (c < spec.capacitorRange.min * (1 - 1e-9) || c > spec.capacitorRange.max * (1 + 1e-9)) continue;
      const v = tryDesign(t, target, { capacitor: c });
      if (v === null || !capacitorsWithin(v, limits) || !resistorsWithin(v, limits)) continue;
      if (centring(v, spec.resistorRange) <= 1) return "inside";
      fit = "within-limits";
    }
  }
  return fit;
}

/** Every resistor rounded to its nearest preferred value, capacitors as given (rounded when off-series). */
function plainSnap(values: ComponentValues, spec: DesignSpec): ComponentValues {
  const out: Record<string, number> = {};
  for (const [k, v] of Object.entries(values)) {
    const series = isCap(k) ? spec.capacitorSeries : spec.resistorSeries;
    out[k] = isCap(k) || isRes(k) ? snapToSeries(v, { series, mode: "nearest" }).value : v;
  }
  return out;
}


/**
 * The stock-capacitor designs whose resistors sit no further from the
 * window's centre than half its log width or the base design's own
 * distance, whichever is larger (re-pairing the capacitors moves the
 * resistor ratio); all of them when none does.
 */
function centred(designs: ComponentValues[], spec: DesignSpec, baseCentring: number): ComponentValues[] {
  const limit = Math.max(0.5, baseCentring);
  const kept = designs.filter((d) => centring(d, spec.resistorRange) <= limit + 1e-12);
  return kept.length > 0 ? kept : designs;
}

/** Options of {@link tuneStage}. */
export interface TuneOptions {
  /** Largest number of capacitor values tried as the impedance level (all that keep the resistors inside the window, at least three). @defaultValue 10 */
  readonly capacitors?: number;
  /** Preferred values tried on each side of every resistor. @defaultValue 2 */
  readonly spread?: number;
  /** Alternatives kept for re-tuning against the mask. @defaultValue 6 */
  readonly keep?: number;
  /**
   * Capacitor values already on the bill of materials (earlier stages). Among
   * sets whose error is within 0.1 % of the best, the one reusing the most of
   * these wins, so the cascade needs fewer distinct capacitors.
   * @defaultValue none
   */
  readonly preferredCapacitors?: ReadonlySet<number>;
  /**
   * Rank the finalists by the pole they have with this op-amp against the
   * wanted target (the `target` argument is then the pre-distorted one).
   * @defaultValue none (ideal-op-amp figures against `target`)
   */
  readonly opampScoring?: OpampScoring;
  /**
   * The hard part limits no value set passes.
   * @defaultValue `partLimits(spec)` (impedance-level.ts)
   */
  readonly limits?: PartLimits;
  /**
   * Choices every design of the search starts from (the capacitor the
   * search sets is added), e.g. a state-variable notch's internal level
   * (`resistorRatio`, internal-level.ts).
   * @defaultValue none
   */
  readonly choices?: StageChoices;
}

/** How {@link tuneStage} scores candidates with a real op-amp. */
export interface OpampScoring {
  /** The op-amp model the stage is built with. */
  readonly opamp: OpAmpModel;
  /** The pole f0 and Q the stage must have with that op-amp (gain and fz are taken from the design target). */
  readonly wanted: StageTarget;
  /** Number of best candidates evaluated with the op-amp. @defaultValue 24 */
  readonly count?: number;
}

/**
 * The target the ideal figures of sets near one exact design are scored
 * against: the wanted pole divided by the shift the op-amp gives that exact
 * design (its own capacitor ratio and impedance level), so that to first order
 * the score is that of the pole with the op-amp. Without op-amp scoring, or
 * when the pole cannot be found, the design target itself.
 */
function localTarget(t: Topology, target: StageTarget, exact: ComponentValues, scoring: OpampScoring | undefined): StageTarget {
  if (scoring === undefined || target.q === undefined || scoring.wanted.q === undefined) return target;
  try {
    const ideal = t.figures(exact);
    const pole = stagePole(t, exact, scoring.opamp);
    if (pole === null || pole.q === undefined || ideal.q === undefined || !(pole.q > 0) || !(pole.f0Hz > 0)) return target;
    const f0Hz = (scoring.wanted.f0Hz * ideal.f0Hz) / pole.f0Hz;
    const q = (scoring.wanted.q * ideal.q) / pole.q;
    return Number.isFinite(f0Hz) && Number.isFinite(q) ? { ...target, f0Hz, q } : target;
  } catch {
    return target;
  }
}

/** The same set scored by its pole with the op-amp; null when that pole cannot be found. */
function rescore(t: Topology, v: ValueSet, target: StageTarget, scoring: OpampScoring): ValueSet | null {
  let pole: AsBuiltPole | null;
  try {
    pole = stagePole(t, v.values, scoring.opamp);
  } catch {
    return null;
  }
  if (pole === null || !Number.isFinite(pole.f0Hz) || (pole.q !== undefined && !(pole.q > 0))) return null;
  const poleErrors = stageErrors({ ...v.figures, f0Hz: pole.f0Hz, ...(pole.q === undefined ? {} : { q: pole.q }) }, scoring.wanted);
  const errors = { ...stageErrors(v.figures, target), f0: poleErrors.f0, q: poleErrors.q };
  const cost = costOf(errors);
  return Number.isFinite(cost) ? { values: v.values, figures: v.figures, errors, cost, withOpamp: pole } : null;
}

/**
 * Choose preferred component values for one stage.
 *
 * @param t - topology
 * @param target - stage target
 * @param spec - canonical spec (series, windows)
 * @param options - search widths
 * @returns the best set, alternatives, and the plain-rounding baseline; `null` when no capacitor in the window gives a design
 */
export function tuneStage(
  t: Topology,
  target: StageTarget,
  spec: DesignSpec,
  options: TuneOptions = {},
): TunedStage | null {
  const cache = tunedStages;
  if (cache === null) return tuneStageUncached(t, target, spec, options);
  const key = `${t.id} ${tuneKey(target, spec, options)}`;
  const hit = cache.get(key);
  if (hit !== undefined && hit.topology === t) return hit.tuned;
  if (cache.size >= TUNE_CACHE_SIZE) cache.clear();
  const tuned = tuneStageUncached(t, target, spec, options);
  cache.set(key, { topology: t, tuned });
  return tuned;
}

/**
 * The stages tuned during one design (see {@link withTunedStages}): the
 * design loop tunes the same stage again (each attempt and yield candidate
 * re-plans the cascade), and the search is a pure function of its key, so a
 * kept result is the one a new search would return. At most this many (a
 * few kB each), then cleared; null outside a design, so nothing is kept
 * from one call to the next.
 */
const TUNE_CACHE_SIZE = 256;
let tunedStages: Map<string, { readonly topology: Topology; readonly tuned: TunedStage | null }> | null = null;

/**
 * Run `f` (one design) with a fresh cache of tuned stages and level fits, dropped when it
 * returns or throws.
 *
 * @param f - the design
 * @returns what `f` returns
 * @internal
 */
export function withTunedStages<T>(f: () => T): T {
  const outer = tunedStages;
  const outerFits = levelFits;
  tunedStages = new Map();
  levelFits = new Map();
  try {
    return f();
  } finally {
    tunedStages = outer;
    levelFits = outerFits;
  }
}

/** Everything {@link tuneStage} reads, as a string: the target, the spec's series and windows, and the options. */
function tuneKey(target: StageTarget, spec: DesignSpec, o: TuneOptions): string {
  const s = o.opampScoring;
  return JSON.stringify([
    target,
    spec.resistorSeries,
    spec.capacitorSeries,
    spec.resistorRange,
    spec.capacitorRange,
    o.capacitors,
    o.spread,
    o.keep,
    o.preferredCapacitors === undefined ? null : [...o.preferredCapacitors].sort((a, b) => a - b),
    s === undefined ? null : [s.opamp, s.wanted, s.count],
    o.limits ?? null,
    o.choices ?? null,
  ], (_k, v: unknown) => (typeof v === "number" && !Number.isFinite(v) ? String(v) : v));
}

function tuneStageUncached(
  t: Topology,
  target: StageTarget,
  spec: DesignSpec,
  options: TuneOptions,
): TunedStage | null {
  const keep = options.keep ?? 6;
  const limits = options.limits ?? partLimits(spec);
  const choices = options.choices ?? {};
  const bases = capacitorCandidates(t, target, spec, { keep: options.capacitors ?? 10, limits, choices });
  // Capacitor values earlier stages use are tried as well (when they keep the resistors near the window).
  for (const c of options.preferredCapacitors ?? []) {
    if (bases.some((b) => b.c === c) || c < spec.capacitorRange.min || c > spec.capacitorRange.max) continue;
    const v = tryDesign(t, target, { ...choices, capacitor: c }, spec.capacitorSeries);
    if (v !== null && centring(v, spec.resistorRange) <= 1 && capacitorsWithin(v, limits)) bases.push({ c, values: v, centring: centring(v, spec.resistorRange) });
  }
  if (bases.length === 0) {
    // No capacitor in the window works: let the topology pick its own impedance level.
    const v = tryDesign(t, target, choices);
    if (v === null || !capacitorsWithin(v, limits) || !resistorsWithin(v, limits)) return null;
    bases.push({ c: NaN, values: v, centring: centring(v, spec.resistorRange) });
  }
  const first = bases[0] as (typeof bases)[number];
  const plain = evaluate(t, plainSnap(first.values, spec), target);
  const scoring = options.opampScoring;
  const all: ValueSet[] = [];
  // Below, the first `depth` sets of the sorted list are read (and, to reuse capacitors, those within 1e-3 of the best).
  const bound: SearchBound = {
    depth: scoring === undefined ? keep : Math.max(scoring.count ?? 24, keep),
    near: options.preferredCapacitors !== undefined && options.preferredCapacitors.size > 0 ? 1e-3 : -Infinity,
    costs: [],
  };
  const search = (exact: ComponentValues, spread: number): void => {
    const found = searchResistors(t, localTarget(t, target, exact, scoring), exact, spec, spread, keep, limits, bound);
    addToBound(bound, found);
    all.push(...found);
  };
  for (const base of bases) {
    const designs = Number.isNaN(base.c) ? [base.values] : centred(stockCapacitorDesigns(t, target, spec, { ...base, limits, choices }), spec, base.centring);
    for (const exact of designs) search(exact, options.spread ?? 2);
  }
  all.sort((a, b) => a.cost - b.cost);
  // A coarse result (worse than 0.3 %) gets one wider search around the best few bases.
  if ((all[0]?.cost ?? Infinity) > 3e-3 && (options.spread ?? 2) < 3) {
    for (const base of bases.slice(0, 4)) {
      const designs = Number.isNaN(base.c) ? [base.values] : centred(stockCapacitorDesigns(t, target, spec, { ...base, limits, choices }), spec, base.centring);
      for (const exact of designs) search(exact, 3);
    }
    all.sort((a, b) => a.cost - b.cost);
  }
  let plainSet = plain;
  if (scoring !== undefined) {
    const finalists = all.slice(0, Math.max(scoring.count ?? 24, keep));
    const rescored: ValueSet[] = [];
    for (const v of finalists) {
      const r = rescore(t, v, target, scoring);
      if (r !== null) rescored.push(r);
    }
    // When no finalist's pole can be found with the op-amp, keep the ideal ranking.
    if (rescored.length > 0) {
      rescored.sort((a, b) => a.cost - b.cost);
      all.length = 0;
      all.push(...rescored);
    }
    plainSet = plain === null ? null : (rescore(t, plain, target, scoring) ?? plain);
  }
  let best = all[0];
  if (best === undefined || plainSet === null) return null;
  const preferred = options.preferredCapacitors;
  if (preferred !== undefined && preferred.size > 0) {
    // Among sets within 0.1 % (absolute error measure) of the best, take the
    // one reusing the most capacitor values already on the bill of materials.
    const reused = (v: ValueSet): number =>
      Object.entries(v.values).filter(([k, x]) => isCap(k) && preferred.has(x)).length;
    const limit = best.cost + 1e-3;
    let most = reused(best);
    for (const v of all) {
      if (v.cost > limit) break;
      const r = reused(v);
      if (r > most) {
        most = r;
        best = v;
      }
    }
  }
  return { best, alternatives: all.filter((v) => v !== best).slice(0, keep - 1), plain: plainSet, exact: first.values };
}
