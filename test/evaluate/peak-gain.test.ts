import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { topologies } from "../../src/topologies/registry.ts";
import type { Topology } from "../../src/topologies/types.ts";
import { stagePolynomials } from "../../src/evaluate/stage-polynomials.ts";
import { opampOutputTransfers } from "../../src/evaluate/opamp-outputs.ts";
import { cascadePeaks, peakGrid, peakMagnitudeSquared, type TappedStage } from "../../src/evaluate/peak-gain.ts";
import { magnitudeSquaredAt } from "../../src/evaluate/cascade.ts";
import type { ScaledRational } from "../../src/evaluate/types.ts";
import { densePeak } from "../helpers/dense-peak.ts";
import { isBoard, opampOf } from "../helpers/stage-cases.ts";
import { realisableArb } from "../topologies/arbitraries.ts";

const db2 = (m2: number): number => 10 * Math.log10(m2);
const second = topologies.filter((t) => t.order === 2);

/** A stage of a random cascade: a topology (index into the list), its design, and an op-amp case. */
const stageArb = fc.integer({ min: 0, max: topologies.length - 1 }).chain((k) =>
  fc.record({
    topo: fc.constant(topologies[k] as Topology),
    design: realisableArb(topologies[k] as Topology),
  }),
);

const cascadeArb = fc.record({
  stages: fc.array(stageArb, { minLength: 1, maxLength: 3 }),
  model: fc.constantFrom("ideal", "single-pole"),
  a0Log: fc.double({ min: 3, max: 6, noNaN: true }),
  gbwLog: fc.double({ min: 1, max: 3, noNaN: true }),
});

type CascadeCase = typeof cascadeArb extends fc.Arbitrary<infer T> ? T : never;

/** The cascade's stages as tapped stages, and the span: a decade beyond the stages' f0s. */
function build(c: CascadeCase) {
  const f0s = c.stages.map((s) => s.design.target.f0Hz);
  const top = Math.max(...f0s);
  const opamp = opampOf(c.model, top, c.a0Log, c.gbwLog, 0);
  const span = [(2 * Math.PI * Math.min(...f0s)) / 10, 2 * Math.PI * top * 10] as const;
  const stages: TappedStage[] = [];
  for (const s of c.stages) {
    const v = s.topo.design(s.design.target, s.design.choices);
    if (!isBoard(s.topo, v)) return null;
    const outs = opampOutputTransfers(s.topo, v, opamp, span);
    if (outs === null) return null;
    const output = outs.find((o) => o.node === "out")!.transfer;
    stages.push({ output, taps: outs.map((o) => o.transfer) });
  }
  return { stages, span };
}

describe("peakMagnitudeSquared", () => {
  it("finds one peak where several factors share their roots (equal sections)", () => {
    const f: ScaledRational = { num: Float64Array.of(1), den: Float64Array.of(1, 1, 1), scale: 6 };
    const g = peakGrid([f, f, f], [0.6, 60]);
    expect([...g].every((w, i) => i === 0 || w > g[i - 1]!)).toBe(true);
    // (1 / |1 - x^2 + j x|^2)^3 peaks at x^2 = 1/2, value (4/3)^3
    const p = peakMagnitudeSquared([f, f, f], [0.6, 60]);
    expect(p.magnitudeSquared).toBeCloseTo((4 / 3) ** 3, 12);
    expect(p.radS).toBeCloseTo(6 * Math.SQRT1_2, 6);
  });

  it("finds the exact peak of a second-order lowpass of Q 20, between the points of any coarse grid", () => {
    // H = 1 / (z^2 + z / Q + 1): the peak Q / sqrt(1 - 1 / (4 Q^2)) at w = sqrt(1 - 1 / (2 Q^2))
    const q = 20;
    const f: ScaledRational = { num: Float64Array.of(1), den: Float64Array.of(1, 1 / q, 1), scale: 1000 };
    const p = peakMagnitudeSquared([f], [100, 10_000]);
    expect(Math.sqrt(p.magnitudeSquared)).toBeCloseTo(q / Math.sqrt(1 - 1 / (4 * q * q)), 10);
    expect(p.radS / 1000).toBeCloseTo(Math.sqrt(1 - 1 / (2 * q * q)), 7);
  });

  it("takes the DC value of a flat lowpass and the high-frequency limit of a highpass", () => {
    const lp: ScaledRational = { num: Float64Array.of(2), den: Float64Array.of(1, Math.SQRT2, 1), scale: 1 };
    expect(peakMagnitudeSquared([lp], [0.1, 10])).toEqual({ radS: 0, magnitudeSquared: 4 });
    const hp: ScaledRational = { num: Float64Array.of(3, 0, 0), den: Float64Array.of(1, Math.SQRT2, 1), scale: 1 };
    expect(peakMagnitudeSquared([hp], [0.1, 10])).toEqual({ radS: 10, magnitudeSquared: 9 });
  });

  it("puts points at the resonance of every complex root inside the span", () => {
    const f: ScaledRational = { num: Float64Array.of(1), den: Float64Array.of(1, 1e-3, 1), scale: 5000 };
    const g = peakGrid([f], [1000, 100_000]);
    const near = g.filter((w) => Math.abs(w / 5000 - 1) < 1e-3);
    expect(near.length).toBeGreaterThanOrEqual(8);
    expect([...g].every((w, i) => i === 0 || w >= g[i - 1]!)).toBe(true);
  });

  it("agrees with a dense evaluation (200,000 log points, refined) to 0.01 dB on random cascades", () => {
    let worst = 0;
    fc.assert(
      fc.property(cascadeArb, (c) => {
        const built = build(c);
        fc.pre(built !== null);
        const { stages, span } = built!;
        const chain: ScaledRational[] = [];
        const peaks = cascadePeaks(stages, span);
        stages.forEach((s, k) => {
          for (const [j, t] of s.taps.entries()) {
            const ref = densePeak([...chain, t], span);
            const found = peaks[k]!.taps[j]!;
            const d = db2(found.magnitudeSquared) - db2(ref.magnitudeSquared);
            worst = Math.max(worst, Math.abs(d));
            expect(Math.abs(d), `stage ${k + 1}, tap ${j + 1}`).toBeLessThan(0.01);
            // the value is the cascade's own at the frequency reported (or its DC / high-frequency limit)
            if (found.radS > span[0] && found.radS < span[1]) {
              expect(db2(magnitudeSquaredAt([...chain, t], found.radS))).toBeCloseTo(db2(found.magnitudeSquared), 12);
            }
          }
          const out = densePeak([...chain, s.output], span);
          expect(Math.abs(db2(peaks[k]!.output.magnitudeSquared) - db2(out.magnitudeSquared))).toBeLessThan(0.01);
          chain.push(s.output);
        });
      }),
      { numRuns: 10 },
    );
    console.log(`found vs dense peaks: worst ${worst.toExponential(2)} dB`);
  });
});

describe("cascadePeaks", () => {
  it("gives the same peaks as peakMagnitudeSquared of each partial cascade", () => {
    const topo = second.find((t) => t.id === "tow-thomas-notch")!;
    const v = topo.design({ order: 2, kind: "notch", f0Hz: 400, q: 8, gain: -1 }, {});
    const outs = opampOutputTransfers(topo, v, { kind: "ideal" })!;
    const lp = topologies.find((t) => t.id === "sallen-key-lowpass-unity")!;
    const lpOut = stagePolynomials(lp, lp.design({ order: 2, kind: "lowpass", f0Hz: 1000, q: 3, gain: 1 }, {}), { kind: "ideal" })!;
    const notchOut = outs.find((o) => o.node === "out")!.transfer;
    const span = [2 * Math.PI * 40, 2 * Math.PI * 10_000] as const;
    const peaks = cascadePeaks(
      [
        { output: lpOut, taps: [lpOut] },
        { output: notchOut, taps: outs.map((o) => o.transfer) },
      ],
      span,
    );
    expect(peaks[0]!.taps[0]).toBe(peaks[0]!.output);
    outs.forEach((o, j) => {
      const alone = peakMagnitudeSquared([lpOut, o.transfer], span);
      expect(db2(peaks[1]!.taps[j]!.magnitudeSquared)).toBeCloseTo(db2(alone.magnitudeSquared), 9);
    });
  });
});
