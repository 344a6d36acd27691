import { describe, expect, it } from "vitest";
import { designFilter, designResponse } from "../../src/design/index.ts";
import { designPolesZeros } from "../../src/analysis/poles-zeros.ts";
import { evalZpk } from "../../src/tf/index.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { thrownBy } from "../helpers/throws.ts";

const TWO_PI = 2 * Math.PI;

const designs = {
  "lowpass, ideal op-amp": designFilter({ response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } }),
  "bandstop, single-pole op-amp": designFilter({
    response: "bandstop",
    passband: { edgeHz: ["800", "1.25k"], maxLossDb: 1 },
    stopband: { edgeHz: ["950", "1.05k"], minAttenuationDb: 30 },
    opamp: { a0: 2e5, gbwHz: "1M" },
  }),
  "highpass, single-pole op-amp": designFilter({
    response: "highpass",
    passband: { edgeHz: "2k", maxLossDb: 0.5 },
    stopband: { edgeHz: "500", minAttenuationDb: 40 },
    family: "butterworth",
    opamp: { a0: 1e5, gbwHz: "10M" },
  }),
};

describe("designPolesZeros", () => {
  for (const [name, r] of Object.entries(designs)) {
    it(`${name}: the zpk evaluated on the j-omega axis is the design's own response (1e-9 relative)`, () => {
      const { zpk } = designPolesZeros(r);
      const f = Float64Array.from({ length: 61 }, (_, i) => 10 * 10 ** (i / 12));
      const h = designResponse(r, f);
      f.forEach((hz, i) => {
        const z = evalZpk(zpk, { re: 0, im: TWO_PI * hz });
        const ref = Math.hypot(h.re[i] as number, h.im[i] as number);
        expect(Math.hypot(z.re - (h.re[i] as number), z.im - (h.im[i] as number))).toBeLessThan(1e-9 * Math.max(ref, 1e-6));
      });
      expect(zpk.poles.every((p) => p.re < 0)).toBe(true);
    });
  }

  it("gives each stage's poles the f0, Q and real pole the design reports as built (ideal op-amp)", () => {
    const r = designs["lowpass, ideal op-amp"];
    const pz = designPolesZeros(r);
    r.stages.forEach((st, k) => {
      const poles = (pz.stages[k] as (typeof pz.stages)[number]).poles;
      expect(poles).toHaveLength(st.order);
      const p = (st.order === 1 ? poles[0] : poles.find((x) => x.im > 0)) as { re: number; im: number };
      const w0 = Math.hypot(p.re, p.im);
      expect(w0 / TWO_PI / st.asBuilt.f0Hz).toBeCloseTo(1, 10);
      if (st.order >= 2) expect(w0 / (2 * -p.re) / (st.asBuilt.q as number)).toBeCloseTo(1, 10);
      if (st.order === 3) {
        const real = poles.find((x) => x.im === 0) as { re: number; im: number };
        expect(-real.re / TWO_PI / (st.asBuilt.realPoleHz as number)).toBeCloseTo(1, 10);
      }
    });
  });

  it("puts a highpass's zeros at the origin exactly, and the op-amps' own poles far out", () => {
    const r = designs["highpass, single-pole op-amp"];
    const { zpk } = designPolesZeros(r);
    const atOrigin = zpk.zeros.filter((z) => z.re === 0 && z.im === 0);
    expect(atOrigin.length).toBe(r.filterOrder);
    const far = zpk.poles.filter((p) => Math.hypot(p.re, p.im) / TWO_PI > 1e5);
    expect(far.length).toBe(r.stages.reduce((k, s) => k + s.opamps.length, 0));
    // with an ideal op-amp the same stages have only the filter's poles
    expect(designPolesZeros(r, { opamp: { kind: "ideal" } }).zpk.poles).toHaveLength(r.filterOrder);
  });

  it("names a bad op-amp model", () => {
    const e = thrownBy(() => designPolesZeros(designs["lowpass, ideal op-amp"], { opamp: { kind: "magic" } as never }), InvalidArgumentError);
    expect(e.path).toMatch(/^options\.opamp/);
  });
});
