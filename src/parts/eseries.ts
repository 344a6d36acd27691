/**
 * IEC 60063 preferred-number series E3 to E192.
 *
 * Source: IEC 60063:2015 "Preferred number series for resistors and
 * capacitors", Table 1 (E3-E24, two significant figures) and Table 2
 * (E48-E192, three significant figures), typed in from memory. Most entries
 * equal the geometric formula 10^(i/N) rounded to the series' significant
 * figures; the historical exceptions (E24's 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7,
 * 8.2 and the E3-E12 entries inherited from them; E192's 9.20) are checked
 * against that formula by test/parts/eseries.test.ts with a numpy fixture.
 *
 * Each decade's values are stored as integers 100..999 (the mantissa times
 * 100) so that a member in any decade is built as one correctly rounded
 * decimal (4.7 kΩ is exactly the double 4700).
 *
 * Usual tolerances (fraction of the value): E6 20 %, E12 10 %, E24 5 %,
 * E48 2 %, E96 1 %, E192 0.5 % (E192 parts are also sold at 0.25 % and
 * 0.1 %; pass the tolerance explicitly for those). IEC 60063 names E3 for
 * tolerances wider than 20 %; filterwright uses 40 %, the figure older part
 * catalogues quote for E3 (common practice, no source).
 *
 * @module
 */
import { requireOneOf } from "../validate.ts";

/** Names of the IEC 60063 series. */
export type SeriesName = "E3" | "E6" | "E12" | "E24" | "E48" | "E96" | "E192";

/** Every series name, coarsest first. */
export const SERIES_NAMES: readonly SeriesName[] = Object.freeze([
  "E3",
  "E6",
  "E12",
  "E24",
  "E48",
  "E96",
  "E192",
] as SeriesName[]);

// IEC 60063:2015, typed in from memory. Mantissa x 100.
const E3 = [100, 220, 470];
const E6 = [100, 150, 220, 330, 470, 680];
const E12 = [100, 120, 150, 180, 220, 270, 330, 390, 470, 560, 680, 820];
const E24 = [
  100, 110, 120, 130, 150, 160, 180, 200, 220, 240, 270, 300, 330, 360, 390, 430, 470, 510, 560, 620, 680, 750, 820,
  910,
];
const E48 = [
  100, 105, 110, 115, 121, 127, 133, 140, 147, 154, 162, 169, 178, 187, 196, 205, 215, 226, 237, 249, 261, 274, 287,
  301, 316, 332, 348, 365, 383, 402, 422, 442, 464, 487, 511, 536, 562, 590, 619, 649, 681, 715, 750, 787, 825, 866,
  909, 953,
];
const E96 = [
  100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137, 140, 143, 147, 150, 154, 158, 162, 165, 169,
  174, 178, 182, 187, 191, 196, 200, 205, 210, 215, 221, 226, 232, 237, 243, 249, 255, 261, 267, 274, 280, 287, 294,
  301, 309, 316, 324, 332, 340, 348, 357, 365, 374, 383, 392, 402, 412, 422, 432, 442, 453, 464, 475, 487, 499, 511,
  523, 536, 549, 562, 576, 590, 604, 619, 634, 649, 665, 681, 698, 715, 732, 750, 768, 787, 806, 825, 845, 866, 887,
  909, 931, 953, 976,
];
const E192 = [
  100, 101, 102, 104, 105, 106, 107, 109, 110, 111, 113, 114, 115, 117, 118, 120, 121, 123, 124, 126, 127, 129, 130,
  132, 133, 135, 137, 138, 140, 142, 143, 145, 147, 149, 150, 152, 154, 156, 158, 160, 162, 164, 165, 167, 169, 172,
  174, 176, 178, 180, 182, 184, 187, 189, 191, 193, 196, 198, 200, 203, 205, 208, 210, 213, 215, 218, 221, 223, 226,
  229, 232, 234, 237, 240, 243, 246, 249, 252, 255, 258, 261, 264, 267, 271, 274, 277, 280, 284, 287, 291, 294, 298,
  301, 305, 309, 312, 316, 320, 324, 328, 332, 336, 340, 344, 348, 352, 357, 361, 365, 370, 374, 379, 383, 388, 392,
  397, 402, 407, 412, 417, 422, 427, 432, 437, 442, 448, 453, 459, 464, 470, 475, 481, 487, 493, 499, 505, 511, 517,
  523, 530, 536, 542, 549, 556, 562, 569, 576, 583, 590, 597, 604, 612, 619, 626, 634, 642, 649, 657, 665, 673, 681,
  690, 698, 706, 715, 723, 732, 741, 750, 759, 768, 777, 787, 796, 806, 816, 825, 835, 845, 856, 866, 876, 887, 898,
  909, 920, 931, 942, 953, 965, 976, 988,
];

/** Internal description of one series. */
export interface SeriesTable {
  /** Series name. */
  readonly name: SeriesName;
  /** Decade values times 100, ascending, in 100..999. */
  readonly mantissas: Int32Array;
  /** Usual tolerance as a fraction. */
  readonly tolerance: number;
  /** Decade values as numbers in [1, 10). */
  readonly values: readonly number[];
  /** For each integer n in 100..999: the index of the largest mantissa <= n (lookup for snapping). */
  readonly floorIndex: Uint16Array;
}

function table(name: SeriesName, m: readonly number[], tolerance: number): SeriesTable {
  const floorIndex = new Uint16Array(1000);
  let j = 0;
  for (let n = 100; n < 1000; n++) {
    while (j + 1 < m.length && (m[j + 1] as number) <= n) j++;
    floorIndex[n] = j;
  }
  return Object.freeze({
    name,
    mantissas: Int32Array.from(m),
    tolerance,
    values: Object.freeze(m.map((x) => x / 100)),
    floorIndex,
  });
}

const TABLES: Readonly<Record<SeriesName, SeriesTable>> = Object.freeze({
  E3: table("E3", E3, 0.4),
  E6: table("E6", E6, 0.2),
  E12: table("E12", E12, 0.1),
  E24: table("E24", E24, 0.05),
  E48: table("E48", E48, 0.02),
  E96: table("E96", E96, 0.01),
  E192: table("E192", E192, 0.005),
});

/**
 * Look up a series table after checking its name (internal).
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param name - value to check
 * @returns the series table
 * @throws {@link InvalidArgumentError} when the name is not a series name
 * @example
 * ```ts
 * seriesTable("f", "series", "E12").mantissas.length; //=> 12
 * ```
 */
export function seriesTable(fn: string, path: string, name: unknown): SeriesTable {
  return TABLES[requireOneOf(fn, path, name, SERIES_NAMES)];
}

/**
 * The values of one decade of an IEC 60063 series, ascending, in [1, 10).
 *
 * @param name - series name, `"E3"` to `"E192"`
 * @returns the decade's values (a frozen array; E24 gives 24 numbers from 1 to 9.1)
 * @throws {@link InvalidArgumentError} when `name` is not a series name
 * @example
 * ```ts
 * eSeries("E6"); //=> [1, 1.5, 2.2, 3.3, 4.7, 6.8]
 * eSeries("E96").length; //=> 96
 * ```
 */
export function eSeries(name: SeriesName): readonly number[] {
  return seriesTable("eSeries", "name", name).values;
}

/**
 * The usual tolerance of parts sold in a series, as a fraction.
 *
 * E3 40 % (common practice, no source; IEC 60063 names E3 for tolerances
 * wider than 20 %), E6 20 %, E12 10 %, E24 5 %, E48 2 %, E96 1 %, E192 0.5 %.
 *
 * @param name - series name, `"E3"` to `"E192"`
 * @returns the tolerance as a fraction (0.05 for 5 %)
 * @throws {@link InvalidArgumentError} when `name` is not a series name
 * @example
 * ```ts
 * seriesTolerance("E24"); //=> 0.05
 * seriesTolerance("E96"); //=> 0.01
 * ```
 */
export function seriesTolerance(name: SeriesName): number {
  return seriesTable("seriesTolerance", "name", name).tolerance;
}
