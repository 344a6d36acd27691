import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { InvalidArgumentError } from "../../src/errors.ts";
import { mulberry32 } from "../../src/math/random.ts";
import { thrownBy } from "../helpers/throws.ts";

describe("mulberry32", () => {
  it("gives the same sequence for seed 1 as an independent transcription", () => {
    const next = mulberry32(1);
    // Reference values from an independent Python transcription of the algorithm in 32-bit unsigned arithmetic, divided by 2^32.
    expect([next(), next(), next()]).toEqual([0.6270739405881613, 0.002735721180215478, 0.5274470399599522]);
  });

  it("repeats from the same seed and differs between seeds", () => {
    const a = mulberry32(20261201);
    const b = mulberry32(20261201);
    const c = mulberry32(20261202);
    const xs = Array.from({ length: 50 }, () => a());
    expect(Array.from({ length: 50 }, () => b())).toEqual(xs);
    expect(Array.from({ length: 50 }, () => c())).not.toEqual(xs);
  });

  it("takes the seed modulo 2^32", () => {
    expect(mulberry32(2 ** 32 + 7)()).toBe(mulberry32(7)());
  });

  it("rejects a seed that is not a finite number", () => {
    expect(thrownBy(() => mulberry32(Number.NaN), InvalidArgumentError).path).toBe("seed");
    expect(thrownBy(() => mulberry32("1" as unknown as number), InvalidArgumentError).path).toBe("seed");
  });

  it("property: values lie in [0, 1) and are multiples of 2^-32", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 32 - 1 }), (seed) => {
        const next = mulberry32(seed);
        for (let i = 0; i < 20; i++) {
          const x = next();
          expect(x).toBeGreaterThanOrEqual(0);
          expect(x).toBeLessThan(1);
          expect(Number.isInteger(x * 4294967296)).toBe(true);
        }
      }),
      { seed: 11, numRuns: 200 },
    );
  });

  it("has a mean near 1/2 over 100000 draws (within 4 standard errors)", () => {
    const next = mulberry32(42);
    let sum = 0;
    const n = 100000;
    for (let i = 0; i < n; i++) sum += next();
    expect(Math.abs(sum / n - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n));
  });
});
