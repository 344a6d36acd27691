import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { InvalidArgumentError } from "../../src/errors.ts";
import { cabs, cadd, cdiv, cmul, complex } from "../../src/math/complex.ts";
import type { Complex } from "../../src/math/complex.ts";
import type { Element } from "../../src/circuit/types.ts";
import { scaleElements, scaleValue, scalingFor } from "../../src/scaling/index.ts";
import type { ScalableElement } from "../../src/scaling/index.ts";
import { expectClose } from "../helpers/tolerance.ts";

// --- A small ladder evaluator local to this test (ABCD chain matrices) -------
// Each rung is a series impedance or a shunt admittance; the last element is
// the load resistor. H = V_load / V_source = 1 / (A + B / R_load).
type Rung = { readonly el: string; readonly shunt: boolean };

interface Abcd {
  a: Complex;
  b: Complex;
  c: Complex;
  d: Complex;
}

function impedance(el: ScalableElement, s: Complex): Complex {
  const v = el.value as number;
  if (el.kind === "R") return complex(v);
  if (el.kind === "L") return cmul(s, complex(v));
  return cdiv(complex(1), cmul(s, complex(v)));
}

function mul(x: Abcd, y: Abcd): Abcd {
  return {
    a: cadd(cmul(x.a, y.a), cmul(x.b, y.c)),
    b: cadd(cmul(x.a, y.b), cmul(x.b, y.d)),
    c: cadd(cmul(x.c, y.a), cmul(x.d, y.c)),
    d: cadd(cmul(x.c, y.b), cmul(x.d, y.d)),
  };
}

function ladderResponse(elements: readonly ScalableElement[], rungs: readonly Rung[], load: string, w: number): Complex {
  const s = complex(0, w);
  const byName = new Map(elements.map((e) => [e.name, e]));
  let m: Abcd = { a: complex(1), b: complex(0), c: complex(0), d: complex(1) };
  for (const r of rungs) {
    const z = impedance(byName.get(r.el) as ScalableElement, s);
    const step: Abcd = r.shunt
      ? { a: complex(1), b: complex(0), c: cdiv(complex(1), z), d: complex(1) }
      : { a: complex(1), b: z, c: complex(0), d: complex(1) };
    m = mul(m, step);
  }
  const rl = (byName.get(load) as ScalableElement).value as number;
  return cdiv(complex(1), cadd(m.a, cdiv(m.b, complex(rl))));
}

// Normalised doubly terminated 3rd-order Butterworth LC ladder: g = 1, 2, 1
// (g_k = 2 sin((2k - 1) pi / 2n); G. Matthaei, L. Young, E. M. T. Jones,
// "Microwave Filters, Impedance-Matching Networks, and Coupling Structures",
// McGraw-Hill, 1964, eq. (4.05-2)). |H(jw)| = 0.5 / sqrt(1 + w^6).
const g = (k: number, n: number): number => 2 * Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
const butterworth3: ScalableElement[] = [
  { name: "Rs", kind: "R", value: 1 },
  { name: "C1", kind: "C", value: g(1, 3) },
  { name: "L2", kind: "L", value: g(2, 3) },
  { name: "C3", kind: "C", value: g(3, 3) },
  { name: "RL", kind: "R", value: 1 },
  { name: "U1", kind: "OA" }, // not part of the ladder; must pass through untouched
];
const ladderRungs: Rung[] = [
  { el: "Rs", shunt: false },
  { el: "C1", shunt: true },
  { el: "L2", shunt: false },
  { el: "C3", shunt: true },
];

// An RC ladder (three sections) with unequal values.
const rc3: ScalableElement[] = [
  { name: "R1", kind: "R", value: 1 },
  { name: "C1", kind: "C", value: 0.5 },
  { name: "R2", kind: "R", value: 2.2 },
  { name: "C2", kind: "C", value: 0.15 },
  { name: "R3", kind: "R", value: 4.7 },
  { name: "C3", kind: "C", value: 0.033 },
  { name: "RL", kind: "R", value: 1e3 },
];
const rcRungs: Rung[] = [
  { el: "R1", shunt: false },
  { el: "C1", shunt: true },
  { el: "R2", shunt: false },
  { el: "C2", shunt: true },
  { el: "R3", shunt: false },
  { el: "C3", shunt: true },
];

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
