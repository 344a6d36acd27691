/**
 * ngspice AC analysis of designLcLadder's exported netlists (our own
 * scenarios: the 30 MHz anti-alias lowpass and the 10.7 MHz IF bandpass)
 * against the design's own circuit by the nodal analysis.
 */
import { describe, expect, it } from "vitest";
import { acAnalysis, LADDER_SOURCE } from "../../src/circuit/index.ts";
import { designLcLadder, lcLadderNetlist, type LcLadderDesign } from "../../src/design/lc-ladder.ts";
import { requireNgspice, runAc, worstDbGap } from "../helpers/ngspice.ts";
import { ADC_SPEC, IF_SPEC, TIGHT } from "./lc-ladder-scenarios.ts";

/** Largest |dB difference| over the netlist's own sweep where the gain is above -100 dB. */
function worstDb(d: LcLadderDesign): { worst: number; points: number } {
  const out = d.asBuilt.outputNode;
  const sim = runAc(lcLadderNetlist(d, { pointsPerDecade: 200 }), [out]);
  const v = sim.vectors[out] as { re: Float64Array; im: Float64Array };
  const mna = acAnalysis(d.circuit, { source: LADDER_SOURCE, outputs: [out], freqHz: sim.freqHz }).outputs[out] as { re: Float64Array; im: Float64Array };
  return worstDbGap(v, mna);
}

describe.runIf(requireNgspice())("designLcLadder netlist (ngspice)", () => {
  it.each([
    ["30 MHz anti-alias lowpass", () => designLcLadder(ADC_SPEC, { ...TIGHT, boards: 1 })],
    ["10.7 MHz IF bandpass", () => designLcLadder(IF_SPEC, { ...TIGHT, inductorQ: 100, boards: 1 })],
  ])("ngspice AC of the %s agrees with the nodal analysis to 0.01 dB", (_name, make) => {
    const { worst, points } = worstDb(make());
    expect(points).toBeGreaterThan(300);
    expect(worst).toBeLessThan(0.01);
  });
});
