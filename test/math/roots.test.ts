import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { polyRoots } from "../../src/math/roots.ts";
import { polyFromRoots } from "../../src/math/polynomial.ts";
import { ConvergenceError, InvalidArgumentError } from "../../src/errors.ts";
import { complexList, loadFixture } from "../helpers/fixtures.ts";
import { expectComplexSetClose } from "../helpers/tolerance.ts";

const fx = loadFixture<{ roots: { coeffs: number[]; roots: [number, number][] }[] }>("math-polynomial.json");

describe("polyRoots vs mpmath.polyroots", () => {
  fx.roots.forEach((c, i) => {
    it(`case ${i}: degree ${c.coeffs.length - 1}`, () => {
      const got = polyRoots(c.coeffs);
      // Relative to each root's modulus; the double-double polish reaches rounding level.
      expectComplexSetClose(got, complexList(c.roots), { rel: 1e-14, abs: 1e-300 });
    });
  });
});

describe("polyRoots output form", () => {
  it("returns exact conjugate pairs and exactly real roots, sorted", () => {
    const r = polyRoots([1, 3.2, 7.1, 9.6, 8.3, 4.4, 1.3]);
    for (const z of r) {
      if (z.im !== 0) expect(r.some((u) => u.re === z.re && u.im === -z.im)).toBe(true);
    }
    const three = polyRoots([1, -6, 11, -6]);
    expect(three.map((z) => z.im)).toEqual([0, 0, 0]);
    expect(three.map((z) => z.re)).toEqual([1, 2, 3]);
  });

  it("handles leading zeros, zero roots, and degrees 0 and 1", () => {
    expect(polyRoots([0, 0, 2, -4, 0, 0])).toEqual([
      { re: 0, im: 0 },
      { re: 0, im: 0 },
      { re: 2, im: 0 },
    ]);
    expect(polyRoots([5])).toEqual([]);
    expect(polyRoots([2, 1])).toEqual([{ re: -0.5, im: 0 }]);
  });

  it("uses lowParts as extra precision of the coefficients", () => {
    // (x - a)(x - b), a = 1 + 2^-31, b = 1 + 2^-30: the constant term ab needs 62 bits.
    const a = 1 + 2 ** -31;
    const b = 1 + 2 ** -30;
    const coeffs = [1, -(a + b), 1 + 2 ** -30 + 2 ** -31];
    const low = [0, 0, 2 ** -61];
    const exact = polyRoots(coeffs, { lowParts: low });
    expect(Math.abs((exact[0]?.re ?? 0) - a)).toBeLessThan(1e-15);
    expect(Math.abs((exact[1]?.re ?? 0) - b)).toBeLessThan(1e-15);
    // without the low part the rounded constant moves the roots by ~2^-30
    const rounded = polyRoots(coeffs);
    expect(Math.abs((rounded[0]?.re ?? 0) - a)).toBeGreaterThan(1e-10);
    const r2 = polyRoots([1, -3, 2], { lowParts: [0, 0, 0] });
    expect(r2).toEqual([
      { re: 1, im: 0 },
      { re: 2, im: 0 },
    ]);
  });

  it("rejects the zero polynomial, bad options and non-finite input", () => {
    expect(() => polyRoots([0, 0])).toThrow(InvalidArgumentError);
    expect(() => polyRoots([])).toThrow(InvalidArgumentError);
    expect(() => polyRoots([1, Number.NaN])).toThrow(/coeffs\[1\]/);
    expect(() => polyRoots([1, 2], { lowParts: [0] })).toThrow(/lowParts/);
    expect(() => polyRoots([1, 2], 3 as unknown as object)).toThrow(InvalidArgumentError);
    expect(new ConvergenceError({ fn: "polyRoots", path: "", message: "x" }).code).toBe("NOT_CONVERGED");
  });
});

describe("polyRoots round trip (property)", () => {
  const root = fc
    .tuple(fc.double({ min: -5, max: -0.05, noNaN: true }), fc.double({ min: 0, max: 5, noNaN: true }), fc.boolean())
    .map(([re, im, real]) => ({ re, im: real ? 0 : im }));
  it("recovers well-separated conjugate-closed roots of polyFromRoots", () => {
    fc.assert(
      fc.property(fc.array(root, { minLength: 1, maxLength: 6 }), (half) => {
        const roots = half.flatMap((r) => (r.im === 0 ? [r] : [r, { re: r.re, im: -r.im }]));
        // keep only well separated sets (repeated roots are intrinsically ill conditioned)
        for (let i = 0; i < roots.length; i++)
          for (let j = i + 1; j < roots.length; j++) {
            const a = roots[i]!;
            const b = roots[j]!;
            if (Math.hypot(a.re - b.re, a.im - b.im) < 0.2) return true;
          }
        const got = polyRoots(polyFromRoots(roots));
        if (got.length !== roots.length) return false;
        for (const r of roots) {
          const best = Math.min(...got.map((g) => Math.hypot(g.re - r.re, g.im - r.im)));
          if (best > 1e-9 * Math.max(1, Math.hypot(r.re, r.im))) return false;
        }
        return true;
      }),
      { numRuns: 150 },
    );
  });
});

describe("polyRoots robustness", () => {
  it("handles coefficient ranges near the limits of double precision", () => {
    // 1e-300 x^2 + x + 1e300: roots (-1 +- j sqrt(3)) / 2e-300
    const r = polyRoots([1e-300, 1, 1e300]);
    expect(r).toHaveLength(2);
    expect(Math.abs(r[0]!.re / -5e299 - 1)).toBeLessThan(1e-14);
    expect(Math.abs(r[0]!.im / (Math.sqrt(3) * 5e299) - 1)).toBeLessThan(1e-14);
  });

  it("returns every root with a backward error at rounding level (random degrees 2..60, property)", () => {
    const coeff = fc.tuple(fc.integer({ min: -1000, max: 1000 }), fc.integer({ min: -3, max: 3 })).map(([m, e]) => (m / 1000) * 10 ** e);
    fc.assert(
      fc.property(fc.array(coeff, { minLength: 3, maxLength: 61 }), (c) => {
        fc.pre(c[0] !== 0 && c[c.length - 1] !== 0);
        const roots = polyRoots(c);
        if (roots.length !== c.length - 1) return false;
        for (const z of roots) {
          let pr = 0;
          let pi = 0;
          let bound = 0;
          const az = Math.hypot(z.re, z.im);
          for (const a of c) {
            const t = pr * z.re - pi * z.im + a;
            pi = pr * z.im + pi * z.re;
            pr = t;
            bound = bound * az + Math.abs(a);
          }
          // |p(z)| relative to sum |a_k||z|^k: the root is exact for a polynomial within that relative distance
          if (Math.hypot(pr, pi) > 1e-13 * bound) return false;
        }
        return true;
      }),
      { numRuns: 60 },
    );
  });
});
