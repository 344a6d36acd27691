import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { InvalidArgumentError } from "../../src/errors.ts";
import { formatRkm, formatValue, parseValue } from "../../src/units/index.ts";

describe("formatValue", () => {
  it("writes engineering notation", () => {
    expect(formatValue(4700, { unit: "\u03a9" })).toBe("4.7 k\u03a9");
    expect(formatValue(4700)).toBe("4.7k");
    expect(formatValue(1e-8, { unit: "F" })).toBe("10 nF");
    expect(formatValue(1.5e6, { unit: "Hz" })).toBe("1.5 MHz");
    expect(formatValue(2.2e-6, { unit: "F" })).toBe("2.2 \u00b5F");
    expect(formatValue(2.2e-6, { unit: "F", micro: "u", space: false })).toBe("2.2uF");
    expect(formatValue(12740, { unit: "ohm", digits: 4 })).toBe("12.74 kohm");
    expect(formatValue(470)).toBe("470");
    expect(formatValue(1)).toBe("1");
    expect(formatValue(0.001)).toBe("1m");
    expect(formatValue(1e-15)).toBe("1f");
    expect(formatValue(1e12)).toBe("1T");
    expect(formatValue(123456, { digits: 2 })).toBe("120k");
    expect(formatValue(470, { digits: 1 })).toBe("500");
    expect(formatValue(-4700, { unit: "V" })).toBe("-4.7 kV");
    expect(formatValue(0)).toBe("0");
    expect(formatValue(0, { unit: "V" })).toBe("0 V");
    expect(formatValue(0, { trimZeros: false })).toBe("0.00");
  });

  it("carries rounding into the next prefix", () => {
    expect(formatValue(999950)).toBe("1M");
    expect(formatValue(999449)).toBe("999k");
    expect(formatValue(999949, { digits: 4 })).toBe("999.9k");
    expect(formatValue(999.96e-9, { unit: "F" })).toBe("1 \u00b5F");
    expect(formatValue(999.4e-9, { unit: "F" })).toBe("999 nF");
    expect(formatValue(999950, { trimZeros: false })).toBe("1.00M");
    expect(formatValue(9.9996, { digits: 4 })).toBe("10");
  });

  it("keeps zeros when asked", () => {
    expect(formatValue(4700, { trimZeros: false })).toBe("4.70k");
    expect(formatValue(1e-9, { unit: "F", digits: 4, trimZeros: false })).toBe("1.000 nF");
  });

  it("falls back to an exponent beyond f..T", () => {
    expect(formatValue(1.5e-18, { unit: "F" })).toBe("1.5e-18 F");
    expect(formatValue(2.5e15)).toBe("2.5e15");
    expect(parseValue("1.5e-18 F")).toBe(1.5e-18);
  });

  it("rejects bad input", () => {
    expect(() => formatValue(NaN)).toThrow(InvalidArgumentError);
    expect(() => formatValue(Infinity)).toThrow(/formatValue: value/);
    expect(() => formatValue(1, { digits: 0 })).toThrow(/options.digits/);
    expect(() => formatValue(1, { digits: 2.5 })).toThrow(InvalidArgumentError);
    expect(() => formatValue(1, { unit: "furlong" })).toThrow(/options.unit/);
    expect(() => formatValue(1, { micro: "mu" as "u" })).toThrow(/options.micro/);
  });

  it("reads back to the same double with 17 digits (fast-check over 1e-15..1e12)", () => {
    fc.assert(
      fc.property(fc.double({ min: -15, max: 12, noNaN: true }), fc.double({ min: 1, max: 10, noNaN: true }), (e, m) => {
        const x = m * 10 ** e; // positive and finite for every m in [1, 10], e in [-15, 12]
        const text = formatValue(x, { digits: 17 });
        expect(parseValue(text)).toBe(x);
        const withUnit = formatValue(x, { digits: 17, unit: "F", micro: "u" });
        expect(parseValue(withUnit, { unit: "F" })).toBe(x);
      }),
      { numRuns: 3000 },
    );
  });

  it("reads back to the value rounded to the digits given", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -15, max: 12, noNaN: true }),
        fc.integer({ min: 1, max: 16 }),
        fc.boolean(),
        (e, digits, negative) => {
          const x = (negative ? -1 : 1) * 10 ** e;
          const text = formatValue(x, { digits, unit: "V" });
          expect(parseValue(text, { allowNegative: true })).toBe(Number(x.toPrecision(digits)));
        },
      ),
      { numRuns: 3000 },
    );
  });

  it("writes every decade from 1e-15 to 1e12 with a prefix and reads it back", () => {
    // Exhaustive over the exponent: one value per power of ten in 1e-15..1e12, both decade ends.
    for (let e = -15; e <= 12; e++) {
      for (const m of [1, 9.999, 3.3]) {
        const x = Number(`${m}e${e}`);
        expect(parseValue(formatValue(x, { digits: 17 }))).toBe(x);
        expect(formatValue(x)).not.toMatch(/e/);
      }
    }
  });
});

describe("formatRkm", () => {
  const resistors: [number, string][] = [
    [4700, "4k7"],
    [100, "100R"],
    [0.47, "R47"],
    [0.047, "R047"],
    [4.7, "4R7"],
    [1, "1R0"],
    [1000, "1k0"],
    [10000, "10k"],
    [12700, "12k7"],
    [1e6, "1M0"],
    [4.7e6, "4M7"],
    [2.2e9, "2G2"],
    [1e12, "1T0"],
    [0, "0R"],
  ];
  it.each(resistors)("writes %d ohm as %s", (v, code) => {
    expect(formatRkm(v)).toBe(code);
  });
  const capacitors: [number, string][] = [
    [4.7e-9, "4n7"],
    [1e-9, "1n0"],
    [1e-7, "100n"],
    [2.2e-6, "2\u00b52"],
    [4.7e-12, "4p7"],
    [4.7e-13, "p47"],
    [1e-3, "1m0"],
    [4.7, "4F7"],
    [470e-12, "470p"],
  ];
  it.each(capacitors)("writes %d F as %s", (v, code) => {
    expect(formatRkm(v, { kind: "capacitor" })).toBe(code);
  });
  it("uses u for micro when asked", () => {
    expect(formatRkm(2.2e-6, { kind: "capacitor", micro: "u" })).toBe("2u2");
  });
  it("rounds to the digits given", () => {
    expect(formatRkm(4749, { digits: 2 })).toBe("4k7");
    expect(formatRkm(12.74e3, { digits: 4 })).toBe("12k74");
    expect(formatRkm(999.6, { digits: 3 })).toBe("1k0");
  });
  it("rejects values it cannot write", () => {
    expect(() => formatRkm(-1)).toThrow(InvalidArgumentError);
    expect(() => formatRkm(0, { kind: "capacitor" })).toThrow(/greater than zero/);
    expect(() => formatRkm(2e15)).toThrow(/1000 T/);
    expect(() => formatRkm(5000, { kind: "capacitor" })).toThrow(/1000 F/);
    expect(() => formatRkm(NaN)).toThrow(InvalidArgumentError);
    expect(() => formatRkm(1, { kind: "inductor" as "resistor" })).toThrow(/options.kind/);
  });
  it("reads back (fast-check, resistors 1e-3..1e14, capacitors 1e-15..1e2)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -3, max: 14, noNaN: true }),
        fc.double({ min: -15, max: 2, noNaN: true }),
        fc.integer({ min: 1, max: 17 }),
        (er, ec, digits) => {
          const r = 10 ** er;
          expect(parseValue(formatRkm(r, { digits }), { unit: "\u03a9" })).toBe(Number(r.toPrecision(digits)));
          const c = 10 ** ec;
          const code = formatRkm(c, { digits, kind: "capacitor", micro: "u" });
          expect(parseValue(code, { unit: "F" })).toBe(Number(c.toPrecision(digits)));
        },
      ),
      { numRuns: 3000 },
    );
  });
});
