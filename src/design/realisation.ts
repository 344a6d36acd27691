/**
 * The realisations of one design compared on the same boards: the biquad
 * cascade the pipeline built, and the active simulations of the doubly
 * terminated LC ladder of the same prototype (leapfrog and FDNR for a
 * lowpass, grounded GIC inductors for a highpass), each built from the
 * spec's part series and op-amp (pre-distorted for a real op-amp by the
 * builders, src/ladder/active/predistort.ts; a method whose op-amp is too
 * slow for that is listed as skipped, with the gain-bandwidth it needs; the
 * resistors re-tuned after rounding, src/ladder/active/retune.ts), each given
 * the same seeded boards at the same part tolerances, distribution and mask
 * check, an unstable board counted as failed.
 *
 * The choice: of the realisations whose yield reaches the target (the lower
 * end of the 95 % Wilson interval), the one with the fewest op-amps, then
 * the higher lower bound; when none reaches it, the highest lower bound.
 * `designFilter` makes it with the spec's `realisation: "auto"` (every
 * candidate) or `"active-ladder"` (the ladders only; the cascade is listed
 * for comparison), and `compareRealisations` for any finished design.
 *
 * Why a ladder: a doubly terminated lossless ladder has zero first-order
 * sensitivity to its elements where it transfers maximum power (H. J.
 * Orchard, "Inductorless filters", Electronics Letters 2(6), 1966), and its
 * active simulations inherit that; a cascade of biquads does not.
 *
 * Accuracy: the yields are Monte Carlo fractions of the boards built (their
 * 95 % Wilson interval given); the figures per board are those of
 * src/evaluate/ (within 1e-9 dB of the nodal analysis).
 *
 * @module
 */
import { FilterwrightError, SingularCircuitError, UnrealisableError } from "../errors.ts";
import { BATCH, runBoards, type BoardStage, type PartDistribution } from "../evaluate/boards.ts";
import { circuitBoardStage } from "../evaluate/circuit-boards.ts";
import type { MaskPlan } from "../evaluate/mask.ts";
import { compileStage } from "../evaluate/stage-polynomials.ts";
import { sequentialYield, wilsonInterval } from "../evaluate/yield.ts";
import { finiteSorted, medianOfSorted } from "../math/order-statistics.ts";
import { ladderPrototype } from "../ladder/ladder-prototype.ts";
import type { LadderPrototype } from "../ladder/types.ts";
import { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder } from "../ladder/active/index.ts";
import type { ActiveLadder, ActiveLadderMethod } from "../ladder/active/types.ts";
import { TWO_PI } from "../units/constants.ts";
import { builtStages } from "./response.ts";
import type { DesignResult } from "./types.ts";
import { maskPlan, spanRadS } from "./verify.ts";

/** Part tolerances of a Monte Carlo run, as fractions. */
export interface ToleranceFractions {
  /** Resistor tolerance. */
  readonly resistor: number;
  /** Capacitor tolerance. */
  readonly capacitor: number;
}

/** How a candidate is built. */
export type RealisationMethod = "biquad-cascade" | ActiveLadderMethod;

/** One realisation measured on the boards. */
export interface RealisationCandidate {
  /** `"cascade"` (the design's own stages) or `"active-ladder"`. */
  readonly realisation: "cascade" | "active-ladder";
  /** How it is built. */
  readonly method: RealisationMethod;
  /** Op-amps on the board. */
  readonly opamps: number;
  /** Resistors and capacitors on the board. */
  readonly parts: number;
  /** Fraction of the boards meeting the mask (unstable boards fail). */
  readonly yield: number;
  /** Lower end of the 95 % Wilson interval of `yield`. */
  readonly lower95: number;
  /** Upper end of the 95 % Wilson interval of `yield`. */
  readonly upper95: number;
  /** Boards built. */
  readonly boards: number;
  /** Whether `lower95` reaches the spec's yield target. */
  readonly meetsTarget: boolean;
  /** Worst margin over the mask of the median board, dB. */
  readonly medianMarginDb: number;
  /** Worst margin over the mask of the nominal board (every part at its value, the spec's op-amp), dB. */
  readonly nominalMarginDb: number;
  /** Part tolerances the boards were built at (fractions): what the BOM of this realisation asks for. */
  readonly tolerances: ToleranceFractions;
  /** The circuit of an active ladder (absent for the cascade, whose circuit is the design itself). */
  readonly ladder?: ActiveLadder;
}

/** A method that could not realise this design, and why. */
export interface RealisationSkipped {
  /** The method. */
  readonly method: ActiveLadderMethod;
  /** Why it was not built, in words. */
  readonly reason: string;
}

/** The realisations of a design compared on the same boards, and the choice. */
export interface RealisationComparison {
  /** Every realisation built, the cascade first. */
  readonly candidates: readonly RealisationCandidate[];
  /** The methods that could not realise this design. */
  readonly skipped: readonly RealisationSkipped[];
  /** Index into `candidates` of the choice. */
  readonly chosen: number;
  /** Why it was chosen, in a sentence. */
  readonly reason: string;
  /** Part tolerances the boards were built at (fractions). */
  readonly tolerances: ToleranceFractions;
  /** Seed of the boards (the same for every candidate). */
  readonly seed: number;
}

/** The realisation `designFilter` chose for a spec's `realisation: "auto"` or `"active-ladder"`. */
export interface DesignRealisation extends RealisationComparison {
  /** What the spec asked for. */
  readonly requested: "active-ladder" | "auto";
  /**
   * Whether the chosen realisation's boards work: for an active ladder, its
   * nominal board meets the mask and its yield on the compared boards
   * reaches the target, and this is the design's verdict; for the cascade,
   * its own `verification.boardsMeetSpec` (its boards at the parts'
   * allocated tolerances).
   */
  readonly boardsMeetSpec: boolean;
}

/** Settings of a comparison (checked by the caller). */
export interface ComparisonSettings {
  /** Boards per candidate. */
  readonly runs: number;
  /** Seed of the boards. */
  readonly seed: number;
  /** Every resistor's tolerance. */
  readonly resistor: number;
  /** Every capacitor's tolerance. */
  readonly capacitor: number;
  /** Part spread. */
  readonly distribution: PartDistribution;
  /** Which candidates may be chosen: every one, or the active ladders only. */
  readonly among: "all" | "active-ladder";
  /**
   * Build each candidate's boards in blocks of 256 until its 95 % interval
   * decides against the yield target (at least two blocks, at most `runs`),
   * as the cascade's own yield check does; else exactly `runs` boards each.
   */
  readonly sequential: boolean;
}

/** A candidate's boards: the counts, and each board's worst margin (dB; NaN for a failed one). */
interface CandidateBoards {
  readonly boards: number;
  readonly passed: number;
  readonly marginDb: Float64Array;
}

/** The boards of one candidate: `runs` of them, or in blocks until the interval decides (see `sequential`). */
function candidateBoards(stages: readonly BoardStage[], plan: MaskPlan, settings: ComparisonSettings, target: number): CandidateBoards {
  const { seed, distribution } = settings;
  if (!settings.sequential) {
    const run = runBoards(stages, plan, { boards: settings.runs, seed, distribution });
    return { boards: run.boards, passed: run.passed, marginDb: run.marginDb };
  }
  const blocks: Float64Array[] = [];
  const y = sequentialYield(stages, plan, { target, seed, distribution, maxBoards: settings.runs }, blocks);
  const marginDb = new Float64Array(y.boards);
  blocks.forEach((m, i) => marginDb.set(m, i * BATCH));
  return { boards: y.boards, passed: y.passed, marginDb };
}

/** A design's boards as the board engine takes them. */
export interface ResultBoardStages {
  /** The mask. */
  readonly plan: MaskPlan;
  /** The band edges' span, rad/s, the stages were compiled for. */
  readonly span: readonly [number, number];
  /** Each stage: compiled, nominal values, tolerances and scale. */
  readonly stages: readonly BoardStage[];
}

/**
 * The mask and the board stages of a checked design: each stage compiled with
 * the design's op-amp model over the mask's span, its nominal values, each
 * part's tolerance (the caller's fixed one, else the part's own, else the
 * spec's) and its scale (the stage's ideal f0, rad/s).
 *
 * @param result - a checked design
 * @param fixed - every resistor's / capacitor's tolerance, where the caller fixes one
 * @returns the plan, the span and the stages
 */
export function resultBoardStages(result: DesignResult, fixed: { readonly resistor?: number | undefined; readonly capacitor?: number | undefined }): ResultBoardStages {
  const plan = maskPlan(result.spec);
  const span = spanRadS(plan.bands);
  const opamp = result.spec.opamp;
  const stages: BoardStage[] = builtStages(result).map((s, k) => {
    const compiled = compileStage(s.topology, s.values, opamp, span);
    const st = result.stages[k] as DesignResult["stages"][number];
    const own = new Map(Object.entries(st.localNames).map(([global, local]) => [local, st.tolerances[global] as number]));
    const part = (name: string): number => {
      const given = name.startsWith("C") ? fixed.capacitor : fixed.resistor;
      return given ?? own.get(name) ?? (name.startsWith("C") ? result.spec.capacitorTolerance : result.spec.resistorTolerance);
    };
    return {
      compiled,
      nominal: Float64Array.from(compiled.componentNames, (name) => s.values[name] as number),
      tolerance: Float64Array.from(compiled.componentNames, part),
      radius: TWO_PI * s.topology.figures(s.values).f0Hz,
    };
  });
  return { plan, span, stages };
}

/** The median of the finite values, or null when there is none. */
function finiteMedian(xs: Float64Array): number | null {
  const s = finiteSorted(xs);
  return s.length === 0 ? null : medianOfSorted(s);
}

/** The normalised ladder of the prototype the design placed (its family, order, design ripple and attenuation). */
function ladderOf(result: DesignResult): LadderPrototype {
  const p = result.placement;
  return ladderPrototype({
    family: result.family,
    order: result.order,
    ...(p.designRippleDb === undefined ? {} : { rippleDb: p.designRippleDb }),
    ...(p.designAttenuationDb === undefined ? {} : { attenuationDb: p.designAttenuationDb }),
    form: "series-first",
  });
}

/** Build each active ladder method that fits the response; the others with the reason. */
function activeLadders(result: DesignResult): { built: ActiveLadder[]; skipped: RealisationSkipped[] } {
  const s = result.spec;
  const built: ActiveLadder[] = [];
  const skipped: RealisationSkipped[] = [];
  const methods: ActiveLadderMethod[] = s.response === "lowpass" ? ["leapfrog", "fdnr"] : s.response === "highpass" ? ["gic-inductor"] : [];
  if (methods.length === 0) {
    for (const method of ["leapfrog", "fdnr", "gic-inductor"] as const) {
      skipped.push({ method, reason: `no active ladder realisation of a ${s.response} is built yet (lowpass: leapfrog, FDNR; highpass: GIC inductors)` });
    }
    return { built, skipped };
  }
  let proto: LadderPrototype;
  try {
    proto = ladderOf(result);
  } catch (e) {
    if (!(e instanceof FilterwrightError)) throw e;
    for (const method of methods) skipped.push({ method, reason: `the ${result.family} order-${result.order} ladder cannot be synthesised: ${e.message}` });
    return { built, skipped };
  }
  const options = {
    edgeHz: result.placement.chosenHz,
    resistorSeries: s.resistorSeries,
    capacitorSeries: s.capacitorSeries,
    opamp: s.opamp,
    gain: s.gain,
  };
  for (const method of methods) {
    try {
      built.push(method === "leapfrog" ? leapfrogLowpassLadder(proto, options) : method === "fdnr" ? fdnrLowpassLadder(proto, options) : gicHighpassLadder(proto, options));
    } catch (e) {
      if (!(e instanceof FilterwrightError)) throw e;
      skipped.push({ method, reason: e.message });
    }
  }
  return { built, skipped };
}

/** A candidate's record from its boards. */
function candidate(
  kind: { readonly realisation: RealisationCandidate["realisation"]; readonly method: RealisationMethod; readonly opamps: number; readonly parts: number },
  run: CandidateBoards,
  figures: { readonly medianMarginDb: number; readonly nominalMarginDb: number },
  settings: ComparisonSettings,
  target: number,
  ladder?: ActiveLadder,
): RealisationCandidate {
  const [lower95, upper95] = wilsonInterval(run.passed, run.boards);
  return {
    ...kind,
    yield: run.passed / run.boards,
    lower95,
    upper95,
    boards: run.boards,
    meetsTarget: lower95 >= target,
    medianMarginDb: figures.medianMarginDb,
    nominalMarginDb: figures.nominalMarginDb,
    tolerances: { resistor: settings.resistor, capacitor: settings.capacitor },
    ...(ladder === undefined ? {} : { ladder }),
  };
}

const pc = (x: number): string => `${Number((x * 100).toPrecision(3))} %`;

/** The choice among `allowed` and the sentence that says why. */
function choose(cands: readonly RealisationCandidate[], allowed: readonly number[], target: number): { chosen: number; reason: string } {
  const c = (i: number): RealisationCandidate => cands[i] as RealisationCandidate;
  const meeting = allowed.filter((i) => c(i).meetsTarget);
  const name = (k: RealisationCandidate): string => (k.realisation === "cascade" ? "the biquad cascade" : `the ${k.method} active ladder`);
  const at = (k: RealisationCandidate): string => `${pc(k.yield)} of boards (95 % interval from ${pc(k.lower95)})`;
  const scope = allowed.length === cands.length ? "realisations" : "active ladders";
  if (meeting.length > 0) {
    const order = [...meeting].sort((a, b) => c(a).opamps - c(b).opamps || c(b).lower95 - c(a).lower95);
    const k = c(order[0] as number);
    const others = meeting.length === 1 ? `the only one of the ${scope} that meets` : `the fewest op-amps (${k.opamps}) of the ${meeting.length} ${scope} that meet`;
    return { chosen: order[0] as number, reason: `${name(k)}: ${others} the ${pc(target)} yield target, at ${at(k)}.` };
  }
  const order = [...allowed].sort((a, b) => c(b).lower95 - c(a).lower95 || c(a).opamps - c(b).opamps);
  const k = c(order[0] as number);
  return { chosen: order[0] as number, reason: `${name(k)}: none of the ${scope} meets the ${pc(target)} yield target at these tolerances; it comes closest, at ${at(k)}.` };
}

/** The boards of one active ladder against the design's mask, and its nominal board (null when every board is singular). */
function ladderBoards(ladder: ActiveLadder, plan: MaskPlan, span: readonly [number, number], settings: ComparisonSettings, target: number): { run: CandidateBoards; median: number; nominal: number } | null {
  const stageAt = (resistor: number, capacitor: number): BoardStage =>
    circuitBoardStage(ladder.circuit, { source: ladder.source, output: ladder.output, spanRadS: span, resistorTolerance: resistor, capacitorTolerance: capacitor, radiusRadS: ladder.frequencyScale });
  const run = candidateBoards([stageAt(settings.resistor, settings.capacitor)], plan, settings, target);
  const median = finiteMedian(run.marginDb);
  const nominal = runBoards([stageAt(0, 0)], plan, { boards: 1, seed: settings.seed, distribution: settings.distribution }).marginDb[0] as number;
  return median === null || !Number.isFinite(nominal) ? null : { run, median, nominal };
}

/**
 * Compare a design's biquad cascade with the active simulations of the LC
 * ladder of the same prototype on the same seeded boards, and choose
 * (internal: the settings are checked by the caller).
 *
 * @param result - a design (its family, order, placement, spec, parts and op-amp are used)
 * @param settings - boards, seed, tolerances, spread and which candidates may be chosen
 * @returns every candidate with its op-amps and yield, the methods that do not fit, the choice and why
 *   (with `among: "active-ladder"` and no ladder built, `chosen` is -1)
 * @throws {@link SingularCircuitError} when every board of the cascade is singular
 */
export function compareOnBoards(result: DesignResult, settings: ComparisonSettings): RealisationComparison {
  const target = result.spec.yieldTarget;
  const { plan, span, stages } = resultBoardStages(result, settings);
  const run = candidateBoards(stages, plan, settings, target);
  const median = finiteMedian(run.marginDb);
  if (median === null) {
    throw new SingularCircuitError({ fn: "compareRealisations", path: "result", message: "no board of the cascade has a finite margin: every board's circuit was singular; check the design's parts, or lower the part tolerances" }, []);
  }
  const cascadeKind = {
    realisation: "cascade" as const,
    method: "biquad-cascade" as const,
    opamps: result.stages.reduce((k, st) => k + st.opamps.length, 0),
    parts: result.stages.reduce((k, st) => k + Object.keys(st.components).length, 0),
  };
  const candidates: RealisationCandidate[] = [candidate(cascadeKind, run, { medianMarginDb: median, nominalMarginDb: result.verification.marginDb }, settings, target)];
  const { built, skipped } = activeLadders(result);
  for (const l of built) {
    const boards = ladderBoards(l, plan, span, settings, target);
    if (boards === null) {
      skipped.push({ method: l.method, reason: "every board of the ladder is singular at these tolerances" });
      continue;
    }
    const kind = { realisation: "active-ladder" as const, method: l.method, opamps: l.opampCount, parts: l.parts.length };
    candidates.push(candidate(kind, boards.run, { medianMarginDb: boards.median, nominalMarginDb: boards.nominal }, settings, target, l));
  }
  const allowed = candidates.map((_, i) => i).filter((i) => settings.among === "all" || i > 0);
  const pick = allowed.length === 0 ? { chosen: -1, reason: "no active ladder could be built for this design" } : choose(candidates, allowed, target);
  return { candidates, skipped, chosen: pick.chosen, reason: pick.reason, tolerances: { resistor: settings.resistor, capacitor: settings.capacitor }, seed: settings.seed };
}

/** The skipped methods' reasons in one clause (a reason shared by every method said once). */
function skippedText(skipped: readonly RealisationSkipped[]): string {
  const reasons = [...new Set(skipped.map((k) => k.reason))];
  return reasons.length === 1 ? (reasons[0] as string) : skipped.map((k) => `${k.method}: ${k.reason}`).join("; ");
}

/**
 * The realisation a spec's `realisation: "auto"` or `"active-ladder"` gets:
 * the cascade and the active ladders compared on the spec's boards (its
 * yield seed, its part tolerances and spread; each candidate's boards built
 * in blocks until its 95 % interval decides against the target, at most
 * `yieldCheck.maxBoards`, as the cascade's own yield check) and the choice
 * (internal: the result is a checked design).
 *
 * @param cascade - the design's biquad cascade
 * @param requested - what the spec asked for
 * @returns the comparison, what was asked for and the chosen realisation's verdict
 * @throws {@link UnrealisableError} (path `realisation`) when an active ladder is asked for and none can be built
 */
export function chooseRealisation(cascade: DesignResult, requested: "active-ladder" | "auto"): DesignRealisation {
  const s = cascade.spec;
  const c = compareOnBoards(cascade, {
    runs: s.yieldMaxBoards,
    seed: s.yieldSeed,
    resistor: s.resistorTolerance,
    capacitor: s.capacitorTolerance,
    distribution: s.partDistribution,
    among: requested === "auto" ? "all" : "active-ladder",
    sequential: true,
  });
  if (c.chosen < 0) {
    throw new UnrealisableError({
      fn: "designFilter",
      path: "realisation",
      received: requested,
      message: `no active ladder can realise this ${cascade.family} ${s.response} (${skippedText(c.skipped)}); ask for realisation "auto" or "cascade"`,
    });
  }
  const k = c.candidates[c.chosen] as RealisationCandidate;
  const own = cascade.verification.yield;
  // The cascade's tighter parts, where its design allocated them, are another way to the target: say so.
  const tighter =
    k.realisation === "active-ladder" && own.met && !(c.candidates[0] as RealisationCandidate).meetsTarget
      ? ` The cascade meets the target too, but only with the tighter parts its design allocated (${pc(own.fraction)} of ${own.boards} boards at ${pc(own.resistorTolerances[0] ?? s.resistorTolerance)} R / ${pc(own.capacitorTolerances[0] ?? s.capacitorTolerance)} C for its tightest parts: verification.yield).`
      : "";
  // The cascade's own verdict stands when it is chosen (its boards at the parts' allocated tolerances).
  return { requested, ...c, reason: `${c.reason}${tighter}`, boardsMeetSpec: k.realisation === "cascade" ? cascade.verification.boardsMeetSpec : k.nominalMarginDb >= 0 && k.meetsTarget };
}

/**
 * The active ladder a design chose (a spec's `realisation: "auto"` or
 * `"active-ladder"`), or undefined when it keeps its cascade.
 *
 * @param result - a design
 * @returns the chosen candidate when it is an active ladder
 */
export function chosenActiveLadder(result: DesignResult): RealisationCandidate | undefined {
  const own = result.realisation;
  const k = own === undefined ? undefined : own.candidates[own.chosen];
  return k !== undefined && k.realisation === "active-ladder" ? k : undefined;
}
