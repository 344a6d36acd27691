// Shared pieces of the fuzz files: the guard that lets only the library's
// typed errors through and checks that every returned number is finite, and
// the arbitraries of awkward numbers and values.
import { expect } from "vitest";
import fc from "fast-check";
import { FilterwrightError } from "../src/errors.ts";
import { firstNonFinite } from "../test/helpers/finite.ts";

/** Calls made and typed errors seen by a guard. */
export interface GuardCounts {
  lowLevel: number;
  typedErrors: number;
}

/**
 * A guard over `counts`: run `f`; a FilterwrightError is fine, anything else
 * fails; a returned value must be finite throughout.
 */
export function makeGuard(counts: GuardCounts): (what: string, f: () => unknown) => void {
  return (what, f) => {
    counts.lowLevel++;
    let v: unknown;
    try {
      v = f();
    } catch (e) {
      if (e instanceof FilterwrightError) {
        counts.typedErrors++;
        return;
      }
      throw new Error(`${what}: threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`);
    }
    const bad = firstNonFinite(v);
    expect(bad, `${what}: a non-finite value`).toBeNull();
  };
}

/** Numbers that break naive code: extremes, zeros, subnormals, NaN, infinities, and ordinary values. */
export const anyNumber = fc.oneof(
  fc.double(),
  fc.constantFrom(0, -0, 1e-324, 5e-324, 1e-300, 1e300, 1.7e308, -1, Number.NaN, Infinity, -Infinity),
  fc.double({ min: 1e-3, max: 1e7, noNaN: true }),
);

/** Any value a JavaScript caller could pass. */
export const anyValue = fc.oneof(anyNumber, fc.string(), fc.constant(undefined), fc.constant(null), fc.boolean(), fc.array(anyNumber, { maxLength: 3 }), fc.object({ maxDepth: 2 }));
