import { describe, expect, it } from "vitest";
import { cabs } from "../../src/math/complex.ts";
import { scaleElements, scaleValue, scalingFor } from "../../src/scaling/index.ts";
import type { ScalableElement } from "../../src/scaling/index.ts";
import { expectClose } from "../helpers/tolerance.ts";
import { butterworth3, g, ladderResponse, ladderRungs } from "./ladder.ts";

describe("scalingFor", () => {
  it("solves Kf from the target and Km from a fixed capacitor", () => {
    const s = scalingFor({ targetHz: 25e3, capacitor: { normalised: 1, actual: 4.7e-9 } });
    expectClose(s.kf, 2 * Math.PI * 25e3, { rel: 1e-15 });
    expectClose(s.km, 1 / (2 * Math.PI * 25e3 * 4.7e-9), { rel: 1e-15 });
    // The fixed capacitor lands exactly where asked.
    expectClose(scaleValue("C", 1, s), 4.7e-9, { rel: 2e-16 });
  });

  it("solves Km from a fixed resistor or an impedance level", () => {
    expect(scalingFor({ targetW: 1000, resistor: { normalised: 2, actual: 20e3 } })).toEqual({ km: 10e3, kf: 1000 });
    expect(scalingFor({ targetW: 1000, impedance: 10e3 })).toEqual({ km: 10e3, kf: 1000 });
    expect(scalingFor({ targetW: 500, normalisedW: 2 })).toEqual({ km: 1, kf: 250 });
  });

  it("moves a hydrophone anti-alias prototype to 25 kHz with 4.7 nF capacitors", () => {
    // Scale the normalised ladder so that C1 = 4.7 nF and the -3 dB point is 25 kHz.
    const s = scalingFor({ targetHz: 25e3, capacitor: { normalised: g(1, 3), actual: 4.7e-9 } });
    const built = scaleElements(butterworth3, s);
    const c1 = built.find((e) => e.name === "C1") as ScalableElement;
    expectClose(c1.value as number, 4.7e-9, { rel: 1e-15 });
    const w3 = 2 * Math.PI * 25e3;
    expectClose(cabs(ladderResponse(built, ladderRungs, "RL", w3)), 0.5 / Math.SQRT2, { rel: 1e-13 });
  });

  it("rejects missing, duplicated and bad targets", () => {
    expect(() => scalingFor({})).toThrow(/exactly one of targetHz/);
    expect(() => scalingFor({ targetHz: 1, targetW: 1 })).toThrow(/exactly one/);
    expect(() => scalingFor({ targetHz: -1 })).toThrow(/scalingFor: targetHz/);
    expect(() => scalingFor({ targetW: 1, impedance: 1, resistor: { normalised: 1, actual: 1 } })).toThrow(
      /at most one of capacitor, resistor and impedance/,
    );
    expect(() => scalingFor({ targetW: 1, capacitor: { normalised: 1, actual: 0 } })).toThrow(/capacitor.actual/);
    expect(() => scalingFor({ targetW: 1e300, capacitor: { normalised: 1e-300, actual: 1e300 } })).toThrow(
      /scaling constants come out/,
    );
  });
});
