import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { bessel, BESSEL_MAX_ORDER, besselDelayGroupDelay, besselDelayMagnitude } from "../../src/approx/bessel.ts";
import { familyMaxOrder } from "../../src/approx/prototype.ts";
import { besselOrderForDelay } from "../../src/approx/order.ts";
import { REVERSE_BESSEL_MAX_ORDER } from "../../src/math/bessel.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectClose, expectComplexSetClose } from "../helpers/tolerance.ts";
import { magnitude, magnitudeDb, mpmathCases, roots, scipyCases } from "./prototype-fixtures.ts";

function poleGroupDelay(poles: readonly { re: number; im: number }[], w: number): number {
  let t = 0;
  for (const p of poles) t += -p.re / (p.re * p.re + (w - p.im) ** 2);
  return t;
}

describe("bessel", () => {
  it("matches scipy.signal.besselap for orders 1-30 in each normalisation (1e-10 relative)", () => {
    const cases = scipyCases("bessel");
    expect(cases.length).toBe(90);
    for (const c of cases) {
      const norm = c.normalization as "delay" | "magnitude" | "phase";
      const h = bessel(c.order, { normalization: norm });
      const label = `n=${c.order} ${norm}`;
      expectComplexSetClose(h.poles, roots(c.poles), { rel: 1e-10, label: `${label} poles` });
      expectClose(h.gain, c.gain, { rel: 1e-10, label: `${label} gain` });
    }
  });

  it("matches the mpmath 50-digit reference to 1e-12 (scipy itself is within 2e-13 of it up to order 30)", () => {
    const cases = mpmathCases("bessel");
    expect(cases.length).toBe(90);
    for (const c of cases) {
      const norm = c.normalization as "delay" | "magnitude" | "phase";
      const h = bessel(c.order, { normalization: norm });
      expectComplexSetClose(h.poles, roots(c.poles), { rel: 1e-12, label: `n=${c.order} ${norm} poles` });
      expectClose(h.gain, c.gain, { rel: 1e-12, label: `n=${c.order} ${norm} gain` });
    }
  });

  it("defaults to the phase normalisation, like scipy's besselap", () => {
    expect(bessel(5)).toEqual(bessel(5, { normalization: "phase" }));
    expect(bessel(5, {})).toEqual(bessel(5, { normalization: "phase" }));
  });

  it("has group delay 1 s at DC under delay normalisation, and unit DC gain in every normalisation", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 30 }), fc.constantFrom("delay", "magnitude", "phase"), (n, norm) => {
        const h = bessel(n, { normalization: norm });
        expectClose(magnitude(h, 0), 1, { rel: 1e-12 });
        if (norm === "delay") expectClose(poleGroupDelay(h.poles, 0), 1, { rel: 1e-12 });
        if (norm === "magnitude") expectClose(magnitudeDb(h, 1), -10 * Math.log10(2), { rel: 1e-10 });
      }),
      { numRuns: 60 },
    );
  });

  it("evaluates magnitude and group delay by recurrence consistently with the poles", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 30 }), fc.double({ min: 0, max: 20, noNaN: true }), (n, w) => {
        const h = bessel(n, { normalization: "delay" });
        expectClose(besselDelayMagnitude(n, w), magnitude(h, w), { rel: 1e-11, abs: 1e-300 });
        expectClose(besselDelayGroupDelay(n, w), poleGroupDelay(h.poles, w), { rel: 1e-10, abs: 1e-14 });
      }),
      { numRuns: 80 },
    );
  });

  it("rejects unknown normalisations and orders outside 1-30", () => {
    expect(BESSEL_MAX_ORDER).toBe(30);
    expect(bessel(BESSEL_MAX_ORDER).poles.length).toBe(30);
    expect(() => bessel(BESSEL_MAX_ORDER + 1)).toThrow(InvalidArgumentError);
    expect(() => bessel(0)).toThrow(InvalidArgumentError);
    expect(() => bessel(4, { normalization: "mag" as "magnitude" })).toThrow(/options\.normalization/);
  });

  it("has one order limit, BESSEL_MAX_ORDER, for the prototype, the family table and the delay search's range", () => {
    expect(familyMaxOrder("bessel")).toBe(BESSEL_MAX_ORDER);
    expect(besselOrderForDelay({ maxDelayErrorPercent: 1, upToW: 2 }).maxOrder).toBe(BESSEL_MAX_ORDER);
    // The polynomial helpers underneath reach further; the prototype never asks them past their limit.
    expect(BESSEL_MAX_ORDER).toBeLessThanOrEqual(REVERSE_BESSEL_MAX_ORDER);
  });
});
