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
