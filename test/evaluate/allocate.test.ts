import { describe, expect, it } from "vitest";
import { SCENARIOS } from "../../src/cli/scenarios.ts";
import { designFilter, type FilterSpec } from "../../src/design/index.ts";
import { maskPlan } from "../../src/design/verify.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { allocateTolerances, CAPACITOR_CLASSES, RESISTOR_CLASSES, type ToleranceClass } from "../../src/evaluate/allocate.ts";
import { runBoards, type BoardStage } from "../../src/evaluate/boards.ts";
import type { MaskPlan } from "../../src/evaluate/mask.ts";
import { linearModel, predictYield, type LinearModel } from "../../src/evaluate/spread.ts";
import { boardStagesOf } from "../helpers/boards.ts";

// Our own scenarios: a logger's anti-alias lowpass with a real op-amp (11 parts), the demo's vibration anti-alias
// lowpass (14 parts: a third-order stage and a Tow-Thomas stage) and hum notch (24 parts, state-variable notches). Each is the nominal
// design (a yield target its first boards reach keeps the pipeline from redesigning it for yield).
const SPECS: Record<string, FilterSpec> = {
  "logger lowpass": {
    response: "lowpass",
    passband: { edgeHz: 2000, maxLossDb: 0.5 },
    stopband: { edgeHz: 6000, minAttenuationDb: 50 },
    family: "chebyshev1",
    opamp: { a0: 2e5, gbwHz: "3M" },
    // pinned to the stages these figures were first measured on (the automatic choice now joins the real pole to a pair in one third-order stage)
    topology: ["first-order-lowpass-buffer", "sallen-key-lowpass-unity", "mfb-lowpass"],
  },
  // pinned to the stages these figures were first measured on (the automatic choice now uses one-op-amp notch sections)
  vibration: { ...SCENARIOS["vibration"]!.spec, family: "chebyshev1" },
  "hum notch": { ...SCENARIOS["hum-notch"]!.spec, topology: "state-variable-notch" },
};

interface Case {
  readonly plan: MaskPlan;
  readonly stages: BoardStage[];
  readonly model: LinearModel;
}
const cases = new Map<string, Case>();
function caseOf(name: string): Case {
  let c = cases.get(name);
  if (c === undefined) {
    const design = designFilter({ ...SPECS[name]!, yieldTarget: 0.001 });
    const plan = maskPlan(design.spec);
    const stages = boardStagesOf(design, 0, 0);
    c = { plan, stages, model: linearModel(stages, plan) };
    cases.set(name, c);
  }
  return c;
}

/** The stages with the allocation's tolerances (board order). */
function allocated(stages: readonly BoardStage[], tolerance: Float64Array): BoardStage[] {
  let at = 0;
  return stages.map((s) => {
    const t = tolerance.slice(at, at + s.nominal.length);
    at += s.nominal.length;
    return { ...s, tolerance: t };
  });
}

describe("allocateTolerances", () => {
  it.each(["logger lowpass", "hum notch"])("%s: meets a 0.95 target on the linear model, confirmed by runBoards on other boards", (name) => {
    const c = caseOf(name);
    const a = allocateTolerances(c.model, c.plan, { target: 0.95 });
    expect(a.met).toBe(true);
    expect(a.predicted).toBeGreaterThanOrEqual(a.required);
    expect(a.required).toBeCloseTo(0.96, 12);
    // the same boards through predictYield: the allocation's incremental bookkeeping gives the same count
    expect(predictYield(c.model, c.plan, a.tolerance, "uniform", { samples: 2000, seed: 1 }).fraction).toBe(a.predicted);
    // full Monte Carlo on boards the allocation never saw
    const run = runBoards(allocated(c.stages, a.tolerance), c.plan, { boards: 1000, seed: 77, distribution: "uniform" });
    expect(run.passed / 1000).toBeGreaterThanOrEqual(0.93);
    // every part got a class from its own list, and the cost is theirs
    a.classes.forEach((label, j) => {
      const list = c.model.parts[j]!.kind === "capacitor" ? CAPACITOR_CLASSES : RESISTOR_CLASSES;
      const cls = list.find((x) => x.label === label)!;
      expect(cls.tolerance).toBe(a.tolerance[j]);
    });
    const cost = a.classes.reduce((sum, label, j) => {
      const list = c.model.parts[j]!.kind === "capacitor" ? CAPACITOR_CLASSES : RESISTOR_CLASSES;
      return sum + list.find((x) => x.label === label)!.cost;
    }, 0);
    expect(a.cost).toBeCloseTo(cost, 12);
  });

  it("costs no more than the cheapest single resistor class and capacitor class for all parts that meet the same target", () => {
    const c = caseOf("logger lowpass");
    const a = allocateTolerances(c.model, c.plan, { target: 0.95 });
    let cheapest = Infinity;
    for (const r of RESISTOR_CLASSES) {
      for (const k of CAPACITOR_CLASSES) {
        const tol = Float64Array.from(c.model.parts, (p) => (p.kind === "capacitor" ? k.tolerance : r.tolerance));
        const y = predictYield(c.model, c.plan, tol, "uniform", { samples: 2000, seed: 1 }).fraction;
        const cost = c.model.parts.reduce((s, p) => s + (p.kind === "capacitor" ? k.cost : r.cost), 0);
        if (y >= a.required) cheapest = Math.min(cheapest, cost);
      }
    }
    expect(Number.isFinite(cheapest)).toBe(true);
    expect(a.cost).toBeLessThan(cheapest);
  });

  it("leaves no part that could be loosened by one class with the target still met (checked by full evaluation)", () => {
    const c = caseOf("hum notch");
    const a = allocateTolerances(c.model, c.plan, { target: 0.9, distribution: "normal" });
    expect(a.met).toBe(true);
    a.tolerance.forEach((t, j) => {
      const list = [...(c.model.parts[j]!.kind === "capacitor" ? CAPACITOR_CLASSES : RESISTOR_CLASSES)].sort((x, y) => y.tolerance - x.tolerance);
      const looser = list.filter((x) => x.tolerance > t).at(-1);
      if (looser === undefined) return;
      const tol = a.tolerance.slice();
      tol[j] = looser.tolerance;
      expect(predictYield(c.model, c.plan, tol, "normal", { samples: 2000, seed: 1 }).fraction).toBeLessThan(a.required);
    });
  });

  it("says when the classes given cannot reach the target", () => {
    const c = caseOf("vibration");
    // 0.014 dB of nominal margin: even 0.1 % resistors and 1 % capacitors leave about half the boards failing
    const a = allocateTolerances(c.model, c.plan, { target: 0.95 });
    expect(a.met).toBe(false);
    expect(a.predicted).toBeLessThan(a.required);
    // the parts the response depends on were tightened to their tightest class
    expect(a.classes.filter((x) => x === "0.1 %").length).toBeGreaterThan(4);
  });

  it("never picks a class that is looser and dearer than another", () => {
    const c = caseOf("logger lowpass");
    const odd: ToleranceClass[] = [...RESISTOR_CLASSES, { label: "3 % (dear)", tolerance: 0.03, cost: 10 }];
    const classes = c.model.parts.map((p) => (p.kind === "capacitor" ? CAPACITOR_CLASSES : odd));
    const a = allocateTolerances(c.model, c.plan, { target: 0.9, classes });
    expect(a.classes).not.toContain("3 % (dear)");
    expect(a.met).toBe(true);
  });

  it("the vibration design (pinned to Chebyshev I) has 14 parts (its real pole and a pair in one third-order stage)", () => {
    expect(caseOf("vibration").model.parts.length).toBe(14);
  });

  it("rejects a target outside (0, 1) and a class list per part of the wrong length", () => {
    const c = caseOf("logger lowpass");
    expect(() => allocateTolerances(c.model, c.plan, { target: 1 })).toThrow(InvalidArgumentError);
    expect(() => allocateTolerances(c.model, c.plan, { target: 0.9, classes: [RESISTOR_CLASSES] })).toThrow(/options\.classes/);
    expect(() => allocateTolerances(c.model, c.plan, { target: 0.9, classes: c.model.parts.map(() => []) })).toThrow(/options\.classes\[0\]/);
  });
});
