import { describe, expect, it } from "vitest";
import { InvalidArgumentError } from "../../src/errors.ts";
import { eSeries, SERIES_NAMES, seriesTolerance } from "../../src/parts/index.ts";
import type { SeriesName } from "../../src/parts/index.ts";
import { loadFixture } from "../helpers/fixtures.ts";

// Tables: IEC 60063:2015, Tables 1 and 2, typed in from memory (src/parts/eseries.ts).
// Formula: numpy round(10^(i/N), d), scripts/reference/parts_eseries.py.
const fx = loadFixture<{ formula: Record<SeriesName, number[]> }>("parts-eseries-formula.json");

/** Entries of the typed-in table that differ from the rounded geometric formula, as [table, formula]. */
function departures(name: SeriesName): [number, number][] {
  const table = eSeries(name);
  const formula = fx.formula[name];
  expect(formula.length).toBe(table.length);
  const out: [number, number][] = [];
  table.forEach((v, i) => {
    const f = (formula[i] as number) / 100;
    if (Math.round(v * 100) !== formula[i]) out.push([v, f]);
  });
  return out;
}

describe("eSeries (IEC 60063:2015, typed in from memory)", () => {
  it("has N values per decade, ascending, in [1, 10)", () => {
    for (const name of SERIES_NAMES) {
      const v = eSeries(name);
      expect(v.length).toBe(Number(name.slice(1)));
      expect(v[0]).toBe(1);
      for (let i = 1; i < v.length; i++) expect(v[i] as number).toBeGreaterThan(v[i - 1] as number);
      expect(v[v.length - 1] as number).toBeLessThan(10);
      expect(Object.isFrozen(v)).toBe(true);
    }
  });

  it("gives the familiar short series", () => {
    expect(eSeries("E3")).toEqual([1, 2.2, 4.7]);
    expect(eSeries("E6")).toEqual([1, 1.5, 2.2, 3.3, 4.7, 6.8]);
    expect(eSeries("E12")).toEqual([1, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]);
  });

  it("departs from the rounded geometric formula exactly where the standard does", () => {
    expect(departures("E24")).toEqual([
      [2.7, 2.6],
      [3, 2.9],
      [3.3, 3.2],
      [3.6, 3.5],
      [3.9, 3.8],
      [4.3, 4.2],
      [4.7, 4.6],
      [8.2, 8.3],
    ]);
    expect(departures("E192")).toEqual([[9.2, 9.19]]);
    expect(departures("E96")).toEqual([]);
    expect(departures("E48")).toEqual([]);
    // E3-E12 inherit their departures from E24.
    expect(departures("E12")).toEqual([
      [2.7, 2.6],
      [3.3, 3.2],
      [3.9, 3.8],
      [4.7, 4.6],
      [8.2, 8.3],
    ]);
    expect(departures("E6")).toEqual([
      [3.3, 3.2],
      [4.7, 4.6],
    ]);
    expect(departures("E3")).toEqual([[4.7, 4.6]]);
  });

  it("nests: E3 in E6 in E12 in E24, E48 in E96 in E192 (every other value)", () => {
    const chains: [SeriesName, SeriesName][] = [
      ["E3", "E6"],
      ["E6", "E12"],
      ["E12", "E24"],
      ["E48", "E96"],
      ["E96", "E192"],
    ];
    for (const [small, big] of chains) {
      const b = eSeries(big);
      expect(eSeries(small)).toEqual(b.filter((_, i) => i % 2 === 0));
    }
  });

  it("shares only 1.0, 1.1, 1.3, 1.5, 2.0 and 7.5 between E24 and E96", () => {
    const e96 = new Set(eSeries("E96"));
    expect(eSeries("E24").filter((v) => e96.has(v))).toEqual([1, 1.1, 1.3, 1.5, 2, 7.5]);
  });

  it("rejects unknown names", () => {
    expect(() => eSeries("E5" as SeriesName)).toThrow(InvalidArgumentError);
    expect(() => eSeries("e12" as SeriesName)).toThrow(/eSeries: name: expected one of "E3"/);
  });
});

describe("seriesTolerance", () => {
  it("gives the usual tolerance of each series", () => {
    expect(SERIES_NAMES.map((n) => seriesTolerance(n))).toEqual([0.4, 0.2, 0.1, 0.05, 0.02, 0.01, 0.005]);
    expect(() => seriesTolerance("E100" as SeriesName)).toThrow(/seriesTolerance: name/);
  });
});
