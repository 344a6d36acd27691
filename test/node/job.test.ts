/**
 * A Monte Carlo run cut into jobs of whole batches (src/node/job.ts), each
 * job posted as plain data (structured clone, as to a worker thread) and run
 * on its own, then joined: the same boards and the same result as
 * `monteCarlo`, bit for bit. No threads here (test/node/parallel.test.ts runs
 * the built package's workers).
 */
import { describe, expect, it } from "vitest";
import { designFilter } from "../../src/design/index.ts";
import { builtStages } from "../../src/design/response.ts";
import { monteCarlo, type MonteCarloOptions } from "../../src/analysis/index.ts";
import { monteCarloSettings, monteCarloStages, monteCarloSummary } from "../../src/analysis/tolerance.ts";
import { BATCH, mergeBoardRuns, runBoards } from "../../src/evaluate/boards.ts";
import { jobStages, runBoardJob, splitBoards, type BoardJob } from "../../src/node/job.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { thrownBy } from "../helpers/throws.ts";
import { expectSameBits } from "../helpers/same-bits.ts";

// A seismic sensor's anti-alias lowpass (our own scenario), single-pole op-amps.
const design = designFilter({
  response: "lowpass",
  passband: { edgeHz: 40, maxLossDb: 0.5 },
  stopband: { edgeHz: 110, minAttenuationDb: 45 },
  family: "chebyshev1",
  opamp: { a0: 2e5, gbwHz: "1M" },
});

/** The jobs `monteCarloParallel` would post for these options over `threads` workers. */
function jobsFor(options: MonteCarloOptions, threads: number): BoardJob[] {
  const settings = monteCarloSettings("test", design, options);
  const { plan, span, stages } = monteCarloStages(design, settings);
  const common = { stages: jobStages(stages, builtStages(design)), opamp: design.spec.opamp, span, plan, seed: settings.seed, distribution: settings.distribution };
  return splitBoards(settings.runs, threads, BATCH).map((r) => ({ ...common, ...r }));
}

describe("splitBoards", () => {
  it.each([
    [1, 1],
    [1000, 1],
    [1000, 2],
    [1000, 3],
    [1000, 64],
    [256, 2],
    [20000, 2],
    [100000, 7],
  ])("%i boards over %i threads: contiguous whole batches from board 0, none empty, at most one per batch", (boards, threads) => {
    const ranges = splitBoards(boards, threads, BATCH);
    expect(ranges.length).toBe(Math.min(threads, Math.ceil(boards / BATCH)));
    let next = 0;
    for (const r of ranges) {
      expect(r.firstBoard).toBe(next);
      expect(r.firstBoard % BATCH).toBe(0);
      expect(r.boards).toBeGreaterThan(0);
      next += r.boards;
    }
    expect(next).toBe(boards);
    // balanced to one batch
    const sizes = ranges.slice(0, -1).map((r) => r.boards / BATCH);
    expect(Math.max(...sizes, 0) - Math.min(...sizes, Infinity)).toBeLessThanOrEqual(1);
  });
});

describe("runBoardJob", () => {
  it.each([
    [{ runs: 1000 }, 3],
    [{ runs: 700, seed: 99, distribution: "normal", resistorTolerance: 0.02 } as const, 2],
  ])("jobs posted as plain data and joined give monteCarlo's result, bit for bit (%o over %i jobs)", (options, threads) => {
    const jobs = jobsFor(options, threads).map((j) => structuredClone(j));
    expect(jobs.length).toBe(threads);
    const runs = jobs.map(runBoardJob);
    const settings = monteCarloSettings("test", design, options);
    const { plan, stages } = monteCarloStages(design, settings);
    const whole = runBoards(stages, plan, { boards: settings.runs, seed: settings.seed, distribution: settings.distribution });
    const joined = mergeBoardRuns(runs);
    expectSameBits(joined, whole);
    const summary = monteCarloSummary(design, stages, settings, joined);
    expectSameBits(summary, monteCarlo(design, options));
  });

  it("throws the registry's typed error for a topology it does not know", () => {
    const [job] = jobsFor({ runs: 10 }, 1) as [BoardJob];
    const bad = { ...job, stages: job.stages.map((s, k) => (k === 0 ? { ...s, topology: "no-such-topology" } : s)) };
    const e = thrownBy(() => runBoardJob(bad), InvalidArgumentError);
    expect([e.fn, e.path, e.received]).toEqual(["getTopology", "id", "no-such-topology"]);
  });
});
