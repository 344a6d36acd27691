import { describe, expect, it } from "vitest";
import fixture from "../fixtures/evaluate-wilson.json" with { type: "json" };
import { designFilter } from "../../src/design/index.ts";
import { builtStages } from "../../src/design/response.ts";
import { maskPlan, spanRadS } from "../../src/design/verify.ts";
import { BATCH, runBoards, type BoardStage } from "../../src/evaluate/boards.ts";
import { compileStage } from "../../src/evaluate/stage-polynomials.ts";
import { sequentialYield, wilsonInterval } from "../../src/evaluate/yield.ts";

const TWO_PI = 2 * Math.PI;

describe("wilsonInterval", () => {
  it("matches scipy's Wilson interval to 1e-12", () => {
    for (const c of fixture.cases) {
      const [lo, hi] = wilsonInterval(c.passed, c.n);
      expect(Math.abs(lo - c.lower)).toBeLessThan(1e-12);
      expect(Math.abs(hi - c.upper)).toBeLessThan(1e-12);
    }
  });

  it("reaches exactly 1 when every board passes and exactly 0 when none does", () => {
    for (const n of [1, 7, 256, 1280, 100_000]) {
      expect(wilsonInterval(n, n)[1]).toBe(1);
      expect(wilsonInterval(0, n)[0]).toBe(0);
      // the inner ends stay strictly inside
      expect(wilsonInterval(n, n)[0]).toBeLessThan(1);
      expect(wilsonInterval(0, n)[1]).toBeGreaterThan(0);
    }
  });
});

// A strain-gauge lowpass (our own scenario) built from toleranced parts.
const design = designFilter({
  response: "lowpass",
  passband: { edgeHz: 300, maxLossDb: 0.5 },
  stopband: { edgeHz: 1200, minAttenuationDb: 45 },
  opamp: { a0: 1e5, gbwHz: "1M" },
});
const plan = maskPlan(design.spec);
function stages(rt: number, ct: number): BoardStage[] {
  return builtStages(design).map((s) => {
    const compiled = compileStage(s.topology, s.values, design.spec.opamp, spanRadS(plan.bands));
    return {
      compiled,
      nominal: Float64Array.from(compiled.componentNames, (n) => s.values[n]!),
      tolerance: Float64Array.from(compiled.componentNames, (n) => (n.startsWith("C") ? ct : rt)),
      radius: TWO_PI * s.topology.figures(s.values).f0Hz,
    };
  });
}

describe("sequentialYield", () => {
  it("builds the same boards as one long run (continuation by firstBoard)", () => {
    const st = stages(0.01, 0.05);
    const long = runBoards(st, plan, { boards: 4 * BATCH, seed: 9, distribution: "uniform" });
    const y = sequentialYield(st, plan, { target: 0.999999, seed: 9, distribution: "uniform", maxBoards: 4 * BATCH, minBoards: 4 * BATCH });
    expect(y.boards).toBe(4 * BATCH);
    expect(y.passed).toBe(long.passed);
    const [lo, hi] = wilsonInterval(long.passed, long.boards);
    expect(y.lower95).toBe(lo);
    expect(y.upper95).toBe(hi);
    expect(y.met).toBe(lo >= 0.999999);
  });

  it("stops as soon as the interval decides, and at the cap otherwise", () => {
    const perfect = sequentialYield(stages(0, 0), plan, { target: 0.95, seed: 1, distribution: "uniform", maxBoards: 10 * BATCH });
    expect(design.verification.meetsSpec).toBe(true);
    expect(perfect.boards).toBe(2 * BATCH); // all pass: lower95 of 512/512 is 0.9925
    expect(perfect.met).toBe(true);
    const loose = sequentialYield(stages(0.05, 0.2), plan, { target: 0.95, seed: 1, distribution: "uniform", maxBoards: 10 * BATCH });
    expect(loose.upper95).toBeLessThan(0.95);
    expect(loose.met).toBe(false);
    expect(loose.boards).toBeLessThan(10 * BATCH);
    expect(loose.lower95).toBeLessThanOrEqual(loose.fraction);
    expect(loose.upper95).toBeGreaterThanOrEqual(loose.fraction);
  });
});
