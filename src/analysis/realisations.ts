/**
 * The realisations of a finished design compared on the boards: the public,
 * checked entry to the comparison in src/design/realisation.ts (the biquad
 * cascade against the leapfrog, FDNR and GIC active ladders of the same
 * prototype, on the same seeded boards at the same part tolerances, chosen
 * by yield and op-amp count). `designFilter` makes the same comparison for a
 * spec's `realisation: "auto"` or `"active-ladder"`.
 *
 * @module
 */
import { requireDesignResult } from "../design/check.ts";
import type { DesignResult } from "../design/index.ts";
import { compareOnBoards, type RealisationComparison } from "../design/realisation.ts";
import { requireOptions, requireInteger, requireInRange } from "../validate.ts";

export type { RealisationCandidate, RealisationComparison, RealisationMethod, RealisationSkipped } from "../design/realisation.ts";

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
  return compareOnBoards(result, { runs, seed, resistor, capacitor, distribution: s.partDistribution, among: "all", sequential: false });
}
