import { describe, expect, it } from "vitest";
import { loadFixture } from "../helpers/fixtures.ts";
import { formatRkm, formatValue, parseValue } from "../../src/units/index.ts";

interface NotationFixture {
  readonly parse: readonly { readonly text: string; readonly value: number }[];
  readonly rounding: readonly { readonly x: number; readonly digits: number; readonly rounded: number }[];
}

const fx = loadFixture<NotationFixture>("units-notation.json");

describe("parseValue against Python's correctly rounded float()", () => {
  it(`reads all ${fx.parse.length} written values to the same double`, () => {
    for (const c of fx.parse) expect(parseValue(c.text), c.text).toBe(c.value);
  });
});

describe("formatValue and formatRkm against Python's '%.*e' rounding", () => {
  it(`round to the same double in all ${fx.rounding.length} cases`, () => {
    for (const c of fx.rounding) {
      expect(parseValue(formatValue(c.x, { digits: c.digits })), `${c.x} @ ${c.digits}`).toBe(c.rounded);
      expect(parseValue(formatRkm(c.x, { digits: c.digits, kind: c.x < 1 ? "capacitor" : "resistor" }))).toBe(
        c.rounded,
      );
    }
  });
});
