import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { InvalidArgumentError } from "../../src/errors.ts";
import {
  eSeries,
  isInSeries,
  nextInSeries,
  SERIES_NAMES,
  seriesValuesInRange,
  snapToSeries,
  snapValues,
} from "../../src/parts/index.ts";
import type { SeriesName } from "../../src/parts/index.ts";
import { loadFixture } from "../helpers/fixtures.ts";

/** Independent member list: decimal strings of the table mantissas, decades k-1..k+1 around x. */
function membersNear(series: SeriesName, x: number): number[] {
  const e = Math.floor(Math.log10(x));
  const out: number[] = [];
  for (let d = e - 2; d <= e + 2; d++) {
    for (const m of eSeries(series)) out.push(Number(`${m}e${d}`));
  }
  return out.sort((a, b) => a - b);
}

const seriesArb = fc.constantFrom(...SERIES_NAMES);
const valueArb = fc.double({ min: -14, max: 11, noNaN: true }).map((e) => 10 ** e);

describe("snapToSeries", () => {
  it("snaps to the nearest member in log distance", () => {
    // Geometric mean of 4.3k and 4.7k is 4495.6: 4400 goes down, 4500 up.
    expect(snapToSeries(4400, { series: "E24" }).value).toBe(4300);
    expect(snapToSeries(4500, { series: "E24" }).value).toBe(4700);
    expect(snapToSeries(12.7e-9, { series: "E12" }).value).toBe(12e-9);
    // Across the decade edge: sqrt(9.1 * 10) = 9.539.
    expect(snapToSeries(9.5, { series: "E24" }).value).toBe(9.1);
    expect(snapToSeries(9.6, { series: "E24" }).value).toBe(10);
    expect(snapToSeries(0.95e-12, { series: "E24" }).value).toBe(0.91e-12);
    expect(snapToSeries(0.96e-12, { series: "E24" }).value).toBe(1e-12);
    expect(snapToSeries(3.2e5, { series: "E3" }).value).toBe(2.2e5); // sqrt(2.2 * 4.7) = 3.216
    expect(snapToSeries(3.3e5, { series: "E3" }).value).toBe(4.7e5);
  });

  it("builds members as exact decimals (4.7k is the double 4700)", () => {
    expect(snapToSeries(4690, { series: "E12" }).value).toBe(4700);
    expect(snapToSeries(8.19e-9, { series: "E12" }).value).toBe(8.2e-9);
    expect(snapToSeries(9.19e-7, { series: "E192" }).value).toBe(9.2e-7);
    expect(snapToSeries(1.0e-15, { series: "E96" }).value).toBe(1e-15);
  });

  it("returns the members around the value and the relative error", () => {
    const r = snapToSeries(12.7e-9, { series: "E12" });
    expect(r).toEqual({
      value: 12e-9,
      ideal: 12.7e-9,
      relativeError: (12e-9 - 12.7e-9) / 12.7e-9,
      series: "E12",
      tolerance: 0.1,
      mode: "nearest",
      down: 12e-9,
      up: 15e-9,
    });
    expect(Object.isFrozen(r)).toBe(true);
  });

  it("goes up or down when asked", () => {
    expect(snapToSeries(4400, { series: "E24", mode: "up" }).value).toBe(4700);
    expect(snapToSeries(4600, { series: "E24", mode: "down" }).value).toBe(4300);
    expect(snapToSeries(9.2, { series: "E24", mode: "up" }).value).toBe(10);
    expect(snapToSeries(1.05, { series: "E12", mode: "down" }).value).toBe(1);
    expect(snapToSeries(0.99, { series: "E12", mode: "down" }).value).toBe(0.82);
  });

  it("keeps a member unchanged in every mode", () => {
    for (const mode of ["nearest", "up", "down"] as const) {
      const r = snapToSeries(4700, { series: "E12", mode });
      expect([r.value, r.down, r.up, r.relativeError]).toEqual([4700, 4700, 4700, 0]);
    }
  });

  it("breaks exact ties towards the lower value", () => {
    // Look for doubles x with x / a === b / x exactly (an exact tie in the comparison used).
    let ties = 0;
    for (const name of ["E24", "E96"] as const) {
      const v = eSeries(name);
      for (let i = 0; i + 1 < v.length; i++) {
        const a = v[i] as number;
        const b = v[i + 1] as number;
        let x = Math.sqrt(a * b);
        for (let s = 0; s < 8; s++, x = x * (1 + Number.EPSILON)) {
          if (x / a === b / x) {
            ties++;
            expect(snapToSeries(x, { series: name }).value).toBe(a);
          }
        }
      }
    }
    expect(ties).toBeGreaterThan(0);
  });

  it("every snapped value is a member, none is nearer, and up >= value >= down (fast-check)", () => {
    fc.assert(
      fc.property(valueArb, seriesArb, (x, series) => {
        const n = snapToSeries(x, { series });
        const up = snapToSeries(x, { series, mode: "up" });
        const down = snapToSeries(x, { series, mode: "down" });
        const members = membersNear(series, x);
        expect(members).toContain(n.value);
        expect(members).toContain(up.value);
        expect(members).toContain(down.value);
        expect(up.value).toBeGreaterThanOrEqual(x);
        expect(down.value).toBeLessThanOrEqual(x);
        expect(n.value === up.value || n.value === down.value).toBe(true);
        // No member strictly between down and up.
        expect(members.filter((m) => m > down.value && m < up.value)).toEqual([]);
        // No member nearer in log distance.
        const d = Math.abs(Math.log(n.value / x));
        for (const m of members) expect(Math.abs(Math.log(m / x))).toBeGreaterThanOrEqual(d - 1e-15);
        expect(isInSeries(n.value, series)).toBe(true);
      }),
      { numRuns: 1500 },
    );
  });

  it("is decade-invariant: snap(10 x) is the same mantissa one decade up (fast-check)", () => {
    fc.assert(
      fc.property(valueArb, seriesArb, fc.integer({ min: -6, max: 6 }), (x, series, shift) => {
        const a = snapToSeries(x, { series });
        const b = snapToSeries(x * 10 ** shift, { series });
        const [ma, ea] = a.value.toExponential(2).split("e");
        const expected = Number(`${ma}e${Number(ea) + shift}`);
        expect(b.value).toBe(expected);
      }),
      { numRuns: 1500 },
    );
  });

  it("handles decade and binade edges from 1e-29 to 1e29", () => {
    const f = new Float64Array(1);
    const u = new BigUint64Array(f.buffer);
    const neighbours = (x: number): number[] => {
      f[0] = x;
      const bits = u[0] as bigint;
      u[0] = bits - 1n;
      const below = f[0] as number;
      u[0] = bits + 1n;
      const above = f[0] as number;
      return [below, x, above];
    };
    const xs: number[] = [];
    for (let e = -29; e <= 29; e++) xs.push(...neighbours(Number(`1e${e}`)), ...neighbours(Number(`9.76e${e}`)));
    for (let b = -96; b <= 96; b += 1) xs.push(...neighbours(2 ** b));
    for (const series of SERIES_NAMES) {
      for (const x of xs) {
        const members = membersNear(series, x);
        const down = snapToSeries(x, { series, mode: "down" }).value;
        const up = snapToSeries(x, { series, mode: "up" }).value;
        const below = members.filter((m) => m <= x);
        const above = members.filter((m) => m >= x);
        expect(down, `${series} down ${x}`).toBe(below[below.length - 1]);
        expect(up, `${series} up ${x}`).toBe(above[0]);
        expect(snapValues([x], { series, mode: "down" })[0]).toBe(down);
        expect(snapValues([x], { series, mode: "up" })[0]).toBe(up);
      }
    }
  });

  it("rejects bad input with the field named", () => {
    expect(() => snapToSeries(0, { series: "E12" })).toThrow(/snapToSeries: value/);
    expect(() => snapToSeries(-1, { series: "E12" })).toThrow(InvalidArgumentError);
    expect(() => snapToSeries(NaN, { series: "E12" })).toThrow(InvalidArgumentError);
    expect(() => snapToSeries(Infinity, { series: "E12" })).toThrow(InvalidArgumentError);
    expect(() => snapToSeries(1e31, { series: "E12" })).toThrow(/1e\+?30/);
    expect(() => snapToSeries(1, { series: "E7" as SeriesName })).toThrow(/options.series: expected one of/);
    expect(() => snapToSeries(1, { series: "E12", mode: "round" as "up" })).toThrow(/options.mode/);
    expect(() => snapToSeries(1, undefined as unknown as { series: "E12" })).toThrow(/options.series/);
  });
});

describe("snapValues", () => {
  it("matches snapToSeries element by element (fast-check)", () => {
    fc.assert(
      fc.property(fc.array(valueArb, { maxLength: 50 }), seriesArb, fc.constantFrom("nearest", "up", "down" as const), (xs, series, mode) => {
        const out = snapValues(xs, { series, mode });
        expect(Array.from(out)).toEqual(xs.map((x) => snapToSeries(x, { series, mode }).value));
      }),
      { numRuns: 200 },
    );
  });
  it("names the first bad element", () => {
    expect(() => snapValues([1, 2, -3], { series: "E12" })).toThrow(/snapValues: values\[2\]/);
    expect(() => snapValues(Float64Array.of(1, NaN), { series: "E12" })).toThrow(/values\[1\]/);
  });
});

describe("nextInSeries", () => {
  it("steps strictly up or down, across decades", () => {
    expect(nextInSeries(4700, { series: "E12" })).toBe(5600);
    expect(nextInSeries(4700, { series: "E12", direction: "down" })).toBe(3900);
    expect(nextInSeries(4800, { series: "E12", direction: "down" })).toBe(4700);
    expect(nextInSeries(4800, { series: "E12" })).toBe(5600);
    expect(nextInSeries(8.2e-9, { series: "E12" })).toBe(1e-8);
    expect(nextInSeries(1e-9, { series: "E6", direction: "down" })).toBe(6.8e-10);
    expect(nextInSeries(9.76, { series: "E96" })).toBe(10);
  });
  it("rejects a bad direction", () => {
    expect(() => nextInSeries(1, { series: "E12", direction: "sideways" as "up" })).toThrow(/options.direction/);
  });
});

describe("seriesValuesInRange", () => {
  it("lists members across decades, bounds included", () => {
    const r = seriesValuesInRange("E12", { min: 10, max: 1e6 });
    expect(r.length).toBe(5 * 12 + 1);
    expect(r[0]).toBe(10);
    expect(r[r.length - 1]).toBe(1e6);
    expect(r).toContain(4700);
    expect(r).toContain(820e3);
    const c = seriesValuesInRange("E6", { min: 10e-12, max: 1e-6 });
    expect(c.length).toBe(5 * 6 + 1);
    expect(c.slice(0, 7)).toEqual([10e-12, 15e-12, 22e-12, 33e-12, 47e-12, 68e-12, 100e-12]);
    expect(seriesValuesInRange("E24", { min: 4.7e3, max: 4.7e3 })).toEqual([4700]);
    expect(seriesValuesInRange("E24", { min: 4.5e3, max: 5.2e3 })).toEqual([4700, 5100]);
  });
  it("rejects empty and impossible ranges", () => {
    expect(() => seriesValuesInRange("E12", { min: 2e3, max: 1e3 })).toThrow(/range: the range is empty/);
    expect(() => seriesValuesInRange("E12", { min: 1.01, max: 1.1 })).toThrow(/no E12 value lies in \[1.01, 1.1\]; widen it to include 1 or 1.2/);
    expect(() => seriesValuesInRange("E12", { min: 0, max: 1 })).toThrow(/range.min/);
    expect(() => seriesValuesInRange("E12", { min: 1, max: Infinity })).toThrow(/range.max/);
    expect(() => seriesValuesInRange("E12", { min: 1e-20, max: 1e20 })).toThrow(/30 decades/);
    expect(() => seriesValuesInRange("E12", undefined as unknown as { min: 1; max: 2 })).toThrow(/range/);
    expect(() => seriesValuesInRange("X" as SeriesName, { min: 1, max: 2 })).toThrow(/series/);
  });
});

describe("isInSeries", () => {
  it("recognises members in any decade", () => {
    expect(isInSeries(4700, "E12")).toBe(true);
    expect(isInSeries(4.7e-12, "E6")).toBe(true);
    expect(isInSeries(4300, "E12")).toBe(false);
    expect(isInSeries(4300, "E24")).toBe(true);
    expect(isInSeries(9.2, "E192")).toBe(true);
    expect(isInSeries(9.19, "E192")).toBe(false);
    expect(isInSeries(0, "E12")).toBe(false);
    expect(isInSeries(NaN, "E12")).toBe(false);
  });
});

describe("snapToSeries against numpy (searchsorted on log10, scripts/reference/parts_snap.py)", () => {
  const fx = loadFixture<{ cases: Record<string, { x: number; nearest: number; up: number; down: number }[]> }>(
    "parts-snap.json",
  );
  for (const name of ["E48", "E96"] as const) {
    const cases = fx.cases[name] ?? [];
    it(`agrees on all ${cases.length} ${name} cases in every mode`, () => {
      expect(cases.length).toBeGreaterThan(300);
      for (const c of cases) {
        expect(snapToSeries(c.x, { series: name }).value, `${c.x}`).toBe(c.nearest);
        expect(snapToSeries(c.x, { series: name, mode: "up" }).value).toBe(c.up);
        expect(snapToSeries(c.x, { series: name, mode: "down" }).value).toBe(c.down);
      }
    });
  }
});
