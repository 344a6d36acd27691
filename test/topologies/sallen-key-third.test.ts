import { describe, expect, it } from "vitest";
import {
  sallenKeyHighpassThird as hp,
  sallenKeyLowpassThird as lp,
  THIRD_ORDER_MAX_RATIO,
  thirdOrderLowpassMinRatio,
} from "../../src/topologies/sallen-key-third.ts";
import { cubicRealRoots, nearestRealRoot } from "../../src/math/cubic.ts";
import type { StageTarget } from "../../src/topologies/types.ts";
import { mnaOf } from "../helpers/stage-cases.ts";
import { targetResponse } from "./target-response.ts";

/** Pole pair and real pole of the prototypes the stage is meant for (f0 1 kHz; ratios from the pole positions). */
const BUTTERWORTH3: StageTarget = { order: 3, kind: "lowpass", f0Hz: 1000, q: 1, realPoleHz: 1000, gain: 1 };
const BESSEL3: StageTarget = { order: 3, kind: "lowpass", f0Hz: 1000, q: 0.691046, realPoleHz: 914.05, gain: 1 };
const CHEBYSHEV3_05: StageTarget = { order: 3, kind: "lowpass", f0Hz: 1000, q: 1.7062, realPoleHz: 586.1, gain: 1 };

const worstDb = (topo: typeof lp, v: Record<string, number>, t: StageTarget): number => {
  const f = Float64Array.from([0.05, 0.3, 0.7, 1, 1.4, 3, 20], (x) => x * t.f0Hz);
  const h = mnaOf(topo, v, f, { kind: "ideal" });
  let worst = 0;
  for (let i = 0; i < f.length; i++) {
    const e = targetResponse(t, f[i]!);
    worst = Math.max(worst, Math.abs(20 * Math.log10(Math.hypot(h.re[i]!, h.im[i]!) / Math.hypot(e.re, e.im))));
  }
  return worst;
};

describe("third-order Sallen-Key lowpass", () => {
  it("is one op-amp, unity gain, and realises Butterworth, Bessel and Chebyshev targets exactly (nodal analysis vs the target, 1e-9 dB)", () => {
    expect(lp.opampCount).toBe(1);
    expect(lp.order).toBe(3);
    expect(lp.fixedGain!(BUTTERWORTH3)).toBe(1);
    for (const t of [BUTTERWORTH3, BESSEL3, CHEBYSHEV3_05, { ...BUTTERWORTH3, f0Hz: 3.3, realPoleHz: 2.9 }, { ...BESSEL3, f0Hz: 2e5, realPoleHz: 1.83e5 }]) {
      const v = lp.design(t, {});
      const f = lp.figures(v);
      expect(Math.abs(f.f0Hz / t.f0Hz - 1)).toBeLessThan(1e-12);
      expect(Math.abs(f.q! / t.q! - 1)).toBeLessThan(1e-12);
      expect(Math.abs(f.realPoleHz! / t.realPoleHz! - 1)).toBeLessThan(1e-12);
      expect(f.gain).toBe(1);
      expect(worstDb(lp, v, t)).toBeLessThan(1e-9);
      // two equal capacitors, the third at C1 / ratio
      expect(v["C2"]).toBe(v["C1"]);
      expect(v["C3"]!).toBeLessThan(v["C1"]!);
    }
  });

  it("has a smallest capacitor ratio C1/C3 that grows with Q (about 8 for the Butterworth pair, above 20 at Q 1.7); the default is 1.25 times it", () => {
    const butter = thirdOrderLowpassMinRatio(BUTTERWORTH3)!;
    const bessel = thirdOrderLowpassMinRatio(BESSEL3)!;
    const cheb = thirdOrderLowpassMinRatio(CHEBYSHEV3_05)!;
    expect(butter).toBeGreaterThan(6);
    expect(butter).toBeLessThan(10);
    expect(bessel).toBeLessThan(butter);
    expect(cheb).toBeGreaterThan(20);
    const v = lp.design(BUTTERWORTH3, {});
    expect(v["C1"]! / v["C3"]!).toBeCloseTo(1.25 * butter, 9);
    // just above the smallest ratio there is a design, well below it there is none
    expect(lp.check(BUTTERWORTH3, { capacitorRatio: butter * 1.01 })).toBeNull();
    expect(lp.check(BUTTERWORTH3, { capacitorRatio: butter * 0.9 })).toMatch(/C1\/C3 of at least/);
    const at = lp.design(BUTTERWORTH3, { capacitorRatio: 22, capacitor: 10e-9 });
    expect(at["C1"]).toBe(10e-9);
    expect(at["C1"]! / at["C3"]!).toBeCloseTo(22, 12);
    expect(worstDb(lp, at, BUTTERWORTH3)).toBeLessThan(1e-9);
  });

  it("refuses a pair of Q 0.5 or less, a resistorRatio, a ratio above the bound and a gain other than 1, saying what to do", () => {
    expect(lp.check({ ...BUTTERWORTH3, q: 0.5 }, {})).toMatch(/first-order stages/);
    expect(lp.check(BUTTERWORTH3, { resistorRatio: 2 })).toMatch(/capacitorRatio/);
    expect(lp.check(BUTTERWORTH3, { capacitorRatio: THIRD_ORDER_MAX_RATIO * 2 })).toMatch(/at most/);
    expect(lp.check({ ...BUTTERWORTH3, gain: 2 }, {})).toMatch(/fixed/);
    expect(() => lp.design({ ...BUTTERWORTH3, realPoleHz: undefined } as unknown as StageTarget, {})).toThrow(/realPoleHz/);
  });
});

describe("third-order Sallen-Key highpass", () => {
  const HP: StageTarget = { ...BUTTERWORTH3, kind: "highpass" };
  it("uses three equal capacitors and realises the target exactly (1e-9 dB); the high-frequency gain is 1", () => {
    for (const t of [HP, { ...BESSEL3, kind: "highpass" as const }, { ...HP, q: 1.3, realPoleHz: 750 }]) {
      const v = hp.design(t, { capacitor: 4.7e-9 });
      expect(v["C1"]).toBe(4.7e-9);
      expect(v["C2"]).toBe(4.7e-9);
      expect(v["C3"]).toBe(4.7e-9);
      const f = hp.figures(v);
      expect(Math.abs(f.f0Hz / t.f0Hz - 1)).toBeLessThan(1e-12);
      expect(Math.abs(f.q! / t.q! - 1)).toBeLessThan(1e-12);
      expect(Math.abs(f.realPoleHz! / t.realPoleHz! - 1)).toBeLessThan(1e-12);
      expect(worstDb(hp, v, t)).toBeLessThan(1e-9);
    }
  });

  it("refuses ratios and a pair with no equal-capacitor design", () => {
    expect(hp.check(HP, { capacitorRatio: 2 })).toMatch(/equal capacitors/);
    // a high-Q pair with a distant real pole: the cubic for R1 has no root in range
    let refused = 0;
    for (const q of [3, 6, 10]) for (const r of [0.1, 5]) if (hp.check({ ...HP, q, realPoleHz: 1000 * r }, {}) !== null) refused++;
    expect(refused).toBeGreaterThan(0);
  });
});

describe("math/cubic", () => {
  it("finds one or three real roots to a few ulps, and the root nearest a value", () => {
    const three = cubicRealRoots(2, -12, 22, -12); // 2 (u - 1)(u - 2)(u - 3)
    expect(three.length).toBe(3);
    three.forEach((r, i) => expect(Math.abs(r - (i + 1))).toBeLessThan(1e-14));
    const one = cubicRealRoots(1, 0, 1, -2); // (u - 1)(u^2 + u + 2)
    expect(one.length).toBe(1);
    expect(Math.abs(one[0]! - 1)).toBeLessThan(1e-15);
    expect(nearestRealRoot(2, -12, 22, -12, 2.4)).toBeCloseTo(2, 14);
  });
});
