import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { evalCascade, evalSection, fromSections, toSections } from "../../src/tf/sections.ts";
import { evalZpk, zpk } from "../../src/tf/zpk.ts";
import { lowpassToBandpass } from "../../src/tf/transforms.ts";
import { butterworth } from "../../src/approx/butterworth.ts";
import type { Complex } from "../../src/math/complex.ts";
import type { SecondOrderSection, Zpk } from "../../src/tf/types.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectClose } from "../helpers/tolerance.ts";
import { complexList, loadFixture } from "../helpers/fixtures.ts";
import { thrownBy } from "../helpers/throws.ts";
import { firstNonFinite } from "../helpers/finite.ts";

/** Match every expected value to the nearest unused actual value (order-free comparison). */
function expectSameSet(actual: readonly Complex[], expected: readonly Complex[], rel: number, label: string): void {
  expect(actual.length, label).toBe(expected.length);
  const used = new Set<number>();
  for (const e of expected) {
    let best = -1;
    let bestD = Infinity;
    actual.forEach((a, i) => {
      const d = Math.hypot(a.re - e.re, a.im - e.im);
      if (!used.has(i) && d < bestD) {
        bestD = d;
        best = i;
      }
    });
    used.add(best);
    expectClose(bestD, 0, { abs: rel * Math.max(Math.hypot(e.re, e.im), 1e-3), label: `${label} ${e.re}${e.im >= 0 ? "+" : ""}${e.im}j` });
  }
}

const pair = (re: number, im: number): Complex[] => [
  { re, im },
  { re, im: -im },
];

/** A 5th-order lowpass with two jw-axis zero pairs (elliptic-like, values of our own). */
const notchLowpass = zpk([...pair(0, 1.3), ...pair(0, 2.2)], [...pair(-0.1, 1), ...pair(-0.4, 0.7), { re: -0.6, im: 0 }], 0.3);

function expectSameResponse(h: Zpk, ws: readonly number[], rel = 1e-13): void {
  const c = toSections(h);
  for (const w of ws) {
    const a = evalZpk(h, { re: 0, im: w });
    const b = evalCascade(c, { re: 0, im: w });
    const m = Math.hypot(a.re, a.im);
    expectClose(Math.hypot(a.re - b.re, a.im - b.im), 0, { abs: rel * m, label: `|H - cascade| at w=${w}` });
  }
}

describe("toSections", () => {
  it("pairs jw zeros with the nearest pole pair by decreasing Q and normalises notch sections", () => {
    const c = toSections(notchLowpass);
    expect(c.sections.map((s) => s.order)).toEqual([1, 2, 2]);
    const [first, low, high] = c.sections as [unknown, SecondOrderSection, SecondOrderSection];
    expect(first).toMatchObject({ kind: "lowpass", w0: 0.6, num: [0, 0, 0.6] });
    expect(high.q).toBeGreaterThan(low.q);
    expect(high).toMatchObject({ kind: "notch", notchType: "lowpass-notch" });
    expectClose(high.wz ?? 0, 1.3, { rel: 1e-15 });
    expectClose(low.wz ?? 0, 2.2, { rel: 1e-15 });
    // lowpass-notch sections have unit DC gain
    for (const s of c.sections) expectClose(evalSection(s, { re: 0, im: 0 }).re, 1, { rel: 1e-15 });
    expectSameResponse(notchLowpass, [0, 0.05, 0.6, 1, 1.3, 2, 10, 1e3]);
  });

  it("gives highpass sections HF gain 1 and bandpass sections gain 1 at w0", () => {
    const hp = zpk(Array(3).fill({ re: 0, im: 0 }), [...pair(-0.3, 0.9), { re: -0.8, im: 0 }], 4);
    const c = toSections(hp);
    expect(c.sections.map((s) => s.kind)).toEqual(["highpass", "highpass"]);
    for (const s of c.sections) {
      const v = evalSection(s, { re: 0, im: 1e9 });
      expectClose(Math.hypot(v.re, v.im), 1, { rel: 1e-12 });
    }
    expect(c.gain).toBe(4);
    const bp = zpk(Array(2).fill({ re: 0, im: 0 }), [...pair(-0.1, 1), ...pair(-0.2, 2)], 0.5);
    const cb = toSections(bp);
    expect(cb.sections.map((s) => s.kind)).toEqual(["bandpass", "bandpass"]);
    for (const s of cb.sections) {
      const v = evalSection(s, { re: 0, im: s.w0 });
      expectClose(v.re, 1, { rel: 1e-14 });
      expectClose(v.im, 0, { abs: 1e-14 });
    }
    expectSameResponse(bp, [0.01, 0.5, 1, 2, 5]);
  });

  it("recognises allpass, symmetric and highpass notches, and general sections", () => {
    const ap = zpk([...pair(0.5, 1), { re: 2, im: 0 }], [...pair(-0.5, 1), { re: -2, im: 0 }], 1);
    const c = toSections(ap);
    expect(c.sections.map((s) => s.kind)).toEqual(["allpass", "allpass"]);
    for (const w of [0.1, 1, 7]) {
      const v = evalCascade(c, { re: 0, im: w });
      expectClose(Math.hypot(v.re, v.im), 1, { rel: 1e-14 });
    }
    const sym = toSections(zpk(pair(0, 1), pair(-0.05, Math.sqrt(1 - 0.0025)), 1));
    expect(sym.sections[0]).toMatchObject({ kind: "notch", notchType: "symmetric" });
    const hpn = toSections(zpk(pair(0, 0.5), pair(-0.2, 1), 1));
    expect(hpn.sections[0]).toMatchObject({ kind: "notch", notchType: "highpass-notch", num: [1, 0, 0.25] });
    const gen = zpk([{ re: -3, im: 0 }, { re: -5, im: 0 }], [{ re: -1, im: 0 }, { re: -2, im: 0 }], 2);
    const cg = toSections(gen);
    expect(cg.sections.map((s) => [s.order, s.kind])).toEqual([
      [1, "general"],
      [1, "general"],
    ]);
    expectSameResponse(gen, [0, 1, 10]);
    // a complex zero pair with only real poles forms a second-order section with Q < 1/2
    const mixed = zpk(pair(-1, 3), [{ re: -1, im: 0 }, { re: -4, im: 0 }, { re: -9, im: 0 }], 1);
    const cm = toSections(mixed);
    expect(cm.sections.map((s) => s.order).sort()).toEqual([1, 2]);
    expectSameResponse(mixed, [0, 0.5, 3, 30]);
  });

  it("orders sections as requested", () => {
    const qs = (o: "ascending-q" | "descending-q" | "as-given") =>
      toSections(notchLowpass, { order: o }).sections.map((s) => (s.order === 2 ? Math.round(s.q * 100) / 100 : 0));
    expect(qs("ascending-q")).toEqual([0, 1.01, 5.02]);
    expect(qs("descending-q")).toEqual([5.02, 1.01, 0]);
    expect(qs("as-given")).toEqual([5.02, 1.01, 0]);
  });

  it("rejects improper or unstable systems and unknown orderings", () => {
    expect(() => toSections(zpk([{ re: -1, im: 0 }], [], 1))).toThrow(/improper/);
    expect(() => toSections(zpk([], [{ re: 1, im: 0 }], 1))).toThrow(/poles\[0\]/);
    expect(() => toSections(notchLowpass, { order: "by-size" as "as-given" })).toThrow(InvalidArgumentError);
    expect(() => toSections(zpk([], [{ re: -1e151, im: 0 }], 1))).toThrow(/at most/);
    expect(() => evalSection({ order: 2, num: [0, 0, 1], den: [2, 1, 1], w0: 1, q: 1, kind: "lowpass" }, { re: 0, im: 0 })).toThrow(/den/);
    expect(() => fromSections({ sections: [], gain: Number.NaN })).toThrow(/gain/);
  });
});

describe("zpk -> sections -> zpk (property)", () => {
  const lhp = fc.record({
    re: fc.double({ min: -10, max: -0.01, noNaN: true }),
    im: fc.double({ min: 0, max: 10, noNaN: true }),
    real: fc.boolean(),
  });
  const zero = fc.record({
    re: fc.double({ min: -10, max: 10, noNaN: true }),
    im: fc.double({ min: 0, max: 10, noNaN: true }),
    kind: fc.constantFrom("origin", "axis", "real", "complex"),
  });
  const expand = (v: { re: number; im: number }, real: boolean): Complex[] =>
    real || v.im === 0 ? [{ re: v.re, im: 0 }] : pair(v.re, v.im);

  it("recovers the same zeros, poles and gain, and the same response", () => {
    fc.assert(
      fc.property(
        fc.array(lhp, { minLength: 1, maxLength: 5 }),
        fc.array(zero, { maxLength: 5 }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        fc.constantFrom("ascending-q" as const, "descending-q" as const, "as-given" as const),
        (ps, zs, k, order) => {
          const poles = ps.flatMap((p) => expand(p, p.real));
          // Nearly coincident poles are ill conditioned in coefficient form (error ~ u |p|^2 / separation);
          // keep them at least 1e-3 |p| apart so that 1e-9 is a fair tolerance.
          for (let i = 0; i < poles.length; i++)
            for (let j = i + 1; j < poles.length; j++) {
              const a = poles[i]!;
              const b = poles[j]!;
              fc.pre(Math.hypot(a.re - b.re, a.im - b.im) > 1e-3 * Math.hypot(a.re, a.im));
            }
          const zeros: Complex[] = [];
          for (const z of zs) {
            const add =
              z.kind === "origin" ? [{ re: 0, im: 0 }] : z.kind === "axis" ? pair(0, z.im + 0.1) : z.kind === "real" ? [{ re: z.re, im: 0 }] : expand({ re: z.re, im: z.im + 0.1 }, false);
            if (zeros.length + add.length <= poles.length) zeros.push(...add);
          }
          const h = zpk(zeros, poles, k);
          const back = fromSections(toSections(h, { order }));
          expectSameSet(back.poles, poles, 1e-9, "poles");
          expectSameSet(back.zeros, zeros, 1e-9, "zeros");
          expectClose(back.gain, k, { rel: 1e-12 });
        },
      ),
      { numRuns: 200 },
    );
  });
});

interface SosCase {
  name: string;
  zeros: [number, number][];
  poles: [number, number][];
  gain: number;
  sos: number[][];
}
const sosFixture = loadFixture<{ cases: SosCase[] }>("tf-sections.json");

describe("toSections vs scipy.signal.zpk2sos(analog=True, pairing='minimal')", () => {
  for (const c of sosFixture.cases) {
    it(`${c.name}: same denominators, same jw-axis zero assigned to each`, () => {
      const h: Zpk = { zeros: complexList(c.zeros), poles: complexList(c.poles), gain: c.gain };
      const ours = toSections(h).sections;
      expect(ours.length).toBe(c.sos.length);
      const used = new Set<number>();
      for (const row of c.sos) {
        const [b2, b1, b0, a2, a1, a0] = row as [number, number, number, number, number, number];
        // scipy stores a first-order section as [0, 0, b0, 0, 1, a0]
        const den = a2 === 0 ? [0, a1, a0] : [1, a1 / a2, a0 / a2];
        const idx = ours.findIndex(
          (s, i) => !used.has(i) && Math.abs(s.den[1] - den[1]!) <= 1e-12 * Math.abs(den[1]!) && Math.abs(s.den[2] - den[2]!) <= 1e-12 * Math.abs(den[2]!),
        );
        expect(idx, `no section with denominator ${den.join(", ")}`).toBeGreaterThanOrEqual(0);
        used.add(idx);
        const s = ours[idx]!;
        if (b2 !== 0 && b1 === 0 && b0 > 0) {
          // a jw-axis zero pair: the same one must be paired with this pole pair
          expect(s.kind).toBe("notch");
          expectClose((s as SecondOrderSection).wz ?? 0, Math.sqrt(b0 / b2), { rel: 1e-12 });
        }
      }
      // zeros at the origin: the same total (we spread them one per section where scipy stacks them)
      const originOurs = ours.reduce((n, s) => n + (s.kind === "highpass" ? s.order : s.kind === "bandpass" ? 1 : 0), 0);
      const originScipy = c.zeros.filter(([re, im]) => re === 0 && im === 0).length;
      expect(originOurs).toBe(originScipy);
    });
  }
});

describe("toSections band split (zerosAtOrigin)", () => {
  const bandpass = (order: number, bw: number): Zpk => lowpassToBandpass(butterworth(order), { w0: 1, bandwidth: bw });

  it("gives highpass sections on the low poles and lowpass sections on the high poles, the same transfer function", () => {
    for (const [order, bw] of [[2, 4], [3, 4], [3, 0.5], [4, 4], [5, 1], [5, 4]] as const) {
      const z = bandpass(order, bw);
      const split = toSections(z, { zerosAtOrigin: "band-split" });
      const usual = toSections(z);
      const kinds = [...split.sections].sort((a, b) => a.w0 - b.w0).map((s) => s.kind).join(" ");
      expect(kinds, `order ${order}, bandwidth ${bw}`).toMatch(/^(highpass )+(bandpass )?(lowpass ?)+$/);
      expect(usual.sections.filter((s) => s.kind === "bandpass").length).toBeGreaterThan(split.sections.filter((s) => s.kind === "bandpass").length);
      for (const w of [0.05, 0.3, 1, 2.5, 17]) {
        const s: Complex = { re: 0, im: w };
        const want = evalZpk(z, s);
        for (const c of [split, usual]) {
          const got = evalCascade(c, s);
          expect(Math.hypot(got.re - want.re, got.im - want.im)).toBeLessThanOrEqual(1e-12 * Math.hypot(want.re, want.im));
        }
      }
    }
  });

  it("refuses an unknown sharing, naming the option", () => {
    expect(() => toSections(bandpass(2, 1), { zerosAtOrigin: "halves" as never })).toThrow(/options\.zerosAtOrigin/);
  });
});

describe("toSections ranges", () => {
  it("refuses a pole at -5e-324 (it returned a non-finite gain), naming the pole", () => {
    const e = thrownBy(() => toSections(zpk([], [{ re: -5e-324, im: 0 }], 1)), InvalidArgumentError);
    expect(e.path).toBe("system.poles[0]");
    expect(e.message).toContain("poles at least 1e-150 rad/s");
  });

  it("refuses a cascade whose gain leaves the double range, though each pole is in range", () => {
    const poles = Array.from({ length: 8 }, () => ({ re: -1e-100, im: 0 }));
    const e = thrownBy(() => toSections(zpk([], poles, 1)), InvalidArgumentError);
    expect(e.path).toBe("system");
  });

  it("returns only finite numbers or throws a typed error for poles and zeros across the range (property)", () => {
    const mag = fc.double({ min: -150, max: 150, noNaN: true }).map((x) => 10 ** x);
    fc.assert(
      fc.property(fc.array(fc.tuple(mag, fc.double({ min: 0, max: 1.5, noNaN: true })), { minLength: 1, maxLength: 6 }), fc.array(mag, { maxLength: 3 }), (ps, zs) => {
        const poles: Complex[] = ps.flatMap(([m, t]) => (t < 0.1 ? [{ re: -m, im: 0 }] : [{ re: -m * Math.cos(t), im: m * Math.sin(t) }, { re: -m * Math.cos(t), im: -m * Math.sin(t) }]));
        const zeros: Complex[] = zs.slice(0, poles.length).map((m) => ({ re: -m, im: 0 }));
        try {
          expect(firstNonFinite(toSections(zpk(zeros, poles, 1)))).toBeNull();
        } catch (e) {
          expect(e).toBeInstanceOf(InvalidArgumentError);
        }
      }),
      { numRuns: 300, seed: 1202 },
    );
  });
});
