/**
 * ngspice AC analysis of exported LC ladder netlists (ladderCircuit then
 * circuitToSpice) against the nodal analysis of the same circuits: scaled
 * ladders of every response and both forms, and as-built ladders with
 * rounded parts, inductor Q and capacitor ESR.
 */
import { describe, expect, it } from "vitest";
import { acAnalysis, circuitToSpice, ladderCircuit, LADDER_SOURCE } from "../../src/circuit/index.ts";
import { asBuiltLadder, scaleLadder, type AsBuiltLadder, type ScaledLadder } from "../../src/ladder/index.ts";
import { requireNgspice, runAc, worstDbGap } from "../helpers/ngspice.ts";
import { butterworthLadder, chebyshevLadder, ellipticLadder } from "../ladder/prototypes.ts";

/**
 * Four decades about the edge at 100 points a decade, or five bandwidths
 * either side of a band's centre at 5000 points a decade; started a little
 * off the round numbers so that no point falls exactly on a bandstop centre,
 * where a lossless ladder's parallel resonators make the nodal equations
 * singular.
 */
function sweep(l: ScaledLadder | AsBuiltLadder): { pointsPerDecade: number; startHz: number; stopHz: number } {
  if ("edgeHz" in l.placement) return { pointsPerDecade: 100, startHz: (l.placement.edgeHz / 100) * 1.0003, stopHz: l.placement.edgeHz * 100 };
  const { centreHz, bandwidthHz } = l.placement;
  return { pointsPerDecade: 5000, startHz: Math.max(centreHz - 5 * bandwidthHz, centreHz / 10) * 1.0003, stopHz: centreHz + 5 * bandwidthHz };
}

/** Largest |dB difference| between ngspice and the nodal analysis where the gain is above -100 dB. */
function worstDb(l: ScaledLadder | AsBuiltLadder): { worst: number; points: number } {
  const circuit = ladderCircuit(l);
  const netlist = circuitToSpice(circuit, { ac: sweep(l) });
  const sim = runAc(netlist, [l.outputNode]);
  const v = sim.vectors[l.outputNode.toLowerCase()] as { re: Float64Array; im: Float64Array };
  const mna = acAnalysis(circuit, { source: LADDER_SOURCE, outputs: [l.outputNode], freqHz: sim.freqHz }).outputs[l.outputNode] as {
    re: Float64Array;
    im: Float64Array;
  };
  return worstDbGap(v, mna);
}

const cases: [string, () => ScaledLadder | AsBuiltLadder][] = [
  ["butterworth 5 lowpass, 50 ohm", () => scaleLadder(butterworthLadder(5, "shunt-first"), { edgeHz: 21.4e6, sourceOhms: 50 })],
  ["chebyshev1 4 highpass, unequal ends", () => scaleLadder(chebyshevLadder(4, 0.5, "series-first"), { response: "highpass", edgeHz: 3e3, sourceOhms: 600 })],
  [
    "chebyshev1 6 bandpass, unequal ends",
    () => scaleLadder(chebyshevLadder(6, 0.25, "shunt-first"), { response: "bandpass", edgeHz: [7.0e6, 7.3e6], sourceOhms: 50 }),
  ],
  ["elliptic 3 bandstop", () => scaleLadder(ellipticLadder("series-first"), { response: "bandstop", centreHz: 60, bandwidthHz: 20, sourceOhms: 8 })],
  ["elliptic 3 bandpass", () => scaleLadder(ellipticLadder("shunt-first"), { response: "bandpass", centreHz: 455e3, bandwidthHz: 40e3, sourceOhms: 1.5e3 })],
  [
    "as built: chebyshev1 5 bandpass, E24, Q 80, 0.1 ohm ESR",
    () =>
      asBuiltLadder(scaleLadder(chebyshevLadder(5, 0.1, "series-first"), { response: "bandpass", centreHz: 10.7e6, bandwidthHz: 2e6, sourceOhms: 50 }), {
        inductorSeries: "E24",
        capacitorSeries: "E24",
        inductorQ: 80,
        capacitorEsrOhms: 0.1,
      }),
  ],
  [
    "as built: elliptic 3 lowpass, E12, default Q",
    () => asBuiltLadder(scaleLadder(ellipticLadder("shunt-first"), { edgeHz: 48e3, sourceOhms: 600 })),
  ],
];

describe.runIf(requireNgspice())("ladderCircuit (ngspice)", () => {
  it.each(cases)("ngspice AC of %s agrees with the nodal analysis to 0.01 dB", (_name, make) => {
    const { worst, points } = worstDb(make());
    expect(points).toBeGreaterThan(100);
    expect(worst).toBeLessThan(0.01);
  });
});
