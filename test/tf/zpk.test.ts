import { describe, expect, it } from "vitest";
import { evalZpk, zpk, zpkToPolynomials } from "../../src/tf/zpk.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectClose } from "../helpers/tolerance.ts";

describe("zpk", () => {
  it("copies and freezes its input", () => {
    const poles = [{ re: -1, im: 2 }, { re: -1, im: -2 }];
    const h = zpk([], poles, 3);
    poles[0] = { re: 5, im: 5 };
    expect(h.poles[0]).toEqual({ re: -1, im: 2 });
    expect(Object.isFrozen(h)).toBe(true);
    expect(Object.isFrozen(h.poles)).toBe(true);
  });

  it("rejects unpaired complex values, non-finite values and a zero gain", () => {
    expect(() => zpk([], [{ re: -1, im: 2 }], 1)).toThrow(/poles\[0\]/);
    expect(() => zpk([{ re: 0, im: 1 }], [{ re: -1, im: 0 }], 1)).toThrow(/zeros\[0\]/);
    expect(() => zpk([], [{ re: Number.NaN, im: 0 }], 1)).toThrow(InvalidArgumentError);
    expect(() => zpk([], [], 0)).toThrow(/gain/);
    expect(() => zpk([], [], Number.POSITIVE_INFINITY)).toThrow(/gain/);
    expect(() => zpk("x" as unknown as [], [], 1)).toThrow(InvalidArgumentError);
  });
});

describe("evalZpk", () => {
  it("evaluates the factored form", () => {
    // H(s) = 2 (s + 3) / ((s + 1)(s^2 + 2s + 5)); at s = j: 2(3 + j) / ((1 + j)(4 + 2j)) = (6 + 2j)/(2 + 6j) = 0.6 - 0.8j
    const h = zpk([{ re: -3, im: 0 }], [{ re: -1, im: 0 }, { re: -1, im: 2 }, { re: -1, im: -2 }], 2);
    const v = evalZpk(h, { re: 0, im: 1 });
    expectClose(v.re, 0.6, { rel: 1e-15 });
    expectClose(v.im, -0.8, { rel: 1e-15 });
  });

  it("rejects evaluation exactly at a pole", () => {
    const h = zpk([], [{ re: -1, im: 0 }], 1);
    expect(() => evalZpk(h, { re: -1, im: 0 })).toThrow(/pole/);
    expect(() => evalZpk(h, { re: 0, im: Number.NaN })).toThrow(InvalidArgumentError);
  });
});

describe("zpkToPolynomials", () => {
  it("expands zeros, poles and gain", () => {
    const h = zpk([{ re: 0, im: 0 }], [{ re: -1, im: 1 }, { re: -1, im: -1 }], 3);
    expect(zpkToPolynomials(h)).toEqual({ num: [3, 0], den: [1, 2, 2] });
  });
});
