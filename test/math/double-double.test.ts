import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  cdd,
  cddDiv,
  cddMul,
  cddSqrt,
  dd,
  ddAdd,
  ddDiv,
  ddMul,
  ddMulNum,
  ddSqrt,
  ddSub,
  ddToNumber,
  type DD,
} from "../../src/math/double-double.ts";
import {
  ddNewtonRealRoot,
  ddNewtonRoot,
  ddPoly,
  ddPolyDivQuadratic,
  ddPolyEval,
  ddPolyMirrorSquare,
  ddPolyMul,
  ddPolyToNumbers,
} from "../../src/math/dd-polynomial.ts";

// Exact reference: every double is a dyadic rational m * 2^e, so sums and products of
// double-doubles are exact in BigInt arithmetic scaled by 2^SHIFT.
const SHIFT = 1200n;

function exact(x: number): bigint {
  if (x === 0) return 0n;
  let e = 0;
  let m = Math.abs(x);
  while (!Number.isInteger(m)) {
    m *= 2;
    e++;
  }
  const v = BigInt(m) << (SHIFT - BigInt(e));
  return x < 0 ? -v : v;
}

const exactDD = (a: DD): bigint => exact(a.hi) + exact(a.lo);

/** |got - want| / |want| with both exact, as a double. */
function relError(got: bigint, want: bigint): number {
  if (want === 0n) return got === 0n ? 0 : Number.POSITIVE_INFINITY;
  const d = got > want ? got - want : want - got;
  const w = want < 0n ? -want : want;
  // scale both into double range
  const shift = BigInt(Math.max(0, w.toString(2).length - 60));
  return Number(d >> shift) / Number(w >> shift);
}

/** |got - want| / size, all exact, as a double. */
function errorOver(got: bigint, want: bigint, size: bigint): number {
  const d = got > want ? got - want : want - got;
  const shift = BigInt(Math.max(0, size.toString(2).length - 60));
  return Number(d >> shift) / Number(size >> shift);
}

const finite = fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }).filter((x) => Math.abs(x) > 1e-6);
const ddArb = fc.tuple(finite, fc.double({ min: -1, max: 1, noNaN: true })).map(([hi, t]) => ddAdd(dd(hi), dd(hi * t * 2 ** -60)));

describe("double-double arithmetic against exact rational arithmetic", () => {
  it("ddAdd and ddSub are accurate to 2^-103 of the operands' size, ddMul to 2^-102 of the product", () => {
    fc.assert(
      fc.property(ddArb, ddArb, (a, b) => {
        const ea = exactDD(a);
        const eb = exactDD(b);
        const size = (ea < 0n ? -ea : ea) + (eb < 0n ? -eb : eb);
        expect(errorOver(exactDD(ddAdd(a, b)), ea + eb, size)).toBeLessThan(2 ** -103);
        expect(errorOver(exactDD(ddSub(a, b)), ea - eb, size)).toBeLessThan(2 ** -103);
        const prod = exactDD(ddMul(a, b)) << SHIFT;
        const want = ea * eb;
        expect(errorOver(prod, want, want < 0n ? -want : want)).toBeLessThan(2 ** -102);
      }),
      { numRuns: 300 },
    );
  });

  it("ddDiv and ddSqrt are accurate to about 2^-102 relative", () => {
    fc.assert(
      fc.property(ddArb, ddArb, (a, b) => {
        const q = ddDiv(a, b);
        // q * b should give a back
        expect(relError(exactDD(ddMul(q, b)), exactDD(a))).toBeLessThan(2 ** -100);
        const r = ddSqrt(ddMul(a, a));
        expect(relError(exactDD(r), exactDD(a) < 0n ? -exactDD(a) : exactDD(a))).toBeLessThan(2 ** -100);
      }),
      { numRuns: 300 },
    );
  });

  it("ddMulNum equals ddMul by a double-double with zero low part", () => {
    const a = ddAdd(dd(Math.PI), dd(1.2246467991473532e-16));
    expect(ddMulNum(a, 3)).toEqual(ddMul(a, dd(3)));
  });

  it("keeps digits that double arithmetic loses: (1 + 2^-70) - 1", () => {
    const x = ddSub(ddAdd(dd(1), dd(2 ** -70)), dd(1));
    expect(ddToNumber(x)).toBe(2 ** -70);
  });
});

describe("complex double-double", () => {
  it("cddMul, cddDiv and cddSqrt invert each other to about 1e-30", () => {
    const z = { re: ddAdd(dd(0.3), dd(1e-18)), im: ddAdd(dd(-1.7), dd(3e-18)) };
    const w = cdd(2.5, 0.75);
    const back = cddMul(cddDiv(z, w), w);
    expect(Math.abs(ddToNumber(ddSub(back.re, z.re)))).toBeLessThan(1e-30);
    expect(Math.abs(ddToNumber(ddSub(back.im, z.im)))).toBeLessThan(1e-30);
    const r = cddSqrt(z);
    expect(r.re.hi).toBeGreaterThan(0);
    const sq = cddMul(r, r);
    expect(Math.abs(ddToNumber(ddSub(sq.re, z.re)))).toBeLessThan(1e-30);
    expect(Math.abs(ddToNumber(ddSub(sq.im, z.im)))).toBeLessThan(1e-30);
    const neg = cddSqrt(cdd(-4, -0));
    expect(ddToNumber(neg.im)).toBe(2);
  });
});

describe("double-double polynomials", () => {
  it("ddPolyMirrorSquare gives |p(jw)|^2 as a polynomial in w^2", () => {
    const p = ddPoly([1, 2.5, 3, 0.7]);
    const q = ddPolyMirrorSquare(p);
    for (const w of [0, 0.3, 1, 2.2]) {
      const v = ddPolyEval(p, cdd(0, w));
      const want = ddToNumber(v.re) ** 2 + ddToNumber(v.im) ** 2;
      const got = ddPolyToNumbers(q).reduce((acc, c) => acc * w * w + c, 0);
      expect(Math.abs(got / want - 1)).toBeLessThan(1e-14);
    }
  });

  it("ddPolyDivQuadratic divides (s^2 + c) out exactly and returns the remainder", () => {
    const c = ddAdd(dd(2), dd(1e-20));
    const q = ddPoly([1, -3, 0.5]);
    const prod = ddPolyMul(q, [dd(1), dd(0), c]);
    const withRem = [...prod.slice(0, -2), ddAdd(prod[prod.length - 2] as DD, dd(0.25)), ddAdd(prod[prod.length - 1] as DD, dd(-1))];
    const d = ddPolyDivQuadratic(withRem, c);
    expect(d.quotient.map((x, i) => Math.abs(ddToNumber(ddSub(x, q[i] as DD))))).toEqual([0, 0, 0]);
    expect(ddToNumber(d.remainder[0])).toBeCloseTo(0.25, 28);
    expect(ddToNumber(d.remainder[1])).toBeCloseTo(-1, 28);
  });

  it("Newton's iteration refines a root to double-double accuracy", () => {
    const p = ddPoly([1, 0, -2]);
    const r = ddNewtonRealRoot(p, dd(1.4), 10);
    expect(Math.abs(ddToNumber(ddSub(ddMul(r, r), dd(2))))).toBeLessThan(1e-30);
    const z = ddNewtonRoot(ddPoly([1, 0, 1]), cdd(0.1, 0.9), 20);
    expect(Math.abs(ddToNumber(z.re))).toBeLessThan(1e-30);
    expect(Math.abs(ddToNumber(z.im) - 1)).toBeLessThan(1e-30);
  });
});
