import { describe, expect, it } from "vitest";
import { REVERSE_BESSEL_MAX_ORDER, reverseBesselCoefficients, reverseBesselRoots } from "../../src/math/bessel.ts";
import { polyRoots } from "../../src/math/roots.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import { expectComplexSetClose } from "../helpers/tolerance.ts";

const fx = loadFixture<{ orders: { order: number; coefficients: string[]; roots: [string, string][] }[] }>(
  "math-bessel-roots.json",
);

describe("reverseBesselRoots vs mpmath 50-digit roots", () => {
  for (const o of fx.orders) {
    it(`order ${o.order}`, () => {
      const ref = o.roots.map(([re, im]) => ({ re: Number(re), im: Number(im) }));
      expectComplexSetClose(reverseBesselRoots(o.order), ref, { rel: 1e-14, label: `theta_${o.order}` });
    });
  }
});

describe("reverseBesselCoefficients", () => {
  it("matches the exact integer coefficients (rounded to double)", () => {
    for (const o of fx.orders) {
      expect(reverseBesselCoefficients(o.order)).toEqual(o.coefficients.map((c) => Number(c)));
    }
    expect(reverseBesselCoefficients(0)).toEqual([1]);
  });

  it("polyRoots on the plain double coefficients is accurate while they are exact (order <= 10)", () => {
    const exact = fx.orders.filter((x) => x.order <= 10);
    expect(exact.map((x) => x.order)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    for (const o of exact) {
      const ref = o.roots.map(([re, im]) => ({ re: Number(re), im: Number(im) }));
      expectComplexSetClose(polyRoots(reverseBesselCoefficients(o.order)), ref, { rel: 1e-14 });
    }
  });

  it("rejects orders out of range", () => {
    expect(() => reverseBesselRoots(0)).toThrow(InvalidArgumentError);
    expect(() => reverseBesselRoots(REVERSE_BESSEL_MAX_ORDER + 1)).toThrow(/order/);
    expect(() => reverseBesselCoefficients(2.5)).toThrow(InvalidArgumentError);
  });
});
