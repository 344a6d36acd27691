import { describe, expect, it } from "vitest";
import { closedFormLoadRatio, closedFormReflection, closedFormValues } from "../../src/ladder/closed-form.ts";
import type { LadderElement } from "../../src/ladder/types.ts";
import { chainTransfer } from "../helpers/ladder-chain.ts";
import { BUTTERWORTH_TABLE, CHEBYSHEV_01_TABLE, CHEBYSHEV_05_TABLE } from "./handbook-tables.ts";

const epsOf = (rippleDb: number): number => Math.sqrt(Math.expm1((rippleDb / 10) * Math.LN10));

function chebT(n: number, w: number): number {
  return w <= 1 ? Math.cos(n * Math.acos(w)) : Math.cosh(n * Math.acosh(w));
}

function seriesFirst(g: readonly number[]): LadderElement[] {
  return g.map((value, i) => ({ kind: i % 2 === 0 ? "series-L" : "shunt-C", value }));
}

function shuntFirst(g: readonly number[]): LadderElement[] {
  return g.map((value, i) => ({ kind: i % 2 === 0 ? "shunt-C" : "series-L", value }));
}

describe("closedFormValues against the printed tables (typed in from memory)", () => {
  const cases = [
    ["Butterworth", BUTTERWORTH_TABLE, null],
    ["Chebyshev 0.1 dB", CHEBYSHEV_01_TABLE, epsOf(0.1)],
    ["Chebyshev 0.5 dB", CHEBYSHEV_05_TABLE, epsOf(0.5)],
  ] as const;
  for (const [name, table, eps] of cases) {
    for (const [ns, row] of Object.entries(table)) {
      const n = Number(ns);
      it(`${name}, n = ${n}: g_1..g_(n+1) to the four printed decimals`, () => {
        const g = [...closedFormValues(n, eps, 0), closedFormLoadRatio(n, eps, 0)];
        expect(g).toHaveLength(row.length);
        for (let i = 0; i < row.length; i++) {
          // printed to 4 decimals: rounding 5e-5, plus 1e-5 for the table's own rounding of g_k from rounded g_(k-1)
          expect(Math.abs((g[i] as number) - (row[i] as number)), `g_${i + 1}`).toBeLessThanOrEqual(6e-5);
        }
      });
    }
  }
});

describe("closedFormValues realise the Butterworth and Chebyshev power transfer (chained ABCD matrices)", () => {
  const grid = Array.from({ length: 400 }, (_, i) => 10 ** (-2 + (3 * i) / 399));
  const families = [
    { name: "Butterworth", eps: null as number | null },
    { name: "Chebyshev 0.01 dB", eps: epsOf(0.01) },
    { name: "Chebyshev 1 dB", eps: epsOf(1) },
    { name: "Chebyshev 3 dB", eps: epsOf(3) },
  ];
  for (const f of families) {
    for (const n of [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 15, 20]) {
      for (const rho2 of [0, 0.05, 0.5]) {
        it(`${f.name}, n = ${n}, |S11|^2 = ${rho2} at the peaks: both forms, 4 R_s/R_L |H|^2 = (1 - rho2) / (1 + eps^2 T_n^2) to 1e-12`, () => {
          const g = closedFormValues(n, f.eps, rho2);
          const r = closedFormLoadRatio(n, f.eps, rho2);
          expect(r).toBeGreaterThanOrEqual(1);
          for (const v of g) expect(v > 0 && Number.isFinite(v)).toBe(true);
          for (const w of grid) {
            const k2 = f.eps === null ? w ** (2 * n) : f.eps ** 2 * chebT(n, w) ** 2;
            const want = (1 - rho2) / (1 + k2);
            // series-first ends in r, shunt-first (the dual) in 1/r
            for (const [els, load] of [
              [seriesFirst(g), r],
              [shuntFirst(g), 1 / r],
            ] as const) {
              const h = chainTransfer(els, 1, load, w);
              const got = ((4 / load) * (h.re * h.re + h.im * h.im));
              expect(Math.abs(got / want - 1)).toBeLessThan(1e-12 * Math.max(1, n / 4));
            }
          }
        });
      }
    }
  }
});

describe("closedFormReflection", () => {
  it("inverts closedFormLoadRatio", () => {
    for (const eps of [null, epsOf(0.2), epsOf(2)]) {
      for (const n of [3, 4]) {
        for (const rho2 of [0, 0.1, 0.7]) {
          const r = closedFormLoadRatio(n, eps, rho2);
          expect(Math.abs(closedFormReflection(n, eps, r) - rho2)).toBeLessThan(1e-14);
        }
      }
    }
  });
  it("is negative for an even-order Chebyshev load too close to the source resistance", () => {
    expect(closedFormReflection(4, epsOf(0.5), 1.5)).toBeLessThan(0);
    expect(closedFormReflection(5, epsOf(0.5), 1.5)).toBeGreaterThan(0);
  });
});
