/**
 * The design pipeline: from a spec to a verified circuit of preferred-value
 * parts.
 *
 * family and minimum order -> prototype with a margin kept back -> placed in
 * the middle of the mask's slack -> transformed and split into sections
 * ordered by ascending Q (the usual ordering for dynamic range in lowpass
 * cascades; common practice, no source) -> gain distributed for equal peaks ->
 * a topology per section -> (real op-amp) each second-order stage's target
 * pre-distorted so the stage lands on its pole WITH that op-amp -> preferred
 * values with joint re-tuning -> as-built check against the mask. When the as-built circuit misses the mask the
 * pipeline re-tunes the parts against the mask itself, then moves the design
 * inside the slack towards the failing band, then (equiripple families) tries
 * prototypes with more dB margin, then (unless the spec fixes the order)
 * raises the order by up to two, and records each step it took. A stage with a
 * free gain absorbs the gain error the stages before it left. When nothing
 * meets the mask, the attempt with the best worst margin is returned, as data.
 *
 * @module
 */
import { SpecError, UnrealisableError } from "../errors.ts";
import { formatValue } from "../units/index.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import { toSections } from "../tf/index.ts";
import type { SectionCascade } from "../tf/types.ts";
import type { FamilyName } from "../approx/index.ts";
import type { ComponentValues } from "../topologies/types.ts";
import { asBuiltPole, getTopology } from "../topologies/index.ts";
import { validateSpec, MAX_SPEC_ORDER, type DesignSpec } from "./spec.ts";
import { deepFreeze, registerDesignResult } from "./check.ts";
import { AUTO_MAX_ORDER, chooseFamily, choosePrototype, MARGIN_LEVELS, designPrototype, type PrototypeDesign } from "./family.ts";
import { intervalWidth, placeInInterval, transformPrototype } from "./placement.ts";
import { CAPACITOR_SPREAD_SOFT_LIMIT, capacitorSpreadOf, describeSections, peakGrid, planStages, type StagePlan } from "./stages.ts";
import { stageErrors, tuneStage, type TunedStage, type ValueSet } from "./components.ts";
import { predistortTarget, type PredistortionOutcome } from "./predistort.ts";
import {
  checkMask,
  gridMarginDb,
  maskGrid,
  multiplyInPlace,
  partialPeaks,
  responseCurve,
  type BuiltStage,
  type MaskFigures,
} from "./verify.ts";
import type {
  DesignAction,
  DesignResult,
  DesignStage,
  DesignWarning,
  FamilyChoice,
  Placement,
  StageFigureSet,
} from "./types.ts";

const TWO_PI = 2 * Math.PI;
const IDEAL: OpAmpModel = { kind: "ideal" };
/** Capacitor ratio above which a warning is given: the same decade of spread that topology choice avoids (common practice, no source). */
export const LARGE_CAPACITOR_RATIO = CAPACITOR_SPREAD_SOFT_LIMIT;
/** Points of the response curve stored in a result. */
export const CURVE_POINTS = 256;

interface Attempt {
  readonly proto: PrototypeDesign;
  readonly position: number;
  readonly value: number;
  readonly cascade: SectionCascade;
  readonly gridHz: Float64Array;
  readonly plans: readonly StagePlan[];
  /** Plans before gain correction (the exact design's targets). */
  readonly plans0: readonly StagePlan[];
  readonly polarityOk: boolean;
  readonly tuned: readonly TunedStage[];
  readonly chosen: readonly ValueSet[];
  readonly mask: MaskFigures;
  /** Per stage: the finite-GBW pre-distortion (null when not attempted: ideal op-amp or first order). */
  readonly predistortion: readonly (PredistortionOutcome | null)[];
}

function built(plans: readonly StagePlan[], sets: readonly { values: ComponentValues }[]): BuiltStage[] {
  return plans.map((p, i) => ({ topology: p.topology, values: (sets[i] as { values: ComponentValues }).values }));
}

function attempt(spec: DesignSpec, proto: PrototypeDesign, position: number, wide: boolean): Attempt {
  const value = placeInInterval(proto.interval, position);
  const zpk = transformPrototype(spec, proto.zpk, proto.interval, value);
  const cascade = toSections(zpk, { order: "ascending-q" });
  const grid = peakGrid(cascade);
  const infos = describeSections(cascade, grid);
  const n = infos.length;
  let forced: string[];
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
    forced = [...spec.stageTopologies];
  } else if (spec.topology === "auto") {
    forced = infos.map(() => "auto");
  } else {
    // One named topology for the whole filter: used wherever it fits (kind and
    // order); the other stages (a first-order section, say) are chosen automatically.
    const t = getTopology(spec.topology);
    forced = infos.map((info) => (t.order === info.order && t.kinds.includes(info.kind) ? t.id : "auto"));
    if (!forced.includes(t.id)) {
      throw new SpecError("designFilter", [
        {
          path: "topology",
          message: `topology "${t.id}" realises ${t.kinds.join("/")} stages of order ${t.order}, and this design has none (its stages are ${infos.map((i) => `${i.kind} order ${i.order}`).join(", ")})`,
          received: spec.topology,
        },
      ]);
    }
  }
  const { plans, polarityOk } = planStages(spec, infos, { forced });
  // Tune stage by stage; a stage with a free gain absorbs the gain error the stages before it left.
  const tuned: TunedStage[] = [];
  const tunedPlans: StagePlan[] = [];
  const predistortion: (PredistortionOutcome | null)[] = [];
  let carried = 1;
  const usedCaps = new Set<number>();
  plans.forEach((p0, i) => {
    let p = p0;
    if (carried !== 1 && p.topology.fixedGain === undefined) {
      const target = { ...p.target, gain: p.target.gain / carried };
      if (p.topology.check(target, {}) === null) p = { ...p, target };
    }
    // A real op-amp: design for the target that lands on the wanted pole with it.
    const pd = spec.opamp.kind !== "ideal" && p.target.order === 2 ? predistortTarget(p.topology, p.target, spec.opamp) : null;
    predistortion.push(pd);
    const t = tuneStage(p.topology, pd?.ok === true ? pd.target : p.target, spec, {
      ...(wide ? { capacitors: 12, spread: 3, keep: 12 } : {}),
      preferredCapacitors: usedCaps,
      ...(pd?.ok === true ? { opampScoring: { opamp: spec.opamp, wanted: p.target } } : {}),
    });
    if (t === null) {
      throw new UnrealisableError({
        fn: "designFilter",
        path: `stages.${i}`,
        message: `topology "${p.topology.id}" gives no usable values for stage ${i + 1} (${p.target.kind}, f0 ${p.target.f0Hz.toPrecision(4)} Hz) with capacitors between ${spec.capacitorRange.min} F and ${spec.capacitorRange.max} F; widen parts.capacitorMinF/capacitorMaxF or name another topology`,
      });
    }
    carried *= t.best.figures.gain / p.target.gain;
    for (const [k, v] of Object.entries(t.best.values)) if (k.startsWith("C")) usedCaps.add(v);
    tuned.push(t);
    tunedPlans.push(p);
  });
  const chosen = tuned.map((t) => t.best);
  const mask = checkMask(spec, built(tunedPlans, chosen), spec.opamp);
  const gridHz = grid.map((w) => w / TWO_PI);
  return { proto, position, value, cascade, gridHz, plans: tunedPlans, plans0: plans, polarityOk, tuned, chosen, mask, predistortion };
}

/**
 * Re-tune against the mask: coordinate descent over each stage's good value
 * sets, maximising the worst margin. Candidates are ranked on the mask grid
 * with each stage's response computed once per candidate; the final choice is
 * checked with the full (refined) mask check and kept only if it is better.
 */
function retuneToMask(spec: DesignSpec, a: Attempt): Attempt {
  const grid = maskGrid(spec);
  const n = grid.freqHz.length;
  const cache = new Map<ValueSet, { re: Float64Array; im: Float64Array }>();
  const responseOf = (i: number, v: ValueSet): { re: Float64Array; im: Float64Array } => {
    let r = cache.get(v);
    if (r === undefined) {
      const h = (a.plans[i] as StagePlan).topology.response(v.values, grid.freqHz, spec.opamp);
      r = { re: h.re, im: h.im };
      cache.set(v, r);
    }
    return r;
  };
  const marginOf = (sets: readonly ValueSet[]): number => {
    const re = new Float64Array(n).fill(1);
    const im = new Float64Array(n);
    sets.forEach((v, i) => multiplyInPlace(re, im, responseOf(i, v)));
    const mag = new Float64Array(n);
    for (let k = 0; k < n; k++) mag[k] = Math.hypot(re[k] as number, im[k] as number);
    return gridMarginDb(spec, grid, mag);
  };
  const chosen = [...a.chosen];
  let bestGrid = marginOf(chosen);
  for (let sweep = 0; sweep < 2; sweep++) {
    let improved = false;
    for (let i = 0; i < chosen.length; i++) {
      const t = a.tuned[i] as TunedStage;
      for (const alt of [t.best, ...t.alternatives]) {
        if (alt === chosen[i]) continue;
        const trial = [...chosen];
        trial[i] = alt;
        const m = marginOf(trial);
        if (m > bestGrid + 1e-9) {
          bestGrid = m;
          chosen[i] = alt;
          improved = true;
        }
      }
    }
    if (!improved) break;
  }
  const mask = checkMask(spec, built(a.plans, chosen), spec.opamp);
  return mask.marginDb > a.mask.marginDb ? { ...a, chosen, mask } : a;
}

/** Whether the measured polarity satisfies the spec. */
function polarityMet(spec: DesignSpec, a: Attempt): boolean {
  return spec.polarity === "either" || a.mask.polarity === spec.polarity;
}

function meets(spec: DesignSpec, a: Attempt): boolean {
  return a.mask.marginDb >= 0 && polarityMet(spec, a);
}

/** Whether raising the placement parameter helps the passband (true) or the stopband. */
function upHelpsPassband(spec: DesignSpec): boolean {
  return spec.response === "lowpass" || spec.response === "bandpass";
}

/** Why an interval is empty, in words: what each band asks of the placed parameter. */
function infeasibleText(s: DesignSpec, proto: PrototypeDesign): string {
  const what = proto.interval.parameter === "bandwidth" ? "bandwidth" : "natural frequency";
  const lo = `${fmt(proto.interval.low / TWO_PI)} Hz`;
  const hi = `${fmt(proto.interval.high / TWO_PI)} Hz`;
  return upHelpsPassband(s)
    ? `the passband needs a ${what} of at least ${lo}, the stopband at most ${hi}`
    : `the passband needs a ${what} of at most ${hi}, the stopband at least ${lo}`;
}

function fmt(x: number, digits = 4): string {
  return Number(x.toPrecision(digits)).toString();
}

function figures(f: { f0Hz: number; q?: number; fzHz?: number; gain: number }): StageFigureSet {
  return {
    f0Hz: f.f0Hz,
    ...(f.q === undefined ? {} : { q: f.q }),
    ...(f.fzHz === undefined ? {} : { fzHz: f.fzHz }),
    gain: f.gain,
  };
}

/** Give every stage's parts designators unique across the cascade. */
function designators(plans: readonly StagePlan[], sets: readonly ValueSet[]): {
  components: Record<string, number>;
  localNames: Record<string, string>;
  opamps: string[];
}[] {
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
      const prefix = /^[A-Za-z]/.test(local) ? (local[0] as string).toUpperCase() : "X";
      const global = next(prefix);
      components[global] = v;
      localNames[global] = local;
    }
    const opamps: string[] = [];
    for (let k = 0; k < p.topology.opampCount; k++) opamps.push(next("U"));
    return { components, localNames, opamps };
  });
}

/**
 * Design an active filter from a specification: family, order, sections,
 * topologies, preferred component values, and the as-built check against the
 * mask.
 *
 * A spec that the (forced) order cannot meet is not an error: the result says
 * `verification.meetsSpec: false` and gives the margins.
 *
 * @param spec - the specification (validated here; see {@link FilterSpec})
 * @returns the design as plain readonly data
 * @throws {@link SpecError} listing every problem of a malformed spec
 * @throws {@link UnrealisableError} when no topology or capacitor window can build a stage
 * @example
 * ```ts
 * const r = designFilter({
 *   response: "lowpass",
 *   passband: { edgeHz: "1k", maxLossDb: 1 },
 *   stopband: { edgeHz: "4k", minAttenuationDb: 40 },
 * });
 * r.verification.meetsSpec; //=> true
 * r.stages.length; //=> 2
 * ```
 */
export function designFilter(spec: unknown): DesignResult {
  const s = validateSpec(spec);
  const fam = chooseFamily(s);
  const family: FamilyName = fam.family;
  const actions: DesignAction[] = [];
  const limit = s.family === "auto" ? AUTO_MAX_ORDER : MAX_SPEC_ORDER;
  const minOrder = fam.order ?? limit;
  let order = s.order ?? minOrder;
  const lastOrder = s.order !== null ? s.order : Math.min(limit, minOrder + 2);

  let result: Attempt | null = null;
  let first: Attempt | null = null;
  // The best of the attempts that missed, returned when none meets the mask.
  let bestMiss: Attempt | null = null;
  for (; order <= lastOrder; order++) {
    const proto = choosePrototype(s, family, order);
    const feasible = intervalWidth(proto.interval) >= 0;
    // Too low an order cannot meet both bands: keep the passband (the end of the
    // interval where it is met exactly) and let the stopband fall short.
    const start = feasible ? 0.5 : upHelpsPassband(s) ? 0 : 1;
    let a = attempt(s, proto, start, false);
    first ??= a;
    if (order === (s.order ?? minOrder)) {
      actions.push({
        code: "placed-in-slack",
        message: feasible
          ? `Placed the ${proto.interval.parameter === "bandwidth" ? "bandwidth" : "natural frequency"} at the geometric middle of the interval where the exact design meets the mask (${fmt(proto.interval.low / TWO_PI)} Hz to ${fmt(proto.interval.high / TWO_PI)} Hz), so part rounding pushes towards neither edge first.`
          : `Order ${order} cannot meet the mask even before rounding: ${infeasibleText(s, proto)}; placed the design where the passband is met, so the stopband falls short.`,
      });
    }
    if (meets(s, a)) {
      result = a;
      break;
    }
    if (!feasible) {
      result = a;
      if (s.order !== null) break;
      actions.push({ code: "raised-order", message: `Order ${order} cannot meet the mask; raised the order to ${order + 1}.` });
      continue;
    }
    // A real op-amp that is too slow is not cured by re-tuning or more order:
    // stop when the same parts with an ideal op-amp would pass.
    if (s.opamp.kind !== "ideal" && a.mask.marginDb < -1 && checkMask(s, built(a.plans, a.chosen), IDEAL).marginDb >= 0) {
      result = a;
      break;
    }
    // 1. Re-tune the parts against the mask itself, with a wider search.
    const before = a.mask.marginDb;
    const wide = attempt(s, proto, 0.5, true);
    a = retuneToMask(s, wide.mask.marginDb > a.mask.marginDb ? wide : a);
    actions.push({
      code: "re-tuned-to-mask",
      message: `The rounded circuit missed the mask by ${fmt(-before, 3)} dB; re-tuned the preferred values against the mask itself (worst margin now ${fmt(a.mask.marginDb, 3)} dB).`,
    });
    if (meets(s, a)) {
      result = a;
      break;
    }
    // 2. Move the design inside the slack towards the failing band.
    const passShort = a.mask.passbandMarginDb < a.mask.stopbandMarginDb;
    const pos = passShort === upHelpsPassband(s) ? 0.75 : 0.25;
    let moved = retuneToMask(s, attempt(s, proto, pos, true));
    actions.push({
      code: "moved-placement",
      message: `Moved the design to ${Math.round(pos * 100)} % of the slack interval, shifting the transition band towards the ${passShort ? "stopband" : "passband"}, because the ${passShort ? "passband" : "stopband"} margin was the short one (worst margin now ${fmt(moved.mask.marginDb, 3)} dB).`,
    });
    if (meets(s, moved)) {
      result = moved;
      break;
    }
    // 3. A prototype with more ripple/attenuation margin, when the equiripple family allows it:
    //    each stricter level that still leaves frequency slack, least strict first.
    if (family === "chebyshev1" || family === "chebyshev2" || family === "elliptic") {
      const current = proto.rippleDb !== undefined ? proto.rippleDb / s.maxLossDb : 1;
      const extra = proto.attenuationDb !== undefined ? proto.attenuationDb - s.minAttenuationDb : 0;
      const stricter = MARGIN_LEVELS.filter(
        (l) => l.rippleFraction < current - 1e-12 || l.extraAttenuationDb > extra + 1e-12,
      ).reverse();
      // At most three of them: the nearest, a middle one and the strictest.
      const picks = stricter.length <= 3 ? stricter : [stricter[0], stricter[Math.floor(stricter.length / 2)], stricter[stricter.length - 1]];
      let done = false;
      for (const level of picks) {
        if (level === undefined) continue;
        const p2 = designPrototype(s, family, order, level);
        if (!(intervalWidth(p2.interval) > 0)) continue;
        const t = retuneToMask(s, attempt(s, p2, 0.5, true));
        actions.push({
          code: "tightened-prototype",
          message: `Redesigned the prototype with more dB margin (${p2.rippleDb === undefined ? "" : `ripple ${fmt(p2.rippleDb, 3)} dB`}${p2.rippleDb !== undefined && p2.attenuationDb !== undefined ? ", " : ""}${p2.attenuationDb === undefined ? "" : `attenuation ${fmt(p2.attenuationDb, 4)} dB`}); worst margin now ${fmt(t.mask.marginDb, 3)} dB.`,
        });
        if (t.mask.marginDb > moved.mask.marginDb) moved = t;
        if (meets(s, moved)) {
          done = true;
          break;
        }
      }
      if (done) {
        result = moved;
        break;
      }
    }
    result = moved.mask.marginDb > a.mask.marginDb ? moved : a;
    if (bestMiss === null || result.mask.marginDb > bestMiss.mask.marginDb) bestMiss = result;
    // A real op-amp far too slow is not cured by more order (higher Q needs more GBW):
    // stop when the same parts with an ideal op-amp pass and the miss is gross.
    if (s.opamp.kind !== "ideal" && result.mask.marginDb < -1) {
      const ideal = checkMask(s, built(result.plans, result.chosen), IDEAL);
      if (ideal.marginDb >= 0) break;
    }
    if (s.order !== null || order === lastOrder) break;
    actions.push({
      code: "raised-order",
      message: `Order ${order} still missed the mask after re-tuning and moving the design; raised the order to ${order + 1}.`,
    });
  }
  let final = (result ?? first) as Attempt;
  if (!meets(s, final) && bestMiss !== null && bestMiss.mask.marginDb > final.mask.marginDb) {
    final = bestMiss;
    actions.push({
      code: "kept-best-attempt",
      message: `No order tried met the mask; kept order ${bestMiss.proto.order}, the attempt with the best worst margin (${fmt(bestMiss.mask.marginDb, 3)} dB).`,
    });
  }
  return assemble(s, fam.choice, family, minOrder, final, actions);
}

function assemble(
  s: DesignSpec,
  choice: FamilyChoice,
  family: FamilyName,
  minOrder: number,
  a: Attempt,
  actions: DesignAction[],
): DesignResult {
  const warnings: DesignWarning[] = [];
  const names = designators(a.plans, a.chosen);
  const boards = built(a.plans, a.chosen);
  const peaks = partialPeaks(boards, a.gridHz, s.opamp);
  const exactBoards = a.plans0.map((p) => ({ topology: p.topology, values: p.topology.design(p.target, {}) }));
  const ideal = checkMask(s, exactBoards, IDEAL);
  const stages: DesignStage[] = a.plans.map((p, i) => {
    const set = a.chosen[i] as ValueSet;
    const tuned = a.tuned[i] as TunedStage;
    const nm = names[i] as (typeof names)[number];
    const peak = peaks[i] as { gain: number; hz: number };
    const gbw = p.topology.gbwDemandHz(p.target);
    const index = i + 1;
    const rs = Object.entries(nm.components).filter(([k]) => k.startsWith("R"));
    const cs = Object.entries(nm.components).filter(([k]) => k.startsWith("C"));
    const outR = rs.filter(([, v]) => v < s.resistorRange.min * (1 - 1e-9) || v > s.resistorRange.max * (1 + 1e-9));
    if (outR.length > 0) {
      warnings.push({
        code: "resistor-out-of-range",
        stage: index,
        message: `${outR.map(([k, v]) => `${k} = ${fmt(v, 3)} Ω`).join(", ")} outside the resistor window ${fmt(s.resistorRange.min)}-${fmt(s.resistorRange.max)} Ω; no capacitor of the series in the capacitor window puts every resistor inside it.`,
      });
    }
    const outC = cs.filter(([, v]) => v < s.capacitorRange.min * (1 - 1e-9) || v > s.capacitorRange.max * (1 + 1e-9));
    if (outC.length > 0) {
      warnings.push({
        code: "capacitor-out-of-range",
        stage: index,
        message: `${outC.map(([k, v]) => `${k} = ${v.toExponential(2)} F`).join(", ")} outside the capacitor window.`,
      });
    }
    const ratio = capacitorSpreadOf(nm.components);
    if (ratio > LARGE_CAPACITOR_RATIO) {
      warnings.push({
        code: "large-capacitor-ratio",
        stage: index,
        message: `capacitor ratio ${fmt(ratio, 3)} exceeds ${LARGE_CAPACITOR_RATIO}; the stage's Q depends on it, so buy tight-tolerance capacitors or name a different topology.`,
      });
    }
    const pd = a.predistortion[i] ?? null;
    if (pd !== null && !pd.ok) {
      warnings.push({
        code: "predistortion-failed",
        stage: index,
        message: `the stage could not be pre-distorted for the op-amp's finite gain-bandwidth (${pd.reason}); it is designed for its ideal-op-amp target, so its pole moves with this op-amp. Choose a faster op-amp.`,
      });
    }
    let withOpamp: { f0Hz: number; q?: number } | undefined = set.withOpamp;
    if (withOpamp === undefined && s.opamp.kind !== "ideal") {
      try {
        withOpamp = asBuiltPole(p.topology, set.values, s.opamp);
      } catch {
        withOpamp = undefined;
      }
    }
    if (s.opamp.kind !== "ideal" && gbw > s.opamp.gbwHz) {
      warnings.push({
        code: "insufficient-gbw",
        stage: index,
        message:
          `the stage needs an op-amp GBW of about ${formatValue(gbw, { digits: 3, unit: "Hz" })} for 1 % accuracy of f0 and Q without correction; the chosen op-amp has ${formatValue(s.opamp.gbwHz, { digits: 3, unit: "Hz" })}.` +
          (pd !== null && pd.ok
            ? " The stage is pre-distorted for this op-amp, so its pole is right as built, but it depends on the op-amp's actual GBW (which varies between parts and with temperature): a faster op-amp is the more robust choice."
            : ""),
      });
    }
    return {
      index,
      topology: p.topology.id,
      topologyName: p.topology.name,
      topologyReason: p.reason,
      kind: p.target.kind,
      order: p.target.order,
      components: nm.components,
      localNames: nm.localNames,
      opamps: nm.opamps,
      target: figures(p.target),
      asBuilt: figures(set.figures),
      errors: set.withOpamp === undefined ? set.errors : stageErrors(set.figures, p.target),
      plainSnapErrors: tuned.plain.withOpamp === undefined ? tuned.plain.errors : stageErrors(tuned.plain.figures, p.target),
      ...(withOpamp === undefined ? {} : { asBuiltWithOpamp: { f0Hz: withOpamp.f0Hz, ...(withOpamp.q === undefined ? {} : { q: withOpamp.q }) } }),
      ...(pd?.ok === true ? { predistortion: { f0Factor: pd.f0Factor, qFactor: pd.qFactor, gainFactor: pd.gainFactor } } : {}),
      peakGain: peak.gain,
      peakHz: peak.hz,
      gbwDemandHz: gbw,
    };
  });
  const corrected = stages.filter((st) => st.predistortion !== undefined);
  if (corrected.length > 0) {
    actions.push({
      code: "predistorted-for-gbw",
      message: `Pre-distorted ${corrected.length === 1 ? "stage" : "stages"} ${corrected.map((st) => `${st.index} (f0 x${fmt(st.predistortion?.f0Factor ?? 1, 5)}, Q x${fmt(st.predistortion?.qFactor ?? 1, 5)}${(st.predistortion?.gainFactor ?? 1) === 1 ? "" : `, gain x${fmt(st.predistortion?.gainFactor ?? 1, 5)}`})`).join(", ")} for the op-amp's ${formatValue((s.opamp as { gbwHz: number }).gbwHz, { digits: 3, unit: "Hz" })} gain-bandwidth, so each stage built with it has the wanted f0 and Q; the preferred values were chosen by their pole with that op-amp.`,
    });
  }
  // Gain distribution: say so when an internal node peaks above the output.
  const outPeak = (peaks[peaks.length - 1] as { gain: number }).gain;
  peaks.slice(0, -1).forEach((p, i) => {
    if (p.gain > outPeak * 1.2) {
      warnings.push({
        code: "gain-not-distributed",
        stage: i + 1,
        message: `the output of stage ${i + 1} peaks ${fmt(20 * Math.log10(p.gain / outPeak), 3)} dB above the filter output (at ${fmt(p.hz, 4)} Hz) because its topology fixes its gain; allow an inverting stage (gain.polarity "either") or name a topology with adjustable gain to lower it.`,
      });
    }
  });
  const polarityOk = polarityMet(s, a);
  if (!polarityOk) {
    warnings.push({
      code: "polarity",
      message: `the requested ${s.polarity} polarity could not be met with the allowed topologies; the filter is ${a.mask.polarity}.`,
    });
  }
  const m = a.mask;
  const meetsSpec = m.marginDb >= 0 && polarityOk;
  if (!meetsSpec) {
    warnings.push({
      code: "spec-not-met",
      message: `the as-built filter misses the mask: passband margin ${fmt(m.passbandMarginDb, 3)} dB, stopband margin ${fmt(m.stopbandMarginDb, 3)} dB, gain margin ${fmt(m.gainMarginDb, 3)} dB${s.order !== null ? "; the spec fixes the order, so the pipeline did not raise it" : ""}.`,
    });
  }
  const p = a.proto;
  const placement: Placement = {
    parameter: p.interval.parameter,
    lowHz: p.interval.low / TWO_PI,
    highHz: p.interval.high / TWO_PI,
    chosenHz: a.value / TWO_PI,
    position: a.position,
    ...(p.interval.centre === undefined ? {} : { centreHz: p.interval.centre / TWO_PI }),
    ...(p.rippleDb === undefined ? {} : { designRippleDb: p.rippleDb }),
    ...(p.attenuationDb === undefined ? {} : { designAttenuationDb: p.attenuationDb }),
  };
  const order = p.order;
  return registerDesignResult(deepFreeze({
    spec: s,
    family,
    familyChoice: choice,
    order,
    filterOrder: s.response === "lowpass" || s.response === "highpass" ? order : 2 * order,
    minimumOrder: minOrder,
    placement,
    stages,
    verification: {
      meetsSpec,
      opamp: s.opamp,
      passbandLossDb: m.passbandLossDb,
      passbandWorstHz: m.passbandWorstHz,
      passbandMarginDb: m.passbandMarginDb,
      stopbandAttenuationDb: m.stopbandAttenuationDb,
      stopbandWorstHz: m.stopbandWorstHz,
      stopbandMarginDb: m.stopbandMarginDb,
      gainDb: m.gainDb,
      targetGainDb: 20 * Math.log10(s.gain),
      gainErrorDb: m.gainErrorDb,
      gainMarginDb: m.gainMarginDb,
      polarity: m.polarity,
      polarityOk,
      marginDb: m.marginDb,
      idealMarginDb: ideal.marginDb,
      curve: responseCurve(s, boards, s.opamp, CURVE_POINTS),
    },
    warnings,
    actions,
  }));
}
