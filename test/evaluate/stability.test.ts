import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { isHurwitz, rightHalfPlaneRoots } from "../../src/evaluate/stability.ts";
import { polyFromRoots } from "../../src/math/polynomial.ts";
import { polyRoots } from "../../src/math/roots.ts";
import type { Complex } from "../../src/math/complex.ts";

/** A real polynomial from conjugate-closed roots, with some leading zeros of storage. */
function fromRoots(roots: Complex[], pad: number): Float64Array {
  const c = polyFromRoots(roots);
  const out = new Float64Array(c.length + pad);
  out.set(c, pad);
  return out;
}

describe("rightHalfPlaneRoots (Routh array)", () => {
  it("counts the right-half-plane roots of polynomials built from known roots", () => {
    const root = fc.record({
      re: fc.double({ min: 0.05, max: 3, noNaN: true }),
      im: fc.double({ min: 0, max: 3, noNaN: true }),
      right: fc.boolean(),
      pair: fc.boolean(),
    });
    fc.assert(
      fc.property(fc.array(root, { minLength: 1, maxLength: 6 }), fc.integer({ min: 0, max: 3 }), (rs, pad) => {
        const roots: Complex[] = [];
        let rhp = 0;
        for (const r of rs) {
          const re = r.right ? r.re : -r.re;
          if (r.pair && r.im > 0.01) {
            roots.push({ re, im: r.im }, { re, im: -r.im });
            if (r.right) rhp += 2;
          } else {
            roots.push({ re, im: 0 });
            if (r.right) rhp += 1;
          }
        }
        expect(rightHalfPlaneRoots(fromRoots(roots, pad))).toBe(rhp);
      }),
      { numRuns: 300, seed: 7 },
    );
  });

  it("agrees with the polynomial root finder on random real coefficients", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -200, max: 200 }), { minLength: 2, maxLength: 9 }), (ks) => {
        const cs = ks.map((k) => (k === 0 ? 0.37 : k / 100));
        const roots = polyRoots(cs);
        // skip coefficient sets with a root too close to the axis for either method to decide
        fc.pre(roots.every((r) => Math.abs(r.re) > 1e-6 * Math.max(1, Math.hypot(r.re, r.im))));
        const rhp = roots.filter((r) => r.re > 0).length;
        expect(rightHalfPlaneRoots(Float64Array.from(cs))).toBe(rhp);
      }),
      { numRuns: 400, seed: 3 },
    );
  });

  it("a second-order section is stable exactly when all three coefficients share a sign", () => {
    expect(isHurwitz(Float64Array.of(1, 0.1, 1))).toBe(true);
    expect(isHurwitz(Float64Array.of(-1, -0.1, -1))).toBe(true);
    expect(isHurwitz(Float64Array.of(1, -0.1, 1))).toBe(false);
    expect(rightHalfPlaneRoots(Float64Array.of(1, -0.1, 1))).toBe(2);
    expect(isHurwitz(Float64Array.of(1, 0, 1))).toBe(false); // roots on the axis: an oscillator, not stable
    expect(isHurwitz(Float64Array.of(0, 0, 2, 1))).toBe(true); // degree 1 stored with leading zeros
    expect(isHurwitz(Float64Array.of(0, 0, 3))).toBe(true); // a constant has no roots
  });

  it("a high-Q pole pair (Q = 1e4) is still decided correctly", () => {
    const q = 1e4;
    expect(isHurwitz(Float64Array.of(1, 1 / q, 1))).toBe(true);
    expect(isHurwitz(Float64Array.of(1, -1 / q, 1))).toBe(false);
    // a third-order characteristic polynomial of a stage with an op-amp pole at 100x its f0
    const stable = fromRoots([{ re: -0.5 / q, im: 1 }, { re: -0.5 / q, im: -1 }, { re: -100, im: 0 }], 1);
    expect(isHurwitz(stable)).toBe(true);
  });
});
