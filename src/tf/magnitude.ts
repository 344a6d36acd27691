/**
 * Magnitude in dB of an analog transfer function on the jw axis, from the
 * factored form.
 *
 * `magnitudeDb` forms per point the products of the squared magnitudes
 *   `|jw - r|^2` (a conjugate pair as `(a^2 + (w - b)^2)(a^2 + (w + b)^2)`,
 *   a section as `(b0 - b2 w^2)^2 + (b1 w)^2`) of numerator and denominator
 *   and takes one logarithm of their quotient: sums and products of
 *   non-negative terms, so a relative error of at most about `(3 m + 1) u`
 *   for `m` factors and `u = 2^-53` (N. J. Higham, "Accuracy and Stability of
 *   Numerical Algorithms", 2nd ed., SIAM 2002, section 3.1, products of
 *   `n` rounded terms: `gamma_n`), i.e. below 1e-13 dB for the orders the
 *   library designs. A point where a term, a partial product or the quotient
 *   leaves the normal range (high orders far from the band, tiny roots, an
 *   exact transmission zero) is redone as the sum of `20 log10 |factor|`
 *   terms, which cannot overflow. The two agree to about 1e-13 dB (property
 *   test: 1e-12 dB).
 *
 * @module
 */
import { isCascade, requireGrid, requireSystem } from "./check.ts";
import { checkNoAxisPole, pack, packSections, polesOf, type PackedFactors } from "./response.ts";
import { fromSectionsUnchecked } from "./sections.ts";
import type { SectionCascade, Zpk } from "./types.ts";

/** Magnitudes below this (in dB), including an exact transmission zero, are reported as this value. */
export const MAGNITUDE_FLOOR_DB = -400;

/** `20 / ln 10`: dB per natural-log unit of a magnitude. */
const DB20 = 20 / Math.LN10;
/** `10 / ln 10`: dB per natural-log unit of a squared magnitude. */
const DB10 = 10 / Math.LN10;
/** The smallest normal double, 2^-1022: below it a product has lost relative precision. */
const MIN_NORMAL = 2.2250738585072014e-308;

/** Clamp values below {@link MAGNITUDE_FLOOR_DB} (and NaN) to the floor, in place. */
function applyFloor(out: Float64Array): Float64Array {
  for (let k = 0; k < out.length; k++) {
    const v = out[k] as number;
    if (!(v >= MAGNITUDE_FLOOR_DB)) out[k] = MAGNITUDE_FLOOR_DB;
  }
  return out;
}

/** dB of a zpk at one frequency as the sum of `20 log10 |jw - r|` per factor (overflow-safe reference, before the floor). */
function zpkDbByFactor(system: Zpk, wk: number): number {
  let v = DB20 * Math.log(Math.abs(system.gain));
  for (const z of system.zeros) v += DB20 * Math.log(Math.hypot(z.re, wk - z.im));
  for (const p of system.poles) v -= DB20 * Math.log(Math.hypot(p.re, wk - p.im));
  return v;
}

/**
 * dB of a cascade at one frequency as the sum of the sections' dB values
 * (reference, before the floor); where a section polynomial overflows
 * (w^2 beyond the double range), from the factored form.
 */
function cascadeDbBySection(cascade: SectionCascade, wk: number): number {
  const w2 = wk * wk;
  let v = DB20 * Math.log(Math.abs(cascade.gain));
  for (const sec of cascade.sections) {
    const [b2, b1, b0] = sec.num;
    const [a2, a1, a0] = sec.den;
    const n = Math.hypot(b0 - b2 * w2, b1 * wk);
    const d = Math.hypot(a0 - a2 * w2, a1 * wk);
    v += DB20 * (Math.log(n) - Math.log(d));
  }
  if (!Number.isNaN(v) && v !== Infinity) return v;
  return zpkDbByFactor(fromSectionsUnchecked(cascade), wk);
}

/**
 * Magnitude in dB summed factor by factor (a logarithm per factor per point):
 * the reference that {@link magnitudeDbUnchecked} falls back to where its
 * products leave the safe range, and that it is tested against.
 */
export function magnitudeDbByFactorUnchecked(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  const out = new Float64Array(w.length);
  if (isCascade(system)) for (let k = 0; k < w.length; k++) out[k] = cascadeDbBySection(system, w[k] as number);
  else for (let k = 0; k < w.length; k++) out[k] = zpkDbByFactor(system, w[k] as number);
  return applyFloor(out);
}

/** Scratch written by {@link squaredProductAt}: the product, then the smallest term or partial product met. */
const sq = new Float64Array(2);

/**
 * prod over the packed factors of `|jw - r|^2` at one frequency: a pair is
 * `(a^2 + (w - b)^2)(a^2 + (w + b)^2)`, a single root `a^2 + (w - b)^2`, sums
 * of non-negative terms (no cancellation, a few ulps each). Writes the
 * product and the smallest term or partial product into `sq`, so that the
 * caller can tell whether anything fell below the normal range.
 */
function squaredProductAt(f: PackedFactors, wk: number): void {
  let x = 1;
  let lo = 1;
  const { pairs, singles } = f;
  for (let i = 0; i < pairs.length; i += 3) {
    const aa = pairs[i] as number;
    const b = pairs[i + 2] as number;
    const d = wk - b;
    const e = wk + b;
    const t = aa + d * d;
    const u = aa + e * e;
    x = x * t * u;
    lo = t < lo ? t : lo;
    lo = u < lo ? u : lo;
    lo = x < lo ? x : lo;
  }
  for (let i = 0; i < singles.length; i += 2) {
    const a = singles[i] as number;
    const d = wk - (singles[i + 1] as number);
    const t = a * a + d * d;
    x *= t;
    lo = t < lo ? t : lo;
    lo = x < lo ? x : lo;
  }
  sq[0] = x;
  sq[1] = lo;
}

/** Magnitude in dB of a zpk, one logarithm per point (no checks). */
function zpkMagnitudeDb(system: Zpk, w: Float64Array): Float64Array {
  const out = new Float64Array(w.length);
  const zf = pack(system.zeros);
  const pf = pack(system.poles);
  const gainDb = DB20 * Math.log(Math.abs(system.gain));
  for (let k = 0; k < w.length; k++) {
    const wk = w[k] as number;
    squaredProductAt(zf, wk);
    const num = sq[0] as number;
    const numLo = sq[1] as number;
    squaredProductAt(pf, wk);
    const q = num / (sq[0] as number);
    // every term, partial product and the quotient normal and finite: a few
    // ulps per factor; otherwise (overflow, underflow, an exact zero) the
    // per-factor sum of logarithms at this point only
    if (numLo >= MIN_NORMAL && (sq[1] as number) >= MIN_NORMAL && q >= MIN_NORMAL && q < Infinity) {
      out[k] = gainDb + DB10 * Math.log(q);
    } else out[k] = zpkDbByFactor(system, wk);
  }
  return out;
}

/** Magnitude in dB of a cascade, one logarithm per point (no checks). */
function cascadeMagnitudeDb(cascade: SectionCascade, w: Float64Array): Float64Array {
  const out = new Float64Array(w.length);
  const c = packSections(cascade);
  const gainDb = DB20 * Math.log(Math.abs(cascade.gain));
  for (let k = 0; k < w.length; k++) {
    const wk = w[k] as number;
    const w2 = wk * wk;
    let num = 1;
    let den = 1;
    let lo = 1;
    for (let i = 0; i < c.length; i += 6) {
      const nr = (c[i + 2] as number) - (c[i] as number) * w2;
      const ni = (c[i + 1] as number) * wk;
      const dr = (c[i + 5] as number) - (c[i + 3] as number) * w2;
      const di = (c[i + 4] as number) * wk;
      const t = nr * nr + ni * ni;
      const u = dr * dr + di * di;
      num *= t;
      den *= u;
      lo = t < lo ? t : lo;
      lo = u < lo ? u : lo;
      lo = num < lo ? num : lo;
      lo = den < lo ? den : lo;
    }
    const q = num / den;
    if (lo >= MIN_NORMAL && q >= MIN_NORMAL && q < Infinity) out[k] = gainDb + DB10 * Math.log(q);
    else out[k] = cascadeDbBySection(cascade, wk);
  }
  return out;
}

/**
 * Magnitude in dB core (no checks): per point the products of the squared
 * magnitudes of the factors (or sections) of numerator and denominator and
 * one logarithm of their quotient; points where a product leaves the normal
 * range fall back to the per-factor sum of logarithms. Agrees with
 * {@link magnitudeDbByFactorUnchecked} to about 1e-13 dB (both are a few
 * ulps per factor; the log-sum's own rounding dominates).
 */
export function magnitudeDbUnchecked(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  return applyFloor(isCascade(system) ? cascadeMagnitudeDb(system, w) : zpkMagnitudeDb(system, w));
}

/**
 * Magnitude `20 log10 |H(jw)|` in dB on a grid, from products of squared
 * factor magnitudes with one logarithm per point (points where a product
 * would overflow or underflow, as for high orders far from the band, are
 * summed factor by factor). Accurate to about 1e-13 dB. Values below
 * {@link MAGNITUDE_FLOOR_DB} (including an exact transmission zero on the
 * grid) are clamped to it.
 *
 * @param system - a zpk transfer function or a section cascade
 * @param w - angular frequencies (rad/s), finite
 * @returns magnitude in dB per grid point
 * @throws {@link InvalidArgumentError} when the system or grid is malformed, or a grid point is exactly a jw-axis pole
 * @example
 * ```ts
 * magnitudeDb(zpk([], [{ re: -1, im: 0 }], 1), Float64Array.of(1)); //=> Float64Array [-3.0102999566398116]
 * ```
 */
export function magnitudeDb(system: Zpk | SectionCascade, w: Float64Array): Float64Array {
  const fn = "magnitudeDb";
  requireSystem(fn, "system", system);
  const grid = requireGrid(fn, "w", w);
  checkNoAxisPole(fn, polesOf(system), grid);
  return magnitudeDbUnchecked(system, grid);
}
