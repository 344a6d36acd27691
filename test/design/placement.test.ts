import { describe, expect, it } from "vitest";
import { prototype } from "../../src/approx/index.ts";
import type { Zpk } from "../../src/tf/types.ts";
import { TWO_PI } from "../../src/units/constants.ts";
import { validateSpec, type DesignSpec, type FilterSpec } from "../../src/design/spec.ts";
import {
  intervalWidth,
  placeInInterval,
  prototypeEdges,
  prototypeInterval,
  transformPrototype,
  upHelpsPassband,
  zpkMagnitude,
} from "../../src/design/placement.ts";

/** Loss in dB below the prototype's peak at each frequency (Hz) of the design placed at `value`. */
function lossDb(spec: DesignSpec, proto: Zpk, value: number, freqHz: readonly number[]): number[] {
  const iv = prototypeInterval(spec, proto);
  const zpk = transformPrototype(spec, proto, iv, value);
  const peak = prototypeEdges(proto, spec.maxLossDb, spec.minAttenuationDb).peak;
  return Array.from(zpkMagnitude(zpk, Float64Array.from(freqHz.map((f) => TWO_PI * f)))).map((m) => 20 * Math.log10(peak / m));
}

const cases: { name: string; input: FilterSpec; proto: Zpk }[] = [
  {
    name: "Butterworth lowpass",
    input: { response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 1 }, stopband: { edgeHz: 3000, minAttenuationDb: 40 } },
    proto: prototype({ family: "butterworth", order: 5 }),
  },
  {
    name: "Chebyshev II highpass",
    input: { response: "highpass", passband: { edgeHz: 2000, maxLossDb: 0.5 }, stopband: { edgeHz: 800, minAttenuationDb: 45 } },
    proto: prototype({ family: "chebyshev2", order: 5, attenuationDb: 45 }),
  },
  {
    name: "Butterworth bandpass",
    input: { response: "bandpass", passband: { edgeHz: [1000, 2000], maxLossDb: 1 }, stopband: { edgeHz: [300, 7000], minAttenuationDb: 40 } },
    proto: prototype({ family: "butterworth", order: 4 }),
  },
  {
    name: "Butterworth bandstop",
    input: { response: "bandstop", passband: { edgeHz: [500, 5000], maxLossDb: 1 }, stopband: { edgeHz: [1200, 2000], minAttenuationDb: 30 } },
    proto: prototype({ family: "butterworth", order: 4 }),
  },
];

describe("prototypeInterval", () => {
  for (const c of cases) {
    it(`${c.name}: at one end the exact design just meets the passband loss, at the other the stopband attenuation`, () => {
      const spec = validateSpec(c.input);
      const iv = prototypeInterval(spec, c.proto);
      expect(intervalWidth(iv)).toBeGreaterThan(0);
      const passEnd = upHelpsPassband(spec) ? iv.low : iv.high;
      const stopEnd = upHelpsPassband(spec) ? iv.high : iv.low;
      // Worst passband edge at the passband end, worst stopband edge at the stopband end.
      expect(Math.max(...lossDb(spec, c.proto, passEnd, spec.passbandHz))).toBeCloseTo(spec.maxLossDb, 4);
      expect(Math.min(...lossDb(spec, c.proto, stopEnd, spec.stopbandHz))).toBeCloseTo(spec.minAttenuationDb, 4);
      // Inside the interval both bands are met with room to spare.
      const middle = placeInInterval(iv, 0.5);
      expect(Math.max(...lossDb(spec, c.proto, middle, spec.passbandHz))).toBeLessThan(spec.maxLossDb);
      expect(Math.min(...lossDb(spec, c.proto, middle, spec.stopbandHz))).toBeGreaterThan(spec.minAttenuationDb);
      expect(iv.parameter).toBe(spec.response === "lowpass" || spec.response === "highpass" ? "natural-frequency" : "bandwidth");
    });
  }

  it("is empty (high below low) for an order too low to meet the mask", () => {
    const spec = validateSpec(cases[0]!.input);
    expect(intervalWidth(prototypeInterval(spec, prototype({ family: "butterworth", order: 3 })))).toBeLessThan(0);
  });

  it("puts the bandpass centre where the interval is widest, no narrower than at the passband's geometric centre", () => {
    const spec = validateSpec({ response: "bandpass", passband: { edgeHz: [1000, 2000], maxLossDb: 1 }, stopband: { edgeHz: [600, 9000], minAttenuationDb: 40 } });
    const iv = prototypeInterval(spec, prototype({ family: "butterworth", order: 5 }));
    expect(iv.centre).toBeGreaterThan(TWO_PI * 1000);
    expect(iv.centre).toBeLessThan(TWO_PI * 2000);
    const w0 = TWO_PI * Math.sqrt(2e6);
    const edges = prototypeEdges(prototype({ family: "butterworth", order: 5 }), 1, 40);
    const d = (x: number): number => Math.abs(x * x - w0 * w0) / x;
    const geometricLow = Math.max(...[1000, 2000].map((f) => d(TWO_PI * f) / edges.passW));
    const geometricHigh = Math.min(...[600, 9000].map((f) => d(TWO_PI * f) / edges.stopW));
    expect(intervalWidth(iv)).toBeGreaterThanOrEqual(Math.log(geometricHigh / geometricLow) - 1e-12);
  });
});

describe("placeInInterval", () => {
  it("places on a log scale: 0 the low end, 1 the high end, 0.5 the geometric middle", () => {
    const iv = { parameter: "natural-frequency", low: 100, high: 400 } as const;
    expect(placeInInterval(iv, 0)).toBe(100);
    expect(placeInInterval(iv, 1)).toBeCloseTo(400, 12);
    expect(placeInInterval(iv, 0.5)).toBeCloseTo(200, 12);
  });
});

describe("prototypeEdges", () => {
  it("finds the Butterworth edges in closed form: W_p* = (10^(Ap/10) - 1)^(1/2n), W_s* likewise", () => {
    const n = 5;
    const e = prototypeEdges(prototype({ family: "butterworth", order: n }), 1, 40);
    // The edges are where the loss passes its limit by the 1e-5 dB comparison slack: about 1e-6 relative.
    expect(e.passW).toBeCloseTo((10 ** 0.1 - 1) ** (1 / (2 * n)), 5);
    expect(e.stopW).toBeCloseTo((10 ** 4 - 1) ** (1 / (2 * n)), 5);
    expect(e.peak).toBeCloseTo(1, 12);
  });
});
