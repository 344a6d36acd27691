/**
 * The sampled boards of the first-order tolerance model (spread.ts): unit
 * part deviations drawn as {@link runBoards} draws them (common random
 * numbers), kept per (parts, boards, distribution, seed) for the design
 * loop's many screens of one spec, and the linearised levels
 * `L_i + sum_j g_ij t_j d_kj` of each board, formed in the same order of
 * operations whichever entry point computes them, so every path gives the
 * same bits.
 *
 * @module
 */
import { BATCH, drawDeviations, type PartDistribution } from "./boards.ts";
import type { LinearModel } from "./spread.ts";

/**
 * Unit deviations (in [-1, 1], times the tolerance later) of `samples`
 * boards of `parts` parts, board-major: the boards {@link runBoards} draws
 * with the same seed.
 *
 * @param parts - parts per board
 * @param samples - boards
 * @param distribution - part spread
 * @param seed - seed
 * @returns `samples * parts` deviations
 */
export function unitDeviations(parts: number, samples: number, distribution: PartDistribution, seed: number): Float64Array {
  const out = new Float64Array(samples * parts);
  for (let start = 0; start < samples; start += BATCH) {
    drawDeviations(seed, start / BATCH, Math.min(BATCH, samples - start), parts, distribution, out.subarray(start * parts));
  }
  return out;
}

/** The last few deviation sets drawn by {@link sharedDeviations}, by parts, samples, distribution and seed. */
const deviationSets = new Map<string, Float64Array>();
/** At most this many kept (a 2,000-board set of 40 parts is 640 kB). */
const DEVIATION_SETS = 4;

/**
 * {@link unitDeviations}, kept: the design loop screens many candidates of
 * one spec with the same part count, boards, distribution and seed, and the
 * draws are a pure function of those four, so a kept set is the one a new
 * draw would give, bit for bit. The array is shared: read it, never write
 * it. Internal.
 *
 * @param parts - parts per board
 * @param samples - boards
 * @param distribution - part spread
 * @param seed - seed
 * @returns `samples * parts` deviations (shared, read-only)
 * @internal
 */
export function sharedDeviations(parts: number, samples: number, distribution: PartDistribution, seed: number): Float64Array {
  const key = `${parts} ${samples} ${distribution} ${seed}`;
  const hit = deviationSets.get(key);
  if (hit !== undefined) return hit;
  const out = unitDeviations(parts, samples, distribution, seed);
  if (deviationSets.size >= DEVIATION_SETS) deviationSets.delete(deviationSets.keys().next().value as string);
  deviationSets.set(key, out);
  return out;
}

/**
 * Linearised levels of sampled boards: `level[k * points + i] = L_i + sum_j g_ij t_j d_kj`.
 *
 * @param model - the linear model
 * @param tolerances - per part (fractions)
 * @param draws - unit deviations, board-major (see {@link unitDeviations})
 * @param samples - boards
 * @returns the levels, board-major
 */
export function linearLevels(model: LinearModel, tolerances: Float64Array, draws: Float64Array, samples: number): Float64Array {
  const p = model.parts.length;
  const n = model.levelDb.length;
  const out = new Float64Array(samples * n);
  const delta = new Float64Array(p);
  const g = model.gradient;
  for (let k = 0; k < samples; k++) {
    for (let j = 0; j < p; j++) delta[j] = (tolerances[j] as number) * (draws[k * p + j] as number);
    for (let i = 0; i < n; i++) {
      let x = model.levelDb[i] as number;
      const row = i * p;
      for (let j = 0; j < p; j++) x += (g[row + j] as number) * (delta[j] as number);
      out[k * n + i] = x;
    }
  }
  return out;
}

/** Scratch of {@link boardLevels} and {@link fourBoardLevels}: the scaled deviations and the levels of up to four boards. */
export interface LevelScratch {
  readonly delta0: Float64Array;
  readonly delta1: Float64Array;
  readonly delta2: Float64Array;
  readonly delta3: Float64Array;
  readonly level0: Float64Array;
  readonly level1: Float64Array;
  readonly level2: Float64Array;
  readonly level3: Float64Array;
}

/**
 * Scratch for {@link boardLevels}.
 *
 * @param parts - parts per board
 * @param points - the model's points
 * @returns fresh scratch
 */
export function levelScratch(parts: number, points: number): LevelScratch {
  const d = (): Float64Array => new Float64Array(parts);
  const l = (): Float64Array => new Float64Array(points);
  return { delta0: d(), delta1: d(), delta2: d(), delta3: d(), level0: l(), level1: l(), level2: l(), level3: l() };
}

/**
 * The linearised levels of board `k` into `scratch.level0` and, with `two`,
 * of board `k + 1` into `scratch.level1`: each level the sum
 * {@link linearLevels} forms, term by term in the same order (so the same
 * bits), the two boards sharing each gradient entry's load.
 *
 * @param model - the linear model
 * @param tolerances - per part (fractions)
 * @param draws - unit deviations, board-major
 * @param k - the first board
 * @param two - whether board `k + 1` is formed too
 * @param scratch - written
 */
export function boardLevels(model: LinearModel, tolerances: Float64Array, draws: Float64Array, k: number, two: boolean, scratch: LevelScratch): void {
  const p = model.parts.length;
  const n = model.levelDb.length;
  const g = model.gradient;
  const { delta0, delta1, level0, level1 } = scratch;
  for (let j = 0; j < p; j++) delta0[j] = (tolerances[j] as number) * (draws[k * p + j] as number);
  if (!two) {
    for (let i = 0; i < n; i++) {
      let x = model.levelDb[i] as number;
      const row = i * p;
      for (let j = 0; j < p; j++) x += (g[row + j] as number) * (delta0[j] as number);
      level0[i] = x;
    }
    return;
  }
  for (let j = 0; j < p; j++) delta1[j] = (tolerances[j] as number) * (draws[(k + 1) * p + j] as number);
  for (let i = 0; i < n; i++) {
    let x0 = model.levelDb[i] as number;
    let x1 = x0;
    const row = i * p;
    for (let j = 0; j < p; j++) {
      const gij = g[row + j] as number;
      x0 += gij * (delta0[j] as number);
      x1 += gij * (delta1[j] as number);
    }
    level0[i] = x0;
    level1[i] = x1;
  }
}

/**
 * The linearised levels of boards `k` to `k + 3` into `scratch.level0` to
 * `level3`: each level the sum {@link linearLevels} forms, term by term in
 * the same order (so the same bits), the four boards sharing each gradient
 * entry's load.
 *
 * @param model - the linear model
 * @param tolerances - per part (fractions)
 * @param draws - unit deviations, board-major (at least `k + 4` boards)
 * @param k - the first board
 * @param scratch - written
 */
export function fourBoardLevels(model: LinearModel, tolerances: Float64Array, draws: Float64Array, k: number, scratch: LevelScratch): void {
  const p = model.parts.length;
  const n = model.levelDb.length;
  const g = model.gradient;
  const { delta0, delta1, delta2, delta3, level0, level1, level2, level3 } = scratch;
  for (let j = 0; j < p; j++) {
    const t = tolerances[j] as number;
    delta0[j] = t * (draws[k * p + j] as number);
    delta1[j] = t * (draws[(k + 1) * p + j] as number);
    delta2[j] = t * (draws[(k + 2) * p + j] as number);
    delta3[j] = t * (draws[(k + 3) * p + j] as number);
  }
  for (let i = 0; i < n; i++) {
    let x0 = model.levelDb[i] as number;
    let x1 = x0;
    let x2 = x0;
    let x3 = x0;
    const row = i * p;
    for (let j = 0; j < p; j++) {
      const gij = g[row + j] as number;
      x0 += gij * (delta0[j] as number);
      x1 += gij * (delta1[j] as number);
      x2 += gij * (delta2[j] as number);
      x3 += gij * (delta3[j] as number);
    }
    level0[i] = x0;
    level1[i] = x1;
    level2[i] = x2;
    level3[i] = x3;
  }
}
