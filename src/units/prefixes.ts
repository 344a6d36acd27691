/**
 * SI prefixes, unit spellings and RKM letters shared by the parser and the
 * formatters.
 *
 * SI prefixes: BIPM, "The International System of Units (SI)", 9th edition,
 * 2019, Table 7. RKM letters: IEC 60062:2016 "Marking codes for resistors and
 * capacitors", clause 4 (typed in from memory). The `meg` spelling of mega is
 * SPICE's: T. Quarles et al., "SPICE3 Version 3f3 User's Manual", 1993,
 * section 2.1 (scale factors).
 *
 * Case matters: `m` is milli and `M` is mega. SPICE ignores case and reads `M`
 * as milli, which is why SPICE writes mega as `meg`; filterwright accepts
 * `meg` (any case) as mega too, but reads `M` as mega, like every datasheet.
 *
 * @module
 */

/** Decimal exponent of each accepted prefix spelling. */
export const PREFIX_EXPONENTS: ReadonlyMap<string, number> = new Map<string, number>([
  ["f", -15],
  ["p", -12],
  ["n", -9],
  ["u", -6],
  ["\u00b5", -6], // MICRO SIGN
  ["\u03bc", -6], // GREEK SMALL LETTER MU
  ["m", -3],
  ["k", 3],
  ["K", 3],
  ["M", 6],
  ["meg", 6],
  ["Meg", 6],
  ["MEG", 6],
  ["G", 9],
  ["T", 12],
]);

/** Prefix spellings, longest first, so that `meg` is tried before `m`. */
export const PREFIX_SPELLINGS: readonly string[] = [...PREFIX_EXPONENTS.keys()].sort(
  (a, b) => b.length - a.length,
);

/** Canonical unit symbols that filterwright reads and writes. */
export type UnitSymbol = "\u03a9" | "F" | "H" | "Hz" | "V" | "A" | "s" | "W";

/** Every accepted spelling of a unit, mapped to its canonical symbol. */
export const UNIT_ALIASES: ReadonlyMap<string, UnitSymbol> = new Map<string, UnitSymbol>([
  ["\u03a9", "\u03a9"], // GREEK CAPITAL LETTER OMEGA
  ["\u2126", "\u03a9"], // OHM SIGN
  ["ohm", "\u03a9"],
  ["ohms", "\u03a9"],
  ["Ohm", "\u03a9"],
  ["Ohms", "\u03a9"],
  ["OHM", "\u03a9"],
  ["F", "F"],
  ["H", "H"],
  ["Hz", "Hz"],
  ["V", "V"],
  ["A", "A"],
  ["s", "s"],
  ["W", "W"],
]);

/**
 * RKM letters (IEC 60062): the letter stands for the decimal point and
 * carries the multiplier. `R` (ohms) and `F` (farads) mark a multiplier of 1.
 */
export const RKM_EXPONENTS: ReadonlyMap<string, number> = new Map<string, number>([
  ["R", 0],
  ["r", 0],
  ["F", 0],
  ["f", -15],
  ["p", -12],
  ["n", -9],
  ["u", -6],
  ["\u00b5", -6],
  ["\u03bc", -6],
  ["m", -3],
  ["k", 3],
  ["K", 3],
  ["M", 6],
  ["G", 9],
  ["T", 12],
]);

/** Engineering prefix written for each exponent from 1e-15 to 1e12 (micro written separately). */
export const PREFIX_FOR_EXPONENT: ReadonlyMap<number, string> = new Map<number, string>([
  [-15, "f"],
  [-12, "p"],
  [-9, "n"],
  [-6, "\u00b5"],
  [-3, "m"],
  [0, ""],
  [3, "k"],
  [6, "M"],
  [9, "G"],
  [12, "T"],
]);

/**
 * Canonical symbol of a unit spelling.
 *
 * @param spelling - a unit as written, e.g. `"ohm"`, `"\u2126"`, `"Hz"`
 * @returns the canonical symbol, or `undefined` when filterwright does not know the spelling
 * @throws never
 * @example
 * ```ts
 * canonicalUnit("kOhm"); //=> undefined (the prefix is not part of the unit)
 * canonicalUnit("Ohm"); //=> "Ω"
 * ```
 */
export function canonicalUnit(spelling: string): UnitSymbol | undefined {
  return UNIT_ALIASES.get(spelling);
}
