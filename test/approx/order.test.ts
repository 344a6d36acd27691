import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { besselOrderForDelay, minimumOrder, type MinimumOrderSpec, type OrderResponse } from "../../src/approx/order.ts";
import { prototype } from "../../src/approx/prototype.ts";
import { bessel } from "../../src/approx/bessel.ts";
import { InvalidArgumentError, SpecError, UnrealisableError } from "../../src/errors.ts";
import type { FamilyName } from "../../src/approx/types.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import { expectArrayClose } from "../helpers/tolerance.ts";
import { magnitudeDb } from "./prototype-fixtures.ts";
import { thrownBy } from "../helpers/throws.ts";
import { firstNonFinite } from "../helpers/finite.ts";

interface OrderCase {
  family: FamilyName;
  response: OrderResponse;
  passbandW: number | number[];
  stopbandW: number | number[];
  passbandLossDb: number;
  stopbandAttenuationDb: number;
  order: number;
  naturalW: number | number[];
}

const list = (x: number | readonly number[]): number[] => (typeof x === "number" ? [x] : [...x]);

/** Loss (dB) of the designed filter at w: the prototype evaluated at the lowpass-equivalent frequency. */
function lossAt(spec: MinimumOrderSpec, w: number): number {
  const r = minimumOrder(spec);
  const h = prototype(r.prototype);
  const wn = list(r.naturalW);
  let omega: number;
  if (spec.response === "lowpass") omega = w / (wn[0] as number);
  else if (spec.response === "highpass") omega = (wn[0] as number) / w;
  else {
    const w0sq = (wn[0] as number) * (wn[1] as number);
    const bw = (wn[1] as number) - (wn[0] as number);
    omega = spec.response === "bandpass" ? Math.abs(w * w - w0sq) / (w * bw) : (w * bw) / Math.abs(w0sq - w * w);
  }
  return -magnitudeDb(h, omega);
}

describe("minimumOrder", () => {
  it("matches scipy.signal buttord/cheb1ord/cheb2ord/ellipord (analog) on 72 specs x 4 families: same order, naturalW to 1e-6", () => {
    const cases = loadFixture<{ cases: OrderCase[] }>("approx-orders-scipy.json").cases;
    expect(cases.length).toBe(288);
    for (const c of cases) {
      const r = minimumOrder({
        family: c.family,
        response: c.response,
        passbandW: c.passbandW,
        stopbandW: c.stopbandW,
        passbandLossDb: c.passbandLossDb,
        stopbandAttenuationDb: c.stopbandAttenuationDb,
      });
      const label = `${c.family} ${c.response} ${JSON.stringify(c.passbandW)}/${JSON.stringify(c.stopbandW)}`;
      expect(r.order, label).toBe(c.order);
      // Bandstop: scipy finds the passband edges with fminbound (xtol 1e-5), we in closed form;
      // measured difference about 6e-8 relative. Everything else agrees to ~1e-15.
      const rel = c.response === "bandstop" ? 1e-6 : 1e-12;
      expectArrayClose(list(r.naturalW), list(c.naturalW), { rel, label });
      expect(r.beyondRange).toBe(c.order > r.maxOrder);
    }
  });

  const families: FamilyName[] = ["butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel", "legendre"];
  const responses: OrderResponse[] = ["lowpass", "highpass", "bandpass", "bandstop"];

  it("gives, for every family and response, a design that meets the mask exactly at the passband edge(s) and at least the attenuation at the stopband edge(s)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...families),
        fc.constantFrom(...responses),
        fc.double({ min: 100, max: 1e5, noNaN: true }),
        fc.double({ min: 1.3, max: 4, noNaN: true }),
        fc.double({ min: 0.1, max: 3, noNaN: true }),
        fc.double({ min: 15, max: 60, noNaN: true }),
        fc.constantFrom("phase", "delay", "magnitude" as const),
        (family, response, w, ratio, gp, gs, normalization) => {
          let spec: MinimumOrderSpec;
          const base = { family, passbandLossDb: gp, stopbandAttenuationDb: gs, ...(family === "bessel" ? { normalization } : {}) };
          if (response === "lowpass") spec = { ...base, response, passbandW: w, stopbandW: w * ratio };
          else if (response === "highpass") spec = { ...base, response, passbandW: w, stopbandW: w / ratio };
          else if (response === "bandpass") spec = { ...base, response, passbandW: [w, 1.5 * w], stopbandW: [w / ratio, 1.5 * w * ratio] };
          else spec = { ...base, response, passbandW: [w, 3 * w * ratio], stopbandW: [w * ratio, 2.5 * w * ratio] };
          let r;
          try {
            r = minimumOrder(spec);
          } catch (e) {
            // Only Bessel can be out of reach at every order (its response tends to a Gaussian).
            expect(e).toBeInstanceOf(UnrealisableError);
            expect(family).toBe("bessel");
            return;
          }
          fc.pre(!r.beyondRange);
          for (const p of list(r.passbandW)) expect(Math.abs(lossAt(spec, p) - gp)).toBeLessThan(1e-7);
          for (const s of list(spec.stopbandW)) expect(lossAt(spec, s)).toBeGreaterThanOrEqual(gs - 1e-7);
          if (response === "bandstop") {
            // the passband used is at least as wide as asked
            const used = list(r.passbandW);
            const asked = list(spec.passbandW);
            expect(used[0]).toBeGreaterThanOrEqual(asked[0] as number);
            expect(used[1]).toBeLessThanOrEqual(asked[1] as number);
          }
        },
      ),
      { numRuns: 120 },
    );
  });

  it("never over-orders Bessel and Legendre: order - 1 misses the attenuation", () => {
    for (const family of ["bessel", "legendre"] as const) {
      for (const ratio of [4, 5, 8, 12]) {
        const spec: MinimumOrderSpec = { family, response: "lowpass", passbandW: 1, stopbandW: ratio, passbandLossDb: 3, stopbandAttenuationDb: 30 };
        const r = minimumOrder(spec);
        if (r.order <= 1 || r.beyondRange) continue;
        const lower = prototype({ ...r.prototype, order: r.order - 1 });
        // scale the lower order to its own 3 dB-loss point and check the stopband
        let lo = 0;
        let hi = 10;
        for (let i = 0; i < 200; i++) {
          const mid = (lo + hi) / 2;
          if (-magnitudeDb(lower, mid) < 3) lo = mid;
          else hi = mid;
        }
        expect(-magnitudeDb(lower, lo * ratio)).toBeLessThan(30);
      }
    }
  });

  it("accepts a one-element array for a single edge and returns frozen results", () => {
    const a = minimumOrder({ family: "chebyshev2", response: "highpass", passbandW: [500], stopbandW: [200], passbandLossDb: 1, stopbandAttenuationDb: 40 });
    const b = minimumOrder({ family: "chebyshev2", response: "highpass", passbandW: 500, stopbandW: 200, passbandLossDb: 1, stopbandAttenuationDb: 40 });
    expect(a).toEqual(b);
    expect(Object.isFrozen(a)).toBe(true);
    expect(a.prototype).toEqual({ family: "chebyshev2", order: b.order, attenuationDb: 40 });
  });

  it("returns orders past the family range flagged beyondRange", () => {
    const r = minimumOrder({ family: "elliptic", response: "lowpass", passbandW: 1, stopbandW: 1.0001, passbandLossDb: 0.01, stopbandAttenuationDb: 120 });
    expect(r.order).toBeGreaterThan(24);
    expect(r.beyondRange).toBe(true);
    expect(r.maxOrder).toBe(24);
    const b = minimumOrder({ family: "bessel", response: "lowpass", passbandW: 1, stopbandW: 10, passbandLossDb: 3, stopbandAttenuationDb: 300 });
    expect(b.order).toBeGreaterThan(30);
    expect(b.beyondRange).toBe(true);
    // A transition a Bessel filter cannot reach at any order is an UnrealisableError naming the attenuation.
    expect(() =>
      minimumOrder({ family: "bessel", response: "lowpass", passbandW: 1, stopbandW: 3, passbandLossDb: 1, stopbandAttenuationDb: 30 }),
    ).toThrow(UnrealisableError);
  });

  it("rejects contradictory specs with a SpecError naming each field", () => {
    const ok: MinimumOrderSpec = { family: "butterworth", response: "lowpass", passbandW: 10, stopbandW: 20, passbandLossDb: 1, stopbandAttenuationDb: 40 };
    const paths = (s: unknown): string[] => {
      try {
        minimumOrder(s as MinimumOrderSpec);
      } catch (e) {
        expect(e).toBeInstanceOf(SpecError);
        return (e as SpecError).issues.map((i) => i.path);
      }
      return [];
    };
    expect(paths({ ...ok, stopbandW: 5 })).toEqual(["stopbandW"]);
    expect(paths({ ...ok, response: "highpass" })).toEqual(["stopbandW"]);
    expect(paths({ ...ok, stopbandAttenuationDb: 1 })).toEqual(["stopbandAttenuationDb"]);
    expect(paths({ ...ok, passbandLossDb: -1, passbandW: 0 })).toEqual(["passbandW", "passbandLossDb"]);
    expect(paths({ ...ok, family: "gaussian" })).toEqual(["family"]);
    expect(paths({ ...ok, response: "bandpass" })).toEqual(["passbandW", "stopbandW"]);
    expect(paths({ ...ok, response: "bandpass", passbandW: [10, 20], stopbandW: [12, 30] })).toEqual(["stopbandW"]);
    expect(paths({ ...ok, response: "bandstop", passbandW: [10, 20], stopbandW: [5, 30] })).toEqual(["stopbandW"]);
    expect(paths({ ...ok, response: "bandstop", passbandW: [20, 10], stopbandW: [12, 15] })).toEqual(["passbandW"]);
    expect(paths({ ...ok, family: "bessel", normalization: "fast" })).toEqual(["normalization"]);
  });
});

describe("besselOrderForDelay", () => {
  function poleDelay(n: number, w: number): number {
    let t = 0;
    for (const p of bessel(n, { normalization: "delay" }).poles) t += -p.re / (p.re * p.re + (w - p.im) ** 2);
    return t;
  }

  it("returns the smallest order whose delay stays within the limit (checked with the pole-based delay)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.1, max: 10, noNaN: true }), fc.double({ min: 0.05, max: 6, noNaN: true }), (pct, w) => {
        const r = besselOrderForDelay({ maxDelayErrorPercent: pct, upToW: w });
        fc.pre(!r.beyondRange);
        expect(Math.abs(1 - poleDelay(r.order, w)) * 100).toBeLessThanOrEqual(pct + 1e-9);
        expect(Math.abs(r.delayErrorPercent - Math.abs(1 - poleDelay(r.order, w)) * 100)).toBeLessThan(1e-9);
        if (r.order > 1) expect(Math.abs(1 - poleDelay(r.order - 1, w)) * 100).toBeGreaterThan(pct);
      }),
      { numRuns: 60 },
    );
  });

  it("scales the band edge by the real delay", () => {
    const a = besselOrderForDelay({ maxDelayErrorPercent: 1, upToW: 2 });
    const b = besselOrderForDelay({ maxDelayErrorPercent: 1, upToW: 2e4, delaySeconds: 1e-4 });
    expect(b.order).toBe(a.order);
  });

  it("rejects non-positive numbers and errors of 100 % or more", () => {
    expect(() => besselOrderForDelay({ maxDelayErrorPercent: 0, upToW: 1 })).toThrow(InvalidArgumentError);
    expect(() => besselOrderForDelay({ maxDelayErrorPercent: 100, upToW: 1 })).toThrow(/maxDelayErrorPercent/);
    expect(() => besselOrderForDelay({ maxDelayErrorPercent: 1, upToW: -1 })).toThrow(/upToW/);
    expect(() => besselOrderForDelay({ maxDelayErrorPercent: 1, upToW: 1, delaySeconds: 0 })).toThrow(/delaySeconds/);
  });
});

describe("minimumOrder ranges", () => {
  const FAMILIES: FamilyName[] = ["butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel", "legendre"];
  const edgesFor = (response: OrderResponse, scale: number): Pick<MinimumOrderSpec, "passbandW" | "stopbandW"> =>
    response === "lowpass"
      ? { passbandW: scale, stopbandW: 3 * scale }
      : response === "highpass"
        ? { passbandW: 3 * scale, stopbandW: scale }
        : response === "bandpass"
          ? { passbandW: [2 * scale, 3 * scale], stopbandW: [scale, 6 * scale] }
          : { passbandW: [scale, 6 * scale], stopbandW: [2 * scale, 3 * scale] };

  it("refuses stopbandAttenuationDb = 1e300 for every family and response (it returned order Infinity)", () => {
    for (const family of FAMILIES) {
      for (const response of ["lowpass", "highpass", "bandpass", "bandstop"] as const) {
        const e = thrownBy(() => minimumOrder({ family, response, ...edgesFor(response, 1000), passbandLossDb: 1, stopbandAttenuationDb: 1e300 }), SpecError);
        expect(e.issues.map((i) => i.path)).toEqual(["stopbandAttenuationDb"]);
        expect(e.issues[0]?.message).toContain("at most 400 dB");
      }
    }
  });

  it("refuses band edges near 1e308 rad/s (they gave NaN orders and frequencies), naming the edge and the range", () => {
    for (const response of ["lowpass", "highpass", "bandpass", "bandstop"] as const) {
      const e = thrownBy(() => minimumOrder({ family: "elliptic", response, ...edgesFor(response, 1e307), passbandLossDb: 1, stopbandAttenuationDb: 40 }), SpecError);
      expect(e.issues.length).toBeGreaterThan(0);
      for (const i of e.issues) expect(i.message).toContain("from 1e-9 to 1000000000000000 rad/s");
    }
  });

  it("refuses edges closer than a relative 1e-9 and a loss below 1e-9 dB", () => {
    expect(thrownBy(() => minimumOrder({ family: "butterworth", response: "lowpass", passbandW: 1, stopbandW: 1 + 1e-12, passbandLossDb: 1, stopbandAttenuationDb: 40 }), SpecError).issues[0]?.path).toBe("stopbandW");
    expect(thrownBy(() => minimumOrder({ family: "butterworth", response: "lowpass", passbandW: 1, stopbandW: 2, passbandLossDb: 1e-300, stopbandAttenuationDb: 40 }), SpecError).issues[0]?.path).toBe("passbandLossDb");
  });

  it("returns only finite numbers or throws a typed error, over the whole accepted range (property)", () => {
    const w = fc.oneof(fc.double({ min: -9, max: 15, noNaN: true }).map((x) => 10 ** x), fc.constantFrom(1e-9, 1e15));
    fc.assert(
      fc.property(
        fc.constantFrom(...FAMILIES),
        fc.constantFrom<OrderResponse>("lowpass", "highpass", "bandpass", "bandstop"),
        fc.array(w, { minLength: 4, maxLength: 4 }),
        fc.oneof(fc.double({ min: 1e-9, max: 60, noNaN: true }), fc.constantFrom(1e-9, 60)),
        fc.oneof(fc.double({ min: 1e-9, max: 400, noNaN: true }), fc.constantFrom(400)),
        (family, response, ws, loss, att) => {
          const [a, b, c, d] = [...ws].sort((x, y) => x - y) as [number, number, number, number];
          const edges =
            response === "lowpass" ? { passbandW: a, stopbandW: d } : response === "highpass" ? { passbandW: d, stopbandW: a }
            : response === "bandpass" ? { passbandW: [b, c], stopbandW: [a, d] } : { passbandW: [a, d], stopbandW: [b, c] };
          try {
            const r = minimumOrder({ family, response, ...edges, passbandLossDb: loss, stopbandAttenuationDb: att });
            expect(firstNonFinite(r)).toBeNull();
            expect(r.order).toBeGreaterThanOrEqual(1);
          } catch (e) {
            expect(e instanceof SpecError || e instanceof UnrealisableError).toBe(true);
          }
        },
      ),
      { numRuns: 400, seed: 1202 },
    );
  });
});
