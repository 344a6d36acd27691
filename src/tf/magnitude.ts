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
 *   test: 1e-12 dB), and both agree with `20 log10 |frequencyResponse|` to
 *   1e-12 dB (property test over random zpk systems and their cascades).
 *
 * The loop runs over four grid points per pass (independent chains the CPU
 * overlaps, all in registers), each formed with exactly the operations of the
 * one-point path; a cascade's constant numerators (lowpass sections) are in
 * its gain once per call. Whether a term or product can leave the normal range
 * is decided once per call where it can be: every term lies between bounds
 * over `|w| <= max |w_i|` (a pair's `a^2 + (w -+ b)^2` in
 * `[a^2, a^2 + (max |w| + b)^2]`, a section's bounds in `sectionLogBounds`),
 * so every partial product and the quotient lie between products of those
 * bounds; when these stay inside `2^-1000 .. 2^1000` no point is tracked, and
 * otherwise (an exact jw-axis zero, a notch section, a grid far out) each
 * point's smallest term and partial product are followed as above. The values
 * are the same either way.
 *
 * @module
 */
import { isCascade, maxAbs, requireGrid } from "./check.ts";
import { packCascade, packSystem, packZpk, rejectAxisPoles, type PackedCascade, type PackedFactors, type PackedZpk } from "./packed.ts";
import { cascadeProductsInRange, zpkProductsInRange } from "./magnitude-range.ts";
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

/** Scratch written by {@link squaredProductAt1} and {@link sectionSquaredProductsAt1}: a product, then the smallest term or partial product met. */
const sq = new Float64Array(2);

/**
 * prod over the packed factors of `|jw - r|^2` at one frequency: a pair is
 * `(a^2 + (w - b)^2)(a^2 + (w + b)^2)`, a single root `a^2 + (w - b)^2`, sums
 * of non-negative terms (no cancellation, a few ulps each). Writes the
 * product and the smallest term or partial product into `sq`, so that the
 * caller can tell whether anything fell below the normal range. The grid
 * loop ({@link zpkMagnitudeDbInto}) runs exactly these operations for each
 * of its four points.
 */
function squaredProductAt1(f: PackedFactors, wk: number): void {
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
    const tu = t * u;
    x *= tu;
    lo = Math.min(lo, t, u, tu, x);
  }
  for (let i = 0; i < singles.length; i += 2) {
    const a = singles[i] as number;
    const d = wk - (singles[i + 1] as number);
    const t = a * a + d * d;
    x *= t;
    lo = Math.min(lo, t, x);
  }
  sq[0] = x;
  sq[1] = lo;
}

/**
 * `gainDb + 10 log10 q` for a normal, finite `q`, clamped to the floor.
 * (`Math.max`, not a conditional with the constant: the conditional made the
 * compiler box every value. The sum is never NaN here: the gain's dB value is
 * finite or -Infinity, the logarithm finite.)
 */
function dbOf(gainDb: number, q: number): number {
  return Math.max(gainDb + DB10 * Math.log(q), MAGNITUDE_FLOOR_DB);
}

/** One grid point of a zpk on its own: the quotient of squared products, else the per-factor sum. */
function zpkDbPoint(p: PackedZpk, gainDb: number, wk: number): number {
  squaredProductAt1(p.zeros, wk);
  const num = sq[0] as number;
  const numLo = sq[1] as number;
  squaredProductAt1(p.poles, wk);
  const q = num / (sq[0] as number);
  // every term, partial product and the quotient normal and finite: a few
  // ulps per factor; otherwise (overflow, underflow, an exact zero) the
  // per-factor sum of logarithms at this point only
  if (numLo >= MIN_NORMAL && (sq[1] as number) >= MIN_NORMAL && q >= MIN_NORMAL && q < Infinity) return dbOf(gainDb, q);
  const v = zpkDbByFactor(p.system, wk);
  return v >= MAGNITUDE_FLOOR_DB ? v : MAGNITUDE_FLOOR_DB;
}

/**
 * Magnitude in dB of a zpk into `out`, one logarithm per point (no checks,
 * no allocation). Four points per pass, each formed with exactly the
 * operations of {@link zpkDbPoint} (independent chains the CPU overlaps);
 * when any term, partial product or quotient of the four leaves the normal
 * range, the four are redone one by one.
 */
function zpkMagnitudeDbInto(p: PackedZpk, w: Float64Array, wmax: number, out: Float64Array): void {
  const track = !zpkProductsInRange(p, wmax);
  const n = w.length;
  const gainDb = DB20 * Math.log(Math.abs(p.system.gain));
  const dp = p.poles.pairs;
  const ds = p.poles.singles;
  const np = p.zeros.pairs;
  const ns = p.zeros.singles;
  for (let k = 0; k < n; k += 4) {
    if (k + 4 > n) {
      // the last one to three points, one by one (the same values)
      for (let j = k; j < n; j++) out[j] = zpkDbPoint(p, gainDb, w[j] as number);
      break;
    }
    const w0 = w[k] as number;
    const w1 = w[k + 1] as number;
    const w2 = w[k + 2] as number;
    const w3 = w[k + 3] as number;
    let lo = 1;
    // numerators
    let y0 = 1;
    let y1 = 1;
    let y2 = 1;
    let y3 = 1;
    for (let i = 0; i < np.length; i += 3) {
      const aa = np[i] as number;
      const b = np[i + 2] as number;
      let d = w0 - b;
      let e = w0 + b;
      let t = aa + d * d;
      let u = aa + e * e;
      let tu = t * u;
      y0 *= tu;
      let m = 1;
      if (track) m = Math.min(t, u, tu, y0);
      d = w1 - b;
      e = w1 + b;
      t = aa + d * d;
      u = aa + e * e;
      tu = t * u;
      y1 *= tu;
      if (track) m = Math.min(m, t, u, tu, y1);
      d = w2 - b;
      e = w2 + b;
      t = aa + d * d;
      u = aa + e * e;
      tu = t * u;
      y2 *= tu;
      if (track) m = Math.min(m, t, u, tu, y2);
      d = w3 - b;
      e = w3 + b;
      t = aa + d * d;
      u = aa + e * e;
      tu = t * u;
      y3 *= tu;
      if (track) lo = Math.min(lo, m, t, u, tu, y3);
    }
    for (let i = 0; i < ns.length; i += 2) {
      const a = ns[i] as number;
      const b = ns[i + 1] as number;
      let d = w0 - b;
      let t = a * a + d * d;
      y0 *= t;
      let m = 1;
      if (track) m = Math.min(t, y0);
      d = w1 - b;
      t = a * a + d * d;
      y1 *= t;
      if (track) m = Math.min(m, t, y1);
      d = w2 - b;
      t = a * a + d * d;
      y2 *= t;
      if (track) m = Math.min(m, t, y2);
      d = w3 - b;
      t = a * a + d * d;
      y3 *= t;
      if (track) lo = Math.min(lo, m, t, y3);
    }
    // denominators
    let x0 = 1;
    let x1 = 1;
    let x2 = 1;
    let x3 = 1;
    for (let i = 0; i < dp.length; i += 3) {
      const aa = dp[i] as number;
      const b = dp[i + 2] as number;
      let d = w0 - b;
      let e = w0 + b;
      let t = aa + d * d;
      let u = aa + e * e;
      let tu = t * u;
      x0 *= tu;
      let m = 1;
      if (track) m = Math.min(t, u, tu, x0);
      d = w1 - b;
      e = w1 + b;
      t = aa + d * d;
      u = aa + e * e;
      tu = t * u;
      x1 *= tu;
      if (track) m = Math.min(m, t, u, tu, x1);
      d = w2 - b;
      e = w2 + b;
      t = aa + d * d;
      u = aa + e * e;
      tu = t * u;
      x2 *= tu;
      if (track) m = Math.min(m, t, u, tu, x2);
      d = w3 - b;
      e = w3 + b;
      t = aa + d * d;
      u = aa + e * e;
      tu = t * u;
      x3 *= tu;
      if (track) lo = Math.min(lo, m, t, u, tu, x3);
    }
    for (let i = 0; i < ds.length; i += 2) {
      const a = ds[i] as number;
      const b = ds[i + 1] as number;
      let d = w0 - b;
      let t = a * a + d * d;
      x0 *= t;
      let m = 1;
      if (track) m = Math.min(t, x0);
      d = w1 - b;
      t = a * a + d * d;
      x1 *= t;
      if (track) m = Math.min(m, t, x1);
      d = w2 - b;
      t = a * a + d * d;
      x2 *= t;
      if (track) m = Math.min(m, t, x2);
      d = w3 - b;
      t = a * a + d * d;
      x3 *= t;
      if (track) lo = Math.min(lo, m, t, x3);
    }
    const q0 = y0 / x0;
    const q1 = y1 / x1;
    const q2 = y2 / x2;
    const q3 = y3 / x3;
    // the test and the operations of zpkDbPoint (dbOf), for the four points at once
    // (Math.min/max propagate NaN, which fails the comparisons)
    if (lo >= MIN_NORMAL && Math.min(q0, q1, q2, q3) >= MIN_NORMAL && Math.max(q0, q1, q2, q3) < Infinity) {
      const v0 = gainDb + DB10 * Math.log(q0);
      const v1 = gainDb + DB10 * Math.log(q1);
      const v2 = gainDb + DB10 * Math.log(q2);
      const v3 = gainDb + DB10 * Math.log(q3);
      out[k] = Math.max(v0, MAGNITUDE_FLOOR_DB);
      out[k + 1] = Math.max(v1, MAGNITUDE_FLOOR_DB);
      out[k + 2] = Math.max(v2, MAGNITUDE_FLOOR_DB);
      out[k + 3] = Math.max(v3, MAGNITUDE_FLOOR_DB);
    } else {
      out[k] = zpkDbPoint(p, gainDb, w0);
      out[k + 1] = zpkDbPoint(p, gainDb, w1);
      out[k + 2] = zpkDbPoint(p, gainDb, w2);
      out[k + 3] = zpkDbPoint(p, gainDb, w3);
    }
  }
}

/**
 * prod over packed section polynomials of `|c2 (jw)^2 + c1 jw + c0|^2 =
 * (c0 - c2 w^2)^2 + (c1 w)^2` at one frequency, written into `sq` with the
 * smallest term or partial product; the grid loop
 * ({@link cascadeMagnitudeDbInto}) runs exactly these operations for each of
 * its four points.
 */
function sectionSquaredProductsAt1(c: Float64Array, wk: number): void {
  const w2 = wk * wk;
  let x = 1;
  let lo = 1;
  for (let i = 0; i < c.length; i += 3) {
    const r = (c[i + 2] as number) - (c[i] as number) * w2;
    const m = (c[i + 1] as number) * wk;
    const t = r * r + m * m;
    x *= t;
    lo = Math.min(lo, t, x);
  }
  sq[0] = x;
  sq[1] = lo;
}

/** One grid point of a cascade on its own: the quotient of squared products, else the sum of the sections' dB values. */
function cascadeDbPoint(p: PackedCascade, gainDb: number, wk: number): number {
  sectionSquaredProductsAt1(p.num, wk);
  const num = sq[0] as number;
  const numLo = sq[1] as number;
  sectionSquaredProductsAt1(p.den, wk);
  const q = num / (sq[0] as number);
  if (numLo >= MIN_NORMAL && (sq[1] as number) >= MIN_NORMAL && q >= MIN_NORMAL && q < Infinity) return dbOf(gainDb, q);
  const v = cascadeDbBySection(p.cascade, wk);
  return v >= MAGNITUDE_FLOOR_DB ? v : MAGNITUDE_FLOOR_DB;
}

/**
 * Magnitude in dB of a cascade into `out`, one logarithm per point (no
 * checks, no allocation); four points per pass as in {@link zpkMagnitudeDbInto}.
 * Constant numerators (lowpass sections) are in the packed gain.
 */
function cascadeMagnitudeDbInto(p: PackedCascade, w: Float64Array, wmax: number, out: Float64Array): void {
  const track = !cascadeProductsInRange(p, wmax);
  const n = w.length;
  const gainDb = DB20 * Math.log(Math.abs(p.gain));
  const den = p.den;
  const num = p.num;
  for (let k = 0; k < n; k += 4) {
    if (k + 4 > n) {
      // the last one to three points, one by one (the same values)
      for (let j = k; j < n; j++) out[j] = cascadeDbPoint(p, gainDb, w[j] as number);
      break;
    }
    const w0 = w[k] as number;
    const w1 = w[k + 1] as number;
    const w2 = w[k + 2] as number;
    const w3 = w[k + 3] as number;
    const ww0 = w0 * w0;
    const ww1 = w1 * w1;
    const ww2 = w2 * w2;
    const ww3 = w3 * w3;
    let lo = 1;
    let y0 = 1;
    let y1 = 1;
    let y2 = 1;
    let y3 = 1;
    for (let i = 0; i < num.length; i += 3) {
      const c2 = num[i] as number;
      const c1 = num[i + 1] as number;
      const c0 = num[i + 2] as number;
      let r = c0 - c2 * ww0;
      let s = c1 * w0;
      let t = r * r + s * s;
      y0 *= t;
      let m = 1;
      if (track) m = Math.min(t, y0);
      r = c0 - c2 * ww1;
      s = c1 * w1;
      t = r * r + s * s;
      y1 *= t;
      if (track) m = Math.min(m, t, y1);
      r = c0 - c2 * ww2;
      s = c1 * w2;
      t = r * r + s * s;
      y2 *= t;
      if (track) m = Math.min(m, t, y2);
      r = c0 - c2 * ww3;
      s = c1 * w3;
      t = r * r + s * s;
      y3 *= t;
      if (track) lo = Math.min(lo, m, t, y3);
    }
    let x0 = 1;
    let x1 = 1;
    let x2 = 1;
    let x3 = 1;
    for (let i = 0; i < den.length; i += 3) {
      const c2 = den[i] as number;
      const c1 = den[i + 1] as number;
      const c0 = den[i + 2] as number;
      let r = c0 - c2 * ww0;
      let s = c1 * w0;
      let t = r * r + s * s;
      x0 *= t;
      let m = 1;
      if (track) m = Math.min(t, x0);
      r = c0 - c2 * ww1;
      s = c1 * w1;
      t = r * r + s * s;
      x1 *= t;
      if (track) m = Math.min(m, t, x1);
      r = c0 - c2 * ww2;
      s = c1 * w2;
      t = r * r + s * s;
      x2 *= t;
      if (track) m = Math.min(m, t, x2);
      r = c0 - c2 * ww3;
      s = c1 * w3;
      t = r * r + s * s;
      x3 *= t;
      if (track) lo = Math.min(lo, m, t, x3);
    }
    const q0 = y0 / x0;
    const q1 = y1 / x1;
    const q2 = y2 / x2;
    const q3 = y3 / x3;
    // the test and the operations of cascadeDbPoint (dbOf), for the four points at once
    // (Math.min/max propagate NaN, which fails the comparisons)
    if (lo >= MIN_NORMAL && Math.min(q0, q1, q2, q3) >= MIN_NORMAL && Math.max(q0, q1, q2, q3) < Infinity) {
      const v0 = gainDb + DB10 * Math.log(q0);
      const v1 = gainDb + DB10 * Math.log(q1);
      const v2 = gainDb + DB10 * Math.log(q2);
      const v3 = gainDb + DB10 * Math.log(q3);
      out[k] = Math.max(v0, MAGNITUDE_FLOOR_DB);
      out[k + 1] = Math.max(v1, MAGNITUDE_FLOOR_DB);
      out[k + 2] = Math.max(v2, MAGNITUDE_FLOOR_DB);
      out[k + 3] = Math.max(v3, MAGNITUDE_FLOOR_DB);
    } else {
      out[k] = cascadeDbPoint(p, gainDb, w0);
      out[k + 1] = cascadeDbPoint(p, gainDb, w1);
      out[k + 2] = cascadeDbPoint(p, gainDb, w2);
      out[k + 3] = cascadeDbPoint(p, gainDb, w3);
    }
  }
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
  const out = new Float64Array(w.length);
  if (isCascade(system)) cascadeMagnitudeDbInto(packCascade(system), w, maxAbs(w), out);
  else zpkMagnitudeDbInto(packZpk(system), w, maxAbs(w), out);
  return out;
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
  const p = packSystem(fn, system);
  // one pass for the grid check and the largest |w| (finite exactly when every value is)
  let wmax = w instanceof Float64Array ? maxAbs(w) : Number.NaN;
  let grid = w;
  if (!Number.isFinite(wmax)) {
    grid = requireGrid(fn, "w", w);
    wmax = maxAbs(grid);
  }
  rejectAxisPoles(fn, p, grid);
  const out = new Float64Array(grid.length);
  if ("cascade" in p) cascadeMagnitudeDbInto(p, grid, wmax, out);
  else zpkMagnitudeDbInto(p, grid, wmax, out);
  return out;
}
