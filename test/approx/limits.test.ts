import { describe, expect, it } from "vitest";
import { chebyshev1, chebyshev2, elliptic, MIN_RIPPLE_DB, prototype } from "../../src/approx/index.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { firstNonFinite } from "../helpers/finite.ts";

describe("ripple and attenuation below the smallest accepted value", () => {
  it("are refused with the field and the range (the poles would run to infinity)", () => {
    expect(() => chebyshev1(1, { rippleDb: 5e-324 })).toThrow(InvalidArgumentError);
    expect(() => chebyshev1(1, { rippleDb: 5e-324 })).toThrow(/options\.rippleDb/);
    expect(() => chebyshev2(3, { attenuationDb: 1e-12 })).toThrow(/options\.attenuationDb/);
    expect(() => elliptic(3, { rippleDb: 1e-9, attenuationDb: 40 })).toThrow(/options\.rippleDb/);
    expect(() => prototype({ family: "chebyshev1", order: 1, rippleDb: 5e-324 })).toThrow(/rippleDb/);
  });

  it("at the smallest accepted value, every order's poles are finite", () => {
    for (const order of [1, 2, 7, 20, 64]) {
      expect(firstNonFinite(chebyshev1(order, { rippleDb: MIN_RIPPLE_DB })), `chebyshev1 ${order}`).toBeNull();
      expect(firstNonFinite(chebyshev2(Math.min(order, 40), { attenuationDb: MIN_RIPPLE_DB })), `chebyshev2 ${order}`).toBeNull();
    }
  });
});
