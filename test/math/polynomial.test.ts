import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { polyAdd, polyDerivative, polyEval, polyEvalReal, polyFromRoots, polyMul } from "../../src/math/polynomial.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { complexList, loadFixture } from "../helpers/fixtures.ts";
import { expectArrayClose, expectClose } from "../helpers/tolerance.ts";

interface Case {
  a: number[];
  b: number[];
  mul: number[];
  add: number[];
  derA: number[];
  z: [number, number];
  evalA: [number, number];
  x: number;
  evalRealB: number;
}
const fx = loadFixture<{
  arithmetic: Case[];
  fromRoots: { roots: [number, number][]; coeffs: number[] }[];
}>("math-polynomial.json");

describe("polyMul / polyAdd / polyDerivative / polyEval / polyEvalReal vs numpy", () => {
  fx.arithmetic.forEach((c, i) => {
    it(`case ${i}: degrees ${c.a.length - 1} and ${c.b.length - 1}`, () => {
      expectArrayClose(polyMul(c.a, c.b), c.mul, { rel: 1e-14, abs: 1e-14, label: "polyMul" });
      expectArrayClose(polyAdd(c.a, c.b), c.add, { rel: 1e-15, abs: 1e-15, label: "polyAdd" });
      expectArrayClose(polyDerivative(c.a), c.derA, { rel: 1e-15, label: "polyDerivative" });
      const v = polyEval(c.a, { re: c.z[0], im: c.z[1] });
      expectClose(v.re, c.evalA[0], { rel: 1e-13, abs: 1e-14, label: "polyEval.re" });
      expectClose(v.im, c.evalA[1], { rel: 1e-13, abs: 1e-14, label: "polyEval.im" });
      expectClose(polyEvalReal(c.b, c.x), c.evalRealB, { rel: 1e-13, abs: 1e-14, label: "polyEvalReal" });
    });
  });
});

describe("polyFromRoots vs numpy.poly", () => {
  fx.fromRoots.forEach((c, i) => {
    it(`case ${i}`, () => {
      expectArrayClose(polyFromRoots(complexList(c.roots)), c.coeffs, { rel: 1e-13, abs: 1e-13 });
    });
  });

  it("rejects a complex root without its conjugate", () => {
    expect(() => polyFromRoots([{ re: -1, im: 1 }])).toThrow(InvalidArgumentError);
    expect(() => polyFromRoots([{ re: -1, im: 1 }, { re: -1, im: -1.1 }])).toThrow(/conjugate/);
  });
});

describe("polynomial algebra properties", () => {
  const coeff = fc.double({ min: -10, max: 10, noNaN: true });
  const poly = fc.array(coeff, { minLength: 1, maxLength: 8 });
  const point = fc.record({ re: fc.double({ min: -2, max: 2, noNaN: true }), im: fc.double({ min: -2, max: 2, noNaN: true }) });

  it("polyEval(polyMul(a, b), z) = polyEval(a, z) * polyEval(b, z)", () => {
    fc.assert(
      fc.property(poly, poly, point, (a, b, z) => {
        const p = polyEval(polyMul(a, b), z);
        const pa = polyEval(a, z);
        const pb = polyEval(b, z);
        const re = pa.re * pb.re - pa.im * pb.im;
        const im = pa.re * pb.im + pa.im * pb.re;
        const scale = (a.reduce((s, v) => s + Math.abs(v), 0) + 1) * (b.reduce((s, v) => s + Math.abs(v), 0) + 1) * 2 ** 16;
        return Math.abs(p.re - re) <= 1e-12 * scale && Math.abs(p.im - im) <= 1e-12 * scale;
      }),
      { numRuns: 200 },
    );
  });

  it("polyEval(polyAdd(a, b), x) = polyEvalReal(a, x) + polyEvalReal(b, x)", () => {
    fc.assert(
      fc.property(poly, poly, fc.double({ min: -2, max: 2, noNaN: true }), (a, b, x) => {
        const s = polyEvalReal(polyAdd(a, b), x);
        const e = polyEvalReal(a, x) + polyEvalReal(b, x);
        return Math.abs(s - e) <= 1e-11 * 2 ** 8 * 20;
      }),
      { numRuns: 200 },
    );
  });
});

describe("polynomial argument validation", () => {
  it("rejects empty or non-finite coefficient arrays with the offending path", () => {
    expect(() => polyMul([], [1])).toThrow(InvalidArgumentError);
    expect(() => polyEvalReal([1, Number.NaN], 1)).toThrow(/coeffs\[1\]/);
    expect(() => polyEvalReal([1, 2], Number.POSITIVE_INFINITY)).toThrow(/x/);
    expect(() => polyEval([1], { re: 0, im: Number.NaN })).toThrow(InvalidArgumentError);
    expect(() => polyDerivative("12" as unknown as number[])).toThrow(InvalidArgumentError);
    expect(() => polyAdd([1], [Infinity])).toThrow(/b\[0\]/);
  });

  it("does not mutate inputs", () => {
    const a = Object.freeze([1, 2, 3]) as readonly number[];
    const b = Object.freeze([1, -1]) as readonly number[];
    expect(polyMul(a, b)).toEqual([1, 1, 1, -3]);
    expect(polyAdd(a, b)).toEqual([1, 3, 2]);
    expect(polyDerivative(a)).toEqual([2, 2]);
  });
});
