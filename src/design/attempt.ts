/**
 * One attempt at a design: a prototype placed at one position of its interval,
 * transformed and split into sections ordered by ascending Q (the usual
 * ordering for dynamic range in lowpass cascades; common practice, no
 * source), a topology and a gain per section, each second-order stage's
 * target pre-distorted for a real op-amp, preferred values per stage, and the
 * as-built check against the mask. A stage with a free gain absorbs the gain
 * error the stages before it left.
 *
 * A bandpass made from an all-pole prototype is also split the other way
 * (`zerosAtOrigin: "band-split"` in the tf layer: highpass sections on the
 * lower edge's poles, lowpass sections on the upper edge's), and that band
 * split is built instead when its stages need fewer op-amps (topologies chosen
 * automatically only).
 *
 * @module
 */
import { SpecError, UnrealisableError } from "../errors.ts";
import { toSections } from "../tf/index.ts";
import { getTopology } from "../topologies/index.ts";
import type { ComponentValues, StageChoices } from "../topologies/types.ts";
import { TWO_PI } from "../units/constants.ts";
import type { DesignSpec } from "./spec.ts";
import type { Prototype } from "./family.ts";
import type { SectionCascade } from "../tf/types.ts";
import { intervalWidth, placeInInterval, prototypeInterval, transformPrototype, upHelpsPassband, type FeasibleInterval } from "./placement.ts";
import { describeSections, peakGrid, planStages, windowGiven, type GainBounds, type SectionInfo, type StagePlan } from "./stages.ts";
import { joinRealPole, THIRD_ORDER_IDS } from "./third-order.ts";
import { tuneStage, type TunedStage, type ValueSet } from "./components.ts";
import { predistortTarget, type PredistortionOutcome } from "./predistort.ts";
import { internalLevels } from "./internal-level.ts";
import { checkMask, type BuiltStage, type MaskCheck } from "./verify.ts";
import type { PartLimits } from "./impedance-level.ts";

/** A prototype with the interval placement found for it. */
export interface PlacedPrototype {
  /** The prototype. */
  readonly proto: Prototype;
  /** Where its exact design meets the mask. */
  readonly interval: FeasibleInterval;
}

/** How an attempt is built. */
export interface AttemptOptions {
  /** Log position inside the interval (0 = low end, 0.5 = geometric middle, 1 = high end). */
  readonly position: number;
  /** Search more capacitors and neighbouring values per stage (the re-tuning steps). */
  readonly wide: boolean;
  /** Topology ids the automatic stage choice leaves out (see {@link sturdierStagesOf}). */
  readonly avoid?: ReadonlySet<string>;
  /**
   * Where a one-op-amp topology with a bounded gain may take less than its
   * stage's wish (stages.ts `GainBounds`).
   * @defaultValue "any"
   */
  readonly gainBounds?: GainBounds;
}

/** A design built at one prototype and position, checked against the mask. */
export interface Attempt extends PlacedPrototype {
  /** Log position inside the interval. */
  readonly position: number;
  /** The placed parameter, rad/s. */
  readonly value: number;
  /** The grid the stage peaks are read on, Hz. */
  readonly gridHz: Float64Array;
  /** Plans with the gain corrections applied (what each stage was tuned for). */
  readonly plans: readonly StagePlan[];
  /** Plans before gain correction (the exact design's targets). */
  readonly exactPlans: readonly StagePlan[];
  /** Where its stages could take a bounded gain (the option it was built with; rebuilds from it keep it). */
  readonly gainBounds: GainBounds;
  /** Per stage: the value search. */
  readonly tuned: readonly TunedStage[];
  /** Per stage: the values on the board. */
  readonly chosen: readonly ValueSet[];
  /** The as-built circuit against the mask, and the stages that are not stable. */
  readonly mask: MaskCheck;
  /** Per stage: the finite-GBW pre-distortion (null when not attempted: ideal op-amp or first order). */
  readonly predistortion: readonly (PredistortionOutcome | null)[];
}

/**
 * The stages as built from plans and value sets.
 *
 * @param plans - the stage plans
 * @param sets - one value set per plan
 * @returns topology and values per stage
 */
export function boardStages(plans: readonly StagePlan[], sets: readonly { values: ComponentValues }[]): BuiltStage[] {
  return plans.map((p, i) => ({ topology: p.topology, values: (sets[i] as { values: ComponentValues }).values }));
}

/**
 * The topology asked for each stage: the spec's per-stage list, `"auto"`
 * everywhere, or one named topology wherever it fits (kind and order) with
 * the other stages (a first-order section, say) chosen automatically.
 *
 * @throws {@link SpecError} when the per-stage list has the wrong length or the named topology fits no stage
 */
function requestedTopologies(spec: DesignSpec, infos: readonly SectionInfo[]): string[] {
  const n = infos.length;
  if (spec.stageTopologies.length > 0) {
    if (spec.stageTopologies.length !== n) {
      throw new SpecError("designFilter", [
        {
          path: "topology",
          message: `this design has ${n} stage${n === 1 ? "" : "s"}; give one topology entry per stage (or a single id, or "auto")`,
          received: spec.stageTopologies,
        },
      ]);
    }
    return [...spec.stageTopologies];
  }
  if (spec.topology === "auto") return infos.map(() => "auto");
  const t = getTopology(spec.topology);
  const ids = infos.map((info) => (t.order === info.order && t.kinds.includes(info.kind) ? t.id : "auto"));
  if (!ids.includes(t.id)) {
    throw new SpecError("designFilter", [
      {
        path: "topology",
        message: `topology "${t.id}" realises ${t.kinds.join("/")} stages of order ${t.order}, and this design has none (its stages are ${infos.map((i) => `${i.kind} order ${i.order}`).join(", ")})`,
        received: spec.topology,
      },
    ]);
  }
  return ids;
}

/** A stage whose topology gave no usable values (internal: {@link buildAttempt} tries another topology first). */
class StageValuesError extends UnrealisableError {
  constructor(
    readonly stage: number,
    readonly topologyId: string,
    details: ConstructorParameters<typeof UnrealisableError>[0],
  ) {
    super(details);
  }
}

/** What tuning the stages one after the other gives. */
interface TunedCascade {
  readonly plans: StagePlan[];
  readonly tuned: TunedStage[];
  readonly predistortion: (PredistortionOutcome | null)[];
}

/** Part limits for a stage no value set builds inside the usual ones: three decades beyond them on each side. */
const LAST_RESORT_LIMITS: PartLimits = { resistor: { min: 0.1, max: 1e10 }, capacitor: { min: 1e-14, max: 1e-2 } };

/** The plan with its gain target divided by the gain error carried from the stages before it, when the stage's gain is free and the corrected target is realisable. */
function absorbGainError(plan: StagePlan, carried: number): StagePlan {
  if (carried === 1 || plan.topology.fixedGain !== undefined) return plan;
  const target = { ...plan.target, gain: plan.target.gain / carried };
  return plan.topology.check(target, {}) === null ? { ...plan, target } : plan;
}

/**
 * Tune stage by stage. Each stage with a free gain absorbs the gain error the
 * stages before it left; the error a stage leaves is measured against its own
 * uncorrected target, so every stage's error is corrected once. With a real
 * op-amp each second-order stage is designed for the pre-distorted target
 * that lands on its pole with that op-amp; a deliberate gain pre-distortion
 * (a free-gain bandpass) is taken back out, since the op-amp undoes it.
 * `choices` are each stage's design choices beyond what the search sets
 * (internal-level.ts: a state-variable notch's internal level).
 */
function tuneCascade(spec: DesignSpec, exactPlans: readonly StagePlan[], wide: boolean, choices?: readonly (StageChoices | undefined)[]): TunedCascade {
  const out: TunedCascade = { plans: [], tuned: [], predistortion: [] };
  let carried = 1;
  const usedCaps = new Set<number>();
  exactPlans.forEach((exact, i) => {
    const plan = absorbGainError(exact, carried);
    const own = choices?.[i];
    const pd = spec.opamp.kind !== "ideal" && plan.target.order === 2 ? predistortTarget(plan.topology, plan.target, spec.opamp, own) : null;
    const tuneOptions = {
      ...(wide ? { capacitors: 12, spread: 3, keep: 12 } : {}),
      ...(own === undefined ? {} : { choices: own }),
      preferredCapacitors: usedCaps,
      ...(pd?.ok === true ? { opampScoring: { opamp: spec.opamp, wanted: plan.target } } : {}),
    };
    const stageTarget = pd?.ok === true ? pd.target : plan.target;
    // A stage no value set builds inside the hard part limits (the planner found no topology that
    // fits) is built beyond them rather than not at all; the result warns about each such part.
    const inside = tuneStage(plan.topology, stageTarget, spec, tuneOptions);
    const beyond = inside === null ? tuneStage(plan.topology, stageTarget, spec, { ...tuneOptions, limits: LAST_RESORT_LIMITS }) : null;
    const t = inside ?? (beyond === null ? null : { ...beyond, beyondLimits: true as const });
    if (t === null) {
      throw new StageValuesError(i, plan.topology.id, {
        fn: "designFilter",
        path: `stages.${i}`,
        message: `topology "${plan.topology.id}" gives no usable values for stage ${i + 1} (${plan.target.kind}, f0 ${plan.target.f0Hz.toPrecision(4)} Hz) with capacitors between ${spec.capacitorRange.min} F and ${spec.capacitorRange.max} F; widen parts.capacitorMinF/capacitorMaxF or name another topology`,
      });
    }
    const gainPredistortion = pd?.ok === true && plan.topology.fixedGain === undefined ? pd.gainFactor : 1;
    carried *= t.best.figures.gain / gainPredistortion / exact.target.gain;
    for (const [k, v] of Object.entries(t.best.values)) if (k.startsWith("C")) usedCaps.add(v);
    out.plans.push(plan);
    out.tuned.push(t);
    out.predistortion.push(pd);
  });
  return out;
}

/**
 * Build and check one attempt.
 *
 * @param spec - canonical spec
 * @param placed - the prototype and its interval
 * @param options - position inside the interval and search width
 * @returns the attempt, checked against the mask
 * @throws {@link SpecError} when the spec's topologies do not fit the stages
 * @throws {@link UnrealisableError} when a stage gets no usable values
 */
export function buildAttempt(spec: DesignSpec, placed: PlacedPrototype, options: AttemptOptions): Attempt {
  const { proto, interval } = placed;
  const value = placeInInterval(interval, options.position);
  const cascades = toSectionsFor(spec, proto, interval, value);
  // A stage whose automatic topology gives no usable values in the part windows is planned again without it.
  // So is one whose parts leave a window the spec gives, when another topology can build it.
  let avoid = options.avoid;
  type Built = { grid: Float64Array; exactPlans: readonly StagePlan[]; cascade: TunedCascade };
  let built: Built | null = null;
  // (when every topology tried leaves it, the cascade with the fewest parts outside is kept)
  let outside: { built: Built; parts: number } | null = null;
  for (let round = 0; built === null; round++) {
    const { grid, exactPlans } = chooseSplit(spec, cascades, avoid, options.gainBounds ?? "any");
    try {
      const cascade = tuneCascade(spec, exactPlans, options.wide);
      const leaving = stageLeavingWindow(spec, exactPlans, cascade, avoid);
      const here = { grid, exactPlans, cascade };
      if (leaving === null && (outside === null || partsOutsideWindow(spec, cascade) <= outside.parts)) built = here;
      else {
        const parts = partsOutsideWindow(spec, cascade);
        if (outside === null || parts < outside.parts) outside = { built: here, parts };
        if (leaving === null || round >= 3) built = outside.built;
        else avoid = new Set([...(avoid ?? []), leaving]);
      }
    } catch (e) {
      if (outside !== null) {
        built = outside.built;
        break;
      }
      const plan = e instanceof StageValuesError ? exactPlans[e.stage] : undefined;
      if (!(e instanceof StageValuesError) || plan === undefined || !plan.automatic || round >= 4 || avoid?.has(e.topologyId) === true) {
        if (e instanceof StageValuesError) throw new UnrealisableError({ fn: e.fn, path: e.path, message: e.reason });
        throw e;
      }
      avoid = new Set([...(avoid ?? []), e.topologyId]);
    }
  }
  const { grid, exactPlans } = built;
  // With signal levels, the state-variable notch stages whose loop nodes would clip are built again at a lower internal level.
  let levels: (StageChoices | undefined)[] | undefined;
  for (let pass = 0; pass < 2 && spec.levels !== null; pass++) {
    const next = internalLevels(spec, built.cascade.plans, built.cascade.tuned.map((t) => t.best), grid, levels);
    if (next === null) break;
    try {
      built = { ...built, cascade: tuneCascade(spec, exactPlans, options.wide, next) };
      levels = next;
    } catch (e) {
      // no values at the lower level inside the windows: the stages stay as they were (a clipping one is reported)
      if (!(e instanceof StageValuesError)) throw e;
      break;
    }
  }
  const { plans, tuned, predistortion } = built.cascade;
  const chosen = tuned.map((t) => t.best);
  const mask = checkMask(spec, boardStages(plans, chosen), spec.opamp);
  const gridHz = grid.map((w) => w / TWO_PI);
  return { proto, interval, position: options.position, value, gridHz, plans, exactPlans, gainBounds: options.gainBounds ?? "any", tuned, chosen, mask, predistortion };
}

/** Whether part `name` of value `v` lies outside the spec's window for its kind. */
function leavesWindow(spec: DesignSpec, name: string, v: number): boolean {
  const w = name.startsWith("R") ? spec.resistorRange : name.startsWith("C") ? spec.capacitorRange : null;
  return w !== null && (v < w.min * (1 - 1e-9) || v > w.max * (1 + 1e-9));
}

/** How many resistors and capacitors of a tuned cascade lie outside the spec's windows. */
function partsOutsideWindow(spec: DesignSpec, cascade: TunedCascade): number {
  let n = 0;
  for (const t of cascade.tuned) for (const [k, v] of Object.entries(t.best.values)) if (leavesWindow(spec, k, v)) n++;
  return n;
}

/** The topology of the first automatic stage whose parts leave a window the spec gives (null when none does, or the window is the default). */
function stageLeavingWindow(spec: DesignSpec, plans: readonly StagePlan[], cascade: TunedCascade, avoid: ReadonlySet<string> | undefined): string | null {
  if (!windowGiven(spec)) return null;
  for (const [i, t] of cascade.tuned.entries()) {
    const plan = plans[i] as StagePlan;
    if (!plan.automatic || avoid?.has(plan.topology.id) === true) continue;
    if (Object.entries(t.best.values).some(([k, v]) => leavesWindow(spec, k, v))) return plan.topology.id;
  }
  return null;
}

/** The cascades an attempt may build: the usual pairing and, for a bandpass from an all-pole prototype with automatic topologies, the band split. */
function toSectionsFor(spec: DesignSpec, proto: Prototype, interval: FeasibleInterval, value: number): SectionCascade[] {
  const system = transformPrototype(spec, proto.zpk, interval, value);
  const usual = toSections(system, { order: "ascending-q" });
  const auto = spec.topology === "auto" && spec.stageTopologies.length === 0;
  if (spec.response !== "bandpass" || !auto || proto.zpk.zeros.length > 0) return [usual];
  return [usual, toSections(system, { order: "ascending-q", zerosAtOrigin: "band-split" })];
}

/** The op-amps a set of plans builds. */
function opampsOf(plans: readonly StagePlan[]): number {
  let n = 0;
  for (const p of plans) n += p.topology.opampCount;
  return n;
}

/**
 * Plan each candidate cascade and keep the first one with the fewest op-amps
 * (the usual pairing wins ties). With automatic topologies, each cascade is
 * also tried with its real pole joined to a pole pair in one third-order
 * stage (third-order.ts), unless `avoid` leaves those stages out.
 */
function chooseSplit(spec: DesignSpec, cascades: readonly SectionCascade[], avoid: ReadonlySet<string> | undefined, gainBounds: GainBounds = "any"): { grid: Float64Array; exactPlans: readonly StagePlan[] } {
  let best: { grid: Float64Array; exactPlans: readonly StagePlan[]; opamps: number } | null = null;
  const auto = spec.topology === "auto" && spec.stageTopologies.length === 0;
  // a spec naming a third-order stage gets the joined sections only
  const named = [spec.topology, ...spec.stageTopologies].some((id) => THIRD_ORDER_IDS.includes(id));
  const joinable = named || (auto && !THIRD_ORDER_IDS.some((id) => avoid?.has(id) === true));
  for (const [k, cascade] of cascades.entries()) {
    const grid = peakGrid(cascade);
    const usual = describeSections(cascade, grid);
    const joined = joinable ? joinRealPole(usual) : null;
    for (const infos of joined === null ? [usual] : named ? [joined] : [usual, joined]) {
      let plans: readonly StagePlan[];
      try {
        plans = planStages(spec, infos, { forced: requestedTopologies(spec, infos), gainBounds, ...(avoid === undefined ? {} : { avoid }) }).plans;
      } catch (e) {
        if (k === 0 && (infos === usual || named)) throw e;
        continue;
      }
      const opamps = opampsOf(plans);
      if (best === null || opamps < best.opamps) best = { grid, exactPlans: plans, opamps };
    }
  }
  return best as { grid: Float64Array; exactPlans: readonly StagePlan[] };
}

/** Stage kinds whose one-op-amp circuits trade sensitivity for op-amps: the finite-zero sections and the bandpass. */
const TRADED_KINDS: ReadonlySet<string> = new Set(["lowpass-notch", "highpass-notch", "notch", "bandpass"]);

/**
 * The topologies to leave out for a sturdier version of an attempt: every
 * automatically chosen second-order stage built with one op-amp where the
 * section is a finite-zero or bandpass section, or has a Q above 2 (their
 * pole Q and notch depth follow part ratios with sensitivities of order Q
 * or more; the multi-amplifier stages have sensitivities near 1; R. Schaumann
 * & M. E. Van Valkenburg, "Design of Analog Filters", 2001, ch. 3 and 4 on
 * sensitivity, from memory), and every automatically chosen third-order
 * stage (built again as a first-order and a second-order stage). Empty when
 * there is nothing to trade.
 *
 * @param a - the attempt
 * @returns topology ids to avoid
 */
export function sturdierStagesOf(a: Attempt): ReadonlySet<string> {
  const out = new Set<string>();
  for (const p of a.plans) {
    if (p.automatic && p.topology.order === 3) out.add(p.topology.id);
    if (!p.automatic || p.topology.order !== 2 || p.topology.opampCount !== 1) continue;
    if (TRADED_KINDS.has(p.info.kind) || (p.info.q ?? 0) > 2) out.add(p.topology.id);
  }
  return out;
}

/**
 * The stage plans a prototype gets where the pipeline first builds it: placed
 * at the middle of its interval (at the passband end when the interval is
 * empty, as `designAtOrder` does), split into sections and given a topology
 * per stage by {@link planStages}, the spec's named topologies included (and,
 * for a bandpass, the band split when it needs fewer op-amps, as `buildAttempt` does).
 *
 * @param spec - canonical spec
 * @param proto - the prototype (family.ts `choosePrototype`)
 * @returns the plans (before gain correction)
 * @throws {@link SpecError} when the spec's topologies do not fit the stages
 * @throws {@link UnrealisableError} when no topology realises a stage
 */
export function planPrototype(spec: DesignSpec, proto: Prototype): readonly StagePlan[] {
  const interval = prototypeInterval(spec, proto.zpk);
  const position = intervalWidth(interval) >= 0 ? 0.5 : upHelpsPassband(spec) ? 0 : 1;
  const value = placeInInterval(interval, position);
  return chooseSplit(spec, toSectionsFor(spec, proto, interval, value), undefined).exactPlans;
}

/** Whether the attempt's measured polarity satisfies the spec. */
export function polarityMet(spec: DesignSpec, a: Attempt): boolean {
  return spec.polarity === "either" || a.mask.polarity === spec.polarity;
}

/** Whether the attempt meets the mask and the polarity nominally, with every stage stable. */
export function meetsSpec(spec: DesignSpec, a: Attempt): boolean {
  return a.mask.marginDb >= 0 && polarityMet(spec, a) && a.mask.unstableStages.length === 0;
}
