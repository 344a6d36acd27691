/**
 * Writing values in engineering notation and in RKM code.
 *
 * Rounding to significant digits uses `Number.prototype.toExponential`, which
 * rounds the exact binary value (ECMAScript 2022, section 21.1.3.2), so a
 * carry such as 999.95k -> 1.00M is handled before the engineering prefix is
 * chosen. With 17 significant digits the text reads back (by `parseValue`) to
 * the same double (IEEE 754-2008, clause 5.12.2: 17 digits identify a binary64).
 *
 * RKM code: IEC 60062:2016 "Marking codes for resistors and capacitors",
 * clause 4 (typed in from memory): the multiplier letter stands for the
 * decimal point (`4k7`, `R47`, `100R`, `4n7`, `1k0`).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireFinite, requireInteger, requireOneOf, requireOptions } from "../validate.ts";
import { canonicalUnit, PREFIX_FOR_EXPONENT } from "./prefixes.ts";

/** Options of {@link formatValue}. */
export interface FormatValueOptions {
  /**
   * Significant digits, 1 to 21.
   * @defaultValue 3
   */
  readonly digits?: number;
  /**
   * Unit written after the prefix (any accepted spelling, written as given:
   * `"Ω"`, `"ohm"`, `"F"`, `"H"`, `"Hz"`, `"V"`, `"A"`, `"s"`, `"W"`).
   * @defaultValue undefined (no unit)
   */
  readonly unit?: string;
  /**
   * Put a space between the number and the prefix/unit (`"4.7 kΩ"`).
   * @defaultValue true when a unit is given, false otherwise (`"4.7k"`)
   */
  readonly space?: boolean;
  /**
   * How to write micro.
   * @defaultValue "µ" (U+00B5 MICRO SIGN)
   */
  readonly micro?: "\u00b5" | "u";
  /**
   * Drop trailing zeros after the decimal point (`"4.7k"` rather than `"4.70k"`).
   * @defaultValue true
   */
  readonly trimZeros?: boolean;
}

/** Kinds of part whose RKM letter set differs. */
export type RkmKind = "resistor" | "capacitor";

/** Options of {@link formatRkm}. */
export interface FormatRkmOptions {
  /**
   * Significant digits, 1 to 21.
   * @defaultValue 3
   */
  readonly digits?: number;
  /**
   * Letter set: resistors use R k M G T (ohms), capacitors p n µ m F (farads).
   * @defaultValue "resistor"
   */
  readonly kind?: RkmKind;
  /**
   * How to write micro (capacitors).
   * @defaultValue "µ" (U+00B5 MICRO SIGN)
   */
  readonly micro?: "\u00b5" | "u";
}

/** Round |value| > 0 to `digits` significant digits: the digit string and the decimal exponent of its first digit. */
function roundDigits(magnitude: number, digits: number): { mantissa: string; exp10: number } {
  const [m = "", e = "0"] = magnitude.toExponential(digits - 1).split("e");
  return { mantissa: m.replace(".", ""), exp10: Number(e) };
}

/** Place the decimal point so that `intLen` digits stand before it (intLen may be <= 0). */
function placePoint(mantissa: string, intLen: number): { int: string; frac: string } {
  if (intLen <= 0) return { int: "", frac: "0".repeat(-intLen) + mantissa };
  const padded = mantissa.length < intLen ? mantissa + "0".repeat(intLen - mantissa.length) : mantissa;
  return { int: padded.slice(0, intLen), frac: padded.slice(intLen) };
}

function checkMicro(fn: string, value: unknown): "\u00b5" | "u" {
  if (value === undefined) return "\u00b5";
  return requireOneOf(fn, "options.micro", value, ["\u00b5", "u"] as const);
}

/**
 * Write a value in engineering notation: a mantissa from 1 to 999.x and an SI
 * prefix from f (1e-15) to T (1e12). Values outside that range are written
 * with a decimal exponent (`"1.5e-18 F"`), which `parseValue` also reads.
 *
 * @param value - the value in SI base units (any finite number, zero and negatives included)
 * @param options - significant digits, unit, spacing, micro sign, zero trimming
 * @returns the text, e.g. `"4.7 kΩ"`, `"10n"`, `"1.5 MHz"`
 * @throws {@link InvalidArgumentError} when `value` is not finite or an option is out of range
 * @example
 * ```ts
 * formatValue(4700, { unit: "Ω" }); //=> "4.7 kΩ"
 * formatValue(4700); //=> "4.7k"
 * formatValue(1e-8, { unit: "F" }); //=> "10 nF"
 * formatValue(999950); //=> "1M"
 * formatValue(2.2e-6, { micro: "u", unit: "F", space: false }); //=> "2.2uF"
 * formatValue(4700, { trimZeros: false }); //=> "4.70k"
 * ```
 */
export function formatValue(value: number, options?: FormatValueOptions): string {
  const fn = "formatValue";
  const v = requireFinite(fn, "value", value);
  const opts = requireOptions(fn, "options", options);
  const digits = opts["digits"] === undefined ? 3 : requireInteger(fn, "options.digits", opts["digits"], { min: 1, max: 21 });
  let unit = "";
  if (opts["unit"] !== undefined) {
    if (typeof opts["unit"] !== "string" || canonicalUnit(opts["unit"]) === undefined) {
      throw new InvalidArgumentError({
        fn,
        path: "options.unit",
        received: opts["unit"],
        message: "expected one of the unit spellings Ω, ohm, F, H, Hz, V, A, s, W",
      });
    }
    unit = opts["unit"];
  }
  for (const key of ["space", "trimZeros"] as const) {
    if (opts[key] !== undefined && typeof opts[key] !== "boolean") {
      throw new InvalidArgumentError({ fn, path: `options.${key}`, received: opts[key], message: "expected true or false" });
    }
  }
  const space = opts["space"] === undefined ? unit !== "" : opts["space"] === true;
  const trim = opts["trimZeros"] !== false;
  const micro = checkMicro(fn, opts["micro"]);
  const sep = space ? " " : "";

  if (v === 0) {
    const zero = trim || digits === 1 ? "0" : `0.${"0".repeat(digits - 1)}`;
    return `${zero}${sep}${unit}`.trimEnd();
  }
  const sign = v < 0 ? "-" : "";
  const { mantissa, exp10 } = roundDigits(Math.abs(v), digits);
  const eng = Math.floor(exp10 / 3) * 3;
  let prefix = PREFIX_FOR_EXPONENT.get(eng);
  let number: string;
  if (prefix === undefined) {
    // Beyond f..T: plain scientific notation.
    const { int, frac } = placePoint(mantissa, 1);
    const f = trim ? frac.replace(/0+$/u, "") : frac;
    number = `${int}${f === "" ? "" : `.${f}`}e${exp10}`;
    prefix = "";
  } else {
    const { int, frac } = placePoint(mantissa, exp10 - eng + 1);
    const f = trim ? frac.replace(/0+$/u, "") : frac;
    number = `${int}${f === "" ? "" : `.${f}`}`;
    if (prefix === "\u00b5") prefix = micro;
  }
  const tail = `${prefix}${unit}`;
  return tail === "" ? `${sign}${number}` : `${sign}${number}${sep}${tail}`;
}

const RKM_LETTERS: Readonly<Record<RkmKind, ReadonlyMap<number, string>>> = {
  resistor: new Map([
    [0, "R"],
    [3, "k"],
    [6, "M"],
    [9, "G"],
    [12, "T"],
  ]),
  capacitor: new Map([
    [-12, "p"],
    [-9, "n"],
    [-6, "\u00b5"],
    [-3, "m"],
    [0, "F"],
  ]),
};

/**
 * Write a value as an RKM code (IEC 60062), the letter standing for the
 * decimal point: `4k7`, `100R`, `R47`, `4n7`. A single digit before the
 * letter gets one zero after it (`1k0`, `1n0`) so the code never ends in a
 * lone letter after one digit. Trailing zeros are otherwise dropped.
 *
 * Resistors (ohms) use R k M G T and cover below 1000 TΩ; values below 1 Ω
 * start with the letter (`R47`, `R047`). Capacitors (farads) use p n µ m F
 * and cover below 1000 F; values below 1 pF start with `p` (`p47`).
 *
 * @param value - resistance in ohms or capacitance in farads (> 0; 0 gives `0R` for resistors)
 * @param options - significant digits, letter set, micro sign
 * @returns the RKM code
 * @throws {@link InvalidArgumentError} when `value` is not finite, negative,
 *   zero for a capacitor, or too large for the letter set
 * @example
 * ```ts
 * formatRkm(4700); //=> "4k7"
 * formatRkm(100); //=> "100R"
 * formatRkm(0.47); //=> "R47"
 * formatRkm(1000); //=> "1k0"
 * formatRkm(4.7e-9, { kind: "capacitor" }); //=> "4n7"
 * formatRkm(1e-7, { kind: "capacitor", micro: "u" }); //=> "100n"
 * ```
 */
export function formatRkm(value: number, options?: FormatRkmOptions): string {
  const fn = "formatRkm";
  const opts = requireOptions(fn, "options", options);
  const digits = opts["digits"] === undefined ? 3 : requireInteger(fn, "options.digits", opts["digits"], { min: 1, max: 21 });
  const kind = opts["kind"] === undefined ? "resistor" : requireOneOf(fn, "options.kind", opts["kind"], ["resistor", "capacitor"] as const);
  const micro = checkMicro(fn, opts["micro"]);
  const v = requireFinite(fn, "value", value);
  if (v < 0 || (v === 0 && kind === "capacitor")) {
    throw new InvalidArgumentError({
      fn,
      path: "value",
      received: value,
      message: kind === "capacitor" ? "expected a capacitance greater than zero" : "expected a resistance of zero or more",
    });
  }
  if (v === 0) return "0R";
  const letters = RKM_LETTERS[kind];
  const minExp = kind === "resistor" ? 0 : -12;
  const maxExp = kind === "resistor" ? 12 : 0;
  const { mantissa, exp10 } = roundDigits(v, digits);
  const eng = Math.max(minExp, Math.floor(exp10 / 3) * 3);
  if (eng > maxExp) {
    throw new InvalidArgumentError({
      fn,
      path: "value",
      received: value,
      message: kind === "resistor" ? "expected a resistance below 1000 TΩ (1e15 Ω)" : "expected a capacitance below 1000 F",
    });
  }
  let letter = letters.get(eng) as string;
  if (letter === "\u00b5") letter = micro;
  const { int, frac } = placePoint(mantissa, exp10 - eng + 1);
  let f = frac.replace(/0+$/u, "");
  if (f === "" && int.length === 1) f = "0";
  return `${int}${letter}${f}`;
}
