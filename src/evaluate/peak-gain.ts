/**
 * The true maximum over frequency of |H(j w)|^2 for a cascade of real
 * rational functions, found rather than sampled: over a span of the
 * frequency axis, with the DC value and the high-frequency limit included.
 *
 * Method: a grid whose density follows the roots. Near a pole or zero
 * `r = -sigma + j Omega` (Omega > 0) the factor `|j w - r|^2 = (w - Omega)^2 +
 * sigma^2` varies on the scale `sigma`, so the points `Omega + sigma sinh(k h)`,
 * k = -K..K, resolve it (spacing 0.3 sigma at the resonance, reaching about
 * 30 sigma either side: the grid of a pole of quality Q is Q times denser in
 * relative frequency than its own width); real roots and the rest of the
 * span vary slowly on a log scale and take a log grid of 24 points per
 * decade. Between grid points the log-magnitude is then smooth (its second
 * derivative at most of order 1 / spacing^2), so every local maximum of
 * the grid brackets one of the function, and each is refined by
 * golden-section search on log frequency to a relative width of 1e-10
 * (J. Kiefer, "Sequential minimax search for a maximum", Proc. AMS
 * 4(3):502-506, 1953). The roots come from the Aberth-Ehrlich iteration
 * (src/math/roots.ts). The DC value is `|H(0)|^2`, the high-frequency limit
 * the ratio of the leading coefficients where numerator and denominator
 * have the same degree.
 *
 * Accuracy: the maximum is located to 1e-10 relative frequency, where a
 * peak is flat to second order, so its level is that of the polynomials
 * (about 1e-12 dB, see stage-polynomials.ts); against 200,000 log points
 * plus refinement it agrees to better than 1e-6 dB on random designs
 * (test/evaluate/peak-gain.test.ts asks for 0.01 dB).
 *
 * @module
 */
import { goldenMax } from "../math/optimize.ts";
import { polyRoots } from "../math/roots.ts";
import { cascadeMagnitudeSquared, magnitudeSquaredAt, multiplyMagnitudeSquared } from "./cascade.ts";
import type { ScaledRational } from "./types.ts";

/** Points per decade of the log grid that covers the span. */
export const PEAK_GRID_PER_DECADE = 24;
/** Half the number of points about each complex root (K). */
const ROOT_POINTS = 14;
/** Step of the sinh-spaced points about a complex root (h). */
const ROOT_STEP = 0.3;

/** A maximum of |H|^2 found over the axis. */
export interface FoundPeak {
  /** Where it is, rad/s (0 for DC; the top of the span when the high-frequency limit is the largest). */
  readonly radS: number;
  /** The value of |H|^2 there. */
  readonly magnitudeSquared: number;
}

/** The roots (rad/s) of one polynomial in z = s / scale, the complex ones with Im > 0 only. */
function upperRoots(c: Float64Array, scale: number, out: number[]): void {
  let first = 0;
  while (first < c.length - 1 && c[first] === 0) first++;
  if (c.length - first < 2) return;
  let last = c.length - 1;
  while (last > first && c[last] === 0) last--; // roots at s = 0: on the log grid's side, not a resonance
  if (last === first) return;
  for (const r of polyRoots(Array.from(c.subarray(first, last + 1)))) {
    if (r.im > 0 && Number.isFinite(r.im)) out.push(scale * r.re, scale * r.im);
  }
}

const roots = new WeakMap<ScaledRational, Float64Array>();

/** A factor's complex roots, poles and zeros, as (re, im) pairs in rad/s (made once per factor). */
function rootsOf(f: ScaledRational): Float64Array {
  let r = roots.get(f);
  if (r === undefined) {
    const out: number[] = [];
    upperRoots(f.num, f.scale, out);
    upperRoots(f.den, f.scale, out);
    r = Float64Array.from(out);
    roots.set(f, r);
  }
  return r;
}

/**
 * The grid that resolves every local maximum of a cascade of these factors
 * on `[lo, hi]` (see the module header), ascending.
 *
 * @param factors - the rational functions (any order)
 * @param spanRadS - `[lo, hi]`, rad/s, 0 < lo < hi
 * @returns the grid, rad/s, strictly ascending, both ends included
 */
export function peakGrid(factors: readonly ScaledRational[], spanRadS: readonly [number, number]): Float64Array {
  const [lo, hi] = spanRadS;
  const n = Math.max(2, Math.ceil(Math.log10(hi / lo) * PEAK_GRID_PER_DECADE) + 1);
  const pts: number[] = [];
  for (let i = 0; i < n; i++) pts.push(lo * Math.pow(hi / lo, i / (n - 1)));
  pts[n - 1] = hi;
  for (const f of factors) {
    const r = rootsOf(f);
    for (let i = 0; i < r.length; i += 2) {
      const sigma = Math.abs(r[i] as number);
      const omega = r[i + 1] as number;
      if (sigma >= omega) continue; // Q below 0.5 in effect: as smooth on a log scale as a real root
      if (omega + 40 * sigma < lo || omega - 40 * sigma > hi) continue;
      for (let k = -ROOT_POINTS; k <= ROOT_POINTS; k++) {
        const w = omega + sigma * Math.sinh(k * ROOT_STEP);
        if (w > lo && w < hi) pts.push(w);
      }
    }
  }
  // one point where several factors share a root (equal sections, a stage and its own taps)
  const sorted = Float64Array.from(pts).sort();
  let kept = 1;
  for (let i = 1; i < sorted.length; i++) {
    if ((sorted[i] as number) > (sorted[kept - 1] as number) * (1 + 1e-9)) sorted[kept++] = sorted[i] as number;
  }
  if (sorted[kept - 1] !== hi) sorted[kept - 1] = hi;
  return sorted.slice(0, kept);
}

/** |H|^2 in the high-frequency limit: finite where every factor is proper, else Infinity; 0 where one is strictly proper. */
function highFrequencyLimit(factors: readonly ScaledRational[]): number {
  let out = 1;
  for (const f of factors) {
    const n = leading(f.num);
    const d = leading(f.den);
    if (n.degree > d.degree) return Infinity;
    out *= n.degree < d.degree ? 0 : (n.value / d.value) ** 2;
  }
  return out;
}

/** The degree and leading coefficient of a polynomial (descending coefficients, possibly with leading zeros). */
function leading(c: Float64Array): { readonly degree: number; readonly value: number } {
  let first = 0;
  while (first < c.length - 1 && c[first] === 0) first++;
  return { degree: c.length - 1 - first, value: c[first] as number };
}

/**
 * The largest |H|^2 of a cascade from its values on a {@link peakGrid}:
 * every local maximum refined by golden-section search on log frequency,
 * the DC value and the high-frequency limit compared with them.
 *
 * @param factors - the rational functions
 * @param grid - the grid (from {@link peakGrid} for these or more factors)
 * @param m2 - |H|^2 on the grid
 * @returns the maximum and where it is
 */
export function refinePeak(factors: readonly ScaledRational[], grid: Float64Array, m2: Float64Array): FoundPeak {
  const n = grid.length;
  let bestW = grid[0] as number;
  let best = m2[0] as number;
  const g = (x: number): number => magnitudeSquaredAt(factors, Math.exp(x));
  for (let i = 0; i < n; i++) {
    const here = m2[i] as number;
    const left = i > 0 ? (m2[i - 1] as number) : -Infinity;
    const right = i < n - 1 ? (m2[i + 1] as number) : -Infinity;
    if (left > here || right > here || !(here >= 0)) continue;
    let w = grid[i] as number;
    let m = here;
    if (i > 0 && i < n - 1) {
      const x = goldenMax(g, [Math.log(grid[i - 1] as number), Math.log(grid[i + 1] as number)], { iterations: 80, width: 1e-10 });
      const mx = g(x);
      if (mx > m) [w, m] = [Math.exp(x), mx];
    }
    if (m > best) [bestW, best] = [w, m];
  }
  const dc = magnitudeSquaredAt(factors, 0);
  if (dc >= best) [bestW, best] = [0, dc];
  const top = highFrequencyLimit(factors);
  if (Number.isFinite(top) && top > best) [bestW, best] = [grid[n - 1] as number, top];
  return { radS: bestW, magnitudeSquared: best };
}

/**
 * The true maximum of |H(j w)|^2 of a cascade over `[lo, hi]`, DC and the
 * high-frequency limit (see the module header). Internal: no checks.
 *
 * @param factors - the rational functions
 * @param spanRadS - `[lo, hi]`, rad/s, 0 < lo < hi
 * @returns the maximum and where it is
 */
export function peakMagnitudeSquared(factors: readonly ScaledRational[], spanRadS: readonly [number, number]): FoundPeak {
  const grid = peakGrid(factors, spanRadS);
  return refinePeak(factors, grid, cascadeMagnitudeSquared(factors, grid));
}

/** A stage of a cascade: its output transfer function and those to its op-amp outputs (the output's own object where an op-amp drives it). */
export interface TappedStage {
  /** Stage input to stage output. */
  readonly output: ScaledRational;
  /** Stage input to each op-amp output. */
  readonly taps: readonly ScaledRational[];
}

/** The peaks of one stage of {@link cascadePeaks}: from the cascade input to its output and to each op-amp output. */
export interface StagePeaks {
  /** To the stage output. */
  readonly output: FoundPeak;
  /** To each op-amp output, in the order of `taps`. */
  readonly taps: readonly FoundPeak[];
}

/**
 * The true maxima of |H|^2 from a cascade's input to every stage output and
 * every op-amp output, on one grid that resolves every root of the cascade
 * (the partial cascade before a stage is evaluated once and shared by its
 * taps). Internal: no checks.
 *
 * @param stages - the stages in cascade order
 * @param spanRadS - `[lo, hi]`, rad/s, 0 < lo < hi
 * @returns one entry per stage
 */
export function cascadePeaks(stages: readonly TappedStage[], spanRadS: readonly [number, number]): StagePeaks[] {
  const all = stages.flatMap((s) => [s.output, ...s.taps.filter((t) => t !== s.output)]);
  const grid = peakGrid(all, spanRadS);
  const before = new Float64Array(grid.length).fill(1);
  const m2 = new Float64Array(grid.length);
  const chain: ScaledRational[] = [];
  const peakTo = (f: ScaledRational): FoundPeak => {
    m2.set(before);
    multiplyMagnitudeSquared(f.num, f.den, f.scale, grid, m2);
    return refinePeak([...chain, f], grid, m2);
  };
  return stages.map((s) => {
    const output = peakTo(s.output);
    const taps = s.taps.map((t) => (t === s.output ? output : peakTo(t)));
    chain.push(s.output);
    multiplyMagnitudeSquared(s.output.num, s.output.den, s.output.scale, grid, before);
    return { output, taps };
  });
}
