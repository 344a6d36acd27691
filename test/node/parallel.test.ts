/**
 * monteCarloParallel (filterwright/node): the same result as monteCarlo, bit
 * for bit, for 1, 2 and 3 worker threads; its options checked as
 * monteCarlo's are, and `threads`; a worker's failure as a rejection.
 *
 * Worker threads run the built worker (dist/node/worker.js: Node cannot run
 * the .ts sources in a worker), so the thread tests need `npm run build`
 * first; CI builds before testing, so under CI a missing dist/ is a failure.
 * The option checks run before any worker starts and use the sources.
 */
import { describe, expect, it } from "vitest";
import { existsSync } from "node:fs";
import { spawnSync } from "node:child_process";
import { fileURLToPath, pathToFileURL } from "node:url";
import { dirname, join } from "node:path";
import * as source from "../../src/node/index.ts";
import { designFilter } from "../../src/design/index.ts";
import { builtStages } from "../../src/design/response.ts";
import { monteCarloSettings, monteCarloStages } from "../../src/analysis/tolerance.ts";
import { BATCH } from "../../src/evaluate/boards.ts";
import { jobStages, runBoardJob, splitBoards, type BoardJob } from "../../src/node/job.ts";
import { runInWorkers } from "../../src/node/pool.ts";
import { FilterwrightError, InvalidArgumentError } from "../../src/errors.ts";
import type { DesignResult } from "../../src/design/index.ts";
import { expectSameBits } from "../helpers/same-bits.ts";

const root = join(dirname(fileURLToPath(import.meta.url)), "..", "..");
const dist = (file: string): string => pathToFileURL(join(root, "dist", file)).href;
const built = existsSync(join(root, "dist", "node", "worker.js"));
if (!built && process.env["CI"]) throw new Error("dist/ is missing: CI must run `npm run build` before `npm test`");

type Root = typeof import("../../src/index.ts");
type Node = typeof import("../../src/node/index.ts");

/** An elevator's vibration sensor lowpass (our own scenario): ideal op-amps. */
const IDEAL = {
  response: "lowpass",
  passband: { edgeHz: 80, maxLossDb: 0.5 },
  stopband: { edgeHz: 200, minAttenuationDb: 50 },
  family: "chebyshev1",
} as const;
/** A tape deck's bias-trap lowpass (our own scenario): single-pole op-amps. */
const SINGLE_POLE = {
  response: "lowpass",
  passband: { edgeHz: 15000, maxLossDb: 1 },
  stopband: { edgeHz: 40000, minAttenuationDb: 45 },
  family: "elliptic",
  opamp: { a0: 1e5, gbwHz: "4M" },
} as const;
/** A mains-hum notch for a field recorder (our own scenario), on Tow-Thomas stages: the generic (sampled nodal) path, whose circle plan each worker makes again. */
const GENERIC = {
  response: "bandstop",
  passband: { edgeHz: [40, 90], maxLossDb: 1 },
  stopband: { edgeHz: [55, 65], minAttenuationDb: 30 },
  family: "elliptic",
  topology: ["tow-thomas-notch", "tow-thomas-lowpass-notch", "tow-thomas-highpass-notch"],
  opamp: { a0: 1e5, gbwHz: "1M" },
} as const;

async function rejection(p: Promise<unknown>): Promise<Error> {
  try {
    await p;
  } catch (e) {
    expect(e).toBeInstanceOf(Error);
    return e as Error;
  }
  return expect.unreachable("expected the promise to reject");
}

describe.skipIf(!built)("monteCarloParallel on worker threads (the built package)", async () => {
  const lib = (await import(dist("index.js"))) as Root;
  const node = (await import(dist("node/index.js"))) as Node;

  describe.each([
    ["ideal op-amps", IDEAL, { runs: 1000 }],
    ["single-pole op-amps", SINGLE_POLE, { runs: 1000 }],
    ["single-pole op-amps, normal spread, another seed", SINGLE_POLE, { runs: 555, seed: 4242, distribution: "normal", capacitorTolerance: 0.02 }],
    ["generic-path stages", GENERIC, { runs: 600, seed: 3 }],
  ] as const)("%s", (_name, spec, options) => {
    const design = lib.designFilter(spec as never);
    const expected = lib.monteCarlo(design, options);

    it.each([1, 2, 3])(`gives monteCarlo's result bit for bit with %i thread(s) (${options.runs} boards)`, async (threads) => {
      const got = await node.monteCarloParallel(design, { ...options, threads });
      expectSameBits(got, expected);
    });
  });

  it("reports each finished worker and stops on an aborted signal or a time limit, terminating its workers", async () => {
    const design = lib.designFilter(IDEAL);
    const seen: number[] = [];
    const got = await node.monteCarloParallel(design, { runs: 1000, threads: 2, onProgress: (p) => void seen.push(p.boards ?? -1) });
    expectSameBits(got, lib.monteCarlo(design, { runs: 1000 }));
    expect(seen).toHaveLength(1); // the first worker to finish (the last one resolves the run)
    expect([512, 488]).toContain(seen[0]);
    const pre = new AbortController();
    pre.abort();
    const e1 = (await rejection(node.monteCarloParallel(design, { runs: 1000, threads: 2, signal: pre.signal }))) as FilterwrightError;
    expect([e1.code, e1.path]).toEqual(["CANCELLED", "options.signal"]);
    const later = new AbortController();
    setTimeout(() => later.abort(), 20);
    const e2 = (await rejection(node.monteCarloParallel(design, { runs: 20000, threads: 2, signal: later.signal }))) as FilterwrightError;
    expect([e2.code, e2.path]).toEqual(["CANCELLED", "options.signal"]);
    const e3 = (await rejection(node.monteCarloParallel(design, { runs: 20000, threads: 2, timeLimitMs: 5 }))) as FilterwrightError;
    expect([e3.code, e3.path]).toEqual(["CANCELLED", "options.timeLimitMs"]);
    expect(e3.message).toMatch(/time limit of 5 ms/);
  });

  it("runs with the default number of threads, and with more threads than the run has batches", async () => {
    const design = lib.designFilter(IDEAL);
    expectSameBits(await node.monteCarloParallel(design, { runs: 300 }), lib.monteCarlo(design, { runs: 300 }));
    expectSameBits(await node.monteCarloParallel(design, { runs: 100, threads: 8 }), lib.monteCarlo(design, { runs: 100 }));
  });

  it("works from the CommonJS build (require), with its own worker", () => {
    const code = `
      const { designFilter, monteCarlo } = require("filterwright");
      const { monteCarloParallel } = require("filterwright/node");
      const design = designFilter(${JSON.stringify(IDEAL)});
      monteCarloParallel(design, { runs: 600, threads: 2 }).then((r) => {
        console.log(JSON.stringify(r) === JSON.stringify(monteCarlo(design, { runs: 600 })));
      });`;
    const r = spawnSync(process.execPath, ["--input-type=commonjs", "-e", code], { cwd: root, encoding: "utf8" });
    expect(r.stderr).toBe("");
    expect(r.stdout.trim()).toBe("true");
  });

  describe("a worker's failure rejects the run", () => {
    const worker = new URL(dist("node/worker.js"));
    const design = designFilter(IDEAL);
    const settings = monteCarloSettings("test", design, { runs: 600 });
    const { plan, span, stages } = monteCarloStages(design, settings);
    const common = { stages: jobStages(stages, builtStages(design)), opamp: design.spec.opamp, span, plan, seed: 1, distribution: "uniform" as const };
    const jobs: BoardJob[] = splitBoards(600, 2, BATCH).map((r) => ({ ...common, ...r }));
    const label = (i: number): string => `the worker of job ${i}`;

    it("the built worker runs a job as the sources do", async () => {
      const runs = await runInWorkers(worker, jobs, label);
      expect(runs.map((r) => (r as { boards: number }).boards)).toEqual([256, 344]);
      expectSameBits(runs, jobs.map(runBoardJob));
    });

    it("with a filterwright error thrown in the worker as that error (class, function, path, value)", async () => {
      const bad = { ...jobs[1]!, stages: jobs[1]!.stages.map((s) => ({ ...s, topology: "no-such-topology" })) };
      const e = await rejection(runInWorkers(worker, [jobs[0]!, bad], label));
      expect(e).toBeInstanceOf(InvalidArgumentError);
      const f = e as InvalidArgumentError;
      expect([f.fn, f.path, f.received]).toEqual(["getTopology", "id", "no-such-topology"]);
    });

    it("with any other error as an Error naming the worker, the worker's error as its cause", async () => {
      const bad = { ...jobs[0]!, stages: 42 };
      const e = await rejection(runInWorkers(worker, [bad, jobs[1]!], label));
      expect(e).not.toBeInstanceOf(FilterwrightError);
      expect(e.message).toMatch(/^the worker of job 0 failed: TypeError: /);
      expect((e.cause as Error).name).toBe("TypeError");
    });
  });
});

describe("monteCarloParallel checks its input before starting any worker", () => {
  const design = designFilter(IDEAL);

  it.each([
    [{ threads: 0 }, "options.threads"],
    [{ threads: 65 }, "options.threads"],
    [{ threads: 1.5 }, "options.threads"],
    [{ threads: "2" }, "options.threads"],
    [{ threads: Number.NaN }, "options.threads"],
    [{ runs: 0 }, "options.runs"],
    [{ runs: 100001, threads: 2 }, "options.runs"],
    [{ seed: 0.5 }, "options.seed"],
    [{ resistorTolerance: 0.6 }, "options.resistorTolerance"],
    [{ distribution: "triangular" }, "options.distribution"],
    [[1], "options"],
  ])("rejects %o with an InvalidArgumentError at %s", async (options, path) => {
    const e = await rejection(source.monteCarloParallel(design, options as never));
    expect(e).toBeInstanceOf(InvalidArgumentError);
    expect([(e as InvalidArgumentError).fn, (e as InvalidArgumentError).path]).toEqual(["monteCarloParallel", path]);
  });

  it("rejects what is not a design result, naming the field", async () => {
    const e = await rejection(source.monteCarloParallel({ stages: [] } as unknown as DesignResult, { threads: 2 }));
    expect(e).toBeInstanceOf(InvalidArgumentError);
    expect((e as InvalidArgumentError).fn).toBe("monteCarloParallel");
    expect((e as InvalidArgumentError).path).toMatch(/^result/);
  });

  it("publishes its limit on threads", () => {
    expect(source.MAX_THREADS).toBe(64);
  });
});
