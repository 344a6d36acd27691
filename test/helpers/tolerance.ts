/**
 * The one shared tolerance helper for numerical tests.
 *
 * Comparisons use a mixed criterion: |a - e| <= abs + rel * |e|. Failures name
 * the worst index, both values and the achieved relative error, so a failing
 * fixture points straight at the offending sample.
 */
import { expect } from "vitest";
import type { Complex } from "../../src/math/complex.ts";

/** Tolerance: relative part and absolute floor. */
export interface Tolerance {
  /** Relative tolerance. @defaultValue 1e-9 */
  readonly rel?: number;
  /** Absolute floor, for values near zero. @defaultValue 0 */
  readonly abs?: number;
  /** Label for failure messages. */
  readonly label?: string;
}

/** Relative error of `a` against reference `e` (absolute when e is 0). */
export function relErr(a: number, e: number): number {
  if (a === e) return 0;
  const d = Math.abs(a - e);
  return e === 0 ? d : d / Math.abs(e);
}

function within(a: number, e: number, rel: number, abs: number): boolean {
  if (a === e) return true;
  if (!Number.isFinite(a) || !Number.isFinite(e)) return false;
  return Math.abs(a - e) <= abs + rel * Math.abs(e);
}

/** Assert one number is close to a reference. */
export function expectClose(actual: number, expected: number, tol: Tolerance = {}): void {
  const rel = tol.rel ?? 1e-9;
  const abs = tol.abs ?? 0;
  if (!within(actual, expected, rel, abs)) {
    expect.fail(
      `${tol.label ?? "value"}: got ${actual}, expected ${expected} (rel err ${relErr(actual, expected).toExponential(3)}, tol rel ${rel} abs ${abs})`,
    );
  }
}

/** Assert two arrays have the same length and are elementwise close; reports the worst element. */
export function expectArrayClose(
  actual: ArrayLike<number>,
  expected: ArrayLike<number>,
  tol: Tolerance = {},
): void {
  const rel = tol.rel ?? 1e-9;
  const abs = tol.abs ?? 0;
  const label = tol.label ?? "array";
  if (actual.length !== expected.length) {
    expect.fail(`${label}: length ${actual.length}, expected ${expected.length}`);
  }
  let worst = -1;
  let worstExcess = 0;
  for (let i = 0; i < expected.length; i++) {
    const a = actual[i] as number;
    const e = expected[i] as number;
    if (!within(a, e, rel, abs)) {
      const excess = Number.isFinite(a) ? Math.abs(a - e) / (abs + rel * Math.abs(e) || 1) : Infinity;
      if (excess > worstExcess || worst < 0) {
        worst = i;
        worstExcess = excess;
      }
    }
  }
  if (worst >= 0) {
    const a = actual[worst] as number;
    const e = expected[worst] as number;
    expect.fail(
      `${label}[${worst}]: got ${a}, expected ${e} (rel err ${relErr(a, e).toExponential(3)}, tol rel ${rel} abs ${abs})`,
    );
  }
}

/** Canonical order for sets of complex roots: by real part, then imaginary part (ties within 1e-9 relative). */
export function sortComplex(values: readonly Complex[]): Complex[] {
  return [...values].sort((x, y) => {
    const scale = Math.max(1, Math.abs(x.re), Math.abs(y.re));
    if (Math.abs(x.re - y.re) > 1e-9 * scale) return x.re - y.re;
    return x.im - y.im;
  });
}

/**
 * Assert two multisets of complex numbers match, after canonical sorting,
 * with relative error measured against the modulus of the reference.
 */
export function expectComplexSetClose(
  actual: readonly Complex[],
  expected: readonly Complex[],
  tol: Tolerance = {},
): void {
  const rel = tol.rel ?? 1e-10;
  const abs = tol.abs ?? 0;
  const label = tol.label ?? "roots";
  if (actual.length !== expected.length) {
    expect.fail(`${label}: ${actual.length} values, expected ${expected.length}`);
  }
  const a = sortComplex(actual);
  const e = sortComplex(expected);
  for (let i = 0; i < e.length; i++) {
    const ai = a[i] as Complex;
    const ei = e[i] as Complex;
    const d = Math.hypot(ai.re - ei.re, ai.im - ei.im);
    const m = Math.hypot(ei.re, ei.im);
    if (!(d <= abs + rel * m)) {
      expect.fail(
        `${label}[${i}]: got ${ai.re}${ai.im >= 0 ? "+" : ""}${ai.im}j, expected ${ei.re}${ei.im >= 0 ? "+" : ""}${ei.im}j (rel err ${(d / (m || 1)).toExponential(3)}, tol rel ${rel})`,
      );
    }
  }
}
