import { describe, expect, it } from "vitest";
import { impulseResponse, stepFigures, stepResponse } from "../../src/tf/time.ts";
import { toSections } from "../../src/tf/sections.ts";
import { zpk } from "../../src/tf/zpk.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import { expectArrayClose, expectClose } from "../helpers/tolerance.ts";
import { filters, fixtureZpk, repeated } from "./fixture-filters.ts";

const peakOf = (v: readonly number[]): number => Math.max(...v.map(Math.abs));

describe("stepResponse / impulseResponse vs exact residue sums (mpmath)", () => {
  for (const f of filters) {
    it(`${f.name}: uniform grid (zero-order-hold recursion)`, () => {
      const h = fixtureZpk(f);
      const t = Float64Array.from(f.time.t);
      // Absolute floor relative to the peak: near zero crossings a relative test is meaningless.
      const sp = peakOf(f.time.exact.step);
      const ip = peakOf(f.time.exact.impulse);
      expectArrayClose(stepResponse(h, t), f.time.exact.step, { rel: 1e-9, abs: 1e-12 * sp, label: "step" });
      expectArrayClose(impulseResponse(h, t), f.time.exact.impulse, { rel: 1e-9, abs: 1e-12 * ip, label: "impulse" });
      // scipy.signal.step/impulse themselves agree with the exact values only to ~3e-8 of the peak
      expectArrayClose(stepResponse(toSections(h), t), f.time.scipy.step, { rel: 0, abs: 1e-7 * sp, label: "vs scipy step" });
    });

    it(`${f.name}: scattered times (one matrix exponential per point)`, () => {
      const h = fixtureZpk(f);
      const idx = [250, 3, 77, 0, 140];
      const t = Float64Array.from(idx, (i) => f.time.t[i]!);
      const sp = peakOf(f.time.exact.step);
      const ip = peakOf(f.time.exact.impulse);
      expectArrayClose(stepResponse(h, t), idx.map((i) => f.time.exact.step[i]!), { rel: 1e-9, abs: 1e-12 * sp });
      expectArrayClose(impulseResponse(toSections(h), t), idx.map((i) => f.time.exact.impulse[i]!), { rel: 1e-9, abs: 1e-12 * ip });
    });
  }

  for (const r of repeated) {
    it(`repeated poles: ${r.name} vs closed form`, () => {
      const h = fixtureZpk(r);
      const t = Float64Array.from(r.t);
      expectArrayClose(stepResponse(h, t), r.step, { rel: 1e-9, abs: 1e-13 });
      expectArrayClose(impulseResponse(h, t), r.impulse, { rel: 1e-9, abs: 1e-13 });
    });
  }

  it("first-order closed forms", () => {
    const h = zpk([], [{ re: -2, im: 0 }], 2);
    const t = Float64Array.of(0, 0.25, 0.5, 3);
    expectArrayClose(stepResponse(h, t), Array.from(t, (x) => 1 - Math.exp(-2 * x)), { rel: 1e-14, abs: 1e-16 });
    expectArrayClose(impulseResponse(h, t), Array.from(t, (x) => 2 * Math.exp(-2 * x)), { rel: 1e-14 });
    // a pure gain
    expect(Array.from(stepResponse(zpk([], [], 3), Float64Array.of(0, 1)))).toEqual([3, 3]);
  });
});

interface FigureCase {
  name: string;
  zeros: [number, number][];
  poles: [number, number][];
  gain: number;
  finalValue: number;
  overshootPercent: number;
  peakTimeS: number;
  riseTimeS: number;
  settlingTimeS: number;
}
const figures = loadFixture<{ cases: FigureCase[] }>("tf-step-figures.json");

describe("stepFigures vs mpmath", () => {
  for (const c of figures.cases) {
    it(c.name, () => {
      const f = stepFigures(fixtureZpk(c));
      expectClose(f.finalValue, c.finalValue, { rel: 1e-12 });
      expectClose(f.overshootPercent, c.overshootPercent, { rel: 1e-9 });
      expectClose(f.peakTimeS ?? Number.NaN, c.peakTimeS, { rel: 1e-9 });
      expectClose(f.riseTimeS ?? Number.NaN, c.riseTimeS, { rel: 1e-9, abs: 1e-15 });
      expectClose(f.settlingTimeS ?? Number.NaN, c.settlingTimeS, { rel: 1e-9 });
    });
  }

  it("second-order lowpass matches the textbook formulas (overshoot exp(-pi zeta / sqrt(1 - zeta^2)), peak at pi / wd)", () => {
    // K. Ogata, "Modern Control Engineering", 5th ed., 2010, sec. 5-3 (formulas from memory; standard results)
    for (const zeta of [0.2, 0.5, 0.7]) {
      const w0 = 1500;
      const wd = w0 * Math.sqrt(1 - zeta * zeta);
      const h = zpk([], [{ re: -zeta * w0, im: wd }, { re: -zeta * w0, im: -wd }], w0 * w0);
      const f = stepFigures(h);
      expectClose(f.overshootPercent, 100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), { rel: 1e-10 });
      expectClose(f.peakTimeS ?? 0, Math.PI / wd, { rel: 1e-10 });
    }
  });

  it("honours bandPercent and a given grid; reports null when not settled on it", () => {
    const h = zpk([], [{ re: -0.3, im: 1 }, { re: -0.3, im: -1 }], 1.09);
    const f2 = stepFigures(h);
    const f5 = stepFigures(h, { bandPercent: 5 });
    expect(f5.settlingTimeS!).toBeLessThan(f2.settlingTimeS!);
    // a grid that ends just after the first peak, still outside the band
    const short = stepFigures(h, { t: Float64Array.from({ length: 101 }, (_, i) => i * 0.035) });
    expect(short.settlingTimeS).toBeNull();
    expectClose(short.peakTimeS ?? 0, f2.peakTimeS ?? 1, { rel: 1e-9 });
    const mono = stepFigures(zpk([], [{ re: -1, im: 0 }], 1));
    expect(mono.overshootPercent).toBe(0);
    expect(mono.peakTimeS).toBeNull();
    expectClose(mono.riseTimeS ?? 0, Math.log(9), { rel: 1e-12 });
    expectClose(mono.settlingTimeS ?? 0, Math.log(50), { rel: 1e-12 });
  });
});

describe("time response validation", () => {
  const lp = zpk([], [{ re: -1, im: 0 }], 1);
  it("rejects unstable, improper and zero-DC systems and bad grids", () => {
    expect(() => stepResponse(zpk([], [{ re: 0.5, im: 0 }], 1), Float64Array.of(0))).toThrow(/left half-plane/);
    expect(() => impulseResponse(zpk([{ re: -1, im: 0 }], [], 1), Float64Array.of(0))).toThrow(/improper/);
    expect(() => stepResponse(lp, Float64Array.of(-1))).toThrow(/t\[0\]/);
    expect(() => stepFigures(zpk([{ re: 0, im: 0 }], [{ re: -1, im: 0 }], 1))).toThrow(/DC gain is zero/);
    expect(() => stepFigures(lp, { bandPercent: 0 })).toThrow(/bandPercent/);
    expect(() => stepFigures(lp, { t: Float64Array.of(0.1, 1) })).toThrow(/options\.t/);
    expect(() =>
      stepResponse({ gain: 1, sections: [{ order: 2, num: [0, 0, 1], den: [1, -1, 1], w0: 1, q: -1, kind: "lowpass" }] }, Float64Array.of(0)),
    ).toThrow(InvalidArgumentError);
  });
});
