/**
 * Order statistics of a sample: its finite values in ascending order and
 * the median of a sorted sample (the mean of the middle two for an even
 * count). Exact: a sort and at most one addition and halving.
 *
 * @module
 */

/**
 * The finite values of `xs`, ascending (a new array).
 *
 * @param xs - the sample
 * @returns its finite values, sorted
 */
export function finiteSorted(xs: Float64Array): Float64Array {
  return xs.filter((x) => Number.isFinite(x)).sort();
}

/**
 * The median of an ascending, non-empty sample.
 *
 * @param s - the sample, sorted ascending
 * @returns the middle value, or the mean of the middle two
 */
export function medianOfSorted(s: Float64Array): number {
  const m = s.length >> 1;
  return s.length % 2 === 1 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}
