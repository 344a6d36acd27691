import { describe, expect, it } from "vitest";
import { UnrealisableError } from "../../../src/errors.ts";
import { isInSeries } from "../../../src/parts/index.ts";
import { gicHighpassLadder } from "../../../src/ladder/active/index.ts";
import type { LadderForm, LadderPrototype } from "../../../src/ladder/types.ts";
import { butterworthLadder, chebyshev1Ladder, passiveLadderResponse } from "../../helpers/ladder-prototypes.ts";
import { acAnalysis } from "../../../src/circuit/index.ts";
import { circuitResponse, denseGridHz, ellipticLadders, errorAgainst, gicsAsInductors, unstableRoots, worstDifference } from "../../helpers/active-ladder-check.ts";
import { thrownBy } from "../../helpers/throws.ts";

const FORMS: readonly LadderForm[] = ["series-first", "shunt-first"];

function allPole(): LadderPrototype[] {
  const out: LadderPrototype[] = [];
  for (const form of FORMS) {
    for (let n = 1; n <= 10; n++) out.push(butterworthLadder(n, form));
    for (let n = 2; n <= 10; n++) out.push(chebyshev1Ladder(n, 1, form));
  }
  return out;
}

describe("gicHighpassLadder", () => {
  it("realises an all-pole prototype's transfer mapped to highpass to 1e-9 dB with ideal op-amps (nodal analysis)", () => {
    const edgeHz = 470;
    const grid = denseGridHz(edgeHz, 2, 3);
    for (const p of allPole()) {
      const gain = p.loadOhms === p.sourceOhms ? 1 : 2;
      const f = gicHighpassLadder(p, { edgeHz, values: "exact", gain });
      const e = errorAgainst(f, f.target, grid);
      expect(e.db, `${p.family} ${p.order} ${p.form}`).toBeLessThan(1e-9);
      expect(e.rad, `${p.family} ${p.order} ${p.form}`).toBeLessThan(1e-9);
    }
  });

  it("is the passive highpass ladder with its DC path resistors to 1e-9 dB for elliptic ladders, within 0.03 dB of the transfer", () => {
    const edgeHz = 470;
    const grid = denseGridHz(edgeHz, 2, 3);
    for (const p of ellipticLadders()) {
      const f = gicHighpassLadder(p, { edgeHz, values: "exact" });
      // the nodes between series capacitors (order 3: one; order 5: two) need a DC path
      expect(f.dcPath?.resistors.length).toBe((p.order - 1) / 2);
      const passive = acAnalysis(gicsAsInductors(f), { source: "Vin", outputs: [f.output], freqHz: grid }).outputs[f.output] as { re: Float64Array; im: Float64Array };
      const e = worstDifference(circuitResponse(f, grid), passive);
      expect(e.db, `order ${p.order}`).toBeLessThan(1e-9);
      expect(e.rad, `order ${p.order}`).toBeLessThan(1e-9);
      // the passband (above the edge) moves by at most 0.03 dB
      const pass = denseGridHz(edgeHz, 0, 3, 400);
      expect(errorAgainst(f, f.target, pass).db, `order ${p.order}`).toBeLessThan(0.03);
    }
  });

  it("adds no DC path resistor to an all-pole ladder", () => {
    for (const p of allPole()) expect(gicHighpassLadder(p, { edgeHz: 100 }).dcPath?.resistors.length).toBe(0);
  });

  it("is the passive ladder at the mirrored frequency (an evaluation by chain matrices)", () => {
    const p = chebyshev1Ladder(7, 0.25, "shunt-first");
    const f = gicHighpassLadder(p, { edgeHz: 1000, values: "exact" });
    const grid = denseGridHz(1000, 2, 2, 300);
    const re = new Float64Array(grid.length);
    const im = new Float64Array(grid.length);
    grid.forEach((hz, i) => {
      // s -> 1 / s: the lowpass ladder at w' = -1 / w, i.e. the conjugate of its response at 1 / w
      const [a, b] = passiveLadderResponse(p, 1000 / hz);
      re[i] = 2 * a;
      im[i] = -2 * b;
    });
    expect(worstDifference(circuitResponse(f, grid), { re, im }).db).toBeLessThan(1e-9);
  });

  it("gives the first series capacitor the shared value, inductors as GICs with the shared capacitor", () => {
    const f = gicHighpassLadder(butterworthLadder(5, "shunt-first"), { edgeHz: 800, capacitorF: 22e-9 });
    // three grounded inductors, two op-amps each, and the output amplifier
    expect(f.opampCount).toBe(7);
    const series = f.parts.filter((x) => x.role.includes("series capacitor"));
    expect(series[0]?.value).toBe(22e-9);
    expect(f.parts.filter((x) => x.role.endsWith("GIC Z4")).every((x) => x.value === 22e-9)).toBe(true);
    expect(f.parts.every((x) => isInSeries(x.value, x.kind === "resistor" ? "E96" : "E12"))).toBe(true);
    // the second series capacitor (1 / 2 of the first normalised) is one or two E12 parts within 0.5 %
    const second = f.parts.filter((x) => x.role.startsWith("arm 4"));
    const total = second.reduce((s, x) => s + x.value, 0);
    expect(Math.abs(total / (second[0] as { ideal: number }).ideal - 1)).toBeLessThan(0.005);
  });

  it("stays stable with single-pole op-amps (the nodal equations' poles, by the Routh array)", () => {
    for (const gbwHz of [1e6, 10e6]) {
      for (const p of [butterworthLadder(3, "shunt-first"), chebyshev1Ladder(7, 0.125, "series-first"), ...ellipticLadders()]) {
        const f = gicHighpassLadder(p, { edgeHz: 2000, opamp: { kind: "single-pole", a0: 1e5, gbwHz }, predistort: false });
        expect(unstableRoots(f.circuit, f.output, 2000).rhp, `${p.family} ${p.order} GBW ${gbwHz}`).toBe(0);
      }
    }
  });

  it("would oscillate with the FDNR's op-amp connections: the stability check can fail", () => {
    const f = gicHighpassLadder(chebyshev1Ladder(7, 0.125, "series-first"), { edgeHz: 2000, opamp: { kind: "single-pole", a0: 1e5, gbwHz: 10e6 } });
    const swapped = f.circuit.elements.map((e) => (e.kind === "OA" && e.out !== "out" ? { ...e, inP: e.inN, inN: e.inP } : e));
    expect(unstableRoots({ title: "swapped", elements: swapped }, f.output, 2000).rhp).toBeGreaterThan(0);
  });

  it("refuses a capacitor across a series inductor (a floating inductor in the highpass)", () => {
    const tank: LadderPrototype = {
      ...butterworthLadder(3, "shunt-first"),
      elements: [{ kind: "shunt-C", value: 1 }, { kind: "series-L", value: 2, parallelC: 0.1 }, { kind: "shunt-C", value: 1 }],
    };
    const e = thrownBy(() => gicHighpassLadder(tank, { edgeHz: 1000 }), UnrealisableError);
    expect(e.path).toBe("prototype.elements[1].parallelC");
    expect(e.message).toMatch(/other form/);
  });
});
