import { describe, expect, it } from "vitest";
import { chebyshev1 } from "../../src/approx/chebyshev1.ts";
import { getTopology } from "../../src/topologies/registry.ts";
import type { ComponentValues, Topology } from "../../src/topologies/types.ts";
import { stagePolynomials } from "../../src/evaluate/stage-polynomials.ts";
import { maskFigures, planMask, rationalSource, type MaskBands, type MaskLimits } from "../../src/evaluate/mask.ts";
import type { ScaledRational } from "../../src/evaluate/types.ts";
import { logGrid } from "../../src/tf/grid.ts";

/** A 6th-order 0.5 dB Chebyshev I lowpass at 1 kHz built from three unity-gain Sallen-Key stages (our own test filter). */
function chebyshevCascade(): { topo: Topology; values: ComponentValues[] } {
  const proto = chebyshev1(6, { rippleDb: 0.5 });
  const topo = getTopology("sallen-key-lowpass-unity");
  const upper = proto.poles.filter((p) => p.im > 0);
  const values = upper.map((p) => {
    const w = Math.hypot(p.re, p.im);
    return topo.design({ order: 2, kind: "lowpass", f0Hz: 1000 * w, q: w / (-2 * p.re), gain: 1 }, { capacitor: 10e-9 });
  });
  return { topo, values };
}

/** |H| from the topologies' closed forms on a dense grid: the reference. */
function denseExtremes(topo: Topology, values: readonly ComponentValues[], band: readonly [number, number], n: number) {
  const f = logGrid(band[0], band[1], n);
  const m = new Float64Array(n).fill(1);
  for (const v of values) {
    const h = topo.response(v, f, { kind: "ideal" });
    for (let i = 0; i < n; i++) m[i] = m[i]! * Math.hypot(h.re[i]!, h.im[i]!);
  }
  let hi = -Infinity;
  let lo = Infinity;
  for (let i = 0; i < n; i++) {
    hi = Math.max(hi, m[i]!);
    lo = Math.min(lo, m[i]!);
  }
  return { hi, lo };
}

describe("maskFigures", () => {
  const { topo, values } = chebyshevCascade();
  const stages: ScaledRational[] = values.map((v) => stagePolynomials(topo, v, { kind: "ideal" })!);
  const bands: MaskBands = { pass: [[1, 1000]], stop: [[2500, 2.5e6]], referenceHz: 1 };
  const limits: MaskLimits = { maxLossDb: 0.5, minAttenuationDb: 50, gain: 1, gainToleranceDb: 0.5 };
  const figures = maskFigures(rationalSource(stages), planMask(bands, limits));

  it("finds the equiripple peak and the passband loss as a dense closed-form scan does (1e-9 dB)", () => {
    const ref = denseExtremes(topo, values, [1, 1000], 400_000);
    const peakDb = 20 * Math.log10(ref.hi);
    expect(Math.abs(figures.gainDb - peakDb)).toBeLessThan(1e-9);
    expect(Math.abs(figures.passbandLossDb - (peakDb - 20 * Math.log10(ref.lo)))).toBeLessThan(1e-9);
    // a 0.5 dB Chebyshev I: the passband loss is the ripple
    expect(figures.passbandLossDb).toBeCloseTo(0.5, 6);
  });

  it("measures the stopband attenuation from the passband peak", () => {
    const ref = denseExtremes(topo, values, [2500, 2.5e6], 200_000);
    const att = figures.gainDb - 20 * Math.log10(ref.hi);
    expect(Math.abs(figures.stopbandAttenuationDb - att)).toBeLessThan(1e-9);
    expect(figures.stopbandWorstHz).toBeCloseTo(2500, 6);
  });

  it("states the margins against the limits and the polarity", () => {
    expect(figures.passbandMarginDb).toBeCloseTo(0.5 - figures.passbandLossDb, 12);
    expect(figures.stopbandMarginDb).toBeCloseTo(figures.stopbandAttenuationDb - 50, 12);
    expect(figures.marginDb).toBe(Math.min(figures.passbandMarginDb, figures.stopbandMarginDb, figures.gainMarginDb));
    expect(figures.polarity).toBe("non-inverting");
  });

  it("sees an inverting cascade", () => {
    const inv = getTopology("mfb-lowpass");
    const v = inv.design({ order: 2, kind: "lowpass", f0Hz: 1000, q: 0.7071, gain: -1 }, {});
    const f = maskFigures(rationalSource([stagePolynomials(inv, v, { kind: "ideal" })!]), planMask(bands, { ...limits, maxLossDb: 3.1 }));
    expect(f.polarity).toBe("inverting");
    expect(f.passbandLossDb).toBeCloseTo(10 * Math.log10(2), 3);
  });
});
