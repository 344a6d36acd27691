import { describe, expect, it } from "vitest";
import { designFilter, designResponse, type DesignResult, type FilterSpec } from "../../src/design/index.ts";
import { monteCarlo, opampRequirements } from "../../src/analysis/index.ts";
import { toSpiceNetlist } from "../../src/report/index.ts";
import { InvalidArgumentError, SingularCircuitError } from "../../src/errors.ts";
import { spread } from "../../src/analysis/tolerance.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";

const haveSpice = requireNgspice();

const lp: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: 1000, maxLossDb: 1 },
  stopband: { edgeHz: 10000, minAttenuationDb: 30 },
};

const design = designFilter({
  response: "lowpass",
  passband: { edgeHz: 1000, maxLossDb: 0.5 },
  stopband: { edgeHz: 3000, minAttenuationDb: 45 },
  family: "chebyshev1",
  gain: { db: 6 },
});

/** The same design with some part values replaced (by designator). */
function withValues(r: DesignResult, values: Readonly<Record<string, number>>): DesignResult {
  return {
    ...r,
    stages: r.stages.map((s) => ({
      ...s,
      components: Object.fromEntries(Object.entries(s.components).map(([k, v]) => [k, values[k] ?? v])),
    })),
  };
}

describe("opampRequirements", () => {
  it("gives one requirement per stage, its peak output the input peak times the stage's peak gain", () => {
    const req = opampRequirements(design, { inputPeakV: 2 });
    expect(req.length).toBe(design.stages.length);
    for (const q of req) expect(q.peakOutputV).toBeCloseTo(2 * q.peakGain, 12);
  });

  it.skipIf(!haveSpice)("gives each stage's peak gain as ngspice sees it at the stage outputs", () => {
    const req = opampRequirements(design, { inputPeakV: 2 });
    const nodes = design.stages.map((_, i) => (i === design.stages.length - 1 ? "out" : `n${i + 1}`));
    const sim = runAc(toSpiceNetlist(design, { pointsPerDecade: 400 }), nodes);
    nodes.forEach((node, i) => {
      const v = sim.vectors[node] as { re: Float64Array; im: Float64Array };
      let peak = 0;
      let slew = 0;
      for (let k = 0; k < sim.freqHz.length; k++) {
        const m = Math.hypot(v.re[k] as number, v.im[k] as number);
        peak = Math.max(peak, m);
        slew = Math.max(slew, 2 * Math.PI * (sim.freqHz[k] as number) * m);
      }
      const q = req[i] as (typeof req)[number];
      expect(Math.abs(q.peakGain / peak - 1), `stage ${i + 1} peak`).toBeLessThan(2e-3);
      expect(Math.abs(q.slewRateVPerS / (2 * slew) - 1), `stage ${i + 1} slew`).toBeLessThan(2e-3);
    });
  });

  it("rejects a bad amplitude", () => {
    expect(() => opampRequirements(design, { inputPeakV: -1 })).toThrow(InvalidArgumentError);
  });
});

describe("monteCarlo", () => {
  it("with zero tolerance every board is the nominal one", () => {
    const mc = monteCarlo(design, { runs: 5, resistorTolerance: 0, capacitorTolerance: 0 });
    expect(mc.yield).toBe(1);
    // the boards' one parabolic step per extreme against the verification's golden-section search (1.8e-6 dB measured here)
    expect(Math.abs(mc.marginDb.min - design.verification.marginDb)).toBeLessThan(5e-6);
    expect(Math.abs(mc.marginDb.max - design.verification.marginDb)).toBeLessThan(5e-6);
  });

  it("is repeatable for a seed and spreads the margins with tolerance", () => {
    const a = monteCarlo(design, { runs: 40, seed: 7, capacitorTolerance: 0.05 });
    const b = monteCarlo(design, { runs: 40, seed: 7, capacitorTolerance: 0.05 });
    expect(a).toEqual(b);
    // resistors default to each one's own tolerance in the design (the loosest is reported)
    expect(a.tolerances).toEqual({ resistor: Math.max(...design.verification.yield.resistorTolerances), capacitor: 0.05 });
    expect(a.marginDb.min).toBeLessThan(a.marginDb.max);
    expect(a.yield).toBeGreaterThanOrEqual(0);
    expect(a.yield).toBeLessThanOrEqual(1);
    expect(a.marginDb.min).toBeLessThanOrEqual(design.verification.marginDb + 1e-9);
  });

  it("gives a worst board with a value for every part", () => {
    const mc = monteCarlo(design, { runs: 30, seed: 3, capacitorTolerance: 0.05 });
    expect(Object.keys(mc.worstBoard).sort()).toEqual(design.stages.flatMap((s) => Object.keys(s.components)).sort());
  });

  it.skipIf(!haveSpice)("its worst board, simulated by ngspice, has the response our analysis used", () => {
    const mc = monteCarlo(design, { runs: 30, seed: 3, capacitorTolerance: 0.05 });
    const worst = withValues(design, mc.worstBoard);
    const sim = runAc(toSpiceNetlist(worst, { pointsPerDecade: 40 }), ["out"]);
    const ours = designResponse(worst, sim.freqHz);
    const out = sim.vectors["out"] as { re: Float64Array; im: Float64Array };
    for (let k = 0; k < sim.freqHz.length; k++) {
      const a = 20 * Math.log10(Math.hypot(ours.re[k] as number, ours.im[k] as number));
      if (!(a > -80)) continue;
      const b = 20 * Math.log10(Math.hypot(out.re[k] as number, out.im[k] as number));
      expect(Math.abs(a - b)).toBeLessThan(0.01);
    }
  });

  it("rejects bad options", () => {
    expect(() => monteCarlo(design, { runs: 0 })).toThrow(InvalidArgumentError);
    expect(() => monteCarlo(design, { capacitorTolerance: 2 })).toThrow(InvalidArgumentError);
  });
});

describe("partSensitivities", () => {
  it("obeys the impedance- and frequency-scaling invariants in every stage", async () => {
    const { partSensitivities } = await import("../../src/analysis/index.ts");
    const { loadFixture } = await import("../helpers/fixtures.ts");
    const fx = loadFixture<{ specs: { id: string; spec: FilterSpec }[] }>("design-specs.json");
    for (const e of fx.specs.slice(0, 12)) {
      const r = designFilter(e.spec);
      const s = partSensitivities(r);
      for (const st of r.stages) {
        const mine = s.filter((x) => x.stage === st.index);
        const sum = (kind: "R" | "C", key: "f0" | "q" | "gain" | "fz"): number =>
          mine.filter((x) => x.part.startsWith(kind)).reduce((a, x) => a + x[key], 0);
        const label = `${e.id} stage ${st.index} (${st.topology})`;
        expect(sum("R", "f0"), label).toBeCloseTo(-1, 5);
        expect(sum("C", "f0"), label).toBeCloseTo(-1, 5);
        expect(sum("R", "q"), label).toBeCloseTo(0, 5);
        expect(sum("C", "q"), label).toBeCloseTo(0, 5);
        expect(sum("R", "gain"), label).toBeCloseTo(0, 5);
        expect(sum("C", "gain"), label).toBeCloseTo(0, 5);
        if (st.target.fzHz !== undefined) {
          expect(sum("R", "fz"), label).toBeCloseTo(-1, 5);
          expect(sum("C", "fz"), label).toBeCloseTo(-1, 5);
        }
      }
    }
  });

  it("matches the closed-form Sallen-Key unity-gain lowpass sensitivities", async () => {
    const { partSensitivities } = await import("../../src/analysis/index.ts");
    // Q = sqrt(R1 R2 C1 / C2) / (R1 + R2) with C1 the feedback capacitor
    // (M. E. Van Valkenburg, "Analog Filter Design", 1982, ch. 7; from memory):
    // S_R1^Q = 1/2 - R1/(R1 + R2), S_C1^Q = 1/2, S_C2^Q = -1/2, every S^f0 = -1/2.
    const r = designFilter({ ...lp, family: "butterworth", order: 2, topology: "sallen-key-lowpass-unity" });
    const st = r.stages[0] as DesignResult["stages"][number];
    const byLocal = Object.fromEntries(Object.entries(st.localNames).map(([g, l]) => [l, g]));
    const s = Object.fromEntries(partSensitivities(r).map((x) => [x.part, x]));
    const v = (l: string): number => st.components[byLocal[l] as string] as number;
    const get = (l: string) => s[byLocal[l] as string] as { f0: number; q: number };
    const r1 = v("R1");
    const r2 = v("R2");
    expect(get("R1").q).toBeCloseTo(0.5 - r1 / (r1 + r2), 6);
    expect(get("R2").q).toBeCloseTo(0.5 - r2 / (r1 + r2), 6);
    expect(get("C1").q).toBeCloseTo(0.5, 6);
    expect(get("C2").q).toBeCloseTo(-0.5, 6);
    for (const l of ["R1", "R2", "C1", "C2"]) expect(get(l).f0).toBeCloseTo(-0.5, 6);
  });
});

describe("spread (the Monte Carlo figures' min, median and max)", () => {
  it("takes the finite figures only, and refuses a run where no board has one (never -Infinity)", () => {
    expect(spread(Float64Array.from([3, Number.NaN, 1, Infinity, 2]))).toEqual({ min: 1, median: 2, max: 3 });
    expect(spread(Float64Array.from([4, 1]))).toEqual({ min: 1, median: 2.5, max: 4 });
    expect(() => spread(Float64Array.from([Number.NaN, -Infinity]), "monteCarlo", "gainDb")).toThrow(SingularCircuitError);
    expect(() => spread(new Float64Array(0))).toThrow(/no board of the run has a finite marginDb/);
  });
});
