/**
 * designLcLadder: a passive LC anti-alias lowpass ahead of a fast ADC
 * (50 ohm, 30 MHz passband), its nominal mask figures against an independent
 * nodal analysis, its boards' yield with tight and loose parts, the
 * dissipation loss of finite-Q inductors, and the typed errors of its options.
 */
import { describe, expect, it } from "vitest";
import { acAnalysis, LADDER_SOURCE } from "../../src/circuit/index.ts";
import { designLcLadder, type LcLadderDesign } from "../../src/design/lc-ladder.ts";
import type { FilterSpec } from "../../src/design/spec.ts";
import { InvalidArgumentError } from "../../src/errors.ts";

/** Our own scenario: ahead of a 125 MS/s ADC, pass 30 MHz within 1 dB, 45 dB down from 60 MHz. */
const ADC_SPEC: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: 30e6, maxLossDb: 1 },
  stopband: { edgeHz: 60e6, minAttenuationDb: 45 },
  parts: { capacitorSeries: "E24" },
};

/** |V(out)| in dB of the design's circuit by the nodal analysis, at the given frequencies. */
function mnaDb(d: LcLadderDesign, freqHz: number[]): number[] {
  const r = acAnalysis(d.circuit, { source: LADDER_SOURCE, outputs: [d.asBuilt.outputNode], freqHz: Float64Array.from(freqHz) });
  const v = r.outputs[d.asBuilt.outputNode] as { re: Float64Array; im: Float64Array };
  return freqHz.map((_, i) => 10 * Math.log10((v.re[i] as number) ** 2 + (v.im[i] as number) ** 2));
}

describe("designLcLadder", () => {
  const d = designLcLadder(ADC_SPEC, { inductorSeries: "E24", inductorTolerance: 0.02, capacitorTolerance: 0.01, inductorQ: 100, seed: 11, boards: 512 });

  it("reports the nominal loss and attenuation the nodal analysis gives at the worst frequencies, to 1e-6 dB", () => {
    const v = d.verification;
    const [pass, stop] = mnaDb(d, [v.passbandWorstHz, v.stopbandWorstHz]) as [number, number];
    expect(Math.abs(d.levelDb - pass - v.passbandLossDb)).toBeLessThan(1e-6);
    expect(Math.abs(d.levelDb - stop - v.stopbandAttenuationDb)).toBeLessThan(1e-6);
  });
});
