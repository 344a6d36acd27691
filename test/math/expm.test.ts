import { describe, expect, it } from "vitest";
import { expm } from "../../src/math/expm.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import { expectArrayClose } from "../helpers/tolerance.ts";

const fx = loadFixture<{ cases: { n: number; data: number[]; expm: number[]; scipy: number[] }[] }>("math-expm.json");

describe("expm vs mpmath.expm", () => {
  fx.cases.forEach((c, i) => {
    it(`case ${i}: ${c.n}x${c.n}`, () => {
      const got = expm({ n: c.n, data: Float64Array.from(c.data) }).data;
      const scale = Math.max(...c.expm.map(Math.abs));
      // entrywise, relative to the largest entry (the norm-wise accuracy of scaling and squaring)
      expectArrayClose(got, c.expm, { rel: 1e-12, abs: 1e-13 * scale });
    });
  });

  it("rejects malformed matrices", () => {
    expect(() => expm({ n: 2, data: new Float64Array(3) })).toThrow(/matrix\.data/);
    expect(() => expm({ n: 0, data: new Float64Array(0) })).toThrow(InvalidArgumentError);
    expect(() => expm({ n: 1, data: Float64Array.of(Number.NaN) })).toThrow(/data\[0\]/);
    expect(() => expm({ n: 1, data: Float64Array.of(1e6) })).toThrow(/overflows/);
  });
});
