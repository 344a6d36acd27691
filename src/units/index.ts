/**
 * Engineering notation, RKM codes (IEC 60062) and numerical constants.
 *
 * @module
 */
export { parseValue, parseQuantity } from "./parse.ts";
export type { ParseValueOptions, Quantity } from "./parse.ts";
export { formatValue, formatRkm } from "./format.ts";
export type { FormatValueOptions, FormatRkmOptions, RkmKind } from "./format.ts";
export { canonicalUnit } from "./prefixes.ts";
export type { UnitSymbol } from "./prefixes.ts";
export { TWO_PI } from "./constants.ts";
