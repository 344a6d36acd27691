import { describe, expect, it } from "vitest";
import { isInSeries } from "../../src/parts/index.ts";
import { asBuiltPole, getTopology } from "../../src/topologies/index.ts";
import type { StageTarget } from "../../src/topologies/types.ts";
import { validateSpec } from "../../src/design/spec.ts";
import { stageErrors, tuneStage, type ValueSet } from "../../src/design/components.ts";

const spec = validateSpec({
  response: "lowpass",
  passband: { edgeHz: 1000, maxLossDb: 1 },
  stopband: { edgeHz: 4000, minAttenuationDb: 40 },
  parts: { resistorSeries: "E24", capacitorSeries: "E12" },
});
const target: StageTarget = { order: 2, kind: "lowpass", f0Hz: 1234, q: 1.3, gain: -2.2 };
const mfb = getTopology("mfb-lowpass");

function expectFromSeries(v: ValueSet): void {
  for (const [name, x] of Object.entries(v.values)) {
    if (name.startsWith("R")) expect(isInSeries(x, spec.resistorSeries), `${name} = ${x}`).toBe(true);
    if (name.startsWith("C")) expect(isInSeries(x, spec.capacitorSeries), `${name} = ${x}`).toBe(true);
  }
}

describe("stageErrors", () => {
  it("gives the relative errors of f0, Q, fz and gain, Q only for second order", () => {
    const e = stageErrors({ f0Hz: 1010, q: 0.99, gain: -2.2 * 1.02 }, target);
    expect(e.f0).toBeCloseTo(1 - 1010 / 1234, 12);
    expect(e.q).toBeCloseTo(1 - 0.99 / 1.3, 12);
    expect(e.fz).toBe(0);
    expect(e.gain).toBeCloseTo(0.02, 12);
    expect(stageErrors({ f0Hz: 100, q: 3, gain: 1 }, { order: 1, kind: "lowpass", f0Hz: 100, gain: 1 }).q).toBe(0);
  });
});

describe("tuneStage", () => {
  const tuned = tuneStage(mfb, target, spec);

  it("returns preferred values from the spec's series, capacitors inside the window", () => {
    expect(tuned).not.toBeNull();
    const t = tuned!;
    for (const v of [t.best, t.plain, ...t.alternatives]) expectFromSeries(v);
    for (const [name, x] of Object.entries(t.best.values)) {
      if (name.startsWith("C")) {
        expect(x).toBeGreaterThanOrEqual(spec.capacitorRange.min);
        expect(x).toBeLessThanOrEqual(spec.capacitorRange.max);
      }
    }
  });

  it("states the figures and errors the values really have, within 1 % after re-tuning (E24 resistors, E12 capacitors)", () => {
    const t = tuned!;
    for (const v of [t.best, ...t.alternatives]) {
      expect(v.figures).toEqual(mfb.figures(v.values));
      expect(v.errors).toEqual(stageErrors(mfb.figures(v.values), target));
    }
    expect(Math.max(t.best.errors.f0, t.best.errors.q)).toBeLessThan(1e-2);
    expect(t.best.errors.gain).toBeLessThan(2e-2);
    expect(t.best.cost).toBeLessThanOrEqual(t.plain.cost);
    const costs = t.alternatives.map((v) => v.cost);
    expect([...costs].sort((a, b) => a - b)).toEqual(costs);
    expect(t.alternatives).not.toContain(t.best);
  });

  it("rounds the exact design part by part for the plain baseline", () => {
    const t = tuned!;
    expect(Object.keys(t.plain.values).sort()).toEqual(Object.keys(t.exact).sort());
    for (const [name, x] of Object.entries(t.plain.values)) expect(Math.abs(Math.log(x / t.exact[name]!))).toBeLessThan(0.1);
  });

  it("under op-amp scoring, states the pole each set has with that op-amp", () => {
    const opamp = { kind: "single-pole", a0: 1e5, gbwHz: 1e6 } as const;
    const t = tuneStage(mfb, target, spec, { opampScoring: { opamp, wanted: target } })!;
    expect(t.best.withOpamp).toEqual(asBuiltPole(mfb, t.best.values, opamp));
    expect(t.best.errors.f0).toBeCloseTo(Math.abs(t.best.withOpamp!.f0Hz / target.f0Hz - 1), 12);
  });

  it("prefers capacitor values already used by earlier stages when that costs under 0.1 %", () => {
    const t = tuned!;
    const used = new Set(Object.entries(t.alternatives.at(-1)!.values).filter(([k]) => k.startsWith("C")).map(([, v]) => v));
    const again = tuneStage(mfb, target, spec, { preferredCapacitors: used })!;
    expect(again.best.cost).toBeLessThanOrEqual(t.best.cost + 1e-3 + 1e-12);
  });
});
