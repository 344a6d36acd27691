import { describe, expect, it } from "vitest";
import { UnrealisableError } from "../../../src/errors.ts";
import { isInSeries } from "../../../src/parts/index.ts";
import { fdnrLowpassLadder, type ActiveLadder } from "../../../src/ladder/active/index.ts";
import type { LadderForm, LadderPrototype } from "../../../src/ladder/types.ts";
import { butterworthLadder, chebyshev1Ladder, passiveLadderResponse } from "../../helpers/ladder-prototypes.ts";
import { circuitResponse, denseGridHz, ellipticLadders, errorAgainst, unstableRoots, worstDifference } from "../../helpers/active-ladder-check.ts";
import { thrownBy } from "../../helpers/throws.ts";

const FORMS: readonly LadderForm[] = ["series-first", "shunt-first"];

/** The passive ladder with the DC path resistors as the inductors they stand for, times the output amplifier's gain. */
function dividedLadderResponse(p: LadderPrototype, f: ActiveLadder, freqHz: Float64Array, gain: number): { re: Float64Array; im: Float64Array } {
  const [ra, rb] = f.dcPath?.resistors ?? [];
  const extra = { source: (ra?.value ?? NaN) / f.impedanceScale, load: (rb?.value ?? NaN) / f.impedanceScale };
  const amp = gain / (Math.sqrt(p.loadOhms / p.sourceOhms) / 2);
  const re = new Float64Array(freqHz.length);
  const im = new Float64Array(freqHz.length);
  freqHz.forEach((hz, i) => {
    const [a, b] = passiveLadderResponse(p, (2 * Math.PI * hz) / f.frequencyScale, extra);
    re[i] = a * amp;
    im[i] = b * amp;
  });
  return { re, im };
}

function allPole(): LadderPrototype[] {
  const out: LadderPrototype[] = [];
  for (const form of FORMS) {
    for (let n = 1; n <= 10; n++) out.push(butterworthLadder(n, form));
    for (let n = 2; n <= 10; n++) out.push(chebyshev1Ladder(n, 0.5, form));
  }
  return out;
}

describe("fdnrLowpassLadder", () => {
  it("is the divided ladder with its DC path resistors to 1e-9 dB with ideal op-amps (all-pole and elliptic ladders)", () => {
    const edgeHz = 2500;
    const grid = denseGridHz(edgeHz, 4, 2);
    for (const p of [...allPole(), ...ellipticLadders()]) {
      const gain = p.loadOhms === p.sourceOhms ? 1 : 2;
      const f = fdnrLowpassLadder(p, { edgeHz, values: "exact", gain });
      const e = worstDifference(circuitResponse(f, grid), dividedLadderResponse(p, f, grid, gain));
      expect(e.db, `${p.family} ${p.order} ${p.form}`).toBeLessThan(1e-9);
      expect(e.rad, `${p.family} ${p.order} ${p.form}`).toBeLessThan(1e-9);
    }
  });

  it("departs from the prototype's transfer by at most about 30 / dcPathRatio dB (ratios of 1000 and more), and keeps the DC gain", () => {
    const edgeHz = 2500;
    const grid = denseGridHz(edgeHz, 5, 1);
    for (const ratio of [1000, 3000]) {
      let worst = 0;
      for (const p of allPole()) {
        const gain = p.loadOhms === p.sourceOhms ? 1 : 2;
        const f = fdnrLowpassLadder(p, { edgeHz, values: "exact", gain, dcPathRatio: ratio });
        worst = Math.max(worst, errorAgainst(f, f.target, grid).db);
        const dc = circuitResponse(f, Float64Array.of(0)).re[0] as number;
        const want = (gain * 2 * Math.sqrt(p.sourceOhms / p.loadOhms) * p.loadOhms) / (p.sourceOhms + p.loadOhms);
        expect(dc, `${p.family} ${p.order} ${p.form} at DC`).toBeCloseTo(want, 10);
      }
      expect(worst, `ratio ${ratio}`).toBeLessThan(30 / ratio);
      expect(worst, `ratio ${ratio}`).toBeGreaterThan(5 / ratio);
    }
  });

  it("shares one capacitor value among the terminations and every GIC, resistors on E96", () => {
    const f = fdnrLowpassLadder(chebyshev1Ladder(7, 0.125, "series-first"), { edgeHz: 18_000, capacitorF: 10e-9 });
    // 3 FDNRs of two op-amps, and the output amplifier
    expect(f.opampCount).toBe(7);
    const caps = f.parts.filter((p) => p.kind === "capacitor");
    expect(caps.length).toBe(2 + 2 * 3);
    expect(caps.every((c) => c.value === 10e-9)).toBe(true);
    expect(f.parts.filter((p) => p.kind === "resistor").every((r) => isInSeries(r.value, "E96"))).toBe(true);
    expect(f.dcPath?.ratio).toBe(1000);
    expect((f.dcPath?.resistors[0]?.value ?? 0) / (f.impedanceScale * 1000)).toBeCloseTo(1, 1);
  });

  it("makes an unequal load capacitor of two in parallel when one alone is more than 0.5 % off", () => {
    const p = chebyshev1Ladder(6, 0.5, "series-first");
    const f = fdnrLowpassLadder(p, { edgeHz: 1000, capacitorF: 100e-9, gain: 2 });
    const load = f.parts.filter((x) => x.role.startsWith("load termination"));
    const want = 100e-9 * (p.sourceOhms / p.loadOhms);
    const total = load.reduce((s, x) => s + x.value, 0);
    expect(load.length).toBe(2);
    expect(Math.abs(total / want - 1)).toBeLessThan(0.005);
    expect(load.every((x) => isInSeries(x.value, "E12"))).toBe(true);
  });

  it("stays stable with single-pole op-amps (the nodal equations' poles, by the Routh array)", () => {
    for (const gbwHz of [1e6, 10e6]) {
      for (const p of [butterworthLadder(4, "series-first"), chebyshev1Ladder(7, 0.125, "series-first"), ...ellipticLadders()]) {
        const f = fdnrLowpassLadder(p, { edgeHz: 18_000, opamp: { kind: "single-pole", a0: 1e5, gbwHz }, predistort: false });
        expect(unstableRoots(f.circuit, f.output, 18_000).rhp, `${p.family} ${p.order} GBW ${gbwHz}`).toBe(0);
      }
    }
  });

  it("would oscillate with the inductor's op-amp connections: the stability check can fail", () => {
    const f = fdnrLowpassLadder(chebyshev1Ladder(7, 0.125, "series-first"), { edgeHz: 18_000, opamp: { kind: "single-pole", a0: 1e5, gbwHz: 10e6 } });
    // swap the inputs of every GIC op-amp (the output amplifier keeps its own)
    const swapped = f.circuit.elements.map((e) => (e.kind === "OA" && e.out !== "out" ? { ...e, inP: e.inN, inN: e.inP } : e));
    expect(unstableRoots({ title: "swapped", elements: swapped }, f.output, 18_000).rhp).toBeGreaterThan(0);
  });

  it("refuses a capacitor across a series inductor, and a gain below the ladder's own level", () => {
    const tank: LadderPrototype = {
      ...butterworthLadder(3, "series-first"),
      elements: [{ kind: "series-L", value: 1, parallelC: 0.2 }, { kind: "shunt-C", value: 2 }, { kind: "series-L", value: 1 }],
    };
    expect(thrownBy(() => fdnrLowpassLadder(tank, { edgeHz: 1000 }), UnrealisableError).path).toBe("prototype.elements[0].parallelC");
    expect(thrownBy(() => fdnrLowpassLadder(butterworthLadder(3, "series-first"), { edgeHz: 1000, gain: 0.4 }), UnrealisableError).path).toBe("options.gain");
  });
});
