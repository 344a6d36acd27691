/**
 * The realisations of one design compared on the boards: the biquad cascade
 * that `designFilter` built, and the active simulations of the doubly
 * terminated LC ladder of the same prototype (leapfrog and FDNR for a
 * lowpass, grounded GIC inductors for a highpass), each built from the spec's
 * part series and op-amp (pre-distorted for a real op-amp by the builders,
 * src/ladder/active/predistort.ts; a method whose op-amp is too slow for
 * that is listed as skipped, with the gain-bandwidth it needs; their
 * resistors re-tuned after rounding, src/ladder/active/retune.ts), each given the same seeded boards at the same
 * uniform part tolerances. The choice: of the realisations whose yield meets
 * the spec's target (the lower end of the 95 % Wilson interval), the one with
 * the fewest op-amps (then the higher yield); when none meets it, the highest
 * lower bound.
 *
 * Why a ladder: a doubly terminated lossless ladder has zero first-order
 * sensitivity to its elements where it transfers maximum power (H. J.
 * Orchard, "Inductorless filters", Electronics Letters 2(6), 1966), and its
 * active simulations inherit that; a cascade of biquads does not.
 *
 * @module
 */
import { requireDesignResult } from "../design/check.ts";
import type { DesignResult } from "../design/index.ts";
import { requireOptions, requireInteger, requireInRange } from "../validate.ts";
import { FilterwrightError } from "../errors.ts";
import { wilsonInterval } from "../evaluate/yield.ts";
import { ladderPrototype } from "../ladder/ladder-prototype.ts";
import type { LadderPrototype } from "../ladder/types.ts";
import { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder } from "../ladder/active/index.ts";
import type { ActiveLadder, ActiveLadderMethod } from "../ladder/active/types.ts";
import { monteCarlo, type ToleranceFractions } from "./tolerance.ts";
import { activeLadderMonteCarlo } from "./ladder-yield.ts";

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

/** The result of {@link compareRealisations}. */
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

/** Options of {@link compareRealisations}. */
export interface CompareRealisationsOptions {
  /**
   * Boards per candidate, 1 to 100,000.
   * @defaultValue 2000
   */
  readonly runs?: number;
  /**
   * Seed of the boards (the same for every candidate).
   * @defaultValue the spec's yield seed
   */
  readonly seed?: number;
  /**
   * Every resistor's tolerance (fraction, 0 to 0.2).
   * @defaultValue the spec's resistor tolerance
   */
  readonly resistorTolerance?: number;
  /**
   * Every capacitor's tolerance (fraction, 0 to 0.2).
   * @defaultValue the spec's capacitor tolerance
   */
  readonly capacitorTolerance?: number;
}

const pc = (x: number): string => `${Number((x * 100).toPrecision(3))} %`;

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

function candidate(
  realisation: RealisationCandidate["realisation"],
  method: RealisationMethod,
  counts: { opamps: number; parts: number },
  mc: { yield: number; runs: number; marginDb: { median: number }; tolerances: { resistor: number; capacitor: number } },
  target: number,
  ladder?: ActiveLadder,
): RealisationCandidate {
  const passed = Math.round(mc.yield * mc.runs);
  const [lower95, upper95] = wilsonInterval(passed, mc.runs);
  return {
    realisation,
    method,
    opamps: counts.opamps,
    parts: counts.parts,
    yield: mc.yield,
    lower95,
    upper95,
    boards: mc.runs,
    meetsTarget: lower95 >= target,
    medianMarginDb: mc.marginDb.median,
    tolerances: { resistor: mc.tolerances.resistor, capacitor: mc.tolerances.capacitor },
    ...(ladder === undefined ? {} : { ladder }),
  };
}

/** The choice and the sentence that says why. */
function choose(cands: readonly RealisationCandidate[], target: number): { chosen: number; reason: string } {
  const idx = cands.map((_, i) => i);
  const meeting = idx.filter((i) => (cands[i] as RealisationCandidate).meetsTarget);
  const name = (c: RealisationCandidate): string => (c.realisation === "cascade" ? "the biquad cascade" : `the ${c.method} active ladder`);
  const at = (c: RealisationCandidate): string => `${pc(c.yield)} of boards (95 % interval from ${pc(c.lower95)})`;
  if (meeting.length > 0) {
    meeting.sort((a, b) => (cands[a] as RealisationCandidate).opamps - (cands[b] as RealisationCandidate).opamps || (cands[b] as RealisationCandidate).lower95 - (cands[a] as RealisationCandidate).lower95);
    const c = cands[meeting[0] as number] as RealisationCandidate;
    const others = meeting.length === 1 ? "the only realisation that meets" : `the fewest op-amps (${c.opamps}) of the ${meeting.length} realisations that meet`;
    return { chosen: meeting[0] as number, reason: `${name(c)}: ${others} the ${pc(target)} yield target, at ${at(c)}.` };
  }
  idx.sort((a, b) => (cands[b] as RealisationCandidate).lower95 - (cands[a] as RealisationCandidate).lower95 || (cands[a] as RealisationCandidate).opamps - (cands[b] as RealisationCandidate).opamps);
  const c = cands[idx[0] as number] as RealisationCandidate;
  return { chosen: idx[0] as number, reason: `${name(c)}: no realisation meets the ${pc(target)} yield target at these tolerances; it comes closest, at ${at(c)}.` };
}

/**
 * Compare the design's biquad cascade with the active simulations of the LC
 * ladder of the same prototype, on the same seeded boards at the same part
 * tolerances, and choose by yield and op-amp count.
 *
 * @param result - a design (its family, order, placement, spec, parts and op-amp are used)
 * @param options - boards, seed, tolerances
 * @returns every candidate with its op-amps and yield, the methods that do not fit, the choice and why
 * @throws {@link InvalidArgumentError} when `result` is not a design result or an option is out of range
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "18k", maxLossDb: 0.25 }, stopband: { edgeHz: "26k", minAttenuationDb: 33 }, family: "chebyshev1", order: 7 };
 * const c = compareRealisations(designFilter(spec), { runs: 500 });
 * c.candidates.map((k) => k.method); //=> ["biquad-cascade", "leapfrog", "fdnr"]
 * ```
 */
export function compareRealisations(result: DesignResult, options: CompareRealisationsOptions = {}): RealisationComparison {
  const fn = "compareRealisations";
  requireDesignResult(fn, result);
  const o = requireOptions(fn, "options", options);
  const s = result.spec;
  const runs = o["runs"] === undefined ? 2000 : requireInteger(fn, "options.runs", o["runs"], { min: 1, max: 100_000 });
  const seed = o["seed"] === undefined ? s.yieldSeed : requireInteger(fn, "options.seed", o["seed"], { min: -(2 ** 31), max: 2 ** 32 - 1 });
  const resistor = o["resistorTolerance"] === undefined ? s.resistorTolerance : requireInRange(fn, "options.resistorTolerance", o["resistorTolerance"], { min: 0, max: 0.2 });
  const capacitor = o["capacitorTolerance"] === undefined ? s.capacitorTolerance : requireInRange(fn, "options.capacitorTolerance", o["capacitorTolerance"], { min: 0, max: 0.2 });
  const mcOptions = { runs, seed, resistorTolerance: resistor, capacitorTolerance: capacitor };
  const target = s.yieldTarget;
  const cascadeCounts = {
    opamps: result.stages.reduce((k, st) => k + st.opamps.length, 0),
    parts: result.stages.reduce((k, st) => k + Object.keys(st.components).length, 0),
  };
  const candidates: RealisationCandidate[] = [candidate("cascade", "biquad-cascade", cascadeCounts, monteCarlo(result, mcOptions), target)];
  const { built, skipped } = activeLadders(result);
  for (const l of built) {
    candidates.push(candidate("active-ladder", l.method, { opamps: l.opampCount, parts: l.parts.length }, activeLadderMonteCarlo(result, l, mcOptions), target, l));
  }
  const { chosen, reason } = choose(candidates, target);
  return { candidates, skipped, chosen, reason, tolerances: { resistor, capacitor }, seed };
}
