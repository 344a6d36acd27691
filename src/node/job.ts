/**
 * A share of a Monte Carlo run as plain data, and running it: what a worker
 * thread receives, and what it does with it.
 *
 * A compiled stage holds functions (its closed form), so it cannot be posted
 * to a worker; a job carries what compiles it again instead (the topology's
 * id, the nominal values, the op-amp model, the mask's span), with the
 * per-part arrays the board engine reads (nominal values and tolerances in
 * component order, the stage's scale) and the mask plan itself, all of them
 * structured-clonable. Compiling is deterministic, so the worker's stages are
 * the parent's, and {@link runBoardJob} gives the boards
 * `firstBoard .. firstBoard + boards - 1` exactly as one `runBoards` call over
 * the whole run gives them (src/evaluate/boards.ts: each batch of 256 boards
 * has its own seeded stream).
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import type { ComponentValues } from "../topologies/types.ts";
import { getTopology } from "../topologies/registry.ts";
import { compileStage } from "../evaluate/stage-polynomials.ts";
import { runBoards, type BoardRun, type BoardStage, type PartDistribution } from "../evaluate/boards.ts";
import type { MaskPlan } from "../evaluate/mask.ts";

/** One stage of a job. */
export interface BoardJobStage {
  /** The topology's id (`Topology.id`). */
  readonly topology: string;
  /** Nominal component values by local name, as the stage was compiled from. */
  readonly values: ComponentValues;
  /** Nominal values in component order. */
  readonly nominal: Float64Array;
  /** Tolerances in component order, fractions. */
  readonly tolerance: Float64Array;
  /** The stage's scale, rad/s. */
  readonly radius: number;
}

/** A consecutive range of a run's boards, as plain data. */
export interface BoardJob {
  /** The stages. */
  readonly stages: readonly BoardJobStage[];
  /** The op-amp model of every stage. */
  readonly opamp: OpAmpModel;
  /** The span (rad/s) the stages are compiled for. */
  readonly span: readonly [number, number];
  /** The mask. */
  readonly plan: MaskPlan;
  /** Boards in the range. */
  readonly boards: number;
  /** The range's first board (a multiple of 256). */
  readonly firstBoard: number;
  /** The run's seed. */
  readonly seed: number;
  /** Part spread. */
  readonly distribution: PartDistribution;
}

/**
 * A job's stages from the parent's board stages and the design's stages.
 *
 * @param stages - the board stages the parent compiled
 * @param built - each stage's topology id and nominal values, in the same order
 * @returns the job's stages
 */
export function jobStages(
  stages: readonly BoardStage[],
  built: readonly { readonly topology: { readonly id: string }; readonly values: ComponentValues }[],
): BoardJobStage[] {
  return stages.map((s, k) => {
    const b = built[k] as (typeof built)[number];
    return { topology: b.topology.id, values: b.values, nominal: s.nominal, tolerance: s.tolerance, radius: s.radius };
  });
}

/**
 * Run a job: compile its stages and build its boards (no checks: the parent
 * checked the design).
 *
 * @param job - the job
 * @returns its boards, numbered from board 0 of the seed
 * @throws `InvalidArgumentError` for a topology id the registry does not know
 */
export function runBoardJob(job: BoardJob): BoardRun {
  const stages: BoardStage[] = job.stages.map((s) => ({
    compiled: compileStage(getTopology(s.topology), s.values, job.opamp, job.span),
    nominal: s.nominal,
    tolerance: s.tolerance,
    radius: s.radius,
  }));
  return runBoards(stages, job.plan, { boards: job.boards, seed: job.seed, distribution: job.distribution, firstBoard: job.firstBoard });
}

/**
 * The contiguous ranges of whole batches that split `boards` boards over at
 * most `threads` workers (no empty range; the last batch may be partial).
 *
 * @param boards - boards in the run (at least 1)
 * @param threads - workers available (at least 1)
 * @param batch - boards per batch
 * @returns each range's first board and number of boards, in board order
 */
export function splitBoards(boards: number, threads: number, batch: number): { readonly firstBoard: number; readonly boards: number }[] {
  const batches = Math.ceil(boards / batch);
  const parts = Math.min(threads, batches);
  const out: { firstBoard: number; boards: number }[] = [];
  for (let i = 0; i < parts; i++) {
    const from = Math.floor((i * batches) / parts) * batch;
    const to = Math.min(Math.floor(((i + 1) * batches) / parts) * batch, boards);
    out.push({ firstBoard: from, boards: to - from });
  }
  return out;
}
