import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { cascadeMagnitudeSquared, cascadeResponse, multiplyMagnitudeSquared, splitEvenOdd } from "../../src/evaluate/cascade.ts";
import type { ScaledRational } from "../../src/evaluate/types.ts";
import { logGrid } from "../../src/tf/grid.ts";
import { expectSameBits } from "../helpers/same-bits.ts";

/** Product of real polynomials (descending coefficients). */
function times(a: readonly number[], b: readonly number[]): number[] {
  const out = new Array<number>(a.length + b.length - 1).fill(0);
  a.forEach((x, i) => b.forEach((y, j) => (out[i + j] = out[i + j]! + x * y)));
  return out;
}

/** A stage from pole pairs (w0, Q), real poles and a numerator chosen by kind, in z = s / scale. */
function stage(pairs: readonly [number, number][], reals: readonly number[], kind: number, k: number): ScaledRational {
  let den = [1];
  for (const [w, q] of pairs) den = times(den, [1, w / q, w * w]);
  for (const r of reals) den = times(den, [1 / r, 1]);
  const order = den.length - 1;
  // lowpass, highpass, bandpass or notch numerators of at most the denominator's degree
  const w0 = pairs[0]![0];
  const numerators = [[k], [k, 0, 0], [k * w0, 0], [k, 0, k * w0 * w0 * 0.8]];
  let num = numerators[kind % numerators.length]!;
  if (num.length - 1 > order) num = [k];
  // pad with leading zeros as the compiled stages do
  const pad = (c: number[], n: number): Float64Array => Float64Array.from([...new Array<number>(n - c.length).fill(0), ...c]);
  const n = Math.max(num.length, den.length) + 1;
  return { num: pad(num, n), den: pad(den, n), scale: 2 * Math.PI * 1000 };
}

describe("cascadeMagnitudeSquared (even and odd parts on the jw axis)", () => {
  it("splits a polynomial into its even and odd parts in -x^2", () => {
    // p = 2 z^3 + 3 z^2 + 5 z + 7: p(jx) = (7 - 3x^2) + j x (5 - 2x^2), so E(t) = 7 + 3t, O(t) = 5 + 2t at t = -x^2
    const parts = new Float64Array(6);
    expect(splitEvenOdd(Float64Array.from([0, 0, 2, 3, 5, 7]), parts, 0, 3)).toBe(3);
    expect(Array.from(parts)).toEqual([7, 3, 0, 5, 2, 0]);
  });

  it("agrees with the complex form to 1e-10 dB over random cascades (Q up to 1000, up to four op-amp-like real poles: every unrolled loop and the general one)", () => {
    const w = logGrid(2 * Math.PI * 1, 2 * Math.PI * 1e6, 2000);
    let worst = 0;
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            pairs: fc.array(fc.tuple(fc.double({ min: 0.05, max: 20, noNaN: true }), fc.double({ min: 0.3, max: 1000, noNaN: true })), { minLength: 1, maxLength: 2 }),
            reals: fc.array(fc.double({ min: 5, max: 3000, noNaN: true }), { maxLength: 4 }),
            kind: fc.nat(3),
            k: fc.double({ min: 0.1, max: 10, noNaN: true }),
          }),
          { minLength: 1, maxLength: 4 },
        ),
        (specs) => {
          const stages = specs.map((s) => stage(s.pairs, s.reals, s.kind, s.k));
          const m2 = cascadeMagnitudeSquared(stages, w);
          const { re, im } = cascadeResponse(stages, w);
          const refs = Array.from(w, (_, i) => re[i]! * re[i]! + im[i]! * im[i]!);
          const top = Math.max(...refs);
          for (let i = 0; i < w.length; i++) {
            const ref = refs[i]!;
            // 100 dB and more below the cascade's peak (a notch bottom), both forms have an absolute, not a relative, error
            if (ref < 1e-10 * top) {
              if (!(Math.abs(Math.sqrt(m2[i]!) - Math.sqrt(ref)) < 1e-14 * Math.sqrt(top))) return false;
              continue;
            }
            const e = Math.abs(10 * Math.log10(m2[i]! / ref));
            worst = Math.max(worst, e);
            if (!(e < 1e-10)) return false;
          }
          return true;
        },
      ),
      { numRuns: 300 },
    );
    expect(worst).toBeLessThan(1e-10);
  });

  it("gives the bits of one pass per stage (stages taken two at a time where both take the same unrolled loop: biquads, degree six and below, mixed, and above)", () => {
    const w = logGrid(2 * Math.PI * 1, 2 * Math.PI * 1e6, 997);
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            pairs: fc.array(fc.tuple(fc.double({ min: 0.05, max: 20, noNaN: true }), fc.double({ min: 0.3, max: 1000, noNaN: true })), { minLength: 1, maxLength: 3 }),
            reals: fc.array(fc.double({ min: 5, max: 3000, noNaN: true }), { maxLength: 3 }),
            kind: fc.nat(3),
            k: fc.double({ min: 0.1, max: 10, noNaN: true }),
          }),
          { minLength: 1, maxLength: 5 },
        ),
        (specs) => {
          const stages = specs.map((s) => stage(s.pairs, s.reals, s.kind, s.k));
          const passes = new Float64Array(w.length).fill(1);
          for (const s of stages) multiplyMagnitudeSquared(s.num, s.den, s.scale, w, passes);
          expectSameBits(cascadeMagnitudeSquared(stages, w), passes);
        },
      ),
      { numRuns: 200 },
    );
  });
});
