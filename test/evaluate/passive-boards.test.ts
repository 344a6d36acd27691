/**
 * The board engine on passive LC ladders: inductors drawn within their own
 * tolerance (and boards without inductors unchanged, bit for bit), parts
 * held at their values, and the mask's fixed reference level.
 */
import { describe, expect, it } from "vitest";
import { ladderCircuit, LADDER_SOURCE } from "../../src/circuit/index.ts";
import { circuitBoardStage, circuitParts, circuitPolynomials, maskFigures, planMask, rationalSource, runBoards } from "../../src/evaluate/index.ts";
import { leapfrogLowpassLadder } from "../../src/ladder/active/index.ts";
import { asBuiltLadder, scaleLadder } from "../../src/ladder/index.ts";
import { chebyshev1Ladder } from "../helpers/ladder-prototypes.ts";

const edgeHz = 18_000;
const w = 2 * Math.PI * edgeHz;
const span: [number, number] = [w / 1000, w * 1000];
const bands = { pass: [[edgeHz / 1000, edgeHz]] as [number, number][], stop: [[edgeHz * 1.6, edgeHz * 1600]] as [number, number][], referenceHz: edgeHz / 1000 };
const limits = { maxLossDb: 0.3, minAttenuationDb: 20, gain: 1, gainToleranceDb: 0.25 };

describe("circuitBoardStage with inductors", () => {
  it("leaves a circuit without inductors the same board, bit for bit, whether or not an inductor tolerance is given", () => {
    const f = leapfrogLowpassLadder(chebyshev1Ladder(7, 0.125, "series-first"), { edgeHz });
    const base = { source: "Vin", output: f.output, spanRadS: span, resistorTolerance: 0.01, capacitorTolerance: 0.02, radiusRadS: w } as const;
    const a = circuitBoardStage(f.circuit, base);
    const b = circuitBoardStage(f.circuit, { ...base, inductorTolerance: 0.1 });
    expect(b.compiled.componentNames).toEqual(a.compiled.componentNames);
    expect(Array.from(b.tolerance)).toEqual(Array.from(a.tolerance));
    const plan = planMask(bands, limits);
    const ra = runBoards([a], plan, { boards: 300, seed: 4, distribution: "uniform" });
    const rb = runBoards([b], plan, { boards: 300, seed: 4, distribution: "uniform" });
    expect(Array.from(rb.marginDb)).toEqual(Array.from(ra.marginDb));
    expect(rb.passed).toBe(ra.passed);
  });

  const ladder = asBuiltLadder(scaleLadder(chebyshev1Ladder(5, 0.25, "series-first"), { edgeHz, sourceOhms: 600 }), { inductorQ: 60 });
  const circuit = ladderCircuit(ladder);
  const options = { source: LADDER_SOURCE, output: ladder.outputNode, spanRadS: span, resistorTolerance: 0.01, capacitorTolerance: 0.05, radiusRadS: w } as const;

  it("puts the inductors on the board after the resistors and capacitors, at their tolerance; held parts at 0", () => {
    const held = ["R_L1", "RS"];
    const stage = circuitBoardStage(circuit, { ...options, inductorTolerance: 0.1, heldParts: held });
    const inductors = circuit.elements.filter((e) => e.kind === "L").map((e) => e.name);
    expect(stage.compiled.componentNames).toEqual([...circuitParts(circuit), ...inductors]);
    stage.compiled.componentNames.forEach((n, i) => {
      const kind = circuit.elements.find((e) => e.name === n)?.kind;
      const want = held.includes(n) ? 0 : kind === "L" ? 0.1 : kind === "C" ? 0.05 : 0.01;
      expect(stage.tolerance[i], n).toBe(want);
    });
    // without the option the inductors keep their values
    expect(circuitBoardStage(circuit, options).compiled.componentNames).toEqual(circuitParts(circuit));
  });

  it("spreads the boards more when the inductors are drawn too", () => {
    const plan = planMask(bands, { ...limits, gain: 0.5, gainToleranceDb: Infinity, reference: 0.5 });
    const spread = (r: { passbandLossDb: Float64Array }): number => Math.max(...r.passbandLossDb) - Math.min(...r.passbandLossDb);
    const without = runBoards([circuitBoardStage(circuit, options)], plan, { boards: 256, seed: 9, distribution: "uniform" });
    const withL = runBoards([circuitBoardStage(circuit, { ...options, inductorTolerance: 0.1 })], plan, { boards: 256, seed: 9, distribution: "uniform" });
    expect(spread(withL)).toBeGreaterThan(spread(without));
  });
});

describe("maskFigures with a reference level", () => {
  const ladder = asBuiltLadder(scaleLadder(chebyshev1Ladder(5, 0.25, "series-first"), { edgeHz, sourceOhms: 600 }), { inductorQ: 60 });
  const c = ladderCircuit(ladder);
  const p = circuitPolynomials(c, { source: LADDER_SOURCE, output: ladder.outputNode, spanRadS: span }, w);
  const source = rationalSource([p as NonNullable<typeof p>]);

  it("measures loss and attenuation from the reference instead of the peak, the peak itself unchanged", () => {
    const byPeak = maskFigures(source, planMask(bands, limits));
    const byRef = maskFigures(source, planMask(bands, { ...limits, reference: 0.5 }));
    const shift = 20 * Math.log10(0.5) - byPeak.gainDb;
    expect(shift).toBeGreaterThan(0); // the lossy ladder sits below its lossless level
    expect(byRef.passbandLossDb - byPeak.passbandLossDb).toBeCloseTo(shift, 12);
    expect(byRef.stopbandAttenuationDb - byPeak.stopbandAttenuationDb).toBeCloseTo(shift, 12);
    expect(byRef.gainDb).toBe(byPeak.gainDb);
  });

  it("gives the peak's figures when the reference is the peak", () => {
    const byPeak = maskFigures(source, planMask(bands, limits));
    const byRef = maskFigures(source, planMask(bands, { ...limits, reference: byPeak.peak }));
    expect(byRef.passbandLossDb).toBeCloseTo(byPeak.passbandLossDb, 12);
    expect(byRef.stopbandAttenuationDb).toBeCloseTo(byPeak.stopbandAttenuationDb, 12);
  });
});
