import { describe, expect, it } from "vitest";
import { designFilter } from "../../src/design/index.ts";
import { builtStages } from "../../src/design/response.ts";
import { checkMask, maskPlan, spanRadS } from "../../src/design/verify.ts";
import { BATCH, runBoards, type BoardStage } from "../../src/evaluate/boards.ts";
import { compileStage } from "../../src/evaluate/stage-polynomials.ts";

const TWO_PI = 2 * Math.PI;

// An anti-alias lowpass for a slow data logger (our own scenario), with a real op-amp.
const design = designFilter({
  response: "lowpass",
  passband: { edgeHz: 2000, maxLossDb: 0.5 },
  stopband: { edgeHz: 6000, minAttenuationDb: 50 },
  family: "chebyshev1",
  opamp: { a0: 2e5, gbwHz: "3M" },
});
const spec = design.spec;
const plan = maskPlan(spec);
const built = builtStages(design);

function boardStages(rt: number, ct: number): BoardStage[] {
  return built.map((s) => {
    const compiled = compileStage(s.topology, s.values, spec.opamp, spanRadS(plan.bands));
    return {
      compiled,
      nominal: Float64Array.from(compiled.componentNames, (n) => s.values[n]!),
      tolerance: Float64Array.from(compiled.componentNames, (n) => (n.startsWith("C") ? ct : rt)),
      radius: TWO_PI * s.topology.figures(s.values).f0Hz,
    };
  });
}

describe("runBoards", () => {
  it("with zero tolerance every board has the design's own margin (1e-6 dB: one parabolic step away from the verdict band)", () => {
    const run = runBoards(boardStages(0, 0), plan, { boards: 10, seed: 1, distribution: "uniform" });
    for (const m of run.marginDb) expect(Math.abs(m - design.verification.marginDb)).toBeLessThan(1e-6);
    expect(run.passed).toBe(design.verification.meetsSpec ? 10 : 0);
  });

  it("gives each board the verdict the design's verification gives its parts, and its margin to 1e-6 dB", () => {
    const stages = boardStages(0.01, 0.05);
    const run = runBoards(stages, plan, { boards: 40, seed: 11, distribution: "uniform" });
    // the worst board, rebuilt from its values and checked by the design layer's mask check
    const worst = built.map((s, k) => {
      const names = stages[k]!.compiled.componentNames;
      const values = Object.fromEntries(names.map((n, j) => [n, run.worstValues[k]![j]!]));
      return { topology: s.topology, values };
    });
    const m = checkMask(spec, worst, spec.opamp);
    expect(Math.abs(m.marginDb - run.marginDb[run.worstBoard]!)).toBeLessThan(1e-6);
    expect(m.marginDb >= 0).toBe(run.marginDb[run.worstBoard]! >= 0);
    expect(Math.min(...run.marginDb)).toBe(run.marginDb[run.worstBoard]);
  });

  it("draws board k the same whatever the number of boards after it", () => {
    const stages = boardStages(0.01, 0.05);
    const short = runBoards(stages, plan, { boards: BATCH + 17, seed: 5, distribution: "uniform" });
    const long = runBoards(stages, plan, { boards: 2 * BATCH + 3, seed: 5, distribution: "uniform" });
    expect(Array.from(long.marginDb.subarray(0, BATCH + 17))).toEqual(Array.from(short.marginDb));
    const other = runBoards(stages, plan, { boards: 50, seed: 6, distribution: "uniform" });
    expect(Array.from(other.marginDb)).not.toEqual(Array.from(short.marginDb.subarray(0, 50)));
  });

  it("keeps every part within its tolerance, for both distributions", () => {
    for (const distribution of ["uniform", "normal"] as const) {
      const stages = boardStages(0.02, 0.1);
      const run = runBoards(stages, plan, { boards: 300, seed: 2, distribution });
      stages.forEach((s, k) => {
        s.nominal.forEach((v, j) => {
          const x = run.worstValues[k]![j]! / v - 1;
          expect(Math.abs(x)).toBeLessThanOrEqual(s.tolerance[j]! * (1 + 1e-12));
        });
      });
    }
  });

  it("spreads normal draws less than uniform ones (sigma = tolerance / 3 against tolerance / sqrt 3)", () => {
    const stages = boardStages(0.01, 0.05);
    const u = runBoards(stages, plan, { boards: 600, seed: 9, distribution: "uniform" });
    const n = runBoards(stages, plan, { boards: 600, seed: 9, distribution: "normal" });
    const sd = (x: Float64Array) => {
      const m = x.reduce((a, b) => a + b, 0) / x.length;
      return Math.sqrt(x.reduce((a, b) => a + (b - m) ** 2, 0) / (x.length - 1));
    };
    // the passband level follows the parts roughly linearly: its spread scales with the part spread (ratio sqrt(3)/3 = 0.58)
    const ratio = sd(n.gainDb) / sd(u.gainDb);
    expect(ratio).toBeGreaterThan(0.45);
    expect(ratio).toBeLessThan(0.72);
  });
});
