import { describe, expect, it } from "vitest";
import { FLIEGE_MAX_Q, fliegeNotch } from "../../src/topologies/fliege.ts";
import type { OpAmpModel } from "../../src/circuit/types.ts";
import type { StageTarget } from "../../src/topologies/types.ts";
import { circuitToSpice } from "../../src/circuit/spice.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";
import { mnaOf } from "../helpers/stage-cases.ts";
import { cascadeResponse } from "../../src/evaluate/cascade.ts";

const base: StageTarget = { order: 2, kind: "notch", f0Hz: 2500, q: 4, gain: 1 };
const realistic: OpAmpModel = { kind: "single-pole", a0: 2e5, gbwHz: 1e6 };
const db = (re: number, im: number): number => 20 * Math.log10(Math.hypot(re, im));

function atF0(v: Record<string, number>, fHz: number, opamp: OpAmpModel = { kind: "ideal" }): number {
  const h = mnaOf(fliegeNotch, v, Float64Array.of(fHz), opamp);
  return db(h.re[0]!, h.im[0]!);
}

describe("fliege-notch limits", () => {
  it("refuses Q above the spread bound, a zero away from f0 and a gain other than 1", () => {
    expect(fliegeNotch.check({ ...base, q: FLIEGE_MAX_Q }, {})).toBeNull();
    expect(fliegeNotch.check({ ...base, q: 0.1 }, {})).toBeNull();
    expect(fliegeNotch.check({ ...base, q: 60 }, {})).toMatch(/Q <= 50/);
    expect(fliegeNotch.check({ ...base, fzHz: 2600 }, {})).toMatch(/lowpass-notch or highpass-notch/);
    expect(fliegeNotch.check({ ...base, gain: 0.5 }, {})).toMatch(/fixed/);
    expect(fliegeNotch.fixedGain!(base)).toBe(1);
    expect(() => fliegeNotch.design({ ...base, q: 80 }, {})).toThrow(/Q <= 50/);
  });
});

describe("fliege-notch design", () => {
  it("the figures of a designed stage equal the target (f0, Q, fz, gain) to 1e-9, with the documented values", () => {
    const cases: [StageTarget, { capacitor?: number; resistor?: number }][] = [
      [base, {}],
      [{ ...base, f0Hz: 60, q: 20 }, { capacitor: 100e-9 }],
      [{ ...base, f0Hz: 90e3, q: 0.4 }, { resistor: 4700 }],
    ];
    for (const [t, c] of cases) {
      const v = fliegeNotch.design(t, c);
      const f = fliegeNotch.figures(v);
      expect(Math.abs(f.f0Hz / t.f0Hz - 1)).toBeLessThan(1e-9);
      expect(Math.abs(f.q! / t.q! - 1)).toBeLessThan(1e-9);
      expect(Math.abs(f.fzHz! / t.f0Hz - 1)).toBeLessThan(1e-9);
      expect(Math.abs(f.gain - 1)).toBeLessThan(1e-12);
      expect(v["C2"]).toBe(v["C1"]);
      for (const n of ["R4", "R5", "R6"]) expect(v[n]! / v["R3"]!).toBeCloseTo(1, 12);
      expect(v["R1"]! / v["R3"]!).toBeCloseTo(2 * t.q!, 9);
      expect(v["R2"]).toBe(v["R1"]);
      expect(v["R3"]! * v["C1"]! * 2 * Math.PI * t.f0Hz).toBeCloseTo(1, 12);
    }
  });
});

describe("fliege-notch notch depth", () => {
  it("is an exact zero with ideal parts and an ideal op-amp; a 1 % error in R1, R2, R5 or R6 fills it to about -46 dB at any Q; R3, R4, C1, C2 do not", () => {
    for (const q of [1, 10]) {
      const t = { ...base, q };
      const v = fliegeNotch.design(t, {});
      expect(atF0(v, t.f0Hz)).toBeLessThan(-200);
      for (const n of ["R1", "R2", "R5", "R6"]) {
        const w = { ...v, [n]: v[n]! * 1.01 };
        const d = atF0(w, fliegeNotch.figures(w).f0Hz); // the zero's modulus stays at the (moved) f0
        // |H(j w0)| = |G1 G5 - G2 G6| / (G5 (G1 + G2)), about 0.01/2
        expect(Math.abs(d - 20 * Math.log10(0.01 / 2)), n).toBeLessThan(0.2);
      }
      for (const n of ["R3", "R4", "C1", "C2"]) {
        const w = { ...v, [n]: v[n]! * 1.01 };
        const f0 = fliegeNotch.figures(w).f0Hz;
        expect(atF0(w, f0), n).toBeLessThan(-200);
        expect(Math.abs(f0 / t.f0Hz - 1.01 ** -0.5), n).toBeLessThan(1e-12); // sensitivity -1/2
      }
    }
  });

  it("with a realistic op-amp (a0 = 2e5, GBW = 1 MHz) the notch fills to a depth set by the loop gain at f0", () => {
    const depths: string[] = [];
    for (const f0Hz of [100, 1000, 10_000]) {
      const v = fliegeNotch.design({ ...base, f0Hz }, {});
      let best = 0;
      for (let i = -400; i <= 400; i++) best = Math.min(best, atF0(v, f0Hz * 10 ** (i * 1e-4), realistic));
      depths.push(`${f0Hz} Hz: ${best.toFixed(1)} dB`);
      expect(best).toBeLessThan(-20);
      const p = fliegeNotch.polynomials!(v, realistic)!;
      const r = cascadeResponse([p], Float64Array.of(2 * Math.PI * f0Hz));
      expect(Math.abs(db(r.re[0]!, r.im[0]!) - atF0(v, f0Hz, realistic))).toBeLessThan(1e-6);
    }
    console.log(`Fliege-type notch, Q = 4, single-pole op-amps (2e5, 1 MHz), deepest point: ${depths.join(", ")}`);
  });
});

describe.skipIf(!requireNgspice())("fliege-notch in ngspice", () => {
  it("a designed stage with a realistic op-amp (a0 = 2e5, GBW = 1 MHz) agrees with the polynomial form to 0.01 dB", () => {
    const t = { ...base, f0Hz: 3000, q: 8 };
    const v = fliegeNotch.design(t, { capacitor: 10e-9 });
    const elements = [
      { kind: "V" as const, name: "Vin", a: "in", b: "0", ac: 1 },
      ...fliegeNotch.elements(v, { input: "in", output: "out", nodePrefix: "x_", opamp: realistic }),
    ];
    const sim = runAc(circuitToSpice({ title: "Fliege-type notch", elements }, { ac: { pointsPerDecade: 40, startHz: 30, stopHz: 300e3 } }), ["out"]);
    const p = fliegeNotch.polynomials!(v, realistic)!;
    const ours = cascadeResponse([p], sim.freqHz.map((f) => 2 * Math.PI * f));
    let compared = 0;
    for (let i = 0; i < sim.freqHz.length; i++) {
      const b = db(sim.vectors["out"]!.re[i]!, sim.vectors["out"]!.im[i]!);
      if (b < -80) continue;
      expect(Math.abs(db(ours.re[i]!, ours.im[i]!) - b), `${sim.freqHz[i]} Hz`).toBeLessThan(0.01);
      compared++;
    }
    expect(compared).toBeGreaterThan(150);
  });
});
