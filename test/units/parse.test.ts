import { describe, expect, it } from "vitest";
import { ParseError, InvalidArgumentError } from "../../src/errors.ts";
import { parseQuantity, parseValue } from "../../src/units/index.ts";

describe("parseValue", () => {
  // Expected values are the decimal literals themselves (the correctly rounded doubles).
  const cases: [string, number][] = [
    ["4.7k", 4.7e3],
    ["4k7", 4.7e3],
    ["4K7", 4.7e3],
    ["10n", 10e-9],
    ["2.2 \u00b5F", 2.2e-6],
    ["2.2uF", 2.2e-6],
    ["2.2 \u03bcF", 2.2e-6],
    ["12.74 k\u03a9", 12.74e3],
    ["12.74 k\u2126", 12.74e3],
    ["12.74 kOhm", 12.74e3],
    ["12.74kohm", 12.74e3],
    ["1.5 MHz", 1.5e6],
    ["1.5 mHz", 1.5e-3],
    ["100R", 100],
    ["R47", 0.47],
    ["4n7", 4.7e-9],
    ["4n7F", 4.7e-9],
    ["4R7", 4.7],
    ["4r7", 4.7],
    ["100r", 100],
    ["4R7\u03a9", 4.7],
    ["1M", 1e6],
    ["1M0", 1e6],
    ["4M7", 4.7e6],
    ["1m", 1e-3],
    ["4m7", 4.7e-3],
    ["1meg", 1e6],
    ["2.2MEG", 2.2e6],
    ["2.2e-9", 2.2e-9],
    ["1.2e3", 1.2e3],
    ["1.2E3", 1.2e3],
    ["2.2e-9F", 2.2e-9],
    ["2.2e-9 F", 2.2e-9],
    [".47", 0.47],
    ["1.", 1],
    ["  33k  ", 33e3],
    ["+4k7", 4.7e3],
    ["10 pF", 10e-12],
    ["p47", 0.47e-12],
    ["n47", 0.47e-9],
    ["4u7", 4.7e-6],
    ["4\u00b57", 4.7e-6],
    ["1F", 1],
    ["1F0", 1],
    ["1fF", 1e-15],
    ["1f", 1e-15],
    ["3.3 mH", 3.3e-3],
    ["5 V", 5],
    ["1 ms", 1e-3],
    ["2G", 2e9],
    ["1T", 1e12],
    ["1 Hz", 1],
    ["7", 7],
    ["0.001", 0.001],
    ["1e-300", 1e-300],
  ];
  it.each(cases)("reads %j as %d", (text, expected) => {
    expect(parseValue(text)).toBe(expected);
  });

  it("gives the correctly rounded double, not prefix arithmetic", () => {
    // 8.2 * 1e-9 is 8.199999999999999e-9 in binary64; the parser must give 8.2e-9.
    expect(8.2 * 1e-9).not.toBe(8.2e-9);
    expect(parseValue("8.2n")).toBe(8.2e-9);
    expect(parseValue("8n2")).toBe(8.2e-9);
    expect(parseValue("1.1k")).toBe(1100);
  });

  it("reads M as mega and m as milli (SPICE reads M as milli; write meg there)", () => {
    expect(parseValue("1M")).toBe(1e6);
    expect(parseValue("1m")).toBe(1e-3);
    expect(parseValue("1Meg")).toBe(1e6);
  });

  it("checks the unit when one is asked for", () => {
    expect(parseValue("10n", { unit: "F" })).toBe(10e-9);
    expect(parseValue("10nF", { unit: "F" })).toBe(10e-9);
    expect(parseValue("4k7 ohm", { unit: "\u03a9" })).toBe(4700);
    expect(parseValue("100R", { unit: "ohm" })).toBe(100);
    expect(() => parseValue("10 nH", { unit: "F" })).toThrow(ParseError);
    expect(() => parseValue("100R", { unit: "F" })).toThrow(/written in \u03a9 but F was expected/);
    expect(() => parseValue("1 kHz", { unit: "\u03a9" })).toThrow(ParseError);
    expect(() => parseValue("1k", { unit: "parsec" })).toThrow(InvalidArgumentError);
  });

  it("accepts zero and negatives only when asked", () => {
    expect(() => parseValue("0")).toThrow(/greater than zero/);
    expect(() => parseValue("0R")).toThrow(ParseError);
    expect(parseValue("0R", { allowZero: true })).toBe(0);
    expect(Object.is(parseValue("-0", { allowZero: true }), 0)).toBe(true);
    expect(() => parseValue("-4k7")).toThrow(/allowNegative/);
    expect(parseValue("-4k7", { allowNegative: true })).toBe(-4700);
    expect(parseValue("-1.5e-3", { allowNegative: true })).toBe(-1.5e-3);
    expect(() => parseValue("1", { allowZero: "yes" as unknown as boolean })).toThrow(InvalidArgumentError);
  });

  const bad: unknown[] = [
    "4k7k",
    "abc",
    "",
    "  ",
    "1..2k",
    "-4k7",
    "NaN",
    "Infinity",
    "-Infinity",
    "1e400",
    "1e-400",
    "k",
    "R",
    "1e",
    "1e3k",
    "0x10",
    "4.7.1",
    "4k7.2",
    "1.5k7",
    "1 k 2",
    "4,7k",
    "1 parsec",
    "1kk",
    "4meg7",
    "--1",
    "1F5k",
    NaN,
    Infinity,
    4700,
    null,
    undefined,
    {},
    ["4k7"],
  ];
  it.each(bad.map((b) => [b]))("rejects %j with a ParseError that quotes the input", (input) => {
    let err: unknown;
    try {
      parseValue(input as string);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ParseError);
    const pe = err as ParseError;
    expect(pe.code).toBe("PARSE_ERROR");
    expect(pe.fn).toBe("parseValue");
    expect(pe.path).toBe("text");
    expect(pe.received).toBe(input);
    if (typeof input === "string") expect(pe.message).toContain(JSON.stringify(input));
  });

  it("says what is accepted", () => {
    expect(() => parseValue("abc")).toThrow(/such as "4.7k".*RKM code such as "4k7"/);
  });
});

describe("parseQuantity", () => {
  it("reports the canonical unit", () => {
    expect(parseQuantity("12.74 kOhm")).toEqual({ value: 12740, unit: "\u03a9" });
    expect(parseQuantity("100R")).toEqual({ value: 100, unit: "\u03a9" });
    expect(parseQuantity("4n7")).toEqual({ value: 4.7e-9, unit: undefined });
    expect(parseQuantity("4n7", { unit: "F" })).toEqual({ value: 4.7e-9, unit: "F" });
    expect(parseQuantity("1.5 MHz")).toEqual({ value: 1.5e6, unit: "Hz" });
  });
  it("names itself in errors", () => {
    expect(() => parseQuantity("x")).toThrow(/^parseQuantity: text:/);
  });
});
