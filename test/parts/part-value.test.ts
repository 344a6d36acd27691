import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { InvalidArgumentError } from "../../src/errors.ts";
import { partValue, seriesValuesInRange, SERIES_NAMES } from "../../src/parts/index.ts";
import type { SeriesName } from "../../src/parts/index.ts";
import { parseValue } from "../../src/units/index.ts";

describe("partValue", () => {
  it("describes a resistor with bounds and labels", () => {
    expect(partValue(4700, { series: "E24" })).toEqual({
      value: 4700,
      kind: "resistor",
      series: "E24",
      tolerance: 0.05,
      min: 4700 * 0.95,
      max: 4700 * 1.05,
      label: "4.7 k\u03a9",
      rkm: "4k7",
    });
  });

  it("describes a capacitor and honours an explicit tolerance", () => {
    const c = partValue(1e-8, { series: "E6", kind: "capacitor", tolerance: 0.01 });
    expect([c.label, c.rkm, c.tolerance, c.min, c.max]).toEqual(["10 nF", "10n", 0.01, 1e-8 * 0.99, 1e-8 * 1.01]);
    expect(partValue(9.2e-7, { series: "E192", kind: "capacitor" }).rkm).toBe("920n");
    expect(partValue(0.47, { series: "E12" }).rkm).toBe("R47");
    expect(partValue(1.21e5, { series: "E96" }).label).toBe("121 k\u03a9");
  });

  it("labels read back to the value for every member in 1 Ω - 10 MΩ and 1 pF - 10 µF", () => {
    for (const name of SERIES_NAMES) {
      for (const r of seriesValuesInRange(name, { min: 1, max: 1e7 })) {
        const p = partValue(r, { series: name });
        expect(parseValue(p.label, { unit: "\u03a9" })).toBe(r);
        expect(parseValue(p.rkm, { unit: "\u03a9" })).toBe(r);
      }
      for (const c of seriesValuesInRange(name, { min: 1e-12, max: 1e-5 })) {
        const p = partValue(c, { series: name, kind: "capacitor" });
        expect(parseValue(p.label, { unit: "F" })).toBe(c);
        expect(parseValue(p.rkm, { unit: "F" })).toBe(c);
      }
    }
  });

  it("keeps min <= value <= max (fast-check)", () => {
    fc.assert(
      fc.property(fc.constantFrom(...SERIES_NAMES), fc.integer({ min: -12, max: 9 }), fc.double({ min: 1e-4, max: 0.5, noNaN: true }), (s, d, tol) => {
        const v = Number(`1e${d}`);
        const p = partValue(v, { series: s as SeriesName, tolerance: tol });
        expect(p.min).toBeLessThan(p.value);
        expect(p.max).toBeGreaterThan(p.value);
      }),
      { numRuns: 100 },
    );
  });

  it("rejects values that are not members, and bad options", () => {
    expect(() => partValue(4400, { series: "E24" })).toThrow(/expected a member of E24; the nearest is 4300/);
    expect(() => partValue(-4700, { series: "E24" })).toThrow(InvalidArgumentError);
    expect(() => partValue(4700, { series: "E24", tolerance: 0 })).toThrow(/options.tolerance/);
    expect(() => partValue(4700, { series: "E24", tolerance: 0.6 })).toThrow(/options.tolerance/);
    expect(() => partValue(4700, { series: "E24", kind: "inductor" as "resistor" })).toThrow(/options.kind/);
    expect(() => partValue(4700, { series: "E25" as SeriesName })).toThrow(/options.series/);
    expect(() => partValue(4700, { series: "E24", kind: "capacitor" })).toThrow(/below 1000 F/);
  });
});
