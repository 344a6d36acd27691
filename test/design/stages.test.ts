import { describe, expect, it } from "vitest";
import { SpecError } from "../../src/errors.ts";
import { toSections } from "../../src/tf/index.ts";
import type { SectionCascade } from "../../src/tf/types.ts";
import { TWO_PI } from "../../src/units/constants.ts";
import { validateSpec, type FilterSpec } from "../../src/design/spec.ts";
import { choosePrototype } from "../../src/design/family.ts";
import { placeInInterval, prototypeInterval, transformPrototype } from "../../src/design/placement.ts";
import { capacitorSpreadOf, describeSections, peakGrid, planStages, type SectionInfo } from "../../src/design/stages.ts";
import { thrownBy } from "../helpers/throws.ts";

const lowpass: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: 1000, maxLossDb: 0.5 },
  stopband: { edgeHz: 2500, minAttenuationDb: 60 },
  family: "chebyshev1",
  order: 7,
  gain: { vPerV: 10 },
};

function cascadeOf(input: FilterSpec, order: number): { spec: ReturnType<typeof validateSpec>; cascade: SectionCascade } {
  const spec = validateSpec(input);
  const proto = choosePrototype(spec, spec.family === "auto" ? "butterworth" : spec.family, order);
  const interval = prototypeInterval(spec, proto.zpk);
  const zpk = transformPrototype(spec, proto.zpk, interval, placeInInterval(interval, 0.5));
  return { spec, cascade: toSections(zpk, { order: "ascending-q" }) };
}

function maxOf(a: Float64Array): number {
  return a.reduce((m, x) => Math.max(m, x), 0);
}

describe("peakGrid", () => {
  it("spans two decades either side of the sections and holds every section's w0", () => {
    const { cascade } = cascadeOf(lowpass, 7);
    const grid = peakGrid(cascade);
    const ws = cascade.sections.map((s) => s.w0);
    expect(grid[0]).toBeCloseTo(Math.min(...ws) / 100, 6);
    expect(grid.at(-1)).toBeCloseTo(Math.max(...ws) * 100, 3);
    for (const w of ws) expect(grid.includes(w)).toBe(true);
    for (let i = 1; i < grid.length; i++) expect(grid[i]!).toBeGreaterThanOrEqual(grid[i - 1]!);
  });
});

describe("describeSections", () => {
  it("orders the sections by ascending Q, first-order first, and normalises each to unit gain at its reference", () => {
    const { cascade } = cascadeOf(lowpass, 7);
    const infos = describeSections(cascade, peakGrid(cascade));
    expect(infos.map((i) => i.order)).toEqual([1, 2, 2, 2]);
    const qs = infos.slice(1).map((i) => i.q as number);
    expect([...qs].sort((a, b) => a - b)).toEqual(qs);
    for (const info of infos) {
      expect(info.kind).toBe("lowpass");
      expect(info.f0Hz).toBeCloseTo(info.section.w0 / TWO_PI, 9);
      expect(info.unitMag[0]).toBeCloseTo(1, 3); // lowpass reference: DC (the grid starts two decades below w0)
    }
  });
});

describe("planStages", () => {
  it("distributes the gain so that every stage output peaks at the spec's gain (equal peaks)", () => {
    const { spec, cascade } = cascadeOf({ ...lowpass, topology: ["first-order-lowpass-noninverting", "tow-thomas-lowpass", "tow-thomas-lowpass", "tow-thomas-lowpass"] }, 7);
    const infos = describeSections(cascade, peakGrid(cascade));
    const { plans, polarityOk } = planStages(spec, infos, { forced: spec.stageTopologies });
    expect(polarityOk).toBe(true);
    const partial = new Float64Array(infos[0]!.unitMag.length).fill(1);
    let gain = 1;
    plans.forEach((p, i) => {
      const info = infos[i] as SectionInfo;
      for (let k = 0; k < partial.length; k++) partial[k]! *= info.unitMag[k]!;
      gain *= Math.abs(p.target.gain);
      expect(gain * maxOf(partial), `stage ${i + 1}`).toBeCloseTo(10, 9);
      expect(p.target.f0Hz).toBe(info.f0Hz);
    });
  });

  it("picks an inverting stage for an inverting spec and reports when the polarity cannot be met", () => {
    const { spec, cascade } = cascadeOf({ ...lowpass, gain: { vPerV: -1 } }, 7);
    const infos = describeSections(cascade, peakGrid(cascade));
    const { plans, polarityOk } = planStages(spec, infos, { forced: infos.map(() => "auto") });
    expect(polarityOk).toBe(true);
    expect(plans.filter((p) => p.topology.inverting).length % 2).toBe(1);
    const forced = infos.map((i) => (i.order === 1 ? "first-order-lowpass-buffer" : "sallen-key-lowpass-unity"));
    expect(planStages(spec, infos, { forced }).polarityOk).toBe(false);
  });

  it("throws a SpecError when a named topology cannot realise its stage", () => {
    const { spec, cascade } = cascadeOf(lowpass, 7);
    const infos = describeSections(cascade, peakGrid(cascade));
    const e = thrownBy(() => planStages(spec, infos, { forced: infos.map(() => "mfb-bandpass") }), SpecError);
    expect(e.issues[0]?.path).toBe("topology");
  });
});

describe("capacitorSpreadOf", () => {
  it("is the ratio of the largest to the smallest capacitor, 1 without capacitors", () => {
    expect(capacitorSpreadOf({ R1: 1e3, C1: 10e-9, C2: 47e-9, C3: 22e-9 })).toBeCloseTo(4.7, 12);
    expect(capacitorSpreadOf({ R1: 1e3 })).toBe(1);
  });
});
