import { describe, expect, it } from "vitest";
import { TWIN_T_MAX_Q, TWIN_T_MIN_RATIO, twinTMinQ, twinTNotch } from "../../src/topologies/twin-t.ts";
import type { OpAmpModel } from "../../src/circuit/types.ts";
import type { StageTarget } from "../../src/topologies/types.ts";
import { circuitToSpice } from "../../src/circuit/spice.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";
import { mnaOf } from "../helpers/stage-cases.ts";
import { cascadeResponse } from "../../src/evaluate/cascade.ts";

const base: StageTarget = { order: 2, kind: "notch", f0Hz: 1300, q: 2, gain: 1 };
const realistic: OpAmpModel = { kind: "single-pole", a0: 2e5, gbwHz: 1e6 };
const db = (re: number, im: number): number => 20 * Math.log10(Math.hypot(re, im));

/** |H| in dB of the ideal-op-amp stage at f (nodal analysis, independent of the closed form). */
function depthDb(v: Record<string, number>, fHz: number): number {
  const h = mnaOf(twinTNotch, v, Float64Array.of(fHz), { kind: "ideal" });
  return db(h.re[0]!, h.im[0]!);
}

describe("twin-t-notch limits", () => {
  it("refuses Q above the bound, Q below the divider's reach, a zero away from f0, a gain other than 1 and a ratio without a design", () => {
    expect(twinTNotch.check({ ...base, q: TWIN_T_MAX_Q }, {})).toBeNull();
    expect(twinTNotch.check({ ...base, q: 10.5 }, {})).toMatch(/Q <= 10/);
    const qMin = twinTMinQ(12);
    expect(qMin).toBeGreaterThan(0.2);
    expect(qMin).toBeLessThan(0.21);
    expect(twinTMinQ(1000)).toBeCloseTo(0.25 / 0.98, 4); // the classic 1/4 over (1 - 0.02)
    expect(twinTNotch.check({ ...base, q: qMin * 1.001 }, {})).toBeNull();
    expect(twinTNotch.check({ ...base, q: qMin * 0.99 }, {})).toMatch(/raise Q/);
    expect(twinTNotch.check({ ...base, fzHz: 1400 }, {})).toMatch(/lowpass-notch or highpass-notch/);
    expect(twinTNotch.check({ ...base, gain: 2 }, {})).toMatch(/fixed/);
    expect(twinTNotch.fixedGain!(base)).toBe(1);
    expect(twinTNotch.check(base, { resistorRatio: 11 })).toMatch(/resistorRatio/);
    expect(twinTNotch.check(base, { resistorRatio: 2000 })).toMatch(/resistorRatio/);
    expect(twinTNotch.check(base, { resistorRatio: TWIN_T_MIN_RATIO })).toBeNull();
    expect(() => twinTNotch.design({ ...base, q: 20 }, {})).toThrow(/Q <= 10/);
  });
});

describe("twin-t-notch design", () => {
  const cases: [StageTarget, { resistorRatio?: number; capacitor?: number; resistor?: number }][] = [
    [base, {}],
    [{ ...base, f0Hz: 50, q: 8 }, { resistor: 22_000 }],
    [{ ...base, f0Hz: 60e3, q: 0.3 }, { capacitor: 1e-9 }],
    [{ ...base, q: 5 }, { resistorRatio: 12 }],
    [{ ...base, q: 1 }, { resistorRatio: TWIN_T_MIN_RATIO }],
    [{ ...base, q: 0.7 }, { resistorRatio: 1000 }],
  ];
  it("the figures of a designed stage equal the target (f0, Q, fz, gain) to 1e-9", () => {
    for (const [t, c] of cases) {
      const f = twinTNotch.figures(twinTNotch.design(t, c));
      expect(Math.abs(f.f0Hz / t.f0Hz - 1)).toBeLessThan(1e-9);
      expect(Math.abs(f.q! / t.q! - 1)).toBeLessThan(1e-9);
      expect(Math.abs(f.fzHz! / t.f0Hz - 1)).toBeLessThan(1e-9);
      expect(Math.abs(f.gain - 1)).toBeLessThan(1e-12);
    }
  });

  it("at resistorRatio 12 gives R3 = R/4, C3 = 4C; as the divider stiffens it tends to the classic R/2, 2C and k = 1 - 1/(4Q)", () => {
    const v12 = twinTNotch.design(base, { resistorRatio: 12 });
    expect(v12["R3"]! / v12["R1"]!).toBeCloseTo(0.25, 12);
    expect(v12["C3"]! / v12["C1"]!).toBeCloseTo(4, 12);
    const v = twinTNotch.design(base, { resistorRatio: 1000 });
    expect(v["R2"]).toBe(v["R1"]);
    expect(v["C2"]).toBe(v["C1"]);
    expect(Math.abs(v["R3"]! / v["R1"]! / 0.5 - 1)).toBeLessThan(0.01);
    expect(Math.abs(v["C3"]! / v["C1"]! / 2 - 1)).toBeLessThan(0.01);
    const k = v["R5"]! / (v["R4"]! + v["R5"]!);
    expect(Math.abs(k / (1 - 1 / (4 * base.q!)) - 1)).toBeLessThan(0.001);
    // C1 = 1/(2 pi f0 R) in the limit
    expect(Math.abs(v["C1"]! * 2 * Math.PI * base.f0Hz * v["R1"]! - 1)).toBeLessThan(0.005);
  });

  it("the divider's source resistance is R1 / resistorRatio (default 12, with R3 = R1/4 and C3 = 4 C1)", () => {
    const d = twinTNotch.design(base, {});
    expect(d["R3"]! / d["R1"]!).toBeCloseTo(0.25, 12);
    expect(d["C3"]! / d["C1"]!).toBeCloseTo(4, 12);
    for (const g of [undefined, 15, 300]) {
      const v = twinTNotch.design(base, g === undefined ? {} : { resistorRatio: g });
      const rth = (v["R4"]! * v["R5"]!) / (v["R4"]! + v["R5"]!);
      expect(v["R1"]! / rth).toBeCloseTo(g ?? 12, 9);
    }
  });
});

describe("twin-t-notch notch depth", () => {
  it("is an exact zero with ideal parts, with the ideal and with a single-pole op-amp", () => {
    for (const t of [base, { ...base, q: 9, f0Hz: 60 }]) {
      const v = twinTNotch.design(t, {});
      expect(depthDb(v, t.f0Hz)).toBeLessThan(-200);
      const h = mnaOf(twinTNotch, v, Float64Array.of(t.f0Hz), realistic);
      expect(db(h.re[0]!, h.im[0]!)).toBeLessThan(-200);
      const p = twinTNotch.polynomials!(v, realistic)!;
      const r = cascadeResponse([p], Float64Array.of(2 * Math.PI * t.f0Hz));
      expect(db(r.re[0]!, r.im[0]!)).toBeLessThan(-200);
    }
  });

  it("with one part off by 1 % fills to about -40 to -70 dB and scales with the error; a change of the divider ratio alone (same source resistance) keeps it", () => {
    const t = { ...base, q: 1 };
    const v = twinTNotch.design(t, {});
    const depths: Record<string, number> = {};
    for (const n of ["R1", "R2", "R3", "C1", "C2", "C3", "R4", "R5"]) {
      // deepest point of the mismatched notch (it moves a little from f0)
      let best = 0;
      for (let i = -300; i <= 300; i++) best = Math.min(best, depthDb({ ...v, [n]: v[n]! * 1.01 }, t.f0Hz * 10 ** (i * 2e-5)));
      depths[n] = best;
      expect(best, n).toBeLessThan(-30);
      expect(best, n).toBeGreaterThan(-75);
      let best10 = 0;
      for (let i = -300; i <= 300; i++) best10 = Math.min(best10, depthDb({ ...v, [n]: v[n]! * 1.001 }, t.f0Hz * 10 ** (i * 2e-6)));
      expect(Math.abs(best10 - best + 20), n).toBeLessThan(1.5);
    }
    // at Q = 8 the same error fills the notch about 20 log10(8) dB more
    const v8 = twinTNotch.design({ ...t, q: 8 }, {});
    let best8 = 0;
    for (let i = -300; i <= 300; i++) best8 = Math.min(best8, depthDb({ ...v8, R3: v8["R3"]! * 1.01 }, t.f0Hz * 10 ** (i * 2e-5)));
    expect(Math.abs(best8 - depths["R3"]! - 20 * Math.log10(8))).toBeLessThan(3);
    console.log(`twin-T notch depth, one part +1 %, Q = 1: ${Object.entries(depths).map(([n, d]) => `${n} ${d.toFixed(1)} dB`).join(", ")}`);
    // the divider's fraction k moved with its source resistance R4 R5 / (R4 + R5) kept: Q moves, the zero stays
    const gt = 1 / v["R4"]! + 1 / v["R5"]!;
    const k = 1.02 * (v["R5"]! / (v["R4"]! + v["R5"]!));
    const moved = { ...v, R4: 1 / (k * gt), R5: 1 / ((1 - k) * gt) };
    expect(depthDb(moved, t.f0Hz)).toBeLessThan(-200);
    expect(twinTNotch.figures(moved).q).toBeGreaterThan(1.05);
    // Q's sensitivity to R5 itself is about k (below 1), even at Q = 8 (k = 0.97)
    const v8q = twinTNotch.design({ ...t, q: 8 }, {});
    const q8 = twinTNotch.figures({ ...v8q, R5: v8q["R5"]! * 1.01 }).q!;
    expect(q8 / 8 - 1).toBeGreaterThan(0.005);
    expect(q8 / 8 - 1).toBeLessThan(0.0101);
  });
});

describe.skipIf(!requireNgspice())("twin-t-notch in ngspice", () => {
  it("a designed stage with a realistic op-amp (a0 = 2e5, GBW = 1 MHz) agrees with the polynomial form to 0.01 dB", () => {
    const t = { ...base, f0Hz: 4000, q: 6 };
    const v = twinTNotch.design(t, { capacitor: 4.7e-9 });
    const elements = [
      { kind: "V" as const, name: "Vin", a: "in", b: "0", ac: 1 },
      ...twinTNotch.elements(v, { input: "in", output: "out", nodePrefix: "x_", opamp: realistic }),
    ];
    const sim = runAc(circuitToSpice({ title: "twin-T notch", elements }, { ac: { pointsPerDecade: 40, startHz: 40, stopHz: 400e3 } }), ["out"]);
    const p = twinTNotch.polynomials!(v, realistic)!;
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
