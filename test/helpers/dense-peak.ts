/**
 * The reference for the found peaks: |H|^2 of a cascade on 200,000 log
 * points over the span, each local maximum of those refined by
 * golden-section search, the DC value and the high-frequency limit beside
 * them. Independent of the root-following grid it checks.
 */
import { cascadeMagnitudeSquared, magnitudeSquaredAt } from "../../src/evaluate/cascade.ts";
import type { ScaledRational } from "../../src/evaluate/types.ts";
import { goldenMax } from "../../src/math/optimize.ts";

/** Points of the dense reference grid. */
export const DENSE_POINTS = 200_000;

/** The highest |H|^2 of the cascade on the dense grid, refined, and the DC and high-frequency values. */
export function densePeak(factors: readonly ScaledRational[], spanRadS: readonly [number, number]): { radS: number; magnitudeSquared: number } {
  const [lo, hi] = spanRadS;
  const w = new Float64Array(DENSE_POINTS);
  for (let i = 0; i < DENSE_POINTS; i++) w[i] = lo * Math.pow(hi / lo, i / (DENSE_POINTS - 1));
  return refinedMax(factors, w, cascadeMagnitudeSquared(factors, w), hi);
}

/**
 * {@link densePeak} of every partial cascade to every tap of a tapped cascade
 * (the partial cascade before a stage evaluated once on the dense grid).
 */
export function denseCascadePeaks(
  stages: readonly { output: ScaledRational; taps: readonly ScaledRational[] }[],
  spanRadS: readonly [number, number],
): { output: { radS: number; magnitudeSquared: number }; taps: { radS: number; magnitudeSquared: number }[] }[] {
  const [lo, hi] = spanRadS;
  const w = new Float64Array(DENSE_POINTS);
  for (let i = 0; i < DENSE_POINTS; i++) w[i] = lo * Math.pow(hi / lo, i / (DENSE_POINTS - 1));
  let before = new Float64Array(DENSE_POINTS).fill(1);
  const chain: ScaledRational[] = [];
  return stages.map((s) => {
    const peakOf = (f: ScaledRational) => {
      const m = cascadeMagnitudeSquared([f], w);
      for (let i = 0; i < DENSE_POINTS; i++) m[i] = m[i]! * before[i]!;
      return refinedMax([...chain, f], w, m, hi);
    };
    const output = peakOf(s.output);
    const taps = s.taps.map(peakOf);
    chain.push(s.output);
    const m = cascadeMagnitudeSquared([s.output], w);
    before = before.map((x, i) => x * m[i]!);
    return { output, taps };
  });
}

/** The largest of the dense samples' refined local maxima, DC and the value far above the span. */
function refinedMax(factors: readonly ScaledRational[], w: Float64Array, m: Float64Array, hi: number): { radS: number; magnitudeSquared: number } {
  const dc = magnitudeSquaredAt(factors, 0);
  let best = { radS: 0, magnitudeSquared: dc >= 0 ? dc : 0 };
  const g = (x: number): number => magnitudeSquaredAt(factors, Math.exp(x));
  for (let i = 0; i < w.length; i++) {
    const here = m[i]!;
    if ((i > 0 && m[i - 1]! > here) || (i < w.length - 1 && m[i + 1]! > here)) continue;
    let at = { radS: w[i]!, magnitudeSquared: here };
    if (i > 0 && i < w.length - 1) {
      const x = goldenMax(g, [Math.log(w[i - 1]!), Math.log(w[i + 1]!)], { iterations: 80, width: 1e-12 });
      if (g(x) > here) at = { radS: Math.exp(x), magnitudeSquared: g(x) };
    }
    if (at.magnitudeSquared > best.magnitudeSquared) best = at;
  }
  const far = magnitudeSquaredAt(factors, hi * 1e6);
  if (far > best.magnitudeSquared) best = { radS: hi, magnitudeSquared: far };
  return best;
}
