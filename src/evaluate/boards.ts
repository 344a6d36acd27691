/**
 * Monte Carlo boards: every part drawn within its tolerance, each board's
 * stages turned into polynomials and checked against the mask.
 *
 * Method: the draws come in batches of {@link BATCH} boards, each batch from
 * its own Mulberry32 stream seeded by the run's seed and the batch number
 * (mixed by the MurmurHash3 finaliser, A. Appleby, 2011, public domain), so
 * board k is the same board whatever the batch size of the caller, the
 * number of worker threads or how many boards run after it. A part is drawn
 * uniformly within +-tolerance (the bound a "+-t %" part guarantees; common
 * practice, no source), or normally with the tolerance as three standard
 * deviations and draws beyond it drawn again (parts outside their
 * tolerance are not sold; Box-Muller transform, G. E. P. Box & M. E.
 * Muller, Ann. Math. Statist. 29(2):610-611, 1958). A board's band extremes
 * are first located by one parabolic step between grid points, and by the
 * verification's full golden-section search when its margin is within
 * {@link VERDICT_BAND_DB} of zero, so every pass/fail verdict is the one the
 * verification would give. A board with a stage whose characteristic
 * polynomial (op-amp poles included) has a root in the closed right
 * half-plane (src/evaluate/stability.ts) is an oscillator: it fails, and is
 * counted on its own, whatever its |H| would say. The draws of a batch are
 * stored structure-of-arrays (one row of parts per board) in one typed
 * array; nothing is allocated per board.
 *
 * @module
 */
import { mulberry32 } from "../math/random.ts";
import { boardPolynomialsInto, genericStagePolynomialsInto, type CompiledStage } from "./stage-polynomials.ts";
import { maskFigures, rationalSource, type MaskPlan } from "./mask.ts";
import { isHurwitz } from "./stability.ts";
import type { ScaledRational } from "./types.ts";
import { checkpoint } from "./progress.ts";

/**
 * Margin (dB) within which a board's verdict is settled by the full
 * golden-section search of its extremes rather than the parabolic step (whose
 * error on a peak a few grid steps wide is far below this).
 */
export const VERDICT_BAND_DB = 0.02;

/** Boards drawn from one random stream. */
export const BATCH = 256;

/** A stage of the board: its compiled form, nominal values and tolerances (component order). */
export interface BoardStage {
  /** The compiled stage. */
  readonly compiled: CompiledStage;
  /** Nominal component values, in `compiled.componentNames` order. */
  readonly nominal: Float64Array;
  /** Tolerance of each component as a fraction (0.01 for 1 %). */
  readonly tolerance: Float64Array;
  /** The scale of the stage's polynomials, rad/s (about its f0). */
  readonly radius: number;
  /**
   * Set for a network of positive resistors, inductors and capacitors only
   * (no op-amp or controlled source; a passive LC ladder): its natural
   * frequencies lie in the closed left half-plane whatever the part values
   * (the driving-point functions of such networks are positive real: O.
   * Brune, "Synthesis of a finite two-terminal network whose driving-point
   * impedance is a prescribed function of frequency", J. Math. Phys. 10,
   * 1931), so its boards are not put to the Routh test, which misjudges a
   * low-loss ladder's denominator when its poles crowd the jw axis (5 of 512
   * boards of a 10.7 MHz IF ladder with Q 80 inductors were called unstable
   * and failed).
   */
  readonly passive?: true;
}

/** How part values spread within their tolerance. */
export type PartDistribution = "uniform" | "normal";

/** Options of {@link runBoards}. */
export interface BoardRunOptions {
  /** Boards to build. */
  readonly boards: number;
  /** Seed of the run. */
  readonly seed: number;
  /** Part spread. */
  readonly distribution: PartDistribution;
  /**
   * Number of the first board (a multiple of {@link BATCH}), so a run can be
   * continued where an earlier one stopped with the same boards.
   * @defaultValue 0
   */
  readonly firstBoard?: number;
}

/** What the boards did. */
export interface BoardRun {
  /** Boards built. */
  readonly boards: number;
  /** Boards that met the mask (margin >= 0) and are stable; boards whose equations were singular count as failed. */
  readonly passed: number;
  /** Boards with a stage whose poles (op-amp poles included) are not all in the open left half-plane; they fail. */
  readonly unstable: number;
  /** Worst margin of each board, dB (NaN for a singular or unstable board). */
  readonly marginDb: Float64Array;
  /** Passband loss of each board, dB. */
  readonly passbandLossDb: Float64Array;
  /** Stopband attenuation of each board, dB. */
  readonly stopbandAttenuationDb: Float64Array;
  /** Passband level of each board, dB. */
  readonly gainDb: Float64Array;
  /** Number of the board with the smallest margin (an unstable or singular one first), counted from board 0 of the seed. */
  readonly worstBoard: number;
  /** That board's margin, dB: -Infinity for an unstable or singular board, +Infinity when no board had a margin (internal, for {@link mergeBoardRuns}). */
  readonly worstMarginDb: number;
  /** That board's component values, per stage in component order. */
  readonly worstValues: readonly Float64Array[];
}

/** Run the stage's full generic path once at its nominal values, so its boards reuse the circle plan. */
function genericPlan(s: BoardStage, num: Float64Array, den: Float64Array): void {
  if (s.compiled.closedForm === null) genericStagePolynomialsInto(s.compiled, s.nominal, s.radius, num, den);
}

/** MurmurHash3's 32-bit finaliser of `seed` and `batch`. */
function batchSeed(seed: number, batch: number): number {
  let h = (seed ^ Math.imul(batch + 1, 0x9e3779b1)) >>> 0;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

/** A relative deviation in [-1, 1] (times the tolerance later), uniform or normal with sigma 1/3. */
function deviation(next: () => number, distribution: PartDistribution): number {
  if (distribution === "uniform") return 2 * next() - 1;
  for (;;) {
    const u = 1 - next(); // (0, 1]
    const v = next();
    const z = (Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v)) / 3;
    if (z >= -1 && z <= 1) return z;
  }
}

/**
 * The unit deviations of one batch of boards, as {@link runBoards} draws
 * them: `count` boards of `parts` parts each, board-major, every entry in
 * [-1, 1] (multiplied by the part's tolerance later). Other estimators call
 * this to draw the very boards `runBoards` builds (common random numbers).
 *
 * @param seed - the run's seed
 * @param batch - the batch number (board `batch * BATCH` is its first)
 * @param count - boards to draw (at most {@link BATCH} for the same boards as `runBoards`)
 * @param parts - parts per board
 * @param distribution - part spread
 * @param out - written from index 0, `count * parts` entries
 */
export function drawDeviations(
  seed: number,
  batch: number,
  count: number,
  parts: number,
  distribution: PartDistribution,
  out: Float64Array,
): void {
  const next = mulberry32(batchSeed(seed, batch));
  for (let i = 0; i < count * parts; i++) out[i] = deviation(next, distribution);
}

/**
 * Build and check Monte Carlo boards (internal hot path: no checks).
 *
 * @param stages - the board's stages
 * @param plan - the mask
 * @param options - boards, seed, distribution
 * @returns per-board figures and the worst board
 */
export function runBoards(stages: readonly BoardStage[], plan: MaskPlan, options: BoardRunOptions): BoardRun {
  const { boards, seed, distribution } = options;
  const first = options.firstBoard ?? 0;
  const parts = stages.reduce((k, s) => k + s.nominal.length, 0);
  const draws = new Float64Array(BATCH * parts);
  const values = stages.map((s) => new Float64Array(s.nominal.length));
  const polys: ScaledRational[] = stages.map((s) => ({
    num: new Float64Array(s.compiled.points),
    den: new Float64Array(s.compiled.points),
    scale: s.radius,
  }));
  const out = {
    marginDb: new Float64Array(boards),
    passbandLossDb: new Float64Array(boards),
    stopbandAttenuationDb: new Float64Array(boards),
    gainDb: new Float64Array(boards),
  };
  let passed = 0;
  let unstable = 0;
  let worstBoard = 0;
  let worstMargin = Infinity;
  let worstValues = values.map((v) => v.slice());
  const source = rationalSource(polys);
  // plan each stage's generic path at its nominal values (a no-op for a closed form)
  stages.forEach((s, i) => {
    const p = polys[i] as { num: Float64Array; den: Float64Array };
    genericPlan(s, p.num, p.den);
  });
  for (let start = 0; start < boards; start += BATCH) {
    if (start > 0) checkpoint("boards", "Monte Carlo boards", { done: start, total: boards });
    const count = Math.min(BATCH, boards - start);
    drawDeviations(seed, (first + start) / BATCH, count, parts, distribution, draws);
    for (let b = 0; b < count; b++) {
      let at = b * parts;
      let ok = true;
      let stable = true;
      for (let s = 0; s < stages.length; s++) {
        const st = stages[s] as BoardStage;
        const v = values[s] as Float64Array;
        for (let j = 0; j < v.length; j++) v[j] = (st.nominal[j] as number) * (1 + (st.tolerance[j] as number) * (draws[at++] as number));
        const p = polys[s] as { num: Float64Array; den: Float64Array; scale: number };
        p.scale = boardPolynomialsInto(st.compiled, v, st.radius, p.num, p.den);
        if (p.scale === 0) ok = false;
        else if (stable && st.passive !== true && !isHurwitz(p.den)) stable = false;
      }
      const k = start + b;
      if (ok && !stable) unstable++;
      if (!ok || !stable) {
        out.marginDb[k] = NaN;
        out.passbandLossDb[k] = NaN;
        out.stopbandAttenuationDb[k] = NaN;
        out.gainDb[k] = NaN;
        if (worstMargin > -Infinity) {
          worstMargin = -Infinity;
          worstBoard = first + k;
          worstValues = values.map((x) => x.slice());
        }
        continue;
      }
      // One parabolic step per extreme first; the full search only where the verdict could turn on it.
      let m = maskFigures(source, plan, "parabola");
      if (Math.abs(m.marginDb) < VERDICT_BAND_DB) m = maskFigures(source, plan, "golden");
      out.marginDb[k] = m.marginDb;
      out.passbandLossDb[k] = m.passbandLossDb;
      out.stopbandAttenuationDb[k] = m.stopbandAttenuationDb;
      out.gainDb[k] = m.gainDb;
      if (m.marginDb >= 0) passed++;
      if (m.marginDb < worstMargin) {
        worstMargin = m.marginDb;
        worstBoard = first + k;
        worstValues = values.map((x) => x.slice());
      }
    }
  }
  return { boards, passed, unstable, ...out, worstBoard, worstMarginDb: worstMargin, worstValues };
}

/**
 * One run from runs of consecutive board ranges (the first from board 0 or
 * wherever the whole run starts, each next starting where the one before
 * ended, as {@link BoardRunOptions.firstBoard} continues a run): counts
 * summed, per-board figures concatenated, and the worst board the one
 * {@link runBoards} would pick over the whole range, the earliest board with
 * the smallest margin (an unstable or singular board's -Infinity first).
 * The result is the single run's, bit for bit.
 *
 * @param runs - the ranges' runs, in board order (at least one)
 * @returns the whole run
 */
export function mergeBoardRuns(runs: readonly BoardRun[]): BoardRun {
  const boards = runs.reduce((n, r) => n + r.boards, 0);
  const joined = (pick: (r: BoardRun) => Float64Array): Float64Array => {
    const out = new Float64Array(boards);
    let at = 0;
    for (const r of runs) {
      out.set(pick(r), at);
      at += r.boards;
    }
    return out;
  };
  // a later range takes over only with a strictly smaller margin, as a later board does within a run
  let worst = runs[0] as BoardRun;
  for (const r of runs) if (r.worstMarginDb < worst.worstMarginDb) worst = r;
  return {
    boards,
    passed: runs.reduce((n, r) => n + r.passed, 0),
    unstable: runs.reduce((n, r) => n + r.unstable, 0),
    marginDb: joined((r) => r.marginDb),
    passbandLossDb: joined((r) => r.passbandLossDb),
    stopbandAttenuationDb: joined((r) => r.stopbandAttenuationDb),
    gainDb: joined((r) => r.gainDb),
    worstBoard: worst.worstBoard,
    worstMarginDb: worst.worstMarginDb,
    worstValues: worst.worstValues,
  };
}
