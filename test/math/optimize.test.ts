import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { geometricBisect, goldenMax } from "../../src/math/optimize.ts";
import { expectClose } from "../helpers/tolerance.ts";

describe("goldenMax", () => {
  it("finds the maximum of a parabola and of sin on [0, 3]", () => {
    expectClose(goldenMax((x) => -((x - 1) ** 2), [0, 3], { iterations: 200, width: 1e-12 }), 1, { abs: 1e-7 });
    expectClose(goldenMax(Math.sin, [0, 3], { iterations: 200, width: 1e-12 }), Math.PI / 2, { abs: 1e-7 });
  });

  it("finds a maximum at an end of the interval", () => {
    expectClose(goldenMax((x) => x, [2, 5], { iterations: 200, width: 1e-12 }), 5, { abs: 1e-9 });
  });

  it("shrinks the interval by the golden ratio per step", () => {
    let calls = 0;
    goldenMax(
      (x) => {
        calls++;
        return -Math.abs(x - 0.3);
      },
      [0, 1],
      { iterations: 1000, width: 1e-6 },
    );
    // 0.618^k < 1e-6 at k = 29: two start evaluations plus one per step
    expect(calls).toBe(2 + Math.ceil(Math.log(1e-6) / Math.log((Math.sqrt(5) - 1) / 2)));
  });

  it("property: on a unimodal |x - m| peak the result is within the final width of m", () => {
    fc.assert(
      fc.property(fc.double({ min: -50, max: 50, noNaN: true }), fc.double({ min: 0.1, max: 20, noNaN: true }), (m, w) => {
        const got = goldenMax((x) => -Math.abs(x - m), [m - w, m + 0.6 * w], { iterations: 300, width: 1e-10 });
        expect(Math.abs(got - m)).toBeLessThan(2e-10);
      }),
      { seed: 5, numRuns: 200 },
    );
  });
});

describe("geometricBisect", () => {
  it("brackets sqrt(2) to 1e-13 relative", () => {
    const { lo, hi } = geometricBisect((x) => x * x > 2, 1, 2, { relWidth: 1e-13, maxIterations: 200 });
    expect(lo).toBeLessThanOrEqual(Math.SQRT2);
    expect(hi).toBeGreaterThanOrEqual(Math.SQRT2);
    expect(hi / lo - 1).toBeLessThanOrEqual(1e-13);
  });

  it("halves the log-width each step and honours maxIterations", () => {
    const { lo, hi } = geometricBisect((x) => x > 5, 1, 1e8, { relWidth: 0, maxIterations: 3 });
    // log10 width 8 -> 4 -> 2 -> 1 decade after three halvings
    expectClose(Math.log10(hi / lo), 1, { abs: 1e-12 });
  });

  it("property: the bracket always contains the threshold and meets the width", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-6, max: 1e6, noNaN: true }),
        fc.double({ min: 1.01, max: 1e4, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (lo, ratio, where) => {
          const hi = lo * ratio;
          const t = lo * ratio ** where;
          const r = geometricBisect((x) => x >= t, lo, hi, { relWidth: 1e-9, maxIterations: Infinity });
          expect(r.lo).toBeLessThanOrEqual(t);
          expect(r.hi).toBeGreaterThanOrEqual(t * (1 - 1e-15));
          expect(r.hi / r.lo - 1).toBeLessThanOrEqual(1e-9);
        },
      ),
      { seed: 3, numRuns: 300 },
    );
  });
});
