/**
 * The colours and line patterns of the plots: distinguishable in print and
 * for the common colour-vision deficiencies (the eight-colour set of
 * M. Okabe & K. Ito, "Color Universal Design", 2002, without its yellow,
 * which is too light on white), with dash patterns added from the seventh
 * trace on so that lines stay apart when the colours repeat.
 *
 * @module
 */

/** The main trace. */
export const MAIN = "#0072b2";
/** Shaded regions the spec forbids. */
export const FORBIDDEN = "#d55e00";
/** The Monte Carlo band. */
export const SPREAD = "#56b4e9";

const COLOURS = ["#0072b2", "#d55e00", "#009e73", "#cc79a7", "#e69f00", "#56b4e9", "#000000"];
const DASHES = [undefined, "6 3", "2 3", "8 3 2 3"];

/** The colour and dash pattern of the i-th of several traces. */
export function traceStyle(i: number): { readonly stroke: string; readonly dash: string | undefined } {
  return { stroke: COLOURS[i % COLOURS.length] as string, dash: DASHES[Math.floor(i / COLOURS.length) % DASHES.length] };
}
