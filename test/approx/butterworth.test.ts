import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { butterworth } from "../../src/approx/butterworth.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { thrownBy } from "../helpers/throws.ts";
import { expectClose, expectComplexSetClose } from "../helpers/tolerance.ts";
import { magnitude, magnitudeDb, roots, scipyCases } from "./prototype-fixtures.ts";

describe("butterworth", () => {
  it("matches scipy.signal.buttap for every order 1-64 (poles 1e-10 relative, gain 1e-12)", () => {
    const cases = scipyCases("butterworth");
    expect(cases.length).toBe(64);
    for (const c of cases) {
      const h = butterworth(c.order);
      expect(h.zeros.length).toBe(0);
      expectComplexSetClose(h.poles, roots(c.poles), { rel: 1e-10, label: `order ${c.order} poles` });
      expectClose(h.gain, c.gain, { rel: 1e-12, label: `order ${c.order} gain` });
    }
  });

  it("is -3.0103 dB at 1 rad/s for every order", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 64 }), (n) => {
        expectClose(magnitudeDb(butterworth(n), 1), -10 * Math.log10(2), { rel: 1e-11 });
      }),
      { numRuns: 40 },
    );
  });

  it("is maximally flat: |H|^2 = 1/(1 + w^2n), so 1/|H|^2 - 1 has its first 2n-1 derivatives zero at DC", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 20 }), fc.double({ min: 0.05, max: 3, noNaN: true }), (n, w) => {
        const h = butterworth(n);
        const m2 = magnitude(h, w) ** 2;
        // 1/|H|^2 - 1 must equal w^(2n) exactly (no lower-order terms).
        expectClose(1 / m2 - 1, w ** (2 * n), { rel: 1e-9, abs: 1e-13 });
      }),
      { numRuns: 60 },
    );
    // Numerically: the deviation 1/|H|^2 - 1 scales as w^(2n) at small w (slope 2n on a log scale).
    for (const n of [1, 2, 3, 5, 8]) {
      const h = butterworth(n);
      const w1 = 0.8;
      const w2 = 0.6;
      const d1 = 1 / magnitude(h, w1) ** 2 - 1;
      const d2 = 1 / magnitude(h, w2) ** 2 - 1;
      expectClose(Math.log(d1 / d2) / Math.log(w1 / w2), 2 * n, { rel: 1e-6 });
    }
  });

  it("rejects orders outside 1-64 with a typed error naming the field", () => {
    for (const bad of [0, 65, 2.5, Number.NaN, "3" as unknown as number]) {
      expect(() => butterworth(bad)).toThrow(InvalidArgumentError);
    }
    const e = thrownBy(() => butterworth(0), InvalidArgumentError);
    expect(e.path).toBe("order");
    expect(e.fn).toBe("butterworth");
  });
});
