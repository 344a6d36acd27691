import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { cadd, cmul, csub, type Complex } from "../../src/math/complex.ts";
import { mullerRoot } from "../../src/math/muller.ts";

const square = (z: Complex): Complex => cmul(z, z);

describe("mullerRoot", () => {
  it("finds j as a root of z^2 + 1 from a nearby start", () => {
    const r = mullerRoot((z) => cadd(square(z), { re: 1, im: 0 }), { re: 0.1, im: 0.9 }, 1);
    expect(r).not.toBeNull();
    expect(Math.hypot((r as Complex).re, (r as Complex).im - 1)).toBeLessThan(1e-13);
  });

  it("leaves the real axis from a real start to find a complex root", () => {
    // z^2 + 2z + 5 = 0 at -1 +- 2j
    const r = mullerRoot((z) => cadd(cadd(square(z), { re: 2 * z.re, im: 2 * z.im }), { re: 5, im: 0 }), { re: -1, im: 0.5 }, 2);
    expect(r).not.toBeNull();
    const p = r as Complex;
    expect(Math.hypot(p.re + 1, Math.abs(p.im) - 2)).toBeLessThan(1e-12);
  });

  it("finds a root of a transcendental function: exp(z) = 2 at ln 2", () => {
    const r = mullerRoot((z) => ({ re: Math.exp(z.re) * Math.cos(z.im) - 2, im: Math.exp(z.re) * Math.sin(z.im) }), { re: 0.5, im: 0 }, 1);
    expect(r).not.toBeNull();
    expect(Math.abs((r as Complex).re - Math.LN2)).toBeLessThan(1e-13);
    expect(Math.abs((r as Complex).im)).toBeLessThan(1e-13);
  });

  it("returns null when the iteration produces a non-finite point", () => {
    expect(mullerRoot(() => ({ re: Number.NaN, im: 0 }), { re: 1, im: 0 }, 1)).toBeNull();
  });

  it("returns null for a function without a root (a nonzero constant)", () => {
    expect(mullerRoot(() => ({ re: 1, im: 0 }), { re: 0, im: 0 }, 1)).toBeNull();
  });

  it("property: finds a simple root of a cubic from a start within 5 % of it", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -10, max: 10, noNaN: true }),
        fc.double({ min: 0.5, max: 10, noNaN: true }),
        (re, im) => {
          // (z - p)(z - conj p)(z + 20): poles well separated from the third root
          const p = { re, im };
          const pc = { re, im: -im };
          const f = (z: Complex): Complex => cmul(cmul(csub(z, p), csub(z, pc)), cadd(z, { re: 20, im: 0 }));
          const mag = Math.hypot(re, im);
          const start = { re: re + 0.03 * mag, im: im - 0.02 * mag };
          const r = mullerRoot(f, start, mag);
          expect(r).not.toBeNull();
          const q = r as Complex;
          expect(Math.hypot(q.re - re, q.im - im)).toBeLessThan(1e-10 * mag);
        },
      ),
      { seed: 17, numRuns: 200 },
    );
  });
});
