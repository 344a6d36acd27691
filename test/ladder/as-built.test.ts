import { describe, expect, it } from "vitest";
import { asBuiltLadder, DEFAULT_INDUCTOR_Q, scaleLadder, type AsBuiltLadder, type LadderPrototype } from "../../src/ladder/index.ts";
import { isInSeries, seriesValuesInRange } from "../../src/parts/index.ts";
import { expectClose } from "../helpers/tolerance.ts";
import { db, nodalResponse } from "./grid.ts";
import { butterworthG, butterworthLadder, chebyshevG, chebyshevLadder } from "./prototypes.ts";

/** The same ladder with every loss resistance removed (rounded values kept). */
function lossless(b: AsBuiltLadder): AsBuiltLadder {
  return { ...b, components: b.components.map((c) => ({ ...c, seriesOhms: 0 })) };
}

/** The same ladder with the exact (unrounded) values and the inductor loss 2 pi f L / Q of those values. */
function exactLossy(b: AsBuiltLadder, q: number, fHz: number): AsBuiltLadder {
  return {
    ...b,
    components: b.components.map((c) => ({ ...c, value: c.designValue, seriesOhms: c.kind === "L" ? (2 * Math.PI * fHz * c.designValue) / q : 0 })),
  };
}

/** Midband dissipation loss (dB) by Cohn's formula, 4.343 sum(g_k) / (w Q) (S. B. Cohn, Proc. IRE 47(8), 1959, from memory). */
function cohnDb(g: readonly number[], w: number, q: number): number {
  return (4.343 * g.reduce((a, x) => a + x, 0)) / (w * q);
}

const at = (b: AsBuiltLadder, fHz: number): number => db(nodalResponse(b, new Float64Array([fHz])))[0] as number;

describe("asBuiltLadder: preferred values and tolerances", () => {
  const scaled = scaleLadder(chebyshevLadder(5, 0.25, "shunt-first"), { response: "bandpass", centreHz: 455e3, bandwidthHz: 60e3, sourceOhms: 330 });

  it("snaps each value to its nearest member of the series and keeps the design value", () => {
    const b = asBuiltLadder(scaled, { inductorSeries: "E24", capacitorSeries: "E48" });
    expect(b.components.map((c) => c.designator)).toEqual(scaled.components.map((c) => c.designator));
    b.components.forEach((c, i) => {
      const exact = scaled.components[i]?.value as number;
      expect(c.designValue).toBe(exact);
      const series = c.kind === "L" ? "E24" : "E48";
      expect(c.series).toBe(series);
      expect(isInSeries(c.value, series)).toBe(true);
      const members = seriesValuesInRange(series, { min: exact / 1.2, max: exact * 1.2 });
      const nearest = Math.min(...members.map((m) => Math.abs(Math.log(m / exact))));
      expectClose(Math.abs(Math.log(c.value / exact)), nearest, { rel: 1e-12, label: c.designator });
      expect([c.a, c.b, c.arm]).toEqual([scaled.components[i]?.a, scaled.components[i]?.b, scaled.components[i]?.arm]);
    });
    expect(b.components.filter((c) => c.kind === "L").every((c) => c.tolerance === 0.05)).toBe(true);
    expect(b.components.filter((c) => c.kind === "C").every((c) => c.tolerance === 0.02)).toBe(true);
    expect(b.designTransfer).toBe(scaled.transfer);
    expect(b.placement).toEqual(scaled.placement);
  });

  it("defaults: E12 inductors and capacitors at 10 %, Q 50 at the centre, no capacitor ESR", () => {
    const b = asBuiltLadder(scaled);
    expect([b.inductorSeries, b.capacitorSeries]).toEqual(["E12", "E12"]);
    expect(b.losses).toEqual({ inductorQ: DEFAULT_INDUCTOR_Q, qFrequencyHz: 455e3, capacitorEsrOhms: 0 });
    for (const c of b.components) {
      expect(c.tolerance).toBe(0.1);
      if (c.kind === "L") expectClose(c.seriesOhms, (2 * Math.PI * 455e3 * c.value) / 50, { rel: 1e-15 });
      else expect(c.seriesOhms).toBe(0);
    }
  });

  it("takes tolerances, the Q, its frequency and a capacitor ESR as given", () => {
    const b = asBuiltLadder(scaled, { inductorTolerance: 0.02, capacitorTolerance: 0.01, inductorQ: 120, qFrequencyHz: 1e6, capacitorEsrOhms: 0.05 });
    for (const c of b.components) {
      if (c.kind === "L") {
        expect(c.tolerance).toBe(0.02);
        expectClose(c.seriesOhms, (2 * Math.PI * 1e6 * c.value) / 120, { rel: 1e-15 });
      } else {
        expect([c.tolerance, c.seriesOhms]).toEqual([0.01, 0.05]);
      }
    }
  });

  it("does not change the scaled ladder", () => {
    const before = JSON.stringify(scaled);
    asBuiltLadder(scaled, { inductorSeries: "E24" });
    expect(JSON.stringify(scaled)).toBe(before);
  });
});

describe("asBuiltLadder: losses in the nodal response", () => {
  it.each<[string, LadderPrototype]>([
    ["butterworth 5, series inductor first", butterworthLadder(5, "series-first")],
    ["chebyshev1 4, shunt capacitor first", chebyshevLadder(4, 0.5, "shunt-first")],
    ["chebyshev1 6, series inductor first", chebyshevLadder(6, 1, "series-first")],
  ])("a lowpass's DC gain is R_L / (R_S + R_L + the inductors' resistances), exactly: %s", (_name, prototype) => {
    const scaled = scaleLadder(prototype, { edgeHz: 30e3, sourceOhms: 600 });
    const b = asBuiltLadder(scaled, { inductorSeries: "E24", inductorQ: 25, qFrequencyHz: 30e3 });
    const r = b.components.filter((c) => c.kind === "L").reduce((a, c) => a + c.seriesOhms, 0);
    expect(r).toBeGreaterThan(0);
    const dc = nodalResponse(b, new Float64Array([0]));
    expectClose(dc.re[0] as number, b.loadOhms / (b.sourceOhms + b.loadOhms + r), { rel: 1e-12 });
    expectClose(dc.im[0] as number, 0, { abs: 1e-15 });
  });

  // Cohn's formula is first order in 1/Q: measured on these cases with exact
  // values, the nodal loss stays within 0.015 (loss in dB)^2 of it (largest
  // relative gap 2.2 %, the 0.5 dB Chebyshev ladder at 1.9 dB of loss).
  const cohnCases: [string, LadderPrototype, readonly number[]][] = [
    ["butterworth 3", butterworthLadder(3, "shunt-first"), butterworthG(3)],
    ["butterworth 5", butterworthLadder(5, "series-first"), butterworthG(5)],
    ["chebyshev1 3, 0.5 dB", chebyshevLadder(3, 0.5, "series-first"), chebyshevG(3, 0.5).g],
    ["chebyshev1 5, 0.1 dB", chebyshevLadder(5, 0.1, "shunt-first"), chebyshevG(5, 0.1).g],
  ];
  const bands: [number, number][] = [
    [0.02, 1000],
    [0.1, 100],
    [0.2, 200],
    [0.3, 50],
  ];

  describe.each(cohnCases)("bandpass %s", (_name, prototype, g) => {
    it.each(bands)("exact values: the loss at the centre is Cohn's 4.343 sum(g) / (w Q) to second order (w = %f, Q = %f)", (w, q) => {
      const f0 = 455e3;
      const scaled = scaleLadder(prototype, { response: "bandpass", centreHz: f0, bandwidthHz: w * f0, sourceOhms: 330 });
      const b = asBuiltLadder(scaled, { inductorQ: q });
      const loss = at(lossless(exactLossy(b, q, f0)), f0) - at(exactLossy(b, q, f0), f0);
      const cohn = cohnDb(g, w, q);
      expect(Math.abs(loss - cohn)).toBeLessThan(0.015 * cohn * cohn + 1e-4);
    });

    it.each(bands.filter(([w]) => w >= 0.2))("rounded E24 parts: Q adds Cohn's loss within 10 % at the centre (w = %f, Q = %f)", (w, q) => {
      const f0 = 455e3;
      const scaled = scaleLadder(prototype, { response: "bandpass", centreHz: f0, bandwidthHz: w * f0, sourceOhms: 330 });
      const b = asBuiltLadder(scaled, { inductorSeries: "E24", capacitorSeries: "E24", inductorQ: q });
      const added = at(lossless(b), f0) - at(b, f0);
      const cohn = cohnDb(g, w, q);
      expect(Math.abs(added - cohn)).toBeLessThan(0.1 * cohn);
    });
  });
});
