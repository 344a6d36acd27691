/**
 * Monte Carlo tolerance analysis: how many boards built from parts within
 * their tolerance still meet the mask.
 *
 * Method: every resistor and capacitor is drawn independently, uniformly
 * within +-tolerance of its nominal value (the worst-case-bounded model of a
 * part sold as "+-t %"; a uniform draw is the conservative choice when the
 * maker's distribution is unknown, common practice, no source), or normally
 * with the tolerance as three standard deviations, from seeded streams
 * (src/evaluate/boards.ts) so runs repeat exactly and board k is the same
 * board whatever the number of runs. Each board's stages become polynomials
 * with the design's op-amp model and are checked against the mask exactly as
 * the design's own verification does. The yield's standard error is
 * sqrt(p (1 - p) / runs).
 *
 * @module
 */
import { withDisplay } from "../display.ts";
import { monteCarloBundle } from "./display.ts";
import { InvalidArgumentError, SingularCircuitError } from "../errors.ts";
import { requireInRange, requireInteger, requireOneOf, requireOptions } from "../validate.ts";
import type { DesignResult } from "../design/index.ts";
import { requireDesignResult } from "../design/check.ts";
import { finiteSorted, medianOfSorted } from "../math/order-statistics.ts";
import { resultBoardStages, type ResultBoardStages, type ToleranceFractions } from "../design/realisation.ts";
import { runBoards, type BoardRun, type BoardStage, type PartDistribution } from "../evaluate/boards.ts";
import { checkpoint, checkRunControl, watched, type RunControl } from "../evaluate/progress.ts";

/** Options of {@link monteCarlo}. */
export interface MonteCarloOptions {
  /**
   * Number of boards simulated (1 to 100000).
   * @defaultValue 200
   */
  readonly runs?: number;
  /**
   * Seed of the random generator (an integer).
   * @defaultValue 1
   */
  readonly seed?: number;
  /**
   * Resistor tolerance as a fraction (0.01 for 1 %), for every resistor.
   * @defaultValue each resistor's own tolerance in the design (`stages[].tolerances`)
   */
  readonly resistorTolerance?: number;
  /**
   * Capacitor tolerance as a fraction, for every capacitor.
   * @defaultValue each capacitor's own tolerance in the design (`stages[].tolerances`)
   */
  readonly capacitorTolerance?: number;
  /**
   * How part values spread within their tolerance: `"uniform"`, or `"normal"`
   * with the tolerance as three standard deviations (draws beyond it redrawn).
   * @defaultValue "uniform"
   */
  readonly distribution?: PartDistribution;
  /**
   * Called after every batch of 256 boards with the boards built so far; return `false` to stop the run.
   * @defaultValue none
   */
  readonly onProgress?: RunControl["onProgress"];
  /**
   * Stops the run at the next batch once aborted.
   * @defaultValue none
   */
  readonly signal?: AbortSignal;
  /**
   * Stops the run at the first batch after this many milliseconds (1 ms to 1 day).
   * @defaultValue no limit
   */
  readonly timeLimitMs?: number;
}

/** Smallest, median and largest of a figure over the runs. */
export interface Spread {
  /** Smallest value. */
  readonly min: number;
  /** Median. */
  readonly median: number;
  /** Largest value. */
  readonly max: number;
}

export type { ToleranceFractions } from "../design/realisation.ts";

/** Result of {@link monteCarlo}. */
export interface MonteCarloResult {
  /** Boards simulated. */
  readonly runs: number;
  /** Fraction of boards meeting the mask (passband, stopband and gain). */
  readonly yield: number;
  /** Standard error of `yield`. */
  readonly yieldStandardError: number;
  /** Tolerances used, as fractions (the loosest resistor and capacitor when the design allocated them per part). */
  readonly tolerances: ToleranceFractions;
  /** Worst margin over the mask, dB. */
  readonly marginDb: Spread;
  /** Passband loss, dB. */
  readonly passbandLossDb: Spread;
  /** Stopband attenuation, dB. */
  readonly stopbandAttenuationDb: Spread;
  /** Passband level, dB. */
  readonly gainDb: Spread;
  /** The component values of the worst board, by designator. */
  readonly worstBoard: Readonly<Record<string, number>>;
}

/**
 * Smallest, median and largest of the finite entries (a singular board has none).
 *
 * @param xs - one figure of every board
 * @param fn - the public function, for the error
 * @param figure - the figure's name, for the error
 * @returns the spread
 * @throws {@link SingularCircuitError} when no board has a finite figure (every board's circuit singular)
 */
export function spread(xs: Float64Array, fn = "monteCarlo", figure = "marginDb"): Spread {
  const s = finiteSorted(xs);
  if (s.length === 0) {
    throw new SingularCircuitError(
      {
        fn,
        path: "options",
        message: `no board of the run has a finite ${figure}: every board's circuit was singular; check the design's parts, or lower options.resistorTolerance / options.capacitorTolerance`,
      },
      [],
    );
  }
  return { min: s[0] as number, median: medianOfSorted(s), max: s[s.length - 1] as number };
}

/** The options of a Monte Carlo run, checked, with their defaults filled in. */
export interface MonteCarloSettings {
  /** Boards. */
  readonly runs: number;
  /** Seed. */
  readonly seed: number;
  /** Every resistor's tolerance, when the caller fixed one. */
  readonly resistorTolerance: number | undefined;
  /** Every capacitor's tolerance, when the caller fixed one. */
  readonly capacitorTolerance: number | undefined;
  /** Part spread. */
  readonly distribution: PartDistribution;
}

/**
 * Check a Monte Carlo call's design and options (shared by `monteCarlo` and
 * the parallel run of `filterwright/node`, which names itself in `fn`).
 *
 * @param fn - the public function, for the errors
 * @param result - the design
 * @param options - the options as given
 * @returns the settings
 * @throws `InvalidArgumentError` as {@link monteCarlo} documents
 */
export function monteCarloSettings(fn: string, result: DesignResult, options: unknown): MonteCarloSettings {
  requireDesignResult(fn, result);
  const o = requireOptions(fn, "options", options);
  const runs = o["runs"] === undefined ? 200 : requireInteger(fn, "options.runs", o["runs"], { min: 1, max: 100000 });
  const seed = o["seed"] === undefined ? 1 : requireInteger(fn, "options.seed", o["seed"], { min: -(2 ** 31), max: 2 ** 32 - 1 });
  const rt =
    o["resistorTolerance"] === undefined
      ? undefined
      : requireInRange(fn, "options.resistorTolerance", o["resistorTolerance"], { min: 0, max: 0.5 });
  const ct =
    o["capacitorTolerance"] === undefined
      ? undefined
      : requireInRange(fn, "options.capacitorTolerance", o["capacitorTolerance"], { min: 0, max: 0.5 });
  if (result === null || typeof result !== "object" || !Array.isArray(result.stages)) {
    throw new InvalidArgumentError({ fn, path: "result", received: result, message: "expected a design result from designFilter" });
  }
  const distribution =
    o["distribution"] === undefined ? "uniform" : requireOneOf(fn, "options.distribution", o["distribution"], ["uniform", "normal"] as const);
  return { runs, seed, resistorTolerance: rt, capacitorTolerance: ct, distribution };
}

/** A design's boards as the board engine takes them. */
export type MonteCarloStages = ResultBoardStages;

/**
 * The mask and the board stages of a checked design (src/design/realisation.ts
 * `resultBoardStages`): each part's tolerance the caller's fixed one, else
 * the part's own, else the spec's.
 *
 * @param result - a checked design
 * @param settings - from {@link monteCarloSettings}
 * @returns the plan, the span and the stages
 */
export function monteCarloStages(result: DesignResult, settings: MonteCarloSettings): MonteCarloStages {
  return resultBoardStages(result, { resistor: settings.resistorTolerance, capacitor: settings.capacitorTolerance });
}

/**
 * The result of a Monte Carlo run from its boards: the yield, the tolerances
 * used, the spread of each figure and the worst board by designator.
 *
 * @param result - the design
 * @param stages - its board stages ({@link monteCarloStages})
 * @param settings - the run's settings
 * @param run - the boards, every one of `settings.runs` from board 0
 * @returns the summary
 */
export function monteCarloSummary(
  result: DesignResult,
  stages: readonly BoardStage[],
  settings: MonteCarloSettings,
  run: BoardRun,
): MonteCarloResult {
  const { runs, resistorTolerance: rt, capacitorTolerance: ct } = settings;
  const worstBoard: Record<string, number> = {};
  result.stages.forEach((st, k) => {
    const names = (stages[k] as BoardStage).compiled.componentNames;
    const values = run.worstValues[k] as Float64Array;
    for (const [global, local] of Object.entries(st.localNames)) worstBoard[global] = values[names.indexOf(local as string)] as number;
  });
  const pass = run.passed;
  const p = pass / runs;
  return withDisplay({
    runs,
    yield: p,
    yieldStandardError: Math.sqrt((p * (1 - p)) / runs),
    tolerances: {
      resistor: rt ?? Math.max(...stages.flatMap((s) => [...s.tolerance].filter((_, i) => !(s.compiled.componentNames[i] as string).startsWith("C")))),
      capacitor: ct ?? Math.max(...stages.flatMap((s) => [...s.tolerance].filter((_, i) => (s.compiled.componentNames[i] as string).startsWith("C")))),
    },
    marginDb: spread(run.marginDb),
    passbandLossDb: spread(run.passbandLossDb, "monteCarlo", "passbandLossDb"),
    stopbandAttenuationDb: spread(run.stopbandAttenuationDb, "monteCarlo", "stopbandAttenuationDb"),
    gainDb: spread(run.gainDb, "monteCarlo", "gainDb"),
    worstBoard,
  }, monteCarloBundle);
}

/**
 * Simulate boards built with parts spread within their tolerances and report
 * the yield against the design's mask.
 *
 * @param result - a design
 * @param options - runs, seed and tolerances
 * @returns the yield and the spread of the mask figures
 * @throws `InvalidArgumentError` for a non-integer or out-of-range `runs`/`seed`, or a tolerance outside [0, 0.5]
 * @throws `SingularCircuitError` when no board of the run has a finite figure (every board singular)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * monteCarlo(designFilter(spec), { runs: 500, capacitorTolerance: 0.01 }).runs; //=> 500
 * ```
 */
export function monteCarlo(result: DesignResult, options?: MonteCarloOptions): MonteCarloResult {
  const settings = monteCarloSettings("monteCarlo", result, options);
  const control = checkRunControl("monteCarlo", "options", options === undefined ? undefined : { onProgress: options.onProgress, signal: options.signal, timeLimitMs: options.timeLimitMs });
  const { plan, stages } = monteCarloStages(result, settings);
  const run = watched("monteCarlo", "options", control, () => {
    checkpoint("boards", "Monte Carlo boards", { done: 0, total: settings.runs });
    return runBoards(stages, plan, { boards: settings.runs, seed: settings.seed, distribution: settings.distribution });
  });
  return monteCarloSummary(result, stages, settings, run);
}
