import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { bracketRoot, type BracketRootOptions } from "../../src/math/bracket.ts";
import { expectClose } from "../helpers/tolerance.ts";

const EDGE: BracketRootOptions = { maxIterations: 400, bisectEvery: 5, relWidth: 2 * Number.EPSILON, result: "smaller-residual" };
const CROSSING: BracketRootOptions = { maxIterations: 100, bisectEvery: 10, relWidth: 4 * Number.EPSILON, result: "latest" };

describe("bracketRoot", () => {
  it("finds sqrt(2), pi and the Dottie number to a few ulp", () => {
    expectClose(bracketRoot((x) => x * x - 2, 0, 2, EDGE), Math.SQRT2, { rel: 4e-16 });
    expectClose(bracketRoot(Math.sin, 3, 4, EDGE), Math.PI, { rel: 4e-16 });
    // cos x = x at 0.739085133215160641655312087673... (mpmath.findroot, 30 digits)
    expectClose(bracketRoot((x) => Math.cos(x) - x, 0, 1, CROSSING), 0.7390851332151607, { rel: 1e-15 });
  });

  it("returns an end that is an exact zero at once", () => {
    let calls = 0;
    const f = (x: number): number => {
      calls++;
      return x - 1;
    };
    expect(bracketRoot(f, 1, 5, EDGE)).toBe(1);
    expect(bracketRoot(f, -3, 1, EDGE)).toBe(1);
    expect(calls).toBe(4); // both ends are evaluated, nothing more
  });

  it("returns the end with the smaller residual when there is no sign change", () => {
    expect(bracketRoot((x) => x * x + 1, 0.5, 3, EDGE)).toBe(0.5);
    expect(bracketRoot((x) => x * x + 1, -3, -0.25, CROSSING)).toBe(-0.25);
  });

  it("converges on a function flat on one side, where plain regula falsi stalls (the Illinois step)", () => {
    // f(x) = x^10 - 0.5 on [0, 1.5]: the secant keeps the right end; halving its value restores superlinear steps.
    let calls = 0;
    const root = bracketRoot(
      (x) => {
        calls++;
        return x ** 10 - 0.5;
      },
      0,
      1.5,
      EDGE,
    );
    expectClose(root, 0.5 ** 0.1, { rel: 1e-15 });
    expect(calls).toBeLessThan(60);
  });

  it("stops at maxIterations and still returns a point of the bracket", () => {
    const root = bracketRoot((x) => x - 0.3, 0, 1, { maxIterations: 1, bisectEvery: 1, relWidth: 0, result: "latest" });
    expect(root).toBe(0.5); // one bisection step
  });

  it("property: for a cubic with one real root in the bracket, the result is within 1e-12 of it", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        fc.double({ min: 0.1, max: 50, noNaN: true }),
        (r, k, width) => {
          // (x - r)((x - r)^2 + k) is monotone, with its only real root at r.
          const f = (x: number): number => (x - r) * ((x - r) * (x - r) + k);
          const a = r - width * 0.37;
          const b = r + width;
          const got = bracketRoot(f, a, b, EDGE);
          expect(got).toBeGreaterThanOrEqual(a);
          expect(got).toBeLessThanOrEqual(b);
          expect(Math.abs(got - r)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(r)));
        },
      ),
      { seed: 91, numRuns: 300 },
    );
  });
});
