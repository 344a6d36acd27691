import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { closestNames, didYouMean, editDistance } from "../../src/cli/suggest.ts";

/**
 * The optimal string alignment distance by its recursive definition (Damerau's four single errors, each
 * substring edited once), memoised: an independent implementation to check the three-row table against.
 */
function osaByRecursion(a: string, b: string): number {
  const memo = new Map<string, number>();
  const d = (i: number, j: number): number => {
    if (i === 0) return j;
    if (j === 0) return i;
    const key = `${i},${j}`;
    const hit = memo.get(key);
    if (hit !== undefined) return hit;
    let v = Math.min(d(i - 1, j) + 1, d(i, j - 1) + 1, d(i - 1, j - 1) + (a[i - 1] === b[j - 1] ? 0 : 1));
    if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, d(i - 2, j - 2) + 1);
    memo.set(key, v);
    return v;
  };
  return d(a.length, b.length);
}

describe("editDistance", () => {
  it("counts Levenshtein's three edits and Damerau's adjacent transposition as one each", () => {
    expect(editDistance("kitten", "sitting")).toBe(3); // two substitutions and an insertion
    expect(editDistance("", "abc")).toBe(3);
    expect(editDistance("design", "design")).toBe(0);
    expect(editDistance("desing", "design")).toBe(1); // one transposition (Levenshtein alone: 2)
    expect(editDistance("E69", "E96")).toBe(1);
    // The restricted variant: "ca" -> "abc" is 3 here (the unrestricted distance is 2: ca -> ac -> abc).
    expect(editDistance("ca", "abc")).toBe(3);
  });

  it("equals the recursive definition, is symmetric, and never exceeds the longer length", () => {
    const word = fc.string({ unit: fc.constantFrom("a", "b", "c", "-"), maxLength: 7 });
    fc.assert(
      fc.property(word, word, (a, b) => {
        const d = editDistance(a, b);
        expect(d).toBe(osaByRecursion(a, b));
        expect(editDistance(b, a)).toBe(d);
        expect(d).toBeLessThanOrEqual(Math.max(a.length, b.length));
        expect(d === 0).toBe(a === b);
      }),
      { numRuns: 300, seed: 1964 },
    );
  });
});

describe("closestNames and didYouMean", () => {
  const families = ["butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel", "legendre", "auto"];
  it("offers the nearest names within a third of the word's length, ties together", () => {
    expect(closestNames("buterworth", families)).toEqual(["butterworth"]);
    expect(closestNames("chebyshev", families)).toEqual(["chebyshev1", "chebyshev2"]);
    expect(closestNames("BESSEL", families)).toEqual(["bessel"]);
    expect(closestNames("gaussian", families)).toEqual([]);
    expect(closestNames("", families)).toEqual([]);
  });
  it("falls back to names the word begins, and says the clause", () => {
    expect(closestNames("ellip", families)).toEqual(["elliptic"]);
    expect(didYouMean("pass-los", ["pass", "pass-loss", "pass-top"], "--")).toBe('; did you mean "--pass-loss"?');
    expect(didYouMean("chebyshev", families)).toBe('; did you mean "chebyshev1" or "chebyshev2"?');
    expect(didYouMean("zzz", families)).toBe("");
  });
});
