import { describe, expect, it } from "vitest";
import { chebyshev2 } from "../../src/approx/chebyshev2.ts";
import { elliptic, ellipticStopbandEdge } from "../../src/approx/elliptic.ts";
import { ddFromRoots, matchedReflection } from "../../src/ladder/characteristic.ts";
import { typeB } from "../../src/ladder/type-b.ts";
import { magnitudeDb } from "../../src/tf/magnitude.ts";
import type { Zpk } from "../../src/tf/types.ts";

function grid(lo: number, hi: number, n: number): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => lo + ((hi - lo) * i) / (n - 1));
}

function transformed(h: Zpk, flat: boolean): Zpk {
  const t = typeB(h, flat);
  if (t === null) return expect.unreachable("no type b form");
  return t.zpk;
}

describe("typeB: even-order elliptic", () => {
  for (const order of [2, 4, 6, 8, 10, 12]) {
    for (const [rippleDb, attenuationDb] of [
      [0.1, 40],
      [0.5, 60],
      [1, 80],
    ] as const) {
      it(`order ${order}, ${rippleDb} dB / ${attenuationDb} dB: same ripple to 1 rad/s, full transmission at DC, two zeros at infinity, at least the attenuation beyond the new stopband edge`, () => {
        const h = elliptic(order, { rippleDb, attenuationDb });
        const t = typeB(h, false);
        if (t === null) return expect.unreachable("no type b form");
        const b = t.zpk;
        expect(b.poles).toHaveLength(order);
        expect(b.zeros).toHaveLength(order - 2);
        for (const p of b.poles) expect(p.re).toBeLessThan(0);
        for (const z of b.zeros) expect(z.re).toBe(0);
        const pass = magnitudeDb(b, grid(0, 1, 4001));
        expect(Math.abs(pass[0] as number)).toBeLessThan(1e-12); // full transmission at DC
        expect(Math.max(...pass)).toBeLessThan(1e-9);
        expect(Math.abs(Math.min(...pass) + rippleDb)).toBeLessThan(1e-9); // ripple kept, edge at 1 rad/s
        expect(Math.abs((pass[4000] as number) + rippleDb)).toBeLessThan(1e-9);
        // the new stopband edge: x_s with X(x_s) = X_s, from the transformation's constants
        const xs = ellipticStopbandEdge(order, { rippleDb, attenuationDb }) ** 2;
        const alpha = t.movedZeroSquared;
        const gamma = (alpha - 1) / (1 - t.movedReflectionSquared);
        const beta = t.movedReflectionSquared * gamma;
        const ws = Math.sqrt((beta - gamma * xs) / (xs - alpha));
        expect(ws).toBeGreaterThan(Math.sqrt(xs));
        const stop = magnitudeDb(b, Float64Array.from({ length: 2000 }, (_, i) => ws * 1.0000001 * 10 ** ((3 * i) / 1999)));
        expect(Math.max(...stop)).toBeLessThan(-attenuationDb + 1e-9);
        expect(Math.abs((magnitudeDb(b, Float64Array.of(ws))[0] as number) + attenuationDb)).toBeLessThan(1e-8);
        // relative degree 2: the response falls at 40 dB/decade far out
        const far = magnitudeDb(b, Float64Array.of(1e6, 1e7));
        expect(Math.abs((far[0] as number) - (far[1] as number) - 40)).toBeLessThan(1e-6);
      });
    }
  }
});

describe("typeB: even-order Chebyshev II", () => {
  for (const order of [2, 4, 6, 8, 10, 12]) {
    it(`order ${order}, 60 dB: flat at DC, the attenuation at 1 rad/s and beyond, two zeros at infinity`, () => {
      const h = chebyshev2(order, { attenuationDb: 60 });
      const b = transformed(h, true);
      expect(b.zeros).toHaveLength(order - 2);
      const dc = magnitudeDb(b, Float64Array.of(0, 1e-3))[0] as number;
      expect(Math.abs(dc)).toBeLessThan(1e-12);
      expect(Math.abs((magnitudeDb(b, Float64Array.of(1))[0] as number) + 60)).toBeLessThan(1e-8);
      const stop = magnitudeDb(b, Float64Array.from({ length: 3000 }, (_, i) => 1 * 10 ** ((3 * i) / 2999)));
      expect(Math.max(...stop)).toBeLessThan(-60 + 1e-8);
      // still maximally flat at DC: all n reflection zeros at s = 0
      const m = matchedReflection(b, ddFromRoots(b.poles, 1), ddFromRoots(b.zeros, b.gain));
      expect(m?.atDc).toBe(order);
    });
  }
});
