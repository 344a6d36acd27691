import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { linearTicks, logTicks } from "../../../src/report/plot/ticks.ts";
import { buildAxis } from "../../../src/report/plot/axes.ts";
import { InvalidArgumentError } from "../../../src/errors.ts";
import { thrownBy } from "../../helpers/throws.ts";

/** Whether x is 1, 2 or 5 times a power of ten (to 1e-9 relative). */
function is125(x: number): boolean {
  const d = Math.floor(Math.log10(x) + 1e-12);
  const m = x / 10 ** d;
  return [1, 2, 5, 10].some((k) => Math.abs(m - k) < 1e-9 * k);
}

describe("linearTicks", () => {
  it("steps by 1, 2 or 5 times a power of ten on spans from 1e-3 to 1e9, covering the range with 3 to 21 ticks", () => {
    fc.assert(
      fc.property(fc.integer({ min: -3, max: 9 }), fc.double({ min: 0.05, max: 1, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), fc.integer({ min: 2, max: 20 }), (e, frac, off, intervals) => {
        const span = frac * 10 ** e;
        const lo = off * span;
        const hi = lo + span;
        const t = linearTicks(lo, hi, { intervals });
        expect(is125(t.step)).toBe(true);
        // a bound within 1e-9 of a step from a tick counts as on it
        expect(t.min).toBeLessThanOrEqual(lo + 1e-9 * t.step);
        expect(t.max).toBeGreaterThanOrEqual(hi - 1e-9 * t.step);
        expect(t.major.length).toBeGreaterThanOrEqual(2);
        expect(t.major.length).toBeLessThanOrEqual(2 * intervals + 2);
        for (let i = 1; i < t.major.length; i++) expect((t.major[i] as number) - (t.major[i - 1] as number)).toBeCloseTo(t.step, 12 - e);
        for (const v of t.major) expect(Math.abs(v / t.step - Math.round(v / t.step))).toBeLessThan(1e-6);
      }),
      { numRuns: 300 },
    );
  });

  it("gives round dB ticks on negative ranges (not -15, -39, -64)", () => {
    expect(linearTicks(-87.3, 12.1).major).toEqual([-100, -80, -60, -40, -20, 0, 20]);
    expect(linearTicks(-64.2, -15.1, { intervals: 5 }).major).toEqual([-70, -60, -50, -40, -30, -20, -10]);
    expect(linearTicks(-0.37, 0.05, { intervals: 4 }).major).toEqual([-0.4, -0.2, 0, 0.2]);
    expect(linearTicks(-0.37, 0.05, { intervals: 6 }).major).toEqual([-0.4, -0.3, -0.2, -0.1, 0, 0.1]);
    expect(linearTicks(-3, -1.3e-3, { intervals: 6 }).step).toBe(0.5);
  });

  it("writes tick values without binary noise", () => {
    expect(linearTicks(0, 0.3, { intervals: 3 }).major).toEqual([0, 0.1, 0.2, 0.3]);
    expect(linearTicks(0, 1e9).major).toEqual([0, 2e8, 4e8, 6e8, 8e8, 1e9]);
    expect(linearTicks(0, 1e-3).major).toEqual([0, 0.0002, 0.0004, 0.0006, 0.0008, 0.001]);
  });

  it("puts minor ticks at fifths of a 1 or 5 step and quarters of a 2 step", () => {
    expect(linearTicks(0, 10, { intervals: 2 }).minor).toEqual([1, 2, 3, 4, 6, 7, 8, 9]);
    expect(linearTicks(0, 4, { intervals: 2 }).minor).toEqual([0.5, 1, 1.5, 2.5, 3, 3.5]);
  });

  it("names the bad argument", () => {
    expect(thrownBy(() => linearTicks(1, 1), InvalidArgumentError).path).toBe("max");
    expect(thrownBy(() => linearTicks(Number.NaN, 1), InvalidArgumentError).path).toBe("min");
    expect(thrownBy(() => linearTicks(0, 1, { intervals: 1 }), InvalidArgumentError).path).toBe("options.intervals");
  });
});

describe("logTicks", () => {
  it("has the decades as major ticks and 2..9 times each as minor ticks, from 1e-3 to 1e9", () => {
    const t = logTicks(1e-3, 1e9);
    expect(t.major).toHaveLength(13);
    expect(t.major[0]).toBe(1e-3);
    expect(t.major[12]).toBe(1e9);
    expect(t.minor).toHaveLength(12 * 8);
    expect(t.minor.slice(0, 8)).toEqual([0.002, 0.003, 0.004, 0.005, 0.006, 0.007, 0.008, 0.009]);
    expect(t.labelled).toEqual(t.major);
  });

  it("widens the range to 1, 2 or 5 times a power of ten", () => {
    const t = logTicks(120, 48000);
    expect([t.min, t.max]).toEqual([100, 50000]);
    expect(t.major).toEqual([100, 1000, 10000]);
    expect(logTicks(2.3e6, 4.1e8).min).toBe(2e6);
    expect(logTicks(2.3e6, 4.1e8).max).toBe(5e8);
  });

  it("labels 2 and 5 times each decade over less than two decades, every line over less than half a decade", () => {
    expect(logTicks(300, 2000).labelled).toEqual([200, 500, 1000, 2000]);
    expect(logTicks(1.1, 2.9).labelled).toEqual([1, 2, 5]);
    expect(logTicks(2.1, 4.9).labelled).toEqual([2, 3, 4, 5]);
  });

  it("names the bad argument", () => {
    expect(thrownBy(() => logTicks(0, 1), InvalidArgumentError).path).toBe("min");
    expect(thrownBy(() => logTicks(10, 5), InvalidArgumentError).path).toBe("max");
  });
});

describe("buildAxis", () => {
  it("takes one SI prefix for a linear axis and names it in the title", () => {
    const a = buildAxis({ scale: "linear", min: 0, max: 2.6e-4, title: "Group delay", unit: "s", prefixed: true }, 300, 12, 45);
    expect(a.title).toBe("Group delay (\u00b5s)");
    expect(a.major.map((t) => t.label)).toEqual(["0", "50", "100", "150", "200", "250", "300"]);
  });

  it("steps degrees by 15, 30, 45, 90, 180 or 360", () => {
    const a = buildAxis({ scale: "linear", min: -400, max: 10, title: "Phase", unit: "\u00b0", angular: true }, 300, 12, 45);
    expect(a.major.map((t) => t.value)).toEqual([-450, -360, -270, -180, -90, 0, 90]);
    expect(a.major[0]?.label).toBe("\u2212450");
  });

  it("labels a log frequency axis with prefixes and leaves the unit to the title", () => {
    const a = buildAxis({ scale: "log", min: 100, max: 50000, title: "Frequency", unit: "Hz" }, 600, 12, 45);
    expect(a.title).toBe("Frequency (Hz)");
    expect(a.major.map((t) => t.label)).toEqual(["100", "1k", "10k"]);
    expect(a.fraction(100)).toBe(0);
    expect(a.fraction(50000)).toBeCloseTo(1, 12);
  });

  it("labels every other decade when the decades are too narrow for their labels", () => {
    const a = buildAxis({ scale: "log", min: 1e-3, max: 1e9, title: "Frequency", unit: "Hz" }, 200, 12, 45);
    const labelled = a.major.filter((t) => t.label !== null).length;
    expect(labelled).toBeLessThan(13);
    expect(labelled).toBeGreaterThanOrEqual(3);
  });
});
