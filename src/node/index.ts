/**
 * Node only: the Monte Carlo run of `monteCarlo` spread over worker threads
 * (node:worker_threads), with a result identical to `monteCarlo`'s, bit for
 * bit, whatever the number of threads. Browsers and Deno use `monteCarlo`.
 *
 * Method: the boards are drawn in batches of 256, each batch from its own
 * seeded stream (src/evaluate/boards.ts), so a board is the same board in
 * whichever thread builds it. The run is cut into contiguous ranges of whole
 * batches, one per worker; each worker compiles the stages again from plain
 * data (src/node/job.ts) and builds its range; the parent joins the ranges
 * in board order (counts summed, per-board figures concatenated, the worst
 * board the earliest with the smallest margin, as one run picks it) and
 * summarises them with `monteCarlo`'s own code.
 *
 * One limit of "bit for bit", on stages without closed-form polynomials
 * only: every worker makes the generic path's circle plan at the nominal
 * values, as one run does at its start, but one run makes it again from a
 * board whose sample point falls on a pole (an LU pivot at most 2^-46 of its
 * column), and the boards after it in that run reuse that plan; the same
 * boards in a worker that did not see that board keep the nominal plan. Their
 * coefficients are the same unless the two plans differ in a circle that
 * supplies a coefficient, so at most the last bits could move.
 *
 * @module
 */
import { availableParallelism } from "node:os";
import { dirname, join } from "node:path";
import { pathToFileURL } from "node:url";
import { requireInteger, requireOptions } from "../validate.ts";
import type { DesignResult } from "../design/index.ts";
import { builtStages } from "../design/response.ts";
import {
  monteCarloSettings,
  monteCarloStages,
  monteCarloSummary,
  type MonteCarloOptions,
  type MonteCarloResult,
} from "../analysis/tolerance.ts";
import { BATCH, mergeBoardRuns, type BoardRun } from "../evaluate/boards.ts";
import { jobStages, splitBoards, type BoardJob } from "./job.ts";
import { runInWorkers } from "./pool.ts";
import { checkRunControl } from "../evaluate/progress.ts";
import { CancelledError } from "../errors.ts";

/** Most worker threads {@link monteCarloParallel} takes. */
export const MAX_THREADS = 64;

/** Options of {@link monteCarloParallel}: those of `monteCarlo`, and the number of threads. */
export interface MonteCarloParallelOptions extends MonteCarloOptions {
  /**
   * Worker threads (an integer from 1 to 64). No more are started than the
   * run has batches of 256 boards. The result does not depend on it.
   * @defaultValue one less than `os.availableParallelism()`, at least 1
   */
  readonly threads?: number;
}

/** The worker's module: beside this one, in the same module format. */
function workerScript(): URL {
  // the CommonJS build has __filename (and no import.meta); the ES module build has import.meta.url
  return typeof __filename === "string" ? pathToFileURL(join(dirname(__filename), "worker.cjs")) : new URL("./worker.js", import.meta.url);
}

/**
 * Simulate boards built with parts spread within their tolerances, as
 * `monteCarlo` does, on worker threads. The result is `monteCarlo(result,
 * options)`'s, every field bit for bit, for any number of threads.
 *
 * @param result - a design
 * @param options - those of `monteCarlo` (runs, seed, tolerances, distribution) and `threads`
 * @returns a promise of the yield and the spread of the mask figures
 * @throws (rejects with) `InvalidArgumentError` for the options `monteCarlo` refuses, or a `threads` that is not an integer from 1 to 64; a worker's own filterwright error as that error; any other failure of a worker as an `Error` that names the worker's boards
 * @example
 * ```ts
 * import { designFilter, monteCarlo } from "filterwright";
 * import { monteCarloParallel } from "filterwright/node";
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const design = designFilter(spec);
 * const mc = await monteCarloParallel(design, { runs: 20000, threads: 2 });
 * mc.yield === monteCarlo(design, { runs: 20000 }).yield; //=> true
 * ```
 */
export async function monteCarloParallel(result: DesignResult, options?: MonteCarloParallelOptions): Promise<MonteCarloResult> {
  const fn = "monteCarloParallel";
  const settings = monteCarloSettings(fn, result, options);
  const o = requireOptions(fn, "options", options);
  const threads =
    o["threads"] === undefined
      ? Math.min(MAX_THREADS, Math.max(1, availableParallelism() - 1))
      : requireInteger(fn, "options.threads", o["threads"], { min: 1, max: MAX_THREADS });
  const { plan, span, stages } = monteCarloStages(result, settings);
  const common = { stages: jobStages(stages, builtStages(result)), opamp: result.spec.opamp, span, plan, seed: settings.seed, distribution: settings.distribution };
  const ranges = splitBoards(settings.runs, threads, BATCH);
  const jobs: BoardJob[] = ranges.map((r) => ({ ...common, boards: r.boards, firstBoard: r.firstBoard }));
  const label = (i: number): string => {
    const r = ranges[i] as (typeof ranges)[number];
    return `${fn}: the worker of boards ${r.firstBoard}-${r.firstBoard + r.boards - 1}`;
  };
  const control = checkRunControl(fn, "options", { onProgress: o["onProgress"], signal: o["signal"], timeLimitMs: o["timeLimitMs"] });
  const start = Date.now();
  let done = 0;
  const runs = await runInWorkers<BoardJob, BoardRun>(workerScript(), jobs, label, {
    ...(control.signal === undefined ? {} : { signal: control.signal }),
    ...(control.timeLimitMs === undefined ? {} : { timeLimitMs: control.timeLimitMs }),
    onDone: (i) => {
      done += (ranges[i] as (typeof ranges)[number]).boards;
      return control.onProgress?.({ step: "boards", message: "Monte Carlo boards", elapsedMs: Date.now() - start, boards: done, totalBoards: settings.runs });
    },
    cancelled: (field) => new CancelledError({ fn, path: `options.${field}`, message: field === "signal" ? "stopped by the aborted signal" : field === "timeLimitMs" ? `the time limit of ${control.timeLimitMs} ms ran out` : "stopped by onProgress" }),
  });
  return monteCarloSummary(result, stages, settings, mergeBoardRuns(runs));
}
