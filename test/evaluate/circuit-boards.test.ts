import { describe, expect, it } from "vitest";
import { assembleMna, mnaDeterminant } from "../../src/circuit/index.ts";
import { cascadeResponse, circuitBoardStage, circuitParts, circuitPolynomials, runBoards, planMask } from "../../src/evaluate/index.ts";
import { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder, type ActiveLadder } from "../../src/ladder/active/index.ts";
import { polyRoots } from "../../src/math/index.ts";
import { chebyshev1Ladder } from "../helpers/ladder-prototypes.ts";
import { circuitResponse, denseGridHz, ellipticLadders, worstDifference } from "../helpers/active-ladder-check.ts";

const edgeHz = 18_000;
const w = 2 * Math.PI * edgeHz;
const span: [number, number] = [w / 1000, w * 1000];
const models = [{ kind: "ideal" }, { kind: "single-pole", a0: 1e5, gbwHz: 5e6 }] as const;

function ladders(opamp: (typeof models)[number]): ActiveLadder[] {
  const c7 = chebyshev1Ladder(7, 0.125, "series-first");
  const e5 = ellipticLadders()[1] as never;
  return [
    leapfrogLowpassLadder(c7, { edgeHz, opamp }),
    fdnrLowpassLadder(c7, { edgeHz, opamp }),
    fdnrLowpassLadder(e5, { edgeHz, opamp }),
    // a 5 MHz op-amp is too slow to pre-distort an 18 kHz GIC highpass: these two are built for it as it is
    gicHighpassLadder(c7, { edgeHz, opamp, predistort: false }),
    gicHighpassLadder(e5, { edgeHz, opamp, predistort: false }),
  ];
}

describe("circuitPolynomials", () => {
  it.each([
    [models[0], 1e-9],
    [models[1], 1e-7],
  ] as const)("equals the nodal analysis over three decades either side of the edge (%o: to %s dB)", (opamp, tolDb) => {
    const grid = denseGridHz(edgeHz, 3, 3, 600);
    for (const f of ladders(opamp)) {
      const p = circuitPolynomials(f.circuit, { source: "Vin", output: f.output, spanRadS: span }, w);
      expect(p).not.toBeNull();
      const h = cascadeResponse([p as NonNullable<typeof p>], grid.map((x) => 2 * Math.PI * x));
      const e = worstDifference(h, circuitResponse(f, grid));
      expect(e.db, f.circuit.title).toBeLessThan(tolDb);
      expect(e.rad, f.circuit.title).toBeLessThan(tolDb);
    }
  });

  it("has as roots of its denominator the zeros of the nodal determinant det(G + s C) (the filter's own poles)", () => {
    for (const f of ladders(models[1])) {
      const p = circuitPolynomials(f.circuit, { source: "Vin", output: f.output, spanRadS: span }, w) as NonNullable<ReturnType<typeof circuitPolynomials>>;
      const sys = assembleMna(f.circuit);
      const roots = polyRoots(Array.from(p.den)).map((r) => ({ re: r.re * p.scale, im: r.im * p.scale }));
      // the op-amps' own poles sit in a tight cluster near GBW / 2 whose roots no coefficient set locates well
      for (const r of roots.filter((x) => Math.hypot(x.re, x.im) < 30 * w)) {
        // |det| at the root is far below its size a little way off (the determinant's scale varies enormously, so compare locally)
        const at = mnaDeterminant(sys, r);
        const off = mnaDeterminant(sys, { re: r.re * 1.01, im: r.im * 1.01 + 0.01 * Math.hypot(r.re, r.im) });
        expect(Math.hypot(at.re, at.im) / Math.hypot(off.re, off.im), `${f.circuit.title} root ${r.re} ${r.im}`).toBeLessThan(1e-6);
      }
    }
  });
});

describe("circuitBoardStage", () => {
  it("puts every resistor and capacitor on the board with its tolerance; nominal boards meet what the nominal circuit meets", () => {
    const f = leapfrogLowpassLadder(chebyshev1Ladder(7, 0.125, "series-first"), { edgeHz });
    const stage = circuitBoardStage(f.circuit, { source: "Vin", output: f.output, spanRadS: span, resistorTolerance: 0.01, capacitorTolerance: 0.02, radiusRadS: w });
    const names = circuitParts(f.circuit);
    expect(stage.compiled.componentNames).toEqual(names);
    expect(names.length).toBe(f.parts.length);
    names.forEach((n, i) => expect(stage.tolerance[i]).toBe(n.startsWith("C") ? 0.02 : 0.01));
    const plan = planMask({ pass: [[edgeHz / 1000, edgeHz]], stop: [[edgeHz * 1.6, edgeHz * 1600]], referenceHz: edgeHz / 1000 }, { maxLossDb: 0.3, minAttenuationDb: 20, gain: 1, gainToleranceDb: 0.25 });
    const zero = { ...stage, tolerance: new Float64Array(stage.tolerance.length) };
    const run = runBoards([zero], plan, { boards: 3, seed: 1, distribution: "uniform" });
    expect(run.passed).toBe(3);
    expect(run.marginDb[0]).toBe(run.marginDb[2]);
  });
});
