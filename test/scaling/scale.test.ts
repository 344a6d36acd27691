import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { InvalidArgumentError } from "../../src/errors.ts";
import { cabs } from "../../src/math/complex.ts";
import type { Element } from "../../src/circuit/types.ts";
import { scaleElements, scaleValue } from "../../src/scaling/index.ts";
import { butterworth3, ladderResponse, ladderRungs, rc3, rcRungs } from "./ladder.ts";
import type { ScalableElement } from "../../src/scaling/index.ts";
import { expectClose } from "../helpers/tolerance.ts";

const logUniform = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true }).map((e) => 10 ** e);

describe("scaleValue", () => {
  it("applies R' = Km R, L' = Km L / Kf, C' = C / (Km Kf)", () => {
    expect(scaleValue("R", 1, { km: 1000 })).toBe(1000);
    expect(scaleValue("R", 2, { km: 50, kf: 1e4 })).toBe(100);
    expect(scaleValue("L", 2, { km: 50, kf: 1e4 })).toBe(0.01);
    expect(scaleValue("C", 1, { km: 1e3, kf: 1e4 })).toBe(1e-7);
    expect(scaleValue("C", 3, {})).toBe(3);
    expect(scaleValue("C", 1, { kf: 2 })).toBe(0.5);
    expect(scaleValue("L", 1, { kf: 2 })).toBe(0.5);
    expect(scaleValue("R", 1, { kf: 2 })).toBe(1);
  });

  it("rejects bad input", () => {
    expect(() => scaleValue("Q" as "R", 1, {})).toThrow(/scaleValue: kind/);
    expect(() => scaleValue("R", 0, {})).toThrow(/scaleValue: value/);
    expect(() => scaleValue("R", 1, { km: -1 })).toThrow(/options.km/);
    expect(() => scaleValue("R", 1, { kf: NaN })).toThrow(/options.kf/);
    expect(() => scaleValue("R", 1e300, { km: 1e10 })).toThrow(/positive finite/);
    expect(() => scaleValue("C", 1e-300, { km: 1e10, kf: 1e20 })).toThrow(InvalidArgumentError);
  });
});

describe("scaleElements", () => {
  it("scales R, C and L only, and does not modify the input", () => {
    const before = JSON.stringify(butterworth3);
    const out = scaleElements(butterworth3, { km: 1e4, kf: 1e3 });
    expect(JSON.stringify(butterworth3)).toBe(before);
    expect(out.map((e) => e.value)).toEqual([1e4, 1e-7, 20, 1e-7, 1e4, undefined]);
    expect(out[5]).toBe(butterworth3[5]);
    expect(out[0]).not.toBe(butterworth3[0]);
  });

  it("accepts the circuit model's element types and keeps their fields", () => {
    const els: Element[] = [
      { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
      { kind: "R", name: "R1", a: "in", b: "x", value: 1 },
      { kind: "C", name: "C1", a: "x", b: "0", value: 1 },
      { kind: "OA", name: "U1", inP: "x", inN: "out", out: "out", model: { kind: "ideal" } },
      { kind: "E", name: "E1", a: "y", b: "0", cp: "x", cn: "0", gain: 2 },
    ];
    const out: Element[] = scaleElements(els, { km: 10, kf: 100 });
    expect(out[1]).toEqual({ kind: "R", name: "R1", a: "in", b: "x", value: 10 });
    expect(out[2]).toEqual({ kind: "C", name: "C1", a: "x", b: "0", value: 1e-3 });
    expect(out[0]).toBe(els[0]);
    expect(out[3]).toBe(els[3]);
    expect(out[4]).toBe(els[4]);
  });

  it("names the element whose value is missing or bad", () => {
    expect(() => scaleElements([{ name: "R9", kind: "R" }], {})).toThrow(/elements\[0\]\.value/);
    expect(() => scaleElements([{ name: "U1", kind: "OA" }, { name: "C1", kind: "C", value: -1 }], {})).toThrow(
      /elements\[1\]\.value/,
    );
    expect(() => scaleElements("R1" as unknown as ScalableElement[], {})).toThrow(/elements/);
  });

  it("the unscaled Butterworth ladder matches 0.5 / sqrt(1 + w^6)", () => {
    for (const w of [0.01, 0.3, 1, 1.7, 10]) {
      expectClose(cabs(ladderResponse(butterworth3, ladderRungs, "RL", w)), 0.5 / Math.sqrt(1 + w ** 6), { rel: 1e-13 });
    }
  });

  it("leaves the response shape unchanged: H_scaled(j Kf w) = H(j w) (fast-check)", () => {
    fc.assert(
      fc.property(logUniform(-3, 6), logUniform(-2, 7), logUniform(-3, 3), (km, kf, w) => {
        for (const [els, rungs, load] of [
          [butterworth3, ladderRungs, "RL"],
          [rc3, rcRungs, "RL"],
        ] as const) {
          const h = ladderResponse(els, rungs, load, w);
          const hs = ladderResponse(scaleElements(els, { km, kf }), rungs, load, kf * w);
          const err = cabs({ re: hs.re - h.re, im: hs.im - h.im }) / cabs(h);
          expect(err).toBeLessThan(1e-12);
        }
      }),
      { numRuns: 500 },
    );
  });
});

