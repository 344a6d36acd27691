/**
 * Monte Carlo tolerance analysis: how many boards built from parts within
 * their tolerance still meet the mask.
 *
 * Method: every resistor and capacitor is drawn independently, uniformly
 * within +-tolerance of its nominal value (the worst-case-bounded model of a
 * part sold as "+-t %"; a uniform draw is the conservative choice when the
 * maker's distribution is unknown, common practice, no source), with a seeded
 * generator (mulberry32, T. Ettinger, public domain, 2017) so runs repeat
 * exactly. Each board's as-built response is checked against the mask exactly
 * as the design's own verification does. The yield's standard error is
 * sqrt(p (1 - p) / runs).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { mulberry32 } from "../math/random.ts";
import { requireInRange, requireInteger, requireOptions } from "../validate.ts";
import type { DesignResult } from "../design/index.ts";
import { builtStages } from "../design/response.ts";
import { checkMask, type BuiltStage } from "../design/verify.ts";
import { requireDesignResult } from "../design/check.ts";

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
   * Resistor tolerance as a fraction (0.01 for 1 %).
   * @defaultValue the spec's `parts.resistorTolerance` (the usual tolerance of its resistor series unless given)
   */
  readonly resistorTolerance?: number;
  /**
   * Capacitor tolerance as a fraction.
   * @defaultValue the spec's `parts.capacitorTolerance` (the usual tolerance of its capacitor series unless given)
   */
  readonly capacitorTolerance?: number;
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

/** Part tolerances as fractions (0.01 for 1 %). */
export interface ToleranceFractions {
  /** Resistor tolerance. */
  readonly resistor: number;
  /** Capacitor tolerance. */
  readonly capacitor: number;
}

/** Result of {@link monteCarlo}. */
export interface MonteCarloResult {
  /** Boards simulated. */
  readonly runs: number;
  /** Fraction of boards meeting the mask (passband, stopband and gain). */
  readonly yield: number;
  /** Standard error of `yield`. */
  readonly yieldStandardError: number;
  /** Tolerances used, as fractions. */
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

function spread(xs: number[]): Spread {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  const median = s.length % 2 === 1 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
  return { min: s[0] as number, median, max: s[s.length - 1] as number };
}

/**
 * Simulate boards built with parts spread within their tolerances and report
 * the yield against the design's mask.
 *
 * @param result - a design
 * @param options - runs, seed and tolerances
 * @returns the yield and the spread of the mask figures
 * @throws `InvalidArgumentError` for a non-integer or out-of-range `runs`/`seed`, or a tolerance outside [0, 0.5]
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * monteCarlo(designFilter(spec), { runs: 500, capacitorTolerance: 0.01 }).runs; //=> 500
 * ```
 */
export function monteCarlo(result: DesignResult, options?: MonteCarloOptions): MonteCarloResult {
  requireDesignResult("monteCarlo", result);
  const fn = "monteCarlo";
  const o = requireOptions(fn, "options", options);
  const runs = o["runs"] === undefined ? 200 : requireInteger(fn, "options.runs", o["runs"], { min: 1, max: 100000 });
  const seed = o["seed"] === undefined ? 1 : requireInteger(fn, "options.seed", o["seed"], { min: -(2 ** 31), max: 2 ** 32 - 1 });
  const rt =
    o["resistorTolerance"] === undefined
      ? result.spec.resistorTolerance
      : requireInRange(fn, "options.resistorTolerance", o["resistorTolerance"], { min: 0, max: 0.5 });
  const ct =
    o["capacitorTolerance"] === undefined
      ? result.spec.capacitorTolerance
      : requireInRange(fn, "options.capacitorTolerance", o["capacitorTolerance"], { min: 0, max: 0.5 });
  if (result === null || typeof result !== "object" || !Array.isArray(result.stages)) {
    throw new InvalidArgumentError({ fn, path: "result", received: result, message: "expected a design result from designFilter" });
  }
  const nominal = builtStages(result);
  const rand = mulberry32(seed);
  const margins: number[] = [];
  const losses: number[] = [];
  const attens: number[] = [];
  const gains: number[] = [];
  let pass = 0;
  let worst = { margin: Infinity, board: {} as Record<string, number> };
  for (let r = 0; r < runs; r++) {
    const board: Record<string, number> = {};
    const stages: BuiltStage[] = nominal.map((s, k) => {
      const st = result.stages[k] as DesignResult["stages"][number];
      const values: Record<string, number> = {};
      for (const [global, local] of Object.entries(st.localNames)) {
        const nominalValue = st.components[global] as number;
        const tol = global.startsWith("C") ? ct : rt;
        const v = nominalValue * (1 + tol * (2 * rand() - 1));
        values[local] = v;
        board[global] = v;
      }
      return { topology: s.topology, values };
    });
    const m = checkMask(result.spec, stages, result.spec.opamp);
    margins.push(m.marginDb);
    losses.push(m.passbandLossDb);
    attens.push(m.stopbandAttenuationDb);
    gains.push(m.gainDb);
    if (m.marginDb >= 0) pass++;
    if (m.marginDb < worst.margin) worst = { margin: m.marginDb, board };
  }
  const p = pass / runs;
  return {
    runs,
    yield: p,
    yieldStandardError: Math.sqrt((p * (1 - p)) / runs),
    tolerances: { resistor: rt, capacitor: ct },
    marginDb: spread(margins),
    passbandLossDb: spread(losses),
    stopbandAttenuationDb: spread(attens),
    gainDb: spread(gains),
    worstBoard: worst.board,
  };
}
