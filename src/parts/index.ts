/**
 * IEC 60063 preferred values: series tables, snapping, ranges across decades,
 * two-part combinations, ratios, and part descriptions with tolerance bounds.
 *
 * @module
 */
export { eSeries, seriesTolerance, SERIES_NAMES } from "./eseries.ts";
export type { SeriesName } from "./eseries.ts";
export {
  snapToSeries,
  snapValues,
  nextInSeries,
  seriesValuesInRange,
  isInSeries,
  PART_VALUE_MIN,
  PART_VALUE_MAX,
} from "./snap.ts";
export type { SnapMode, SnapOptions, SnapResult, NextOptions, ValueRange } from "./snap.ts";
export { bestCombination, bestRatio } from "./combine.ts";
export type {
  CombinationKind,
  CombinationOptions,
  Combination,
  CombinationResult,
  RatioMode,
  RatioOptions,
  RatioResult,
} from "./combine.ts";
export { partValue } from "./part-value.ts";
export type { PartKind, PartValue, PartValueOptions } from "./part-value.ts";
