import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  attenuationFrequency,
  familyMaxOrder,
  prototype,
  rescaleToAttenuation,
  unitFrequencyMeaning,
} from "../../src/approx/prototype.ts";
import { butterworth } from "../../src/approx/butterworth.ts";
import { chebyshev1 } from "../../src/approx/chebyshev1.ts";
import { chebyshev2 } from "../../src/approx/chebyshev2.ts";
import { elliptic } from "../../src/approx/elliptic.ts";
import { bessel } from "../../src/approx/bessel.ts";
import { legendre } from "../../src/approx/legendre.ts";
import { FAMILY_NAMES, type FamilyName } from "../../src/approx/types.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectClose } from "../helpers/tolerance.ts";
import { magnitude, magnitudeDb } from "./prototype-fixtures.ts";

const DB3 = 10 * Math.log10(2);

describe("prototype", () => {
  it("dispatches to each family with the same result as the family function", () => {
    expect(prototype({ family: "butterworth", order: 5 })).toEqual(butterworth(5));
    expect(prototype({ family: "chebyshev1", order: 6, rippleDb: 0.5 })).toEqual(chebyshev1(6, { rippleDb: 0.5 }));
    expect(prototype({ family: "chebyshev2", order: 7, attenuationDb: 45 })).toEqual(chebyshev2(7, { attenuationDb: 45 }));
    expect(prototype({ family: "elliptic", order: 5, rippleDb: 0.2, attenuationDb: 55 })).toEqual(
      elliptic(5, { rippleDb: 0.2, attenuationDb: 55 }),
    );
    expect(prototype({ family: "bessel", order: 8 })).toEqual(bessel(8));
    expect(prototype({ family: "bessel", order: 8, normalization: "delay" })).toEqual(bessel(8, { normalization: "delay" }));
    expect(prototype({ family: "legendre", order: 9 })).toEqual(legendre(9));
  });

  it("names the missing or bad field", () => {
    expect(() => prototype({ family: "chebyshev1", order: 4 })).toThrow(/prototype: rippleDb/);
    expect(() => prototype({ family: "chebyshev2", order: 4 })).toThrow(/prototype: attenuationDb/);
    expect(() => prototype({ family: "elliptic", order: 4, rippleDb: 2, attenuationDb: 1 })).toThrow(/attenuationDb/);
    expect(() => prototype({ family: "legendre", order: 21 })).toThrow(/prototype: order/);
    expect(() => prototype({ family: "cauer" as FamilyName, order: 2 })).toThrow(InvalidArgumentError);
    expect(() => prototype({ family: "bessel", order: 3, normalization: "x" as "delay" })).toThrow(/normalization/);
  });

  it("states which frequency is 1 rad/s, and the prototypes honour it", () => {
    expect(FAMILY_NAMES.map((f) => unitFrequencyMeaning(f))).toEqual([
      "-3dB",
      "passband-edge",
      "stopband-edge",
      "passband-edge",
      "asymptote-intersection",
      "-3dB",
    ]);
    expect(unitFrequencyMeaning("bessel", "delay")).toBe("unit-delay");
    expect(unitFrequencyMeaning("bessel", "magnitude")).toBe("-3dB");
    expectClose(magnitudeDb(butterworth(6), 1), -DB3, { rel: 1e-12 });
    expectClose(magnitudeDb(legendre(6), 1), -DB3, { rel: 1e-12 });
    expectClose(magnitudeDb(chebyshev1(6, { rippleDb: 0.5 }), 1), -0.5, { rel: 1e-12 });
    expectClose(magnitudeDb(elliptic(6, { rippleDb: 0.5, attenuationDb: 50 }), 1), -0.5, { rel: 1e-10 });
    expectClose(magnitudeDb(chebyshev2(6, { attenuationDb: 50 }), 1), -50, { rel: 1e-12 });
    // Bessel "phase": |H| ~ 1/w^n at high frequency with unit coefficient, like Butterworth.
    for (const n of [2, 5, 9]) {
      const w = 1e4;
      expectClose(magnitude(bessel(n), w) * w ** n, 1, { rel: 1e-3 });
    }
    expect(familyMaxOrder("elliptic")).toBe(24);
    expect(familyMaxOrder("legendre")).toBe(20);
  });
});

describe("rescaleToAttenuation", () => {
  it("puts any family's -3 dB point at 1 rad/s (e.g. Chebyshev I ripple edge -> -3 dB)", () => {
    fc.assert(
      fc.property(fc.constantFrom(...FAMILY_NAMES), fc.integer({ min: 1, max: 12 }), (family, order) => {
        const h = prototype({ family, order, rippleDb: 1, attenuationDb: 40, normalization: "delay" });
        const moved = rescaleToAttenuation(h, { attenuationDb: DB3 });
        expectClose(magnitudeDb(moved, 1), -DB3, { rel: 1e-9 });
        // shape preserved: DC gain unchanged
        expectClose(magnitude(moved, 0), magnitude(h, 0), { rel: 1e-12 });
      }),
      { numRuns: 50 },
    );
  });

  it("finds the Chebyshev I -3 dB frequency exactly as cosh(acosh(sqrt(10^0.30103 - 1)/eps)/n)", () => {
    for (const [n, rp] of [
      [3, 1],
      [5, 0.5],
      [8, 2],
    ] as const) {
      const eps = Math.sqrt(10 ** (rp / 10) - 1);
      const expected = Math.cosh(Math.acosh(Math.sqrt(10 ** (DB3 / 10) - 1) / eps) / n);
      expectClose(attenuationFrequency(chebyshev1(n, { rippleDb: rp }), { attenuationDb: DB3 }), expected, { rel: 1e-13 });
    }
  });

  it("rejects levels already reached at DC or never reached", () => {
    expect(() => rescaleToAttenuation(chebyshev1(4, { rippleDb: 2 }), { attenuationDb: 1 })).toThrow(/already that far down at DC/);
    // H(s) = 0.5 (s + 2) / (s + 1): 0 dB at DC, -6.02 dB at high frequency, never 10 dB down.
    const shelf = { zeros: [{ re: -2, im: 0 }], poles: [{ re: -1, im: 0 }], gain: 0.5 };
    expect(() => attenuationFrequency(shelf, { attenuationDb: 10 })).toThrow(/never falls/);
    expectClose(attenuationFrequency(shelf, { attenuationDb: 3 }), Math.sqrt((4 - 4 * 10 ** -0.3) / (4 * 10 ** -0.3 - 1)), { rel: 1e-12 });
    expect(() => attenuationFrequency(butterworth(2), { attenuationDb: -3 })).toThrow(/options\.attenuationDb/);
    expect(() => attenuationFrequency({ zeros: [], poles: [{ re: -1, im: 1 }], gain: 1 }, { attenuationDb: 3 })).toThrow(
      InvalidArgumentError,
    );
  });
});
