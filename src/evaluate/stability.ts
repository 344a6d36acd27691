/**
 * Stability of a stage as built: whether every root of its characteristic
 * polynomial (the denominator of its transfer function, op-amp poles
 * included) lies in the open left half-plane.
 *
 * Method: the Routh array (E. J. Routh, "A Treatise on the Stability of a
 * Given State of Motion", Macmillan, 1877, ch. 2; equivalently the Hurwitz
 * determinants, A. Hurwitz, "Ueber die Bedingungen, unter welchen eine
 * Gleichung nur Wurzeln mit negativen reellen Theilen besitzt", Math. Ann.
 * 46:273-284, 1895). The number of sign changes down its first column is the
 * number of roots in the right half-plane; a zero in the first column means
 * a root on the imaginary axis (or a symmetric pair), which is not stable
 * either, and is counted as one unstable root here rather than continued by
 * the epsilon method. Leading coefficients that are exactly zero (a degree
 * below the storage length) are skipped.
 *
 * Accuracy: the array is formed in the scaled variable z = s / scale, where
 * the stage's coefficients are near unity; each entry carries a relative
 * rounding error of a few ulps times the array's growth, so a verdict can
 * only be wrong for a root within about 1e-12 of the scale from the
 * imaginary axis (a pole Q above about 1e11), far beyond any realisable
 * stage. Checked against numpy's polynomial roots in
 * test/evaluate/stability.test.ts.
 *
 * @module
 */

/** Rows of the Routh array for polynomials up to degree 31 (two rows of 17 entries, reused). */
const ROW = 17;
const a = new Float64Array(ROW);
const b = new Float64Array(ROW);

/**
 * Number of roots of a real polynomial in the closed right half-plane
 * (internal hot path: no checks, no allocation).
 *
 * @param coefficients - coefficients in descending powers (leading exact zeros are skipped)
 * @returns the count; 0 means every root lies in the open left half-plane
 */
export function rightHalfPlaneRoots(coefficients: Float64Array): number {
  let lead = 0;
  while (lead < coefficients.length && coefficients[lead] === 0) lead++;
  const n = coefficients.length - 1 - lead; // degree
  if (n <= 0) return 0;
  // Row 0: even positions, row 1: odd positions (from the leading coefficient).
  const width = (n >> 1) + 1;
  a.fill(0, 0, width + 1);
  b.fill(0, 0, width + 1);
  for (let k = 0; k <= n; k++) {
    const c = coefficients[lead + k] as number;
    if ((k & 1) === 0) a[k >> 1] = c;
    else b[k >> 1] = c;
  }
  let changes = 0;
  let prev = a[0] as number;
  let top = a;
  let bottom = b;
  for (let row = 1; row <= n; row++) {
    const pivot = bottom[0] as number;
    if (pivot === 0 || !Number.isFinite(pivot)) return changes + 1;
    if (pivot > 0 !== prev > 0) changes++;
    prev = pivot;
    // next row: (pivot * top[k+1] - top[0] * bottom[k+1]) / pivot, written over top
    const t0 = top[0] as number;
    for (let k = 0; k < width; k++) top[k] = (top[k + 1] as number) - (t0 * (bottom[k + 1] as number)) / pivot;
    top[width] = 0;
    const swap = top;
    top = bottom;
    bottom = swap;
  }
  return changes;
}

/**
 * Whether a real polynomial is Hurwitz: every root in the open left half-plane.
 *
 * @param coefficients - coefficients in descending powers
 * @returns true when stable
 */
export function isHurwitz(coefficients: Float64Array): boolean {
  return rightHalfPlaneRoots(coefficients) === 0;
}
