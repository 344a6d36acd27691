/**
 * Bad input never yields NaN or a stack trace from deep inside: every
 * function exported from the package root is called with a battery of wrong
 * arguments, and each call must either throw a FilterwrightError (typed, with
 * a field path) or return a value that contains no NaN.
 *
 * The complex-arithmetic primitives (cadd, cmul, ...) are the one documented
 * exception: they sit in inner loops and, like the rest of the numerical core,
 * assume valid input (src/math/complex.ts says so in its header).
 */
import { describe, expect, it } from "vitest";
import * as fw from "../../src/index.ts";

const UNCHECKED_PRIMITIVES = new Set([
  "complex",
  "cadd",
  "csub",
  "cmul",
  "cdiv",
  "cscale",
  "cneg",
  "cconj",
  "cabs",
  "carg",
  "cinv",
  "csqrt",
  "cexp",
  "fromPolar",
]);

const BAD_ARGUMENTS: readonly (readonly unknown[])[] = [
  [],
  [undefined],
  [null],
  [Number.NaN],
  [Number.POSITIVE_INFINITY],
  [-1],
  ["x"],
  [{}],
  [[1, 2]],
  [{}, {}],
  [1, { bogus: Number.NaN }],
  [{ re: Number.NaN, im: 0 }],
];

function containsNaN(value: unknown, seen = new Set<unknown>()): boolean {
  if (typeof value === "number") return Number.isNaN(value);
  if (typeof value !== "object" || value === null || seen.has(value)) return false;
  seen.add(value);
  if (ArrayBuffer.isView(value)) return Array.from(value as unknown as ArrayLike<number>).some((x) => Number.isNaN(x));
  return Object.values(value).some((v) => containsNaN(v, seen));
}

const functions = Object.entries(fw).filter(
  ([name, f]) => typeof f === "function" && !/^[A-Z]/.test(name) && !UNCHECKED_PRIMITIVES.has(name),
) as [string, (...args: unknown[]) => unknown][];

describe("every public function rejects bad input with a typed error", () => {
  it("covers the public API", () => {
    expect(functions.length).toBeGreaterThan(80);
  });

  it.each(functions)("%s", (_name, f) => {
    const problems: string[] = [];
    for (const args of BAD_ARGUMENTS) {
      try {
        const r = f(...args);
        if (containsNaN(r)) problems.push(`returned NaN for ${JSON.stringify(args)}`);
      } catch (e) {
        if (!(e instanceof fw.FilterwrightError)) {
          problems.push(`threw ${(e as Error)?.constructor?.name} for ${JSON.stringify(args)}: ${(e as Error)?.message}`);
        } else {
          expect(e.fn.length).toBeGreaterThan(0);
        }
      }
    }
    expect(problems).toEqual([]);
  });
});
