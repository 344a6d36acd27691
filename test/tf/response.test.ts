import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { packZpk } from "../../src/tf/packed.ts";
import { frequencyResponse, packedMagnitudeAt } from "../../src/tf/response.ts";
import { magnitudeDb, magnitudeDbByFactorUnchecked, MAGNITUDE_FLOOR_DB } from "../../src/tf/magnitude.ts";
import { groupDelay, phase } from "../../src/tf/phase.ts";
import { evalCascade, fromSections, toSections } from "../../src/tf/sections.ts";
import { zpk } from "../../src/tf/zpk.ts";
import type { Complex } from "../../src/math/complex.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { expectArrayClose, expectClose } from "../helpers/tolerance.ts";
import { filters, fixtureZpk } from "./fixture-filters.ts";

const TWO_PI = 2 * Math.PI;

/** 30 poles on the unit circle at the Butterworth angles, as exact conjugate pairs. */
function butterworth30(): Complex[] {
  const poles = Array.from({ length: 30 }, (_, k) => {
    const th = (Math.PI * (2 * k + 31)) / 60;
    return { re: Math.cos(th), im: Math.sin(th) };
  });
  for (let k = 0; k < 15; k++) poles[29 - k] = { re: poles[k]!.re, im: -poles[k]!.im };
  return poles;
}
const wrap = (x: number): number => x - TWO_PI * Math.round(x / TWO_PI);

describe("frequencyResponse vs scipy.signal.freqs_zpk", () => {
  for (const f of filters) {
    it(`${f.name}: zpk and section cascade`, () => {
      const h = fixtureZpk(f);
      const w = Float64Array.from(f.w);
      const peak = Math.max(...f.response.re.map((re, i) => Math.hypot(re, f.response.im[i]!)));
      for (const [system, floor] of [
        [h, 0],
        // section polynomials s^2 + wz^2 lose relative accuracy right at a notch: absolute floor 1e-13 of the peak
        [toSections(h), 1e-13 * peak],
      ] as const) {
        const r = frequencyResponse(system, w);
        for (let i = 0; i < w.length; i++) {
          const er = f.response.re[i]!;
          const ei = f.response.im[i]!;
          const d = Math.hypot(r.re[i]! - er, r.im[i]! - ei);
          expectClose(d, 0, { abs: 1e-11 * Math.hypot(er, ei) + floor, label: `${f.name} |H - ref| at w=${w[i]}` });
        }
      }
    });
  }
});

describe("magnitudeDb vs scipy", () => {
  for (const f of filters) {
    it(f.name, () => {
      const h = fixtureZpk(f);
      const w = Float64Array.from(f.w);
      // below the floor the value is clamped; the cascade form is compared down to -250 dB
      const ref = f.response.magnitudeDb.map((v) => Math.max(v, MAGNITUDE_FLOOR_DB));
      expectArrayClose(magnitudeDb(h, w), ref, { rel: 0, abs: 1e-10, label: "zpk dB" });
      const cascade = magnitudeDb(toSections(h), w);
      ref.forEach((v, i) => {
        if (v > -250) expectClose(cascade[i]!, v, { rel: 0, abs: 1e-9, label: `cascade dB at w=${w[i]}` });
      });
    });
  }

  it("clamps an exact transmission zero to MAGNITUDE_FLOOR_DB", () => {
    const notch = zpk([{ re: 0, im: 2 }, { re: 0, im: -2 }], [{ re: -1, im: 1 }, { re: -1, im: -1 }], 1);
    expect(magnitudeDb(notch, Float64Array.of(2))[0]).toBe(MAGNITUDE_FLOOR_DB);
  });
});

describe("magnitudeDb (one logarithm per point) vs the per-factor sum of logarithms", () => {
  const root = fc.record({
    re: fc.double({ min: -50, max: 50, noNaN: true }),
    im: fc.double({ min: 0, max: 50, noNaN: true }),
    real: fc.boolean(),
    axis: fc.boolean(),
  });
  const expand = (r: { re: number; im: number; real: boolean; axis: boolean }): Complex[] => {
    const re = r.axis ? 0 : r.re;
    return r.real ? [{ re, im: 0 }] : [{ re, im: r.im }, { re, im: -r.im }];
  };
  const stable = (r: { re: number; im: number; real: boolean; axis: boolean }): Complex[] =>
    expand({ ...r, re: -Math.max(Math.abs(r.re), 1e-3), axis: false });

  it("agree to 1e-12 dB above the floor, for zpk systems and their section cascades", () => {
    fc.assert(
      fc.property(
        fc.array(root, { maxLength: 5 }),
        fc.array(root, { minLength: 1, maxLength: 6 }),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.array(fc.double({ min: -200, max: 200, noNaN: true }), { minLength: 1, maxLength: 9 }),
        (zs, ps, logGain, ws) => {
          const h = zpk(zs.flatMap(expand), ps.flatMap(stable), 10 ** logGain);
          const w = Float64Array.from(ws);
          for (const system of h.zeros.length <= h.poles.length ? [h, toSections(h)] : [h]) {
            const fast = magnitudeDb(system, w);
            const ref = magnitudeDbByFactorUnchecked(system, w);
            for (let i = 0; i < w.length; i++) {
              if (ref[i]! === MAGNITUDE_FLOOR_DB) expect(fast[i]).toBe(MAGNITUDE_FLOOR_DB);
              else expectClose(fast[i]!, ref[i]!, { rel: 0, abs: 1e-12, label: `dB at w=${w[i]}` });
            }
          }
        },
      ),
      { numRuns: 300 },
    );
  });

  it("falls back to the per-factor sum where the products overflow or underflow", () => {
    // |H| ~ gain w^-30 for w >> 1
    const poles = butterworth30();
    const h = zpk([], poles, 1e200);
    const w = Float64Array.of(1e4, 1e6, 1e7);
    // 4000 - 600 log10(w) dB; |den|^2 = w^60 is in range at 1e4 and overflows at 1e6 and 1e7
    expectArrayClose(magnitudeDb(h, w), [1600, 400, -200], { rel: 0, abs: 1e-10 });
    // tiny roots: every factor ~1e-200, products underflow; |H| = 1e-3 |w - 1e-200 j|^2 / |w + 2e-200|^2
    const tiny = zpk([{ re: 0, im: 1e-200 }, { re: 0, im: -1e-200 }], [{ re: -2e-200, im: 0 }, { re: -3e-200, im: 0 }], 1e-3);
    const wt = Float64Array.of(1e-200, 2e-200, 1e-180);
    expectArrayClose(magnitudeDb(tiny, wt), magnitudeDbByFactorUnchecked(tiny, wt), { rel: 0, abs: 1e-12 });
    expect(magnitudeDb(tiny, wt)[0]).toBe(MAGNITUDE_FLOOR_DB);
  });
});

describe("packedMagnitudeAt (one-point, unchecked)", () => {
  it("is exactly hypot of the frequencyResponse value, on the fast and the overflow-safe path", () => {
    const poles = butterworth30();
    const systems = [...filters.map(fixtureZpk), zpk([], poles, 1)];
    for (const h of systems) {
      const packed = packZpk(h);
      const w = Float64Array.of(0, 0.3, 1, 7, 1e3, 1e10);
      const r = frequencyResponse(h, w);
      w.forEach((x, i) => expect(packedMagnitudeAt(packed, x)).toBe(Math.hypot(r.re[i]!, r.im[i]!)));
    }
  });
});

describe("four grid points per pass", () => {
  // a grid of 11 points (two blocks of four and a tail of three); the last
  // point of the first block is far above the band, where the pole product
  // overflows, so that block falls back to one point at a time
  const poles = butterworth30();
  const h = zpk([{ re: 0, im: 3 }, { re: 0, im: -3 }], poles, 1);
  const w = Float64Array.of(0, 0.3, 0.9, 1e12, 1.1, 2, 3, 5, 40, 700, 9e3);
  for (const [label, system] of [
    ["zpk", h],
    ["cascade", toSections(h)],
    ["fixture cascade", toSections(fixtureZpk(filters[0]!))],
  ] as const) {
    it(`${label}: every point is exactly its one-point value (frequencyResponse and magnitudeDb)`, () => {
      const all = frequencyResponse(system, w);
      const db = magnitudeDb(system, w);
      for (let i = 0; i < w.length; i++) {
        const one = frequencyResponse(system, w.subarray(i, i + 1));
        expect([all.re[i], all.im[i]]).toEqual([one.re[0], one.im[0]]);
        expect(db[i]).toBe(magnitudeDb(system, w.subarray(i, i + 1))[0]);
      }
    });
  }

  it("magnitudeDb gives the same values whether or not the grid lets it skip the range tracking", () => {
    // the grid's largest |w| decides whether the products' range is proven
    // for the whole grid (no per-point tracking); a far point turns that off
    const f = fixtureZpk(filters[0]!);
    const w0 = Float64Array.from(f.poles.map((p) => Math.abs(p.im) * 1.01 + 0.5));
    const far = Float64Array.from([...w0, 1e250]);
    for (const system of [f, toSections(f)]) {
      const near = magnitudeDb(system, w0);
      const mixed = magnitudeDb(system, far);
      for (let i = 0; i < w0.length; i++) expect(mixed[i]).toBe(near[i]);
      expect(mixed[w0.length]).toBe(magnitudeDbByFactorUnchecked(system, far.subarray(w0.length))[0]);
    }
  });
});

describe("magnitudeDb (squared products) vs the complex response", () => {
  const root = fc.record({
    re: fc.double({ min: -1e4, max: 1e4, noNaN: true }),
    im: fc.double({ min: 0, max: 1e4, noNaN: true }),
    real: fc.boolean(),
    axis: fc.boolean(),
  });
  const expand = (r: { re: number; im: number; real: boolean; axis: boolean }): Complex[] => {
    const re = r.axis ? 0 : r.re;
    return r.real ? [{ re, im: 0 }] : [{ re, im: r.im }, { re, im: -r.im }];
  };
  const stable = (r: { re: number; im: number; real: boolean; axis: boolean }): Complex[] =>
    expand({ ...r, re: -Math.max(Math.abs(r.re), 1e-2), axis: false });

  it("20 log10 |frequencyResponse| agrees to 1e-12 dB over random zpk systems and their cascades", () => {
    fc.assert(
      fc.property(
        fc.array(root, { maxLength: 6 }),
        fc.array(root, { minLength: 1, maxLength: 8 }),
        fc.double({ min: -6, max: 6, noNaN: true }),
        fc.array(fc.double({ min: -2e4, max: 2e4, noNaN: true }), { minLength: 1, maxLength: 14 }),
        (zs, ps, logGain, ws) => {
          const h = zpk(zs.flatMap(expand), ps.flatMap(stable), 10 ** logGain);
          const w = Float64Array.from(ws);
          for (const system of h.zeros.length <= h.poles.length ? [h, toSections(h)] : [h]) {
            const db = magnitudeDb(system, w);
            const r = frequencyResponse(system, w);
            for (let i = 0; i < w.length; i++) {
              const m = Math.hypot(r.re[i]!, r.im[i]!);
              const ref = 20 * Math.log10(m);
              // section polynomials s^2 + wz^2 lose relative accuracy next to a notch: both forms
              // are then far below the passband; compare the zpk form everywhere above the floor
              if (!(ref > MAGNITUDE_FLOOR_DB)) expect(db[i]).toBe(MAGNITUDE_FLOOR_DB);
              else if (system === h || ref > -200) expectClose(db[i]!, ref, { rel: 0, abs: 1e-12, label: `dB at w=${w[i]}` });
            }
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe("cascade jw-axis poles (read from the sections)", () => {
  it("rejects the same grid points, with the same paths, as the cascade's zpk", () => {
    const cascade = {
      gain: 1,
      sections: [
        { order: 2 as const, num: [0, 0, 4] as const, den: [1, 0.5, 4] as const, w0: 2, q: 4, kind: "lowpass" as const },
        { order: 2 as const, num: [0, 0, 9] as const, den: [1, 0, 9] as const, w0: 3, q: Infinity, kind: "lowpass" as const },
        { order: 1 as const, num: [0, 1, 0] as const, den: [0, 1, 0] as const, w0: 0, kind: "highpass" as const },
      ],
    };
    const z = fromSections(cascade);
    expect(() => magnitudeDb(cascade, Float64Array.of(1, 3))).toThrow(/jw axis/);
    expect(() => frequencyResponse(cascade, Float64Array.of(1, -3))).toThrow(InvalidArgumentError);
    expect(() => frequencyResponse(cascade, Float64Array.of(2, 0))).toThrow(/jw axis/);
    for (const w of [Float64Array.of(1, 3), Float64Array.of(-3, 5), Float64Array.of(2, 0), Float64Array.of(1, 2, 2.5)]) {
      const fromZpk = (() => {
        try {
          frequencyResponse(z, w);
          return "ok";
        } catch (e) {
          return (e as Error).message;
        }
      })();
      for (const f of [frequencyResponse, magnitudeDb] as const) {
        if (fromZpk === "ok") expect(() => f(cascade, w)).not.toThrow();
        else expect(() => f(cascade, w)).toThrow(fromZpk.replace("frequencyResponse", f.name));
      }
    }
  });
});

describe("packed systems", () => {
  it("a system that is not frozen is read afresh on every call", () => {
    const h = { zeros: [] as Complex[], poles: [{ re: -1, im: 0 }], gain: 1 };
    const w = Float64Array.of(1);
    expect(magnitudeDb(h, w)[0]).toBeCloseTo(-3.0103, 4);
    h.poles[0] = { re: -2, im: 0 };
    h.gain = 2;
    expect(magnitudeDb(h, w)[0]).toBeCloseTo(20 * Math.log10(2 / Math.sqrt(5)), 12);
    expect(frequencyResponse(h, w).re[0]).toBeCloseTo(0.8, 14);
    h.gain = Number.NaN;
    expect(() => frequencyResponse(h, w)).toThrow(/gain/);
  });

  it("toSections returns a cascade frozen down to the coefficient arrays", () => {
    const c = toSections(fixtureZpk(filters[0]!));
    expect(Object.isFrozen(c.sections[0]!.num) && Object.isFrozen(c.sections[0]!.den)).toBe(true);
  });

  it("a cascade whose constant numerators would overflow when multiplied into the gain is evaluated as given", () => {
    // three sections with b0 = a0 = 1e200: the product 1e600 of the numerators is not folded
    const sec = { order: 2 as const, num: [0, 0, 1e200] as const, den: [1, 1e100, 1e200] as const, w0: 1e100, q: 1, kind: "lowpass" as const };
    const cascade = { gain: 1, sections: [sec, sec, sec] };
    const w = Float64Array.of(0, 3e99, 1e100, 2e100, 1e101);
    const r = frequencyResponse(cascade, w);
    const db = magnitudeDb(cascade, w);
    w.forEach((x, i) => {
      const v = evalCascade(cascade, { re: 0, im: x });
      expectClose(r.re[i]!, v.re, { rel: 1e-14, abs: 1e-16 });
      expectClose(r.im[i]!, v.im, { rel: 1e-14, abs: 1e-16 });
      // where w^2 terms overflow the dB value is a sum of logarithms of magnitudes near 1e200
      // (460 natural-log units, ulp 6e-14, times 8.7 dB per unit): 1e-11 dB
      expectClose(db[i]!, 20 * Math.log10(Math.hypot(v.re, v.im)), { rel: 0, abs: 1e-11 });
    });
  });
});

describe("phase vs numpy.unwrap(angle(freqs_zpk))", () => {
  for (const f of filters) {
    it(`${f.name}: same angle modulo 2 pi, continuous between transmission zeros`, () => {
      const h = fixtureZpk(f);
      const w = Float64Array.from(f.w);
      const hasAxisZeros = h.zeros.some((z) => Math.abs(z.re) <= 1e-9 * Math.hypot(z.re, z.im) && z.im !== 0);
      for (const system of [h, toSections(h)]) {
        const ph = phase(system, w);
        for (let i = 0; i < w.length; i++) {
          expectClose(wrap(ph[i]! - f.response.phaseUnwrapped[i]!), 0, { abs: 1e-10, label: `phase at w=${w[i]}` });
        }
        // continuous along the grid: each step is the principal angle step, plus +pi per jw-axis zero crossed
        for (let i = 1; i < w.length; i++) {
          const crossed = h.zeros.filter(
            (z) => Math.abs(z.re) <= 1e-9 * Math.hypot(z.re, z.im) && z.im > w[i - 1]! && z.im <= w[i]!,
          ).length;
          const mine = ph[i]! - ph[i - 1]! - Math.PI * crossed;
          const ref = wrap(f.response.phaseUnwrapped[i]! - f.response.phaseUnwrapped[i - 1]! - Math.PI * crossed);
          expectClose(mine, ref, { rel: 0, abs: 1e-9, label: `phase step at w=${w[i]}` });
        }
        if (!hasAxisZeros) {
          // where numpy's unwrap is unambiguous the two agree up to one constant multiple of 2 pi
          const offset = ph[0]! - f.response.phaseUnwrapped[0]!;
          expectClose(wrap(offset), 0, { abs: 1e-10 });
          for (let i = 0; i < w.length; i++) expectClose(ph[i]! - f.response.phaseUnwrapped[i]! - offset, 0, { abs: 1e-9 });
        }
      }
    });
  }

  it("analytic examples: three real poles, RHP zeros (allpass), a sign-inverting gain", () => {
    const p3 = zpk([], Array(3).fill({ re: -1, im: 0 }), 1);
    expectArrayClose(phase(p3, Float64Array.of(0, 1, 1e8)), [0, -0.75 * Math.PI, -1.5 * Math.PI + 3e-8], { rel: 1e-12, abs: 1e-15 });
    // first-order allpass (s - 2)/(s + 2): H(0) = -1, principal phase pi at 0+, then pi - 2 atan(w/2)
    const ap = zpk([{ re: 2, im: 0 }], [{ re: -2, im: 0 }], 1);
    const w = Float64Array.of(0, 2, 1e9);
    expectArrayClose(phase(ap, w), Array.from(w, (x) => Math.PI - 2 * Math.atan(x / 2)), { rel: 1e-12, abs: 1e-15 });
    const inv = zpk([], [{ re: -1, im: 0 }], -3);
    expectClose(phase(inv, Float64Array.of(1))[0]!, Math.PI - Math.PI / 4, { rel: 1e-15 });
  });
});

describe("groupDelay vs mpmath derivative of the phase", () => {
  for (const f of filters) {
    it(f.name, () => {
      const h = fixtureZpk(f);
      const w = Float64Array.from(f.groupDelay.w);
      const maxTau = Math.max(...f.groupDelay.tau.map(Math.abs));
      for (const system of [h, toSections(h)]) {
        expectArrayClose(groupDelay(system, w), f.groupDelay.tau, { rel: 1e-9, abs: 1e-12 * maxTau });
      }
    });
  }
});

describe("groupDelay = -d phase / dw (property)", () => {
  const root = fc.record({
    re: fc.double({ min: -3, max: -0.2, noNaN: true }),
    im: fc.double({ min: 0, max: 3, noNaN: true }),
    real: fc.boolean(),
  });
  const expand = (r: { re: number; im: number; real: boolean }): Complex[] =>
    r.real ? [{ re: r.re, im: 0 }] : [{ re: r.re, im: r.im }, { re: r.re, im: -r.im }];
  it("matches a central difference of phase within 1e-6 relative", () => {
    fc.assert(
      fc.property(
        fc.array(root, { minLength: 1, maxLength: 4 }),
        fc.array(fc.record({ re: fc.double({ min: -3, max: 3, noNaN: true }), im: fc.double({ min: 0, max: 3, noNaN: true }), real: fc.boolean() }), { maxLength: 3 }),
        fc.double({ min: 0.05, max: 5, noNaN: true }),
        (ps, zs, w0) => {
          const h = zpk(zs.flatMap(expand), ps.flatMap(expand), 1);
          const dw = 1e-5 * w0;
          const ph = phase(h, Float64Array.of(w0 - dw, w0 + dw));
          const numeric = -(ph[1]! - ph[0]!) / (2 * dw);
          const tau = groupDelay(h, Float64Array.of(w0))[0]!;
          // scale: the sum of the magnitudes of all factor contributions
          let scale = 0;
          for (const r of [...h.poles, ...h.zeros]) scale += Math.abs(r.re) / ((w0 - r.im) ** 2 + r.re ** 2);
          return Math.abs(numeric - tau) <= 1e-6 * Math.max(scale, 1e-3);
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe("extreme frequencies", () => {
  it("stays finite where section polynomials would overflow (w^2 beyond the double range)", () => {
    const h = zpk([], [{ re: -5e149, im: 5e149 }, { re: -5e149, im: -5e149 }], 5e299);
    const w = Float64Array.of(0, 1e150, 1e155);
    const direct = frequencyResponse(h, w);
    const cascade = frequencyResponse(toSections(h), w);
    // at 1e155 (w^2 overflows): H = 5e299 / ((j w + 5e149)^2 + 2.5e299) ~ -5e-11 (1 + 1e-5 j)
    expectClose(direct.re[2]!, -5e-11, { rel: 1e-9 });
    for (let k = 0; k < 3; k++) {
      expectClose(cascade.re[k]!, direct.re[k]!, { rel: 1e-13 });
      expectClose(cascade.im[k]!, direct.im[k]!, { rel: 1e-13, abs: 1e-300 });
    }
    const db = magnitudeDb(toSections(h), w);
    expectClose(db[2]!, 20 * Math.log10(5e-11), { rel: 1e-9 });
  });
});

describe("frequencyResponse far above a high-order filter's band", () => {
  it("matches |H| = w^-n where the pole product overflows (the one-root-at-a-time path)", () => {
    // 30 poles on the unit circle (Butterworth angles), gain 1: |H(jw)| -> w^-30 for w >> 1
    const poles = butterworth30();
    const h = zpk([], poles, 1);
    const w = Float64Array.of(1e6, 1e10);
    const r = frequencyResponse(h, w);
    expectClose(Math.hypot(r.re[0]!, r.im[0]!), 1e-180, { rel: 1e-12 });
    expectClose(Math.hypot(r.re[1]!, r.im[1]!), 1e-300, { rel: 1e-12 });
  });
});

describe("response argument validation", () => {
  const h = zpk([], [{ re: -1, im: 0 }], 1);
  it("rejects bad grids and systems with typed errors", () => {
    expect(() => frequencyResponse(h, [1, 2] as unknown as Float64Array)).not.toThrow();
    expect(() => frequencyResponse(h, Float64Array.of(1, Number.NaN))).toThrow(/w\[1\]/);
    expect(() => phase(h, Float64Array.of(-1))).toThrow(InvalidArgumentError);
    expect(() => magnitudeDb({ zeros: [], poles: [{ re: -1, im: 1 }], gain: 1 }, Float64Array.of(1))).toThrow(/conjugate/);
    expect(() => groupDelay({ sections: [], gain: "1" } as unknown as never, Float64Array.of(1))).toThrow(/gain/);
    const integrator = zpk([], [{ re: 0, im: 0 }], 1);
    expect(() => frequencyResponse(integrator, Float64Array.of(0, 1))).toThrow(/jw axis/);
  });
});

describe("system validation on the public boundary", () => {
  const w = Float64Array.of(0.5, 2);
  const p = { re: -1, im: 2 };
  const q = { re: -3, im: 0.5 };
  const c = (x: Complex): Complex => ({ re: x.re, im: -x.im });
  it("accepts conjugates in any order and within the pairing tolerance, with the same values", () => {
    const ref = magnitudeDb({ zeros: [], poles: [p, c(p), q, c(q)], gain: 3 }, w);
    for (const poles of [
      [p, q, c(q), c(p)],
      [p, q, c(p), c(q)],
      [c(p), p, { re: -3, im: -0.5 * (1 + 1e-12) }, q],
    ]) {
      expectArrayClose(magnitudeDb({ zeros: [], poles, gain: 3 }, w), ref, { rel: 0, abs: 1e-10 });
    }
  });
  it("names the failing field", () => {
    expect(() => magnitudeDb({ zeros: [], poles: [p, c(p), q], gain: 1 }, w)).toThrow(/system\.poles\[2\]/);
    expect(() => frequencyResponse({ zeros: [{ re: 0, im: Number.NaN }], poles: [q, c(q)], gain: 1 }, w)).toThrow(/system\.zeros\[0\]/);
    expect(() => frequencyResponse({ zeros: [], poles: [p, c(p)], gain: Infinity }, w)).toThrow(/system\.gain/);
    const sec = { order: 2, num: [0, 0, 1], den: [2, 1, 1], w0: 1, q: 1, kind: "lowpass" };
    expect(() => magnitudeDb({ gain: 1, sections: [sec] } as never, w)).toThrow(/system\.sections\[0\]\.den/);
  });
});

describe("frequencyResponse never returns a non-finite value", () => {
  it("refuses a response beyond the double range, naming the grid point", () => {
    const huge = { zeros: [], poles: [{ re: -1e-300, im: 0 }], gain: 1.7e308 };
    expect(() => frequencyResponse(huge as never, Float64Array.of(1e-310, 1))).toThrow(/w\[0\].*beyond the double range/s);
  });
});
