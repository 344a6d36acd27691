import { describe, expect, it } from "vitest";
import { butterworth } from "../../src/approx/butterworth.ts";
import { chebyshev1 } from "../../src/approx/chebyshev1.ts";
import { elliptic } from "../../src/approx/elliptic.ts";
import { closedFormLoadRatio, closedFormReflection, closedFormValues } from "../../src/ladder/closed-form.ts";
import { ladderPrototype } from "../../src/ladder/index.ts";
import { peakReflection, synthesizeLadder, zeroOrders, type SynthesisResult } from "../../src/ladder/synthesis.ts";

const epsOf = (rippleDb: number): number => Math.sqrt(Math.expm1((rippleDb / 10) * Math.LN10));

function synthesised(h: ReturnType<typeof butterworth>, r: number, form: "series-first" | "shunt-first"): SynthesisResult {
  const res = synthesizeLadder(h, r, form);
  if (typeof res === "string") return expect.unreachable(`synthesis failed: ${res}`);
  return res;
}

describe("synthesizeLadder against the closed forms", () => {
  const cases = [
    { name: "Butterworth", eps: null as number | null, h: (n: number) => butterworth(n) },
    { name: "Chebyshev 0.01 dB", eps: epsOf(0.01), h: (n: number) => chebyshev1(n, { rippleDb: 0.01 }) },
    { name: "Chebyshev 0.5 dB", eps: epsOf(0.5), h: (n: number) => chebyshev1(n, { rippleDb: 0.5 }) },
    { name: "Chebyshev 3 dB", eps: epsOf(3), h: (n: number) => chebyshev1(n, { rippleDb: 3 }) },
  ];
  for (const c of cases) {
    for (let n = 1; n <= 12; n++) {
      it(`${c.name}, order ${n}: matched (or the ripple's ratio) and a 3:1 load, both forms, every element to 1e-12`, () => {
        for (const rho2Extra of [0, 0.5]) {
          const r0 = closedFormLoadRatio(n, c.eps, 0);
          const rSeries = rho2Extra === 0 ? r0 : Math.max(3, r0 * 1.5);
          const rho2 = closedFormReflection(n, c.eps, rSeries);
          const g = closedFormValues(n, c.eps, rho2 < 1e-13 ? 0 : rho2);
          for (const [form, r] of [
            ["series-first", rSeries],
            ["shunt-first", 1 / rSeries],
          ] as const) {
            const res = synthesised(c.h(n), r, form);
            expect(res.loadRatio / r).toBeCloseTo(1, 12);
            res.elements.forEach((e, i) => {
              expect(Math.abs(e.value / (g[i] as number) - 1), `g_${i + 1}, ${form}, r = ${r}`).toBeLessThan(1e-12);
            });
          }
        }
      });
    }
  }
});

describe("ladderPrototype: method", () => {
  it('"auto" takes the closed forms for Butterworth and Chebyshev I, and they agree with "synthesis"', () => {
    for (const spec of [
      { family: "butterworth", order: 9 },
      { family: "chebyshev1", order: 8, rippleDb: 1 },
      { family: "chebyshev1", order: 7, rippleDb: 0.1, loadOhms: 0.2 },
    ] as const) {
      const auto = ladderPrototype(spec);
      const cf = ladderPrototype({ ...spec, method: "closed-form" });
      const syn = ladderPrototype({ ...spec, method: "synthesis" });
      expect(auto).toEqual(cf);
      syn.elements.forEach((e, i) => expect(Math.abs(e.value / (cf.elements[i]?.value as number) - 1)).toBeLessThan(1e-12));
    }
  });

  it("the closed forms go beyond the synthesis's order limit", () => {
    const l = ladderPrototype({ family: "chebyshev1", order: 40, rippleDb: 0.2 });
    expect(l.elements).toHaveLength(40);
    for (const e of l.elements) expect(e.value > 0 && Number.isFinite(e.value)).toBe(true);
  });
});

describe("peakReflection", () => {
  it("is exactly 0 for equal terminations of a response that peaks at DC, and ((r - 1)/(r + 1))^2 otherwise", () => {
    expect(peakReflection(1, 1)).toBe(0);
    expect(peakReflection(1 + 1e-15, 1)).toBe(0);
    expect(peakReflection(1, 3)).toBeCloseTo(0.25, 15);
  });
  it("gives the even-order Chebyshev reflection, 0 at the ripple's own ratio", () => {
    const eps = epsOf(0.5);
    const h0 = 1 / Math.sqrt(1 + eps * eps);
    expect(peakReflection(h0, closedFormLoadRatio(4, eps, 0))).toBe(0);
    expect(peakReflection(h0, 1)).toBeLessThan(0);
  });
});

describe("zeroOrders", () => {
  it("starts with the lowest zero in the middle, then ascending and descending, then every other order once", () => {
    const o = zeroOrders([3, 1, 2, 4]);
    expect(o[0]).toEqual([3, 1, 2, 4].sort((a, b) => a - b).reduce<number[]>((acc, z, i) => (i % 2 === 0 ? [...acc, z] : [z, ...acc]), []));
    expect(o[1]).toEqual([1, 2, 3, 4]);
    expect(o[2]).toEqual([4, 3, 2, 1]);
    expect(o).toHaveLength(24);
    expect(new Set(o.map((x) => x.join(","))).size).toBe(24);
  });
  it("has one empty order for an all-pole ladder", () => {
    expect(zeroOrders([])).toEqual([[]]);
  });
});

describe("synthesizeLadder: consistency of the synthesis", () => {
  it("discards remainders that are rounding of zero (below 1e-15 relative) for the families' ladders to order 12", () => {
    for (let n = 3; n <= 11; n += 2) {
      const res = synthesised(elliptic(n, { rippleDb: 0.5, attenuationDb: 60 }), 1, "shunt-first");
      expect(res.worstResidual).toBeLessThan(1e-15);
      expect(res.zeroOrder).toHaveLength((n - 1) / 2);
    }
  });
});
