import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { neighbours } from "../../src/design/resistor-search.ts";
import { isInSeries, nextInSeries, snapToSeries, type SeriesName } from "../../src/parts/index.ts";
import { nearestMember } from "../../src/parts/snap.ts";

/** The search's neighbours from the checked calls, one by one (what `neighbours` returned before it read the series positions directly). */
function byCheckedCalls(x: number, series: SeriesName, spread: number): number[] {
  const down1 = isInSeries(x, series) ? x : snapToSeries(x, { series, mode: "down" }).value;
  const up1 = isInSeries(x, series) ? x : snapToSeries(x, { series, mode: "up" }).value;
  const set = new Set<number>([down1, up1]);
  let d = down1;
  let u = up1;
  for (let i = 1; i < spread; i++) {
    d = nextInSeries(d, { series, direction: "down" });
    u = nextInSeries(u, { series, direction: "up" });
    set.add(d);
    set.add(u);
  }
  return [...set].sort((a, b) => a - b);
}

const SERIES: SeriesName[] = ["E3", "E6", "E12", "E24", "E48", "E96", "E192"];

describe("neighbours (the value search's preferred values around a part)", () => {
  it("are the values of the checked snapping and stepping calls, bit for bit, off and on the series, across decades and at decade edges", () => {
    fc.assert(
      fc.property(fc.constantFrom(...SERIES), fc.double({ min: -13, max: 8, noNaN: true }), fc.integer({ min: 1, max: 4 }), fc.boolean(), (series, e, spread, onSeries) => {
        const x0 = 10 ** e;
        const x = onSeries ? snapToSeries(x0, { series, mode: "nearest" }).value : x0;
        expect(neighbours(x, series, spread)).toEqual(byCheckedCalls(x, series, spread));
      }),
      { numRuns: 3000 },
    );
    for (const series of SERIES) {
      for (let k = -12; k <= 8; k++) {
        for (const x of [10 ** k, 10 ** k * (1 - 1e-15), 10 ** k * (1 + 1e-15), 9.999999999 * 10 ** k, 1.0000001 * 10 ** k]) {
          for (const spread of [1, 2, 3]) expect(neighbours(x, series, spread)).toEqual(byCheckedCalls(x, series, spread));
        }
      }
    }
  });

  it("throw as the checked calls do for a value no part can have", () => {
    expect(() => neighbours(-1, "E12", 2)).toThrow(/snapToSeries/);
    expect(() => byCheckedCalls(-1, "E12", 2)).toThrow(/snapToSeries/);
  });
});

describe("nearestMember (the design loop's unchecked nearest snap)", () => {
  it("is snapToSeries' nearest member, bit for bit, and null outside the part range", () => {
    fc.assert(
      fc.property(fc.constantFrom(...SERIES), fc.double({ min: -29, max: 29, noNaN: true }), (series, e) => {
        const x = 10 ** e;
        expect(nearestMember(x, series)).toBe(snapToSeries(x, { series, mode: "nearest" }).value);
      }),
      { numRuns: 3000 },
    );
    for (const series of SERIES) for (let k = -12; k <= 8; k++) for (const x of [10 ** k, 10 ** k * (1 - 1e-15), 1.2 * 10 ** k * (1 + 1e-15)]) expect(nearestMember(x, series)).toBe(snapToSeries(x, { series, mode: "nearest" }).value);
    expect(nearestMember(1e-31, "E12")).toBeNull();
    expect(nearestMember(2e30, "E12")).toBeNull();
    expect(nearestMember(NaN, "E12")).toBeNull();
  });
});
