/**
 * The result of a design as plain readonly data: the stages with their parts
 * and figures, the warnings for the builder, where the design sits inside
 * its slack and the as-built verification against the mask.
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import type { FamilyName } from "../approx/index.ts";
import { asBuiltPole } from "../topologies/index.ts";
import type { AsBuiltPole } from "../topologies/as-built.ts";
import type { StageFigures } from "../topologies/types.ts";
import { formatValue } from "../units/index.ts";
import { TWO_PI } from "../units/constants.ts";
import type { DesignSpec } from "./spec.ts";
import { deepFreeze, registerDesignResult } from "./check.ts";
import { withDisplay } from "../display.ts";
import { designBundle } from "./display.ts";
import { CAPACITOR_SPREAD_SOFT_LIMIT, capacitorSpreadOf, type StagePlan } from "./stages.ts";
import type { TunedStage, ValueSet } from "./components.ts";
import { stageErrors } from "./stage-cost.ts";
import type { PredistortionOutcome } from "./predistort.ts";
import { checkMask, maskVerification, responseCurve, type BuiltStage } from "./verify.ts";
import { clipWarning, headroomOf, opampPeaksOf, stagePeakGains, type StagePeakGains } from "./headroom.ts";
import { boardStages, meetsSpec as nominalMeets, polarityMet, type Attempt } from "./attempt.ts";
import { classText, opampCount, yieldText, type YieldCandidate, type YieldOutcome } from "./yield.ts";
import { significant } from "./text.ts";
import { feasibilityText } from "./relax.ts";
import type {
  BoardYield,
  DesignAction,
  DesignResult,
  DesignStage,
  DesignWarning,
  FamilyChoice,
  Feasibility,
  Headroom,
  Placement,
  Verification,
  YieldAlternative,
} from "./types.ts";

const IDEAL: OpAmpModel = { kind: "ideal" };
/** Capacitor ratio above which a warning is given: the same decade of spread that topology choice avoids (common practice, no source). */
export const LARGE_CAPACITOR_RATIO = CAPACITOR_SPREAD_SOFT_LIMIT;
/** Points of the response curve stored in a result. */
export const CURVE_POINTS = 256;

/** A stage's parts under designators unique across the cascade. */
interface StageDesignators {
  readonly components: Record<string, number>;
  readonly localNames: Record<string, string>;
  readonly opamps: string[];
}

/** Give every stage's parts designators unique across the cascade. */
function designators(plans: readonly StagePlan[], sets: readonly ValueSet[]): StageDesignators[] {
  const counters = new Map<string, number>();
  const next = (prefix: string): string => {
    const k = (counters.get(prefix) ?? 0) + 1;
    counters.set(prefix, k);
    return `${prefix}${k}`;
  };
  return plans.map((p, i) => {
    const values = (sets[i] as ValueSet).values;
    const components: Record<string, number> = {};
    const localNames: Record<string, string> = {};
    const names = [...p.topology.componentNames, ...Object.keys(values).filter((k) => !p.topology.componentNames.includes(k))];
    for (const local of names) {
      const v = values[local];
      if (v === undefined) continue;
      const global = next(/^[A-Za-z]/.test(local) ? (local[0] as string).toUpperCase() : "X");
      components[global] = v;
      localNames[global] = local;
    }
    const opamps: string[] = [];
    for (let k = 0; k < p.topology.opampCount; k++) opamps.push(next("U"));
    return { components, localNames, opamps };
  });
}

/** The figures as stored in a result: only the fields that are set. */
function storedFigures(f: StageFigures): StageFigures {
  return {
    f0Hz: f.f0Hz,
    ...(f.q === undefined ? {} : { q: f.q }),
    ...(f.fzHz === undefined ? {} : { fzHz: f.fzHz }),
    ...(f.realPoleHz === undefined ? {} : { realPoleHz: f.realPoleHz }),
    gain: f.gain,
  };
}

/** Warnings about the parts of one stage: values outside their windows, and a large capacitor ratio. */
function partWarnings(spec: DesignSpec, index: number, components: Readonly<Record<string, number>>): DesignWarning[] {
  const warnings: DesignWarning[] = [];
  const outside = (prefix: string, range: { min: number; max: number }): [string, number][] =>
    Object.entries(components).filter(([k, v]) => k.startsWith(prefix) && (v < range.min * (1 - 1e-9) || v > range.max * (1 + 1e-9)));
  const outR = outside("R", spec.resistorRange);
  if (outR.length > 0) {
    warnings.push({
      code: "resistor-out-of-range",
      stage: index,
      message: `${outR.map(([k, v]) => `${k} = ${significant(v, 3)} Ω`).join(", ")} outside the resistor window ${significant(spec.resistorRange.min)}-${significant(spec.resistorRange.max)} Ω; no impedance level (capacitor of the series in the capacitor window) and no other topology the planner tried puts every resistor inside it. Widen parts.resistorMinOhm/parts.resistorMaxOhm, or name another topology for this stage.`,
    });
  }
  const outC = outside("C", spec.capacitorRange);
  if (outC.length > 0) {
    warnings.push({
      code: "capacitor-out-of-range",
      stage: index,
      message: `${outC.map(([k, v]) => `${k} = ${v.toExponential(2)} F`).join(", ")} outside the capacitor window ${spec.capacitorRange.min.toExponential(2)}-${spec.capacitorRange.max.toExponential(2)} F; widen parts.capacitorMinF/parts.capacitorMaxF, or name another topology for this stage.`,
    });
  }
  const ratio = capacitorSpreadOf(components);
  if (ratio > LARGE_CAPACITOR_RATIO) {
    warnings.push({
      code: "large-capacitor-ratio",
      stage: index,
      message: `capacitor ratio ${significant(ratio, 3)} exceeds ${LARGE_CAPACITOR_RATIO}; the stage's Q depends on it, so buy tight-tolerance capacitors or name a different topology.`,
    });
  }
  return warnings;
}

/** Warnings about one stage and its op-amp: a failed pre-distortion, and a GBW below the stage's demand. */
function opampWarnings(spec: DesignSpec, index: number, pd: PredistortionOutcome | null, gbwDemandHz: number): DesignWarning[] {
  const warnings: DesignWarning[] = [];
  if (pd !== null && !pd.ok) {
    warnings.push({
      code: "predistortion-failed",
      stage: index,
      message: `the stage could not be pre-distorted for the op-amp's finite gain-bandwidth (${pd.reason}); it is designed for its ideal-op-amp target, so its pole moves with this op-amp. Choose a faster op-amp.`,
    });
  }
  if (spec.opamp.kind !== "ideal" && gbwDemandHz > spec.opamp.gbwHz) {
    warnings.push({
      code: "insufficient-gbw",
      stage: index,
      message:
        `the stage needs an op-amp GBW of about ${formatValue(gbwDemandHz, { digits: 3, unit: "Hz" })} for 1 % accuracy of f0 and Q without correction; the chosen op-amp has ${formatValue(spec.opamp.gbwHz, { digits: 3, unit: "Hz" })}.` +
        (pd !== null && pd.ok
          ? " The stage is pre-distorted for this op-amp, so its pole is right as built, but it depends on the op-amp's actual GBW (which varies between parts and with temperature): a faster op-amp is the more robust choice."
          : ""),
    });
  }
  return warnings;
}

/** The pole the values on the board have with the spec's op-amp (from the value search, or found here); undefined with an ideal op-amp or when none is found. */
function poleWithOpamp(spec: DesignSpec, plan: StagePlan, set: ValueSet): AsBuiltPole | undefined {
  if (set.withOpamp !== undefined || spec.opamp.kind === "ideal") return set.withOpamp;
  try {
    return asBuiltPole(plan.topology, set.values, spec.opamp);
  } catch {
    return undefined;
  }
}

/** Everything the assembly needs about one stage. */
interface StageInputs {
  readonly index: number;
  readonly plan: StagePlan;
  readonly set: ValueSet;
  readonly tuned: TunedStage;
  readonly names: StageDesignators;
  readonly peaks: StagePeakGains;
  readonly pd: PredistortionOutcome | null;
  /** Tolerance per part, in the topology's component order. */
  readonly tolerances: Float64Array;
}

/** One stage of the result, and the warnings about it. */
function stageRecord(spec: DesignSpec, x: StageInputs): { stage: DesignStage; warnings: DesignWarning[] } {
  const { plan, set, tuned, names, pd } = x;
  const gbw = plan.topology.gbwDemandHz(plan.target);
  const warnings = [...partWarnings(spec, x.index, names.components), ...opampWarnings(spec, x.index, pd, gbw)];
  const pole = poleWithOpamp(spec, plan, set);
  const stage: DesignStage = {
    index: x.index,
    topology: plan.topology.id,
    topologyName: plan.topology.name,
    topologyReason: plan.reason,
    kind: plan.target.kind,
    order: plan.target.order,
    components: names.components,
    localNames: names.localNames,
    opamps: names.opamps,
    tolerances: Object.fromEntries(
      Object.entries(names.localNames).map(([global, local]) => [global, x.tolerances[plan.topology.componentNames.indexOf(local)] as number]),
    ),
    target: storedFigures(plan.target),
    asBuilt: storedFigures(set.figures),
    errors: set.withOpamp === undefined ? set.errors : stageErrors(set.figures, plan.target),
    plainSnapErrors: tuned.plain.withOpamp === undefined ? tuned.plain.errors : stageErrors(tuned.plain.figures, plan.target),
    ...(pole === undefined ? {} : { asBuiltWithOpamp: { f0Hz: pole.f0Hz, ...(pole.q === undefined ? {} : { q: pole.q }) } }),
    ...(pd?.ok === true ? { predistortion: { f0Factor: pd.f0Factor, qFactor: pd.qFactor, gainFactor: pd.gainFactor } } : {}),
    peakGain: x.peaks.output.gain,
    peakHz: x.peaks.output.hz,
    gbwDemandHz: gbw,
    opampPeaks: opampPeaksOf(x.peaks, names.opamps),
  };
  return { stage, warnings };
}

/** The action recording which stages were pre-distorted for the op-amp, when any was. */
function predistortionAction(spec: DesignSpec, stages: readonly DesignStage[]): DesignAction | null {
  const corrected = stages.filter((st) => st.predistortion !== undefined);
  if (corrected.length === 0) return null;
  const factors = corrected.map((st) => {
    const f = st.predistortion ?? { f0Factor: 1, qFactor: 1, gainFactor: 1 };
    return `${st.index} (f0 x${significant(f.f0Factor, 5)}, Q x${significant(f.qFactor, 5)}${f.gainFactor === 1 ? "" : `, gain x${significant(f.gainFactor, 5)}`})`;
  });
  return {
    code: "predistorted-for-gbw",
    message: `Pre-distorted ${corrected.length === 1 ? "stage" : "stages"} ${factors.join(", ")} for the op-amp's ${formatValue((spec.opamp as { gbwHz: number }).gbwHz, { digits: 3, unit: "Hz" })} gain-bandwidth, so each stage built with it has the wanted f0 and Q; the preferred values were chosen by their pole with that op-amp.`,
  };
}

/** Warnings about the whole cascade: an internal node peaking above the output, the polarity, clipping, a missed spec. */
function cascadeWarnings(spec: DesignSpec, a: Attempt, peaks: readonly { gain: number; hz: number }[], headroom: Headroom | undefined, feasible: Feasibility | undefined): DesignWarning[] {
  const warnings: DesignWarning[] = [];
  const outPeak = (peaks[peaks.length - 1] as { gain: number }).gain;
  peaks.slice(0, -1).forEach((p, i) => {
    if (p.gain > outPeak * 1.2) {
      warnings.push({
        code: "gain-not-distributed",
        stage: i + 1,
        message: `the output of stage ${i + 1} peaks ${significant(20 * Math.log10(p.gain / outPeak), 3)} dB above the filter output (at ${significant(p.hz, 4)} Hz) because its topology fixes its gain; allow an inverting stage (gain.polarity "either") or name a topology with adjustable gain to lower it.`,
      });
    }
  });
  const polarityOk = polarityMet(spec, a);
  if (!polarityOk) {
    warnings.push({
      code: "polarity",
      message: `the requested ${spec.polarity} polarity could not be met with the allowed topologies; the filter is ${a.mask.polarity}.`,
    });
  }
  const clip = clipWarning(headroom);
  if (clip !== null) warnings.push(clip);
  const m = a.mask;
  if (m.unstableStages.length > 0) {
    warnings.push({
      code: "unstable",
      message: `stage${m.unstableStages.length === 1 ? "" : "s"} ${m.unstableStages.join(", ")} ${m.unstableStages.length === 1 ? "has" : "have"} poles in the right half-plane with the op-amp model: ${m.unstableStages.length === 1 ? "it oscillates" : "they oscillate"}, so the design does not meet the spec. Choose a faster op-amp or another topology for ${m.unstableStages.length === 1 ? "that stage" : "those stages"}.`,
    });
  }
  if (!(m.marginDb >= 0 && polarityOk)) {
    warnings.push({
      code: "spec-not-met",
      message: `the as-built filter misses the mask: passband margin ${significant(m.passbandMarginDb, 3)} dB, stopband margin ${significant(m.stopbandMarginDb, 3)} dB, gain margin ${significant(m.gainMarginDb, 3)} dB${spec.order !== null ? "; the spec fixes the order, so the pipeline did not raise it" : ""}.${feasible === undefined ? "" : ` ${feasibilityText(feasible)}`}`,
    });
  } else if (clip !== null) {
    warnings.push({ code: "spec-not-met", message: "the as-built filter meets the mask, but an op-amp output clips at the spec's signal levels (see the clipping warning), so it does not meet the spec." });
  }
  return warnings;
}

/** Where the attempt sits inside its interval, in Hz. */
function placementOf(a: Attempt): Placement {
  const iv = a.interval;
  return {
    parameter: iv.parameter,
    lowHz: iv.low / TWO_PI,
    highHz: iv.high / TWO_PI,
    chosenHz: a.value / TWO_PI,
    position: a.position,
    ...(iv.centre === undefined ? {} : { centreHz: iv.centre / TWO_PI }),
    ...(a.proto.rippleDb === undefined ? {} : { designRippleDb: a.proto.rippleDb }),
    ...(a.proto.attenuationDb === undefined ? {} : { designAttenuationDb: a.proto.attenuationDb }),
  };
}

/** Distinct values, ascending. */
function distinct(xs: Iterable<number>): number[] {
  return [...new Set(xs)].sort((p, q) => p - q);
}

/** The yield record of the chosen candidate. */
function boardYieldOf(spec: DesignSpec, c: YieldCandidate): BoardYield {
  const y = c.estimate;
  const of = (prefix: string): number[] =>
    distinct(c.attempt.plans.flatMap((p, i) => p.topology.componentNames.flatMap((n, k) => (n.startsWith(prefix) ? [(c.tolerances[i] as Float64Array)[k] as number] : []))));
  return {
    fraction: y.fraction,
    lower95: y.lower95,
    upper95: y.upper95,
    boards: y.boards,
    met: y.met,
    target: spec.yieldTarget,
    passed: y.passed,
    unstableBoards: y.unstable,
    distribution: spec.partDistribution,
    seed: spec.yieldSeed,
    resistorTolerances: of("R"),
    capacitorTolerances: of("C"),
  };
}

/** The candidates of the yield search as alternatives. */
function alternativesOf(robust: YieldOutcome): YieldAlternative[] {
  return robust.candidates.map((c) => ({
    change: c.change,
    family: c.attempt.proto.family,
    order: c.attempt.proto.order,
    opamps: opampCount(c.attempt),
    resistorTolerance: c.classes.resistor,
    capacitorTolerance: c.classes.capacitor,
    fraction: c.estimate.fraction,
    lower95: c.estimate.lower95,
    upper95: c.estimate.upper95,
    boards: c.estimate.boards,
    met: c.estimate.met,
    chosen: c === robust.chosen,
  }));
}

/** The warning that the boards miss the yield target, with what would reach it when something tried does. */
function yieldWarning(spec: DesignSpec, robust: YieldOutcome): DesignWarning[] {
  const c = robust.chosen;
  if (c.estimate.met) return [];
  const fixed = [spec.resistorToleranceFixed ? "resistor" : "", spec.capacitorToleranceFixed ? "capacitor" : ""].filter((x) => x !== "");
  return [
    {
      code: "yield-not-met",
      message: `only ${yieldText(c.estimate)} meet the mask at ${classText(c.classes)} (target ${significant(spec.yieldTarget * 100, 3)} %, judged on the interval's lower end)${fixed.length > 0 ? `; the spec fixes the ${fixed.join(" and ")} tolerance, so tighter parts were not tried` : ""}${spec.order !== null ? "; the spec fixes the order" : ""}. Tighter parts, a higher order or a looser mask raise it.`,
    },
  ];
}

/** The as-built verification, with the exact design's ideal margin beside it. */
function verificationOf(spec: DesignSpec, a: Attempt, boards: readonly BuiltStage[], robust: YieldOutcome, headroom: Headroom | undefined): Verification {
  const exactBoards = a.exactPlans.map((p) => ({ topology: p.topology, values: p.topology.design(p.target, {}) }));
  const ideal = checkMask(spec, exactBoards, IDEAL);
  const m = a.mask;
  const nominal = nominalMeets(spec, a) && headroom?.clips !== true;
  const boardYield = boardYieldOf(spec, robust.chosen);
  return {
    meetsSpec: nominal,
    boardsMeetSpec: nominal && boardYield.met,
    opamp: spec.opamp,
    ...maskVerification(spec, m),
    yield: boardYield,
    idealMarginDb: ideal.marginDb,
    curve: responseCurve(spec, boards, spec.opamp, CURVE_POINTS),
    ...(headroom === undefined ? {} : { headroom }),
  };
}

/** What the pipeline decided before the final attempt: the family and how it was chosen, the minimum order, the actions taken. */
export interface DesignDecisions {
  /** The family used. */
  readonly family: FamilyName;
  /** How it was chosen. */
  readonly choice: FamilyChoice;
  /** The minimum order. */
  readonly minimumOrder: number;
  /** What the pipeline did, in order. */
  readonly actions: readonly DesignAction[];
}

/**
 * The frozen, registered result of a design from its final attempt.
 *
 * @param spec - canonical spec
 * @param decisions - family, minimum order and actions
 * @param robust - the yield search's outcome (its chosen candidate is the attempt kept)
 * @returns the result
 */
export function assembleResult(spec: DesignSpec, decisions: DesignDecisions, robust: YieldOutcome): DesignResult {
  const a = robust.chosen.attempt;
  const names = designators(a.plans, a.chosen);
  const boards = boardStages(a.plans, a.chosen);
  const found = stagePeakGains(spec, boards, spec.opamp, a.gridHz);
  const records = a.plans.map((plan, i) =>
    stageRecord(spec, {
      index: i + 1,
      plan,
      set: a.chosen[i] as ValueSet,
      tuned: a.tuned[i] as TunedStage,
      names: names[i] as StageDesignators,
      peaks: found[i] as StagePeakGains,
      pd: a.predistortion[i] ?? null,
      tolerances: robust.chosen.tolerances[i] as Float64Array,
    }),
  );
  const stages = records.map((r) => r.stage);
  const headroom = headroomOf(spec, stages);
  const predistorted = predistortionAction(spec, stages);
  const order = a.proto.order;
  return registerDesignResult(deepFreeze(withDisplay({
    spec,
    family: decisions.family,
    familyChoice: decisions.choice,
    order,
    filterOrder: spec.response === "lowpass" || spec.response === "highpass" ? order : 2 * order,
    minimumOrder: decisions.minimumOrder,
    placement: placementOf(a),
    stages,
    verification: verificationOf(spec, a, boards, robust, headroom),
    warnings: [...records.flatMap((r) => r.warnings), ...cascadeWarnings(spec, a, found.map((p) => p.output), headroom, decisions.choice.feasibility), ...yieldWarning(spec, robust)],
    actions: predistorted === null ? [...decisions.actions] : [...decisions.actions, predistorted],
    yieldAlternatives: alternativesOf(robust),
  }, designBundle)));
}
