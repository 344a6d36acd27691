import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { complexLuFactor, complexLuSolve } from "../../src/math/linear.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { loadFixture } from "../helpers/fixtures.ts";

interface Case {
  n: number;
  aRe: number[];
  aIm: number[];
  bRe: number[];
  bIm: number[];
  xRe: number[];
  xIm: number[];
  cond: number;
}

const fixture = loadFixture<{ cases: Case[] }>("circuit-linear-solve.json");

describe("complexLuSolve", () => {
  it("matches numpy.linalg.solve on row-scaled random complex systems", () => {
    for (const c of fixture.cases) {
      const lu = complexLuFactor({ n: c.n, re: Float64Array.from(c.aRe), im: Float64Array.from(c.aIm) });
      expect(lu.singularColumn).toBe(-1);
      const x = complexLuSolve(lu, { re: Float64Array.from(c.bRe), im: Float64Array.from(c.bIm) });
      let norm = 0;
      for (let i = 0; i < c.n; i++) norm = Math.max(norm, Math.hypot(c.xRe[i] as number, c.xIm[i] as number));
      for (let i = 0; i < c.n; i++) {
        const d = Math.hypot((x.re[i] as number) - (c.xRe[i] as number), (x.im[i] as number) - (c.xIm[i] as number));
        // forward error bounded by condition number times unit roundoff (with margin)
        expect(d / norm).toBeLessThan(Math.max(1e-13, c.cond * 1e-14));
      }
    }
  });

  it("has a residual at rounding level for random systems (property)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 9 }),
        fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: 2 * 81 + 18, maxLength: 2 * 81 + 18 }),
        (n, vals) => {
          const re = Float64Array.from(vals.slice(0, n * n));
          const im = Float64Array.from(vals.slice(81, 81 + n * n));
          for (let i = 0; i < n; i++) re[i * n + i] = (re[i * n + i] as number) + 25; // keep it regular
          const b = { re: Float64Array.from(vals.slice(162, 162 + n)), im: Float64Array.from(vals.slice(171, 171 + n)) };
          const x = complexLuSolve(complexLuFactor({ n, re, im }), b);
          for (let i = 0; i < n; i++) {
            let sr = 0;
            let si = 0;
            for (let j = 0; j < n; j++) {
              const ar = re[i * n + j] as number;
              const ai = im[i * n + j] as number;
              sr += ar * (x.re[j] as number) - ai * (x.im[j] as number);
              si += ar * (x.im[j] as number) + ai * (x.re[j] as number);
            }
            expect(Math.hypot(sr - (b.re[i] as number), si - (b.im[i] as number))).toBeLessThan(1e-11);
          }
        },
      ),
      { numRuns: 100 },
    );
  });

  it("pivots when the leading entry is zero", () => {
    const lu = complexLuFactor({ n: 2, re: new Float64Array([0, 2, 1, 0]), im: new Float64Array(4) });
    expect(Array.from(lu.pivots)).toEqual([1, 0]);
    const x = complexLuSolve(lu, { re: new Float64Array([4, 3]), im: new Float64Array(2) });
    expect(Array.from(x.re)).toEqual([3, 2]);
  });
});

describe("complexLuFactor", () => {
  it("flags the first singular column", () => {
    // second column is twice the first
    const lu = complexLuFactor({ n: 2, re: new Float64Array([1, 2, 3, 6]), im: new Float64Array([1, 2, 0, 0]) });
    expect(lu.singularColumn).toBe(1);
    expect(() => complexLuSolve(lu, { re: new Float64Array(2), im: new Float64Array(2) })).toThrow(InvalidArgumentError);
  });

  it("rejects malformed matrices with a path", () => {
    expect(() => complexLuFactor({ n: 2, re: new Float64Array(3), im: new Float64Array(4) })).toThrow(/a\.re/);
    expect(() => complexLuFactor({ n: 1, re: new Float64Array([NaN]), im: new Float64Array(1) })).toThrow(/a\.re\[0\]/);
  });
});
