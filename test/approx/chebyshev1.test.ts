import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { chebyshev1 } from "../../src/approx/chebyshev1.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectClose, expectComplexSetClose } from "../helpers/tolerance.ts";
import { magnitudeDb, roots, scipyCases } from "./prototype-fixtures.ts";

describe("chebyshev1", () => {
  it("matches scipy.signal.cheb1ap for orders 1-64 at 0.5, 1 and 3 dB ripple", () => {
    const cases = scipyCases("chebyshev1");
    expect(cases.length).toBe(192);
    for (const c of cases) {
      const h = chebyshev1(c.order, { rippleDb: c.rippleDb as number });
      expectComplexSetClose(h.poles, roots(c.poles), { rel: 1e-10, label: `n=${c.order} rp=${c.rippleDb}` });
      expectClose(h.gain, c.gain, { rel: 1e-10, label: `gain n=${c.order} rp=${c.rippleDb}` });
    }
  });

  it("stays within the ripple band on [0, 1] rad/s and touches the 0 dB and -ripple bounds n + 1 times in all", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 16 }), fc.double({ min: 0.01, max: 6, noNaN: true }), (n, rp) => {
        const h = chebyshev1(n, { rippleDb: rp });
        // On [0, 1], T_n(w)^2 = 1 (loss exactly rp) at w = cos(m pi / n), m = 0..floor(n/2),
        // and T_n(w) = 0 (0 dB) at w = cos((2m - 1) pi / (2n)), m = 1..ceil(n/2): n + 1 touches in all.
        let valleys = 0;
        for (let m = 0; 2 * m <= n; m++) {
          if (Math.abs(magnitudeDb(h, Math.cos((m * Math.PI) / n)) + rp) < 1e-9 * Math.max(1, rp)) valleys++;
        }
        let peaks = 0;
        for (let m = 1; 2 * m - 1 <= n; m++) {
          if (Math.abs(magnitudeDb(h, Math.cos(((2 * m - 1) * Math.PI) / (2 * n)))) < 1e-9) peaks++;
        }
        expect(valleys).toBe(Math.floor(n / 2) + 1);
        expect(peaks).toBe(Math.ceil(n / 2));
        expect(valleys + peaks).toBe(n + 1);
        for (let i = 0; i <= 400; i++) {
          const db = magnitudeDb(h, i / 400);
          expect(db).toBeLessThanOrEqual(1e-9);
          expect(db).toBeGreaterThanOrEqual(-rp - 1e-9);
        }
        expectClose(magnitudeDb(h, 1), -rp, { rel: 1e-9 });
        // Beyond the edge the loss keeps growing.
        expect(magnitudeDb(h, 1.2)).toBeLessThan(-rp);
      }),
      { numRuns: 40 },
    );
  });

  it("rejects a non-positive ripple, a bad order and a missing options object", () => {
    expect(() => chebyshev1(3, { rippleDb: 0 })).toThrow(InvalidArgumentError);
    expect(() => chebyshev1(3, { rippleDb: -1 })).toThrow(/options\.rippleDb/);
    expect(() => chebyshev1(65, { rippleDb: 1 })).toThrow(/order/);
    expect(() => chebyshev1(3, undefined as unknown as { rippleDb: number })).toThrow(/options\.rippleDb/);
  });
});
