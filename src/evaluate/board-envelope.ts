/**
 * The spread of Monte Carlo boards' magnitude responses over frequency: at
 * every frequency of a grid the smallest, the largest and chosen quantiles of
 * |H| in dB over the boards, for a band drawn around the nominal curve.
 *
 * Method: the very boards of src/evaluate/boards.ts (the same seeded batches
 * through {@link drawDeviations}, the same part values from them), each
 * board's stages as polynomials with the op-amp model, |H|^2 of the cascade on
 * the grid (src/evaluate/cascade.ts). Boards with a stage that is not stable
 * or whose equations are singular are left out and counted. The quantiles are
 * sample quantiles by linear interpolation between order statistics
 * (definition 7 of R. J. Hyndman & Y. Fan, "Sample quantiles in statistical
 * packages", The American Statistician 50(4):361-365, 1996; numpy's default),
 * exact for the boards drawn; as estimates of the population's they carry the
 * sampling error of the number of boards. The per-board curves are held as
 * 32-bit floats (about 1e-5 dB at -100 dB), one row per frequency.
 *
 * @module
 */
import { BATCH, drawDeviations, type BoardStage, type PartDistribution } from "./boards.ts";
import { boardPolynomialsInto, genericStagePolynomialsInto } from "./stage-polynomials.ts";
import { isHurwitz } from "./stability.ts";
import { cascadeMagnitudeSquared } from "./cascade.ts";
import type { ScaledRational } from "./types.ts";
import { checkpoint } from "./progress.ts";

/** Options of {@link boardEnvelope}. */
export interface BoardEnvelopeOptions {
  /** Boards to build. */
  readonly boards: number;
  /** Seed of the run (the same boards as `runBoards` with this seed). */
  readonly seed: number;
  /** Part spread. */
  readonly distribution: PartDistribution;
  /** Lower and upper quantile levels, each in [0, 1]. */
  readonly quantiles: readonly [number, number];
}

/** The spread of the boards' |H| over a grid, dB. */
export interface BoardEnvelope {
  /** Boards whose stages were all stable and solvable (those the figures come from). */
  readonly used: number;
  /** Boards left out (unstable or singular). */
  readonly leftOut: number;
  /** Smallest |H| over the boards, per frequency, dB. */
  readonly minDb: Float64Array;
  /** Largest |H|, dB. */
  readonly maxDb: Float64Array;
  /** The lower quantile, dB. */
  readonly lowerDb: Float64Array;
  /** The median, dB. */
  readonly medianDb: Float64Array;
  /** The upper quantile, dB. */
  readonly upperDb: Float64Array;
}

/** Quantile q (definition 7) of a sorted array. */
function quantile(sorted: Float32Array, count: number, q: number): number {
  const h = (count - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(count - 1, lo + 1);
  const a = sorted[lo] as number;
  return a + (h - lo) * ((sorted[hi] as number) - a);
}

/**
 * The boards' magnitude spread on a grid (internal hot path: no checks; see
 * the module header).
 *
 * @param stages - the board's stages (as `runBoards` takes them)
 * @param w - angular frequencies, rad/s
 * @param options - boards, seed, distribution, quantile levels
 * @returns the spread per frequency (NaN everywhere when no board was usable)
 */
export function boardEnvelope(stages: readonly BoardStage[], w: Float64Array, options: BoardEnvelopeOptions): BoardEnvelope {
  const { boards, seed, distribution } = options;
  const m = w.length;
  const parts = stages.reduce((k, s) => k + s.nominal.length, 0);
  const draws = new Float64Array(BATCH * parts);
  const values = stages.map((s) => new Float64Array(s.nominal.length));
  const polys: ScaledRational[] = stages.map((s) => ({ num: new Float64Array(s.compiled.points), den: new Float64Array(s.compiled.points), scale: s.radius }));
  stages.forEach((s, i) => {
    const p = polys[i] as ScaledRational;
    if (s.compiled.closedForm === null) genericStagePolynomialsInto(s.compiled, s.nominal, s.radius, p.num, p.den);
  });
  // one row of boards per frequency, filled board by board
  const table = new Float32Array(boards * m);
  const mag = new Float64Array(m);
  let used = 0;
  for (let start = 0; start < boards; start += BATCH) {
    if (start > 0) checkpoint("boards", "Monte Carlo boards", { done: start, total: boards });
    const count = Math.min(BATCH, boards - start);
    drawDeviations(seed, start / BATCH, count, parts, distribution, draws);
    for (let b = 0; b < count; b++) {
      let at = b * parts;
      let ok = true;
      for (let s = 0; s < stages.length; s++) {
        const st = stages[s] as BoardStage;
        const v = values[s] as Float64Array;
        for (let j = 0; j < v.length; j++) v[j] = (st.nominal[j] as number) * (1 + (st.tolerance[j] as number) * (draws[at++] as number));
        const p = polys[s] as { num: Float64Array; den: Float64Array; scale: number };
        p.scale = boardPolynomialsInto(st.compiled, v, st.radius, p.num, p.den);
        if (p.scale === 0 || !isHurwitz(p.den)) ok = false;
      }
      if (!ok) continue;
      cascadeMagnitudeSquared(polys, w, mag);
      for (let k = 0; k < m; k++) table[k * boards + used] = 10 * Math.log10(mag[k] as number);
      used++;
    }
  }
  const out = { minDb: new Float64Array(m), maxDb: new Float64Array(m), lowerDb: new Float64Array(m), medianDb: new Float64Array(m), upperDb: new Float64Array(m) };
  const [qLo, qHi] = options.quantiles;
  for (let k = 0; k < m; k++) {
    if (used === 0) {
      for (const a of Object.values(out)) a[k] = NaN;
      continue;
    }
    const row = table.subarray(k * boards, k * boards + used).sort();
    out.minDb[k] = row[0] as number;
    out.maxDb[k] = row[used - 1] as number;
    out.lowerDb[k] = quantile(row, used, qLo);
    out.medianDb[k] = quantile(row, used, 0.5);
    out.upperDb[k] = quantile(row, used, qHi);
  }
  return { used, leftOut: boards - used, ...out };
}
