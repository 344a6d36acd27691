/**
 * Reading component values written in engineering notation or RKM code.
 *
 * Accepted forms (whitespace around the text is ignored):
 * - a decimal number, optionally with an exponent: `2.2e-9`, `1.2E3`, `.47`;
 * - a decimal number with an SI prefix and/or unit, optionally separated by
 *   spaces: `4.7k`, `10n`, `2.2 µF`, `2.2uF`, `2.2 μF`, `12.74 kΩ`,
 *   `12.74 kOhm`, `1.5 MHz`, `1meg` (SPICE mega);
 * - an RKM code (IEC 60062:2016, clause 4, typed in from memory) where the
 *   letter stands for the decimal point: `4k7`, `4R7`, `R47`, `100R`, `4n7`,
 *   `4u7F`, `1M0`, with an optional unit after it (`4r7`, lower-case r, is
 *   read as `4R7`).
 *
 * Prefixes: f p n u/µ/μ m k/K M/meg G T (BIPM SI Brochure, 9th ed., 2019,
 * Table 7). `m` is milli and `M` is mega; SPICE's case-blind `M` (milli) is not
 * followed, write `meg` for SPICE-style mega. `F` is farad, never femto.
 *
 * The number is assembled as a decimal string and converted once with
 * `Number()`, so the result is the correctly rounded double of the written
 * value (`"4.7k"` is exactly 4700, not 4.7 * 1000).
 *
 * @module
 */
import { InvalidArgumentError, ParseError } from "../errors.ts";
import { requireOptions } from "../validate.ts";
import { canonicalUnit, PREFIX_EXPONENTS, PREFIX_SPELLINGS, RKM_EXPONENTS } from "./prefixes.ts";
import type { UnitSymbol } from "./prefixes.ts";

/** Options of {@link parseValue} and {@link parseQuantity}. */
export interface ParseValueOptions {
  /**
   * Unit the value must be in (any accepted spelling: `"Ω"`, `"ohm"`, `"F"`,
   * `"H"`, `"Hz"`, `"V"`, `"A"`, `"s"`, `"W"`). A value written with a
   * different unit is rejected; a value written without a unit is accepted.
   * @defaultValue undefined (any known unit, or none)
   */
  readonly unit?: string;
  /**
   * Accept values below zero.
   * @defaultValue false
   */
  readonly allowNegative?: boolean;
  /**
   * Accept zero (a zero-ohm link `"0R"`, for instance).
   * @defaultValue false
   */
  readonly allowZero?: boolean;
}

/** A parsed value with the unit it was written in. */
export interface Quantity {
  /** The value in SI base units (ohms, farads, hertz, ...). */
  readonly value: number;
  /** Canonical unit symbol as written (`"Ω"` for `R` in RKM codes), or `undefined` when none was written. */
  readonly unit: UnitSymbol | undefined;
}

const ACCEPTED =
  'expected a number with an optional SI prefix (f p n u µ m k M meg G T) and unit (Ω ohm F H Hz V A s W), ' +
  'such as "4.7k", "2.2 µF", "1.5 MHz", "1meg" or "2.2e-9", or an RKM code such as "4k7", "R47", "100R" or "4n7"';

const RKM_RE = /^([+-]?)(\d*)(R|r|F|f|p|n|u|\u00b5|\u03bc|m|k|K|M|G|T)(\d*)\s*(.*)$/u;
const DECIMAL_RE = /^([+-]?)(\d+\.?\d*|\.\d+)(?:[eE]([+-]?\d+))?\s*(.*)$/u;

interface Raw {
  readonly negative: boolean;
  readonly decimal: string;
  readonly unit: UnitSymbol | undefined;
}

function fail(fn: string, text: unknown, why: string): never {
  throw new ParseError({ fn, path: "text", received: text, message: `${why}; ${ACCEPTED}` });
}

/** Split a suffix such as `kOhm`, `uF`, `meg`, `Hz` into prefix exponent and unit. */
function readSuffix(suffix: string): { exp: number; unit: UnitSymbol | undefined } | undefined {
  if (suffix === "") return { exp: 0, unit: undefined };
  const whole = canonicalUnit(suffix);
  if (whole !== undefined) return { exp: 0, unit: whole };
  for (const p of PREFIX_SPELLINGS) {
    if (!suffix.startsWith(p)) continue;
    const rest = suffix.slice(p.length);
    const exp = PREFIX_EXPONENTS.get(p) as number;
    if (rest === "") return { exp, unit: undefined };
    const unit = canonicalUnit(rest);
    if (unit !== undefined) return { exp, unit };
  }
  return undefined;
}

function readRaw(fn: string, text: unknown): Raw {
  if (typeof text !== "string") fail(fn, text, "expected a string");
  const s = text.trim();
  if (s === "") fail(fn, text, "the text is empty");

  const rkm = RKM_RE.exec(s);
  if (rkm !== null) {
    const [, sign = "", int = "", letter = "", frac = "", rest = ""] = rkm;
    // An RKM code has digits after the letter, or is `<digits>R` (such as 100R).
    const isRkm = frac !== "" || ((letter === "R" || letter === "r") && int !== "");
    if (isRkm) {
      const exp = RKM_EXPONENTS.get(letter) as number;
      let unit: UnitSymbol | undefined = letter === "R" || letter === "r" ? "\u03a9" : letter === "F" ? "F" : undefined;
      if (rest !== "") {
        const written = canonicalUnit(rest);
        if (written === undefined) fail(fn, text, `"${rest}" after the RKM code is not a unit`);
        if (unit !== undefined && written !== unit) {
          fail(fn, text, `the RKM letter ${letter} means ${unit} but the unit written is ${written}`);
        }
        unit = written;
      }
      return {
        negative: sign === "-",
        decimal: `${int === "" ? "0" : int}.${frac === "" ? "0" : frac}e${exp}`,
        unit,
      };
    }
  }

  const dec = DECIMAL_RE.exec(s);
  if (dec === null) fail(fn, text, "it does not start with a number or an RKM code");
  const [, sign = "", num = "", expText, suffix = ""] = dec;
  const read = readSuffix(suffix);
  if (read === undefined) fail(fn, text, `"${suffix}" is not an SI prefix and/or unit`);
  if (expText !== undefined && read.exp !== 0) {
    fail(fn, text, "write either an exponent or an SI prefix, not both");
  }
  const exp = (expText === undefined ? 0 : Number(expText)) + read.exp;
  return { negative: sign === "-", decimal: `${num}e${exp}`, unit: read.unit };
}

function parseChecked(fn: string, text: unknown, options: unknown): Quantity {
  const opts = requireOptions(fn, "options", options);
  let wanted: UnitSymbol | undefined;
  if (opts["unit"] !== undefined) {
    wanted = typeof opts["unit"] === "string" ? canonicalUnit(opts["unit"]) : undefined;
    if (wanted === undefined) {
      throw new InvalidArgumentError({
        fn,
        path: "options.unit",
        received: opts["unit"],
        message: "expected one of the unit spellings Ω, ohm, F, H, Hz, V, A, s, W",
      });
    }
  }
  for (const key of ["allowNegative", "allowZero"] as const) {
    if (opts[key] !== undefined && typeof opts[key] !== "boolean") {
      throw new InvalidArgumentError({ fn, path: `options.${key}`, received: opts[key], message: "expected true or false" });
    }
  }
  const raw = readRaw(fn, text);
  if (wanted !== undefined && raw.unit !== undefined && raw.unit !== wanted) {
    throw new ParseError({
      fn,
      path: "text",
      received: text,
      message: `the value is written in ${raw.unit} but ${wanted} was expected; write it in ${wanted} or without a unit`,
    });
  }
  const magnitude = Number(raw.decimal);
  if (!Number.isFinite(magnitude)) {
    throw new ParseError({ fn, path: "text", received: text, message: "the value is too large to represent (above about 1.8e308)" });
  }
  const nonzeroDigits = /[1-9]/.test(raw.decimal.split("e")[0] as string);
  if (magnitude === 0 && nonzeroDigits) {
    throw new ParseError({ fn, path: "text", received: text, message: "the value is too small to represent (below about 5e-324)" });
  }
  if (magnitude === 0 && opts["allowZero"] !== true) {
    throw new ParseError({ fn, path: "text", received: text, message: "a part value must be greater than zero (pass allowZero to accept zero)" });
  }
  if (raw.negative && magnitude !== 0 && opts["allowNegative"] !== true) {
    throw new ParseError({ fn, path: "text", received: text, message: "a part value must be greater than zero (pass allowNegative to accept negative values)" });
  }
  const value = raw.negative && magnitude !== 0 ? -magnitude : magnitude;
  return { value, unit: raw.unit ?? wanted };
}

/**
 * Read a value written in engineering notation, SPICE scale factors or RKM
 * code (IEC 60062), with an optional unit.
 *
 * @param text - the value as written, e.g. `"4k7"`, `"2.2 µF"`, `"1.5 MHz"`
 * @param options - expected unit and whether negative values or zero are accepted
 * @returns the value in SI base units, the correctly rounded double of the written decimal
 * @throws {@link ParseError} when the text is not a value in an accepted form,
 *   is in another unit than `options.unit`, or is zero/negative when not allowed
 * @throws {@link InvalidArgumentError} when `options` is malformed
 * @example
 * ```ts
 * parseValue("4k7"); //=> 4700
 * parseValue("2.2 µF", { unit: "F" }); //=> 2.2e-6
 * parseValue("1meg"); //=> 1000000
 * parseValue("R47"); //=> 0.47
 * parseValue("-3.3", { allowNegative: true }); //=> -3.3
 * ```
 */
export function parseValue(text: string, options?: ParseValueOptions): number {
  return parseChecked("parseValue", text, options).value;
}

/**
 * Read a value like {@link parseValue} and also report the unit it was written in.
 *
 * @param text - the value as written, e.g. `"12.74 kOhm"`
 * @param options - expected unit and whether negative values or zero are accepted
 * @returns the value and its canonical unit (`options.unit` when none was written, else `undefined`)
 * @throws {@link ParseError} as {@link parseValue}
 * @throws {@link InvalidArgumentError} when `options` is malformed
 * @example
 * ```ts
 * parseQuantity("12.74 kOhm"); //=> { value: 12740, unit: "Ω" }
 * parseQuantity("4n7"); //=> { value: 4.7e-9, unit: undefined }
 * ```
 */
export function parseQuantity(text: string, options?: ParseValueOptions): Quantity {
  return parseChecked("parseQuantity", text, options);
}
