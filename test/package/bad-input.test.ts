/**
 * Bad input never yields NaN, Infinity or a stack trace from deep inside:
 * every function exported from the package root and from every subpath export
 * (the entries of package.json `exports`) is called with a battery of wrong
 * arguments, and each call must either throw a FilterwrightError (typed, with
 * a field path) or return a value that contains no NaN and no ±Infinity,
 * however deep in nested objects, arrays or typed arrays (a function that
 * returns a promise: the same of what it settles with).
 *
 * The complex-arithmetic primitives (cadd, cmul, ...) are the one documented
 * exception: they sit in inner loops and, like the rest of the numerical core,
 * assume valid input (src/math/complex.ts says so in its header).
 */
import { describe, expect, it } from "vitest";
import { firstNonFinite } from "../helpers/finite.ts";
import { readFileSync } from "node:fs";
import { FilterwrightError } from "../../src/errors.ts";

/** The package's entry points, read from package.json `exports`: "." is src/index.ts, "./x" is src/x/index.ts. */
const subpaths = Object.keys(
  (JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { exports: Record<string, unknown> }).exports,
).filter((k) => k !== "./package.json");
const modules: [string, Record<string, unknown>][] = [];
for (const k of subpaths) {
  const file = k === "." ? "../../src/index.ts" : `../../src/${k.slice(2)}/index.ts`;
  modules.push([k === "." ? "filterwright" : `filterwright/${k.slice(2)}`, (await import(file)) as Record<string, unknown>]);
}

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
  [0],
  [Number.MAX_VALUE],
  [Number.MIN_VALUE],
  [Number.NEGATIVE_INFINITY],
  [1, Number.POSITIVE_INFINITY],
  [1, 0],
  [new Float64Array([Number.POSITIVE_INFINITY])],
  [[Number.POSITIVE_INFINITY, 1]],
  [{ re: Number.POSITIVE_INFINITY, im: 0 }],
];

/** Every public function once (a function exported from the root and a subpath is called once), named by where it is first exported. */
const functions: [string, (...args: unknown[]) => unknown][] = [];
const listed = new Set<unknown>();
for (const [entry, mod] of modules) {
  for (const [name, f] of Object.entries(mod)) {
    if (typeof f !== "function" || /^[A-Z]/.test(name) || UNCHECKED_PRIMITIVES.has(name) || listed.has(f)) continue;
    listed.add(f);
    functions.push([`${entry}: ${name}`, f as (...args: unknown[]) => unknown]);
  }
}

describe("every public function rejects bad input with a typed error", () => {
  it("covers the public API: the root and every subpath export", () => {
    expect(modules.map(([entry]) => entry)).toContain("filterwright/topologies");
    expect(modules.length).toBe(subpaths.length);
    expect(functions.length).toBeGreaterThan(80);
  });

  it("finds NaN and ±Infinity at any depth of a result", () => {
    expect(firstNonFinite({ a: [1, { b: new Float64Array([0, Number.NEGATIVE_INFINITY]) }] })).toBe("result.a.1.b[1] = -Infinity");
    expect(firstNonFinite([{ x: Number.POSITIVE_INFINITY }])).toBe("result.0.x = Infinity");
    expect(firstNonFinite({ re: new Float32Array([Number.NaN]) })).toBe("result.re[0] = NaN");
    expect(firstNonFinite({ ok: [1, -2, 1e308], text: "Infinity" })).toBeNull();
  });

  it.each(functions)("%s", async (_name, f) => {
    const problems: string[] = [];
    for (const args of BAD_ARGUMENTS) {
      try {
        // an async function (filterwright/node) rejects instead of throwing: the same checks on its outcome
        const out = f(...args);
        const bad = firstNonFinite(out instanceof Promise ? await out : out);
        if (bad !== null) problems.push(`returned ${bad} for ${JSON.stringify(args)}`);
      } catch (e) {
        if (!(e instanceof FilterwrightError)) {
          problems.push(`threw ${(e as Error)?.constructor?.name} for ${JSON.stringify(args)}: ${(e as Error)?.message}`);
        } else {
          expect(e.fn.length).toBeGreaterThan(0);
        }
      }
    }
    expect(problems).toEqual([]);
  });
});
