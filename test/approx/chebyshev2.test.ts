import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { chebyshev2 } from "../../src/approx/chebyshev2.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectClose, expectComplexSetClose } from "../helpers/tolerance.ts";
import { magnitudeDb, roots, scipyCases } from "./prototype-fixtures.ts";

describe("chebyshev2", () => {
  it("matches scipy.signal.cheb2ap for orders 1-64 at 20, 50 and 80 dB", () => {
    const cases = scipyCases("chebyshev2");
    expect(cases.length).toBe(192);
    for (const c of cases) {
      const h = chebyshev2(c.order, { attenuationDb: c.attenuationDb as number });
      const label = `n=${c.order} as=${c.attenuationDb}`;
      expectComplexSetClose(h.poles, roots(c.poles), { rel: 1e-10, label: `${label} poles` });
      expectComplexSetClose(h.zeros, roots(c.zeros), { rel: 1e-10, label: `${label} zeros` });
      expectClose(h.gain, c.gain, { rel: 1e-10, label: `${label} gain` });
    }
  });

  it("reaches exactly the requested attenuation at the stopband edge 1 rad/s and never less beyond it", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 16 }), fc.double({ min: 3, max: 120, noNaN: true }), (n, as) => {
        const h = chebyshev2(n, { attenuationDb: as });
        expectClose(magnitudeDb(h, 1), -as, { rel: 1e-9 });
        for (let i = 0; i <= 300; i++) {
          const w = 10 ** ((3 * i) / 300); // 1 .. 1000 rad/s
          expect(magnitudeDb(h, w)).toBeLessThanOrEqual(-as + 1e-7);
        }
        expectClose(magnitudeDb(h, 0), 0, { abs: 1e-12 });
      }),
      { numRuns: 40 },
    );
  });

  it("rejects a non-positive attenuation", () => {
    expect(() => chebyshev2(3, { attenuationDb: 0 })).toThrow(InvalidArgumentError);
    expect(() => chebyshev2(3, { attenuationDb: Number.POSITIVE_INFINITY })).toThrow(/options\.attenuationDb/);
  });
});
