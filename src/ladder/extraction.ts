/**
 * Element values of a lowpass ladder from its input immittance, by
 * continued-fraction extraction at infinity with zero shifting for finite
 * transmission zeros, in double-double arithmetic.
 *
 * Method (G. C. Temes and S. K. Mitra (eds.), "Modern Filter Theory and
 * Design", Wiley, 1973, ch. 4; E. A. Guillemin, "Synthesis of Passive
 * Networks", Wiley, 1957, ch. 11 (zero shifting)): the immittance W = A/B is an
 * impedance when the next arm is in series and an admittance when it is a
 * shunt arm. At an arm with no finite transmission zero left, the pole of W at
 * infinity is removed in full (value = lead(A) / lead(B); the constant term of
 * the remainder is an exact zero and is dropped). At an arm that precedes a
 * transmission zero at w_z, the pole at infinity is removed only in part,
 * value = Im W(j w_z) / w_z, so that the remainder has a zero at j w_z; its
 * reciprocal then has a pole there, removed in full as the resonant arm
 * 2 k s / (s^2 + w_z^2) (a parallel tank L || C in a series arm, a series
 * L-C in a shunt arm; 2k = 1 / (companion), value = 2k / w_z^2). Each
 * division by s^2 + w_z^2 leaves a remainder that is rounding of an exact
 * zero; its size is reported. After the last arm W is a constant, the
 * termination.
 * Accuracy: the arithmetic is double-double; the values lose, with respect to
 * their input, about as many digits as the extraction's conditioning (which
 * grows with the order); measured in the tests against the ladder's own
 * response.
 *
 * @module
 */
import { cdd, cddDiv, dd, ddDiv, ddMul, ddToNumber, type DD } from "../math/double-double.ts";
import {
  ddPolyDivQuadratic,
  ddPolyEval,
  ddPolyScale,
  ddPolySub,
  ddPolyTrim,
  type DDPoly,
} from "../math/dd-polynomial.ts";

/** One extracted arm: its main value, and for a resonant arm the companion and the zero. */
export interface ExtractedArm {
  /** Series inductance or shunt capacitance (normalised). */
  readonly value: number;
  /** Companion element of a resonant arm (parallel C of a series tank, series L of a shunt resonator). */
  readonly companion?: number;
}

/** Result of {@link extractLadder}. */
export interface Extraction {
  /** Arms from the input end. */
  readonly arms: readonly ExtractedArm[];
  /** The immittance left after the last arm, of the last arm's kind: an impedance after a series arm, an admittance after a shunt arm. */
  readonly termination: number;
  /** Largest discarded remainder relative to the size of its polynomial (a measure of consistency). */
  readonly worstResidual: number;
}

function maxAbs(p: DDPoly): number {
  let m = 0;
  for (const c of p) m = Math.max(m, Math.abs(c.hi));
  return m;
}

/** Multiply by s. */
function timesS(p: DDPoly): DD[] {
  return [...p, dd(0)];
}

/**
 * Extract the arms of a ladder from W = a / b, where W has a pole at
 * infinity (deg a = deg b + 1). `zeros` lists, in extraction order, the finite
 * transmission zeros (rad/s); each consumes a partially removed arm and the
 * following resonant arm; the last arm is always a full removal. Arms beyond the finite zeros are removed in full
 * until `arms` arms are extracted.
 *
 * @param a - numerator of the input immittance
 * @param b - denominator
 * @param zeros - finite transmission zeros w_z > 0, in the order to extract them
 * @param arms - total number of arms
 * @returns the arm values, the termination and the worst discarded remainder;
 *   null when a value is not positive and finite (this order of zeros does not realise W) or the
 *   degrees do not fit the arm count
 * @throws never (unchecked)
 * @example
 * ```ts
 * extractLadder(ddPoly([2, 2]), ddPoly([1]), [], 1); //=> { arms: [{ value: 2 }], termination: 2, worstResidual: 0 }
 * ```
 */
export function extractLadder(a: DDPoly, b: DDPoly, zeros: readonly number[], arms: number): Extraction | null {
  let num: DD[] = ddPolyTrim(a);
  let den: DD[] = ddPolyTrim(b);
  const out: ExtractedArm[] = [];
  let worst = 0;
  let z = 0;
  while (out.length < arms) {
    const wz = zeros[z];
    if (wz !== undefined && out.length + 2 <= arms) {
      // partial removal of the pole at infinity so that W - k s vanishes at j wz
      const w = cddDiv(ddPolyEval(num, cdd(0, wz)), ddPolyEval(den, cdd(0, wz)));
      const k = ddDiv(w.im, dd(wz));
      const shifted = ddPolySub(num, ddPolyScale(timesS(den), k));
      const w2 = ddMul(dd(wz), dd(wz));
      const d1 = ddPolyDivQuadratic(ddPolyTrim(shifted), w2);
      worst = Math.max(worst, Math.max(Math.abs(d1.remainder[0].hi), Math.abs(d1.remainder[1].hi)) / maxAbs(shifted));
      const q = d1.quotient;
      // reciprocal: den / (q (s^2 + wz^2)); residue 2k at the pole pair
      const res = cddDiv(ddPolyEval(den, cdd(0, wz)), ddPolyEval(timesS(q), cdd(0, wz)));
      const twoK = res.re;
      const rest = ddPolySub(den, ddPolyScale(timesS(q), twoK));
      const d2 = ddPolyDivQuadratic(ddPolyTrim(rest), w2);
      worst = Math.max(worst, Math.max(Math.abs(d2.remainder[0].hi), Math.abs(d2.remainder[1].hi)) / maxAbs(rest));
      const value = ddToNumber(k);
      const tankValue = ddToNumber(ddDiv(twoK, w2));
      const companion = 1 / ddToNumber(twoK);
      if (!(value > 0 && tankValue > 0 && companion > 0) || !Number.isFinite(value + tankValue + companion)) return null;
      out.push({ value });
      out.push({ value: tankValue, companion });
      // remainder of the reciprocal is d2.quotient / q; the next arm sees its reciprocal
      num = q;
      den = ddPolyTrim(d2.quotient);
      z++;
      continue;
    }
    // full removal of the pole at infinity
    const value = ddDiv(num[0] as DD, den[0] as DD);
    const v = ddToNumber(value);
    if (!(v > 0) || !Number.isFinite(v)) return null;
    const rest = ddPolySub(num, ddPolyScale(timesS(den), value)).slice(1);
    out.push({ value: v });
    if (out.length === arms) {
      // rest / den is the termination: both of degree 0
      if (rest.length !== 1 || den.length !== 1) return null;
      const t = ddToNumber(ddDiv(rest[rest.length - 1] as DD, den[den.length - 1] as DD));
      if (!(t > 0) || !Number.isFinite(t)) return null;
      return { arms: out, termination: t, worstResidual: worst };
    }
    // the remainder vanishes at infinity: its leading coefficient is rounding of zero
    worst = Math.max(worst, Math.abs((rest[0] as DD).hi) / maxAbs(rest));
    const next = rest.slice(1);
    num = den;
    den = next;
  }
  // the last arm was resonant: no arm left to absorb the remainder (not a lowpass ladder of this layer)
  return null;
}
