import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { InvalidArgumentError } from "../../src/errors.ts";
import { bestCombination, bestRatio, eSeries, isInSeries } from "../../src/parts/index.ts";
import type { SeriesName } from "../../src/parts/index.ts";

/** All members of a series from 10^lo to 10^hi (decimal strings, independent of src). */
function members(series: SeriesName, lo: number, hi: number): number[] {
  const out: number[] = [];
  for (let d = lo; d <= hi; d++) for (const m of eSeries(series)) out.push(Number(`${m}e${d}`));
  return out;
}

/** Brute force over every pair: smallest |error| of series pairs (both parts < T) and parallel pairs (both > T). */
function bruteForce(t: number, a: SeriesName, b: SeriesName): { series: number; parallel: number } {
  const e = Math.floor(Math.log10(t));
  const A = members(a, e - 4, e + 4);
  const B = members(b, e - 4, e + 4);
  let s = Infinity;
  let p = Infinity;
  for (const x of A) {
    for (const y of B) {
      if (x < t && y < t) s = Math.min(s, Math.abs((x + y - t) / t));
      if (x > t && y > t) p = Math.min(p, Math.abs(((x * y) / (x + y) - t) / t));
    }
  }
  return { series: s, parallel: p };
}

describe("bestCombination", () => {
  it("finds a series pair for a value between E24 steps", () => {
    const r = bestCombination(12_740, { series: "E24" });
    expect(r.achievable).toBe(true);
    expect(r.best.relativeError).toBeLessThanOrEqual(0.001);
    expect(r.best.series).toEqual(["E24", "E24"]);
    const [a, b] = r.best.parts;
    expect(isInSeries(a, "E24") && isInSeries(b, "E24")).toBe(true);
    expect(r.best.value).toBe(r.best.kind === "series" ? a + b : (a * b) / (a + b));
  });

  it("hits a member exactly with two equal parts when that is best", () => {
    // 2350 = 4700 || 4700 exactly, and also 2200 + 150.
    const r = bestCombination(2350, { series: "E12", kinds: ["parallel"] });
    expect(r.best).toEqual({ kind: "parallel", parts: [4700, 4700], series: ["E12", "E12"], value: 2350, relativeError: 0 });
    const s = bestCombination(2350, { series: "E12", kinds: ["series"] });
    expect(s.best.relativeError).toBe(0);
    expect(s.best.parts).toEqual([150, 2200]);
  });

  it("matches a brute force over all pairs (fast-check, same and mixed series)", () => {
    const small = fc.constantFrom<SeriesName>("E3", "E6", "E12", "E24");
    fc.assert(
      fc.property(fc.double({ min: -9, max: 6, noNaN: true }), small, small, (e, a, b) => {
        const t = 10 ** e;
        const ref = bruteForce(t, a, b);
        const s = bestCombination(t, { series: a, otherSeries: b, kinds: ["series"], maxError: 1 });
        const p = bestCombination(t, { series: a, otherSeries: b, kinds: ["parallel"], maxError: 1 });
        expect(Math.abs(s.best.relativeError)).toBeLessThanOrEqual(ref.series + 1e-15);
        expect(Math.abs(p.best.relativeError)).toBeLessThanOrEqual(ref.parallel + 1e-15);
        for (const r of [s, p]) {
          expect(isInSeries(r.best.parts[0], a)).toBe(true);
          expect(isInSeries(r.best.parts[1], b)).toBe(true);
        }
        const both = bestCombination(t, { series: a, otherSeries: b, maxError: 1 });
        expect(Math.abs(both.best.relativeError)).toBe(
          Math.min(Math.abs(s.best.relativeError), Math.abs(p.best.relativeError)),
        );
      }),
      { numRuns: 40 },
    );
  });

  it("matches a brute force for E96 at a few targets", () => {
    for (const t of [1234, 3.3e-9 * 1.003, 77.7, 5.5e5]) {
      const ref = bruteForce(t, "E96", "E96");
      const r = bestCombination(t, { series: "E96", maxError: 1 });
      expect(Math.abs(r.best.relativeError)).toBeLessThanOrEqual(Math.min(ref.series, ref.parallel) + 1e-15);
    }
  });

  it("returns data, not an error, when no pair is close enough", () => {
    const r = bestCombination(1.234e3, { series: "E3", maxError: 1e-6 });
    expect(r.achievable).toBe(false);
    expect(r.maxError).toBe(1e-6);
    expect(Math.abs(r.best.relativeError)).toBeGreaterThan(1e-6);
  });

  it("rejects bad input", () => {
    expect(() => bestCombination(0, { series: "E12" })).toThrow(/bestCombination: target/);
    expect(() => bestCombination(1e29, { series: "E12" })).toThrow(/1e-27 to 1e27/);
    expect(() => bestCombination(1, { series: "E12", kinds: [] })).toThrow(/options.kinds/);
    expect(() => bestCombination(1, { series: "E12", kinds: ["bridge" as "series"] })).toThrow(/options.kinds\[0\]/);
    expect(() => bestCombination(1, { series: "E12", otherSeries: "E13" as SeriesName })).toThrow(/options.otherSeries/);
    expect(() => bestCombination(1, { series: "E12", maxError: 0 })).toThrow(InvalidArgumentError);
  });
});

/** Brute force over a in one decade and b in a wide span of decades. */
function bruteRatio(r: number, a: SeriesName, b: SeriesName, mode: "nearest" | "atLeast" | "atMost"): number {
  const e = Math.floor(Math.log10(1 / r));
  let best = Infinity;
  for (const x of eSeries(a)) {
    for (const y of members(b, e - 2, e + 2)) {
      const q = x / y;
      if (mode === "atLeast" && q < r) continue;
      if (mode === "atMost" && q > r) continue;
      best = Math.min(best, Math.abs(Math.log(q / r)));
    }
  }
  return best;
}

describe("bestRatio", () => {
  it("finds the capacitor ratio of a unity-gain Sallen-Key stage (>= 4 Q^2)", () => {
    const q = 0.7071;
    const r = bestRatio(4 * q * q, { series: "E12", mode: "atLeast" });
    expect(r.ratio).toBeGreaterThanOrEqual(4 * q * q);
    expect([r.a, r.b]).toEqual([6.8, 3.3]);
    expect(r.relativeError).toBeCloseTo(6.8 / 3.3 / (4 * q * q) - 1, 15);
  });

  it("hits exact ratios", () => {
    expect(bestRatio(10, { series: "E24" })).toMatchObject({ a: 1, b: 0.1, ratio: 10, relativeError: 0, achievable: true });
    expect(bestRatio(2, { series: "E24" }).relativeError).toBe(0);
  });

  it("matches a brute force (fast-check)", () => {
    const names = fc.constantFrom<SeriesName>("E6", "E12", "E24", "E96");
    fc.assert(
      fc.property(
        fc.double({ min: -4, max: 4, noNaN: true }),
        names,
        names,
        fc.constantFrom("nearest", "atLeast", "atMost" as const),
        (e, a, b, mode) => {
          const target = 10 ** e;
          const r = bestRatio(target, { series: a, otherSeries: b, mode });
          expect(Math.abs(Math.log(r.ratio / target))).toBeLessThanOrEqual(bruteRatio(target, a, b, mode) + 1e-14);
          if (mode === "atLeast") expect(r.ratio).toBeGreaterThanOrEqual(target);
          if (mode === "atMost") expect(r.ratio).toBeLessThanOrEqual(target);
          expect(isInSeries(r.a, a) && isInSeries(r.b, b)).toBe(true);
          expect(r.a).toBeGreaterThanOrEqual(1);
          expect(r.a).toBeLessThan(10);
          expect(r.ratio).toBe(r.a / r.b);
          expect(r.achievable).toBe(Math.abs(r.relativeError) <= r.maxError);
        },
      ),
      { numRuns: 150 },
    );
  });

  it("rejects bad input", () => {
    expect(() => bestRatio(0, { series: "E12" })).toThrow(/bestRatio: ratio/);
    expect(() => bestRatio(1e13, { series: "E12" })).toThrow(/1e-12 to 1e12/);
    expect(() => bestRatio(2, { series: "E12", mode: "exact" as "nearest" })).toThrow(/options.mode/);
  });
});
