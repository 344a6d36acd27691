import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { legendre, legendreL, legendreLCoefficientStrings, legendreMagnitude } from "../../src/approx/legendre.ts";
import { butterworth } from "../../src/approx/butterworth.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectClose, expectComplexSetClose } from "../helpers/tolerance.ts";
import { magnitude, mpmathCases, roots } from "./prototype-fixtures.ts";

describe("legendre", () => {
  it("matches the mpmath 50-digit reference (exact rational L_n, polyroots) for orders 1-20 to 1e-13", () => {
    // scipy has no Legendre prototype; the reference is built independently in the fixture script.
    const cases = mpmathCases("legendre");
    expect(cases.length).toBe(20);
    for (const c of cases) {
      const h = legendre(c.order);
      expect(legendreLCoefficientStrings(c.order)).toEqual(c.lCoefficients);
      expectComplexSetClose(h.poles, roots(c.poles), { rel: 1e-13, label: `n=${c.order} poles` });
      expectClose(h.gain, c.gain, { rel: 1e-13, label: `n=${c.order} gain` });
    }
  });

  it("reproduces Papoulis' and Fukada's first polynomials L_3, L_4, L_5 (typed from memory)", () => {
    expect(legendreLCoefficientStrings(3)).toEqual(["0", "1", "-3", "3"]);
    expect(legendreLCoefficientStrings(4)).toEqual(["0", "0", "3", "-8", "6"]);
    expect(legendreLCoefficientStrings(5)).toEqual(["0", "1", "-8", "28", "-40", "20"]);
  });

  it("legendreLCoefficientStrings rejects orders outside 1-20 with a typed error naming the field", () => {
    for (const bad of [0, 21, 2.5, Number.NaN]) {
      expect(() => legendreLCoefficientStrings(bad)).toThrow(InvalidArgumentError);
      expect(() => legendreLCoefficientStrings(bad)).toThrow(/order/);
    }
  });

  it("is -3.0103 dB at 1 rad/s and coincides with Butterworth at orders 1 and 2", () => {
    for (let n = 1; n <= 20; n++) expectClose(20 * Math.log10(magnitude(legendre(n), 1)), -10 * Math.log10(2), { rel: 1e-11 });
    expectComplexSetClose(legendre(1).poles, butterworth(1).poles, { rel: 1e-15 });
    expectComplexSetClose(legendre(2).poles, butterworth(2).poles, { rel: 1e-14 });
  });

  it("has a monotonic magnitude, steeper at the band edge than Butterworth of the same order (n >= 3)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 3, max: 20 }), (n) => {
        const h = legendre(n);
        let prev = magnitude(h, 0);
        for (let i = 1; i <= 600; i++) {
          const m = magnitude(h, (3 * i) / 600);
          expect(m).toBeLessThanOrEqual(prev * (1 + 1e-13));
          prev = m;
        }
        const d = 1e-6;
        const slopeL = (magnitude(h, 1 + d) - magnitude(h, 1 - d)) / (2 * d);
        const b = butterworth(n);
        const slopeB = (magnitude(b, 1 + d) - magnitude(b, 1 - d)) / (2 * d);
        expect(slopeL).toBeLessThan(slopeB);
      }),
      { numRuns: 18 },
    );
  });

  it("evaluates |H| by quadrature consistently with the poles, also beyond the pole range", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 20 }), fc.double({ min: 0, max: 5, noNaN: true }), (n, w) => {
        expectClose(legendreMagnitude(n, w), magnitude(legendre(n), w), { rel: 1e-11 });
      }),
      { numRuns: 80 },
    );
    // L_n(1) = 1 for orders past the prototype range too.
    for (const n of [21, 30, 45]) expectClose(legendreL(n, 1), 1, { rel: 1e-12 });
  });

  it("rejects orders outside 1-20", () => {
    expect(() => legendre(21)).toThrow(InvalidArgumentError);
    expect(() => legendre(0)).toThrow(/order/);
  });
});
