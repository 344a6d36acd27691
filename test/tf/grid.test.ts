import { describe, expect, it } from "vitest";
import { linearGrid, logGrid } from "../../src/tf/grid.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectArrayClose } from "../helpers/tolerance.ts";

describe("logGrid", () => {
  it("matches numpy.logspace spacing with exact end points", () => {
    // numpy.logspace(0, 3, 7) = 10^(0, 0.5, ..., 3) (values of 10^(k/2), common knowledge)
    const g = logGrid(1, 1000, 7);
    expectArrayClose(g, [1, Math.sqrt(10), 10, 10 * Math.sqrt(10), 100, 100 * Math.sqrt(10), 1000], { rel: 1e-15 });
    expect(g[0]).toBe(1);
    expect(g[6]).toBe(1000);
    expect(Array.from(logGrid(5, 5, 1))).toEqual([5]);
    const down = logGrid(100, 1, 3);
    expectArrayClose(down, [100, 10, 1], { rel: 1e-15 });
  });

  it("rejects non-positive end points and bad counts", () => {
    expect(() => logGrid(0, 10, 5)).toThrow(InvalidArgumentError);
    expect(() => logGrid(1, -10, 5)).toThrow(/stop/);
    expect(() => logGrid(1, 10, 0)).toThrow(/count/);
    expect(() => logGrid(1, 10, 2.5)).toThrow(/count/);
  });
});

describe("linearGrid", () => {
  it("spaces evenly with exact end points", () => {
    expect(Array.from(linearGrid(0, 1, 5))).toEqual([0, 0.25, 0.5, 0.75, 1]);
    const g = linearGrid(0.1, 0.7, 7);
    expect(g[6]).toBe(0.7);
    expectArrayClose(g, [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7], { rel: 1e-15 });
  });

  it("rejects non-finite end points and overflowing spans", () => {
    expect(() => linearGrid(Number.NaN, 1, 3)).toThrow(/start/);
    expect(() => linearGrid(-1.7e308, 1.7e308, 3)).toThrow(/overflows/);
  });
});
