import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { topologies } from "../../src/topologies/registry.ts";
import type { OpAmpModel } from "../../src/circuit/types.ts";
import type { Topology } from "../../src/topologies/types.ts";
import { boardOfCase, isBoard, mnaOf, opampOf, stageCaseArb as caseArb } from "../helpers/stage-cases.ts";
import {
  boardPolynomialsInto,
  compileStage,
  genericStagePolynomialsInto,
  stagePolynomials,
} from "../../src/evaluate/stage-polynomials.ts";
import { cascadeMagnitudeSquared, cascadeResponse } from "../../src/evaluate/cascade.ts";
import { realisableArb } from "../topologies/arbitraries.ts";


const worst: Record<string, { mag: number; deg: number }> = {};

describe("stagePolynomials, generic path", () => {
  for (const topo of topologies) {
    it(`${topo.id}: polynomials agree with nodal analysis to 1e-9 dB and 1e-7 degree`, () => {
      fc.assert(
        fc.property(caseArb(topo), (c) => {
          const board = boardOfCase(topo, c);
          fc.pre(board !== null);
          const { design } = c;
          const { v, opamp, freqHz } = board!;
          const p = stagePolynomials(topo, v, opamp, { closedForm: false }); // the generic path (the closed forms: test/topologies/polynomials.test.ts)
          expect(p).not.toBeNull();
          const w = freqHz.map((f) => 2 * Math.PI * f);
          const h = cascadeResponse([p!], w);
          const m2 = cascadeMagnitudeSquared([p!], w);
          const floor = 1e-6 * Math.abs(design.target.gain);
          // the references: nodal analysis of the stage's own elements, and its closed form
          for (const m of [mnaOf(topo, v, freqHz, opamp), topo.response(v, freqHz, opamp)]) {
            for (let i = 0; i < freqHz.length; i++) {
              const d = Math.hypot(h.re[i]! - m.re[i]!, h.im[i]! - m.im[i]!);
              expect(d / Math.abs(design.target.gain), `f = ${freqHz[i]} Hz (${opamp.kind})`).toBeLessThan(1e-10);
              const ref = Math.hypot(m.re[i]!, m.im[i]!);
              if (ref < floor) continue; // deep in a notch: the absolute comparison above covers it
              const magDb = Math.abs(10 * Math.log10(m2[i]!) - 20 * Math.log10(ref));
              let dp = Math.atan2(h.im[i]!, h.re[i]!) - Math.atan2(m.im[i]!, m.re[i]!);
              dp -= 2 * Math.PI * Math.round(dp / (2 * Math.PI));
              const deg = Math.abs((dp * 180) / Math.PI);
              const w0 = (worst[topo.id] ??= { mag: 0, deg: 0 });
              w0.mag = Math.max(w0.mag, magDb);
              w0.deg = Math.max(w0.deg, deg);
              expect(magDb, `f = ${freqHz[i]} Hz (${opamp.kind})`).toBeLessThan(1e-9);
              expect(deg, `f = ${freqHz[i]} Hz (${opamp.kind})`).toBeLessThan(1e-7);
            }
          }
        }),
        { numRuns: 40 },
      );
    });
  }

  it("reports the worst agreement per topology", () => {
    const rows = Object.entries(worst).map(([id, e]) => `${id}: ${e.mag.toExponential(2)} dB, ${e.deg.toExponential(2)} deg`);
    console.log(rows.join("\n"));
    expect(rows.length).toBe(topologies.length);
  });
});

describe("boardPolynomialsInto (a board's parts on the circles planned at nominal)", () => {
  const boardArb = (topo: Topology) =>
    fc.record({
      design: realisableArb(topo),
      deviation: fc.array(fc.double({ min: -0.1, max: 0.1, noNaN: true }), { minLength: 12, maxLength: 12 }),
      // an op-amp with an output resistance: every topology's closed form declines it, so the board takes the planned circles
      model: fc.constant("single-pole-rout" as const),
      a0Log: fc.double({ min: 3, max: 7, noNaN: true }),
      gbwLog: fc.double({ min: 0.5, max: 4, noNaN: true }),
    });
  for (const topo of topologies) {
    it(`${topo.id}: agrees with the full generic path to 1e-9 dB for parts within 10 % (op-amp with an output resistance)`, () => {
      fc.assert(
        fc.property(boardArb(topo), ({ design, deviation, model, a0Log, gbwLog }) => {
          const nominal = topo.design(design.target, design.choices);
          fc.pre(isBoard(topo, nominal));
          const f0 = design.target.f0Hz;
          const opamp = opampOf(model, f0, a0Log, gbwLog, 10);
          const span = [2 * Math.PI * f0 * 1e-3, 2 * Math.PI * f0 * 1e3] as const;
          const cs = compileStage(topo, nominal, opamp, span);
          const radius = 2 * Math.PI * f0;
          const M = cs.points;
          const [n0, d0, n1, d1] = [0, 0, 0, 0].map(() => new Float64Array(M)) as [Float64Array, Float64Array, Float64Array, Float64Array];
          const x0 = Float64Array.from(cs.componentNames, (n) => nominal[n]!);
          genericStagePolynomialsInto(cs, x0, radius, n0, d0); // the plan
          const x = x0.map((v, i) => v * (1 + deviation[i % deviation.length]!));
          const rb = boardPolynomialsInto(cs, x, radius, n1, d1);
          const rf = genericStagePolynomialsInto(cs, x, radius, n0, d0);
          const w = Float64Array.from([-3, -2, -1, -0.3, 0, 0.3, 1, 2, 3], (e) => radius * 10 ** e);
          const planned = cascadeMagnitudeSquared([{ num: n1, den: d1, scale: rb }], w);
          const full = cascadeMagnitudeSquared([{ num: n0, den: d0, scale: rf }], w);
          const peak = Math.max(...full);
          for (let k = 0; k < w.length; k++) {
            // within 40 dB of the peak in dB; deeper in a notch in absolute terms against the peak, where
            // each path is within 1e-10 of the nodal analysis (the generic-path test above)
            if (full[k]! >= 1e-4 * peak) expect(Math.abs(10 * Math.log10(planned[k]! / full[k]!)), `w = ${w[k]}`).toBeLessThan(1e-9);
            else expect(Math.abs(Math.sqrt(planned[k]!) - Math.sqrt(full[k]!)) / Math.sqrt(peak), `w = ${w[k]}`).toBeLessThan(2e-10);
          }
        }),
        { numRuns: 30 },
      );
    });
  }
});
