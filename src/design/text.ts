/**
 * Numbers as the design's action and warning messages print them.
 *
 * @module
 */

/**
 * A number rounded to a few significant digits and printed without trailing
 * zeros or an exponent where none is needed (`1234.5678` -> `"1235"`,
 * `0.00012345` -> `"0.0001235"`).
 *
 * @param x - the number
 * @param digits - significant digits
 * @returns the rounded number as text
 */
export function significant(x: number, digits = 4): string {
  return Number(x.toPrecision(digits)).toString();
}

/**
 * A frequency as reports and tables print it: hertz with the k, M or G
 * prefix, never milli (a table that mixes "mHz" and "MHz" is easily misread),
 * so a frequency below 1 Hz is written as a decimal (`0.05` -> `"0.05 Hz"`,
 * `1234.5` -> `"1.235 kHz"`).
 *
 * @param f - frequency, Hz
 * @param digits - significant digits
 * @returns the frequency as text
 */
export function hertz(f: number, digits = 4): string {
  const a = Math.abs(f);
  if (a >= 1e9) return `${significant(f / 1e9, digits)} GHz`;
  if (a >= 1e6) return `${significant(f / 1e6, digits)} MHz`;
  if (a >= 1e3) return `${significant(f / 1e3, digits)} kHz`;
  return `${significant(f, digits)} Hz`;
}
