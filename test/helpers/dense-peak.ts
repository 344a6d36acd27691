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
  const m = cascadeMagnitudeSquared(factors, w);
  let best = { radS: 0, magnitudeSquared: magnitudeSquaredAt(factors, 0) };
  if (!(best.magnitudeSquared >= 0)) best = { radS: 0, magnitudeSquared: 0 };
  const g = (x: number): number => magnitudeSquaredAt(factors, Math.exp(x));
  for (let i = 0; i < DENSE_POINTS; i++) {
    const here = m[i]!;
    if ((i > 0 && m[i - 1]! > here) || (i < DENSE_POINTS - 1 && m[i + 1]! > here)) continue;
    let at = { radS: w[i]!, magnitudeSquared: here };
    if (i > 0 && i < DENSE_POINTS - 1) {
      const x = goldenMax(g, [Math.log(w[i - 1]!), Math.log(w[i + 1]!)], { iterations: 80, width: 1e-12 });
      if (g(x) > here) at = { radS: Math.exp(x), magnitudeSquared: g(x) };
    }
    if (at.magnitudeSquared > best.magnitudeSquared) best = at;
  }
  // the high-frequency limit: |H|^2 far above the span, where a proper cascade has settled
  const far = magnitudeSquaredAt(factors, hi * 1e6);
  if (far > best.magnitudeSquared) best = { radS: hi, magnitudeSquared: far };
  return best;
}
