import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { lowpassToBandpass, lowpassToBandstop, lowpassToHighpass, lowpassToLowpass } from "../../src/tf/transforms.ts";
import { frequencyResponse } from "../../src/tf/response.ts";
import { zpk } from "../../src/tf/zpk.ts";
import type { Complex } from "../../src/math/complex.ts";
import type { Zpk } from "../../src/tf/types.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectClose, expectComplexSetClose } from "../helpers/tolerance.ts";
import { filters, fixtureZpk } from "./fixture-filters.ts";

function apply(kind: string, h: Zpk, params: { w0: number; bandwidth?: number }): Zpk {
  const band = { w0: params.w0, bandwidth: params.bandwidth ?? 1 };
  if (kind === "lp2lp") return lowpassToLowpass(h, { w0: params.w0 });
  if (kind === "lp2hp") return lowpassToHighpass(h, { w0: params.w0 });
  if (kind === "lp2bp") return lowpassToBandpass(h, band);
  return lowpassToBandstop(h, band);
}

describe("lowpassTo* vs scipy.signal.lp2*_zpk", () => {
  for (const f of filters) {
    it(`${f.name} (${f.transform.kind})`, () => {
      const proto = fixtureZpk(f.prototype);
      const got = apply(f.transform.kind, proto, f.transform.params);
      const ref = fixtureZpk(f);
      // roots relative to their modulus; scipy computes z B/2 - sqrt(...) directly, which loses a few digits
      expectComplexSetClose(got.poles, ref.poles, { rel: 1e-12, label: "poles" });
      expectComplexSetClose(got.zeros, ref.zeros, { rel: 1e-12, abs: 1e-12 * f.transform.params.w0, label: "zeros" });
      expectClose(got.gain, ref.gain, { rel: 1e-12, label: "gain" });
      // exact conjugate symmetry
      for (const r of [...got.poles, ...got.zeros]) {
        if (r.im !== 0) expect([...got.poles, ...got.zeros].some((u) => u.re === r.re && u.im === -r.im)).toBe(true);
      }
    });
  }
});

const pair = (re: number, im: number): Complex[] => [
  { re, im },
  { re, im: -im },
];

const mag = (h: Zpk, w: number): number => {
  const r = frequencyResponse(h, Float64Array.of(w));
  return Math.hypot(r.re[0]!, r.im[0]!);
};

describe("transforms map the magnitude exactly (property)", () => {
  const root = fc.record({
    re: fc.double({ min: -2, max: -0.05, noNaN: true }),
    im: fc.double({ min: 0, max: 2, noNaN: true }),
    real: fc.boolean(),
  });
  const zeroIm = fc.double({ min: 1.05, max: 4, noNaN: true });
  const proto = fc
    .tuple(fc.array(root, { minLength: 1, maxLength: 4 }), fc.array(zeroIm, { maxLength: 1 }), fc.double({ min: 0.2, max: 5, noNaN: true }))
    .map(([ps, zs, k]) => {
      const poles = ps.flatMap((r) => (r.real ? [{ re: r.re, im: 0 }] : pair(r.re, r.im)));
      return zpk(poles.length >= 2 ? zs.flatMap((b) => pair(0, b)) : [], poles, k);
    });
  const w0 = fc.double({ min: 0.1, max: 1e4, noNaN: true });
  const ratio = fc.double({ min: 0.05, max: 3, noNaN: true });
  const at = fc.double({ min: 0.01, max: 100, noNaN: true });
  const tol = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(a, b) + 1e-300;

  it("lowpassToLowpass: |H(jw)| = |H_lp(j w/w0)|", () => {
    fc.assert(fc.property(proto, w0, at, (h, w0v, x) => tol(mag(lowpassToLowpass(h, { w0: w0v }), x * w0v), mag(h, x))), { numRuns: 100 });
  });
  it("lowpassToHighpass: |H_hp(jw)| = |H_lp(j w0/w)|", () => {
    fc.assert(fc.property(proto, w0, at, (h, w0v, x) => tol(mag(lowpassToHighpass(h, { w0: w0v }), x * w0v), mag(h, 1 / x))), { numRuns: 100 });
  });
  it("lowpassToBandpass: |H_bp(jw)| = |H_lp(j (w^2 - w0^2)/(w B))|", () => {
    fc.assert(
      fc.property(proto, w0, ratio, at, (h, w0v, r, x) => {
        const B = r * w0v;
        const w = x * w0v;
        return tol(mag(lowpassToBandpass(h, { w0: w0v, bandwidth: B }), w), mag(h, Math.abs(w * w - w0v * w0v) / (w * B)));
      }),
      { numRuns: 100 },
    );
  });
  it("lowpassToBandstop: |H_bs(jw)| = |H_lp(j w B/(w0^2 - w^2))|", () => {
    fc.assert(
      fc.property(proto, w0, ratio, at, (h, w0v, r, x) => {
        fc.pre(Math.abs(x - 1) > 1e-6);
        const B = r * w0v;
        const w = x * w0v;
        return tol(mag(lowpassToBandstop(h, { w0: w0v, bandwidth: B }), w), mag(h, (w * B) / Math.abs(w0v * w0v - w * w)));
      }),
      { numRuns: 100 },
    );
  });
});

describe("transform argument validation", () => {
  const h = zpk([], pair(-0.5, 0.8), 1);
  it("rejects bad options, improper prototypes and roots at the origin", () => {
    expect(() => lowpassToLowpass(h, { w0: 0 })).toThrow(/options\.w0/);
    expect(() => lowpassToBandpass(h, { w0: 1 } as unknown as { w0: number; bandwidth: number })).toThrow(/options\.bandwidth/);
    expect(() => lowpassToHighpass(h, undefined as unknown as { w0: number })).toThrow(InvalidArgumentError);
    expect(() => lowpassToHighpass(zpk([{ re: 0, im: 0 }], pair(-0.5, 0.8), 1), { w0: 1 })).toThrow(/zeros\[0\]/);
    expect(() => lowpassToBandstop(zpk([{ re: -1, im: 0 }, { re: -2, im: 0 }], [{ re: -1, im: 0 }], 1), { w0: 1, bandwidth: 1 })).toThrow(/more zeros/);
  });
});
