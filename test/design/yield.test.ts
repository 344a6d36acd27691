import { describe, expect, it } from "vitest";
import { designFilter, validateSpec, type FilterSpec } from "../../src/design/index.ts";
import { SpecError } from "../../src/errors.ts";
import { monteCarlo } from "../../src/analysis/index.ts";
import { toBomCsv, bomLines, toMarkdown } from "../../src/report/index.ts";
import { SCENARIOS } from "../../src/cli/scenarios.ts";
import { wilsonInterval } from "../../src/evaluate/yield.ts";
import { classLadder } from "../../src/design/yield.ts";

// The README's library example: a hydrophone front end, default parts.
const readmeSpec = {
  response: "bandpass",
  passband: { edgeHz: ["2k", "20k"], maxLossDb: 0.5 },
  stopband: { edgeHz: [500, "80k"], minAttenuationDb: 40 },
  gain: { db: 20 },
  opamp: { a0: 1e5, gbwHz: "10M" },
} as const;

describe("design for yield: the demo scenarios and the README example at default parts", () => {
  const cases: [string, unknown][] = [
    ...Object.entries(SCENARIOS).map(([k, s]) => [`demo ${k}`, s.spec] as [string, unknown]),
    ["README example", readmeSpec],
  ];
  it.each(cases)("%s: the boards' 95 %% interval clears the 0.95 target, and the report says what was chosen", (_, spec) => {
    const r = designFilter(spec as FilterSpec);
    const y = r.verification.yield;
    expect(r.verification.meetsSpec).toBe(true);
    expect(r.verification.stable).toBe(true);
    expect(y.lower95).toBeGreaterThanOrEqual(0.95);
    expect(y.met).toBe(true);
    expect(r.verification.boardsMeetSpec).toBe(true);
    // the interval is the Wilson interval of the boards counted
    const [lo, hi] = wilsonInterval(y.passed, y.boards);
    expect(y.lower95).toBeCloseTo(lo, 15);
    expect(y.upper95).toBeCloseTo(hi, 15);
    expect(y.fraction).toBe(y.passed / y.boards);
    // what it chose is in the report: family, order, topology, tolerance classes
    const md = toMarkdown(r);
    expect(md).toContain("## Boards as built (yield)");
    expect(md).toContain(r.family);
    for (const t of y.capacitorTolerances) expect(md).toContain(`${Number((t * 100).toPrecision(3))} %`);
    expect(r.yieldAlternatives.filter((a) => a.chosen)).toHaveLength(1);
  });

  it("a spec that fixes 2 % capacitors keeps them and tightens only what it leaves free", () => {
    const r = designFilter({ ...readmeSpec, parts: { capacitorTolerance: 0.02 }, yieldCheck: { maxBoards: 512 } });
    expect(r.verification.yield.capacitorTolerances).toEqual([0.02]);
    for (const st of r.stages) for (const [k, t] of Object.entries(st.tolerances)) if (k.startsWith("C")) expect(t).toBe(0.02);
  });
});

describe("the yield in the result agrees with monteCarlo on the same boards", () => {
  it("same seed, same boards, same per-part tolerances: the same fraction", () => {
    const r = designFilter({
      response: "highpass",
      passband: { edgeHz: 300, maxLossDb: 1 },
      stopband: { edgeHz: 60, minAttenuationDb: 40 },
      yieldCheck: { maxBoards: 512, seed: 4 },
    });
    const y = r.verification.yield;
    const mc = monteCarlo(r, { runs: y.boards, seed: 4 });
    expect(mc.yield).toBe(y.fraction);
  });
});

describe("yieldTarget and yieldCheck", () => {
  const base = { response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 1 }, stopband: { edgeHz: 4000, minAttenuationDb: 40 } };
  it("defaults: 0.95, 2048 boards, seed 1, uniform spread, 5 % capacitors free to tighten", () => {
    const s = validateSpec(base);
    expect([s.yieldTarget, s.yieldMaxBoards, s.yieldSeed, s.partDistribution]).toEqual([0.95, 2048, 1, "uniform"]);
    expect(s.capacitorTolerance).toBe(0.05);
    expect(s.capacitorToleranceFixed).toBe(false);
    expect(validateSpec({ ...base, parts: { capacitorSeries: "E96" } }).capacitorTolerance).toBe(0.01);
  });
  it.each([0, 1, -0.1, 1.5, Number.NaN, "0.9"])("yieldTarget %s is refused with its path", (t) => {
    try {
      validateSpec({ ...base, yieldTarget: t });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(SpecError);
      expect((e as SpecError).issues.map((i) => i.path)).toEqual(["yieldTarget"]);
    }
  });
  it.each([
    [{ maxBoards: 100 }, "yieldCheck.maxBoards"],
    [{ maxBoards: 1.5e5 }, "yieldCheck.maxBoards"],
    [{ seed: 0.5 }, "yieldCheck.seed"],
    [{ boards: 300 }, "yieldCheck.boards"],
  ])("yieldCheck %j is refused at %s", (c, path) => {
    try {
      validateSpec({ ...base, yieldCheck: c });
      expect.unreachable();
    } catch (e) {
      expect((e as SpecError).issues.map((i) => i.path)).toEqual([path]);
    }
  });
  it("parts.distribution must be uniform or normal", () => {
    expect(() => validateSpec({ ...base, parts: { distribution: "gaussian" } })).toThrow(/parts.distribution/);
    expect(validateSpec({ ...base, parts: { distribution: "normal" } }).partDistribution).toBe("normal");
  });
  it("the class ladder tightens only the free kind, capacitors first", () => {
    const free = classLadder(validateSpec(base));
    expect(free[0]).toEqual({ resistor: 0.01, capacitor: 0.05 });
    expect(free[1]).toEqual({ resistor: 0.01, capacitor: 0.02 });
    expect(free.at(-1)).toEqual({ resistor: 0.001, capacitor: 0.01 });
    const fixedC = classLadder(validateSpec({ ...base, parts: { capacitorTolerance: 0.1 } }));
    expect(new Set(fixedC.map((c) => c.capacitor))).toEqual(new Set([0.1]));
  });
});

describe("a target the parts cannot reach", () => {
  // A tight seismic lowpass with 10 % capacitors fixed: the boards cannot make it.
  const spec = {
    response: "lowpass",
    passband: { edgeHz: 20, maxLossDb: 0.1 },
    stopband: { edgeHz: 40, minAttenuationDb: 50 },
    parts: { capacitorTolerance: 0.1, resistorTolerance: 0.05 },
    family: "chebyshev1",
    order: 6,
    yieldCheck: { maxBoards: 512 },
  };
  it("does not meet the spec, says why, and lists what it measured", () => {
    const r = designFilter(spec as FilterSpec);
    expect(r.verification.yield.met).toBe(false);
    expect(r.verification.boardsMeetSpec).toBe(false);
    expect(r.warnings.map((w) => w.code)).toContain("yield-not-met");
    expect(r.warnings.find((w) => w.code === "yield-not-met")?.message).toMatch(/fixes the resistor and capacitor tolerance/);
    expect(r.yieldAlternatives.length).toBeGreaterThanOrEqual(1);
    for (const a of r.yieldAlternatives) {
      expect(a.order).toBe(6);
      expect(a.resistorTolerance).toBe(0.05);
      expect(a.capacitorTolerance).toBe(0.1);
    }
  });
});

describe("BOM: each part's own tolerance and the capacitor dielectric", () => {
  it("carries the allocated tolerances and names the dielectric class", () => {
    const r = designFilter(SCENARIOS["hum-notch"]!.spec);
    const lines = bomLines(r);
    for (const l of lines.filter((x) => x.part === "capacitor")) {
      expect(["C0G/NP0", "film (PP/PPS)"]).toContain(l.dielectric);
      for (const d of l.designators) {
        const st = r.stages.find((s) => d in s.components)!;
        expect(l.tolerance).toBe(`${Number((st.tolerances[d]! * 100).toPrecision(3))}%`);
      }
    }
    expect(toBomCsv(r).split("\r\n")[0]).toBe("designators,part,value,rkm,series,tolerance,dielectric,quantity");
  });
});

describe("stability: a stage with right-half-plane poles never meets the spec", () => {
  it("a gain-K Sallen-Key lowpass with K above 3 at equal parts is flagged by checkMask, and its boards count as unstable", async () => {
    const { checkMask, maskPlan, spanRadS } = await import("../../src/design/verify.ts");
    const { getTopology } = await import("../../src/topologies/index.ts");
    const { compileStage } = await import("../../src/evaluate/stage-polynomials.ts");
    const { runBoards } = await import("../../src/evaluate/boards.ts");
    const spec = validateSpec({ response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 3 }, stopband: { edgeHz: 8000, minAttenuationDb: 20 } });
    const t = getTopology("sallen-key-lowpass-gain");
    // equal R and C: Q = 1 / (3 - K); K = 1 + R3/R4 = 3.2 puts both poles in the right half-plane
    const values = { R1: 10e3, R2: 10e3, C1: 15.9e-9, C2: 15.9e-9, R3: 22e3, R4: 10e3 };
    const m = checkMask(spec, [{ topology: t, values }], { kind: "ideal" });
    expect(m.unstableStages).toEqual([1]);
    // K = 2.9 (Q = 10) is stable nominally, but 5 % parts move K past 3 on some boards
    const near = { ...values, R3: 19e3 };
    expect(checkMask(spec, [{ topology: t, values: near }], { kind: "ideal" }).unstableStages).toEqual([]);
    const plan = maskPlan(spec);
    const compiled = compileStage(t, near, { kind: "ideal" }, spanRadS(plan.bands));
    const run = runBoards(
      [{ compiled, nominal: Float64Array.from(compiled.componentNames, (n) => near[n as keyof typeof near]), tolerance: new Float64Array(compiled.componentNames.length).fill(0.05), radius: 2 * Math.PI * 1000 }],
      plan,
      { boards: 512, seed: 1, distribution: "uniform" },
    );
    expect(run.unstable).toBeGreaterThan(10);
    expect(run.passed + run.unstable).toBeLessThanOrEqual(512);
  });
});

describe("the yield fields survive JSON", () => {
  it("fromJson(toJson(r)) keeps verification.yield, the per-part tolerances and the alternatives", async () => {
    const { toJson, fromJson } = await import("../../src/report/index.ts");
    const r = designFilter({ ...SCENARIOS["hum-notch"]!.spec, yieldCheck: { maxBoards: 512 } });
    const back = fromJson(toJson(r));
    expect(back.verification.yield).toEqual(r.verification.yield);
    expect(back.stages.map((s) => s.tolerances)).toEqual(r.stages.map((s) => s.tolerances));
    expect(back.yieldAlternatives).toEqual(r.yieldAlternatives);
    expect(back.verification.boardsMeetSpec).toBe(r.verification.boardsMeetSpec);
    const broken = JSON.parse(toJson(r));
    broken.result.verification.yield.lower95 = 1.5;
    expect(() => fromJson(JSON.stringify(broken))).toThrow(/verification\.yield\.lower95/);
  });
});
