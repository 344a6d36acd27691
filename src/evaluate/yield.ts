/**
 * The yield of a design: the fraction of boards built from toleranced parts
 * that meet the mask and are stable, with its 95 % interval, run
 * sequentially until the interval decides against a target.
 *
 * Interval: the Wilson score interval (E. B. Wilson, "Probable inference, the
 * law of succession, and statistical inference", J. Amer. Statist. Assoc.
 * 22(158):209-212, 1927), whose coverage stays close to nominal for
 * proportions near 0 or 1 where the normal-approximation interval collapses
 * (L. D. Brown, T. T. Cai & A. DasGupta, "Interval estimation for a binomial
 * proportion", Statist. Sci. 16(2):101-133, 2001).
 *
 * Sequential rule: boards are built in blocks of {@link BATCH} (the same
 * boards whatever the block count, see boards.ts); after each block the
 * interval is formed, and the run stops once its lower end is at or above
 * the target (met) or its upper end below it (not met), or at the cap. The
 * interval is the fixed-size interval at the boards built; looking after
 * every block makes the stopping decision slightly less conservative than a
 * single look (an error rate up to a few percent above the nominal 2.5 %
 * per side for a yield right at the target; Wald's sequential analysis would
 * be the exact treatment), which is why the design loop confirms only
 * candidates its first-order model predicts above the target, and the
 * result reports the interval, not only the verdict.
 *
 * @module
 */
import { BATCH, runBoards, type BoardStage, type PartDistribution } from "./boards.ts";
import type { MaskPlan } from "./mask.ts";
import { checkpoint } from "./progress.ts";

/** The 97.5 % point of the standard normal distribution (two-sided 95 %). */
export const Z95 = 1.959963984540054;

/**
 * The Wilson score interval of a binomial proportion.
 *
 * @param passed - successes (0..n)
 * @param n - trials (> 0)
 * @param z - normal quantile of the wanted confidence (1.96 for 95 %)
 * @returns the interval `[lower, upper]`, inside [0, 1]
 */
export function wilsonInterval(passed: number, n: number, z = Z95): readonly [number, number] {
  const p = passed / n;
  const z2 = z * z;
  const centre = (p + z2 / (2 * n)) / (1 + z2 / n);
  const half = (z / (1 + z2 / n)) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  // At p = 0 and p = 1 the interval's outer end is exactly 0 and 1; the rounded sum leaves it an ulp inside.
  return [passed <= 0 ? 0 : Math.max(0, centre - half), passed >= n ? 1 : Math.min(1, centre + half)];
}

/** Options of {@link sequentialYield}. */
export interface SequentialYieldOptions {
  /** The yield the boards must reach (0 < target < 1). */
  readonly target: number;
  /** Seed of the boards. */
  readonly seed: number;
  /** Part spread. */
  readonly distribution: PartDistribution;
  /** Most boards built (rounded up to whole blocks). */
  readonly maxBoards: number;
  /**
   * Fewest boards built before the interval may decide.
   * @defaultValue 2 * {@link BATCH}
   */
  readonly minBoards?: number;
}

/** The outcome of a yield run. */
export interface YieldEstimate {
  /** Fraction of boards that met the mask and were stable. */
  readonly fraction: number;
  /** Lower end of the 95 % Wilson interval. */
  readonly lower95: number;
  /** Upper end of the 95 % Wilson interval. */
  readonly upper95: number;
  /** Boards built. */
  readonly boards: number;
  /** Boards that passed. */
  readonly passed: number;
  /** Boards with a stage that is not stable (counted among the failures). */
  readonly unstable: number;
  /** Whether `lower95 >= target`. */
  readonly met: boolean;
}

/**
 * Build boards in blocks until the 95 % interval of their yield lies wholly
 * on one side of the target, or the cap is reached (internal: no checks).
 *
 * @param stages - the board's stages (nominal values and per-part tolerances)
 * @param plan - the mask
 * @param options - target, seed, spread and the board limits
 * @param margins - when given, receives each block's worst margins per board (dB), in order
 * @returns the yield, its interval and whether the target is met
 */
export function sequentialYield(stages: readonly BoardStage[], plan: MaskPlan, options: SequentialYieldOptions, margins?: Float64Array[]): YieldEstimate {
  const { target, seed, distribution } = options;
  const cap = Math.max(BATCH, Math.ceil(options.maxBoards / BATCH) * BATCH);
  const min = Math.min(cap, options.minBoards ?? 2 * BATCH);
  let boards = 0;
  let passed = 0;
  let unstable = 0;
  let lower = 0;
  let upper = 1;
  while (boards < cap) {
    checkpoint("boards", "yield boards", { done: boards, total: cap });
    const run = runBoards(stages, plan, { boards: BATCH, seed, distribution, firstBoard: boards });
    boards += BATCH;
    passed += run.passed;
    margins?.push(run.marginDb);
    unstable += run.unstable;
    [lower, upper] = wilsonInterval(passed, boards);
    if (boards >= min && (lower >= target || upper < target)) break;
  }
  return { fraction: passed / boards, lower95: lower, upper95: upper, boards, passed, unstable, met: lower >= target };
}
