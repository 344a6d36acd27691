// The seeded, bounded fuzz run: low-level calls with random (often invalid)
// arguments, and random designs carried through every export. Nothing may
// escape but the library's own typed errors; no non-finite number may leave
// a public function; every BOM value is in its series; toJson/fromJson round
// trips are equal; a sample of the designs' netlists runs in ngspice.
// This file holds the low-level calls; the random designs are in
// fuzz/designs-*.fuzz.test.ts (fuzz/designs.ts), split in two files so the
// two cores share them. Counts are printed at the end (and quoted in the
// issue notes). Run by .ci/run (`npx vitest run --config vitest.fuzz.config.ts`).
import { afterAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { FilterwrightError } from "../src/errors.ts";
import { validateSpec } from "../src/design/spec.ts";
import { minimumOrder, prototype, FAMILY_NAMES } from "../src/approx/index.ts";
import { eSeries, isInSeries, snapToSeries, SERIES_NAMES } from "../src/parts/index.ts";
import { formatValue, parseValue } from "../src/units/index.ts";
import { frequencyResponse, toSections } from "../src/tf/index.ts";
import { topologies } from "../src/topologies/registry.ts";
import { anyNumber, anyValue, makeGuard } from "./guard.ts";

const SEED = 20261202;
const counts = { lowLevel: 0, typedErrors: 0 };

const guarded = makeGuard(counts);

describe("fuzz: low-level calls", () => {
  const runs = 1500;
  afterAll(() => console.log(`fuzz: ${counts.lowLevel} low-level calls (${counts.typedErrors} typed errors)`));
  it("parseValue and formatValue", () => {
    fc.assert(
      fc.property(fc.oneof(fc.string(), fc.constantFrom("4k7", "2.2µ", "1e400", "0x10", "1..2", "-3k", "10 MHz", "R47")), anyNumber, (s, x) => {
        guarded(`parseValue(${JSON.stringify(s)})`, () => parseValue(s));
        guarded(`formatValue(${x})`, () => formatValue(x));
      }),
      { numRuns: runs, seed: SEED },
    );
  });

  it("snapToSeries and eSeries", () => {
    fc.assert(
      fc.property(anyNumber, fc.oneof(fc.constantFrom(...SERIES_NAMES), fc.string()), fc.constantFrom("nearest", "up", "down", "sideways"), (x, series, mode) => {
        guarded(`snapToSeries(${x}, ${series}, ${mode})`, () => snapToSeries(x, { series: series as never, mode: mode as never }));
        guarded(`eSeries(${series})`, () => eSeries(series as never));
      }),
      { numRuns: runs, seed: SEED + 1 },
    );
  });

  it("minimumOrder and prototype", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...FAMILY_NAMES),
        fc.constantFrom("lowpass", "highpass", "bandpass", "bandstop"),
        anyNumber,
        anyNumber,
        anyNumber,
        anyNumber,
        fc.integer({ min: -2, max: 40 }),
        (family, response, w1, w2, loss, att, order) => {
          const band = response === "bandpass" || response === "bandstop";
          const pass = band ? [Math.abs(w1), Math.abs(w1) * 2] : Math.abs(w1);
          const stop = band ? [Math.abs(w2), Math.abs(w2) * 3] : Math.abs(w2);
          guarded(`minimumOrder(${family}, ${response}, ${w1}, ${w2}, ${loss}, ${att})`, () =>
            minimumOrder({ family, response, passbandW: pass, stopbandW: stop, passbandLossDb: loss, stopbandAttenuationDb: att } as never),
          );
          guarded(`prototype(${family}, ${order}, ${loss}, ${att})`, () => prototype({ family, order, rippleDb: loss, attenuationDb: att } as never));
        },
      ),
      { numRuns: runs, seed: SEED + 2 },
    );
  });

  it("toSections and frequencyResponse", () => {
    const root = fc.record({ re: anyNumber, im: anyNumber });
    fc.assert(
      fc.property(fc.array(root, { maxLength: 4 }), fc.array(root, { minLength: 1, maxLength: 5 }), anyNumber, fc.array(anyNumber, { minLength: 1, maxLength: 4 }), (zeros, poles, gain, w) => {
        const conj = (xs: { re: number; im: number }[]): { re: number; im: number }[] => xs.flatMap((p) => (p.im === 0 ? [p] : [p, { re: p.re, im: -p.im }]));
        const z = { zeros: conj(zeros), poles: conj(poles), gain };
        guarded("toSections", () => toSections(z as never));
        guarded("frequencyResponse", () => frequencyResponse(z as never, Float64Array.from(w)));
      }),
      { numRuns: runs, seed: SEED + 3 },
    );
  });

  it("validateSpec on random objects", () => {
    fc.assert(
      fc.property(fc.record({ response: anyValue, passband: fc.oneof(anyValue, fc.record({ edgeHz: anyValue, maxLossDb: anyValue })), stopband: fc.oneof(anyValue, fc.record({ edgeHz: anyValue, minAttenuationDb: anyValue })), opamp: anyValue, parts: anyValue, gain: anyValue, order: anyValue }, { requiredKeys: [] }), (s) => {
        guarded("validateSpec", () => validateSpec(s));
      }),
      { numRuns: runs, seed: SEED + 4 },
    );
  });

  it("every topology's check and design with random targets", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...topologies),
        fc.record({ f0Hz: anyNumber, q: anyNumber, gain: anyNumber, fzHz: anyNumber }),
        fc.record({ capacitor: fc.option(anyNumber, { nil: undefined }), resistor: fc.option(anyNumber, { nil: undefined }), capacitorRatio: fc.option(anyNumber, { nil: undefined }) }, { requiredKeys: [] }),
        (t, x, c) => {
          const target = { order: t.order, kind: t.kinds[0], ...x };
          const choices = Object.fromEntries(Object.entries(c).filter(([, v]) => v !== undefined));
          guarded(`${t.id}.check`, () => t.check(target as never, choices));
          guarded(`${t.id}.design`, () => {
            const v = t.design(target as never, choices);
            for (const [k, value] of Object.entries(v)) if (!(value > 0)) throw new Error(`${k} = ${value}`);
            return v;
          });
        },
      ),
      { numRuns: 2 * runs, seed: SEED + 5 },
    );
  });
});
