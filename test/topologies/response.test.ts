import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { topologies } from "../../src/topologies/registry.ts";
import { acAnalysis } from "../../src/circuit/mna.ts";
import type { Element, OpAmpModel } from "../../src/circuit/types.ts";
import type { ComponentValues, Topology } from "../../src/topologies/types.ts";
import { realisableArb } from "./arbitraries.ts";

/** MNA of the topology's own elements, driven by Vin at "in", output "out". */
function mnaOf(topo: Topology, v: ComponentValues, freqHz: Float64Array, opamp: OpAmpModel) {
  const elements: Element[] = [
    { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
    ...topo.elements(v, { input: "in", output: "out", nodePrefix: "k_", opamp }),
  ];
  return acAnalysis({ title: topo.id, elements }, { source: "Vin", outputs: ["out"], freqHz }).outputs["out"]!;
}

const worst: Record<string, number> = {};

const caseArb = (topo: Topology) =>
  fc.record({
    design: realisableArb(topo),
    // as-built values: every part off by up to -30 % / +40 %
    spread: fc.array(fc.double({ min: 0.7, max: 1.4, noNaN: true }), { minLength: 12, maxLength: 12 }),
    freqs: fc.array(fc.double({ min: -2.5, max: 2.5, noNaN: true }), { minLength: 1, maxLength: 8 }),
    model: fc.record({ ideal: fc.boolean(), a0Log: fc.double({ min: 3, max: 7, noNaN: true }) }),
    gbwLog: fc.double({ min: 0.5, max: 4, noNaN: true }),
  });

describe("Topology.response", () => {
  for (const topo of topologies) {
    it(`${topo.id}: closed form agrees with nodal analysis of its own elements to 1e-9`, () => {
      fc.assert(
        fc.property(caseArb(topo), ({ design, spread, freqs, model, gbwLog }) => {
          const v0 = topo.design(design.target, design.choices);
          const v: Record<string, number> = {};
          topo.componentNames.forEach((n, i) => {
            v[n] = (v0[n] as number) * (spread[i % spread.length] as number);
          });
          const f0 = design.target.f0Hz;
          const freqHz = Float64Array.from(freqs.map((x) => f0 * 10 ** x));
          const opamp: OpAmpModel = model.ideal
            ? { kind: "ideal" }
            : { kind: "single-pole", a0: 10 ** model.a0Log, gbwHz: f0 * 10 ** gbwLog };
          const h = topo.response(v, freqHz, opamp);
          const m = mnaOf(topo, v, freqHz, opamp);
          for (let i = 0; i < freqHz.length; i++) {
            const d = Math.hypot(h.re[i]! - m.re[i]!, h.im[i]! - m.im[i]!);
            const mag = Math.hypot(m.re[i]!, m.im[i]!);
            // relative to the response, with a floor of 1e-6 of the stage gain for points deep in a notch
            const e = d / Math.max(mag, 1e-6 * Math.abs(design.target.gain));
            worst[topo.id] = Math.max(worst[topo.id] ?? 0, e);
            expect(e, `f = ${freqHz[i]} Hz, closed ${h.re[i]}+${h.im[i]}j, mna ${m.re[i]}+${m.im[i]}j`).toBeLessThan(1e-9);
          }
        }),
        { numRuns: 60 },
      );
    });
  }

  it("reports the worst relative error per topology", () => {
    const all = Object.values(worst);
    console.log(`closed form vs MNA worst relative error: ${Math.max(...all).toExponential(2)}`);
    console.log(Object.entries(worst).map(([k, e]) => `${k}: ${e.toExponential(2)}`).join("\n"));
    expect(all.length).toBe(topologies.length);
  });

  it("uses nodal analysis for the single-pole model with output resistance", () => {
    const topo = topologies.find((t) => t.id === "mfb-lowpass")!;
    const v = topo.design({ order: 2, kind: "lowpass", f0Hz: 2e4, q: 1, gain: -1 }, {});
    const f = new Float64Array([1e3, 2e4, 1e5]);
    const model: OpAmpModel = { kind: "single-pole-rout", a0: 1e5, gbwHz: 1e6, routOhm: 50 };
    const h = topo.response(v, f, model);
    const m = mnaOf(topo, v, f, model);
    for (let i = 0; i < 3; i++) expect(h.re[i]).toBe(m.re[i]);
  });

  it("rejects missing component values and bad frequencies", () => {
    const topo = topologies[0]!;
    expect(() => topo.response({ R1: 1 }, new Float64Array([1]), { kind: "ideal" })).toThrow(/values\.C1/);
    expect(() => topo.response({ R1: 1, C1: 1 }, new Float64Array([-1]), { kind: "ideal" })).toThrow(/freqHz\[0\]/);
  });
});

describe("Topology.response at 0 Hz", () => {
  it("is finite for every topology and agrees between closed form and nodal analysis", () => {
    for (const topo of topologies) {
      const kind = topo.kinds[0]!;
      const fixed = topo.fixedGain;
      // Q 6 for the Deliyannis-Friend bandpass, which starts at Q 5
      const base = {
        order: topo.order,
        kind,
        f0Hz: 500,
        q: topo.id === "deliyannis-friend-bandpass" ? 6 : 1.5,
        ...(topo.order === 3 ? { realPoleHz: 400 } : {}),
      } as const;
      let gain = topo.id.includes("unity") || topo.id.includes("buffer") ? 1 : 3;
      if (topo.id.startsWith("boctor-")) gain = kind === "highpass-notch" ? 0.8 : 1; // bounded gains (below 1 at HF for the highpass-notch)
      if (fixed !== undefined) gain = fixed(base);
      const target = {
        ...base,
        gain: topo.inverting ? -gain : gain,
        ...(kind === "lowpass-notch" ? { fzHz: 900 } : {}),
        ...(kind === "highpass-notch" ? { fzHz: 200 } : {}),
      };
      const v = topo.design(target, {});
      const f = new Float64Array([0]);
      for (const opamp of [{ kind: "ideal" }, { kind: "single-pole", a0: 1e5, gbwHz: 1e6 }] as OpAmpModel[]) {
        const h = topo.response(v, f, opamp);
        const m = mnaOf(topo, v, f, opamp);
        expect(Number.isFinite(h.re[0]) && Number.isFinite(h.im[0]), topo.id).toBe(true);
        expect(Math.abs(h.re[0]! - m.re[0]!), topo.id).toBeLessThan(1e-9 * Math.max(1, Math.abs(m.re[0]!)));
        expect(Math.abs(h.im[0]!)).toBeLessThan(1e-12);
      }
    }
  });
});
