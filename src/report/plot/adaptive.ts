/**
 * Adaptive sampling of curves over frequency for plotting: dense where the
 * response turns fast (peaks, notches, the phase jump at a notch), sparse
 * where it is straight, and the exact extremes of peaks and notches.
 *
 * Method: recursive interval subdivision with a midpoint test (the adaptive
 * plotting scheme of J. Nievergelt & K. Hinrichs, "Algorithms and Data
 * Structures", Prentice Hall, 1993, section on curve plotting; common in
 * plotting programs): start from a log grid; for every interval evaluate the
 * curves at its geometric midpoint and split it there when a curve's value
 * departs from the straight line between the interval's ends (the segment
 * the plot would draw) by more than its tolerance (a fraction of a pixel,
 * in data units, from the caller). Intervals are refined breadth-first, all
 * midpoints of a round evaluated in one call; the intervals with the largest
 * departure go first when the point budget runs out, and no interval is
 * split below a relative width of 1e-9. Then every interior local extreme of
 * the curves marked for it is refined by golden-section search on log
 * frequency over its two neighbouring intervals (J. Kiefer, "Sequential
 * minimax search for a maximum", Proc. AMS 4(3):502-506, 1953), to a width of
 * 1e-10 decades, and the extreme point added. A peak or notch bottom is
 * therefore drawn at its true height to the accuracy of the search (far
 * below 0.01 dB), not at whatever height the grid happened to hit.
 *
 * A curve given a period (degrees of phase: 360) is compared modulo it, so a
 * wrapped angle does not look like a jump; the caller unwraps it afterwards.
 *
 * @module
 */
import { goldenMax } from "../../math/optimize.ts";

/** Curves at given frequencies: one array per curve, one value per frequency. */
export type CurveEvaluator = (freqHz: Float64Array) => Float64Array[];

/** Options of {@link adaptiveSample}. */
export interface AdaptiveOptions {
  /** First frequency, Hz. */
  readonly startHz: number;
  /** Last frequency, Hz. */
  readonly stopHz: number;
  /** Points of the starting log grid. */
  readonly initialPoints: number;
  /** Most points in all. */
  readonly maxPoints: number;
  /** Largest departure from the drawn segment per curve, data units. */
  readonly tolerance: readonly number[];
  /** Values are compared after clamping to this range per curve (null: no clamp), so detail far outside the frame is not chased. */
  readonly clamp?: readonly (readonly [number, number] | null)[];
  /** Period of a wrapped curve (360 for degrees of phase), or null. */
  readonly period?: readonly (number | null)[];
  /** Curves whose local extremes are refined by search. */
  readonly polish?: readonly boolean[];
}

/** Sampled curves. */
export interface SampledCurves {
  /** Frequencies, Hz, increasing. */
  readonly freqHz: Float64Array;
  /** One array per curve. */
  readonly curves: readonly Float64Array[];
}

/** The difference a - b, wrapped into (-period/2, period/2] when a period is given. */
function diff(a: number, b: number, period: number | null): number {
  const d = a - b;
  if (period === null) return d;
  return d - period * Math.round(d / period);
}

/** How far the midpoint departs from the segment, in tolerances (Infinity where one value is not finite and another is). */
function departure(
  ys: readonly Float64Array[],
  i: number,
  mids: readonly Float64Array[],
  k: number,
  o: AdaptiveOptions,
): number {
  let worst = 0;
  for (let c = 0; c < ys.length; c++) {
    const clamp = o.clamp?.[c] ?? null;
    const period = o.period?.[c] ?? null;
    const cl = (v: number): number => (clamp === null || !Number.isFinite(v) ? v : Math.min(clamp[1], Math.max(clamp[0], v)));
    const a = cl((ys[c] as Float64Array)[i] as number);
    const b = cl((ys[c] as Float64Array)[i + 1] as number);
    const m = cl((mids[c] as Float64Array)[k] as number);
    const finite = [a, b, m].filter(Number.isFinite).length;
    if (finite === 0) continue;
    if (finite < 3) return Infinity;
    const bb = a + diff(b, a, period);
    const line = (a + bb) / 2;
    const dev = Math.abs(diff(m, line, period)) / (o.tolerance[c] as number);
    if (dev > worst) worst = dev;
  }
  return worst;
}

/** Insert new points (sorted by frequency) into the sorted samples. */
function merge(f: Float64Array, ys: readonly Float64Array[], nf: Float64Array, nys: readonly Float64Array[]): { f: Float64Array; ys: Float64Array[] } {
  const n = f.length + nf.length;
  const order = Array.from({ length: nf.length }, (_, k) => k).sort((a, b) => (nf[a] as number) - (nf[b] as number));
  const out = new Float64Array(n);
  const outY = ys.map(() => new Float64Array(n));
  let i = 0;
  let j = 0;
  for (let k = 0; k < n; k++) {
    const takeOld = j >= order.length || (i < f.length && (f[i] as number) <= (nf[order[j] as number] as number));
    if (takeOld) {
      out[k] = f[i] as number;
      ys.forEach((y, c) => ((outY[c] as Float64Array)[k] = y[i] as number));
      i++;
    } else {
      const q = order[j] as number;
      out[k] = nf[q] as number;
      nys.forEach((y, c) => ((outY[c] as Float64Array)[k] = y[q] as number));
      j++;
    }
  }
  return { f: out, ys: outY };
}

/** The geometric grid of `n` points from a to b. */
function logSpaced(a: number, b: number, n: number): Float64Array {
  const out = new Float64Array(n);
  const la = Math.log(a);
  const step = (Math.log(b) - la) / (n - 1);
  for (let i = 0; i < n; i++) out[i] = i === n - 1 ? b : Math.exp(la + step * i);
  return out;
}

/** Bisection rounds (see the module header). */
function refine(evaluate: CurveEvaluator, o: AdaptiveOptions, f0: Float64Array, y0: Float64Array[]): { f: Float64Array; ys: Float64Array[] } {
  let f = f0;
  let ys = y0;
  // intervals still to test, by their left index; the first round tests them all
  let active: number[] = Array.from({ length: f.length - 1 }, (_, i) => i);
  while (active.length > 0 && f.length < o.maxPoints) {
    const usable = active.filter((i) => (f[i + 1] as number) / (f[i] as number) - 1 > 1e-9);
    if (usable.length === 0) break;
    const mid = Float64Array.from(usable, (i) => Math.sqrt((f[i] as number) * (f[i + 1] as number)));
    const my = evaluate(mid);
    const scored = usable.map((i, k) => ({ i, k, d: departure(ys, i, my, k, o) })).filter((s) => s.d > 1);
    if (scored.length === 0) break;
    scored.sort((a, b) => b.d - a.d);
    const keep = scored.slice(0, Math.max(0, o.maxPoints - f.length));
    const nf = Float64Array.from(keep, (s) => mid[s.k] as number);
    const nys = my.map((y) => Float64Array.from(keep, (s) => y[s.k] as number));
    const leftOf = new Set(keep.map((s) => mid[s.k] as number));
    ({ f, ys } = merge(f, ys, nf, nys));
    // both halves of every split interval are tested next round
    active = [];
    for (let i = 0; i < f.length - 1; i++) if (leftOf.has(f[i] as number) || leftOf.has(f[i + 1] as number)) active.push(i);
  }
  return { f, ys };
}

/** The refined extremes of the polished curves: new points to add. */
function polishExtremes(evaluate: CurveEvaluator, o: AdaptiveOptions, f: Float64Array, ys: readonly Float64Array[]): number[] {
  const found: number[] = [];
  ys.forEach((y, c) => {
    if (o.polish?.[c] !== true) return;
    const candidates: number[] = [];
    for (let i = 1; i < f.length - 1; i++) {
      const a = y[i - 1] as number;
      const b = y[i] as number;
      const d = y[i + 1] as number;
      if (!Number.isFinite(a) || !Number.isFinite(b) || !Number.isFinite(d)) continue;
      if ((b > a && b >= d) || (b < a && b <= d)) candidates.push(i);
    }
    // the sharpest first, at most 64
    const sharp = (i: number): number => Math.abs(2 * (y[i] as number) - (y[i - 1] as number) - (y[i + 1] as number));
    candidates.sort((p, q) => sharp(q) - sharp(p));
    for (const i of candidates.slice(0, 64)) {
      const sign = (y[i] as number) > (y[i - 1] as number) ? 1 : -1;
      const at = (lf: number): number => {
        const v = ((evaluate(Float64Array.of(10 ** lf))[c] as Float64Array)[0] as number);
        return Number.isFinite(v) ? sign * v : sign > 0 ? -Infinity : Infinity;
      };
      const lf = goldenMax((x) => at(x), [Math.log10(f[i - 1] as number), Math.log10(f[i + 1] as number)], { iterations: 200, width: 1e-10 });
      found.push(10 ** lf);
    }
  });
  return found;
}

/**
 * Sample curves over frequency adaptively (see the module header).
 *
 * @param evaluate - the curves at given frequencies
 * @param options - span, point counts, tolerances
 * @returns the frequencies and the curves on them
 */
export function adaptiveSample(evaluate: CurveEvaluator, options: AdaptiveOptions): SampledCurves {
  const f0 = logSpaced(options.startHz, options.stopHz, options.initialPoints);
  let { f, ys } = refine(evaluate, options, f0, evaluate(f0));
  const extra = polishExtremes(evaluate, options, f, ys).filter((x) => x > (f[0] as number) && x < (f[f.length - 1] as number));
  if (extra.length > 0) {
    const nf = Float64Array.from(new Set(extra));
    ({ f, ys } = merge(f, ys, nf, evaluate(nf)));
  }
  return { freqHz: f, curves: ys };
}
